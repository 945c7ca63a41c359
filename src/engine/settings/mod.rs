//! Pressure-settings advice: for every phase, the pressure it needs and the lowest limit that
//! serves it; across the cycle, the main relief setting, each unloading setting, and the
//! remote stages. Each piece of advice carries the rule and numbers behind it and, where one
//! change applies it, an [`Action`] for a proposed design (never for the baseline: see
//! [`apply_to_proposed`]). Savings are not estimated: the design is solved again with the
//! action applied and the two results are compared.
//!
//! The rules are common practice, not a standard (DOMAIN.md, "Relief valves and pressure
//! settings per phase"); their margins are the user's, in [`AdvicePolicy`].

mod apply;
mod needs;
mod rules;
mod windows;
mod words;

use apply::saving;
pub use apply::{apply, apply_to_proposed};
pub use needs::{
    compensator_floor, cycle_lowest_limit, lowest_limit, lowest_limit_for, needed_pressure,
    phase_needs, round_up_setting, PhaseNeed,
};
use needs::{held_by_pump, system_rating};
pub use rules::advise;
pub(crate) use windows::unloading_fits;
pub use windows::{
    proposed_unloading, unloading_window, unloading_window_by, FlowNeed, UnloadingWindow,
};
pub use words::Described;

use serde::{Deserialize, Serialize};
use uom::si::f64::Pressure;

pub use crate::policy::AdvicePolicy;
pub use crate::power_unit::compensator_dead_head;

pub(super) fn pascals(pa: f64) -> Pressure {
    Pressure::new::<uom::si::pressure::pascal>(pa)
}

/// How much a piece of advice matters.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Severity {
    /// A setting that cannot do its job, or one above a component's rating.
    Caution,
    /// Power (and heat) that a change would save.
    Saving,
    /// Worth knowing; nothing to change.
    Note,
}

/// One change to a design.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "action", rename_all = "snake_case")]
pub enum Action {
    /// Govern phase `phase` by a remote stage at `pressure` (the stage is added if the design
    /// has none at that setting).
    LimitPhase {
        phase: usize,
        #[serde(rename = "pressure_pa")]
        pressure: Pressure,
    },
    /// Vent the relief in phase `phase`: an idle sends its flow to tank through the vent, a
    /// hold whose pressure a check valve keeps lets the pump off load.
    VentPhase { phase: usize },
    /// Set the main relief.
    SetMain {
        #[serde(rename = "pressure_pa")]
        pressure: Pressure,
    },
    /// Set the unloading valve of pump `pump` (numbered from 1 in shaft order).
    SetUnloading {
        pump: usize,
        #[serde(rename = "pressure_pa")]
        pressure: Pressure,
    },
    /// Take away remote stage `stage` (from 0), and any phase selecting it goes back to main.
    RemoveRemote { stage: usize },
}

/// Which rule a piece of advice comes from, with its numbers (SI).
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(tag = "rule", rename_all = "snake_case")]
pub enum Rule {
    /// The phase's limit is further above what it needs than the margin asks: the surplus
    /// flow goes over the relief (or the flow control) at the higher pressure.
    LimitAboveNeed {
        phase: usize,
        need_pa: f64,
        limit_pa: f64,
        lowest_pa: f64,
    },
    /// The valve's cracking pressure at the phase's limit is below what it needs: flow leaks
    /// over the relief while working, or the work stalls.
    LimitBelowNeed {
        phase: usize,
        need_pa: f64,
        limit_pa: f64,
        lowest_pa: f64,
    },
    /// The limit is above the need and the valve stays shut while working, but with less
    /// margin than the rule asks.
    MarginThin {
        phase: usize,
        need_pa: f64,
        limit_pa: f64,
        lowest_pa: f64,
    },
    /// A hold the pump keeps sits at its limit, with the pump's flow over the relief: a limit
    /// below the pressure it must hold falls short.
    HoldBelowNeed {
        phase: usize,
        need_pa: f64,
        limit_pa: f64,
    },
    /// A limit (main, or a phase's remote stage) that cracks at or below a compensated pump's
    /// dead-head pressure: the pump never destrokes and its whole flow crosses the relief.
    BelowCompensator {
        /// The phase on that limit; `None` for the main relief.
        phase: Option<usize>,
        limit_pa: f64,
        cracking_pa: f64,
        dead_head_pa: f64,
        lowest_pa: f64,
    },
    /// The phase needs no pressure but the pump pushes its flow over a limit.
    NeedsNoPressure {
        phase: usize,
        limit_pa: f64,
        vent_pa: f64,
    },
    /// As `NeedsNoPressure`, but the relief has no vent port to use.
    NoVentPort { phase: usize },
    /// The lowest limit that serves the phase is above a component's rating.
    BeyondRating {
        phase: usize,
        lowest_pa: f64,
        rating_pa: f64,
    },
    /// The main relief is further above the highest need of the cycle than the margin asks.
    MainAboveNeed { main_pa: f64, lowest_pa: f64 },
    /// The main relief is below what the most demanding phase needs.
    MainBelowNeed { main_pa: f64, lowest_pa: f64 },
    /// The main relief lets the system line rise above the rating of the pump on it.
    MainAboveRating { main_pa: f64, rating_pa: f64 },
    /// Before it unloads, a staged pump's outlet reaches its unloading setting plus its check
    /// valve's cracking pressure: above the pump's rating.
    UnloadingAboveRating {
        pump: usize,
        setting_pa: f64,
        cracking_pa: f64,
        rating_pa: f64,
    },
    /// An unloading setting outside the window its phases allow; `window` is (lowest,
    /// highest) setting that keeps the pump feeding where its flow is needed and unloads it
    /// where it is not.
    UnloadingOutside {
        pump: usize,
        setting_pa: f64,
        window: (f64, f64),
    },
    /// No unloading setting can serve both: `with_phase` needs the pump's flow up to
    /// `with_pa`, `without_phase` should run without it from `without_pa`.
    UnloadingImpossible {
        pump: usize,
        with_phase: usize,
        with_pa: f64,
        without_phase: usize,
        without_pa: f64,
    },
    /// A remote stage at or above the main setting never governs.
    RemoteRedundant {
        stage: usize,
        remote_pa: f64,
        main_pa: f64,
    },
    /// A remote stage no phase selects.
    RemoteUnused { stage: usize, remote_pa: f64 },
}

/// One piece of advice for a design.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Advice {
    pub severity: Severity,
    pub rule: Rule,
    pub action: Option<Action>,
    /// What the action saves, found by solving the design again with it: in the phase it
    /// concerns (W, zero for cycle-wide changes) and per year (kWh).
    pub saving_w: f64,
    pub annual_saving_kwh: f64,
}
