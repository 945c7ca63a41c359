//! Unloading windows: where each unloading valve may be set, judged by which phases need its
//! pump's flow, and the setting the advice proposes inside a window.

use super::*;
use crate::cycle::{PhaseKind, SpeedRule};
use crate::job::Job;
use crate::power_unit::{Design, UnloadingStage};
use crate::pump::PumpAtSpeed;

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
        let Some(need) = needs.get(i).and_then(|n| n.need.map(|p| p.value)) else {
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
            need.max(needs.get(i).map_or(need, |n| n.limit.value))
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
