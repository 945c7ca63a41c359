//! The results area: what the engine says about the job, redrawn on every edit. While the
//! job has an error, the last good results stay, marked stale, with what to fix.

use super::charts::{LedgerChart, TimelineChart};
use super::field::UnitSwitch;
use super::state::{use_job, Display};
use super::unit_editor::DesignTabs;
use crate::engine::units::{Measure, UnitSystem};
use crate::engine::valve::ActiveLimit;
use crate::engine::{DesignReport, Job, JobReport, PumpState};
use crate::engine::ledger::LedgerItem;
use leptos::prelude::*;

/// The index a field path gives right after `prefix`: 1 for `cycle[1].load.force_n` after
/// `cycle[`.
fn index_after(field: &str, prefix: &str) -> Option<usize> {
    field
        .strip_prefix(prefix)
        .and_then(|rest| rest.split(']').next())
        .and_then(|n| n.parse::<usize>().ok())
}

/// Where a field path points, in words: "Phase 3 (Dwell)" or "Power unit “Proposed”".
pub fn place_of(field: &str, job: &Job) -> String {
    let index = |prefix: &str| index_after(field, prefix);
    if let Some(i) = index("cycle[") {
        let name = job.cycle.get(i).map(|p| p.name.as_str()).unwrap_or("");
        return format!("Phase {} ({name})", i + 1);
    }
    if let Some(i) = index("designs[") {
        let name = job.designs.get(i).map(|d| d.name.as_str()).unwrap_or("");
        return format!("Power unit “{name}”");
    }
    match field.split('.').next() {
        Some("site") => "Site".into(),
        Some("oil") => "Oil".into(),
        _ => "Job".into(),
    }
}

/// A field's name in words, from its path: `cycle[1].load.force_n` is "force",
/// `designs[0].relief.setting_pa` is "relief setting". The unit suffix of the job file's key
/// goes; the part it belongs to stays where it says which (relief, motor, unloading, check).
pub fn field_words(field: &str) -> String {
    const SUFFIXES: [&str; 13] = [
        "_m3_per_rev",
        "_m3_per_s",
        "_rad_per_s",
        "_m_per_s",
        "_kg_per_m3",
        "_j_per_kg_k",
        "_per_kwh",
        "_m3",
        "_pa",
        "_m",
        "_n",
        "_s",
        "_w",
    ];
    let mut parts = field.split('.').map(|p| p.split('[').next().unwrap_or(p));
    let last = parts.next_back().unwrap_or(field);
    let key = SUFFIXES
        .iter()
        .find_map(|s| last.strip_suffix(s))
        .unwrap_or(last);
    let owner = parts.next_back().filter(|p| {
        matches!(
            *p,
            "relief" | "motor" | "unloading" | "check" | "load" | "speed"
        )
    });
    let words = key.replace('_', " ");
    match owner {
        Some(owner) if !words.starts_with(owner) && owner != "load" && owner != "speed" => {
            format!("{owner} {words}")
        }
        _ => words,
    }
}

/// The area that holds a field, by its path.
pub fn area_of(field: &str) -> super::area::Area {
    use super::area::Area;
    match field.split(['.', '[']).next().unwrap_or_default() {
        "cycle" => Area::Cycle,
        "designs" => Area::PowerUnit,
        "site" | "oil" => Area::Quote,
        "advice" | "staging" => Area::Settings,
        "pump_tests" | "wear" => Area::PumpTest,
        _ => Area::Jobs,
    }
}

/// Opens the area holding `field` (the phase or design it belongs to first) and puts the
/// cursor in it.
fn go_to_field(state: super::state::JobState, field: String) {
    let index = |prefix: &str| index_after(&field, prefix);
    if let Some(i) = index("cycle[") {
        state.open_phase.set(Some(i));
    }
    if let Some(i) = index("designs[") {
        state.design.set(i);
    }
    let _ = window().location().set_hash(&area_of(&field).href());
    // Once the area has drawn, the field takes the cursor and comes into view.
    let _ = set_timeout_with_handle(
        move || {
            let selector = format!("[data-path='{field}']");
            if let Ok(Some(el)) = document().query_selector(&selector) {
                el.scroll_into_view();
                if let Ok(input) = wasm_bindgen::JsCast::dyn_into::<web_sys::HtmlInputElement>(el) {
                    let _ = input.focus();
                }
            }
        },
        std::time::Duration::from_millis(150),
    );
}

/// The display switches: presenter view and high contrast.
#[component]
pub fn DisplaySwitches() -> impl IntoView {
    let state = use_job();
    let toggle = move |name: &'static str, get: fn(&Display) -> bool, flip: fn(&mut Display)| {
        view! {
            <button
                type="button"
                class="toggle"
                aria-pressed=move || if state.display.with(get) { "true" } else { "false" }
                on:click=move |_| state.display.update(flip)
            >
                {name}
            </button>
        }
    };
    view! {
        <div class="segmented" role="group" aria-label="Display">
            {toggle("Presenter view", |d| d.presenter, |d| d.presenter = !d.presenter)}
            {toggle("High contrast", |d| d.high_contrast, |d| d.high_contrast = !d.high_contrast)}
        </div>
    }
}

/// A strip of the key figures, shown while editing so every change shows its effect at once.
/// Its markup stays; only its texts change, so an edit costs a solve and three text updates.
#[component]
pub fn LiveSummary() -> impl IntoView {
    let state = use_job();
    let figures = Memo::new(move |_| {
        let units = state.units();
        let d = state.design.get();
        let pick = |report: &JobReport| {
            let design = report
                .designs
                .get(d.min(report.designs.len().saturating_sub(1)))?;
            let t = &design.totals;
            Some((
                design.name.clone(),
                [
                    Measure::Power.with_unit(units, t.average_electrical.value),
                    Measure::Heat.with_unit(units, t.heat_load.value),
                    Measure::Duration.with_unit(units, t.cycle_time.value),
                ],
            ))
        };
        match state.result.with(|r| r.as_ref().ok().and_then(|r| pick(r))) {
            Some((name, values)) => Some((false, name, values)),
            None => state
                .last_good
                .with(|g| g.as_ref().and_then(|r| pick(r)))
                .map(|(name, values)| (true, name, values)),
        }
    });
    let stale = move || figures.with(|f| f.as_ref().is_some_and(|f| f.0));
    let name = move || {
        figures.with(|f| {
            f.as_ref().map(|(stale, name, _)| {
                if *stale {
                    format!("{name} (not up to date)")
                } else {
                    name.clone()
                }
            })
        })
    };
    let value = move |i: usize| move || figures.with(|f| f.as_ref().map(|f| f.2[i].clone()));
    view! {
        <Show when=move || figures.with(|f| f.is_some())>
            <a class="live-summary" class:stale=stale href="#/results" aria-live="polite">
                <span class="live-name">{name}</span>
                <span class="live-figure"><span class="live-label">"Average"</span><strong data-live="average">{value(0)}</strong></span>
                <span class="live-figure"><span class="live-label">"Heat"</span><strong data-live="heat">{value(1)}</strong></span>
                <span class="live-figure"><span class="live-label">"Cycle"</span><strong data-live="cycle-time">{value(2)}</strong></span>
            </a>
        </Show>
    }
}

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
            <super::cycle_editor::ExampleBanner />
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

/// Says the results are not for the job as it now stands, and why.
#[component]
pub fn StaleNotice() -> impl IntoView {
    let state = use_job();
    move || {
        state.result.with(|r| r.as_ref().err().cloned()).map(|errors| {
            let job = state.job.get();
            let count = errors.len();
            view! {
                <div class="stale-notice" role="alert" data-stale="true">
                    <strong>{if state.last_good.with(|g| g.is_some()) { "Not up to date. " } else { "No results yet. " }}</strong>
                    {format!(
                        "{count} {} to fix; the figures below are from the last valid entries.",
                        if count == 1 { "figure" } else { "figures" }
                    )}
                    <ul>
                        {errors.iter().take(5).map(|e| {
                            let field = e.field.clone();
                            view! {
                                <li>
                                    {format!("{}, {}: {} ", place_of(&e.field, &job), field_words(&e.field), e.message)}
                                    <a href=area_of(&e.field).href() data-go-to=e.field.clone()
                                        on:click=move |ev| { ev.prevent_default(); go_to_field(state, field.clone()); }>
                                        "Go to it"
                                    </a>
                                </li>
                            }
                        }).collect_view()}
                    </ul>
                </div>
            }
        })
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
            super::jobs::file_stem(&job_name),
            super::jobs::file_stem(&csv_design.name)
        );
        let text = crate::formats::ledger_csv::ledger_csv(&csv_design, units);
        super::jobs::download_as(&name, "text/csv", &text);
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
                    <Figure label="Energy saved a year" value=format!("{:.0} kWh", c.annual_energy_saved_kwh) key="saved-energy" />
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
            {design.phases.iter().enumerate().map(|(i, p)| view! { <PhaseResult i=i phase=p.clone() units=units /> }).collect_view()}
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
                let pressures = match e.needed_pa {
                    Some(need) if (e.pump_pa - need).abs() > need.abs() * 0.01 + 1e3 => format!(
                        "needs {}, pump at {}",
                        Measure::Pressure.with_unit(units, need),
                        Measure::Pressure.with_unit(units, e.pump_pa)
                    ),
                    Some(need) => format!("at {}", Measure::Pressure.with_unit(units, need)),
                    None => format!("needs no pressure, pump at {}", Measure::Pressure.with_unit(units, e.pump_pa)),
                };
                view! {
                    <li data-phase=e.phase>
                        <span class="rank-name">{format!("{}. {}", e.phase + 1, e.name)}</span>
                        <span class="rank-energy" data-value="energy">{format!(
                            "{} per cycle, {:.0} % of it",
                            Measure::Energy.with_unit(units, e.energy_j),
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
                <Figure label="Energy a year" value=format!("{:.0} kWh", t.annual_energy_kwh) key="annual-energy" />
                <Figure label="Running cost a year" value=format!("{:.0} {currency}", t.annual_cost) key="annual-cost" />
            </dl>
        </div>
    }
}

#[component]
fn PhaseResult(i: usize, phase: crate::engine::PhaseReport, units: UnitSystem) -> impl IntoView {
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
                {row("Pumps", "pumps", pumps)}
                {row("Limit", "limit", format!("{limit}, {}", Measure::Pressure.with_unit(units, p.limit.setting.value)))}
                {row("Electrical input", "input", Measure::Power.with_unit(units, l.electrical_input.value))}
                {row(LedgerItem::UsefulWork.name(), "useful", Measure::Power.with_unit(units, l.useful_power.value))}
                {row("Heat into the oil", "heat", Measure::Power.with_unit(units, l.heat_into_oil().value))}
            </dl>
            <details>
                <summary>"The whole ledger"</summary>
                <dl class="figures">
                    {row(LedgerItem::Motor.name(), "motor-loss", Measure::Power.with_unit(units, l.motor_loss.value))}
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

#[cfg(test)]
mod tests {
    use super::{area_of, field_words};
    use crate::ui::area::Area;

    #[test]
    fn a_field_is_named_in_words_and_found_in_its_area() {
        assert_eq!(field_words("cycle[1].load.force_n"), "force");
        assert_eq!(field_words("cycle[0].cylinder.bore_m"), "bore");
        assert_eq!(
            field_words("designs[0].relief.setting_pa"),
            "relief setting"
        );
        assert_eq!(
            field_words("designs[1].unloading_stages[0].unloading.setting_pa"),
            "unloading setting"
        );
        assert_eq!(
            field_words("designs[0].motor.rated_power_w"),
            "motor rated power"
        );
        assert_eq!(field_words("site.tariff_per_kwh"), "tariff");
        assert_eq!(field_words("name"), "name");
        assert_eq!(area_of("cycle[3].duration_s"), Area::Cycle);
        assert_eq!(
            area_of("designs[0].base_pump.drag_power_w"),
            Area::PowerUnit
        );
        assert_eq!(area_of("site.retrofit_price"), Area::Quote);
        assert_eq!(area_of("advice.margin_min_pa"), Area::Settings);
        assert_eq!(area_of("name"), Area::Jobs);
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
            let design = report.designs.get(d.min(report.designs.len().saturating_sub(1)))?;
            let t = &design.totals;
            Some((
                design.name.clone(),
                [
                    Measure::Power.with_unit(units, t.average_electrical.value),
                    Measure::Heat.with_unit(units, t.heat_load.value),
                    format!("{:.0} kWh", t.annual_energy_kwh),
                    format!("{:.0} {currency}", t.annual_cost),
                    Measure::Duration.with_unit(units, t.cycle_time.value),
                ],
            ))
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
        let Some((name, now)) = figures.get() else { return };
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
            let design = report.designs.get(d.min(report.designs.len().saturating_sub(1)))?.clone();
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
