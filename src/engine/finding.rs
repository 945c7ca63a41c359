//! What the solver noticed: conditions a technician should know about, each with the numbers
//! behind it and a sentence in plain words.

use super::units::Measure;
use super::units::{seconds, UnitSystem};
use serde::Serialize;
use uom::si::f64::{ElectricCurrent, Power, Pressure, Time, VolumeRate};

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
}

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
            Finding::MotorStartsTooOften { starts_per_hour, allowed_per_hour } => format!(
                "The motor is stopped in idles and started again {starts_per_hour:.1} times an hour, more than the {allowed_per_hour:.1} a motor of its size and speed may take (NEMA MG 10): each start heats its windings. Keep it running, vented, through short idles, or ask the motor's maker.",
            ),
        }
    }
}
