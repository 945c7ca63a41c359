//! Charts drawn as SVG from the engine's report: the power ledger of each phase as a stacked
//! bar, and the cycle's pressure, flow and power against time. Text stays at a readable size
//! (the drawing is 400 units wide, so on a 360 px phone a unit is about a pixel).

use crate::engine::ledger::LedgerItem;
use crate::engine::quote::QuoteColumn;
use crate::engine::units::{Measure, UnitSystem};
use crate::engine::{DesignReport, PowerLedger};
use leptos::prelude::*;

const WIDTH: f64 = 400.0;
/// The timeline's margin for its value ticks.
const LEFT: f64 = 52.0;
const RIGHT: f64 = 12.0;

/// The ledger's items in the order they are stacked ([`LedgerItem::ALL`]), with their legend
/// text and CSS class.
pub const LEDGER_ITEMS: [(&str, &str); LedgerItem::COUNT] = [
    (LedgerItem::ALL[0].name(), "seg-useful"),
    (LedgerItem::ALL[1].name(), "seg-relief"),
    (LedgerItem::ALL[2].name(), "seg-metering"),
    (LedgerItem::ALL[3].name(), "seg-unloading"),
    (LedgerItem::ALL[4].name(), "seg-line"),
    (LedgerItem::ALL[5].name(), "seg-pump"),
    (LedgerItem::ALL[6].name(), "seg-motor"),
    (LedgerItem::ALL[7].name(), "seg-drive"),
];

fn ledger_values(l: &PowerLedger) -> [f64; LedgerItem::COUNT] {
    LedgerItem::ALL.map(|item| l.part(item).value)
}

/// Where the bars of a stacked chart start: the names stand on their own line above each bar,
/// so a long phase name is never cut to fit a column beside it.
const BAR_LEFT: f64 = 12.0;

/// A ledger item's name, its style class and its figure in words.
type SegmentWords = (&'static str, &'static str, String);

/// One bar per row, split into the ledger's items, on an axis from zero to about `max`. Each
/// segment's figure can be read three ways: hovering (its title), tapping or focusing it (the
/// read-out line under the chart), and the table of figures that opens below.
fn stacked_bars(
    rows: Vec<(String, [f64; LedgerItem::COUNT])>,
    max: f64,
    axis_label: String,
    aria: &'static str,
    tip: impl Fn(f64) -> String,
) -> impl IntoView {
    let row = 48.0;
    let top = 8.0;
    let axis = 44.0;
    let height = top + row * rows.len() as f64 + axis;
    let plot = WIDTH - BAR_LEFT - RIGHT;
    let axis_ticks = ticks(max);
    let axis_max = *axis_ticks.last().unwrap_or(&1.0);
    let x = move |v: f64| BAR_LEFT + plot * v / axis_max;
    let picked = RwSignal::new(None::<String>);
    // Each row's segments in words, for the read-out and the table.
    let words: Vec<(String, Vec<SegmentWords>, String)> = rows
        .iter()
        .map(|(name, values)| {
            let parts = values
                .iter()
                .zip(LEDGER_ITEMS)
                .filter(|(v, _)| **v > 0.0)
                .map(|(v, (item, class))| (item, class, tip(*v)))
                .collect();
            (name.clone(), parts, tip(values.iter().sum()))
        })
        .collect();
    let bars = rows
        .iter()
        .zip(&words)
        .enumerate()
        .map(|(i, ((name, values), (_, parts, _)))| {
            let y = top + row * i as f64;
            let mut start = 0.0;
            let segments = values
                .iter()
                .filter(|v| **v > 0.0)
                .zip(parts.clone())
                .map(|(v, (item, class, figure))| {
                    let (x0, x1) = (x(start), x(start + v));
                    start += v;
                    let said = format!("{name}: {item} {figure}");
                    let on_pick = {
                        let said = said.clone();
                        move || picked.set(Some(said.clone()))
                    };
                    let on_key = on_pick.clone();
                    let label = said.clone();
                    view! {
                        <rect class=class x=x0 y=y + 22.0 width=(x1 - x0).max(0.0) height=row - 28.0
                            tabindex="0" role="button" aria-label=label
                            on:click=move |_| on_pick()
                            on:focus=move |_| on_key()>
                            <title>{said}</title>
                        </rect>
                    }
                })
                .collect_view();
            view! {
                <text class="chart-label" x=BAR_LEFT y=y + 16.0>{name.clone()}</text>
                {segments}
            }
        })
        .collect_view();
    let grid = axis_ticks
        .iter()
        .map(|t| {
            let gx = x(*t);
            view! {
                <line class="chart-grid" x1=gx x2=gx y1=top y2=height - axis + 4.0 />
                <text class="chart-tick" x=gx y=height - axis + 19.0 text-anchor="middle">{format_tick(*t)}</text>
            }
        })
        .collect_view();
    let table = words
        .into_iter()
        .map(|(name, parts, total)| {
            view! {
                <tbody>
                    <tr class="chart-figures-row"><th scope="rowgroup">{name}</th><td>{total}</td></tr>
                    {parts.into_iter().map(|(item, class, figure)| view! {
                        <tr><th scope="row"><span class=format!("swatch {class}") aria-hidden="true"></span>{item}</th><td>{figure}</td></tr>
                    }).collect_view()}
                </tbody>
            }
        })
        .collect_view();
    view! {
        <figure class="chart">
            <svg viewBox=format!("0 0 {WIDTH} {height}") role="img" aria-label=aria>
                {grid}
                {bars}
                <text class="chart-axis" x=BAR_LEFT + plot / 2.0 y=height - 4.0 text-anchor="middle">{axis_label}</text>
            </svg>
            <p class="chart-readout" aria-live="polite">
                {move || picked.get().unwrap_or_else(|| "Tap a coloured part of a bar to read its figure.".into())}
            </p>
            <ul class="legend">
                {LEDGER_ITEMS.iter().map(|(name, class)| view! {
                    <li><span class=format!("swatch {class}") aria-hidden="true"></span>{*name}</li>
                }).collect_view()}
            </ul>
            <details class="chart-figures">
                <summary>"Every figure in this chart"</summary>
                <table>{table}</table>
            </details>
        </figure>
    }
}

/// Each design's year of electrical energy split into where it goes, on one scale.
#[component]
pub fn EnergyChart(columns: Vec<QuoteColumn>) -> impl IntoView {
    let max = columns
        .iter()
        .map(|c| c.annual_energy_by_item_kwh.iter().sum::<f64>())
        .fold(0.0, f64::max);
    // Large yearly figures read better in MWh on the axis.
    let (scale, unit) = if max >= 10_000.0 {
        (1e-3, "MWh")
    } else {
        (1.0, "kWh")
    };
    let rows = columns
        .iter()
        .map(|c| {
            (
                c.name.clone(),
                c.annual_energy_by_item_kwh.map(|e| e * scale),
            )
        })
        .collect();
    stacked_bars(
        rows,
        max * scale,
        format!("Electrical energy a year, {unit}"),
        "Where the energy goes in each power unit over a year",
        move |v| {
            format!(
                "{} {unit}",
                crate::formats::quote_text::grouped(v, if scale < 1.0 { 2 } else { 0 })
            )
        },
    )
}

/// A round step for an axis reaching `max`: 1, 2 or 5 times a power of ten, about four ticks.
pub fn nice_step(max: f64) -> f64 {
    if !(max.is_finite() && max > 0.0) {
        return 1.0;
    }
    let raw = max / 4.0;
    let magnitude = 10f64.powf(raw.log10().floor());

    [1.0, 2.0, 5.0, 10.0]
        .into_iter()
        .map(|m| m * magnitude)
        .find(|s| *s >= raw)
        .unwrap_or(10.0 * magnitude)
}

fn ticks(max: f64) -> Vec<f64> {
    let step = nice_step(max);
    let count = (max / step).ceil().max(1.0) as usize;
    (0..=count).map(|i| i as f64 * step).collect()
}

/// The highest phase input of any design of the report: one power scale for every design's
/// ledger chart, so their bars compare.
pub fn ledger_scale_w(report: &crate::engine::JobReport) -> f64 {
    report
        .designs
        .iter()
        .flat_map(|d| d.phases.iter().map(|p| p.ledger.electrical_input.value))
        .fold(0.0, f64::max)
}

/// Each phase's electrical input split into where it goes, on one power scale.
#[component]
pub fn LedgerChart(
    design: DesignReport,
    units: UnitSystem,
    #[prop(into)] scale_w: f64,
) -> impl IntoView {
    let rows = design
        .phases
        .iter()
        .map(|phase| {
            (
                phase.name.clone(),
                ledger_values(&phase.ledger).map(|w| Measure::Power.shown(units, w)),
            )
        })
        .collect();
    let label = Measure::Power.label(units);
    stacked_bars(
        rows,
        Measure::Power.shown(units, scale_w),
        format!("Electrical input, {label}"),
        "Where the power goes in each phase",
        move |v| format!("{v:.2} {label}"),
    )
}

fn format_tick(t: f64) -> String {
    if t == t.round() {
        format!("{t:.0}")
    } else if (t * 10.0) == (t * 10.0).round() {
        format!("{t:.1}")
    } else {
        format!("{t:.2}")
    }
}

/// One panel of the timeline: a quantity through the cycle, phase by phase.
fn timeline_panel(
    title: String,
    values: &[(f64, f64)],
    measure: Measure,
    units: UnitSystem,
    top: f64,
    height: f64,
    total: f64,
) -> impl IntoView {
    let plot = WIDTH - LEFT - RIGHT;
    let max = values
        .iter()
        .map(|(_, v)| measure.shown(units, *v))
        .fold(0.0, f64::max);
    let axis_ticks = ticks(max);
    let axis_max = *axis_ticks.last().unwrap_or(&1.0);
    let y = move |v: f64| top + height - height * measure.shown(units, v) / axis_max;
    let x = move |t: f64| LEFT + plot * t / total;
    let mut points = String::new();
    let mut t = 0.0;
    for (duration, value) in values {
        points += &format!(
            "{:.2},{:.2} {:.2},{:.2} ",
            x(t),
            y(*value),
            x(t + duration),
            y(*value)
        );
        t += duration;
    }
    let grid = axis_ticks
        .iter()
        .map(|tick| {
            let gy = top + height - height * tick / axis_max;
            view! {
                <line class="chart-grid" x1=LEFT x2=WIDTH - RIGHT y1=gy y2=gy />
                <text class="chart-tick" x=LEFT - 6.0 y=gy + 4.0 text-anchor="end">{format_tick(*tick)}</text>
            }
        })
        .collect_view();
    view! {
        <g class="timeline-panel">
            <text class="chart-title" x=LEFT y=top - 8.0>{format!("{title}, {}", measure.label(units))}</text>
            {grid}
            <polyline class="chart-line" points=points />
        </g>
    }
}

/// Pressure, flow to the actuator and electrical power through one cycle.
#[component]
pub fn TimelineChart(design: DesignReport, units: UnitSystem) -> impl IntoView {
    let total: f64 = design.phases.iter().map(|p| p.point.duration.value).sum();
    let panel = 70.0;
    let gap = 34.0;
    let height = 3.0 * (panel + gap) + 48.0;
    let series = |f: &dyn Fn(&crate::engine::PhaseReport) -> f64| {
        design
            .phases
            .iter()
            .map(|p| (p.point.duration.value, f(p)))
            .collect::<Vec<_>>()
    };
    let pressure = series(&|p| p.point.system_pressure.value);
    let flow = series(&|p| p.point.actuator_flow.value);
    let power = series(&|p| p.ledger.electrical_input.value);
    let plot = WIDTH - LEFT - RIGHT;
    let time_ticks = ticks(total);
    let time_max = *time_ticks.last().unwrap_or(&1.0);
    let scale = total / time_max;
    // The time axis sits under the last panel's baseline, never across the power panel.
    let base = 3.0 * (panel + gap);
    let x_axis = time_ticks
        .iter()
        .map(|t| {
            let gx = LEFT + plot * t / time_max;
            view! { <text class="chart-tick time-tick" x=gx y=base + 21.0 text-anchor="middle">{format_tick(*t)}</text> }
        })
        .collect_view();
    // Phase boundaries, so a bump can be matched to its phase.
    let mut t = 0.0;
    let bounds = design
        .phases
        .iter()
        .map(|p| {
            t += p.point.duration.value;
            let gx = LEFT + plot * (t / total) * scale;
            view! { <line class="chart-phase" x1=gx x2=gx y1=gap - 8.0 y2=base /> }
        })
        .collect_view();
    view! {
        <figure class="chart">
            <svg viewBox=format!("0 0 {WIDTH} {height}") role="img" aria-label="Pressure, flow and power through the cycle">
                {bounds}
                {timeline_panel("Pressure".into(), &pressure, Measure::Pressure, units, gap, panel, total / scale)}
                {timeline_panel("Flow to the actuator".into(), &flow, Measure::Flow, units, gap + panel + gap, panel, total / scale)}
                {timeline_panel("Electrical input".into(), &power, Measure::Power, units, gap + 2.0 * (panel + gap), panel, total / scale)}
                {x_axis}
                <text class="chart-axis time-axis" x=LEFT + plot / 2.0 y=height - 4.0 text-anchor="middle">"Time in the cycle, s"</text>
            </svg>
        </figure>
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn axis_steps_are_round_and_cover_the_maximum() {
        for (max, step) in [
            (9.3, 5.0),
            (11.28, 5.0),
            (62.4, 20.0),
            (0.8, 0.2),
            (210.0, 100.0),
            (1.0, 0.5),
        ] {
            assert_eq!(nice_step(max), step, "{max}");
            assert!(*ticks(max).last().unwrap() >= max);
        }
        assert_eq!(nice_step(0.0), 1.0);
        assert_eq!(nice_step(f64::NAN), 1.0);
    }
}
