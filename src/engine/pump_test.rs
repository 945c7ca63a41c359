//! A pump's field test as the job keeps it: the pump's nameplate, the motor's, and the readings
//! taken at the machine. What the readings say is [`super::efficiency`]'s work.

use super::motor::EfficiencyClass;
use serde::{Deserialize, Serialize};
use uom::si::f64::{
    AngularVelocity, ElectricCurrent, ElectricPotential, Power, Pressure, Torque, Volume,
    VolumeRate,
};

/// One field test of one pump, kept with the job.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct PumpTest {
    /// Which pump, in the user's words ("pump 1, vane, 40 cc"): tests of the same pump are
    /// compared by this label.
    pub pump: String,
    /// The day of the test, `yyyy-mm-dd`.
    #[serde(default)]
    pub date: String,
    #[serde(default)]
    pub notes: String,
    /// The nameplate displacement.
    #[serde(rename = "displacement_m3_per_rev")]
    pub displacement: Volume,
    /// The driving motor's nameplate full-load speed. At part load the shaft turns faster (the
    /// slip falls with the load): a reading's measured speed is used when it has one, else the
    /// speed is estimated from the load ([`synchronous_speed`]). Files written before readings
    /// had speeds kept the test's one shaft speed here; they read the same way.
    #[serde(rename = "speed_rad_per_s")]
    pub speed: AngularVelocity,
    /// The motor's synchronous speed (120 x supply frequency / poles), when entered. Absent:
    /// inferred from the full-load speed ([`synchronous_speed`]).
    #[serde(
        default,
        rename = "synchronous_speed_rad_per_s",
        skip_serializing_if = "Option::is_none"
    )]
    pub synchronous_speed: Option<AngularVelocity>,
    /// The maker's rated pressure: the leakage line predicts the efficiency there.
    #[serde(rename = "rated_pressure_pa")]
    pub rated_pressure: Pressure,
    /// The driving motor's nameplate rating.
    #[serde(rename = "motor_rated_power_w")]
    pub motor_rated_power: Power,
    pub motor_efficiency: MotorEfficiency,
    pub readings: Vec<Reading>,
}

/// Where the motor's efficiency comes from.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "from", rename_all = "snake_case")]
pub enum MotorEfficiency {
    /// From the nameplate (a fraction).
    Entered { efficiency: f64 },
    /// The published class's nominal figure for the motor's rating.
    Class { class: EfficiencyClass },
}

/// One reading: the flow at a test pressure, and optionally the shaft speed, what the motor
/// drew and the shaft torque at the same time.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Reading {
    #[serde(rename = "pressure_pa")]
    pub pressure: Pressure,
    #[serde(rename = "flow_m3_per_s")]
    pub flow: VolumeRate,
    /// The shaft speed measured at this reading (a tachometer). Absent: estimated from the
    /// motor's slip at the load drawn.
    #[serde(
        default,
        rename = "speed_rad_per_s",
        skip_serializing_if = "Option::is_none"
    )]
    pub speed: Option<AngularVelocity>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub electrical: Option<ElectricalInput>,
    #[serde(
        default,
        rename = "torque_n_m",
        skip_serializing_if = "Option::is_none"
    )]
    pub torque: Option<Torque>,
}

/// The motor's electrical input, as read.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "as", rename_all = "snake_case")]
pub enum ElectricalInput {
    /// From a power meter.
    Power {
        #[serde(rename = "input_w")]
        input: Power,
    },
    /// Three-phase line voltage, line current and power factor: P = sqrt(3) V I PF.
    ThreePhase {
        #[serde(rename = "line_voltage_v")]
        voltage: ElectricPotential,
        #[serde(rename = "line_current_a")]
        current: ElectricCurrent,
        power_factor: f64,
    },
}

impl ElectricalInput {
    /// The input power (W).
    pub fn watts(&self) -> f64 {
        match *self {
            ElectricalInput::Power { input } => input.value,
            ElectricalInput::ThreePhase {
                voltage,
                current,
                power_factor,
            } => 3f64.sqrt() * voltage.value * current.value * power_factor,
        }
    }
}

/// Days since 1970-01-01 of a `yyyy-mm-dd` date (the civil calendar; month and day with or
/// without a leading zero), if it reads and the day is in its month.
pub fn day_number(date: &str) -> Option<i64> {
    let mut parts = date.trim().splitn(3, '-');
    let y: i64 = parts.next()?.parse().ok()?;
    let m: i64 = parts.next()?.parse().ok()?;
    let d: i64 = parts.next()?.parse().ok()?;
    let leap = (y % 4 == 0 && y % 100 != 0) || y % 400 == 0;
    let month_days = match m {
        2 if leap => 29,
        2 => 28,
        4 | 6 | 9 | 11 => 30,
        _ => 31,
    };
    if !(1..=12).contains(&m) || !(1..=month_days).contains(&d) {
        return None;
    }
    // Days from civil (the proleptic Gregorian calendar), after H. Hinnant's algorithm.
    let y = if m <= 2 { y - 1 } else { y };
    let era = y.div_euclid(400);
    let yoe = y - era * 400;
    let mp = (m + 9) % 12;
    let doy = (153 * mp + 2) / 5 + d - 1;
    let doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
    Some(era * 146_097 + doe - 719_468)
}
