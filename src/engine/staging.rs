//! The pump-staging search: which fixed pumps (one to three, from a list of standard
//! displacements), at which motor speed, with which unloading settings, or a single
//! pressure-compensated pump, serve the cycle with the smallest standard motor and then the
//! least energy, no slower than the user allows.
//!
//! Each candidate is a real design, solved over the whole cycle: its pumps take the baseline's
//! efficiencies (drag scaled with displacement), its unloading settings and main relief come
//! from the settings rules ([`super::settings`]), idles and check-held holds are vented where
//! the relief allows. Nothing is estimated from rules of thumb.
//!
//! # Candidates
//!
//! `specs(options)` lists every candidate: at each speed, every multiset of one to
//! `max_pumps` sizes (the larger sizes on the unloading stages, the smallest as the base
//! pump), then one compensated pump of each size. The defaults (18 R10 sizes, 4 speeds, up to
//! three pumps, compensated on) give 5,388. [`build`] makes each a design from the baseline:
//! pumps with the baseline's efficiencies and rating (drag in proportion to displacement), the
//! baseline's first stage's unloading drop and check, the relief's main setting at the cycle's
//! lowest serving limit (`settings::cycle_lowest_limit`), each unloading valve at its window's
//! low end, idles and check-held holds vented where the relief has a vent port; a compensated
//! pump governs at that limit with the relief at the advice's compensator floor. Each pump
//! keeps the baseline's leakage flow (its volumetric efficiency is stated at the baseline's
//! motor speed, `Pump::efficiency_speed`), so a slower candidate leaks a larger share.
//!
//! Which moves a staged pump must feed is judged by the move times, not by a motor (the motor
//! is what the search chooses): `settings::unloading_window_by(.., FlowNeed::MoveTimes(times))`
//! counts a move at all pump flow as needing pump `k` when the pumps after it alone would take
//! longer than the move's target ([`targets`]: the move's `target_time`, or its time as
//! found). A move that could do without the pump but sits within a margin of the pressure
//! where the others need it keeps it (it runs faster than it must), so the window is never
//! empty for a choice the search could make. The advice uses `FlowNeed::MotorCarries` (the
//! unit's own motor). A spec is dropped when a staged pump would never feed (the spec without
//! it is also tried), never unload, sit at or below its unloaded drop, or see more than its
//! rating, or when the main setting is above the pump rating.
//!
//! # Evaluation and ranking
//!
//! [`evaluate`] solves it, drops it if any phase stalls, hunts, misses its hold or its metered
//! flow, a move takes longer than its target, or the cycle longer than the options'
//! `cycle_time_target` (none by default: the moves' targets and the set times bound it), then
//! picks the smallest standard motor (IEC kW or NEMA hp steps) whose rating x service factor
//! covers the RMS shaft power and rating x peak allowance the peak, gives it the nominal
//! full-load efficiency of the options' `efficiency_class` at that size (IE3 for IEC steps and
//! NEMA Premium for NEMA steps when absent; a size outside the class's table takes the nearer
//! end's figure), and recomputes the energy with that motor's losses. The candidate's motor
//! carries those two factors, so the engine's motor findings on the applied design agree with
//! the search. Ranking: motor, then energy per cycle, then cycle time.
//!
//! [`Search`] keeps the best five ([`KEPT`]) and, per motor size, the shortest cycle (the
//! trade-off chart). The UI runs it in slices of about 16 ms (batches of 50 candidates until
//! the slice is used), handing the thread back between slices, with a progress bar.
//! `cargo run --release -p phasewise-engine --example staging -- [job.json]` prints a search's
//! counts, best candidates and trade-off.
//!
//! Modelling choices to know: every candidate motor keeps the baseline's fixed-loss share, and
//! the 4-pole efficiency tables serve every speed; stages unload in shaft order; the relief's
//! rated flow is the baseline's. [`search`] and [`Search::new`] return the job's (or the
//! options') input errors instead of assuming a valid job.

use super::cycle::PhaseKind;
use super::drive::{
    motor_apparent_power, ConverterClass, ConverterLoss, DriveKind, HoldSpeed, IdleSpeed,
    MotorCooling, VariableSpeed,
};
use super::finding::Finding;
use super::job::Job;
use super::ledger::CycleTotals;
use super::motor::Motor;
use super::power_unit::{Design, UnloadingStage};
use super::pump::{Pump, PumpControl};
use super::settings::{self, FlowNeed, UnloadingWindow};
use super::solve::{electrical_losses, oil_at, solve_design_at, solve_design_working, OilAt};
use super::units::{joules, pascals, watts};
use super::validate::InputError;
use super::valve::{ActiveLimit, CheckValve, IdlePath, UnloadingValve};
use serde::Serialize;
use uom::si::f64::{AngularVelocity, Energy, Power, Time, Volume};

pub use super::policy::{MotorSteps, StagingOptions, IEC_KW, NEMA_HP};

/// What to build: pump displacements in shaft order (the unloading stages, largest first, then
/// the base pump), the speed, and whether the single pump is compensated.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Spec {
    #[serde(rename = "displacements_m3_per_rev")]
    pub displacements: Vec<f64>,
    #[serde(rename = "speed_rad_per_s")]
    pub speed: f64,
    pub compensated: bool,
    /// On a variable-speed drive: its slowest speed (`speed` is then its fastest, the motor's
    /// full-load speed). None at fixed speed.
    #[serde(
        rename = "min_speed_rad_per_s",
        skip_serializing_if = "Option::is_none"
    )]
    pub min_speed: Option<f64>,
}

/// The kinds of design the search tries.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum CandidateKind {
    /// One to three fixed pumps at fixed speed, the larger ones unloading.
    Staged,
    /// One pressure-compensated pump at fixed speed.
    Compensated,
    /// One fixed pump on a variable-speed drive.
    VariableSpeed,
}

impl Spec {
    pub fn kind(&self) -> CandidateKind {
        match (self.min_speed, self.compensated) {
            (Some(_), _) => CandidateKind::VariableSpeed,
            (None, true) => CandidateKind::Compensated,
            (None, false) => CandidateKind::Staged,
        }
    }
}

/// A point of the trade-off: for one kind of design and one motor size, the shortest cycle
/// some candidate reaches.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Trade {
    pub kind: CandidateKind,
    #[serde(rename = "motor_w")]
    pub motor: f64,
    #[serde(rename = "cycle_time_s")]
    pub cycle_time: f64,
}

/// A candidate that meets every constraint, with what ranks it.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Candidate {
    pub spec: Spec,
    /// The smallest standard motor that covers the RMS and the peak (W).
    #[serde(rename = "motor_w")]
    pub motor: Power,
    #[serde(rename = "cycle_time_s")]
    pub cycle_time: Time,
    #[serde(rename = "energy_per_cycle_j")]
    pub energy_per_cycle: Energy,
    #[serde(rename = "rms_shaft_w")]
    pub rms_shaft: Power,
    #[serde(rename = "peak_shaft_w")]
    pub peak_shaft: Power,
    /// The design, ready to become the proposed one.
    pub design: Design,
}

impl Candidate {
    /// The ranking: smaller motor first, then less energy, then the shorter cycle.
    fn key(&self) -> (f64, f64, f64) {
        (
            self.motor.value,
            self.energy_per_cycle.value,
            self.cycle_time.value,
        )
    }

    pub fn ranks_before(&self, other: &Candidate) -> bool {
        let (a, b) = (self.key(), other.key());
        a.0.total_cmp(&b.0)
            .then(a.1.total_cmp(&b.1))
            .then(a.2.total_cmp(&b.2))
            .is_lt()
    }
}

/// What the search found.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct SearchResult {
    /// Candidates built and solved.
    pub evaluated: usize,
    /// Of those, how many met every constraint.
    pub feasible: usize,
    /// The best few, best first.
    pub best: Vec<Candidate>,
    /// The trade-off: for each kind of design and each motor size that some candidate of that
    /// kind fits, the shortest cycle time reached with it; by kind, smallest motor first.
    pub frontier: Vec<Trade>,
}

/// How many of the best candidates are kept.
pub const KEPT: usize = 5;

/// Every spec the options allow, in a fixed order: for each speed, one to `max_pumps` fixed
/// pumps (sizes with repetition, largest on the unloading stages), then the compensated ones.
pub fn specs(options: &StagingOptions) -> Vec<Spec> {
    let mut sizes: Vec<f64> = options
        .displacements
        .iter()
        .map(|v| v.value)
        .filter(|v| v.is_finite() && *v > 0.0)
        .collect();
    sizes.sort_by(|a, b| b.total_cmp(a));
    sizes.dedup();
    let mut out = Vec::new();
    for speed in options.speeds.iter().map(|s| s.value).filter(|s| *s > 0.0) {
        // Non-increasing sequences of sizes: each multiset once.
        fn extend(
            sizes: &[f64],
            from: usize,
            left: usize,
            current: &mut Vec<f64>,
            speed: f64,
            out: &mut Vec<Spec>,
        ) {
            if !current.is_empty() {
                out.push(Spec {
                    displacements: current.clone(),
                    speed,
                    compensated: false,
                    min_speed: None,
                });
            }
            if left == 0 {
                return;
            }
            for i in from..sizes.len() {
                current.push(sizes[i]);
                extend(sizes, i, left - 1, current, speed, out);
                current.pop();
            }
        }
        extend(
            &sizes,
            0,
            options.max_pumps.clamp(1, 3),
            &mut Vec::new(),
            speed,
            &mut out,
        );
        if options.compensated {
            for &size in &sizes {
                out.push(Spec {
                    displacements: vec![size],
                    speed,
                    compensated: true,
                    min_speed: None,
                });
            }
        }
        let drive_mins = options.drive_min_speeds.iter().filter(|_| options.drives);
        for min in drive_mins.map(|s| s.value) {
            if !(min > 0.0 && min < speed) {
                continue;
            }
            for &size in &sizes {
                out.push(Spec {
                    displacements: vec![size],
                    speed,
                    compensated: false,
                    min_speed: Some(min),
                });
            }
        }
    }
    out
}

/// The drive a variable-speed candidate gets: an induction motor on an IE2 converter sized to
/// the motor, turning the pump between `min` and `max` (rad/s); holds kept by making up the
/// leakage, idles at the slowest speed (the relief vented where it can be), and a self-cooled
/// motor, the cautious choice: slow, loaded seconds count against its size.
fn candidate_drive(motor: &Motor, min: f64, max: f64) -> VariableSpeed {
    VariableSpeed {
        kind: DriveKind::InductionOnInverter,
        min_speed: AngularVelocity::new::<uom::si::angular_velocity::radian_per_second>(min),
        max_speed: AngularVelocity::new::<uom::si::angular_velocity::radian_per_second>(max),
        converter_rating: watts(motor_apparent_power(motor)),
        converter_loss: ConverterLoss::Class {
            class: ConverterClass::IE2,
        },
        hold: HoldSpeed::MakeUpLeakage,
        idle: IdleSpeed::Minimum,
        cooling: MotorCooling::SelfCooled,
    }
}

/// A pump like `template`, of another displacement (its drag and its leakage in proportion),
/// driven by `baseline`'s motor when its volumetric efficiency was stated: at another speed the
/// same leakage is another share of the swept flow.
fn pump_like(template: &Pump, displacement: f64, baseline: &Design) -> Pump {
    let scale = displacement / template.displacement.value;
    Pump {
        displacement: Volume::new::<uom::si::volume::cubic_meter>(displacement),
        drag_power: template.drag_power * scale,
        control: PumpControl::Fixed,
        efficiency_temperature: None,
        efficiency_speed: Some(
            template
                .efficiency_speed
                .unwrap_or(baseline.motor.full_load_speed),
        ),
        ..*template
    }
}

/// The design for `spec`, from the baseline's components; `None` when no unloading setting
/// or relief setting can serve the cycle within the ratings. A staged pump feeds the moves
/// that would be slower than `targets` without it, and unloads in the rest where the
/// pressures allow.
pub fn build(job: &Job, baseline: &Design, spec: &Spec, targets: &Targets) -> Option<Design> {
    let us = job.units == super::units::UnitSystem::UsCustomary;
    let (&base_size, stage_sizes) = spec.displacements.split_last()?;
    let stage_template = baseline
        .unloading_stages
        .first()
        .copied()
        .unwrap_or(UnloadingStage {
            pump: baseline.base_pump,
            unloading: UnloadingValve {
                setting: baseline.relief.setting,
                unloaded_drop: pascals(super::valve::TYPICAL_UNLOADED_DROP_PA),
            },
            check: CheckValve {
                cracking: pascals(super::valve::TYPICAL_CHECK_CRACKING_PA),
            },
        });
    let mut design = baseline.clone();
    design.motor.full_load_speed =
        AngularVelocity::new::<uom::si::angular_velocity::radian_per_second>(spec.speed);
    design.base_pump = pump_like(&baseline.base_pump, base_size, baseline);
    design.drive = spec
        .min_speed
        .map(|min| candidate_drive(&design.motor, min, spec.speed));
    design.unloading_stages = stage_sizes
        .iter()
        .map(|&size| UnloadingStage {
            pump: pump_like(&stage_template.pump, size, baseline),
            ..stage_template
        })
        .collect();
    let vent_port = design.relief.kind.has_vent_port();
    for (setting, phase) in design.phase_settings.iter_mut().zip(&job.cycle) {
        let needs_none = settings::needed_pressure(&phase.kind, &job.advice).is_none();
        if needs_none && vent_port {
            if matches!(phase.kind, PhaseKind::Idle(_)) {
                if setting.idle_path == IdlePath::OverLimit {
                    setting.idle_path = IdlePath::Vented;
                }
            } else {
                setting.limit = ActiveLimit::Vented;
            }
        }
    }
    let needs = settings::phase_needs(job, &design);
    let rating = design.base_pump.rated_pressure.value;
    let highest = settings::cycle_lowest_limit(&needs).unwrap_or(design.vent_pressure.value);
    let main = settings::round_up_setting(highest, us);
    if spec.compensated {
        // The compensator governs at the highest need with its margin; the relief, now a
        // safety valve, sits where the advice's rule puts it: cracking above the
        // compensator's dead-head pressure, with the compensator margin.
        design.base_pump.control = PumpControl::Compensated {
            setting: pascals(main),
        };
        let relief = settings::compensator_floor(&design, &job.advice).unwrap_or(main);
        design.relief.setting = pascals(settings::round_up_setting(relief, us));
    } else {
        design.relief.setting = pascals(main);
    }
    if design.relief.setting.value > rating {
        return None;
    }
    for k in 0..design.unloading_stages.len() {
        let rule = FlowNeed::MoveTimes(&targets.phase_times);
        match settings::unloading_window_by(job, &design, &needs, k, rule) {
            UnloadingWindow::Open {
                low,
                high,
                with_phase,
                ..
            } => {
                let setting = settings::proposed_unloading(low, high, &design, us);
                if with_phase.is_none()
                    || setting >= design.relief.setting.value
                    || !settings::unloading_fits(&design.unloading_stages[k], setting)
                {
                    // The pump would never feed, or never unload (the spec without it, or
                    // with a smaller pump, serves the cycle the same), or it would see more
                    // than its rating.
                    return None;
                }
                design.unloading_stages[k].unloading.setting = pascals(setting);
            }
            UnloadingWindow::Impossible { .. } => return None,
        }
    }
    Some(design)
}

/// The limits a candidate must meet.
#[derive(Clone, Debug, PartialEq)]
pub struct Targets {
    /// The longest each phase may take (s); `None` for phases whose time is set, not driven.
    pub phase_times: Vec<Option<f64>>,
    /// The longest the cycle may take (s); `None`: no limit beyond the phases'.
    pub cycle_time: Option<f64>,
    /// The oil every candidate is worked out at: at the baseline's working temperature. A
    /// candidate that makes less heat would run a little cooler; searching each one's own
    /// heat balance would cost a few dozen solves per candidate.
    pub oil: OilAt,
}

/// The targets: each move's own target time, or its time with the baseline ("as found");
/// the options' cycle time, if any. `None` for a job with no design.
pub fn targets(job: &Job, options: &StagingOptions) -> Option<Targets> {
    let baseline = job.designs.first()?;
    let report = solve_design_working(job, baseline);
    Some(Targets {
        phase_times: job
            .cycle
            .iter()
            .zip(&report.phases)
            .map(|(phase, r)| match &phase.kind {
                PhaseKind::Move(m) => {
                    Some(m.target_time.map_or(r.point.duration.value, |t| t.value))
                }
                _ => None,
            })
            .collect(),
        cycle_time: options.cycle_time_target.map(|t| t.value),
        oil: oil_at(job, report.oil.working_temperature),
    })
}

/// The smallest standard motor of `options` whose rating x service factor carries the cycle's
/// RMS shaft power and whose rating x peak allowance carries its peak; none when no size does.
/// Its loss depends on its rating and on its class's efficiency at that rating (the nearest
/// table end outside the table; the fixed share of the loss stays `motor`'s). It carries the
/// sizing's factors, so the engine's motor findings judge it as the sizing did.
pub fn right_sized_motor(
    motor: &Motor,
    totals: &CycleTotals,
    options: &StagingOptions,
) -> Option<Motor> {
    let rms = totals.rms_shaft.value;
    let peak = totals.peak_shaft.value;
    let motor_w = options.motor_steps.ratings_w().into_iter().find(|&rated| {
        rated * options.service_factor >= rms && rated * options.peak_allowance >= peak
    })?;
    let mut sized = *motor;
    sized.rated_power = Power::new::<uom::si::power::watt>(motor_w);
    sized.full_load_efficiency = options
        .efficiency_class()
        .nominal_efficiency_or_nearest(sized.rated_power);
    sized.service_factor = options.service_factor;
    sized.peak_allowance = options.peak_allowance;
    Some(sized)
}

/// Builds, solves and sizes one spec; `None` when it misses a constraint.
pub fn evaluate(
    job: &Job,
    options: &StagingOptions,
    targets: &Targets,
    spec: &Spec,
) -> Option<Candidate> {
    let baseline = job.designs.first()?;
    let design = build(job, baseline, spec, targets)?;
    let report = solve_design_at(job, &design, &targets.oil);
    const SLACK: f64 = 1.0 + 1e-9;
    for (phase, limit) in report.phases.iter().zip(&targets.phase_times) {
        let troubled = phase.findings.iter().any(|f| {
            matches!(
                f,
                Finding::Stall { .. }
                    | Finding::Hunting { .. }
                    | Finding::HoldBelowRequired { .. }
                    | Finding::DemandUnmet { .. }
            )
        });
        if troubled || limit.is_some_and(|t| phase.point.duration.value > t * SLACK) {
            return None;
        }
    }
    let totals = &report.totals;
    if targets
        .cycle_time
        .is_some_and(|t| totals.cycle_time.value > t * SLACK)
    {
        return None;
    }
    let rms = totals.rms_shaft.value;
    let peak = totals.peak_shaft.value;
    let motor = right_sized_motor(&design.motor, totals, options)?;
    let motor_w = motor.rated_power.value;
    let mut design = design;
    design.motor = motor;
    if let Some(drive) = &mut design.drive {
        // The converter sized to the motor chosen.
        drive.converter_rating = watts(motor_apparent_power(&motor));
    }
    let energy = report
        .phases
        .iter()
        .map(|p| {
            let shaft = p.ledger.shaft_power().value;
            let share = p
                .point
                .shaft_speed
                .map_or(1.0, |w| w.value / motor.full_load_speed.value);
            let (motor_loss, drive_loss) =
                electrical_losses(&design, shaft, share, !p.point.motor_running);
            (shaft + motor_loss + drive_loss) * p.point.duration.value
        })
        .sum();
    Some(Candidate {
        spec: spec.clone(),
        motor: watts(motor_w),
        cycle_time: totals.cycle_time,
        energy_per_cycle: joules(energy),
        rms_shaft: watts(rms),
        peak_shaft: watts(peak),
        design,
    })
}

/// Searches every spec the options allow; the job's and the options' input errors if either
/// is invalid.
pub fn search(job: &Job, options: &StagingOptions) -> Result<SearchResult, Vec<InputError>> {
    let mut progress = Search::new(job.clone(), options.clone())?;
    progress.run(usize::MAX);
    Ok(progress.result())
}

/// A search that can run in slices (so a page stays responsive): `run(n)` evaluates up to `n`
/// more specs.
pub struct Search {
    job: Job,
    options: StagingOptions,
    targets: Option<Targets>,
    specs: Vec<Spec>,
    next: usize,
    feasible: usize,
    best: Vec<Candidate>,
    frontier: Vec<Trade>,
}

impl Search {
    /// A search over every spec `options` allows, for `job`; the input errors of the job, or of
    /// the options (checked as the job's own `staging`), if either is invalid.
    pub fn new(job: Job, options: StagingOptions) -> Result<Search, Vec<InputError>> {
        super::validate::validate(&Job {
            staging: options.clone(),
            ..job.clone()
        })?;
        Ok(Search {
            targets: targets(&job, &options),
            specs: specs(&options),
            job,
            options,
            next: 0,
            feasible: 0,
            best: Vec::new(),
            frontier: Vec::new(),
        })
    }

    pub fn total(&self) -> usize {
        self.specs.len()
    }

    pub fn done(&self) -> usize {
        self.next
    }

    pub fn run(&mut self, count: usize) {
        let Some(targets) = self.targets.clone() else {
            self.next = self.specs.len();
            return;
        };
        let end = self.next.saturating_add(count).min(self.specs.len());
        for i in self.next..end {
            if let Some(c) = evaluate(&self.job, &self.options, &targets, &self.specs[i]) {
                self.feasible += 1;
                let kind = c.spec.kind();
                match self
                    .frontier
                    .iter_mut()
                    .find(|t| t.kind == kind && t.motor == c.motor.value)
                {
                    Some(t) => t.cycle_time = t.cycle_time.min(c.cycle_time.value),
                    None => self.frontier.push(Trade {
                        kind,
                        motor: c.motor.value,
                        cycle_time: c.cycle_time.value,
                    }),
                }
                let at = self
                    .best
                    .iter()
                    .position(|b| c.ranks_before(b))
                    .unwrap_or(self.best.len());
                if at < KEPT {
                    self.best.insert(at, c);
                    self.best.truncate(KEPT);
                }
            }
        }
        self.next = end;
    }

    pub fn result(&self) -> SearchResult {
        let mut frontier = self.frontier.clone();
        frontier.sort_by(|a, b| {
            (a.kind as u8)
                .cmp(&(b.kind as u8))
                .then(a.motor.total_cmp(&b.motor))
        });
        SearchResult {
            evaluated: self.next,
            feasible: self.feasible,
            best: self.best.clone(),
            frontier,
        }
    }
}

/// `job` with `candidate`'s design as the proposed one (see
/// [`settings::apply_to_proposed`] for which design that is); the baseline never changes.
pub fn apply_candidate(job: &Job, shown: usize, candidate: &Candidate) -> (Job, usize) {
    let mut job = job.clone();
    let Some(baseline) = job.designs.first().cloned() else {
        // No baseline to compare with: the candidate becomes the job's only design.
        job.designs.push(candidate.design.clone());
        return (job, 0);
    };
    let mark = baseline.machine_mark();
    let target = if shown > 0 && shown < job.designs.len() {
        shown
    } else if job.designs.len() > 1 {
        1
    } else {
        job.designs.push(baseline);
        1
    };
    let name =
        if target == 1 && job.designs.len() == 2 && job.designs[1].name == job.designs[0].name {
            "Proposed".to_string()
        } else {
            job.designs[target].name.clone()
        };
    // The candidate keeps the price quoted for the design it replaces.
    job.designs[target] = Design {
        name,
        retrofit_price: job.designs[target].retrofit_price,
        made_from: Some(mark),
        ..candidate.design.clone()
    };
    (job, target)
}
