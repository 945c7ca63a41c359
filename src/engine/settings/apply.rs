//! Applying a piece of advice's action to a design, and what it saves, solved.

use super::*;
use crate::job::Job;
use crate::power_unit::Design;
use crate::solve::{oil_at, solve_design_at, DesignReport};
use crate::valve::{ActiveLimit, IdlePath};
use uom::si::energy::kilowatt_hour;

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
pub(super) fn saving(
    job: &Job,
    design: &Design,
    before: &DesignReport,
    action: &Action,
    phase: Option<usize>,
) -> (Power, f64) {
    // At the oil temperature `before` was worked out at: the saving is the action's, not the
    // cooler oil's it would also bring.
    let oil = oil_at(job, before.oil.working_temperature);
    let after = solve_design_at(job, &apply(design, action), &oil);
    let in_phase = phase
        .and_then(|i| {
            Some(
                before.phases.get(i)?.ledger.electrical_input.value
                    - after.phases.get(i)?.ledger.electrical_input.value,
            )
        })
        .unwrap_or(0.0);
    (
        crate::units::watts(in_phase),
        before.totals.annual_energy.get::<kilowatt_hour>()
            - after.totals.annual_energy.get::<kilowatt_hour>(),
    )
}
