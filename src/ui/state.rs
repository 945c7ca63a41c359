//! The job being edited, and what the engine says about it: shared by every area through
//! Leptos context. The UI keeps no physics of its own: every figure it shows comes from the
//! engine's report for the current job (or, while the job has errors, the last good one).

use crate::engine::job::RemovedPhase;
use crate::engine::units::UnitSystem;
use crate::engine::{solve, InputError, Job, JobReport};
use leptos::prelude::*;
use std::sync::Arc;

/// The engine's answer, shared rather than copied: results, stale notices and the live strip
/// all read the same one.
pub type Outcome = Result<Arc<JobReport>, Arc<Vec<InputError>>>;

/// What the engine says about each pump test of the job: its report, or its input errors.
pub type PumpTestOutcomes =
    Arc<Vec<Result<crate::engine::efficiency::TestReport, Vec<InputError>>>>;
pub type MotorCheckOutcomes =
    Arc<Vec<Result<crate::engine::motor_load::MotorCheckReport, Vec<InputError>>>>;

/// A change that threw something away (a design removed, a proposed design overwritten), kept
/// so one tap puts the job back as it was.
#[derive(Clone, Debug, PartialEq)]
pub struct Undo {
    /// Where it was done (the bar that offers it shows there): "unit", "advice", "staging".
    pub place: &'static str,
    /// What was done, in words ("Removed “Proposed”").
    pub what: String,
    /// The job before it, and the design shown then.
    pub before: Job,
    pub design: usize,
    /// The job just after it: the undo is offered only while the job is still this (any later
    /// edit would be lost by it).
    pub after: Job,
}

#[derive(Clone, Copy)]
pub struct JobState {
    pub job: RwSignal<Job>,
    /// The engine's answer for the current job.
    pub result: Memo<Outcome>,
    /// Each pump test checked and assessed once per change of the job (computed only when
    /// read: the pump-check area and its fields share it).
    pub pump_tests: Memo<PumpTestOutcomes>,
    /// Each motor check read once per change of the job (computed only when read).
    pub motor_checks: Memo<MotorCheckOutcomes>,
    /// The last report of a job without errors: shown, marked stale, while the job has errors.
    pub last_good: RwSignal<Option<Arc<JobReport>>>,
    /// The design the power-unit and results areas show.
    pub design: RwSignal<usize>,
    /// The phase open for editing in the cycle area.
    pub open_phase: RwSignal<Option<usize>>,
    /// The last phase deleted, until it is restored or another goes.
    pub deleted: RwSignal<Option<RemovedPhase>>,
    /// The last change that threw something away, while it can still be undone.
    pub undo: RwSignal<Option<Undo>>,
    /// What was typed into each number field (by path) that is not a number: the job holds NaN
    /// there, so the text itself is kept here, to be shown again when the field is (a move to
    /// another area and back must not wipe what the user is correcting).
    pub typed_text: StoredValue<std::collections::HashMap<String, String>>,
}

impl JobState {
    /// The state for `job`.
    pub fn new(job: Job) -> JobState {
        let job = RwSignal::new(job);
        // Every new answer counts as a change: comparing two reports field by field costs as
        // much as drawing them, and nearly every edit changes the report anyway.
        let result = Memo::new_with_compare(
            move |_| job.with(|j| solve(j).map(Arc::new).map_err(Arc::new)),
            |_, _| true,
        );
        let pump_tests = Memo::new_with_compare(
            move |_| {
                job.with(|j| {
                    Arc::new(
                        j.pump_tests
                            .iter()
                            .enumerate()
                            .map(|(i, t)| {
                                // Refused: the same checks, named by their paths in the job.
                                crate::engine::efficiency::assess(t, &j.wear, j.units).map_err(
                                    |_| crate::engine::validate::validate_pump_test(t, i, j.units),
                                )
                            })
                            .collect(),
                    )
                })
            },
            |_, _| true,
        );
        let motor_checks = Memo::new_with_compare(
            move |_| {
                job.with(|j| {
                    Arc::new(
                        j.motor_checks
                            .iter()
                            .enumerate()
                            .map(|(i, c)| {
                                crate::engine::motor_load::assess_motor(j, c, j.units).map_err(
                                    |_| {
                                        crate::engine::validate::validate_motor_check(
                                            c, i, j, j.units,
                                        )
                                    },
                                )
                            })
                            .collect(),
                    )
                })
            },
            |_, _| true,
        );
        // Kept by an effect, not a memo: a memo is only computed when read, and the results
        // may not be on screen while the job is still good.
        let last_good = RwSignal::new(None);
        Effect::new(move |_| {
            if let Ok(report) = result.get() {
                last_good.set(Some(report));
            }
        });
        JobState {
            job,
            result,
            pump_tests,
            motor_checks,
            last_good,
            design: RwSignal::new(0),
            open_phase: RwSignal::new(None),
            deleted: RwSignal::new(None),
            undo: RwSignal::new(None),
            typed_text: StoredValue::new(Default::default()),
        }
    }

    /// Changes the job by `change`, keeping what it was so the change can be undone (see
    /// [`Undo`]); `what` says what was done, `place` where its bar shows.
    pub fn change_with_undo(
        &self,
        place: &'static str,
        what: String,
        change: impl FnOnce(&mut Job),
    ) {
        let before = self.job.get_untracked();
        let design = self.design.get_untracked();
        self.job.update(|j| {
            change(j);
            // An edit makes an example the user's own (as the autosave would next), so the job
            // the undo is offered against is the one that stays.
            crate::engine::demo::claim(j);
        });
        self.undo.set(Some(Undo {
            place,
            what,
            before,
            design,
            after: self.job.get_untracked(),
        }));
    }

    /// Puts another job in place of the open one (opened, or started new): nothing shown or
    /// kept for the job before it stays (its last good report, its undo, its typed text).
    pub fn replace_job(&self, job: Job) {
        self.typed_text.update_value(|kept| kept.clear());
        self.last_good.set(None);
        self.undo.set(None);
        self.deleted.set(None);
        self.design.set(0);
        self.open_phase.set(None);
        self.job.set(job);
    }

    pub fn units(&self) -> UnitSystem {
        self.job.with(|j| j.units)
    }

    /// The engine's message for a field (by its path in the job file), if it has one. A pump
    /// test's or a motor check's fields are judged by its own checks (they never stop the
    /// job's results), then by what its readings say (a flow above what the pump sweeps, ...).
    pub fn error_for(&self, field: &str) -> Option<String> {
        if let Some(message) = self
            .pump_tests
            .with(|tests| field_check_message(tests, "pump_tests[", field, |r| &r.problems))
        {
            return message;
        }
        if let Some(message) = self
            .motor_checks
            .with(|checks| field_check_message(checks, "motor_checks[", field, |r| &r.problems))
        {
            return message;
        }
        self.result.with(|r| match r {
            Ok(_) => None,
            Err(errors) => errors
                .iter()
                .find(|e| e.field == field)
                .map(|e| e.message.clone()),
        })
    }

    /// The design index to show, kept inside the job's designs.
    pub fn design_index(&self) -> usize {
        let count = self.job.with(|j| j.designs.len());
        self.design.get().min(count.saturating_sub(1))
    }
}

/// For a path into a field check's list (`list` is its start, `pump_tests[`): `Some` with the
/// check's message for the field (its input error, else the problem its report names there),
/// `None` for a path outside the list.
fn field_check_message<R>(
    outcomes: &[Result<R, Vec<InputError>>],
    list: &str,
    field: &str,
    problems: impl Fn(&R) -> &[crate::engine::efficiency::Problem],
) -> Option<Option<String>> {
    let rest = field.strip_prefix(list)?;
    let message = (|| {
        let (index, inner) = rest.split_once("].")?;
        let index: usize = index.parse().ok()?;
        match outcomes.get(index)? {
            Err(errors) => errors
                .iter()
                .find(|e| e.field == field)
                .map(|e| e.message.clone()),
            Ok(report) => problems(report)
                .iter()
                .find(|p| p.field == inner)
                .map(|p| p.message.clone()),
        }
    })();
    Some(message)
}

pub fn use_job() -> JobState {
    expect_context::<JobState>()
}
