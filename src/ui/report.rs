//! The quote report: one page that prints (or saves as PDF) as a clean document for the
//! customer and the file: the job, the site and the date, the comparison, each design with its
//! ledger and the settings advice, the exact figures, every assumption and its source, the
//! formulas' sources, and the cautions. The print stylesheet (style/main.css, "print") drops
//! the app's bars and keeps tables and charts whole.
//!
//! While any figure is invalid the report shows no figures at all, only what to fix (a quote
//! document is never made from stale figures). Its assumptions and formulas' sources are the
//! engine's (`quote::assumptions`, `quote::FORMULAS`); the cautions come from
//! `safety::CAUTIONS`.
//!
//! Print (`@media print` in style/main.css): the top bar, navigation, live strip and buttons
//! are hidden; the page is white with black text whatever the display mode (high contrast
//! included); no `@page size`, so the printer's paper (A4 or US Letter) decides and the layout
//! follows; tables, charts, lists and the small sections are never cut across a page
//! (`break-inside: avoid`), headings stay with what follows, each design starts a page. The
//! summary is the exception: its sentences come first and its table may run on to page two
//! (rows whole, head repeated), so page one always holds the summary; the test reads page one
//! alone for the job, the payback and each design's energy.
//!
//! The browser test (`tests/harness/tests/quote.rs`) prints the demo job's report with
//! `Page.printToPDF` on both papers, checks its text with poppler's `pdftotext` (the job's
//! name, each design's energy a year, the payback as the screen shows it, no buttons), renders
//! the pages to PNG (`pdftoppm`, in `target/screenshots/quote_report/`) and prints the page
//! counts: 10 pages on A4, 11 on Letter (2026-12-02). The set-up installs Debian's
//! `poppler-utils` when `pdftotext` is missing.

use super::charts::{EnergyChart, LedgerChart};
use super::quote::{use_columns, ComparisonTable, CoolingList};
use super::safety::{CAUTIONS, ESTIMATE_NOTE};
use super::state::use_job;
use crate::engine::pump::PumpControl;
use crate::engine::quote::{self, Assumed, Basis, QuoteColumn};
use crate::engine::settings::{self, Severity};
use crate::engine::units::{Measure, UnitSystem};
use crate::engine::valve::ReliefKind;
use crate::engine::{DesignReport, Job, JobReport, PumpState};
use crate::formats::quote_text::{self, Precision};
use leptos::prelude::*;
use std::sync::Arc;

/// Today's date on this device, as YYYY-MM-DD (read the same in every country).
fn today() -> String {
    let d = js_sys::Date::new_0();
    format!(
        "{:04}-{:02}-{:02}",
        d.get_full_year(),
        d.get_month() + 1,
        d.get_date()
    )
}

#[component]
pub fn ReportArea() -> impl IntoView {
    let state = use_job();
    let columns = use_columns();
    let print = |_: leptos::ev::MouseEvent| {
        let _ = window().print();
    };
    view! {
        <section class="area report-area" aria-labelledby="area-title">
            <div class="report-tools no-print">
                <a class="button" href=super::area::Area::Quote.href()>"Back to the quote"</a>
                <button type="button" class="button primary" data-action="print" on:click=print>
                    "Print or save as PDF"
                </button>
            </div>
            <h1 id="area-title" class="report-kind">"Quote report"</h1>
            {move || {
                let report = state.result.get().ok();
                match (report, columns.get()) {
                    (Some(report), Some(columns)) => {
                        let job = state.job.get();
                        view! { <Document job=job report=report columns=columns /> }.into_any()
                    }
                    _ => view! {
                        <p class="empty-note" data-report-blocked="true">
                            "A quote is made only from a job whose every figure is valid. Fix the figures below, then come back."
                        </p>
                        <super::shared::StaleNotice />
                    }
                    .into_any(),
                }
            }}
        </section>
    }
}

#[component]
fn Document(job: Job, report: Arc<JobReport>, columns: Vec<QuoteColumn>) -> impl IntoView {
    let units = job.units;
    let currency = job.site.currency.clone();
    let scale = super::charts::ledger_scale_w(&report);
    let site = if job.site.location.trim().is_empty() {
        "not given".to_string()
    } else {
        job.site.location.clone()
    };
    let names: Vec<String> = job
        .designs
        .iter()
        .map(|d| format!("“{}”", d.name))
        .collect();
    let summary = columns
        .iter()
        .zip(&job.designs)
        .filter_map(|(c, design)| {
            let s = c.against_baseline?;
            let cell = |row| quote_text::cell(row, c, units, &currency, Precision::ForCustomer);
            Some(view! {
                <li data-summary=c.name.clone()>
                    {match s.payback_years {
                        Some(_) => format!(
                            "“{}” saves {} and {} a year: the retrofit price of {} pays for itself in {} (simple payback).",
                            c.name,
                            cell(quote_text::Row::EnergySaved).unwrap_or_default(),
                            cell(quote_text::Row::CostSaved).unwrap_or_default(),
                            quote_text::grouped(design.retrofit_price_or(&job.site), 0) + " " + currency.trim(),
                            cell(quote_text::Row::Payback).unwrap_or_default(),
                        ),
                        None => format!(
                            "“{}” saves no running cost against the baseline, so the retrofit does not pay for itself on energy.",
                            c.name
                        ),
                    }}
                </li>
            })
        })
        .collect_view();
    let designs = job
        .designs
        .iter()
        .zip(report.designs.iter())
        .enumerate()
        .map(|(i, (design, r))| {
            view! { <DesignSection job=job.clone() index=i design=design.clone() report=r.clone() scale_w=scale /> }
        })
        .collect_view();
    view! {
        <article class="report" data-report="true">
            <header class="report-head">
                <p class="report-job" data-report-job="true">{job.name.clone()}</p>
                <dl class="report-meta">
                    <div><dt>"Site"</dt><dd>{site}</dd></div>
                    <div><dt>"Date"</dt><dd data-report-date="true">{today()}</dd></div>
                    <div><dt>"Power units compared"</dt><dd>{names.join(", ")}</dd></div>
                    <div><dt>"Prepared with"</dt><dd>{format!("Phasewise {}", env!("CARGO_PKG_VERSION"))}</dd></div>
                </dl>
                {job.example.then(|| view! {
                    <p class="example-banner" role="note"><strong>"Example data. "</strong>"An invented machine, not a real quote."</p>
                })}
                {(!job.notes.trim().is_empty()).then(|| view! { <p class="report-notes">{job.notes.clone()}</p> })}
            </header>

            // Not kept whole: the summary starts on page one under the heading block, its
            // sentences first, and a long table runs on to the next page rather than leave the
            // first one empty.
            <section class="report-block report-opening">
                <h2>"Summary"</h2>
                <ul class="report-summary">{summary}</ul>
                <ComparisonTable columns=columns.clone() units=units currency=currency.clone() precision=Precision::ForCustomer />
                {super::quote::fewer_parts_notes(&columns)}
            </section>
            <section class="report-block keep">
                <h2>"Where the energy goes in a year"</h2>
                <EnergyChart columns=columns.clone() />
            </section>
            <section class="report-block keep">
                <h2>"Cooling"</h2>
                <CoolingList columns=columns.clone() units=units precision=Precision::ForCustomer />
            </section>
            {(!job.pump_tests.is_empty()).then(|| view! {
                <section class="report-block keep" data-report-pumps="true">
                    <h2>"Pump tests"</h2>
                    <p class="hint">"A worn pump loses flow and power whatever the retrofit: its verdict from the readings taken at the machine."</p>
                    <super::shared::PumpVerdicts />
                </section>
            })}

            {designs}

            <section class="report-block keep">
                <h2>"Exact figures"</h2>
                <p class="hint">"The summary's figures as computed, before rounding for the quote."</p>
                <ComparisonTable columns=columns units=units currency=currency precision=Precision::Exact />
            </section>
            <Assumptions job=job.clone() />
            <Formulas />
            <section class="report-block keep report-cautions">
                <h2>"Safety"</h2>
                <ul>
                    {CAUTIONS.iter().map(|(rule, detail)| view! { <li><strong>{*rule}</strong>" "{*detail}</li> }).collect_view()}
                </ul>
                <p class="estimate-note">{ESTIMATE_NOTE}</p>
            </section>
        </article>
    }
}

/// One design: the unit as described, its cycle's totals, its ledger, its phases, and what
/// the settings advice says of it.
#[component]
fn DesignSection(
    job: Job,
    index: usize,
    design: crate::engine::power_unit::Design,
    report: DesignReport,
    scale_w: f64,
) -> impl IntoView {
    let units = job.units;
    let t = report.totals;
    let m = &design.motor;
    let pumps = design
        .pumps()
        .enumerate()
        .map(|(n, pump)| {
            // Pumps in shaft order: the unloading stages first, so pump n has stage n if any.
            let stage = design.unloading_stages.get(n);
            let control = match pump.control {
                PumpControl::Fixed => "fixed".to_string(),
                PumpControl::Compensated { setting } => {
                    format!("pressure-compensated at {}", units.pressure(setting))
                }
            };
            let unloads = stage.map_or(String::new(), |s| {
                format!("; unloads at {}", units.pressure(s.unloading.setting))
            });
            format!(
                "Pump {}: {}, {control}{unloads}",
                n + 1,
                Measure::Displacement.with_unit(units, pump.displacement.value)
            )
        })
        .collect::<Vec<_>>();
    let relief = format!(
        "Relief valve: {}, set at {}{}",
        match design.relief.kind {
            ReliefKind::DirectActing => "direct-acting",
            ReliefKind::PilotOperated => "pilot-operated",
        },
        units.pressure(design.relief.setting),
        if design.remote_stages.is_empty() {
            String::new()
        } else {
            format!(
                "; remote stages at {}",
                design
                    .remote_stages
                    .iter()
                    .map(|p| units.pressure(*p))
                    .collect::<Vec<_>>()
                    .join(", ")
            )
        }
    );
    let advice = settings::advise(&job, index).unwrap_or_default();
    let row = |label: &'static str, value: String| {
        view! { <tr><th scope="row">{label}</th><td>{value}</td></tr> }
    };
    let phases = report
        .phases
        .iter()
        .enumerate()
        .map(|(i, p)| {
            let unloaded = p
                .point
                .pumps
                .iter()
                .filter(|x| x.state == PumpState::Unloaded)
                .count();
            view! {
                <tr>
                    <th scope="row">{format!("{}. {}", i + 1, p.name)}</th>
                    <td>{Measure::Pressure.format(units, p.point.system_pressure.value)}</td>
                    <td>{Measure::Flow.format(units, p.point.actuator_flow.value)}</td>
                    <td>{Measure::Duration.format(units, p.point.duration.value)}</td>
                    <td>{Measure::Power.format(units, p.ledger.electrical_input.value)}</td>
                    <td>{Measure::Heat.format(units, p.ledger.heat_into_oil().value)}</td>
                    <td>{
                        let state = if !p.point.motor_running { "motor off".to_string() } else if unloaded == 0 { "all feed".to_string() } else { format!("{unloaded} unloaded") };
                        match p.point.shaft_speed.filter(|_| p.point.motor_running) {
                            Some(w) => format!("{state}, {}", Measure::ShaftSpeed.with_unit(units, w.value)),
                            None => state,
                        }
                    }</td>
                </tr>
            }
        })
        .collect_view();
    let head = |text: &'static str, measure: Option<Measure>| {
        view! { <th scope="col">{text}{measure.map(|m| view! { <span class="unit-head">{m.label(units)}</span> })}</th> }
    };
    view! {
        <section class="report-block report-design" data-report-design=index>
            <h2>{format!("“{}”", design.name)}{if index == 0 { " (baseline)" } else { "" }}</h2>
            <ul class="unit-lines">
                <li>{format!(
                    "Motor: {} at {}, {} efficient at full load",
                    Measure::Power.with_unit(units, m.rated_power.value),
                    Measure::ShaftSpeed.with_unit(units, m.full_load_speed.value),
                    Measure::Percent.with_unit(units, m.full_load_efficiency)
                )}</li>
                {design.drive.map(|x| view! { <li data-report-drive="true">{super::shared::drive_words(&x, units)}</li> })}
                {pumps.into_iter().map(|p| view! { <li>{p}</li> }).collect_view()}
                <li>{relief}</li>
            </ul>
            <div class="table-wrap">
                <table class="needs report-totals">
                    <tbody>
                        {row("Cycle time", Measure::Duration.with_unit(units, t.cycle_time.value))}
                        {row("Energy per cycle", Measure::Energy.with_unit(units, t.energy_per_cycle.value))}
                        {row("Average electrical input", Measure::Power.with_unit(units, t.average_electrical.value))}
                        {row("Motor load, RMS / peak", format!("{} / {}", Measure::Power.with_unit(units, t.rms_shaft.value), Measure::Power.with_unit(units, t.peak_shaft.value)))}
                        {row("Heat into the oil", Measure::Heat.with_unit(units, t.heat_load.value))}
                    </tbody>
                </table>
            </div>
            <h3>"Where the power goes, phase by phase"</h3>
            <LedgerChart design=report.clone() units=units scale_w=scale_w />
            <div class="table-wrap">
                <table class="needs report-phases">
                    <thead><tr>
                        {head("Phase", None)}{head("Pressure", Some(Measure::Pressure))}{head("Flow", Some(Measure::Flow))}
                        {head("Time", Some(Measure::Duration))}{head("Input", Some(Measure::Power))}{head("Heat", Some(Measure::Heat))}{head("Pumps", None)}
                    </tr></thead>
                    <tbody>{phases}</tbody>
                </table>
            </div>
            {(!report.findings.is_empty()).then(|| view! {
                <h3>"About this power unit"</h3>
                <ul class="findings">
                    {report.findings.iter().map(|f| view! { <li>{f.describe(units)}</li> }).collect_view()}
                </ul>
            })}
            <h3>"Valve settings advice"</h3>
            <p class="caution-line">"Settings are changed only by a qualified person, with the machine locked out and every pressure released, and never above any component's rating: see the cautions at the end."</p>
            {if advice.is_empty() {
                view! { <p>"Nothing to change: every setting is within the rules (see the assumptions)."</p> }.into_any()
            } else {
                view! {
                    <ol class="report-advice">
                        {advice.iter().map(|a| {
                            let text = a.describe(&job);
                            let kind = match a.severity {
                                Severity::Caution => "Caution",
                                Severity::Saving => "Saving",
                                Severity::Note => "Note",
                            };
                            view! {
                                <li>
                                    <strong>{format!("{kind}: {}", text.title)}</strong>
                                    " "{text.explanation}
                                    {text.action.map(|action| view! { " "<em>{format!("What to do: {action}.")}</em> })}
                                    {text.effect.map(|effect| view! { " "{effect} })}
                                </li>
                            }
                        }).collect_view()}
                    </ol>
                }.into_any()
            }}
        </section>
    }
}

/// An assumption's value in the job's units.
fn assumed_text(value: &Assumed, units: UnitSystem) -> String {
    match value {
        Assumed::Quantity(measure, si) => measure.with_unit(units, *si),
        Assumed::QuantityAt(measure, si, at, at_si) => format!(
            "{} at {}",
            measure.with_unit(units, *si),
            at.with_unit(units, *at_si)
        ),
        Assumed::Plain(v, unit) => {
            format!("{} {unit}", quote_text::grouped(*v, plain_decimals(*v)))
        }
        Assumed::Text(text) => text.clone(),
    }
}

/// Enough decimals for a plain figure to read as entered (0.18 per kWh, 4000 h).
fn plain_decimals(v: f64) -> usize {
    (0..=4)
        .find(|&d| {
            let scale = 10f64.powi(d as i32);
            ((v * scale).round() - v * scale).abs() < 1e-9 * scale.max(1.0)
        })
        .unwrap_or(4)
}

#[component]
fn Assumptions(job: Job) -> impl IntoView {
    let units = job.units;
    let rows = quote::assumptions(&job)
        .into_iter()
        .map(|a| {
            let basis = match a.basis {
                Basis::Entered => "entered for this job".to_string(),
                Basis::FromExample => "as in the example job: check it for this site".to_string(),
                Basis::Default { source } => format!("default: {source}"),
                Basis::Model { source } => format!("how Phasewise works: {source}"),
            };
            view! {
                <tr>
                    <th scope="row">{a.what}</th>
                    <td>{assumed_text(&a.value, units)}</td>
                    <td class="basis">{basis}</td>
                </tr>
            }
        })
        .collect_view();
    view! {
        <section class="report-block report-assumptions">
            <h2>"Assumptions"</h2>
            <div class="table-wrap">
                <table class="needs report-text-table">
                    <thead><tr><th scope="col">"What"</th><th scope="col">"Value"</th><th scope="col">"Basis"</th></tr></thead>
                    <tbody>{rows}</tbody>
                </table>
            </div>
        </section>
    }
}

#[component]
fn Formulas() -> impl IntoView {
    view! {
        <section class="report-block keep report-formulas">
            <h2>"Formulas and their sources"</h2>
            <div class="table-wrap">
                <table class="needs report-text-table">
                    <thead><tr><th scope="col">"Figure"</th><th scope="col">"Formula"</th><th scope="col">"Source"</th></tr></thead>
                    <tbody>
                        {quote::FORMULAS.iter().map(|(what, formula, source)| view! {
                            <tr><th scope="row">{*what}</th><td>{*formula}</td><td class="basis">{*source}</td></tr>
                        }).collect_view()}
                    </tbody>
                </table>
            </div>
        </section>
    }
}
