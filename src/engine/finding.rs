//! What the solver noticed: conditions a technician should know about, each with the numbers
//! behind it and a sentence in plain words.

use super::lines::LineRole;
use super::units::Measure;
use super::units::{seconds, UnitSystem};
use serde::Serialize;
use uom::si::f64::{
    ElectricCurrent, KinematicViscosity, Length, Power, Pressure, ThermodynamicTemperature, Time,
    Velocity, VolumeRate,
};

/// How far a clamp-meter reading may differ from the model's current, as a share of the
/// motor's full-load current, before it is a finding. Our judgement: a clamp meter reads within
/// a few percent, and the model's no-load current is a rule of thumb; a tenth of the full-load
/// current is more than both.
pub const CURRENT_DIFFERENCE_SHARE: f64 = 0.1;

/// Pumps are numbered from 1 in shaft order (unloading stages first, the base pump last).
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(tag = "finding", rename_all = "snake_case")]
pub enum Finding {
    /// No unloading state is consistent: the valve unloads, pressure falls, it reloads.
    /// The phase is solved in the state nearest to consistent (named by `solved_unloaded`).
    Hunting {
        pump: usize,
        #[serde(rename = "setting_pa")]
        setting: Pressure,
        #[serde(rename = "pressure_pa")]
        pressure: Pressure,
        solved_unloaded: bool,
    },
    /// The load needs more pressure than the active limit gives: the cylinder does not move.
    /// Solved as a dead-head over the relief, for the time the stroke would take at the
    /// feeding pumps' theoretical flow.
    Stall {
        #[serde(rename = "needed_pa")]
        needed: Pressure,
        #[serde(rename = "limit_pa")]
        limit: Pressure,
        #[serde(rename = "duration_s")]
        duration: Time,
    },
    /// The relief cracks below the working pressure, so flow leaks over it while working.
    ReliefLeaks {
        #[serde(rename = "working_pa")]
        working: Pressure,
        #[serde(rename = "cracking_pa")]
        cracking: Pressure,
        #[serde(rename = "leak_m3_per_s")]
        leak: VolumeRate,
    },
    /// A metered speed or a direct demand the pumps cannot supply at that pressure; the
    /// actuator takes what is left.
    DemandUnmet {
        #[serde(rename = "wanted_m3_per_s")]
        wanted: VolumeRate,
        #[serde(rename = "available_m3_per_s")]
        available: VolumeRate,
    },
    /// A held pressure the active limit cannot reach.
    HoldBelowRequired {
        #[serde(rename = "required_pa")]
        required: Pressure,
        #[serde(rename = "reached_pa")]
        reached: Pressure,
    },
    /// The line current read in a phase differs from the model's by more than
    /// [`CURRENT_DIFFERENCE_SHARE`] of the motor's full-load current.
    CurrentDiffers {
        #[serde(rename = "measured_a")]
        measured: ElectricCurrent,
        #[serde(rename = "expected_a")]
        expected: ElectricCurrent,
    },
    /// Over the cycle the motor's power factor (kWh over kVAh) is below the one the site's
    /// tariff asks for, so the site pays for reactive power.
    PowerFactorBelowTariff { average: f64, threshold: f64 },
    /// A remote stage set at or above the main setting never governs.
    RemoteAboveMain {
        stage: usize,
        #[serde(rename = "remote_pa")]
        remote: Pressure,
        #[serde(rename = "main_pa")]
        main: Pressure,
    },
    /// A pressure a pump can see is above the pump's rating.
    AboveRating {
        pump: usize,
        what: &'static str,
        #[serde(rename = "setting_pa")]
        setting: Pressure,
        #[serde(rename = "rating_pa")]
        rating: Pressure,
    },
    /// An unloading valve set at or above the relief: its pump never unloads.
    NeverUnloads {
        pump: usize,
        #[serde(rename = "setting_pa")]
        setting: Pressure,
        #[serde(rename = "relief_pa")]
        relief: Pressure,
    },
    /// The relief is rated for less flow than the pumps can give together: at full flow its
    /// pressure rises far above the setting.
    ReliefUndersized {
        #[serde(rename = "rated_m3_per_s")]
        rated: VolumeRate,
        #[serde(rename = "pumps_m3_per_s")]
        pumps: VolumeRate,
    },
    /// The motor's RMS load over the cycle is above what it may carry continuously (rating x
    /// service factor): it will overheat.
    MotorRmsOverload {
        #[serde(rename = "rms_w")]
        rms: Power,
        #[serde(rename = "limit_w")]
        limit: Power,
    },
    /// On a variable-speed drive the motor's RMS load is above what it may carry
    /// continuously only because it turns slowly under load, where its own fan cools it less.
    MotorHotAtLowSpeed {
        #[serde(rename = "rms_w")]
        rms: Power,
        #[serde(rename = "limit_w")]
        limit: Power,
        /// The slowest the motor runs in the cycle, as a share of its full-load speed.
        slowest_share: f64,
    },
    /// A phase needs a faster shaft than the variable-speed drive's maximum: it runs at the
    /// maximum and takes longer. `needed` is absent when no speed would do (the pumps lose
    /// their whole flow to leakage at that pressure).
    BeyondMaximumSpeed {
        #[serde(rename = "needed_rad_per_s", skip_serializing_if = "Option::is_none")]
        needed: Option<uom::si::f64::AngularVelocity>,
        #[serde(rename = "maximum_rad_per_s")]
        maximum: uom::si::f64::AngularVelocity,
    },
    /// The cycle's peak is above what the motor may carry briefly (rating x peak allowance).
    MotorPeakOverload {
        #[serde(rename = "peak_w")]
        peak: Power,
        #[serde(rename = "limit_w")]
        limit: Power,
    },
    /// The cycle is too long for the RMS sizing method (the motor heats up to each long
    /// phase's load), and its peak is above what the motor may carry continuously.
    RmsCycleTooLong {
        #[serde(rename = "cycle_s")]
        cycle: Time,
        #[serde(rename = "longest_s")]
        longest: Time,
    },
    /// Idles that stop the motor start it more often an hour than a motor of its size and
    /// speed may be started.
    MotorStartsTooOften {
        starts_per_hour: f64,
        allowed_per_hour: f64,
    },
    /// A limit (the main relief, or a remote stage a phase selects) cracks at or below a
    /// compensated pump's dead-head pressure: the pump never destrokes and its whole flow
    /// crosses the relief, burning `burns_w` whenever it is dead-headed on that limit.
    ReliefAtCompensator {
        /// `None` for the main relief, else the remote stage (from 0).
        remote_stage: Option<usize>,
        #[serde(rename = "cracking_pa")]
        cracking: Pressure,
        #[serde(rename = "dead_head_pa")]
        dead_head: Pressure,
        #[serde(rename = "burns_w")]
        burns: Power,
    },
    /// A metered move whose limit leaves its pressure-compensated flow control less than the
    /// drop it needs to hold its flow: the move runs slower than metered.
    FlowControlStarved {
        #[serde(rename = "available_pa")]
        available: Pressure,
        #[serde(rename = "needed_pa")]
        needed: Pressure,
    },
    /// Oil in a line goes faster than common practice allows for its kind of line: noise,
    /// heat, and on a suction line cavitation. `diameter` is the smallest inner diameter that
    /// keeps to the limit.
    LineTooFast {
        role: LineRole,
        #[serde(rename = "velocity_m_per_s")]
        velocity: Velocity,
        #[serde(rename = "limit_m_per_s")]
        limit: Velocity,
        #[serde(rename = "diameter_m")]
        diameter: Length,
    },
    /// The oil is thinner at its working temperature than pumps commonly need
    /// ([`THINNEST_FOR_PUMPS_MM2_S`]): leakage and wear rise, and the slip model (leakage in
    /// proportion to pressure over viscosity) is no longer to be trusted.
    OilTooThin {
        #[serde(rename = "viscosity_m2_per_s")]
        viscosity: KinematicViscosity,
        #[serde(rename = "temperature_k")]
        temperature: ThermodynamicTemperature,
    },
    /// The oil settles above a common-practice limit: `seals` for the one where seals and oil
    /// degrade fast, else the one for long oil life.
    OilHot {
        #[serde(rename = "steady_k")]
        steady: ThermodynamicTemperature,
        #[serde(rename = "limit_k")]
        limit: ThermodynamicTemperature,
        seals: bool,
    },
    /// More heat goes in than the tank and cooler shed even with the oil at `ceiling`: it
    /// does not settle at any temperature the oil survives.
    OilDoesNotSettle {
        #[serde(rename = "ceiling_k")]
        ceiling: ThermodynamicTemperature,
    },
}

/// The thinnest oil, mm^2/s, pumps commonly work with (common practice: gear and vane pump
/// makers give about 10 mm^2/s as the least working viscosity).
pub const THINNEST_FOR_PUMPS_MM2_S: f64 = 10.0;

/// Oil in the tank above about 60 degC ages fast; above about 80 degC seals and oil degrade
/// quickly (common practice, degC).
pub const OIL_LIFE_LIMIT_C: f64 = 60.0;
pub const SEAL_LIMIT_C: f64 = 80.0;

impl Finding {
    /// The finding in one or two plain sentences.
    pub fn describe(&self, u: UnitSystem) -> String {
        let p = |pa: Pressure| u.pressure(pa);
        match *self {
            Finding::Hunting { pump, setting, pressure, solved_unloaded } => format!(
                "Pump {pump}'s unloading valve, set at {}, sits inside this phase's pressure range ({} here): it unloads, pressure falls, it reloads, and the valve hunts. Figures are for the pump {}.",
                p(setting),
                p(pressure),
                if solved_unloaded { "unloaded" } else { "feeding" }
            ),
            Finding::Stall { needed, limit, duration } => format!(
                "The load needs {} but the active limit gives {}: the cylinder stalls and all the flow goes over the relief. Figures assume it stalls for {}.",
                p(needed),
                p(limit),
                seconds(duration)
            ),
            Finding::ReliefLeaks { working, cracking, leak } => format!(
                "The relief starts to open at {}, below the {} this phase works at: {} leaks over it as heat and lost speed.",
                p(cracking),
                p(working),
                u.flow(leak)
            ),
            Finding::DemandUnmet { wanted, available } => format!(
                "The phase wants {} but the pumps can give only {} at its pressure: it runs slower.",
                u.flow(wanted),
                u.flow(available)
            ),
            Finding::HoldBelowRequired { required, reached } => format!(
                "The hold needs {} but the active limit holds only {}.",
                p(required),
                p(reached)
            ),
            Finding::PowerFactorBelowTariff { average, threshold } => format!(
                "Over the cycle the motor's power factor averages {average:.2}, below the {threshold:.2} the tariff asks for: the site pays for reactive power. A motor sized to its load, or power-factor correction by a qualified electrician, raises it; the utility's terms decide what it costs."
            ),
            Finding::CurrentDiffers { measured, expected } => format!(
                "The motor draws {} here; the model expects {}. {}",
                Measure::Current.with_unit(u, measured.value),
                Measure::Current.with_unit(u, expected.value),
                if measured > expected {
                    "Check the relief and unloading settings (flow crossing a valve), the pumps' wear and the supply voltage, then the figures entered."
                } else {
                    "Check that the phase runs as entered (pressure, flow, which pumps feed) and the meter's range and conductor."
                }
            ),
            Finding::RemoteAboveMain { stage, remote, main } => format!(
                "Remote stage {} is set at {}, not below the main setting of {}: it never governs.",
                stage + 1,
                p(remote),
                p(main)
            ),
            Finding::ReliefAtCompensator { remote_stage, cracking, dead_head, burns } => format!(
                "The {} starts to open at {}, at or below the {} where the compensated pump destrokes: the pump never destrokes, and its whole flow crosses the relief, about {} of heat whenever it is dead-headed there. Set the relief clearly above the compensator.",
                match remote_stage {
                    Some(stage) => format!("remote stage {}", stage + 1),
                    None => "main relief".to_string(),
                },
                p(cracking),
                p(dead_head),
                u.power(burns)
            ),
            Finding::FlowControlStarved { available, needed } => format!(
                "The limit leaves the flow control {} across it, less than the {} it needs to hold its flow: the move runs slower than metered, or the flow control hunts. Raise the limit or check the flow control's rating.",
                p(available),
                p(needed)
            ),
            Finding::AboveRating { pump, what, setting, rating } => format!(
                "Pump {pump} can see {} (the {what}), above its rating of {}. Never run above a component's rating.",
                p(setting),
                p(rating)
            ),
            Finding::NeverUnloads { pump, setting, relief } => format!(
                "Pump {pump}'s unloading valve is set at {}, not below the relief's {}: the pump never unloads.",
                p(setting),
                p(relief)
            ),
            Finding::ReliefUndersized { rated, pumps } => format!(
                "The relief is rated for {} but the pumps give up to {}: it cannot pass full flow near its setting.",
                u.flow(rated),
                u.flow(pumps)
            ),
            Finding::MotorRmsOverload { rms, limit } => format!(
                "The motor's RMS load over the cycle is {}, above the {} it may carry continuously (rating times service factor): it will run hot.",
                u.power(rms),
                u.power(limit)
            ),
            Finding::MotorHotAtLowSpeed {
                rms,
                limit,
                slowest_share,
            } => format!(
                "Counting how little its own fan cools it at low speed (down to {:.0} % of full-load speed here), the motor's RMS load over the cycle is {}, above the {} it may carry continuously: it will run hot. A motor rated for inverter duty with a separate fan, a higher minimum speed, or a larger motor avoids it; the motor's maker decides.",
                slowest_share * 100.0,
                u.power(rms),
                u.power(limit)
            ),
            Finding::BeyondMaximumSpeed { needed, maximum } => match needed {
                Some(needed) => format!(
                    "The phase needs the pump turning at {} but the drive's maximum is {}: it runs at the maximum and takes longer.",
                    u.shaft_speed(needed),
                    u.shaft_speed(maximum)
                ),
                None => format!(
                    "At this phase's pressure the pumps lose their whole flow to leakage at any speed: it runs at the drive's maximum of {} and cannot deliver what it needs.",
                    u.shaft_speed(maximum)
                ),
            },
            Finding::MotorPeakOverload { peak, limit } => format!(
                "The cycle's peak of {} is above the {} the motor may carry briefly (rating times peak allowance): it may stall or trip.",
                u.power(peak),
                u.power(limit)
            ),
            Finding::RmsCycleTooLong { cycle, longest } => format!(
                "The cycle takes {}, longer than the {} the RMS sizing holds for: the motor heats up to each long phase's load in turn, so its RMS load does not show how hot it runs. Check the heaviest long phase against what the motor carries continuously, or ask the motor's maker.",
                seconds(cycle),
                seconds(longest)
            ),
            Finding::LineTooFast { role, velocity, limit, diameter } => format!(
                "Oil in the {} line goes {}, faster than the {} common practice allows there: {}. A line of at least {} inner diameter keeps to it.",
                match role {
                    LineRole::Suction => "suction",
                    LineRole::Pressure => "pressure",
                    LineRole::Return => "return",
                },
                Measure::Speed.with_unit(u, velocity.value),
                Measure::Speed.with_unit(u, limit.value),
                match role {
                    LineRole::Suction => "the pump may cavitate",
                    LineRole::Pressure => "it costs pressure and heat, and makes noise",
                    LineRole::Return => "it raises back-pressure on the cylinder and heats the oil",
                },
                Measure::LineSize.with_unit(u, diameter.value)
            ),
            Finding::OilTooThin { viscosity, temperature } => format!(
                "At {} the oil is down to {}, thinner than the {} pumps commonly need: leakage and wear rise, and the leakage figures here are no longer to be trusted. Check the pumps' data sheets, and the oil's grade and temperature.",
                Measure::Temperature.with_unit(u, temperature.value),
                Measure::Viscosity.with_unit(u, viscosity.value),
                Measure::Viscosity.with_unit(u, THINNEST_FOR_PUMPS_MM2_S * 1e-6)
            ),
            Finding::OilHot { steady, limit, seals } => format!(
                "The oil settles at {}, above the {} {}. Reduce the heat (the ledger shows where it comes from) or add cooling.",
                Measure::Temperature.with_unit(u, steady.value),
                Measure::Temperature.with_unit(u, limit.value),
                if seals {
                    "where seals and oil degrade fast (common practice)"
                } else {
                    "that keeps mineral oil long-lived (common practice)"
                }
            ),
            Finding::OilDoesNotSettle { ceiling } => format!(
                "The losses put in more heat than the tank and cooler shed even at {}: the oil does not settle at any temperature it survives. Figures are at that temperature. Reduce the heat or add cooling before running the machine long.",
                Measure::Temperature.with_unit(u, ceiling.value)
            ),
            Finding::MotorStartsTooOften { starts_per_hour, allowed_per_hour } => format!(
                "The motor is stopped in idles and started again {starts_per_hour:.1} times an hour, more than the {allowed_per_hour:.1} a motor of its size and speed may take (NEMA MG 10): each start heats its windings. Keep it running, vented, through short idles, or ask the motor's maker.",
            ),
        }
    }
}
