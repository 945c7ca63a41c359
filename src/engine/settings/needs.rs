//! What each phase needs: its pressure, the lowest limit that serves it, and the cycle's.

use super::*;
use crate::cycle::{HoldMode, PhaseKind, SpeedRule};
use crate::job::Job;
use crate::power_unit::Design;

/// What one phase needs, and what its limit is.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct PhaseNeed {
    /// The system pressure the phase needs; `None` for an idle, or a hold a check valve keeps.
    #[serde(rename = "need_pa")]
    pub need: Option<Pressure>,
    /// The governing limit now.
    #[serde(rename = "limit_pa")]
    pub limit: Pressure,
    /// The lowest limit that serves the need with the margin and above the valve's cracking.
    #[serde(rename = "lowest_pa")]
    pub lowest: Option<Pressure>,
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
        crate::units::PSI * 10.0
    } else {
        crate::units::BAR
    };
    (pa / step - 1e-9).ceil() * step
}

/// The governing limit of phase `i` of `design`, as the solver uses it (Pa).
pub(super) fn governing(design: &Design, i: usize, idle: bool) -> f64 {
    let setting = design.phase_settings.get(i).copied().unwrap_or_default();
    crate::solve::governing_limit(design, &setting, idle).1
}

/// A hold the pump keeps with its flow over the relief at the limit: not one a check valve
/// locks, nor one a variable-speed drive keeps by making up the leakage (there the relief is a
/// safety valve above the hold, as above any working pressure).
pub(super) fn held_at_limit(kind: &PhaseKind, design: &Design) -> bool {
    let by_speed = design
        .drive
        .is_some_and(|d| d.hold == crate::drive::HoldSpeed::MakeUpLeakage);
    matches!(kind, PhaseKind::Hold(h) if h.mode == HoldMode::HeldByPump) && !by_speed
}

/// The lowest limit that serves a phase needing `need` (Pa) on `design`. A hold the pump keeps
/// sits at its limit with the pump's whole flow over the relief (the limit is read that way),
/// so its limit is its need, with no margin: a higher one only adds clamp force and heat.
/// Every other need takes [`lowest_limit`], and so does a hold a variable-speed drive keeps by
/// its speed. Either way never below [`compensator_floor`].
pub fn lowest_limit_for(
    kind: &PhaseKind,
    need: f64,
    policy: &AdvicePolicy,
    design: &Design,
) -> f64 {
    let rule = if held_at_limit(kind, design) {
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
                need: need.map(pascals),
                limit: pascals(governing(
                    design,
                    i,
                    matches!(phase.kind, PhaseKind::Idle(_)),
                )),
                lowest: need
                    .map(|n| lowest_limit_for(&phase.kind, n, policy, design))
                    .map(pascals),
            }
        })
        .collect()
}

/// The lowest limit that serves the cycle's most demanding phase (Pa): what the main relief
/// must give. `None` when no phase needs pressure.
pub fn cycle_lowest_limit(needs: &[PhaseNeed]) -> Option<f64> {
    needs
        .iter()
        .filter_map(|n| n.lowest.map(|p| p.value))
        .reduce(f64::max)
}

/// The lowest pressure rating on the system line: the base pump sees system pressure.
pub(super) fn system_rating(design: &Design) -> f64 {
    design.base_pump.rated_pressure.value
}
