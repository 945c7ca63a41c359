//! The advice rules: every piece of advice for a design, most serious first.

use super::*;
use crate::cycle::{PhaseKind, SpeedRule};
use crate::job::Job;
use crate::power_unit::Design;
use crate::solve::solve_design_working;
use crate::units::watts;
use crate::validate::InputError;
use crate::valve::{ActiveLimit, IdlePath};

/// Every piece of advice for design `index` of a job, most serious first; the job's input
/// errors if it is invalid (or if it has no design `index`).
pub fn advise(job: &Job, index: usize) -> Result<Vec<Advice>, Vec<InputError>> {
    crate::validate::validate(job)?;
    let Some(design) = job.designs.get(index) else {
        return Err(vec![InputError {
            field: crate::fields::DESIGNS.at(&[]),
            words: crate::fields::DESIGNS.words(),
            message: format!(
                "there is no power unit {} (the job has {})",
                index + 1,
                job.designs.len()
            ),
        }]);
    };
    let policy = &job.advice;
    let us = job.units == crate::units::UnitSystem::UsCustomary;
    let before = solve_design_working(job, design);
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
        let (saving, annual_saving_kwh) = action
            .map(|a| saving(job, design, &before, &a, phase))
            .unwrap_or((watts(0.0), 0.0));
        advice.push(Advice {
            severity,
            rule,
            action,
            saving,
            annual_saving_kwh,
        });
    };

    for (i, need) in needs.iter().enumerate() {
        let limit = need.limit.value;
        match (need.need.map(|p| p.value), need.lowest.map(|p| p.value)) {
            (Some(n), Some(lowest)) => {
                if lowest > rating {
                    push(
                        Severity::Caution,
                        Rule::BeyondRating {
                            phase: i,
                            lowest: pascals(lowest),
                            rating: pascals(rating),
                        },
                        None,
                        None,
                    );
                    continue;
                }
                let target = round_up_setting(lowest, us).min(main);
                let held = job
                    .cycle
                    .get(i)
                    .is_some_and(|ph| held_at_limit(&ph.kind, design));
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
                                    limit: pascals(limit_pa),
                                    cracking: pascals(cracking),
                                    dead_head: pascals(dead_head_pa),
                                    lowest: pascals(lowest_pa),
                                },
                            )
                        } else if held {
                            (
                                Severity::Caution,
                                Rule::HoldBelowNeed {
                                    phase: i,
                                    need: pascals(need_pa),
                                    limit: pascals(limit_pa),
                                },
                            )
                        } else if cracking < n {
                            (
                                Severity::Caution,
                                Rule::LimitBelowNeed {
                                    phase: i,
                                    need: pascals(need_pa),
                                    limit: pascals(limit_pa),
                                    lowest: pascals(lowest_pa),
                                },
                            )
                        } else {
                            (
                                Severity::Note,
                                Rule::MarginThin {
                                    phase: i,
                                    need: pascals(need_pa),
                                    limit: pascals(limit_pa),
                                    lowest: pascals(lowest_pa),
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
                    if w.value >= policy.least_saving_w {
                        push(
                            Severity::Saving,
                            Rule::LimitAboveNeed {
                                phase: i,
                                need: pascals(n),
                                limit: pascals(limit),
                                lowest: pascals(lowest),
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
                    if w.value >= policy.least_saving_w {
                        push(
                            Severity::Saving,
                            Rule::NeedsNoPressure {
                                phase: i,
                                limit: pascals(limit),
                                vent: pascals(design.vent_pressure.value),
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
                limit: pascals(main),
                cracking: pascals(cracking),
                dead_head: pascals(dead_head_pa),
                lowest: pascals(lowest),
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
                main: pascals(main),
                rating: pascals(rating),
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
                        main: pascals(main),
                        lowest: pascals(highest),
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
                        main: pascals(main),
                        lowest: pascals(highest),
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
                    remote: pascals(remote.value),
                    main: pascals(main),
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
                    remote: pascals(remote.value),
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

pub(super) fn unloading_advice(
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
                    setting: pascals(setting),
                    cracking: pascals(cracking),
                    rating: pascals(rating),
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
                    with: pascals(with_pa),
                    without_phase,
                    without: pascals(without_pa),
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
                        setting: pascals(setting),
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
