//! The solve: every phase's consistent operating point, and its power ledger.
//!
//! Which pumps feed the system depends on system pressure (each unloading valve is piloted
//! from it), and the pressure depends on the flow (through the relief's characteristic and
//! the pumps' leakage). So for each phase every unloading state is tried, fewest pumps
//! unloaded first, and the first whose pressure agrees with every valve's setting is kept.
//! When none agrees the valve hunts: the state nearest to agreeing is kept and the finding
//! says so. Within a state every flow is a straight line in pressure between breakpoints, so
//! each balance is solved exactly, without iteration.

use super::cycle::{HoldMode, Phase, PhaseKind, SpeedRule};
use super::finding::{Finding, CURRENT_DIFFERENCE_SHARE};
use super::job::Job;
use super::ledger::PowerLedger;
use super::ledger::{Comparison, CycleTotals};
use super::power_unit::{Design, PhaseSetting};
use super::pump::PumpControl;
use super::units::{cubic_metres_per_second, pascals, seconds_of, watts};
use super::validate::InputError;
use super::valve::{ActiveLimit, IdlePath, ReliefCharacteristic};
use serde::Serialize;
use uom::si::f64::{Pressure, Time, Velocity, VolumeRate};

pub(crate) use super::delivery::governing_limit;
use super::delivery::{PreparedUnit, NO_FLOW};

/// One phase at its operating point.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct PhaseReport {
    pub name: String,
    pub point: OperatingPoint,
    pub ledger: PowerLedger,
    /// The line current and power factor, when the motor's electrical nameplate is entered
    /// and it runs.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub line: Option<super::electrical::LineDraw>,
    pub findings: Vec<Finding>,
}

#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct OperatingPoint {
    #[serde(rename = "system_pressure_pa")]
    pub system_pressure: Pressure,
    /// Each pump in shaft order.
    pub pumps: Vec<PumpPoint>,
    #[serde(rename = "actuator_flow_m3_per_s")]
    pub actuator_flow: VolumeRate,
    /// For a move: the cylinder's speed.
    #[serde(rename = "actuator_speed_m_per_s")]
    pub actuator_speed: Option<Velocity>,
    #[serde(rename = "relief_flow_m3_per_s")]
    pub relief_flow: VolumeRate,
    #[serde(rename = "duration_s")]
    pub duration: Time,
    /// The pressure limit that governs the phase.
    pub limit: LimitInUse,
    pub motor_running: bool,
}

#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct LimitInUse {
    pub limit: ActiveLimit,
    /// The governing setting (the lower of main and remote; the vent pressure when vented).
    #[serde(rename = "setting_pa")]
    pub setting: Pressure,
    #[serde(rename = "cracking_pa")]
    pub cracking: Pressure,
}

#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct PumpPoint {
    pub state: PumpState,
    #[serde(rename = "outlet_pressure_pa")]
    pub outlet_pressure: Pressure,
    #[serde(rename = "flow_m3_per_s")]
    pub flow: VolumeRate,
    #[serde(rename = "shaft_power_w")]
    pub shaft_power: uom::si::f64::Power,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum PumpState {
    /// Delivering into the system through its check valve.
    Feeding,
    /// Sent to tank by its unloading valve.
    Unloaded,
    /// The motor is off.
    Stopped,
}

/// Everything the engine says about a job.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct JobReport {
    /// One per design, in the job's order.
    pub designs: Vec<DesignReport>,
    /// Each design after the first against the first (the baseline).
    pub comparisons: Vec<Comparison>,
}

#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct DesignReport {
    pub name: String,
    pub phases: Vec<PhaseReport>,
    pub totals: CycleTotals,
    /// Findings about the design as a whole: its settings and its motor.
    pub findings: Vec<Finding>,
}

/// Solves every design of a job over its cycle.
pub fn solve(job: &Job) -> Result<JobReport, Vec<InputError>> {
    super::validate::validate(job)?;
    let designs: Vec<DesignReport> = job
        .designs
        .iter()
        .map(|design| solve_design(job, design))
        .collect();
    let baseline = &designs[0];
    let comparisons = designs[1..]
        .iter()
        .zip(&job.designs[1..])
        .map(|(d, design)| {
            super::ledger::compare(
                (&baseline.name, &baseline.totals),
                (&d.name, &d.totals),
                design.retrofit_price_or(&job.site),
            )
        })
        .collect();
    Ok(JobReport {
        designs,
        comparisons,
    })
}

/// Solves one (validated) design over the job's cycle.
pub(crate) fn solve_design(job: &Job, design: &Design) -> DesignReport {
    let unit = PreparedUnit::new(design);
    let mut phases: Vec<PhaseReport> = job
        .cycle
        .iter()
        .zip(&design.phase_settings)
        .map(|(phase, setting)| solve_phase(&unit, phase, setting))
        .collect();
    for (report, phase) in phases.iter_mut().zip(&job.cycle) {
        if let Some(f) = flow_control_starved(phase, report, &job.advice) {
            report.findings.push(f);
        }
    }
    let mut reactive_note = None;
    if let Some(rating) = &design.motor.electrical {
        for (report, setting) in phases.iter_mut().zip(&design.phase_settings) {
            draw_from_line(report, &design.motor, rating, setting);
        }
        if let Some(threshold) = job.site.power_factor_threshold {
            reactive_note = power_factor_below(&phases, rating, threshold);
        }
    }
    let timed: Vec<super::ledger::TimedLedger> = phases
        .iter()
        .map(|p| super::ledger::TimedLedger {
            ledger: p.ledger,
            duration: p.point.duration,
            motor_running: p.point.motor_running,
        })
        .collect();
    let totals = super::ledger::cycle_totals(&timed, &job.site, &job.oil);
    let mut findings = design_findings(design);
    findings.extend(reactive_note);
    findings.extend(super::ledger::motor_findings(
        &design.motor,
        &totals,
        &timed,
    ));
    DesignReport {
        name: design.name.clone(),
        phases,
        totals,
        findings,
    }
}

/// The phase's line current and power factor, and a finding when the current read there
/// differs from it by more than [`CURRENT_DIFFERENCE_SHARE`] of the full-load current.
fn draw_from_line(
    report: &mut PhaseReport,
    motor: &super::motor::Motor,
    rating: &super::motor::ElectricalRating,
    setting: &PhaseSetting,
) {
    if !report.point.motor_running {
        return;
    }
    let shaft = report.ledger.electrical_input - report.ledger.motor_loss;
    let draw = super::electrical::line_draw(motor, rating, report.ledger.electrical_input, shaft);
    report.line = Some(draw);
    if let Some(measured) = setting.measured_current {
        let tolerance = rating.full_load_current * CURRENT_DIFFERENCE_SHARE;
        if (measured - draw.current).abs() > tolerance {
            report.findings.push(Finding::CurrentDiffers {
                measured,
                expected: draw.current,
            });
        }
    }
}

/// The cycle's power factor, kWh over kVAh of the running phases, when it is below the
/// tariff's `threshold`.
fn power_factor_below(
    phases: &[PhaseReport],
    rating: &super::motor::ElectricalRating,
    threshold: f64,
) -> Option<Finding> {
    let (mut real, mut apparent) = (0.0, 0.0);
    for p in phases {
        if let Some(line) = p.line {
            let t = p.point.duration.value;
            real += p.ledger.electrical_input.value * t;
            apparent += 3f64.sqrt() * rating.voltage.value * line.current.value * t;
        }
    }
    let average = real / apparent;
    (apparent > 0.0 && average < threshold)
        .then_some(Finding::PowerFactorBelowTariff { average, threshold })
}

/// What a phase asks of the power unit, in SI numbers.
#[derive(Clone, Copy, Debug)]
enum Demand {
    Move {
        load: f64,
        line: f64,
        area: f64,
        stroke: f64,
        metered: Option<f64>,
    },
    Hold {
        required: f64,
        mode: HoldMode,
        duration: f64,
    },
    Idle {
        duration: f64,
    },
    Direct {
        flow: f64,
        pressure: f64,
        duration: f64,
    },
}

fn demand(phase: &Phase) -> Demand {
    match &phase.kind {
        PhaseKind::Move(m) => {
            let area = m.cylinder.working_area_m2(m.direction);
            let load = m.load_pressure();
            let metered = match m.speed {
                SpeedRule::AllPumpFlow => None,
                SpeedRule::MeteredSpeed { speed } => Some(speed.value * area),
                SpeedRule::MeteredFlow { flow } => Some(flow.value),
            };
            Demand::Move {
                load,
                line: m.line_loss.value,
                area,
                stroke: m.cylinder.stroke.value,
                metered,
            }
        }
        PhaseKind::Hold(h) => Demand::Hold {
            required: h.pressure.value,
            mode: h.mode,
            duration: h.duration.value,
        },
        PhaseKind::Idle(i) => Demand::Idle {
            duration: i.duration.value,
        },
        PhaseKind::Direct(d) => Demand::Direct {
            flow: d.flow.value,
            pressure: d.pressure.value,
            duration: d.duration.value,
        },
    }
}

/// A phase solved in one unloading state.
#[derive(Clone, Debug, Default)]
struct Point {
    pressure: f64,
    actuator: f64,
    /// Flow through an open valve centre, and its drop.
    sink: (f64, f64),
    /// The pressure the actuator takes its flow at (load), and the line loss on top of it.
    load: f64,
    line: f64,
    area: Option<f64>,
    duration: f64,
    findings: Vec<Finding>,
}

/// The limit governing a phase, and a finding if a remote stage was chosen that cannot govern.
fn limit_in_use(
    unit: &PreparedUnit,
    setting: &PhaseSetting,
    idle: bool,
) -> (LimitInUse, ReliefCharacteristic) {
    let (limit, governing) = governing_limit(unit.design, setting, idle);
    let characteristic = unit.relief(governing);
    let in_use = LimitInUse {
        limit,
        setting: pascals(governing),
        cracking: pascals(characteristic.cracking),
    };
    (in_use, characteristic)
}

/// Solves one phase of a design.
pub(crate) fn solve_phase(
    unit: &PreparedUnit,
    phase: &Phase,
    setting: &PhaseSetting,
) -> PhaseReport {
    let demand = demand(phase);
    let idle = matches!(demand, Demand::Idle { .. });
    let (limit, relief) = limit_in_use(unit, setting, idle);

    if let (Demand::Idle { duration }, IdlePath::MotorStopped) = (demand, setting.idle_path) {
        return report(
            unit,
            phase,
            limit,
            0,
            Point {
                duration,
                ..Point::default()
            },
            true,
        );
    }

    // Fewest pumps unloaded first: where two states agree (they cannot, with monotonic
    // flows, but rounding could), the one with more flow is kept.
    // Validation allows at most MAX_PUMPS pumps; the cap keeps any other caller finite.
    let stages = unit.stages().min(super::power_unit::MAX_PUMPS - 1);
    let mut masks: Vec<u32> = (0..1u32 << stages).collect();
    masks.sort_by_key(|m| (m.count_ones(), *m));

    let mut best: Option<(f64, u32, Point)> = None;
    for &mask in masks.iter() {
        let point = solve_state(unit, &relief, demand, setting, mask);
        let miss = disagreement(unit, point.pressure, mask);
        if miss == 0.0 {
            return report(unit, phase, limit, mask, point, false);
        }
        if best.as_ref().is_none_or(|(m, _, _)| miss < *m) {
            best = Some((miss, mask, point));
        }
    }
    // `masks` always holds the all-feeding state, so `best` is set.
    let Some((_, mask, mut point)) = best else {
        let point = solve_state(unit, &relief, demand, setting, 0);
        return report(unit, phase, limit, 0, point, false);
    };
    for (i, s) in unit.pumps.iter().enumerate() {
        if let Some((setting, _)) = s.unloading {
            let unloaded = mask & (1 << i) != 0;
            if unloaded != (point.pressure >= setting) {
                point.findings.push(Finding::Hunting {
                    pump: i + 1,
                    setting: pascals(setting),
                    pressure: pascals(point.pressure),
                    solved_unloaded: unloaded,
                });
            }
        }
    }
    report(unit, phase, limit, mask, point, false)
}

/// How far a state is from agreeing with the unloading valves (0 when it agrees).
fn disagreement(unit: &PreparedUnit, pressure: f64, unloaded: u32) -> f64 {
    unit.pumps
        .iter()
        .enumerate()
        .filter_map(|(i, s)| s.unloading.map(|(setting, _)| (i, setting)))
        .filter(|&(i, setting)| (unloaded & (1 << i) != 0) != (pressure >= setting))
        .map(|(_, setting)| (pressure - setting).abs().max(f64::MIN_POSITIVE))
        .sum()
}

fn solve_state(
    unit: &PreparedUnit,
    relief: &ReliefCharacteristic,
    demand: Demand,
    setting: &PhaseSetting,
    mask: u32,
) -> Point {
    let running = Point::default();
    match demand {
        Demand::Move {
            load,
            line,
            area,
            stroke,
            metered,
        } => {
            let need = load + line;
            let mut point = Point {
                load,
                line,
                area: Some(area),
                ..running
            };
            if let Some(wanted) = metered {
                let available = unit.supply(need, mask) - relief.flow(need);
                if available >= wanted {
                    point.pressure = unit.balance(relief, wanted, need, mask);
                    point.actuator = wanted;
                    point.duration = stroke * area / wanted;
                    return point;
                }
                point.findings.push(Finding::DemandUnmet {
                    wanted: cubic_metres_per_second(wanted),
                    available: cubic_metres_per_second(available.max(0.0)),
                });
            }
            take_all_flow(
                unit,
                relief,
                point,
                need,
                mask,
                |flow| stroke * area / flow,
                Some(stroke * area),
            )
        }
        Demand::Direct {
            flow,
            pressure,
            duration,
        } => {
            let mut point = Point {
                load: pressure,
                duration,
                ..running
            };
            let available = unit.supply(pressure, mask) - relief.flow(pressure);
            if available >= flow {
                point.pressure = unit.balance(relief, flow, pressure, mask);
                point.actuator = flow;
                return point;
            }
            point.findings.push(Finding::DemandUnmet {
                wanted: cubic_metres_per_second(flow),
                available: cubic_metres_per_second(available.max(0.0)),
            });
            take_all_flow(unit, relief, point, pressure, mask, |_| duration, None)
        }
        Demand::Hold {
            required,
            mode,
            duration,
        } => {
            let pressure = unit.balance(relief, 0.0, 0.0, mask);
            let mut point = Point {
                pressure,
                duration,
                ..running
            };
            if mode == HoldMode::HeldByPump && pressure < required * (1.0 - 1e-9) {
                point.findings.push(Finding::HoldBelowRequired {
                    required: pascals(required),
                    reached: pascals(pressure),
                });
            }
            point
        }
        Demand::Idle { duration } => match setting.idle_path {
            IdlePath::OpenCentre { drop } => {
                let drop = drop.value;
                let through_centre = (unit.supply(drop, mask) - relief.flow(drop)).max(0.0);
                Point {
                    pressure: drop,
                    sink: (through_centre, drop),
                    duration,
                    ..running
                }
            }
            // Over the limit or vented (the limit already reflects a vented idle path).
            _ => Point {
                pressure: unit.balance(relief, 0.0, 0.0, mask),
                duration,
                ..running
            },
        },
    }
}

/// The actuator takes whatever the pumps give at `need` that the relief does not take; if
/// nothing is left, it stalls (see [`Finding::Stall`]).
fn take_all_flow(
    unit: &PreparedUnit,
    relief: &ReliefCharacteristic,
    mut point: Point,
    need: f64,
    mask: u32,
    duration_at: impl Fn(f64) -> f64,
    stall_volume: Option<f64>,
) -> Point {
    let supply = unit.supply(need, mask);
    let leak = relief.flow(need);
    let flow = supply - leak;
    if flow > NO_FLOW {
        point.pressure = need;
        point.actuator = flow;
        point.duration = duration_at(flow);
        if leak > 0.0 {
            point.findings.push(Finding::ReliefLeaks {
                working: pascals(need),
                cracking: pascals(relief.cracking),
                leak: cubic_metres_per_second(leak),
            });
        }
        return point;
    }
    point.pressure = unit.balance(relief, 0.0, 0.0, mask);
    point.actuator = 0.0;
    if let Some(volume) = stall_volume {
        point.duration = volume / unit.swept(mask);
        point.findings.push(Finding::Stall {
            needed: pascals(need),
            limit: pascals(point.pressure),
            duration: seconds_of(point.duration),
        });
    } else {
        point.duration = duration_at(0.0);
    }
    point
}

/// The phase's report: every pump's state and the ledger, from the solved point.
fn report(
    unit: &PreparedUnit,
    phase: &Phase,
    limit: LimitInUse,
    mask: u32,
    point: Point,
    stopped: bool,
) -> PhaseReport {
    let p = point.pressure;
    let mut pumps = Vec::with_capacity(unit.pumps.len());
    let (mut supply, mut shaft, mut internal, mut unloading, mut checks) =
        (0.0, 0.0, 0.0, 0.0, 0.0);
    for (i, s) in unit.pumps.iter().enumerate() {
        let (state, outlet) = match s.unloading {
            _ if stopped => (PumpState::Stopped, 0.0),
            Some((_, drop)) if mask & (1 << i) != 0 => (PumpState::Unloaded, drop),
            _ => (PumpState::Feeding, p + s.check),
        };
        let (flow, power) = if stopped {
            (0.0, 0.0)
        } else {
            let flow = s.pump.delivered(outlet);
            (flow, s.pump.shaft_power(outlet, flow))
        };
        shaft += power;
        internal += power - outlet * flow;
        match state {
            PumpState::Feeding => {
                supply += flow;
                checks += s.check * flow;
            }
            PumpState::Unloaded => unloading += outlet * flow,
            PumpState::Stopped => {}
        }
        pumps.push(PumpPoint {
            state,
            outlet_pressure: pascals(outlet),
            flow: per_second(flow),
            shaft_power: watts(power),
        });
    }
    let (sink_flow, sink_drop) = point.sink;
    // Whatever the actuator and an open centre do not take goes over the relief: defined by
    // the flow balance, so the ledger closes whatever the rounding in the solve.
    let relief_flow = (supply - point.actuator - sink_flow).max(0.0);
    let need = point.load + point.line;
    let motor_loss = if stopped {
        0.0
    } else {
        unit.design.motor.loss(shaft)
    };
    let ledger = PowerLedger {
        electrical_input: watts(shaft + motor_loss),
        motor_loss: watts(motor_loss),
        pump_internal_loss: watts(internal),
        unloading_loss: watts(unloading),
        relief_loss: watts(p * relief_flow),
        metering_loss: watts((p - need) * point.actuator),
        line_valve_loss: watts(point.line * point.actuator + checks + sink_drop * sink_flow),
        useful_power: watts(point.load * point.actuator),
    };
    PhaseReport {
        name: phase.name.clone(),
        point: OperatingPoint {
            system_pressure: pascals(p),
            pumps,
            actuator_flow: per_second(point.actuator),
            actuator_speed: point
                .area
                .map(|a| Velocity::new::<uom::si::velocity::meter_per_second>(point.actuator / a)),
            relief_flow: per_second(relief_flow),
            duration: Time::new::<uom::si::time::second>(point.duration),
            limit,
            motor_running: !stopped,
        },
        ledger,
        line: None,
        findings: point.findings,
    }
}

/// A metered move whose limit leaves its flow control less than the drop it needs (the
/// advice policy's working drop): it cannot hold its flow.
pub(crate) fn flow_control_starved(
    phase: &Phase,
    report: &PhaseReport,
    policy: &super::policy::AdvicePolicy,
) -> Option<Finding> {
    let PhaseKind::Move(m) = &phase.kind else {
        return None;
    };
    if m.speed == SpeedRule::AllPumpFlow || report.point.actuator_flow.value <= NO_FLOW {
        return None;
    }
    let available = report.point.system_pressure.value - m.load_pressure() - m.line_loss.value;
    let needed = policy.flow_control_drop.value;
    (available < needed * (1.0 - 1e-9)).then_some(Finding::FlowControlStarved {
        available: pascals(available.max(0.0)),
        needed: pascals(needed),
    })
}

/// Where a limit at `governing` settles with the pumps dead-headed on it (compensators acting),
/// and the flow then crossing the relief: (pressure, flow).
fn dead_headed(unit: &PreparedUnit, governing: f64) -> (f64, f64) {
    let mask = unit
        .pumps
        .iter()
        .enumerate()
        .filter(|(_, s)| s.unloading.is_some_and(|(setting, _)| governing >= setting))
        .fold(0u32, |m, (i, _)| m | (1 << i));
    let relief = unit.relief(governing);
    let p = unit.balance(&relief, 0.0, 0.0, mask);
    (p, relief.flow(p))
}

/// Findings about the design's settings, whatever the phase.
pub(crate) fn design_findings(design: &Design) -> Vec<Finding> {
    let mut findings = Vec::new();
    let unit = PreparedUnit::new(design);
    // A relief cracking at or below a compensator takes the pump's whole flow.
    if let Some(dead_head) = super::power_unit::compensator_dead_head(design) {
        let main = design.relief.setting.value;
        let limits = std::iter::once((None, main)).chain(
            design
                .remote_stages
                .iter()
                .enumerate()
                .filter(|(stage, _)| {
                    design
                        .phase_settings
                        .iter()
                        .any(|s| s.limit == ActiveLimit::Remote { stage: *stage })
                })
                .map(|(stage, r)| (Some(stage), r.value.min(main))),
        );
        for (remote_stage, governing) in limits {
            let cracking = governing * design.relief.cracking_fraction;
            if cracking <= dead_head * (1.0 + 1e-9) {
                let (p, flow) = dead_headed(&unit, governing);
                findings.push(Finding::ReliefAtCompensator {
                    remote_stage,
                    cracking: pascals(cracking),
                    dead_head: pascals(dead_head),
                    burns: watts(p * flow),
                });
            }
        }
    }
    let all_pumps = unit.swept(0);
    if design.relief.rated_flow.value < all_pumps * (1.0 - 1e-9) {
        findings.push(Finding::ReliefUndersized {
            rated: cubic_metres_per_second(design.relief.rated_flow.value),
            pumps: cubic_metres_per_second(all_pumps),
        });
    }
    let main = design.relief.setting.value;
    for (stage, remote) in design.remote_stages.iter().enumerate() {
        if remote.value >= main {
            findings.push(Finding::RemoteAboveMain {
                stage,
                remote: pascals(remote.value),
                main: pascals(main),
            });
        }
    }
    let count = design.pump_count();
    for (i, s) in design.unloading_stages.iter().enumerate() {
        let setting = s.unloading.setting.value;
        if setting >= main {
            findings.push(Finding::NeverUnloads {
                pump: i + 1,
                setting: pascals(setting),
                relief: pascals(main),
            });
        }
        let seen = setting.min(main) + s.check.cracking.value;
        if seen > s.pump.rated_pressure.value {
            findings.push(Finding::AboveRating {
                pump: i + 1,
                what: "unloading setting",
                setting: pascals(seen),
                rating: pascals(s.pump.rated_pressure.value),
            });
        }
    }
    if main > design.base_pump.rated_pressure.value {
        findings.push(Finding::AboveRating {
            pump: count,
            what: "main relief setting",
            setting: pascals(main),
            rating: pascals(design.base_pump.rated_pressure.value),
        });
    }
    for (i, pump) in design.pumps().enumerate() {
        if let PumpControl::Compensated { setting } = pump.control {
            if setting.value > pump.rated_pressure.value {
                findings.push(Finding::AboveRating {
                    pump: i + 1,
                    what: "compensator setting",
                    setting: pascals(setting.value),
                    rating: pascals(pump.rated_pressure.value),
                });
            }
        }
    }
    findings
}

fn per_second(m3_per_s: f64) -> VolumeRate {
    VolumeRate::new::<uom::si::volume_rate::cubic_meter_per_second>(m3_per_s)
}
