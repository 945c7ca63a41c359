//! The results area: what the engine says about the job, redrawn on every edit. While the
//! job has an error, the last good results stay, marked stale, with what to fix.

use super::charts::{LedgerChart, TimelineChart};
use super::display::DisplaySwitches;
use super::field::UnitSwitch;
use super::shared::DesignTabs;
use super::shared::StaleNotice;
use super::state::use_job;
use crate::engine::ledger::LedgerItem;
use crate::engine::units::{Measure, UnitSystem};
use crate::engine::valve::ActiveLimit;
use crate::engine::{DesignReport, JobReport, PumpState};
use leptos::prelude::*;
use uom::si::energy::kilowatt_hour;

#[component]
pub fn ResultsArea() -> impl IntoView {
    let state = use_job();
    let report = move || state.result.get().ok().or_else(|| state.last_good.get());
    view! {
        <section class="area results" aria-labelledby="area-title">
            <div class="area-head">
                <h1 id="area-title">"Results"</h1>
                <UnitSwitch />
                <DisplaySwitches />
            </div>
            <super::shared::ExampleBanner />
            <StaleNotice />
            <DesignTabs />
            {move || match report() {
                // Read here, so a new design choice or unit system redraws the report.
                Some(report) => view! { <ReportView report=report d=state.design_index() units=state.units() currency=state.job.with(|j| j.site.currency.clone()) /> }.into_any(),
                None => view! {
                    <p class="empty-note">"Results appear as soon as every figure of the job is valid: see the fields marked in red."</p>
                }.into_any(),
            }}
        </section>
    }
}

#[component]
fn ReportView(
    report: std::sync::Arc<JobReport>,
    d: usize,
    units: UnitSystem,
    currency: String,
) -> impl IntoView {
    let d = d.min(report.designs.len().saturating_sub(1));
    let design = report.designs[d].clone();
    let scale = super::charts::ledger_scale_w(&report);
    let comparison = (d > 0)
        .then(|| report.comparisons.get(d - 1).cloned())
        .flatten();
    let drawn = scale > 0.0;
    let csv_design = design.clone();
    let state = use_job();
    let download_csv = move |_: leptos::ev::MouseEvent| {
        let job_name = state.job.with_untracked(|j| j.name.clone());
        let name = format!(
            "{}-{}-ledger.csv",
            super::storage::file_stem(&job_name),
            super::storage::file_stem(&csv_design.name)
        );
        let text = crate::formats::ledger_csv::ledger_csv(&csv_design, units);
        super::storage::download_as(&name, "text/csv", &text);
    };
    view! {
        <Totals design=design.clone() units=units currency=currency.clone() />
        {comparison.map(|c| view! {
            <div class="comparison card" data-comparison="true">
                <h2>{format!("Against “{}”", c.baseline)}</h2>
                <dl class="figures">
                    <Figure label="Average power saved" value=Measure::Power.with_unit(units, c.average_power_saved.value) key="saved-power" />
                    <Figure label="Less heat into the oil" value=Measure::Heat.with_unit(units, c.heat_load_saved.value) key="saved-heat" />
                    <Figure label="Motor RMS load saved" value=Measure::Power.with_unit(units, c.rms_shaft_saved.value) key="saved-rms" />
                    <Figure label="Energy saved a year" value=format!("{:.0} kWh", c.annual_energy_saved.get::<kilowatt_hour>()) key="saved-energy" />
                    <Figure label="Cost saved a year" value=format!("{:.0} {currency}", c.annual_cost_saved) key="saved-cost" />
                    <Figure label="Simple payback" value=crate::formats::quote_text::payback_text(c.payback_years, crate::formats::quote_text::Precision::ForCustomer) key="payback" />
                </dl>
                <a href=super::area::Area::Quote.href()>"Every power unit side by side, and the printable report"</a>
            </div>
        })}
        <h2>"Where the power goes"</h2>
        {if drawn {
            view! { <LedgerChart design=design.clone() units=units scale_w=scale /> }.into_any()
        } else {
            view! { <p class="empty-note">"No power is drawn in this cycle (the motor is stopped throughout), so there is nothing to chart."</p> }.into_any()
        }}
        <button type="button" class="button" data-action="ledger-csv" on:click=download_csv>"Download this ledger for a spreadsheet (CSV)"</button>
        <PhasesByEnergy report=report.clone() d=d units=units />
        <h2>"Through the cycle"</h2>
        <TimelineChart design=design.clone() units=units />
        <h2>"Phase by phase"</h2>
        <ol class="phase-results">
            {design.phases.iter().enumerate().map(|(i, p)| {
                let read = state.job.with_untracked(|j| {
                    j.designs.get(d).and_then(|x| x.phase_settings.get(i)).and_then(|s| s.measured_current.map(|a| a.value))
                });
                view! { <PhaseResult i=i phase=p.clone() units=units read=read /> }
            }).collect_view()}
        </ol>
        {(!design.findings.is_empty()).then(|| view! {
            <h2>"About this power unit"</h2>
            <ul class="findings">
                {design.findings.iter().map(|f| view! { <li>{f.describe(units)}</li> }).collect_view()}
            </ul>
        })}
    }
}

/// The phases ranked by their energy over one cycle, with their share of it and, where a
/// phase needs less pressure than the pump works at, both pressures.
#[component]
fn PhasesByEnergy(report: std::sync::Arc<JobReport>, d: usize, units: UnitSystem) -> impl IntoView {
    let state = use_job();
    // The report shown (the last good one while a figure is being retyped), with the job's
    // needs as they were read for it.
    let ranked = state
        .job
        .with_untracked(|job| crate::engine::phases_by_energy(job, &report, d));
    view! {
        <h2>"Where each cycle's energy goes"</h2>
        <ol class="card energy-rank" data-energy-rank="true">
            {ranked.into_iter().map(|e| {
                let need = e.needed.map_or(0.0, |q| q.value);
                let pressures = match e.pump_at_need() {
                    Some(false) => format!(
                        "needs {}, pump at {}",
                        Measure::Pressure.with_unit(units, need),
                        Measure::Pressure.with_unit(units, e.pump.value)
                    ),
                    Some(true) => format!("at {}", Measure::Pressure.with_unit(units, need)),
                    None => format!("needs no pressure, pump at {}", Measure::Pressure.with_unit(units, e.pump.value)),
                };
                view! {
                    <li data-phase=e.phase>
                        <span class="rank-name">{format!("{}. {}", e.phase + 1, e.name)}</span>
                        <span class="rank-energy" data-value="energy">{format!(
                            "{} per cycle, {:.0} % of it",
                            Measure::Energy.with_unit(units, e.energy.value),
                            e.share * 100.0
                        )}</span>
                        <span class="rank-pressure" data-value="pressures">{pressures}</span>
                    </li>
                }
            }).collect_view()}
        </ol>
    }
}

#[component]
fn Figure(label: &'static str, #[prop(into)] value: String, key: &'static str) -> impl IntoView {
    view! {
        <div class="figure">
            <dt>{label}</dt>
            <dd data-total=key>{value}</dd>
        </div>
    }
}

#[component]
fn Totals(design: DesignReport, units: UnitSystem, currency: String) -> impl IntoView {
    let t = design.totals;
    let oil = &design.oil;
    let oil_words = match oil.balance.as_ref().map(|b| b.steady) {
        Some(crate::engine::heat::Settling::At(k)) => {
            format!("settles at {}", Measure::Temperature.with_unit(units, k))
        }
        Some(crate::engine::heat::Settling::Above(k)) => format!(
            "does not settle below {}",
            Measure::Temperature.with_unit(units, k)
        ),
        None => format!(
            "at {}, as entered",
            Measure::Temperature.with_unit(units, oil.working_temperature)
        ),
    };
    view! {
        <div class="card totals">
            <h2>{format!("“{}” over one cycle", design.name)}</h2>
            <dl class="figures">
                <Figure label="Cycle time" value=Measure::Duration.with_unit(units, t.cycle_time.value) key="cycle-time" />
                <Figure label="Energy per cycle" value=Measure::Energy.with_unit(units, t.energy_per_cycle.value) key="energy-per-cycle" />
                <Figure label="Average input" value=Measure::Power.with_unit(units, t.average_electrical.value) key="average" />
                <Figure label="Peak input" value=Measure::Power.with_unit(units, t.peak_electrical.value) key="peak" />
                <Figure label="Motor load, RMS" value=Measure::Power.with_unit(units, t.rms_shaft.value) key="rms-shaft" />
                <Figure label="Motor load, peak" value=Measure::Power.with_unit(units, t.peak_shaft.value) key="peak-shaft" />
                <Figure label="Heat into the oil" value=Measure::Heat.with_unit(units, t.heat_load.value) key="heat" />
                <Figure label="Oil warms, no cooler" value=Measure::RiseRate.with_unit(units, t.oil_rise_k_per_minute) key="oil-rise" />
                <Figure label="Oil temperature" value=oil_words key="oil-temperature" />
                <Figure label="Energy a year" value=format!("{:.0} kWh", t.annual_energy.get::<kilowatt_hour>()) key="annual-energy" />
                <Figure label="Running cost a year" value=format!("{:.0} {currency}", t.annual_cost) key="annual-cost" />
                {t.demand.map(|demand| view! {
                    <Figure label="of which demand charge" value=format!(
                        "{:.0} {currency} ({} billed)",
                        demand.annual_cost,
                        Measure::Power.with_unit(units, demand.billed_demand.value)
                    ) key="demand-cost" />
                })}
            </dl>
            <a class="button quiet" href=super::area::Area::Heat.href() data-link="heat">"Oil and heat"</a>
        </div>
    }
}

/// A difference of current with its sign: "+0.7 A", "-1.2 A".
fn signed_current(units: UnitSystem, amps: f64) -> String {
    let text = Measure::Current.with_unit(units, amps.abs());
    if Measure::Current.format(units, amps.abs()) == Measure::Current.format(units, 0.0) {
        text
    } else if amps > 0.0 {
        format!("+{text}")
    } else {
        format!("−{text}")
    }
}

#[component]
fn PhaseResult(
    i: usize,
    phase: crate::engine::PhaseReport,
    units: UnitSystem,
    /// The line current a clamp meter read in this phase, if entered.
    read: Option<f64>,
) -> impl IntoView {
    let p = &phase.point;
    let l = &phase.ledger;
    let unloaded: Vec<String> = p
        .pumps
        .iter()
        .enumerate()
        .filter(|(_, x)| x.state == PumpState::Unloaded)
        .map(|(n, _)| format!("{}", n + 1))
        .collect();
    let pumps = if !p.motor_running {
        "motor stopped".to_string()
    } else if unloaded.is_empty() {
        "all feeding".to_string()
    } else {
        format!("pump {} unloaded", unloaded.join(" and "))
    };
    let limit = match p.limit.limit {
        ActiveLimit::Main => "main",
        ActiveLimit::Remote { .. } => "remote stage",
        ActiveLimit::Vented => "vented",
    };
    let row = |label: &'static str, key: &'static str, value: String| {
        view! {
            <div class="figure">
                <dt>{label}</dt>
                <dd data-value=key>{value}</dd>
            </div>
        }
    };
    view! {
        <li class="card phase-result" data-phase=i>
            <h3>{format!("{}. {}", i + 1, phase.name)}</h3>
            <dl class="figures">
                {row("Pressure", "pressure", Measure::Pressure.with_unit(units, p.system_pressure.value))}
                {row("Flow to actuator", "flow", Measure::Flow.with_unit(units, p.actuator_flow.value))}
                {p.actuator_speed.map(|s| row("Cylinder speed", "speed", Measure::Speed.with_unit(units, s.value)))}
                {row("Over the relief", "relief-flow", Measure::Flow.with_unit(units, p.relief_flow.value))}
                {row("Duration", "duration", Measure::Duration.with_unit(units, p.duration.value))}
                {p.shaft_speed.map(|w| row("Pump speed", "shaft-speed", Measure::ShaftSpeed.with_unit(units, w.value)))}
                {row("Pumps", "pumps", pumps)}
                {row("Limit", "limit", format!("{limit}, {}", Measure::Pressure.with_unit(units, p.limit.setting.value)))}
                {row("Electrical input", "input", Measure::Power.with_unit(units, l.electrical_input.value))}
                {phase.line.map(|line| row("Line current", "current", format!(
                    "{} at power factor {:.2}",
                    Measure::Current.with_unit(units, line.current.value),
                    line.power_factor
                )))}
                {phase.line.zip(read).map(|(line, read)| row("Clamp meter read", "current-read", format!(
                    "{} ({} against the model)",
                    Measure::Current.with_unit(units, read),
                    signed_current(units, read - line.current.value)
                )))}
                {row(LedgerItem::UsefulWork.name(), "useful", Measure::Power.with_unit(units, l.useful_power.value))}
                {row("Heat into the oil", "heat", Measure::Power.with_unit(units, l.heat_into_oil().value))}
            </dl>
            <details>
                <summary>"The whole ledger"</summary>
                <dl class="figures">
                    {row(LedgerItem::Motor.name(), "motor-loss", Measure::Power.with_unit(units, l.motor_loss.value))}
                    {p.shaft_speed.map(|_| row(LedgerItem::Drive.name(), "drive-loss", Measure::Power.with_unit(units, l.drive_loss.value)))}
                    {row(LedgerItem::InsidePumps.name(), "pump-loss", Measure::Power.with_unit(units, l.pump_internal_loss.value))}
                    {row(LedgerItem::Unloading.name(), "unloading-loss", Measure::Power.with_unit(units, l.unloading_loss.value))}
                    {row(LedgerItem::Relief.name(), "relief-loss", Measure::Power.with_unit(units, l.relief_loss.value))}
                    {row(LedgerItem::FlowControl.name(), "metering-loss", Measure::Power.with_unit(units, l.metering_loss.value))}
                    {row(LedgerItem::LinesAndValves.name(), "line-loss", Measure::Power.with_unit(units, l.line_valve_loss.value))}
                </dl>
            </details>
            {(!phase.findings.is_empty()).then(|| view! {
                <ul class="findings">
                    {phase.findings.iter().map(|f| view! { <li>{f.describe(units)}</li> }).collect_view()}
                </ul>
            })}
        </li>
    }
}

/// The presenter view's panel, beside an area where figures are typed: the shown power unit's
/// headline figures (each with the value it had before the last change, as a ghost) and its
/// power ledger, so a class sees a change and what it moves on one screen.
#[component]
pub fn PresenterPanel() -> impl IntoView {
    let state = use_job();
    // The figures in words, from the engine's answer; none while the job has errors.
    let figures = Memo::new(move |_| {
        let units = state.units();
        let d = state.design.get();
        let currency = state.job.with(|j| j.site.currency.clone());
        state.result.with(|r| {
            let report = r.as_ref().ok()?;
            let (name, [average, heat, cycle]) = super::shared::headline_figures(report, d, units)?;
            let t = &super::shared::shown_design(report, d)?.totals;
            let energy = format!("{:.0} kWh", t.annual_energy.get::<kilowatt_hour>());
            let cost = format!("{:.0} {currency}", t.annual_cost);
            Some((name, [average, heat, energy, cost, cycle]))
        })
    });
    // What each figure was when the field being changed was entered, so typing "250" shows
    // the figures before the 2, not those after the 25. Entering another field starts anew.
    let before = RwSignal::new(None::<[String; 5]>);
    let anchor = StoredValue::new(None::<(String, [String; 5])>);
    let entered = window_event_listener(leptos::ev::focusin, move |_| {
        if let Some(now) = figures.get_untracked() {
            anchor.set_value(Some(now));
        }
    });
    on_cleanup(move || entered.remove());
    Effect::new(move |_| {
        let Some((name, now)) = figures.get() else {
            return;
        };
        match anchor.get_value() {
            Some((anchor_name, was)) if anchor_name == name => {
                before.set((was != now).then_some(was));
            }
            // First figures, or another power unit shown: no "before" across two machines.
            _ => {
                anchor.set_value(Some((name, now)));
                before.set(None);
            }
        }
    });
    const LABELS: [(&str, &str); 5] = [
        ("Average input", "average"),
        ("Heat into the oil", "heat"),
        ("Energy a year", "annual-energy"),
        ("Running cost a year", "annual-cost"),
        ("Cycle time", "cycle-time"),
    ];
    let chart = Memo::new(move |_| {
        let d = state.design.get();
        state.result.with(|r| {
            let report = r.as_ref().ok()?;
            let design = super::shared::shown_design(report, d)?.clone();
            Some((design, super::charts::ledger_scale_w(report)))
        })
    });
    view! {
        <aside class="presenter-panel" aria-label="Live figures" data-presenter-panel="true">
            {move || match figures.get() {
                None => view! { <p class="empty-note">"Figures return once every field holds a valid number."</p> }.into_any(),
                Some((name, now)) => {
                    let was = before.get();
                    view! {
                        <h2>{name}</h2>
                        <dl class="figures presenter-figures">
                            {LABELS.iter().zip(now).enumerate().map(|(i, ((label, key), value))| {
                                let ghost = was.as_ref().map(|w| w[i].clone()).filter(|w| *w != value);
                                view! {
                                    <div class="figure">
                                        <dt>{*label}</dt>
                                        <dd data-presenter=*key>{value}</dd>
                                        {ghost.map(|g| view! { <dd class="ghost" data-ghost=*key>{format!("before: {g}")}</dd> })}
                                    </div>
                                }
                            }).collect_view()}
                        </dl>
                    }.into_any()
                }
            }}
            {move || chart.get().map(|(design, scale)| {
                let units = state.units();
                view! { <LedgerChart design=design units=units scale_w=scale /> }
            })}
        </aside>
    }
}
