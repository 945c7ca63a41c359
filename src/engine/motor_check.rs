//! A motor checked at the machine, as the job keeps it: the motor's nameplate and the readings
//! taken with a power meter, a clamp meter or a tachometer. What they say (its load and
//! efficiency by the US DOE's methods, and a verdict) is [`super::motor_load`]'s work.

use super::pump_test::MotorEfficiency;
use serde::{Deserialize, Serialize};
use uom::si::f64::{AngularVelocity, ElectricCurrent, ElectricPotential, Power};

/// One check of one motor, kept with the job.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct MotorCheck {
    /// Which motor, in the user's words ("main pump motor, 11 kW").
    pub motor: String,
    /// The day of the check, `yyyy-mm-dd`.
    #[serde(default)]
    pub date: String,
    #[serde(default)]
    pub notes: String,
    /// The power unit the motor drives (the first, "as found", unless another is chosen): its
    /// cycle gives the yearly figures of a right-sized motor.
    #[serde(default)]
    pub design: usize,
    pub nameplate: MotorNameplate,
    pub readings: Vec<MotorReading>,
}

/// What the motor's nameplate says.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct MotorNameplate {
    #[serde(rename = "rated_power_w")]
    pub rated_power: Power,
    /// Rated line-to-line voltage (the one the motor is connected for).
    #[serde(rename = "voltage_v")]
    pub voltage: ElectricPotential,
    #[serde(rename = "full_load_current_a")]
    pub full_load_current: ElectricCurrent,
    #[serde(rename = "full_load_speed_rad_per_s")]
    pub full_load_speed: AngularVelocity,
    pub efficiency: MotorEfficiency,
    /// The full-load power factor, when printed.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub power_factor: Option<f64>,
    /// 120 x supply frequency / poles, when entered; absent: inferred from the full-load speed
    /// (the lowest synchronous speed of a 50 or 60 Hz supply above it, within a few percent).
    #[serde(
        default,
        rename = "synchronous_speed_rad_per_s",
        skip_serializing_if = "Option::is_none"
    )]
    pub synchronous_speed: Option<AngularVelocity>,
}

/// One reading: any of a power meter's input, the line's volts and amps (and power factor, if
/// the meter gives it) and the shaft speed, taken at the same time.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize, Default)]
pub struct MotorReading {
    /// What a power meter reads (three-phase total).
    #[serde(default, rename = "input_w", skip_serializing_if = "Option::is_none")]
    pub input: Option<Power>,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub line: Option<LineReading>,
    /// A tachometer's shaft speed.
    #[serde(
        default,
        rename = "speed_rad_per_s",
        skip_serializing_if = "Option::is_none"
    )]
    pub speed: Option<AngularVelocity>,
}

/// A clamp meter's reading: the mean of the three line-to-line voltages and of the three line
/// currents, and the power factor where the meter gives one.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct LineReading {
    #[serde(rename = "voltage_v")]
    pub voltage: ElectricPotential,
    #[serde(rename = "current_a")]
    pub current: ElectricCurrent,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub power_factor: Option<f64>,
}
