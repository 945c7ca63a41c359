//! The quote area: every design of the job side by side as a customer reads a retrofit quote
//! (engine `quote`, worded by `quote_text`), the site's costs that drive it, where each
//! design's energy goes, what its heat means for cooling, and the way to the printable report.
//!
//! While any figure is invalid the quote area keeps the last comparison, dimmed and titled
//! "not up to date" (so the page does not jump while a figure is retyped), under the stale
//! notice; the report (`ui::report`) shows no figures at all then.

use super::charts::EnergyChart;
use super::field::{NumberField, OptionalNumberField, TextField, UnitSwitch};
use super::state::use_job;
use crate::engine::fields;
use crate::engine::quote::{self, QuoteColumn};
use crate::engine::units::UnitSystem;
use crate::engine::Job;
use crate::formats::quote_text::{self, Precision, Row};
use leptos::prelude::*;

/// The comparison as the job now stands, or none while any figure is invalid: a quote is
/// never made from stale figures.
pub fn use_columns() -> Memo<Option<Vec<QuoteColumn>>> {
    let state = use_job();
    Memo::new(move |_| {
        state.result.with(|r| {
            r.as_ref()
                .ok()
                .map(|report| state.job.with(|job| quote::columns(job, report)))
        })
    })
}

#[component]
pub fn QuoteArea() -> impl IntoView {
    let state = use_job();
    let columns = use_columns();
    let precision = RwSignal::new(Precision::ForCustomer);
    let designs = move || state.job.with(|j| j.designs.len());
    // While a figure is being retyped the last comparison stays, dimmed and marked, so the
    // page does not jump under the user's finger; the stale notice says what to fix.
    let last = RwSignal::new(None::<Vec<QuoteColumn>>);
    Effect::new(move |_| {
        if let Some(c) = columns.get() {
            last.set(Some(c));
        }
    });
    let shown = Memo::new(move |_| {
        columns
            .get()
            .map(|c| (false, c))
            .or_else(|| last.get().map(|c| (true, c)))
    });
    view! {
        <section class="area quote" aria-labelledby="area-title">
            <div class="area-head">
                <h1 id="area-title">"Retrofit quote"</h1>
                <UnitSwitch />
            </div>
            <super::shared::ExampleBanner />
            <super::shared::StaleNotice />
            {move || {
                // A quote on a proposal made from an earlier "as found" compares two machines.
                let older: Vec<String> = state.job.with(|j| match j.designs.split_first() {
                    Some((baseline, rest)) => rest.iter().filter(|x| x.made_from_older(baseline)).map(|x| format!("“{}”", x.name)).collect(),
                    None => Vec::new(),
                });
                (!older.is_empty()).then(|| view! {
                    <p class="older-baseline" role="status" data-older-baseline="true">
                        {format!(
                            "{} made from an earlier “as found”: the machine found has changed since. Make {} again in the ",
                            older.join(", ") + if older.len() == 1 { " was" } else { " were" },
                            if older.len() == 1 { "it" } else { "them" }
                        )}
                        <a href=super::area::Area::PowerUnit.href()>{super::area::Area::PowerUnit.title()}</a>
                        " area before quoting."
                    </p>
                })
            }}
            {move || (designs() < 2).then(|| view! {
                <p class="empty-note" data-quote-single="true">
                    "Only one power unit so far. Add a proposed one in the "
                    <a href=super::area::Area::PowerUnit.href()>{super::area::Area::PowerUnit.title()}</a>
                    " area (or apply a staging candidate or a setting's advice) to compare it with this one."
                </p>
            })}
            {move || shown.get().map(|(stale, columns)| {
                let units = state.units();
                let currency = state.job.with(|j| j.site.currency.clone());
                let notes = fewer_parts_notes(&columns);
                view! {
                    <div class="card" class:stale=stale data-quote-stale=if stale { "true" } else { "false" }>
                        <div class="card-head">
                            <h2>{if stale { "Side by side (not up to date)" } else { "Side by side" }}</h2>
                            <PrecisionSwitch precision=precision />
                        </div>
                        {move || view! { <ComparisonTable columns=columns.clone() units=units currency=currency.clone() precision=precision.get() /> }}
                        {notes}
                        <p class="hint">"Simple payback: the retrofit price over the cost saved a year, with no interest and today's electricity price. Each cell's exact figure shows on the “Exact” switch and in the report."</p>
                    </div>
                }
            })}
            {move || shown.get().map(|(stale, columns)| {
                let units = state.units();
                view! {
                    <div class:stale=stale>
                        <h2>"Where the energy goes"</h2>
                        <EnergyChart columns=columns.clone() />
                        <h2>"What the heat means for cooling"</h2>
                        <CoolingList columns=columns units=units precision=precision.get() />
                    </div>
                }
            })}
            {move || state.job.with(|j| !j.pump_tests.is_empty()).then(|| view! {
                <div class="card" data-quote-pumps="true">
                    <h2>"Pump tests"</h2>
                    <super::shared::PumpVerdicts />
                </div>
            })}
            <SiteCosts />
            <OilFields />
            <a class="button wide" href=super::area::Area::Report.href() data-action="open-report">
                "Open the report to print or save as PDF"
            </a>
        </section>
    }
}

/// A caution under the comparison for each design that makes fewer parts than the baseline.
pub fn fewer_parts_notes(columns: &[QuoteColumn]) -> impl IntoView {
    let notes: Vec<String> = columns
        .split_first()
        .map(|(baseline, rest)| {
            rest.iter()
                .filter_map(|c| quote_text::fewer_parts_note(c, baseline))
                .collect()
        })
        .unwrap_or_default();
    (!notes.is_empty()).then(|| {
        view! {
            <ul class="fewer-parts" data-fewer-parts="true">
                {notes.into_iter().map(|n| view! { <li>{n}</li> }).collect_view()}
            </ul>
        }
    })
}

/// Rounded for a customer, or exact.
#[component]
fn PrecisionSwitch(precision: RwSignal<Precision>) -> impl IntoView {
    let option = move |this: Precision, label: &'static str| {
        view! {
            <button
                type="button"
                class="toggle"
                data-precision=match this { Precision::ForCustomer => "customer", Precision::Exact => "exact" }
                aria-pressed=move || if precision.get() == this { "true" } else { "false" }
                on:click=move |_| precision.set(this)
            >
                {label}
            </button>
        }
    };
    view! {
        <div class="segmented" role="group" aria-label="Figures">
            {option(Precision::ForCustomer, "Rounded")}
            {option(Precision::Exact, "Exact")}
        </div>
    }
}

/// The comparison: a column per design, a row per figure, then the savings against the
/// baseline (the first design).
#[component]
pub fn ComparisonTable(
    columns: Vec<QuoteColumn>,
    units: UnitSystem,
    currency: String,
    precision: Precision,
) -> impl IntoView {
    let head = columns
        .iter()
        .enumerate()
        .map(|(i, c)| {
            view! {
                <th scope="col" data-design=i>
                    {c.name.clone()}
                    {(i == 0).then(|| view! { <span class="role-tag">" (baseline)"</span> })}
                </th>
            }
        })
        .collect_view();
    let body = |rows: &[Row]| {
        rows.iter()
            .filter(|row| row.shown_for(&columns))
            .map(|&row| {
                let cells = columns
                    .iter()
                    .enumerate()
                    .map(|(i, c)| {
                        let text = quote_text::cell(row, c, units, &currency, precision);
                        view! { <td data-design=i>{text.unwrap_or_else(|| "–".into())}</td> }
                    })
                    .collect_view();
                view! {
                    <tr data-quote-row=row.key()>
                        <th scope="row">{row.label()}</th>
                        {cells}
                    </tr>
                }
            })
            .collect_view()
    };
    let baseline = columns.first().map(|c| c.name.clone()).unwrap_or_default();
    let savings = (columns.len() > 1).then(|| {
        view! {
            <tbody class="savings">
                <tr class="group">
                    <th scope="rowgroup" colspan=columns.len() + 1>{format!("Against “{baseline}”")}</th>
                </tr>
                {body(&Row::SAVING)}
            </tbody>
        }
    });
    view! {
        <div class="table-wrap">
            <table class="needs quote-table" data-quote-table=match precision { Precision::ForCustomer => "customer", Precision::Exact => "exact" }>
                <thead>
                    <tr><th scope="col">"Figure"</th>{head}</tr>
                </thead>
                <tbody>{body(&Row::DESIGN)}</tbody>
                {savings}
            </table>
        </div>
    }
}

/// What each design's heat load asks of a cooler.
#[component]
pub fn CoolingList(
    columns: Vec<QuoteColumn>,
    units: UnitSystem,
    precision: Precision,
) -> impl IntoView {
    view! {
        <ul class="cooling">
            {columns.iter().enumerate().map(|(i, c)| view! {
                <li data-cooling=i>
                    <strong>{format!("{}: ", c.name)}</strong>
                    {quote_text::cooling(c, units, precision)}
                </li>
            }).collect_view()}
        </ul>
    }
}

/// The site's figures a quote rests on: hours, price, currency, retrofit price, grid factor;
/// and a price of its own for any proposed design whose retrofit costs differently.
#[component]
fn SiteCosts() -> impl IntoView {
    let state = use_job();
    // Rebuilt only when a design is added, removed or renamed, never while a price is typed.
    let proposed = Memo::new(move |_| {
        state.job.with(|j| {
            j.designs
                .iter()
                .skip(1)
                .map(|d| d.name.clone())
                .collect::<Vec<_>>()
        })
    });
    let site_price = Signal::derive(move || {
        state.job.with(|j| {
            format!(
                "the site's: {}",
                quote_text::grouped(j.site.retrofit_price, 0)
            )
        })
    });
    let own_prices = move || {
        proposed
            .get()
            .into_iter()
            .enumerate()
            .map(|(n, name)| {
                let d = n + 1;
                view! {
                    <OptionalNumberField
                        field=&fields::OWN_RETROFIT_PRICE
                        at=[d]
                        label=format!("Retrofit price for “{name}”, if its own")
                        placeholder=site_price
                        get=move |j: &Job| j.designs.get(d).and_then(|x| x.retrofit_price)
                        set=move |j: &mut Job, v| if let Some(x) = j.designs.get_mut(d) { x.retrofit_price = v }
                    />
                }
            })
            .collect_view()
    };
    view! {
        <div class="card">
            <h2>"Site and costs"</h2>
            <div class="field-grid">
                <NumberField field=&fields::OPERATING_HOURS
                    get=|j: &Job| j.site.operating_hours_per_year set=|j: &mut Job, v| j.site.operating_hours_per_year = v />
                <NumberField field=&fields::TARIFF
                    get=|j: &Job| j.site.tariff_per_kwh set=|j: &mut Job, v| j.site.tariff_per_kwh = v />
                <TextField field=&fields::CURRENCY
                    get=|j: &Job| j.site.currency.clone() set=|j: &mut Job, v| j.site.currency = v />
                <NumberField field=&fields::RETROFIT_PRICE
                    get=|j: &Job| j.site.retrofit_price set=|j: &mut Job, v| j.site.retrofit_price = v />
                <OptionalNumberField field=&fields::GRID_FACTOR
                    placeholder="none: no CO₂ figures".to_string()
                    get=|j: &Job| j.site.grid_factor set=|j: &mut Job, v| j.site.grid_factor = v />
                <OptionalNumberField field=&fields::DEMAND_CHARGE
                    placeholder="none: energy only".to_string()
                    get=|j: &Job| j.site.demand_charge set=|j: &mut Job, v| j.site.demand_charge = v />
                <OptionalNumberField field=&fields::POWER_FACTOR_THRESHOLD
                    placeholder="none: reactive power not billed".to_string()
                    get=|j: &Job| j.site.power_factor_threshold set=|j: &mut Job, v| j.site.power_factor_threshold = v />
                {own_prices}
            </div>
        </div>
    }
}

/// The oil now lives with the heat balance: a link there.
#[component]
fn OilFields() -> impl IntoView {
    view! {
        <div class="card">
            <h2>"The oil"</h2>
            <p class="hint">"How much oil, how thick it is, the tank and where the oil settles are in their own area."</p>
            <a class="button quiet" href=super::area::Area::Heat.href() data-link="heat">"Oil and heat"</a>
        </div>
    }
}
