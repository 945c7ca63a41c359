//! Pressure-settings advice: for every phase, the pressure it needs and the lowest limit that
//! serves it; across the cycle, the main relief setting, each unloading setting, and the
//! remote stages. Each piece of advice carries the rule and numbers behind it and, where one
//! change applies it, an [`Action`] for a proposed design (never for the baseline: see
//! [`apply_to_proposed`]). Savings are not estimated: the design is solved again with the
//! action applied and the two results are compared.
//!
//! The rules are common practice, not a standard; their margins are the user's, in
//! [`AdvicePolicy`].
//!
//! # What a phase needs (`needs`)
//!
//! `advise(job, design)` (the job's input errors if it is invalid) works from what each
//! phase needs at the system line: a move's load pressure plus its line loss (plus the flow
//! control's drop when metered), a hold's pressure when the pump holds it, a direct demand's
//! pressure; nothing for an idle or a check-held hold. The lowest limit that serves a need
//! ([`lowest_limit_for`]) is the larger of need + margin (the policy's share, or its minimum,
//! whichever is more) and need / cracking fraction (so the valve stays shut while working);
//! for a hold the pump keeps, the need itself (it sits at its limit, the pump's flow over the
//! relief, which is how the limit is read). On a variable-speed drive that keeps its holds by
//! making up the leakage, the relief is a safety valve above every working pressure, so such a
//! hold takes the margin like any other need; the drive's phases send nothing over the relief,
//! so the advice's savings there come out near zero and only the main setting's rule speaks. On a unit with a compensated pump, never below
//! [`compensator_floor`]: cracking above the highest compensator's dead-head pressure (setting
//! x 1.03) and the compensator margin above it (the policy's share, or
//! `compensator_margin_min`, 15 bar by default, whichever is more).
//!
//! # The rules (`rules`)
//!
//! All common practice:
//!
//! | rule | severity | action |
//! |---|---|---|
//! | a phase's limit above its lowest serving limit, saving at least the policy's threshold | saving | govern the phase by a remote stage at that limit (pilot-operated reliefs) |
//! | the limit's cracking pressure below the need (leaks or stalls) | caution | a remote stage at the lowest serving limit, if main allows |
//! | the limit above cracking but inside the margin | note | as above (it costs power: shown as such) |
//! | a hold the pump keeps on a limit below its pressure | caution | a remote stage at the hold's pressure, if main allows |
//! | a phase's remote stage, or main, below the compensator floor | caution when it cracks at or below the dead-head pressure, else note | main: set it to the floor (or the cycle's lowest limit, if higher); phases on main are not repeated |
//! | a phase that needs no pressure, not vented | saving | vent it (a note with no action on a direct-acting relief) |
//! | the lowest serving limit above the base pump's rating | caution | none: the machine must change |
//! | main above (saving or note) or below (caution) the cycle's highest lowest limit | | set main to it, rounded up to 1 bar or 10 psi |
//! | main above the base pump's rating | caution (replaces "main above") | set main to the cycle's lowest limit, if that is within the rating |
//! | an unloading setting outside its window, or no window | saving / caution | set it to the window's low end |
//! | a staged pump's unloading setting plus its check valve's cracking above its rating | caution (replaces the window advice) | set it to the window's low end, if that fits |
//! | a remote stage at or above main, or that no phase selects | note | remove it (selections renumbered) |
//!
//! # Unloading windows (`windows`)
//!
//! The unloading window of pump `k` runs from the highest need of the phases that need its
//! flow (plus the margin) to the lowest need of those that should run without it (less the
//! margin). A move at all pump flow needs it while the motor (rating x service factor) can
//! carry pumps `k` onward at that pressure; a metered move or direct demand needs it when the
//! pumps after it cannot give the flow, and counts at the pressure it runs at (its limit, when
//! the pumps give more than it takes and the rest crosses the relief); holds never do. With no
//! phase needing the pump, the window starts at the vent pressure. A setting above the window
//! because of a move at all pump flow is a caution (the motor carries that move with the pump
//! feeding). Stages are taken to unload in shaft order. No action sets an unloading valve at
//! or below its unloaded drop, or where the pump would see more than its rating
//! (`unloading_fits`). This is [`FlowNeed::MotorCarries`]; the staging search judges by move
//! times instead ([`FlowNeed::MoveTimes`], see `staging`).
//!
//! # Applying advice (`apply`, `words`)
//!
//! On the baseline ("as found"), advice is shown with what it would do but applied only when
//! the baseline is the job's only design (a "Proposed" copy is made); with a proposed design,
//! that design's own advice is applied to it, so an action never lands on a design it was not
//! worked out for.
//!
//! Every action goes through [`apply_to_proposed`]: the design shown if it is not the
//! baseline, else the second design, else a new copy named "Proposed". The saving shown is
//! the difference between two solves, never an estimate, worded once in the engine
//! (`Advice::effect`, in [`Described::effect`]): a rise is "draws ... more" / "costs ...
//! more", never "saves", and a cycle-wide action (main, unloading, removing a stage) says
//! nothing of one phase. No action ever proposes a limit below the compensator floor. The
//! demo's proposed design follows every rule (its advice is empty: a unit test).

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
use needs::{held_at_limit, system_rating};
pub use rules::advise;
pub(crate) use windows::unloading_fits;
pub use windows::{
    proposed_unloading, unloading_window, unloading_window_by, FlowNeed, UnloadingWindow,
};
pub use words::Described;

use serde::{Deserialize, Serialize};
use uom::si::f64::{Power, Pressure};

pub use crate::policy::AdvicePolicy;
pub use crate::power_unit::compensator_dead_head;
use crate::units::pascals;

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
        #[serde(rename = "need_pa")]
        need: Pressure,
        #[serde(rename = "limit_pa")]
        limit: Pressure,
        #[serde(rename = "lowest_pa")]
        lowest: Pressure,
    },
    /// The valve's cracking pressure at the phase's limit is below what it needs: flow leaks
    /// over the relief while working, or the work stalls.
    LimitBelowNeed {
        phase: usize,
        #[serde(rename = "need_pa")]
        need: Pressure,
        #[serde(rename = "limit_pa")]
        limit: Pressure,
        #[serde(rename = "lowest_pa")]
        lowest: Pressure,
    },
    /// The limit is above the need and the valve stays shut while working, but with less
    /// margin than the rule asks.
    MarginThin {
        phase: usize,
        #[serde(rename = "need_pa")]
        need: Pressure,
        #[serde(rename = "limit_pa")]
        limit: Pressure,
        #[serde(rename = "lowest_pa")]
        lowest: Pressure,
    },
    /// A hold the pump keeps sits at its limit, with the pump's flow over the relief: a limit
    /// below the pressure it must hold falls short.
    HoldBelowNeed {
        phase: usize,
        #[serde(rename = "need_pa")]
        need: Pressure,
        #[serde(rename = "limit_pa")]
        limit: Pressure,
    },
    /// A limit (main, or a phase's remote stage) that cracks at or below a compensated pump's
    /// dead-head pressure: the pump never destrokes and its whole flow crosses the relief.
    BelowCompensator {
        /// The phase on that limit; `None` for the main relief.
        phase: Option<usize>,
        #[serde(rename = "limit_pa")]
        limit: Pressure,
        #[serde(rename = "cracking_pa")]
        cracking: Pressure,
        #[serde(rename = "dead_head_pa")]
        dead_head: Pressure,
        #[serde(rename = "lowest_pa")]
        lowest: Pressure,
    },
    /// The phase needs no pressure but the pump pushes its flow over a limit.
    NeedsNoPressure {
        phase: usize,
        #[serde(rename = "limit_pa")]
        limit: Pressure,
        #[serde(rename = "vent_pa")]
        vent: Pressure,
    },
    /// As `NeedsNoPressure`, but the relief has no vent port to use.
    NoVentPort { phase: usize },
    /// The lowest limit that serves the phase is above a component's rating.
    BeyondRating {
        phase: usize,
        #[serde(rename = "lowest_pa")]
        lowest: Pressure,
        #[serde(rename = "rating_pa")]
        rating: Pressure,
    },
    /// The main relief is further above the highest need of the cycle than the margin asks.
    MainAboveNeed {
        #[serde(rename = "main_pa")]
        main: Pressure,
        #[serde(rename = "lowest_pa")]
        lowest: Pressure,
    },
    /// The main relief is below what the most demanding phase needs.
    MainBelowNeed {
        #[serde(rename = "main_pa")]
        main: Pressure,
        #[serde(rename = "lowest_pa")]
        lowest: Pressure,
    },
    /// The main relief lets the system line rise above the rating of the pump on it.
    MainAboveRating {
        #[serde(rename = "main_pa")]
        main: Pressure,
        #[serde(rename = "rating_pa")]
        rating: Pressure,
    },
    /// Before it unloads, a staged pump's outlet reaches its unloading setting plus its check
    /// valve's cracking pressure: above the pump's rating.
    UnloadingAboveRating {
        pump: usize,
        #[serde(rename = "setting_pa")]
        setting: Pressure,
        #[serde(rename = "cracking_pa")]
        cracking: Pressure,
        #[serde(rename = "rating_pa")]
        rating: Pressure,
    },
    /// An unloading setting outside the window its phases allow; `window` is (lowest,
    /// highest) setting that keeps the pump feeding where its flow is needed and unloads it
    /// where it is not.
    UnloadingOutside {
        pump: usize,
        #[serde(rename = "setting_pa")]
        setting: Pressure,
        window: (f64, f64),
    },
    /// No unloading setting can serve both: `with_phase` needs the pump's flow up to
    /// `with_pa`, `without_phase` should run without it from `without_pa`.
    UnloadingImpossible {
        pump: usize,
        with_phase: usize,
        #[serde(rename = "with_pa")]
        with: Pressure,
        without_phase: usize,
        #[serde(rename = "without_pa")]
        without: Pressure,
    },
    /// A remote stage at or above the main setting never governs.
    RemoteRedundant {
        stage: usize,
        #[serde(rename = "remote_pa")]
        remote: Pressure,
        #[serde(rename = "main_pa")]
        main: Pressure,
    },
    /// A remote stage no phase selects.
    RemoteUnused {
        stage: usize,
        #[serde(rename = "remote_pa")]
        remote: Pressure,
    },
}

/// One piece of advice for a design.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Advice {
    pub severity: Severity,
    pub rule: Rule,
    pub action: Option<Action>,
    /// What the action saves, found by solving the design again with it: in the phase it
    /// concerns (W, zero for cycle-wide changes) and per year (kWh).
    #[serde(rename = "saving_w")]
    pub saving: Power,
    /// Kept in kWh, the unit the site is billed in: it is the difference of the two yearly
    /// figures as billed (a round trip through joules would move its last digit).
    pub annual_saving_kwh: f64,
}
