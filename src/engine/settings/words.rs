//! The advice in plain words, with the job's phase names and units.

use super::*;
use crate::job::Job;

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
    pub fn effect(&self, units: crate::units::UnitSystem) -> Option<String> {
        let action = self.action?;
        // Below these a solved difference is rounding, not a change worth a word.
        const LEAST_W: f64 = 0.5;
        const LEAST_KWH: f64 = 0.5;
        let in_one_phase = matches!(action, Action::LimitPhase { .. } | Action::VentPhase { .. });
        let w = if in_one_phase { self.saving.value } else { 0.0 };
        let kwh = self.annual_saving_kwh;
        let mut clauses = Vec::new();
        if w > LEAST_W {
            clauses.push(format!(
                "saves {} in the phase",
                units.power(crate::units::watts(w))
            ));
        } else if w < -LEAST_W {
            clauses.push(format!(
                "draws {} more in the phase",
                units.power(crate::units::watts(-w))
            ));
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
        let p = |pa: Pressure| u.pressure(pa);
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
            p(job.advice.margin_min)
        );
        // A hold advised its own pressure as its limit sits at it; one a drive keeps by its
        // speed is advised a margin like any working need.
        let is_held = |i: usize, need: Pressure, lowest: Pressure| {
            job.cycle.get(i).is_some_and(|ph| {
                matches!(&ph.kind, crate::cycle::PhaseKind::Hold(h) if h.mode == crate::cycle::HoldMode::HeldByPump)
            }) && lowest.value <= need.value * (1.0 + 1e-9)
        };
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
            Rule::LimitAboveNeed { phase: i, need, limit, lowest } => (
                format!("{}: a lower limit would do", phase(i)),
                if is_held(i, need, lowest) {
                    format!(
                        "It must hold {} but sits at {}: the pump's flow crosses the relief at the limit, so the extra pressure is extra clamp force and heat. A limit of {} holds it (the pump's flow over the valve at that setting gives that pressure).",
                        p(need), p(limit), p(lowest)
                    )
                } else {
                    format!(
                        "It needs {} but works against {}; the surplus flow crosses the relief (or the flow control) at that pressure as heat. The lowest limit that serves it is {} (the margin of {margin} above the need, and the valve's cracking pressure above it{}).",
                        p(need), p(limit), p(lowest), floor_words
                    )
                },
            ),
            Rule::HoldBelowNeed { phase: i, need, limit } => (
                format!("{}: the limit is below the pressure to hold", phase(i)),
                format!(
                    "It must hold {} but its limit is {}: the pump's flow crosses the relief there, short of the pressure the hold needs. Its limit must be at least {}.",
                    p(need), p(limit), p(need)
                ),
            ),
            Rule::BelowCompensator { phase: i, limit, cracking, dead_head, lowest } => (
                match i {
                    Some(i) => format!("{}: the limit is at the compensator", phase(i)),
                    None => "Main relief: at or below the compensator".to_string(),
                },
                format!(
                    "The limit of {} starts to open at {}; the compensated pump only destrokes at {}. {} Keep the relief at least {} ({:.0} % or {} above the compensator, whichever is more, with its cracking above it).",
                    p(limit),
                    p(cracking),
                    p(dead_head),
                    if cracking <= dead_head {
                        "The pump never destrokes: its whole flow crosses the relief at that pressure, the commonest fault on such units and a frequent cause of hot oil."
                    } else {
                        "It opens just above the compensator, with less margin than the rule asks: a pressure peak or a drifting compensator sends the pump's flow over it."
                    },
                    p(lowest),
                    job.advice.margin_fraction * 100.0,
                    p(job.advice.compensator_margin_min)
                ),
            ),
            Rule::LimitBelowNeed { phase: i, need, limit, lowest } => (
                format!("{}: the limit is too close to the work", phase(i)),
                format!(
                    "It needs {} and its limit is {}: the relief starts to open before the work is done, so flow leaks over it, or the load stalls. It needs at least {} ({margin} above the need, cracking above it).",
                    p(need), p(limit), p(lowest)
                ),
            ),
            Rule::MarginThin { phase: i, need, limit, lowest } => (
                format!("{}: less margin than the rule asks", phase(i)),
                format!(
                    "It needs {} and its limit is {}: the valve stays shut while working, but with less than the margin of {margin}, so a pressure peak or a drifting pilot reaches the relief. The rule asks for at least {}.",
                    p(need), p(limit), p(lowest)
                ),
            ),
            Rule::NeedsNoPressure { phase: i, limit, vent } => (
                format!("{}: needs no pressure, vent it", phase(i)),
                format!(
                    "No work is done, yet the pump's flow crosses a limit of {}. Venting the relief sends it to tank at the vent pressure ({}).",
                    p(limit),
                    p(vent)
                ),
            ),
            Rule::NoVentPort { phase: i } => (
                format!("{}: needs no pressure", phase(i)),
                "The flow crosses the relief at pressure, but a direct-acting relief has no vent port: an open-centre valve, a vent-capable pilot-operated relief, or stopping the motor would save it.".to_string(),
            ),
            Rule::BeyondRating { phase: i, lowest, rating } => (
                format!("{}: beyond the pump's rating", phase(i)),
                format!(
                    "With the margin it needs a limit of {}, above the {} rating of the pump to the relief. No setting serves it safely: the load, the bore or the components must change.",
                    p(lowest), p(rating)
                ),
            ),
            Rule::MainAboveNeed { main, lowest } => (
                "Main relief: higher than the cycle needs".to_string(),
                format!(
                    "Set at {}; the most demanding phase needs a limit of {} ({margin} above its pressure). Every phase on the main setting works against the excess.",
                    p(main), p(lowest)
                ),
            ),
            Rule::MainBelowNeed { main, lowest } => (
                "Main relief: lower than the cycle needs".to_string(),
                format!(
                    "Set at {}; the most demanding phase needs a limit of {}: it leaks over the relief or stalls.",
                    p(main), p(lowest)
                ),
            ),
            Rule::MainAboveRating { main, rating } => (
                "Main relief: above the pump's rating".to_string(),
                format!(
                    "Set at {}, above the {} rating of the pump to the relief: a stalled load or a closed valve takes the pump past what its maker allows. Set the main relief at or below the rating.",
                    p(main), p(rating)
                ),
            ),
            Rule::UnloadingAboveRating { pump, setting, cracking, rating } => (
                format!("Pump {pump}: sees more than its rating before it unloads"),
                format!(
                    "Its unloading valve is set at {} and its check valve cracks at {}: its outlet reaches {} before it unloads, above its rating of {}.",
                    p(setting), p(cracking), p(setting + cracking), p(rating)
                ),
            ),
            Rule::UnloadingOutside { pump, setting, window: (low, high) } => (
                format!("Pump {pump}: unloading setting outside its window"),
                format!(
                    "Set at {}. The phases that need its flow need up to {} with the margin, and the phases that should run without it start from {} less the margin: a setting from {} to {} serves both.",
                    p(setting),
                    p(pascals(low)),
                    if high.is_finite() { p(pascals(high)) } else { "nothing".into() },
                    p(pascals(low)),
                    if high.is_finite() { p(pascals(high)) } else { "the relief".into() }
                ),
            ),
            Rule::UnloadingImpossible { pump, with_phase, with, without_phase, without } => (
                format!("Pump {pump}: no unloading setting serves both"),
                format!(
                    "{} needs its flow up to {}, and {} should run without it from {}: with the margin of {margin} the two overlap. Change the pumps or the phases (a slower move, or a remote stage and a check-held hold).",
                    phase(with_phase), p(with), phase(without_phase), p(without)
                ),
            ),
            Rule::RemoteRedundant { stage, remote, main } => (
                format!("Remote stage {}: never governs", stage + 1),
                format!("Set at {}, not below the main {}: the lower setting always governs.", p(remote), p(main)),
            ),
            Rule::RemoteUnused { stage, remote } => (
                format!("Remote stage {}: no phase uses it", stage + 1),
                format!("Set at {}, but no phase selects it.", p(remote)),
            ),
        };
        let action = self.action.map(|a| match a {
            Action::LimitPhase { phase: i, pressure } => {
                format!(
                    "Govern {} by a remote stage at {}",
                    phase_in(i),
                    p(pressure)
                )
            }
            Action::VentPhase { phase: i } => {
                format!("Vent the relief in {}", phase_in(i))
            }
            Action::SetMain { pressure } => format!("Set the main relief to {}", p(pressure)),
            Action::SetUnloading { pump, pressure } => {
                format!("Set pump {pump}'s unloading valve to {}", p(pressure))
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
