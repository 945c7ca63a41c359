//! The engine: a job in, every design's phases, ledgers and totals out.
//!
//! Pure Rust with no browser dependency: the UI calls [`solve`] and shows what it returns.
//! Bad input comes back as [`InputError`]s, never a panic, a NaN or an infinity. Everything
//! the engine says about a job in one document is [`answer`] (its JSON shape is on it).
//!
//! # From input to ledger
//!
//! 1. **Read** (`Job::from_json`, in `job`): the file's `schema_version` is read first; a
//!    newer one is refused with "update the app"; then serde reads the rest (text in a number
//!    field, a missing field or a truncated file is `JobFileError::Unreadable` with serde's
//!    reason).
//! 2. **Validate** (`validate::validate`): every number is checked for being a number, its
//!    sign, zero where zero is impossible, and a plausible maximum (beyond which it is a typing
//!    slip and could overflow; the message gives both figures in the field's own unit and the
//!    job's unit system, rounded as the field shows them); the structure (rod thinner than
//!    bore, one setting per phase, remote stage indices, a vent port for venting and remote
//!    stages, at most four pumps). All problems are returned at once, each with the field's
//!    path in the job file (`designs[0].unloading_stages[1].unloading.setting_pa`) so the UI
//!    can show it at the field.
//! 3. **Prepare** (`delivery::PreparedUnit`): per design, each pump at the motor's speed as
//!    plain SI numbers: theoretical flow, leakage per pascal (from the volumetric efficiency at
//!    its stated pressure and speed: leakage grows in proportion to pressure and does not
//!    depend on speed, so a pump turned slower than its efficiency was stated at leaks a larger
//!    share), hydromechanical efficiency, drag.
//! 4. **Solve each phase** (`solve::solve_phase`), in these parts:
//!
//!    *The limit.* The active limit gives the relief's characteristic: nothing below cracking
//!    (cracking fraction x governing setting), then a straight line to the dead-head flow at
//!    the governing setting and on above it (override). The dead-head flow
//!    (`PreparedUnit::dead_head_flow`) is what the pumps not unloaded at that pressure give
//!    there, at full stroke: a setting is what the gauge reads when the technician sets it, so
//!    a phase that dead-heads on a limit (a hold, an idle over it, a stall) sits exactly at its
//!    setting. Governing (`delivery::governing_limit`) = main; or min(main, remote stage); or
//!    the vent pressure when vented (an idle whose path is "vented" uses it too).
//!
//!    *The demand* (`solve::demand`). A move needs load pressure (force / area: bore
//!    extending, annulus retracting) plus its line loss (the plain allowance, plus its
//!    described lines' Darcy-Weisbach drop at its flow: the pressure line's, and the return
//!    line's at flow x area ratio times that ratio, `lines::MoveLines::carrying`), and either
//!    takes all the flow left at that pressure (with lines, the flow whose drop leaves that
//!    flow, `solve::flow_through_lines`) or a metered flow (speed x area) with the surplus
//!    over the limit; a hold
//!    and an idle send all pump flow over the limit (an idle may go through an open centre at
//!    its drop, or stop the motor); a direct phase is a flow at a pressure for a duration.
//!
//!    *The unloading state.* Every unloading state (pump `i` unloaded when bit `i` is set),
//!    fewest unloaded first, is solved; the first whose pressure agrees with every unloading
//!    setting (unloaded exactly when pressure >= setting) is kept. None agreeing means the
//!    valve hunts: the nearest state is kept, with `Finding::Hunting`.
//!
//!    *The balance.* Within a state, supply (sum of feeding pumps' delivered flow at
//!    pressure + check cracking) and relief flow are piecewise linear in pressure, so
//!    `PreparedUnit::balance` walks the breakpoints and interpolates exactly, without
//!    iteration.
//!
//!    *Fallbacks*, each defined and with its finding: a metered or direct demand the pumps
//!    cannot meet takes what is left (`DemandUnmet`); a move with nothing left stalls and is
//!    solved as a dead-head over the relief for the time the stroke would take at the feeding
//!    pumps' theoretical flow (`Stall`); flow over a relief that cracks below the working
//!    pressure is lost speed (`ReliefLeaks`).
//! 5. **Ledger** (`solve::report`): each pump's outlet pressure, flow and shaft power; relief
//!    flow is defined by the flow balance (supply - actuator - open centre), so the ledger
//!    closes by construction. Items: motor loss (the motor's fixed share of its full-load
//!    loss, plus the rest in proportion to load squared), pump internal loss (shaft - hydraulic
//!    out), unloading loss (unloaded pumps' flow x drop), relief loss (relief flow x system
//!    pressure), metering loss ((system - needed pressure) x actuator flow), line and valve
//!    loss (line loss x actuator flow, check cracking x each feeding pump's flow, open-centre
//!    drop x its flow), useful (load pressure x actuator flow). Heat into the oil is every item
//!    but motor loss and useful.
//! 6. **Totals** (`ledger::cycle_totals`, over `TimedLedger`s: ledger, duration, motor
//!    running): cycle time, energy, average, peak and RMS of electrical and shaft power,
//!    average heat (W and Btu_IT/h), oil temperature rise with no cooler (heat / (volume x
//!    density x specific heat)), energy and cost per year (average power x operating hours).
//!    The RMS shaft load counts time with the motor stopped at a third
//!    (`motor::STOPPED_COOLING_SHARE`, common practice: a stopped fan-cooled motor cools
//!    less): `sqrt(sum(P^2 t) / (running time + stopped time / 3))`; the electrical RMS stays
//!    over plain time. Motor findings (`ledger::motor_findings`): RMS shaft above rating x
//!    service factor (what it may carry continuously), peak above rating x peak allowance
//!    (what it may carry briefly), a cycle longer than the RMS method holds for
//!    (`motor::RMS_LONGEST_CYCLE_S`, 300 s, Machine Design "MSD 101") when its peak is above
//!    what the motor carries continuously, and more starts an hour (each separate span of
//!    motor-stopped phases, round the cycle, `ledger::motor_starts_per_cycle`) than NEMA MG 10
//!    Table 2-3 allows its size and poles (`Motor::allowed_starts_per_hour`). The staging
//!    search sizes on the first two.
//! 7. **Compare** (`ledger::compare`): every design after the first against the first: power,
//!    heat, RMS, cycle time, energy and cost per year saved, payback = retrofit price / saving.
//! 8. **Design findings** (`solve::design_findings`, and `solve::flow_control_starved` per
//!    phase): a relief rated for less than the pumps give, remote stages at or above main,
//!    unloading valves that never unload, settings above a pump's rating, a limit (main, or a
//!    selected remote stage) that cracks at or below a compensated pump's dead-head pressure
//!    (with the power it burns dead-headed there), and a metered move whose limit leaves its
//!    flow control less than the advice policy's working drop.
//!
//! 9. **The oil's temperature** (`solve::solve_design`): the cycle is worked out with the oil
//!    at its working temperature (`OilAt`: the viscosity on its ASTM D341 line), entered or,
//!    with the tank described, where heat in (the cycle's average heat into the oil, solved at
//!    each temperature tried) equals what the tank's walls and the cooler shed
//!    (`heat::settle`). A pump's leakage stated at another temperature scales as viscosity
//!    there over viscosity at work. Beside it: where the oil would settle without the
//!    cooler, the warm-up from the air's temperature (`heat::warm_up`), the cooler the target
//!    temperature needs, and a field warm-up's heat against the model's (`JobReport::warm_up`).
//!
//! Modelling choices: in the solve, motor speed is constant (slip neglected; the pump check
//! does correct for it); a compensated pump destrokes linearly from its flow at the setting to
//! none at setting x 1.03 (`pump::COMPENSATOR_BAND`); a check valve's cracking pressure is its
//! drop at any flow; a direct phase's pressure is all useful.

/// The quantities the engine's results carry, for crates above it to read them with; its
/// `unit!` macro defines the trade's exact units in [`units::us`].
#[macro_use]
pub extern crate uom;

pub mod cycle;
pub mod delivery;
pub mod demo;
pub mod drive;
pub mod efficiency;
pub mod electrical;
pub mod fields;
pub mod finding;
pub mod heat;
pub mod job;
pub mod ledger;
pub mod lines;
pub mod motor;
pub mod motor_check;
pub mod motor_load;
pub mod numeric;
pub mod policy;
pub mod power_unit;
pub mod pump;
pub mod pump_test;
pub mod quote;
pub mod settings;
pub mod site;
pub mod solve;
pub mod staging;
pub mod units;
pub mod validate;
pub mod valve;
pub mod viscosity;

pub use finding::Finding;
pub use job::{Job, JobFileError, Oil, Site, SCHEMA_VERSION};
pub use ledger::{Comparison, CycleTotals, PowerLedger};
pub use solve::{
    solve, DesignReport, JobReport, OperatingPoint, PhaseReport, PumpPoint, PumpState,
};
pub use validate::InputError;

use serde::Serialize;
use units::{joules, pascals};
use uom::si::f64::{Energy, Pressure};

/// One phase's part of a cycle's energy: what "which phase wastes most" is answered by, since
/// a long idle at a few kilowatts can cost more than a short dwell at many.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct PhaseEnergy {
    /// The phase's place in the cycle (from 0).
    pub phase: usize,
    pub name: String,
    /// Electrical energy over the phase, once per cycle (J).
    #[serde(rename = "energy_j")]
    pub energy: Energy,
    /// Its share of the cycle's electrical energy (0 when the cycle draws none).
    pub share: f64,
    /// Of it, what ends as heat in the oil (J).
    #[serde(rename = "heat_j")]
    pub heat: Energy,
    /// The pressure the phase needs (the advice's reading of it), if it needs any (Pa).
    #[serde(rename = "needed_pa")]
    pub needed: Option<Pressure>,
    /// The pressure the pump works at in the phase (Pa).
    #[serde(rename = "pump_pa")]
    pub pump: Pressure,
}

impl PhaseEnergy {
    /// Whether the pump works at the pressure the phase needs, give or take 1 % and 0.01 bar
    /// (the rounding between two solved figures, not a surplus worth naming). `None` when the
    /// phase needs no pressure.
    pub fn pump_at_need(&self) -> Option<bool> {
        let need = self.needed?.value;
        Some((self.pump.value - need).abs() <= need.abs() * 0.01 + 1e3)
    }
}

/// Each phase of design `d`'s report by its energy over one cycle, most first (ties in cycle
/// order). Empty for a design the report does not hold.
pub fn phases_by_energy(job: &Job, report: &JobReport, d: usize) -> Vec<PhaseEnergy> {
    let Some(design) = report.designs.get(d) else {
        return Vec::new();
    };
    let total: f64 = design
        .phases
        .iter()
        .map(|p| p.ledger.electrical_input.value * p.point.duration.value)
        .sum();
    let mut phases: Vec<PhaseEnergy> = design
        .phases
        .iter()
        .enumerate()
        .map(|(i, p)| {
            let t = p.point.duration.value;
            let energy = p.ledger.electrical_input.value * t;
            PhaseEnergy {
                phase: i,
                name: p.name.clone(),
                energy: joules(energy),
                share: if total > 0.0 { energy / total } else { 0.0 },
                heat: joules(p.ledger.heat_into_oil().value * t),
                needed: job
                    .cycle
                    .get(i)
                    .and_then(|ph| settings::needed_pressure(&ph.kind, &job.advice))
                    .map(pascals),
                pump: pascals(p.point.system_pressure.value),
            }
        })
        .collect();
    phases.sort_by(|a, b| {
        b.energy
            .value
            .total_cmp(&a.energy.value)
            .then(a.phase.cmp(&b.phase))
    });
    phases
}

/// Everything the engine says about a job, in one document: what `cargo run -p phasewise-engine --example solve`
/// prints (its shape is on [`answer`]).
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct JobAnswer {
    /// Every design's phases, ledgers, totals and findings, and the comparisons.
    pub report: JobReport,
    /// The findings of each design (its own, then each phase's) in words, in the job's units.
    pub findings_in_words: Vec<DesignWords>,
    /// Each design's phases by their energy over one cycle, most first ([`phases_by_energy`]).
    pub phases_by_energy: Vec<Vec<PhaseEnergy>>,
    /// The settings advice for each design, in the job's order.
    pub advice: Vec<DesignAdvice>,
    /// Each pump test's assessment (or its input errors) and its trend, in the job's order.
    pub pump_tests: Vec<PumpTestAnswer>,
    /// Each motor check's assessment (or its input errors) and its words, in the job's order.
    #[serde(skip_serializing_if = "Vec::is_empty")]
    pub motor_checks: Vec<MotorCheckAnswer>,
}

#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct MotorCheckAnswer {
    pub motor: String,
    pub date: String,
    pub assessment: MotorAssessed,
    /// The verdict and each reading in words, when assessed.
    pub words: Option<motor_load::MotorCheckWords>,
}

/// A motor check read, or the input errors that stop it being read.
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum MotorAssessed {
    Assessment(motor_load::MotorCheckReport),
    InputErrors(Vec<InputError>),
}

#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct DesignWords {
    pub design: String,
    pub design_findings: Vec<String>,
    /// Per phase, in the cycle's order.
    pub phase_findings: Vec<Vec<String>>,
}

#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct DesignAdvice {
    pub design: String,
    pub items: Vec<AdviceAnswer>,
}

/// One piece of advice: its rule, action and solved figures, and the same in words.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct AdviceAnswer {
    #[serde(flatten)]
    pub advice: settings::Advice,
    pub words: settings::Described,
}

#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct PumpTestAnswer {
    pub pump: String,
    pub date: String,
    /// The assessment, or why the test cannot be assessed yet.
    pub assessment: Assessed,
    pub trend: Option<efficiency::Trend>,
}

/// A pump test read, or the input errors that stop it being read.
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Assessed {
    Assessment(efficiency::TestReport),
    InputErrors(Vec<InputError>),
}

/// Everything the engine says about `job`; its input errors if it is invalid.
///
/// `cargo run -p phasewise-engine --example solve -- FILE.job.json` prints it as one JSON
/// document ([`solve_json`]); a new capability adds its part here. The golden tests compare it
/// whole. Shape:
///
/// ```text
/// {
///   "report": {                     // engine::JobReport, as solve returns it
///     "designs": [ { "name", "phases": [ { "name", "point", "ledger", "findings" } ],
///                    "totals", "findings" } ],
///     "comparisons": [ ... ]        // each design after the first against the baseline
///   },
///   "findings_in_words": [ { "design", "design_findings": [".."], "phase_findings": [[".."]] } ],
///   "phases_by_energy": [ [ { "phase", "name", "energy_j", "share", "heat_j", "needed_pa",
///                             "pump_pa" } ] ],   // per design, most energy first
///   "advice": [ { "design", "items": [ {
///       "severity", "rule": { "rule": "limit_above_need", ...numbers in SI },
///       "action": { "action": "limit_phase", ... } | null, "saving_w", "annual_saving_kwh",
///       "words": { "title", "explanation", "action", "effect" } } ] } ],
///   "pump_tests": [ { "pump", "date",
///       "assessment": { "assessment": { ...efficiency::TestReport } }
///                   | { "input_errors": [ { "field", "message" } ] },
///       "trend": { "earlier", "days", "volumetric_change" } | null } ],
///   "motor_checks": [ { "motor", "date",          // left out when the job has none
///       "assessment": { "assessment": { ...motor_load::MotorCheckReport } }
///                   | { "input_errors": [ { "field", "message" } ] },
///       "words": { "verdict", "readings": [".."] } | null } ]
/// }
///
/// A phase's `line` (its line current and power factor) is there when the motor's electrical
/// nameplate is entered and the motor runs; a move's `lines` (velocity, Reynolds number,
/// friction factor and drop of its pressure and return lines) when they are described. Each
/// design's `oil` gives `working_k` and `viscosity_m2_per_s`, and with the tank its
/// `balance` (`steady`, `heat_in_w`, `tank_sheds_w`, `cooler_removes_w`, `without_cooler`,
/// `warm_up` `{curve_s_k, time_to_steady_s}`, `target_k`, `cooler_duty_w`,
/// `cooler_needed_w_per_k`); the report's `warm_up` sets two field readings against the model.
/// ```
///
/// Quantities are SI, named by their key's suffix as in the job file. An invalid job prints
/// its input errors (`[{field, message}]`) on stderr with exit status 2.
pub fn answer(job: &Job) -> Result<JobAnswer, Vec<InputError>> {
    let report = solve(job)?;
    let units = job.units;
    let findings_in_words = report
        .designs
        .iter()
        .map(|d| DesignWords {
            design: d.name.clone(),
            design_findings: d.findings.iter().map(|f| f.describe(units)).collect(),
            phase_findings: d
                .phases
                .iter()
                .map(|p| p.findings.iter().map(|f| f.describe(units)).collect())
                .collect(),
        })
        .collect();
    let advice = (0..job.designs.len())
        .map(|d| {
            Ok(DesignAdvice {
                design: job.designs[d].name.clone(),
                items: settings::advise(job, d)?
                    .into_iter()
                    .map(|advice| AdviceAnswer {
                        words: advice.describe(job),
                        advice,
                    })
                    .collect(),
            })
        })
        .collect::<Result<Vec<_>, Vec<InputError>>>()?;
    let pump_tests = job
        .pump_tests
        .iter()
        .enumerate()
        .map(|(i, test)| PumpTestAnswer {
            pump: test.pump.clone(),
            date: test.date.clone(),
            assessment: match efficiency::assess(test, &job.wear, units) {
                Ok(report) => Assessed::Assessment(report),
                Err(errors) => Assessed::InputErrors(errors),
            },
            trend: efficiency::trend(&job.pump_tests, i, &job.wear),
        })
        .collect();
    let phases_by_energy = (0..report.designs.len())
        .map(|d| phases_by_energy(job, &report, d))
        .collect();
    let motor_checks = job
        .motor_checks
        .iter()
        .map(|check| {
            let assessed = motor_load::assess_motor(job, check, units);
            MotorCheckAnswer {
                motor: check.motor.clone(),
                date: check.date.clone(),
                words: assessed
                    .as_ref()
                    .ok()
                    .map(|r| r.describe(units, &job.site.currency)),
                assessment: match assessed {
                    Ok(report) => MotorAssessed::Assessment(report),
                    Err(errors) => MotorAssessed::InputErrors(errors),
                },
            }
        })
        .collect();
    Ok(JobAnswer {
        phases_by_energy,
        report,
        findings_in_words,
        advice,
        pump_tests,
        motor_checks,
    })
}

/// Reads a job file and says everything about it ([`answer`]) as pretty JSON, or the reason
/// the file could not be read, or its input errors as a JSON list of `{field, message}`. This
/// is what `cargo run -p phasewise-engine --example solve -- job.json` prints, and what the golden-file tests
/// compare.
pub fn solve_json(text: &str) -> Result<String, String> {
    let job = Job::from_json(text).map_err(|e| e.to_string())?;
    match answer(&job) {
        Ok(answer) => Ok(pretty(&answer)),
        Err(errors) => Err(pretty(&errors)),
    }
}

/// Pretty JSON of an answer type. Serialising them cannot fail (no maps with non-string keys,
/// no failing `Serialize`), so the fallback is never seen.
fn pretty<T: Serialize>(value: &T) -> String {
    serde_json::to_string_pretty(value).unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}"))
}
