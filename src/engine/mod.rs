//! The engine: a job in, every design's phases, ledgers and totals out.
//!
//! Pure Rust with no browser dependency: the UI calls [`solve`] and shows what it returns.
//! Bad input comes back as [`InputError`]s, never a panic, a NaN or an infinity.

pub mod cycle;
pub mod demo;
pub mod efficiency;
pub mod finding;
pub mod job;
pub mod ledger;
pub mod motor;
pub mod power_unit;
pub mod pump;
pub mod quote;
pub mod settings;
pub mod solve;
pub mod staging;
pub mod units;
pub mod validate;
pub mod valve;

pub use finding::Finding;
pub use job::{Job, JobFileError, Oil, Site, SCHEMA_VERSION};
pub use ledger::{Comparison, CycleTotals, PowerLedger};
pub use solve::{OperatingPoint, PhaseReport, PumpPoint, PumpState};
pub use validate::InputError;

use serde::Serialize;

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
    validate::validate(job)?;
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
            ledger::compare(
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

/// Reads a job file and solves it: the report as pretty JSON, or the reason the file could
/// not be read, or its input errors as a JSON list of `{field, message}`. This is what
/// `cargo run --example solve -- job.json` prints, and what the golden-file tests compare.
pub fn solve_json(text: &str) -> Result<String, String> {
    let job = Job::from_json(text).map_err(|e| e.to_string())?;
    match solve(&job) {
        Ok(report) => {
            Ok(serde_json::to_string_pretty(&report).expect("a report always serialises"))
        }
        Err(errors) => Err(serde_json::to_string_pretty(&errors).expect("errors always serialise")),
    }
}

/// Solves one (validated) design over the job's cycle.
pub(crate) fn solve_design(job: &Job, design: &power_unit::Design) -> DesignReport {
    let unit = solve::PreparedUnit::new(design);
    let mut phases: Vec<PhaseReport> = job
        .cycle
        .iter()
        .zip(&design.phase_settings)
        .map(|(phase, setting)| solve::solve_phase(&unit, phase, setting))
        .collect();
    for (report, phase) in phases.iter_mut().zip(&job.cycle) {
        if let Some(f) = solve::flow_control_starved(phase, report, &job.advice) {
            report.findings.push(f);
        }
    }
    let timed: Vec<ledger::TimedLedger> = phases
        .iter()
        .map(|p| ledger::TimedLedger {
            ledger: p.ledger,
            duration_s: p.point.duration.value,
            motor_running: p.point.motor_running,
        })
        .collect();
    let totals = ledger::cycle_totals(&timed, &job.site, &job.oil);
    let mut findings = solve::design_findings(design);
    findings.extend(ledger::motor_findings(&design.motor, &totals, &timed));
    DesignReport {
        name: design.name.clone(),
        phases,
        totals,
        findings,
    }
}
