//! What the solver noticed: conditions a technician should know about, each with the numbers
//! behind it and a sentence in plain words.

use super::units::{seconds, UnitSystem};
use serde::Serialize;

/// Pumps are numbered from 1 in shaft order (unloading stages first, the base pump last).
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(tag = "finding", rename_all = "snake_case")]
pub enum Finding {
    /// No unloading state is consistent: the valve unloads, pressure falls, it reloads.
    /// The phase is solved in the state nearest to consistent (named by `solved_unloaded`).
    Hunting {
        pump: usize,
        setting_pa: f64,
        pressure_pa: f64,
        solved_unloaded: bool,
    },
    /// The load needs more pressure than the active limit gives: the cylinder does not move.
    /// Solved as a dead-head over the relief, for the time the stroke would take at the
    /// feeding pumps' theoretical flow.
    Stall {
        needed_pa: f64,
        limit_pa: f64,
        duration_s: f64,
    },
    /// The relief cracks below the working pressure, so flow leaks over it while working.
    ReliefLeaks {
        working_pa: f64,
        cracking_pa: f64,
        leak_m3_per_s: f64,
    },
    /// A metered speed or a direct demand the pumps cannot supply at that pressure; the
    /// actuator takes what is left.
    DemandUnmet {
        wanted_m3_per_s: f64,
        available_m3_per_s: f64,
    },
    /// A held pressure the active limit cannot reach.
    HoldBelowRequired { required_pa: f64, reached_pa: f64 },
    /// A remote stage set at or above the main setting never governs.
    RemoteAboveMain {
        stage: usize,
        remote_pa: f64,
        main_pa: f64,
    },
    /// A pressure a pump can see is above the pump's rating.
    AboveRating {
        pump: usize,
        what: &'static str,
        setting_pa: f64,
        rating_pa: f64,
    },
    /// An unloading valve set at or above the relief: its pump never unloads.
    NeverUnloads {
        pump: usize,
        setting_pa: f64,
        relief_pa: f64,
    },
    /// The relief is rated for less flow than the pumps can give together: at full flow its
    /// pressure rises far above the setting.
    ReliefUndersized {
        rated_m3_per_s: f64,
        pumps_m3_per_s: f64,
    },
    /// The motor's RMS load over the cycle is above what it may carry continuously (rating x
    /// service factor): it will overheat.
    MotorRmsOverload { rms_w: f64, limit_w: f64 },
    /// The cycle's peak is above what the motor may carry briefly (rating x peak allowance).
    MotorPeakOverload { peak_w: f64, limit_w: f64 },
    /// The cycle is too long for the RMS sizing method (the motor heats up to each long
    /// phase's load), and its peak is above what the motor may carry continuously.
    RmsCycleTooLong { cycle_s: f64, longest_s: f64 },
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
        cracking_pa: f64,
        dead_head_pa: f64,
        burns_w: f64,
    },
    /// A metered move whose limit leaves its pressure-compensated flow control less than the
    /// drop it needs to hold its flow: the move runs slower than metered.
    FlowControlStarved { available_pa: f64, needed_pa: f64 },
}

impl Finding {
    /// The finding in one or two plain sentences.
    pub fn describe(&self, u: UnitSystem) -> String {
        let p = |pa: f64| u.pressure(pa);
        match *self {
            Finding::Hunting { pump, setting_pa, pressure_pa, solved_unloaded } => format!(
                "Pump {pump}'s unloading valve, set at {}, sits inside this phase's pressure range ({} here): it unloads, pressure falls, it reloads, and the valve hunts. Figures are for the pump {}.",
                p(setting_pa),
                p(pressure_pa),
                if solved_unloaded { "unloaded" } else { "feeding" }
            ),
            Finding::Stall { needed_pa, limit_pa, duration_s } => format!(
                "The load needs {} but the active limit gives {}: the cylinder stalls and all the flow goes over the relief. Figures assume it stalls for {}.",
                p(needed_pa),
                p(limit_pa),
                seconds(duration_s)
            ),
            Finding::ReliefLeaks { working_pa, cracking_pa, leak_m3_per_s } => format!(
                "The relief starts to open at {}, below the {} this phase works at: {} leaks over it as heat and lost speed.",
                p(cracking_pa),
                p(working_pa),
                u.flow(leak_m3_per_s)
            ),
            Finding::DemandUnmet { wanted_m3_per_s, available_m3_per_s } => format!(
                "The phase wants {} but the pumps can give only {} at its pressure: it runs slower.",
                u.flow(wanted_m3_per_s),
                u.flow(available_m3_per_s)
            ),
            Finding::HoldBelowRequired { required_pa, reached_pa } => format!(
                "The hold needs {} but the active limit holds only {}.",
                p(required_pa),
                p(reached_pa)
            ),
            Finding::RemoteAboveMain { stage, remote_pa, main_pa } => format!(
                "Remote stage {} is set at {}, not below the main setting of {}: it never governs.",
                stage + 1,
                p(remote_pa),
                p(main_pa)
            ),
            Finding::ReliefAtCompensator { remote_stage, cracking_pa, dead_head_pa, burns_w } => format!(
                "The {} starts to open at {}, at or below the {} where the compensated pump destrokes: the pump never destrokes, and its whole flow crosses the relief, about {} of heat whenever it is dead-headed there. Set the relief clearly above the compensator.",
                match remote_stage {
                    Some(stage) => format!("remote stage {}", stage + 1),
                    None => "main relief".to_string(),
                },
                p(cracking_pa),
                p(dead_head_pa),
                u.power(burns_w)
            ),
            Finding::FlowControlStarved { available_pa, needed_pa } => format!(
                "The limit leaves the flow control {} across it, less than the {} it needs to hold its flow: the move runs slower than metered, or the flow control hunts. Raise the limit or check the flow control's rating.",
                p(available_pa),
                p(needed_pa)
            ),
            Finding::AboveRating { pump, what, setting_pa, rating_pa } => format!(
                "Pump {pump} can see {} (the {what}), above its rating of {}. Never run above a component's rating.",
                p(setting_pa),
                p(rating_pa)
            ),
            Finding::NeverUnloads { pump, setting_pa, relief_pa } => format!(
                "Pump {pump}'s unloading valve is set at {}, not below the relief's {}: the pump never unloads.",
                p(setting_pa),
                p(relief_pa)
            ),
            Finding::ReliefUndersized { rated_m3_per_s, pumps_m3_per_s } => format!(
                "The relief is rated for {} but the pumps give up to {}: it cannot pass full flow near its setting.",
                u.flow(rated_m3_per_s),
                u.flow(pumps_m3_per_s)
            ),
            Finding::MotorRmsOverload { rms_w, limit_w } => format!(
                "The motor's RMS load over the cycle is {}, above the {} it may carry continuously (rating times service factor): it will run hot.",
                u.power(rms_w),
                u.power(limit_w)
            ),
            Finding::MotorPeakOverload { peak_w, limit_w } => format!(
                "The cycle's peak of {} is above the {} the motor may carry briefly (rating times peak allowance): it may stall or trip.",
                u.power(peak_w),
                u.power(limit_w)
            ),
            Finding::RmsCycleTooLong { cycle_s, longest_s } => format!(
                "The cycle takes {}, longer than the {} the RMS sizing holds for: the motor heats up to each long phase's load in turn, so its RMS load does not show how hot it runs. Check the heaviest long phase against what the motor carries continuously, or ask the motor's maker.",
                seconds(cycle_s),
                seconds(longest_s)
            ),
            Finding::MotorStartsTooOften { starts_per_hour, allowed_per_hour } => format!(
                "The motor is stopped in idles and started again {starts_per_hour:.1} times an hour, more than the {allowed_per_hour:.1} a motor of its size and speed may take (NEMA MG 10): each start heats its windings. Keep it running, vented, through short idles, or ask the motor's maker.",
            ),
        }
    }
}
