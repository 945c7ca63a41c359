//! The engine: a job in, every design's phases, ledgers and totals out.
//!
//! Pure Rust with no browser dependency: the UI calls [`solve`] and shows what it returns.
//! Bad input comes back as [`InputError`]s, never a panic, a NaN or an infinity.

pub mod cycle;
pub mod delivery;
pub mod demo;
pub mod efficiency;
pub mod finding;
pub mod job;
pub mod ledger;
pub mod motor;
pub mod policy;
pub mod power_unit;
pub mod pump_test;
pub mod pump;
pub mod quote;
pub mod settings;
pub mod site;
pub mod solve;
pub mod staging;
pub mod units;
pub mod validate;
pub mod valve;

pub use finding::Finding;
pub use job::{Job, JobFileError, Oil, Site, SCHEMA_VERSION};
pub use ledger::{Comparison, CycleTotals, PowerLedger};
pub use solve::{solve, DesignReport, JobReport, OperatingPoint, PhaseReport, PumpPoint, PumpState};
pub use validate::InputError;

use serde::Serialize;

/// One phase's part of a cycle's energy: what "which phase wastes most" is answered by, since
/// a long idle at a few kilowatts can cost more than a short dwell at many.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct PhaseEnergy {
    /// The phase's place in the cycle (from 0).
    pub phase: usize,
    pub name: String,
    /// Electrical energy over the phase, once per cycle (J).
    pub energy_j: f64,
    /// Its share of the cycle's electrical energy (0 when the cycle draws none).
    pub share: f64,
    /// Of it, what ends as heat in the oil (J).
    pub heat_j: f64,
    /// The pressure the phase needs (the advice's reading of it), if it needs any (Pa).
    pub needed_pa: Option<f64>,
    /// The pressure the pump works at in the phase (Pa).
    pub pump_pa: f64,
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
                energy_j: energy,
                share: if total > 0.0 { energy / total } else { 0.0 },
                heat_j: p.ledger.heat_into_oil().value * t,
                needed_pa: job
                    .cycle
                    .get(i)
                    .and_then(|ph| settings::needed_pressure(&ph.kind, &job.advice)),
                pump_pa: p.point.system_pressure.value,
            }
        })
        .collect();
    phases.sort_by(|a, b| {
        b.energy_j
            .total_cmp(&a.energy_j)
            .then(a.phase.cmp(&b.phase))
    });
    phases
}

/// Everything the engine says about a job, in one document: what `cargo run -p phasewise-engine --example solve`
/// prints (its shape is in DEVELOPERS.md, "Everything the engine says").
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
    Ok(JobAnswer {
        phases_by_energy,
        report,
        findings_in_words,
        advice,
        pump_tests,
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

