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
use super::finding::{OIL_LIFE_LIMIT_C, SEAL_LIMIT_C, THINNEST_FOR_PUMPS_MM2_S};
use super::heat::{self, HeatBalance, HeatPaths, OilReport, Settling};
use super::job::Job;
use super::ledger::PowerLedger;
use super::ledger::{Comparison, CycleTotals};
use super::lines::{LineFlow, LineRole, MoveLines, MoveLinesFlow};
use super::power_unit::{Design, PhaseSetting};
use super::pump::PumpControl;
use super::site::WorkingTemperature;
use super::units::{cubic_metres_per_second, pascals, seconds_of, watts};
use super::validate::InputError;
use super::valve::{ActiveLimit, IdlePath, ReliefCharacteristic};
use super::viscosity::ViscosityLine;
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
    /// For a move with its pressure and return lines described: their velocities and drops.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub lines: Option<MoveLinesFlow>,
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
    /// On a variable-speed drive: the shaft speed the engine chose for the phase (none when
    /// the motor runs at its full-load speed in every phase).
    #[serde(
        rename = "shaft_speed_rad_per_s",
        skip_serializing_if = "Option::is_none"
    )]
    pub shaft_speed: Option<uom::si::f64::AngularVelocity>,
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
    /// The heat the field's warm-up readings show against the model's, for the machine as
    /// found (with the tank described and two readings entered).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub warm_up: Option<heat::WarmUpCheck>,
}

#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct DesignReport {
    pub name: String,
    pub phases: Vec<PhaseReport>,
    pub totals: CycleTotals,
    /// Findings about the design as a whole: its settings and its motor.
    pub findings: Vec<Finding>,
    /// The oil's temperature and viscosity the phases are worked out at, and where it settles.
    pub oil: OilReport,
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
        warm_up: warm_up_check(job),
    })
}

/// The field's warm-up against the model: the heat the two readings show going into the oil
/// (what warmed it plus what the tank and cooler shed meanwhile) and the heat the model puts
/// in with the oil at their mean temperature, for the machine as found.
fn warm_up_check(job: &Job) -> Option<heat::WarmUpCheck> {
    let (readings, tank, baseline) = (job.warm_up?, job.tank.as_ref()?, job.designs.first()?);
    let paths = HeatPaths {
        tank,
        cooler: baseline.cooler.as_ref(),
    };
    let capacity = heat_capacity(job, tank);
    let measured = heat::heat_from_warm_up(&readings.first, &readings.second, capacity, &paths)?;
    let mean = 0.5 * (readings.first.oil.value + readings.second.oil.value);
    let model = solve_design_at(job, baseline, &oil_at(job, mean))
        .totals
        .heat_load
        .value;
    Some(heat::WarmUpCheck {
        mean,
        measured,
        model,
    })
}

/// What the oil and the tank's steel store per kelvin, J/K.
fn heat_capacity(job: &Job, tank: &heat::Tank) -> f64 {
    job.oil.heat_capacity()
        + tank
            .steel_mass
            .map_or(0.0, |m| m.value * heat::STEEL_SPECIFIC_HEAT)
}

/// Solves one (validated) design over the job's cycle, with the oil at its working
/// temperature (entered, or where the heat balance settles it), and, with the tank described,
/// the heat balance: where the oil settles with and without the cooler, the warm-up, and the
/// cooler the target temperature needs. Each is a search over temperature that solves the
/// cycle at each temperature it tries (the losses follow the oil's viscosity).
pub(crate) fn solve_design(job: &Job, design: &Design) -> DesignReport {
    let (oil, entered) = entered_oil(job);
    let Some(tank) = &job.tank else {
        // Validation asks for the tank when the temperature is to settle.
        return solve_design_at(job, design, &oil);
    };
    let paths = HeatPaths {
        tank,
        cooler: design.cooler.as_ref(),
    };
    let mut heat_in = heat_in_at(job, design, &oil);
    let steady = heat::settle(&mut heat_in, &paths);
    let working = if entered {
        oil.temperature
    } else {
        steady.kelvin()
    };
    let mut report = solve_design_at(job, design, &oil.at(working));
    let at_steady = if working == steady.kelvin() {
        report.totals.heat_load.value
    } else {
        heat_in(steady.kelvin())
    };
    let without_cooler = design
        .cooler
        .map(|_| heat::settle(&mut heat_in, &HeatPaths { tank, cooler: None }));
    let capacity = heat_capacity(job, tank);
    let warm_up = match steady {
        Settling::At(t) => Some(heat::warm_up(
            &mut heat_in,
            &paths,
            capacity,
            tank.ambient.value,
            t,
        )),
        Settling::Above(_) => None,
    };
    let target = job.oil.target_temperature.value;
    let cooler_duty = (heat_in(target) - tank.sheds(target)).max(0.0);
    let coolant = design
        .cooler
        .map_or(tank.ambient.value, |c| c.coolant_temperature.value);
    report.findings.extend(oil_findings(steady));
    report.oil.balance = Some(HeatBalance {
        steady,
        heat_in: at_steady,
        tank_sheds: tank.sheds(steady.kelvin()),
        cooler_removes: design.cooler.map_or(0.0, |c| c.removes(steady.kelvin())),
        without_cooler,
        warm_up,
        target,
        cooler_duty,
        cooler_needed: (target > coolant).then(|| cooler_duty / (target - coolant)),
    });
    report
}

/// The job's oil at its entered working temperature (or the usual one), and whether it was
/// entered.
fn entered_oil(job: &Job) -> (OilAt, bool) {
    match job.oil.working_temperature {
        WorkingTemperature::Entered { temperature } => (oil_at(job, temperature.value), true),
        WorkingTemperature::Settled => (oil_at(job, WorkingTemperature::default_kelvin()), false),
    }
}

/// Solves one (validated) design at its working temperature, without the rest of the heat
/// balance (the warm-up, the oil without the cooler, the cooler needed): for the advice, the
/// staging targets and the motor check, which compare designs at work.
pub(crate) fn solve_design_working(job: &Job, design: &Design) -> DesignReport {
    let (oil, entered) = entered_oil(job);
    match (&job.tank, entered) {
        (Some(tank), false) => {
            let paths = HeatPaths {
                tank,
                cooler: design.cooler.as_ref(),
            };
            let steady = heat::settle(&mut heat_in_at(job, design, &oil), &paths);
            solve_design_at(job, design, &oil.at(steady.kelvin()))
        }
        _ => solve_design_at(job, design, &oil),
    }
}

/// The heat the design's cycle puts into `oil` at a temperature (kelvin, W): what the heat
/// balance's searches ask of the solve.
fn heat_in_at<'a>(job: &'a Job, design: &'a Design, oil: &'a OilAt) -> impl FnMut(f64) -> f64 + 'a {
    move |t| {
        solve_design_at(job, design, &oil.at(t))
            .totals
            .heat_load
            .value
    }
}

/// Cautions on where the oil settles.
fn oil_findings(steady: Settling) -> Option<Finding> {
    let celsius = |c: f64| {
        uom::si::f64::ThermodynamicTemperature::new::<
            uom::si::thermodynamic_temperature::degree_celsius,
        >(c)
    };
    match steady {
        Settling::Above(ceiling) => Some(Finding::OilDoesNotSettle {
            ceiling: kelvin(ceiling),
        }),
        Settling::At(t) => [(SEAL_LIMIT_C, true), (OIL_LIFE_LIMIT_C, false)]
            .into_iter()
            .map(|(limit, seals)| (celsius(limit), seals))
            .find(|(limit, _)| t > limit.value)
            .map(|(limit, seals)| Finding::OilHot {
                steady: kelvin(t),
                limit,
                seals,
            }),
    }
}

/// A line faster than common practice allows for its kind, with the inner diameter that
/// would keep to it (velocity goes as one over the diameter squared).
fn too_fast(state: &LineFlow, diameter: f64) -> Option<Finding> {
    let limit = state.role.velocity_limit();
    let v = state.velocity.value;
    (v > limit * (1.0 + 1e-9)).then(|| Finding::LineTooFast {
        role: state.role,
        velocity: state.velocity,
        limit: uom::si::f64::Velocity::new::<uom::si::velocity::meter_per_second>(limit),
        diameter: uom::si::f64::Length::new::<uom::si::length::meter>(
            state.diameter_within_limit(diameter),
        ),
    })
}

/// Each move's lines against their velocity limits, as findings of the phase.
fn move_line_findings(job: &Job, phases: &mut [PhaseReport]) {
    for (phase, report) in job.cycle.iter().zip(phases) {
        let (PhaseKind::Move(m), Some(state)) = (&phase.kind, report.lines) else {
            continue;
        };
        let Some(lines) = &m.lines else { continue };
        report.findings.extend(
            [
                too_fast(
                    &state.pressure_line,
                    lines.pressure_line.inner_diameter.value,
                ),
                too_fast(&state.return_line, lines.return_line.inner_diameter.value),
            ]
            .into_iter()
            .flatten(),
        );
    }
}

/// Findings on the design's suction line and oil at its working temperature: a suction line
/// faster than common practice allows, oil thinner than pumps need.
fn line_findings(design: &Design, oil: &OilAt) -> Vec<Finding> {
    let mut findings = Vec::new();
    if let Some(suction) = &design.suction_line {
        // The suction line feeds every pump's whole swept flow.
        let rps = design.motor.revolutions_per_second();
        let swept: f64 = design.pumps().map(|p| p.displacement.value * rps).sum();
        let state = suction.carrying(LineRole::Suction, swept, oil.viscosity, oil.density);
        findings.extend(too_fast(&state, suction.inner_diameter.value));
    }
    if oil.viscosity * 1e6 < THINNEST_FOR_PUMPS_MM2_S {
        findings.push(Finding::OilTooThin {
            viscosity: uom::si::f64::KinematicViscosity::new::<
                uom::si::kinematic_viscosity::square_meter_per_second,
            >(oil.viscosity),
            temperature: kelvin(oil.temperature),
        });
    }
    findings
}

/// The oil as the solve sees it: its temperature and, there, its viscosity and density.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct OilAt {
    /// Kelvin.
    pub temperature: f64,
    /// Kinematic viscosity, m^2/s.
    pub viscosity: f64,
    /// kg/m^3.
    pub density: f64,
    /// The oil's viscosity-temperature line, drawn once per solve.
    pub line: ViscosityLine,
}

impl OilAt {
    /// The same oil at `temperature` (kelvin).
    pub fn at(&self, temperature: f64) -> OilAt {
        OilAt {
            temperature,
            viscosity: self.line.at(kelvin(temperature)).value,
            ..*self
        }
    }
}

fn kelvin(k: f64) -> uom::si::f64::ThermodynamicTemperature {
    uom::si::f64::ThermodynamicTemperature::new::<uom::si::thermodynamic_temperature::kelvin>(k)
}

/// The job's oil at `temperature` (kelvin): its viscosity along its line (validation makes
/// the line; a job that skipped it gets the common mineral oil's).
pub fn oil_at(job: &Job, temperature: f64) -> OilAt {
    // The common oil's line is always drawn (its grade and index are in the table).
    let line = job
        .oil
        .viscosity
        .line()
        .or_else(|_| super::viscosity::COMMON_MINERAL_OIL.line())
        .unwrap_or(ViscosityLine::FLAT);
    OilAt {
        temperature,
        viscosity: line.at(kelvin(temperature)).value,
        density: job.oil.density.value,
        line,
    }
}

/// Solves one (validated) design over the job's cycle with the oil at `oil`; no heat balance.
pub(crate) fn solve_design_at(job: &Job, design: &Design, oil: &OilAt) -> DesignReport {
    // Slip flow goes as pressure over viscosity: a pump's leakage stated at another
    // temperature scales by the viscosity there over the working one.
    let unit = PreparedUnit::new(design).with_leakage_scaled(|pump| {
        pump.efficiency_temperature
            .map_or(1.0, |stated| oil.line.at(stated).value / oil.viscosity)
    });
    let mut phases: Vec<PhaseReport> = job
        .cycle
        .iter()
        .zip(&design.phase_settings)
        .map(|(phase, setting)| solve_phase(&unit, phase, setting, oil))
        .collect();
    for (report, phase) in phases.iter_mut().zip(&job.cycle) {
        if let Some(f) = flow_control_starved(phase, report, &job.advice) {
            report.findings.push(f);
        }
    }
    move_line_findings(job, &mut phases);
    let mut reactive_note = None;
    // A converter-fed motor's line current is the converter's, which the nameplate model does
    // not describe: left out on a variable-speed drive.
    if let (Some(rating), None) = (&design.motor.electrical, &design.drive) {
        for (report, setting) in phases.iter_mut().zip(&design.phase_settings) {
            draw_from_line(report, &design.motor, rating, setting);
        }
        if let Some(threshold) = job.site.power_factor_threshold {
            reactive_note = power_factor_below(&phases, rating, threshold);
        }
    }
    let timed: Vec<super::ledger::TimedLedger> =
        phases.iter().map(|p| timed_ledger(design, p)).collect();
    let totals = super::ledger::cycle_totals(&timed, &job.site, &job.oil);
    let mut findings = design_findings(design);
    findings.extend(reactive_note);
    findings.extend(line_findings(design, oil));
    findings.extend(super::ledger::motor_findings(
        &design.motor,
        &totals,
        &timed,
        design.drive.is_some(),
    ));
    DesignReport {
        name: design.name.clone(),
        phases,
        totals,
        findings,
        oil: OilReport {
            working_temperature: oil.temperature,
            viscosity: oil.viscosity,
            balance: None,
        },
    }
}

/// A phase as the cycle's totals see it: on a variable-speed drive with its speed and how
/// well the motor cools there.
fn timed_ledger(design: &Design, p: &PhaseReport) -> super::ledger::TimedLedger {
    let fixed =
        super::ledger::TimedLedger::fixed_speed(p.ledger, p.point.duration, p.point.motor_running);
    match (&design.drive, p.point.shaft_speed) {
        (Some(drive), Some(speed)) => {
            let share = speed.value / design.motor.full_load_speed.value;
            super::ledger::TimedLedger {
                speed_share: share,
                cooling_weight: drive.cooling.cooling_weight(share),
                ..fixed
            }
        }
        _ => fixed,
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
    let shaft = report.ledger.shaft_power();
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
enum Demand<'a> {
    Move {
        load: f64,
        /// The fixed allowance for lines and valves.
        line: f64,
        lines: Option<LinesAt<'a>>,
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

/// A move's described lines with what they carry: the return side's area ratio and the oil.
#[derive(Clone, Copy, Debug)]
struct LinesAt<'a> {
    lines: &'a MoveLines,
    ratio: f64,
    oil: OilAt,
}

impl LinesAt<'_> {
    fn carrying(&self, flow: f64) -> MoveLinesFlow {
        self.lines
            .carrying(flow, self.ratio, self.oil.viscosity, self.oil.density)
    }
}

/// A move's drop between pump and cylinder at `flow`: its fixed allowance `line` plus its
/// described lines' drop, if any.
fn line_drop(line: f64, lines: Option<LinesAt>, flow: f64) -> f64 {
    line + lines.map_or(0.0, |l| l.carrying(flow).drop_at_pump)
}

fn demand<'a>(phase: &'a Phase, oil: &OilAt) -> Demand<'a> {
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
                lines: m.lines.as_ref().map(|lines| LinesAt {
                    lines,
                    ratio: m.cylinder.return_ratio(m.direction),
                    oil: *oil,
                }),
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
    /// The described lines at the actuator's flow.
    lines: Option<MoveLinesFlow>,
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

/// Solves one phase of a design: at the motor's full-load speed, or on a variable-speed drive
/// at the speed the engine chooses for it.
pub(crate) fn solve_phase(
    unit: &PreparedUnit,
    phase: &Phase,
    setting: &PhaseSetting,
    oil: &OilAt,
) -> PhaseReport {
    let Some(drive) = &unit.design.drive else {
        return solve_phase_at_speed(unit, phase, setting, oil);
    };
    let demand = demand(phase, oil);
    let idle = matches!(demand, Demand::Idle { .. });
    let (_, relief) = limit_in_use(unit, setting, idle);
    match phase_speed(unit, drive, &relief, demand, setting) {
        PhaseSpeed::Stopped => {
            let stopped = PhaseSetting {
                idle_path: IdlePath::MotorStopped,
                ..*setting
            };
            solve_phase_at_speed(&unit.at_speed(0.0), phase, &stopped, oil)
        }
        PhaseSpeed::Turning { share, beyond } => {
            let mut report = solve_phase_at_speed(&unit.at_speed(share), phase, setting, oil);
            report.findings.extend(beyond);
            report
        }
    }
}

/// The speed a phase runs at on a variable-speed drive.
#[derive(Clone, Debug, PartialEq)]
enum PhaseSpeed {
    /// The drive stops the pump (an idle).
    Stopped,
    /// A share of the motor's full-load speed, within the drive's range; with a finding when
    /// the phase needs more than the drive's maximum.
    Turning { share: f64, beyond: Option<Finding> },
}

/// The lowest speed that delivers what the phase needs, within the drive's range: a metered
/// move or a direct demand its flow (plus the pumps' leakage and anything the relief takes
/// at its pressure); a move on all pump flow the drive's maximum; a hold kept by the pump at
/// the minimum (its surplus over the relief) or at the speed that just makes up the leakage
/// at the hold's pressure; anything else (a hold locked by a check, an idle) the minimum, or an
/// idle stopped.
fn phase_speed(
    unit: &PreparedUnit,
    drive: &super::drive::VariableSpeed,
    relief: &ReliefCharacteristic,
    demand: Demand,
    setting: &PhaseSetting,
) -> PhaseSpeed {
    use super::drive::{HoldSpeed, IdleSpeed};
    let (min, max) = drive.speed_shares(&unit.design.motor);
    let delivering = |flow: f64, pressure: f64| {
        unit.speed_share_for(
            flow + relief.flow(pressure),
            pressure,
            unit.unloaded_at(pressure),
        )
    };
    let needed = match demand {
        Demand::Move {
            metered: Some(wanted),
            load,
            line,
            lines,
            ..
        } => delivering(wanted, load + line_drop(line, lines, wanted)),
        Demand::Move {
            metered: None,
            load,
            line,
            ..
        } => all_flow_share(unit, max, load + line),
        Demand::Direct { flow, pressure, .. } => delivering(flow, pressure),
        Demand::Hold {
            required,
            mode: HoldMode::HeldByPump,
            ..
        } if drive.hold == HoldSpeed::MakeUpLeakage => delivering(0.0, required),
        Demand::Hold { .. } => min,
        Demand::Idle { .. }
            if drive.idle == IdleSpeed::Stopped || setting.idle_path == IdlePath::MotorStopped =>
        {
            return PhaseSpeed::Stopped
        }
        Demand::Idle { .. } => min,
    };
    if needed > max * (1.0 + 1e-9) {
        let base = unit.design.motor.full_load_speed.value;
        return PhaseSpeed::Turning {
            share: max,
            beyond: Some(Finding::BeyondMaximumSpeed {
                needed: (needed.is_finite())
                    .then(|| super::units::radians_per_second(needed * base)),
                maximum: super::units::radians_per_second(max * base),
            }),
        };
    }
    PhaseSpeed::Turning {
        share: needed.max(min),
        beyond: None,
    }
}

/// The speed share a move on all pump flow runs at: the drive's maximum, except that above the
/// motor's full-load speed (field weakening) the motor gives at most its rated power times its
/// peak allowance, so the drive slows to what that power turns at the move's pressure `need`
/// (the described lines' drop left out of it), never below full-load speed. Below it the motor's
/// torque, not its power, is the limit, and that is the motor sizing's to judge.
fn all_flow_share(unit: &PreparedUnit, max: f64, need: f64) -> f64 {
    if max <= 1.0 {
        return max;
    }
    let motor = &unit.design.motor;
    let at_full_speed = unit
        .at_speed(1.0)
        .shaft_power_at(need, unit.unloaded_at(need));
    let most = motor.rated_power.value * motor.peak_allowance;
    if at_full_speed * max <= most {
        max
    } else {
        (most / at_full_speed).clamp(1.0, max)
    }
}

/// Solves one phase of a design with its shaft at the unit's speed.
fn solve_phase_at_speed(
    unit: &PreparedUnit,
    phase: &Phase,
    setting: &PhaseSetting,
    oil: &OilAt,
) -> PhaseReport {
    let demand = demand(phase, oil);
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
            lines,
            area,
            stroke,
            metered,
        } => {
            let line_at = |flow: f64| line_drop(line, lines, flow);
            let mut point = Point {
                load,
                line,
                area: Some(area),
                ..running
            };
            if let Some(wanted) = metered {
                let need = load + line_at(wanted);
                let available = unit.supply(need, mask) - relief.flow(need);
                // The tolerance lets a drive's speed, chosen to give exactly this flow, give it.
                if available >= wanted * (1.0 - 1e-12) {
                    point.line = need - load;
                    point.lines = lines.map(|l| l.carrying(wanted));
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
            let need = match lines {
                None => load + line,
                Some(_) => load + line_at(flow_through_lines(unit, relief, load, mask, &line_at)),
            };
            point.line = need - load;
            let mut point = take_all_flow(
                unit,
                relief,
                point,
                need,
                mask,
                |flow| stroke * area / flow,
                Some(stroke * area),
            );
            point.lines = lines.map(|l| l.carrying(point.actuator));
            point
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
            if available >= flow * (1.0 - 1e-12) {
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

/// The flow a move takes with all the pump flow through its described lines: where the flow
/// the pumps give at the load plus the lines' drop (less what the relief takes there) is the
/// flow that makes that drop. The drop rises with the flow and what is given falls with the
/// pressure, so there is one such flow; false position (Illinois) between none and what is
/// given at the load alone finds it.
fn flow_through_lines(
    unit: &PreparedUnit,
    relief: &ReliefCharacteristic,
    load: f64,
    mask: u32,
    line_at: &dyn Fn(f64) -> f64,
) -> f64 {
    let given = |flow: f64| {
        let need = load + line_at(flow);
        (unit.supply(need, mask) - relief.flow(need)).max(0.0)
    };
    let gap = |flow: f64| flow - given(flow);
    let (a, b) = (0.0, given(0.0));
    if b <= NO_FLOW {
        return 0.0;
    }
    let (ga, gb) = (gap(a), gap(b));
    super::numeric::false_position(
        &mut |q| gap(q),
        (a, ga),
        (b, gb),
        &|q, g| g.abs() <= 1e-12 * q.max(NO_FLOW),
        1e-15,
    )
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
    let (motor_loss, drive_loss) = electrical_losses(unit.design, shaft, unit.speed_share, stopped);
    let ledger = PowerLedger {
        electrical_input: watts(shaft + motor_loss + drive_loss),
        motor_loss: watts(motor_loss),
        drive_loss: watts(drive_loss),
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
            shaft_speed: unit.design.drive.map(|_| {
                super::units::radians_per_second(
                    unit.speed_share * unit.design.motor.full_load_speed.value,
                )
            }),
        },
        ledger,
        line: None,
        lines: point.lines,
        findings: point.findings,
    }
}

/// The motor's and the drive's losses while the motor gives `shaft` watts at `share` of its
/// full-load speed:
/// at fixed speed the motor's part-load loss and no drive; on a variable-speed drive the motor's
/// loss at that speed and torque and the converter's at that frequency and current (its
/// standing loss while the pump is stopped: it stays powered).
pub(crate) fn electrical_losses(
    design: &Design,
    shaft: f64,
    share: f64,
    stopped: bool,
) -> (f64, f64) {
    let motor = &design.motor;
    match (&design.drive, stopped) {
        (None, true) => (0.0, 0.0),
        (None, false) => (motor.loss(shaft), 0.0),
        (Some(drive), true) => (0.0, drive.converter_loss(0.0, 0.0, motor)),
        (Some(drive), false) => {
            let torque = shaft / motor.rated_power.value / share.max(f64::MIN_POSITIVE);
            (
                motor.loss_at_speed(shaft, share),
                drive.converter_loss(share, torque, motor),
            )
        }
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
    let lines = report.lines.map_or(0.0, |l| l.drop_at_pump);
    let available =
        report.point.system_pressure.value - m.load_pressure() - m.line_loss.value - lines;
    let needed = policy.flow_control_drop.value;
    (available < needed * (1.0 - 1e-9)).then_some(Finding::FlowControlStarved {
        available: pascals(available.max(0.0)),
        needed: pascals(needed),
    })
}

/// Where a limit at `governing` settles with the pumps dead-headed on it (compensators acting),
/// and the flow then crossing the relief: (pressure, flow).
fn dead_headed(unit: &PreparedUnit, governing: f64) -> (f64, f64) {
    let mask = unit.unloaded_at(governing);
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
