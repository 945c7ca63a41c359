//! Pressure-settings advice: for every phase, the pressure it needs and the lowest limit that
//! serves it; across the cycle, the main relief setting, each unloading setting, and the
//! remote stages. Each piece of advice carries the rule and numbers behind it and, where one
//! change applies it, an [`Action`] for a proposed design (never for the baseline: see
//! [`apply_to_proposed`]). Savings are not estimated: the design is solved again with the
//! action applied and the two results are compared.
//!
//! The rules are common practice, not a standard (DOMAIN.md, "Relief valves and pressure
//! settings per phase"); their margins are the user's, in [`AdvicePolicy`].

use super::cycle::{HoldMode, PhaseKind, SpeedRule};
use super::job::Job;
use super::power_unit::{Design, UnloadingStage};
use super::pump::PumpAtSpeed;
use super::validate::InputError;
use super::valve::{ActiveLimit, IdlePath};
use super::solve::{solve_design, DesignReport};
use serde::{Deserialize, Serialize};
use uom::si::f64::Pressure;

pub use super::policy::AdvicePolicy;
pub use super::power_unit::compensator_dead_head;

fn pascals(pa: f64) -> Pressure {
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

/// What one phase needs, and what its limit is.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct PhaseNeed {
    /// The system pressure the phase needs; `None` for an idle, or a hold a check valve keeps.
    pub need_pa: Option<f64>,
    /// The governing limit now.
    pub limit_pa: f64,
    /// The lowest limit that serves the need with the margin and above the valve's cracking.
    pub lowest_pa: Option<f64>,
}

/// The system pressure a phase needs (Pa), or `None` when it needs none.
pub fn needed_pressure(kind: &PhaseKind, policy: &AdvicePolicy) -> Option<f64> {
    match kind {
        PhaseKind::Move(m) => {
            let base = m.load_pressure() + m.line_loss.value;
            Some(match m.speed {
                SpeedRule::AllPumpFlow => base,
                // A flow control holds its flow only with a drop across it.
                SpeedRule::MeteredSpeed { .. } | SpeedRule::MeteredFlow { .. } => {
                    base + policy.flow_control_drop.value
                }
            })
        }
        PhaseKind::Hold(h) => match h.mode {
            HoldMode::HeldByPump => Some(h.pressure.value),
            HoldMode::LockedByCheck => None,
        },
        PhaseKind::Idle(_) => None,
        PhaseKind::Direct(d) => Some(d.pressure.value),
    }
}

/// The lowest limit that serves `need`: the margin above it, and the valve's cracking
/// pressure (`cracking_fraction` of the setting) at or above it.
pub fn lowest_limit(need: f64, policy: &AdvicePolicy, cracking_fraction: f64) -> f64 {
    let margin = (need * policy.margin_fraction).max(policy.margin_min.value);
    (need + margin).max(need / cracking_fraction.max(1e-3))
}

/// A setting rounded up to a step a gauge is read in: 1 bar, or 10 psi for US units.
pub fn round_up_setting(pa: f64, us_units: bool) -> f64 {
    let step = if us_units {
        super::units::PSI * 10.0
    } else {
        super::units::BAR
    };
    (pa / step - 1e-9).ceil() * step
}

/// The governing limit of phase `i` of `design`, as the solver uses it (Pa).
fn governing(design: &Design, i: usize, idle: bool) -> f64 {
    let setting = design.phase_settings.get(i).copied().unwrap_or_default();
    super::solve::governing_limit(design, &setting, idle).1
}

/// A hold the pump keeps (its flow over the relief at the limit), not one a check valve locks.
fn held_by_pump(kind: &PhaseKind) -> bool {
    matches!(kind, PhaseKind::Hold(h) if h.mode == HoldMode::HeldByPump)
}

/// The lowest limit that serves a phase needing `need` (Pa) on `design`. A hold the pump keeps
/// sits at its limit with the pump's whole flow over the relief (the limit is read that way),
/// so its limit is its need, with no margin: a higher one only adds clamp force and heat.
/// Every other need takes [`lowest_limit`]. Either way never below [`compensator_floor`].
pub fn lowest_limit_for(
    kind: &PhaseKind,
    need: f64,
    policy: &AdvicePolicy,
    design: &Design,
) -> f64 {
    let rule = if held_by_pump(kind) {
        need
    } else {
        lowest_limit(need, policy, design.relief.cracking_fraction)
    };
    rule.max(compensator_floor(design, policy).unwrap_or(0.0))
}

/// The lowest limit a relief may have on a unit with a compensated pump (Pa): cracking above
/// the highest compensator's dead-head pressure, and the compensator margin above it (see
/// [`AdvicePolicy::compensator_margin_min`]). `None` with no compensated pump.
pub fn compensator_floor(design: &Design, policy: &AdvicePolicy) -> Option<f64> {
    let dead_head = compensator_dead_head(design)?;
    let margin = (dead_head * policy.margin_fraction).max(policy.compensator_margin_min.value);
    Some((dead_head + margin).max(dead_head / design.relief.cracking_fraction.max(1e-3)))
}

/// Each phase's need and limit for `design`.
pub fn phase_needs(job: &Job, design: &Design) -> Vec<PhaseNeed> {
    let policy = &job.advice;
    job.cycle
        .iter()
        .enumerate()
        .map(|(i, phase)| {
            let need = needed_pressure(&phase.kind, policy);
            PhaseNeed {
                need_pa: need,
                limit_pa: governing(design, i, matches!(phase.kind, PhaseKind::Idle(_))),
                lowest_pa: need.map(|n| lowest_limit_for(&phase.kind, n, policy, design)),
            }
        })
        .collect()
}

/// The lowest limit that serves the cycle's most demanding phase (Pa): what the main relief
/// must give. `None` when no phase needs pressure.
pub fn cycle_lowest_limit(needs: &[PhaseNeed]) -> Option<f64> {
    needs.iter().filter_map(|n| n.lowest_pa).reduce(f64::max)
}

/// The lowest pressure rating on the system line: the base pump sees system pressure.
fn system_rating(design: &Design) -> f64 {
    design.base_pump.rated_pressure.value
}

/// The design with `action` applied. Indices out of range change nothing.
pub fn apply(design: &Design, action: &Action) -> Design {
    let mut d = design.clone();
    match *action {
        Action::LimitPhase { phase, pressure } => {
            let stage = match d
                .remote_stages
                .iter()
                .position(|r| (r.value - pressure.value).abs() < 1.0)
            {
                Some(stage) => stage,
                None => {
                    d.remote_stages.push(pressure);
                    d.remote_stages.len() - 1
                }
            };
            if let Some(s) = d.phase_settings.get_mut(phase) {
                s.limit = ActiveLimit::Remote { stage };
            }
        }
        Action::VentPhase { phase } => {
            if let Some(s) = d.phase_settings.get_mut(phase) {
                s.limit = ActiveLimit::Vented;
                s.idle_path = IdlePath::Vented;
            }
        }
        Action::SetMain { pressure } => d.relief.setting = pressure,
        Action::SetUnloading { pump, pressure } => {
            if let Some(s) = pump
                .checked_sub(1)
                .and_then(|i| d.unloading_stages.get_mut(i))
            {
                s.unloading.setting = pressure;
            }
        }
        Action::RemoveRemote { stage } => {
            if stage < d.remote_stages.len() {
                d.remote_stages.remove(stage);
                for s in &mut d.phase_settings {
                    s.limit = match s.limit {
                        ActiveLimit::Remote { stage: k } if k == stage => ActiveLimit::Main,
                        ActiveLimit::Remote { stage: k } if k > stage => {
                            ActiveLimit::Remote { stage: k - 1 }
                        }
                        other => other,
                    };
                }
            }
        }
    }
    d
}

/// `job` with `action` applied to a proposed design: the design `shown` if it is not the
/// baseline, else the second design, else a new copy of the baseline named "Proposed". The
/// baseline ("as found") is never changed. Returns the job and the design changed.
pub fn apply_to_proposed(job: &Job, shown: usize, action: &Action) -> (Job, usize) {
    let mut job = job.clone();
    let Some(baseline) = job.designs.first() else {
        // Nothing to propose from: unchanged.
        return (job, 0);
    };
    let target = if shown > 0 && shown < job.designs.len() {
        shown
    } else if job.designs.len() > 1 {
        1
    } else {
        let copy = Design::proposal_from(baseline, job.next_proposal_name());
        job.designs.push(copy);
        1
    };
    job.designs[target] = apply(&job.designs[target], action);
    (job, target)
}

/// What `action` saves on `design`: in phase `phase` (W) and per year (kWh). Solved, not
/// estimated.
fn saving(
    job: &Job,
    design: &Design,
    before: &DesignReport,
    action: &Action,
    phase: Option<usize>,
) -> (f64, f64) {
    let after = solve_design(job, &apply(design, action));
    let in_phase = phase
        .and_then(|i| {
            Some(
                before.phases.get(i)?.ledger.electrical_input.value
                    - after.phases.get(i)?.ledger.electrical_input.value,
            )
        })
        .unwrap_or(0.0);
    (
        in_phase,
        before.totals.annual_energy_kwh - after.totals.annual_energy_kwh,
    )
}

/// Every piece of advice for design `index` of a job, most serious first; the job's input
/// errors if it is invalid (or if it has no design `index`).
pub fn advise(job: &Job, index: usize) -> Result<Vec<Advice>, Vec<InputError>> {
    super::validate::validate(job)?;
    let Some(design) = job.designs.get(index) else {
        return Err(vec![InputError {
            field: "designs".into(),
            message: format!(
                "there is no power unit {} (the job has {})",
                index + 1,
                job.designs.len()
            ),
        }]);
    };
    let policy = &job.advice;
    let us = job.units == super::units::UnitSystem::UsCustomary;
    let before = solve_design(job, design);
    let needs = phase_needs(job, design);
    let rating = system_rating(design);
    let vent_port = design.relief.kind.has_vent_port();
    let main = design.relief.setting.value;
    let cracking_fraction = design.relief.cracking_fraction;
    let floor = compensator_floor(design, policy);
    let dead_head = compensator_dead_head(design);
    // No limit the compensator rule forbids is ever proposed.
    let allowed = |p: f64| floor.is_none_or(|f| p >= f * (1.0 - 1e-9));
    let below_compensator = |limit: f64| floor.is_some_and(|f| limit < f * (1.0 - 1e-9));
    let mut advice = Vec::new();
    let mut push = |severity, rule, action: Option<Action>, phase: Option<usize>| {
        let (saving_w, annual_saving_kwh) = action
            .map(|a| saving(job, design, &before, &a, phase))
            .unwrap_or((0.0, 0.0));
        advice.push(Advice {
            severity,
            rule,
            action,
            saving_w,
            annual_saving_kwh,
        });
    };

    for (i, need) in needs.iter().enumerate() {
        let limit = need.limit_pa;
        match (need.need_pa, need.lowest_pa) {
            (Some(n), Some(lowest)) => {
                if lowest > rating {
                    push(
                        Severity::Caution,
                        Rule::BeyondRating {
                            phase: i,
                            lowest_pa: lowest,
                            rating_pa: rating,
                        },
                        None,
                        None,
                    );
                    continue;
                }
                let target = round_up_setting(lowest, us).min(main);
                let held = job.cycle.get(i).is_some_and(|ph| held_by_pump(&ph.kind));
                let on_main = design
                    .phase_settings
                    .get(i)
                    .is_none_or(|s| s.limit == ActiveLimit::Main);
                if on_main && below_compensator(limit) {
                    // The main relief's own rule says it once, for every phase on it.
                    continue;
                }
                if limit < lowest * (1.0 - 1e-9) {
                    // Raising a phase's limit past main means raising main: the cycle rule does.
                    let action = (vent_port && target >= lowest && allowed(target)).then_some(
                        Action::LimitPhase {
                            phase: i,
                            pressure: pascals(target),
                        },
                    );
                    let (need_pa, limit_pa, lowest_pa) = (n, limit, lowest);
                    let cracking = limit * cracking_fraction;
                    let (severity, rule) =
                        if let (true, Some(dead_head_pa)) = (below_compensator(limit), dead_head) {
                            let severity = if cracking <= dead_head_pa {
                                Severity::Caution
                            } else {
                                Severity::Note
                            };
                            (
                                severity,
                                Rule::BelowCompensator {
                                    phase: Some(i),
                                    limit_pa,
                                    cracking_pa: cracking,
                                    dead_head_pa,
                                    lowest_pa,
                                },
                            )
                        } else if held {
                            (
                                Severity::Caution,
                                Rule::HoldBelowNeed {
                                    phase: i,
                                    need_pa,
                                    limit_pa,
                                },
                            )
                        } else if cracking < n {
                            (
                                Severity::Caution,
                                Rule::LimitBelowNeed {
                                    phase: i,
                                    need_pa,
                                    limit_pa,
                                    lowest_pa,
                                },
                            )
                        } else {
                            (
                                Severity::Note,
                                Rule::MarginThin {
                                    phase: i,
                                    need_pa,
                                    limit_pa,
                                    lowest_pa,
                                },
                            )
                        };
                    push(severity, rule, action, Some(i));
                } else if target < limit * (1.0 - 1e-9) && vent_port && allowed(target) {
                    let action = Action::LimitPhase {
                        phase: i,
                        pressure: pascals(target),
                    };
                    let (w, _) = saving(job, design, &before, &action, Some(i));
                    if w >= policy.least_saving_w {
                        push(
                            Severity::Saving,
                            Rule::LimitAboveNeed {
                                phase: i,
                                need_pa: n,
                                limit_pa: limit,
                                lowest_pa: lowest,
                            },
                            Some(action),
                            Some(i),
                        );
                    }
                }
            }
            _ => {
                let vented = limit <= design.vent_pressure.value * (1.0 + 1e-9);
                let stopped = design.phase_settings.get(i).is_some_and(|s| {
                    job.cycle
                        .get(i)
                        .is_some_and(|ph| matches!(ph.kind, PhaseKind::Idle(_)))
                        && matches!(
                            s.idle_path,
                            IdlePath::MotorStopped | IdlePath::OpenCentre { .. }
                        )
                });
                if vented || stopped {
                    continue;
                }
                if vent_port {
                    let action = Action::VentPhase { phase: i };
                    let (w, _) = saving(job, design, &before, &action, Some(i));
                    if w >= policy.least_saving_w {
                        push(
                            Severity::Saving,
                            Rule::NeedsNoPressure {
                                phase: i,
                                limit_pa: limit,
                                vent_pa: design.vent_pressure.value,
                            },
                            Some(action),
                            Some(i),
                        );
                    }
                } else {
                    push(Severity::Note, Rule::NoVentPort { phase: i }, None, None);
                }
            }
        }
    }

    // The main relief serves the most demanding phase (remote stages only go lower), and
    // never lets the system line past the pump's rating.
    let highest = cycle_lowest_limit(&needs);
    if let (Some(f), Some(dead_head_pa), true) = (floor, dead_head, below_compensator(main)) {
        let lowest = highest.map_or(f, |h| h.max(f));
        let target = round_up_setting(lowest, us);
        let action = (target <= rating).then_some(Action::SetMain {
            pressure: pascals(target),
        });
        let cracking = main * cracking_fraction;
        push(
            if cracking <= dead_head_pa {
                Severity::Caution
            } else {
                Severity::Note
            },
            Rule::BelowCompensator {
                phase: None,
                limit_pa: main,
                cracking_pa: cracking,
                dead_head_pa,
                lowest_pa: lowest,
            },
            action,
            None,
        );
    } else if main > rating * (1.0 + 1e-9) {
        let action = highest
            .filter(|h| *h <= rating)
            .map(|h| round_up_setting(h, us).min(rating))
            .filter(|p| allowed(*p))
            .map(|p| Action::SetMain {
                pressure: pascals(p),
            });
        push(
            Severity::Caution,
            Rule::MainAboveRating {
                main_pa: main,
                rating_pa: rating,
            },
            action,
            None,
        );
    } else if let Some(highest) = highest {
        if highest <= rating {
            let target = round_up_setting(highest, us).min(rating);
            if main < highest * (1.0 - 1e-9) {
                push(
                    Severity::Caution,
                    Rule::MainBelowNeed {
                        main_pa: main,
                        lowest_pa: highest,
                    },
                    Some(Action::SetMain {
                        pressure: pascals(target),
                    }),
                    None,
                );
            } else if target < main * (1.0 - 1e-9) {
                let action = Action::SetMain {
                    pressure: pascals(target),
                };
                let (_, kwh) = saving(job, design, &before, &action, None);
                // A lower main also narrows the margin against a pressure spike: worth it
                // only when it saves energy; otherwise a note.
                let severity = if kwh > 0.0 {
                    Severity::Saving
                } else {
                    Severity::Note
                };
                push(
                    severity,
                    Rule::MainAboveNeed {
                        main_pa: main,
                        lowest_pa: highest,
                    },
                    Some(action),
                    None,
                );
            }
        }
    }

    unloading_advice(job, design, &needs, us, &mut push);

    for (stage, remote) in design.remote_stages.iter().enumerate() {
        let action = Some(Action::RemoveRemote { stage });
        if remote.value >= main {
            push(
                Severity::Note,
                Rule::RemoteRedundant {
                    stage,
                    remote_pa: remote.value,
                    main_pa: main,
                },
                action,
                None,
            );
        } else if !design
            .phase_settings
            .iter()
            .any(|s| s.limit == ActiveLimit::Remote { stage })
        {
            push(
                Severity::Note,
                Rule::RemoteUnused {
                    stage,
                    remote_pa: remote.value,
                },
                action,
                None,
            );
        }
    }

    advice.sort_by(|a, b| {
        a.severity
            .cmp(&b.severity)
            .then(b.annual_saving_kwh.total_cmp(&a.annual_saving_kwh))
    });
    Ok(advice)
}

/// Where pump `k`'s unloading valve may be set (numbered from 0 among the unloading stages):
/// above the highest need of the phases that need its flow (plus the margin), below the lowest
/// need of the phases that should run without it (less the margin). A move at all pump flow
/// needs pump `k`'s flow when the motor can carry it with pumps `k` onward feeding (stages
/// unload in shaft order, pump 1 first); a metered move or a direct demand needs it when the
/// pumps after it cannot give the flow; holds never do.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum UnloadingWindow {
    /// Any setting from `low` to `high` (Pa; `high` infinite when no phase should run
    /// without the pump).
    Open {
        low: f64,
        high: f64,
        /// The phase that sets `low`, if any: none when no phase needs the pump's flow.
        with_phase: Option<usize>,
        /// The phase that sets `high`, if any.
        without_phase: Option<usize>,
    },
    /// The two phases that no setting can both serve, and their needs.
    Impossible {
        with_phase: usize,
        with_pa: f64,
        without_phase: usize,
        without_pa: f64,
    },
}

/// How to judge whether a move at all pump flow needs an unloading pump's flow.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum FlowNeed<'a> {
    /// While the motor (rating x service factor) can carry the move with that pump and the
    /// ones after it feeding: the advice on a unit as it stands, whose motor is given.
    MotorCarries,
    /// While the pumps after it alone would make the move slower than its longest time (s, one
    /// per phase; `None`: keep the flow): the staging search, where the motor is still to be
    /// chosen and the move times are the constraint.
    MoveTimes(&'a [Option<f64>]),
}

/// The window for pump `k` as the advice judges it ([`FlowNeed::MotorCarries`]).
pub fn unloading_window(
    job: &Job,
    design: &Design,
    needs: &[PhaseNeed],
    k: usize,
) -> UnloadingWindow {
    unloading_window_by(job, design, needs, k, FlowNeed::MotorCarries)
}

/// The window for pump `k`, judging which moves need its flow by `rule`. Under
/// [`FlowNeed::MoveTimes`] a phase that could run without the pump but sits below the pressure
/// the others need it to, within the margin, keeps it (it runs faster than it must): the window
/// is then never empty for want of a choice the search could make.
pub fn unloading_window_by(
    job: &Job,
    design: &Design,
    needs: &[PhaseNeed],
    k: usize,
    rule: FlowNeed,
) -> UnloadingWindow {
    let policy = &job.advice;
    let rps = design.motor.revolutions_per_second();
    let pumps: Vec<PumpAtSpeed> = design.pumps().map(|p| PumpAtSpeed::new(p, rps)).collect();
    let motor_limit = design.motor.rated_power.value * design.motor.service_factor;
    // Out-of-range `k` (no such stage) reads as a pump with none after it.
    let from = |i: usize| pumps.get(i.min(pumps.len())..).unwrap_or(&[]);
    let later_flow = |p: f64| from(k + 1).iter().map(|q| q.delivered(p)).sum::<f64>();
    // (phase, needs the flow, its pressure without the pump, its pressure with it)
    let mut judged: Vec<(usize, bool, f64, f64)> = Vec::new();
    for (i, phase) in job.cycle.iter().enumerate() {
        let Some(need) = needs.get(i).and_then(|n| n.need_pa) else {
            continue;
        };
        // A metered move or a direct demand that takes less than the feeding pumps give
        // leaves the rest to cross the relief: the system then runs at the phase's limit,
        // not at its need.
        let demand = match &phase.kind {
            PhaseKind::Move(m) => match m.speed {
                SpeedRule::AllPumpFlow => None,
                SpeedRule::MeteredSpeed { speed } => {
                    Some(speed.value * m.cylinder.working_area_m2(m.direction))
                }
                SpeedRule::MeteredFlow { flow } => Some(flow.value),
            },
            PhaseKind::Direct(d) => Some(d.flow.value),
            PhaseKind::Hold(_) | PhaseKind::Idle(_) => None,
        };
        let supply: f64 = from(k).iter().map(|q| q.delivered(need)).sum();
        let runs_at_limit = demand.is_some_and(|q| q < supply * (1.0 - 1e-9));
        let needs_flow = match &phase.kind {
            PhaseKind::Move(m) => match m.speed {
                SpeedRule::AllPumpFlow => match rule {
                    FlowNeed::MotorCarries => {
                        let shaft: f64 = from(k)
                            .iter()
                            .map(|q| q.shaft_power(need, q.delivered(need)))
                            .sum();
                        shaft <= motor_limit
                    }
                    FlowNeed::MoveTimes(times) => {
                        let volume =
                            m.cylinder.working_area_m2(m.direction) * m.cylinder.stroke.value;
                        match times.get(i).copied().flatten() {
                            Some(longest) => volume > later_flow(need) * longest,
                            None => true,
                        }
                    }
                },
                SpeedRule::MeteredSpeed { speed } => {
                    speed.value * m.cylinder.working_area_m2(m.direction) > later_flow(need)
                }
                SpeedRule::MeteredFlow { flow } => flow.value > later_flow(need),
            },
            PhaseKind::Direct(d) => d.flow.value > later_flow(need),
            PhaseKind::Hold(_) | PhaseKind::Idle(_) => false,
        };
        let with_pressure = if runs_at_limit {
            need.max(needs.get(i).map_or(need, |n| n.limit_pa))
        } else {
            need
        };
        judged.push((i, needs_flow, need, with_pressure));
    }
    let margin = |p: f64| (p * policy.margin_fraction).max(policy.margin_min.value);
    let low_of = |judged: &[(usize, bool, f64, f64)]| {
        judged
            .iter()
            .filter(|j| j.1)
            .map(|j| (j.0, j.3))
            .reduce(|a, b| if b.1 > a.1 { b } else { a })
    };
    if matches!(rule, FlowNeed::MoveTimes(_)) {
        // Keep the pump in every phase the setting could not sit below with its margin.
        while let Some((_, top)) = low_of(&judged) {
            let low = top + margin(top);
            let mut changed = false;
            for j in judged.iter_mut().filter(|j| !j.1) {
                if j.2 - margin(j.2) < low {
                    j.1 = true;
                    changed = true;
                }
            }
            if !changed {
                break;
            }
        }
    }
    let with = low_of(&judged);
    let without = judged
        .iter()
        .filter(|j| !j.1)
        .map(|j| (j.0, j.2))
        .reduce(|a, b| if b.1 < a.1 { b } else { a });
    let vent = design.vent_pressure.value;
    // With no phase needing the pump's flow, it may unload from the start.
    let low = with.map_or(vent, |(_, p)| p + margin(p));
    let high = without.map_or(f64::INFINITY, |(_, p)| (p - margin(p)).max(vent));
    let without_phase = without.map(|(i, _)| i);
    match (with, without) {
        (Some((with_phase, with_pa)), Some((without_phase, without_pa))) if low > high => {
            UnloadingWindow::Impossible {
                with_phase,
                with_pa,
                without_phase,
                without_pa,
            }
        }
        _ => UnloadingWindow::Open {
            low,
            high: high.max(low),
            with_phase: with.map(|(i, _)| i),
            without_phase,
        },
    }
}

/// The setting the advice proposes inside an open window: its low end (the pump unloads as
/// early as the phases allow), rounded up to a gauge step when that stays inside, and never
/// below the vent pressure.
pub fn proposed_unloading(low: f64, high: f64, design: &Design, us: bool) -> f64 {
    let target = round_up_setting(low.max(design.vent_pressure.value), us);
    if target > high {
        low
    } else {
        target
    }
}

/// Whether a stage's unloading valve can be set at `setting` (Pa): above the pressure it drops
/// to unloaded, and with its check valve's cracking pressure within the pump's rating.
pub(crate) fn unloading_fits(stage: &UnloadingStage, setting: f64) -> bool {
    setting > stage.unloading.unloaded_drop.value
        && setting + stage.check.cracking.value <= stage.pump.rated_pressure.value
}

fn unloading_advice(
    job: &Job,
    design: &Design,
    needs: &[PhaseNeed],
    us: bool,
    push: &mut impl FnMut(Severity, Rule, Option<Action>, Option<usize>),
) {
    for (k, stage) in design.unloading_stages.iter().enumerate() {
        let setting = stage.unloading.setting.value;
        let pump = k + 1;
        let cracking = stage.check.cracking.value;
        let rating = stage.pump.rated_pressure.value;
        let window = unloading_window(job, design, needs, k);
        if setting + cracking > rating * (1.0 + 1e-9) {
            let action = match window {
                UnloadingWindow::Open { low, high, .. } => {
                    let target = proposed_unloading(low, high, design, us);
                    unloading_fits(stage, target).then_some(Action::SetUnloading {
                        pump,
                        pressure: pascals(target),
                    })
                }
                UnloadingWindow::Impossible { .. } => None,
            };
            push(
                Severity::Caution,
                Rule::UnloadingAboveRating {
                    pump,
                    setting_pa: setting,
                    cracking_pa: cracking,
                    rating_pa: rating,
                },
                action,
                None,
            );
            continue;
        }
        match window {
            UnloadingWindow::Impossible {
                with_phase,
                with_pa,
                without_phase,
                without_pa,
            } => push(
                Severity::Caution,
                Rule::UnloadingImpossible {
                    pump,
                    with_phase,
                    with_pa,
                    without_phase,
                    without_pa,
                },
                None,
                None,
            ),
            UnloadingWindow::Open {
                low,
                high,
                without_phase,
                ..
            } if setting < low || setting > high => {
                let target = proposed_unloading(low, high, design, us);
                let action = unloading_fits(stage, target).then_some(Action::SetUnloading {
                    pump,
                    pressure: pascals(target),
                });
                // Too low, the pump unloads where its flow is needed (a slow move); too high,
                // it keeps feeding at pressure: power and heat, and where that phase is a move
                // at all pump flow, more than the motor can carry.
                let overloads = without_phase.and_then(|i| job.cycle.get(i)).is_some_and(|ph| {
                    matches!(&ph.kind, PhaseKind::Move(m) if m.speed == SpeedRule::AllPumpFlow)
                });
                let severity = if setting < low || overloads {
                    Severity::Caution
                } else {
                    Severity::Saving
                };
                push(
                    severity,
                    Rule::UnloadingOutside {
                        pump,
                        setting_pa: setting,
                        window: (low, high),
                    },
                    action,
                    None,
                );
            }
            UnloadingWindow::Open { .. } => {}
        }
    }
}

/// A piece of advice in words: a heading, the rule and the numbers behind it, and what its
/// action does.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct Described {
    pub title: String,
    pub explanation: String,
    pub action: Option<String>,
    /// What the action does to the power drawn, solved: "Saves 686 W in the phase and 154 kWh
    /// a year." A rise is never called a saving; a change to the whole cycle says nothing of
    /// one phase. `None` when there is no action or it changes nothing worth a word.
    pub effect: Option<String>,
}

impl Advice {
    /// The action's effect in words (see [`Described::effect`]).
    pub fn effect(&self, units: super::units::UnitSystem) -> Option<String> {
        let action = self.action?;
        // Below these a solved difference is rounding, not a change worth a word.
        const LEAST_W: f64 = 0.5;
        const LEAST_KWH: f64 = 0.5;
        let in_one_phase = matches!(action, Action::LimitPhase { .. } | Action::VentPhase { .. });
        let w = if in_one_phase { self.saving_w } else { 0.0 };
        let kwh = self.annual_saving_kwh;
        let mut clauses = Vec::new();
        if w > LEAST_W {
            clauses.push(format!("saves {} in the phase", units.power(w)));
        } else if w < -LEAST_W {
            clauses.push(format!("draws {} more in the phase", units.power(-w)));
        }
        let saves_in_phase = w > LEAST_W;
        if kwh > LEAST_KWH {
            clauses.push(if saves_in_phase {
                format!("{kwh:.0} kWh a year")
            } else {
                format!("saves {kwh:.0} kWh a year")
            });
        } else if kwh < -LEAST_KWH {
            clauses.push(format!("costs {:.0} kWh a year more", -kwh));
        }
        let mut sentence = clauses.join(" and ");
        let first = sentence.chars().next()?;
        sentence.replace_range(..first.len_utf8(), &first.to_uppercase().to_string());
        if w < -LEAST_W || kwh < -LEAST_KWH {
            sentence.push_str(": the price of a setting that does its job safely");
        }
        sentence.push('.');
        Some(sentence)
    }
}

impl Advice {
    /// The advice in plain words, with the job's phase names and units.
    pub fn describe(&self, job: &Job) -> Described {
        let u = job.units;
        let p = |pa: f64| u.pressure(pa);
        let phase = |i: usize| {
            job.cycle.get(i).map_or(format!("Phase {}", i + 1), |ph| {
                format!("Phase {} ({})", i + 1, ph.name)
            })
        };
        let phase_in = |i: usize| {
            job.cycle.get(i).map_or(format!("phase {}", i + 1), |ph| {
                format!("phase {} ({})", i + 1, ph.name)
            })
        };
        let margin = format!(
            "{:.0} % or {}, whichever is more",
            job.advice.margin_fraction * 100.0,
            p(job.advice.margin_min.value)
        );
        let is_held = |i: usize| job.cycle.get(i).is_some_and(|ph| held_by_pump(&ph.kind));
        let floor_words = if job
            .designs
            .iter()
            .any(|d| compensator_dead_head(d).is_some())
        {
            ", and on a unit with a compensated pump, the relief kept above the compensator"
        } else {
            ""
        };
        let (title, explanation) = match self.rule {
            Rule::LimitAboveNeed { phase: i, need_pa, limit_pa, lowest_pa } => (
                format!("{}: a lower limit would do", phase(i)),
                if is_held(i) {
                    format!(
                        "It must hold {} but sits at {}: the pump's flow crosses the relief at the limit, so the extra pressure is extra clamp force and heat. A limit of {} holds it (the pump's flow over the valve at that setting gives that pressure).",
                        p(need_pa), p(limit_pa), p(lowest_pa)
                    )
                } else {
                    format!(
                        "It needs {} but works against {}; the surplus flow crosses the relief (or the flow control) at that pressure as heat. The lowest limit that serves it is {} (the margin of {margin} above the need, and the valve's cracking pressure above it{}).",
                        p(need_pa), p(limit_pa), p(lowest_pa), floor_words
                    )
                },
            ),
            Rule::HoldBelowNeed { phase: i, need_pa, limit_pa } => (
                format!("{}: the limit is below the pressure to hold", phase(i)),
                format!(
                    "It must hold {} but its limit is {}: the pump's flow crosses the relief there, short of the pressure the hold needs. Its limit must be at least {}.",
                    p(need_pa), p(limit_pa), p(need_pa)
                ),
            ),
            Rule::BelowCompensator { phase: i, limit_pa, cracking_pa, dead_head_pa, lowest_pa } => (
                match i {
                    Some(i) => format!("{}: the limit is at the compensator", phase(i)),
                    None => "Main relief: at or below the compensator".to_string(),
                },
                format!(
                    "The limit of {} starts to open at {}; the compensated pump only destrokes at {}. {} Keep the relief at least {} ({:.0} % or {} above the compensator, whichever is more, with its cracking above it).",
                    p(limit_pa),
                    p(cracking_pa),
                    p(dead_head_pa),
                    if cracking_pa <= dead_head_pa {
                        "The pump never destrokes: its whole flow crosses the relief at that pressure, the commonest fault on such units and a frequent cause of hot oil."
                    } else {
                        "It opens just above the compensator, with less margin than the rule asks: a pressure peak or a drifting compensator sends the pump's flow over it."
                    },
                    p(lowest_pa),
                    job.advice.margin_fraction * 100.0,
                    p(job.advice.compensator_margin_min.value)
                ),
            ),
            Rule::LimitBelowNeed { phase: i, need_pa, limit_pa, lowest_pa } => (
                format!("{}: the limit is too close to the work", phase(i)),
                format!(
                    "It needs {} and its limit is {}: the relief starts to open before the work is done, so flow leaks over it, or the load stalls. It needs at least {} ({margin} above the need, cracking above it).",
                    p(need_pa), p(limit_pa), p(lowest_pa)
                ),
            ),
            Rule::MarginThin { phase: i, need_pa, limit_pa, lowest_pa } => (
                format!("{}: less margin than the rule asks", phase(i)),
                format!(
                    "It needs {} and its limit is {}: the valve stays shut while working, but with less than the margin of {margin}, so a pressure peak or a drifting pilot reaches the relief. The rule asks for at least {}.",
                    p(need_pa), p(limit_pa), p(lowest_pa)
                ),
            ),
            Rule::NeedsNoPressure { phase: i, limit_pa, vent_pa } => (
                format!("{}: needs no pressure, vent it", phase(i)),
                format!(
                    "No work is done, yet the pump's flow crosses a limit of {}. Venting the relief sends it to tank at the vent pressure ({}).",
                    p(limit_pa),
                    p(vent_pa)
                ),
            ),
            Rule::NoVentPort { phase: i } => (
                format!("{}: needs no pressure", phase(i)),
                "The flow crosses the relief at pressure, but a direct-acting relief has no vent port: an open-centre valve, a vent-capable pilot-operated relief, or stopping the motor would save it.".to_string(),
            ),
            Rule::BeyondRating { phase: i, lowest_pa, rating_pa } => (
                format!("{}: beyond the pump's rating", phase(i)),
                format!(
                    "With the margin it needs a limit of {}, above the {} rating of the pump to the relief. No setting serves it safely: the load, the bore or the components must change.",
                    p(lowest_pa), p(rating_pa)
                ),
            ),
            Rule::MainAboveNeed { main_pa, lowest_pa } => (
                "Main relief: higher than the cycle needs".to_string(),
                format!(
                    "Set at {}; the most demanding phase needs a limit of {} ({margin} above its pressure). Every phase on the main setting works against the excess.",
                    p(main_pa), p(lowest_pa)
                ),
            ),
            Rule::MainBelowNeed { main_pa, lowest_pa } => (
                "Main relief: lower than the cycle needs".to_string(),
                format!(
                    "Set at {}; the most demanding phase needs a limit of {}: it leaks over the relief or stalls.",
                    p(main_pa), p(lowest_pa)
                ),
            ),
            Rule::MainAboveRating { main_pa, rating_pa } => (
                "Main relief: above the pump's rating".to_string(),
                format!(
                    "Set at {}, above the {} rating of the pump to the relief: a stalled load or a closed valve takes the pump past what its maker allows. Set the main relief at or below the rating.",
                    p(main_pa), p(rating_pa)
                ),
            ),
            Rule::UnloadingAboveRating { pump, setting_pa, cracking_pa, rating_pa } => (
                format!("Pump {pump}: sees more than its rating before it unloads"),
                format!(
                    "Its unloading valve is set at {} and its check valve cracks at {}: its outlet reaches {} before it unloads, above its rating of {}.",
                    p(setting_pa), p(cracking_pa), p(setting_pa + cracking_pa), p(rating_pa)
                ),
            ),
            Rule::UnloadingOutside { pump, setting_pa, window: (low, high) } => (
                format!("Pump {pump}: unloading setting outside its window"),
                format!(
                    "Set at {}. The phases that need its flow need up to {} with the margin, and the phases that should run without it start from {} less the margin: a setting from {} to {} serves both.",
                    p(setting_pa),
                    p(low),
                    if high.is_finite() { p(high) } else { "nothing".into() },
                    p(low),
                    if high.is_finite() { p(high) } else { "the relief".into() }
                ),
            ),
            Rule::UnloadingImpossible { pump, with_phase, with_pa, without_phase, without_pa } => (
                format!("Pump {pump}: no unloading setting serves both"),
                format!(
                    "{} needs its flow up to {}, and {} should run without it from {}: with the margin of {margin} the two overlap. Change the pumps or the phases (a slower move, or a remote stage and a check-held hold).",
                    phase(with_phase), p(with_pa), phase(without_phase), p(without_pa)
                ),
            ),
            Rule::RemoteRedundant { stage, remote_pa, main_pa } => (
                format!("Remote stage {}: never governs", stage + 1),
                format!("Set at {}, not below the main {}: the lower setting always governs.", p(remote_pa), p(main_pa)),
            ),
            Rule::RemoteUnused { stage, remote_pa } => (
                format!("Remote stage {}: no phase uses it", stage + 1),
                format!("Set at {}, but no phase selects it.", p(remote_pa)),
            ),
        };
        let action = self.action.map(|a| match a {
            Action::LimitPhase { phase: i, pressure } => {
                format!(
                    "Govern {} by a remote stage at {}",
                    phase_in(i),
                    p(pressure.value)
                )
            }
            Action::VentPhase { phase: i } => {
                format!("Vent the relief in {}", phase_in(i))
            }
            Action::SetMain { pressure } => format!("Set the main relief to {}", p(pressure.value)),
            Action::SetUnloading { pump, pressure } => {
                format!("Set pump {pump}'s unloading valve to {}", p(pressure.value))
            }
            Action::RemoveRemote { stage } => format!("Remove remote stage {}", stage + 1),
        });
        Described {
            title,
            explanation,
            action,
            effect: self.effect(u),
        }
    }
}
