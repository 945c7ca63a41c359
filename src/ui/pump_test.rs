//! The pump-check area: a field test of one pump (nameplate, speed, readings), what the
//! engine makes of it (`engine::efficiency`): efficiencies, the leakage line, the wear verdict,
//! a chart of flow against pressure, the trend against the same pump's earlier test, and one
//! action that copies the measured efficiencies into a design.

use super::field::{ChoiceField, NumberField, OptionalNumberField, TextField};
use super::icons::CautionIcon;
use super::shared::{
    efficiency_from_key, efficiency_source_key, efficiency_source_options, percent, verdict_words,
};
use super::state::use_job;
use crate::engine::efficiency::{
    self, ElectricalInput, MotorEfficiency, PumpTest, Reading, SpeedFrom, TestReport,
};
use crate::engine::fields::{self, FieldSpec};
use crate::engine::units::{Measure, UnitSystem};
use crate::engine::Job;
use leptos::prelude::*;
use uom::si::f64::{
    AngularVelocity, ElectricCurrent, ElectricPotential, Power, Pressure, Torque, VolumeRate,
};

fn test(j: &Job, t: usize) -> Option<&PumpTest> {
    j.pump_tests.get(t)
}

fn test_mut(j: &mut Job, t: usize) -> Option<&mut PumpTest> {
    j.pump_tests.get_mut(t)
}

fn reading(j: &Job, t: usize, k: usize) -> Option<&Reading> {
    test(j, t)?.readings.get(k)
}

fn reading_mut(j: &mut Job, t: usize, k: usize) -> Option<&mut Reading> {
    test_mut(j, t)?.readings.get_mut(k)
}

/// A new test, from the shown design's base pump and motor (the user corrects what differs);
/// none while the job has no power unit.
fn new_test(j: &Job, d: usize) -> Option<PumpTest> {
    let design = j.designs.get(d).or(j.designs.last())?;
    let today = js_sys::Date::new_0()
        .to_iso_string()
        .as_string()
        .unwrap_or_default();
    Some(PumpTest {
        pump: format!("Pump {}", design.pump_count()),
        date: today.get(..10).unwrap_or("").to_string(),
        notes: String::new(),
        displacement: design.base_pump.displacement,
        speed: design.motor.full_load_speed,
        synchronous_speed: None,
        rated_pressure: design.base_pump.rated_pressure,
        motor_rated_power: design.motor.rated_power,
        motor_efficiency: MotorEfficiency::Entered {
            efficiency: design.motor.full_load_efficiency,
        },
        readings: Vec::new(),
    })
}

fn blank_reading() -> Reading {
    Reading {
        pressure: Pressure::new::<uom::si::pressure::pascal>(f64::NAN),
        flow: VolumeRate::new::<uom::si::volume_rate::cubic_meter_per_second>(f64::NAN),
        speed: None,
        electrical: None,
        torque: None,
    }
}

#[component]
pub fn PumpCheckArea() -> impl IntoView {
    let state = use_job();
    let shown = RwSignal::new(0usize);
    let count = Memo::new(move |_| state.job.with(|j| j.pump_tests.len()));
    let labels = Memo::new(move |_| {
        state.job.with(|j| {
            j.pump_tests
                .iter()
                .map(|t| format!("{} · {}", t.pump, t.date))
                .collect::<Vec<_>>()
        })
    });
    let start = move |_| {
        let d = state.design_index();
        state.job.update(|j| {
            if let Some(t) = new_test(j, d) {
                j.pump_tests.push(t);
            }
        });
        shown.set(count.get_untracked().saturating_sub(1));
    };
    let current = move || shown.get().min(count.get().saturating_sub(1));
    view! {
        <section class="area pump-check" aria-labelledby="area-title">
            <div class="area-head">
                <h1 id="area-title">"Pump test"</h1>
            </div>
            <p class="purpose">"A pump's volumetric and overall efficiency from flow, pressure, speed and motor readings, and whether it is worn."</p>
            <p class="inline-caution">
                <CautionIcon />
                <span>"Test only with gauges, meters and hoses rated for the pressure, and guards in place. Loading a pump against a valve is work for a qualified person; the maker's test procedure and ratings come first."</span>
            </p>
            <div class="segmented test-tabs" role="group" aria-label="Test shown">
                {move || labels.get().into_iter().enumerate().map(|(i, label)| view! {
                    <button type="button" class="toggle" aria-pressed=move || if current() == i { "true" } else { "false" }
                        on:click=move |_| shown.set(i)>{label}</button>
                }).collect_view()}
            </div>
            <button type="button" class="button" data-action="new-test" on:click=start>"Start a test"</button>
            {move || if count.get() == 0 {
                view! { <p class="empty-note">"No test yet. Start one, then enter each flow reading at its test pressure."</p> }.into_any()
            } else {
                let t = current();
                view! { <TestEditor t=t /> <TestResults t=t /> }.into_any()
            }}
            <WearLines />
        </section>
    }
}

#[component]
fn TestEditor(t: usize) -> impl IntoView {
    let state = use_job();
    let readings = Memo::new(move |_| {
        state
            .job
            .with(|j| test(j, t).map_or(0, |x| x.readings.len()))
    });
    let add = move |_| {
        state.job.update(|j| {
            if let Some(x) = test_mut(j, t) {
                x.readings.push(blank_reading());
            }
        })
    };
    let remove = move |_| {
        state.job.update(|j| {
            if t < j.pump_tests.len() {
                j.pump_tests.remove(t);
            }
        })
    };
    view! {
        <h2>"The pump"</h2>
        <div class="field-grid">
            <TextField field=&fields::TESTED_PUMP at=[t]
                get=move |j: &Job| test(j, t).map_or(String::new(), |x| x.pump.clone())
                set=move |j: &mut Job, v| if let Some(x) = test_mut(j, t) { x.pump = v } />
            <TextField field=&fields::TEST_DATE at=[t]
                get=move |j: &Job| test(j, t).map_or(String::new(), |x| x.date.clone())
                set=move |j: &mut Job, v| if let Some(x) = test_mut(j, t) { x.date = v } />
            <NumberField field=&fields::TEST_DISPLACEMENT at=[t]
                get=move |j: &Job| test(j, t).map_or(f64::NAN, |x| x.displacement.value)
                set=move |j: &mut Job, v| if let Some(x) = test_mut(j, t) { x.displacement.value = v } />
            <NumberField field=&fields::TEST_SPEED at=[t]
                get=move |j: &Job| test(j, t).map_or(f64::NAN, |x| x.speed.value)
                set=move |j: &mut Job, v| if let Some(x) = test_mut(j, t) { x.speed.value = v } />
            <OptionalNumberField field=&fields::TEST_SYNCHRONOUS_SPEED at=[t]
                placeholder=Signal::derive(move || synchronous_hint(&state.job.read(), t))
                get=move |j: &Job| test(j, t).and_then(|x| x.synchronous_speed).map(|s| s.value)
                set=move |j: &mut Job, v| if let Some(x) = test_mut(j, t) { x.synchronous_speed = v.map(AngularVelocity::new::<uom::si::angular_velocity::radian_per_second>) } />
            <NumberField field=&fields::TEST_RATED_PRESSURE at=[t]
                get=move |j: &Job| test(j, t).map_or(f64::NAN, |x| x.rated_pressure.value)
                set=move |j: &mut Job, v| if let Some(x) = test_mut(j, t) { x.rated_pressure.value = v } />
            <NumberField field=&fields::TEST_MOTOR_POWER at=[t]
                get=move |j: &Job| test(j, t).map_or(f64::NAN, |x| x.motor_rated_power.value)
                set=move |j: &mut Job, v| if let Some(x) = test_mut(j, t) { x.motor_rated_power.value = v } />
            <ChoiceField field=&fields::MOTOR_EFFICIENCY_FROM at=[t]
                options=efficiency_source_options()
                get=move |j: &Job| motor_source(j, t)
                set=move |j: &mut Job, v: &str| set_motor_source(j, t, v) />
            {move || (motor_source(&state.job.read(), t) == "entered").then(|| view! {
                <NumberField field=&fields::TEST_MOTOR_EFFICIENCY at=[t]
                    get=move |j: &Job| match test(j, t).map(|x| x.motor_efficiency) { Some(MotorEfficiency::Entered { efficiency }) => efficiency, _ => f64::NAN }
                    set=move |j: &mut Job, v| if let Some(x) = test_mut(j, t) { x.motor_efficiency = MotorEfficiency::Entered { efficiency: v } } />
            })}
        </div>
        <TextField field=&fields::TEST_NOTES at=[t]
            get=move |j: &Job| test(j, t).map_or(String::new(), |x| x.notes.clone())
            set=move |j: &mut Job, v| if let Some(x) = test_mut(j, t) { x.notes = v } />
        <h2>"Readings"</h2>
        {move || (0..readings.get()).map(|k| view! { <ReadingEditor t=t k=k /> }).collect_view()}
        <button type="button" class="button wide" data-action="add-reading" on:click=add>"Add a reading"</button>
        <button type="button" class="button danger" data-action="delete-test" on:click=remove>"Delete this test"</button>
    }
}

/// What applies while the synchronous speed is left empty: the engine's inferred one, or none.
fn synchronous_hint(j: &Job, t: usize) -> String {
    match test(j, t).and_then(efficiency::synchronous_speed) {
        Some(s) => format!(
            "taken as {} from the full-load speed",
            Measure::ShaftSpeed.format(j.units, s)
        ),
        None => "not known: the full-load speed is used".to_string(),
    }
}

fn motor_source(j: &Job, t: usize) -> &'static str {
    test(j, t).map_or("entered", |x| efficiency_source_key(x.motor_efficiency))
}

fn set_motor_source(j: &mut Job, t: usize, v: &str) {
    let efficiency = efficiency_from_key(
        v,
        crate::engine::efficiency::nameplate_efficiency_offered(j),
    );
    if let Some(x) = test_mut(j, t) {
        x.motor_efficiency = efficiency;
    }
}

fn electrical_kind(j: &Job, t: usize, k: usize) -> &'static str {
    match reading(j, t, k).and_then(|r| r.electrical) {
        None => "none",
        Some(ElectricalInput::Power { .. }) => "power",
        Some(ElectricalInput::ThreePhase { .. }) => "three_phase",
    }
}

fn set_electrical_kind(j: &mut Job, t: usize, k: usize, v: &str) {
    if let Some(r) = reading_mut(j, t, k) {
        r.electrical = match v {
            "power" => Some(ElectricalInput::Power {
                input: Power::new::<uom::si::power::watt>(f64::NAN),
            }),
            "three_phase" => Some(ElectricalInput::ThreePhase {
                voltage: ElectricPotential::new::<uom::si::electric_potential::volt>(f64::NAN),
                current: ElectricCurrent::new::<uom::si::electric_current::ampere>(f64::NAN),
                power_factor: f64::NAN,
            }),
            _ => None,
        };
    }
}

/// One electrical figure of reading `k`: 0 input power, 1 voltage, 2 current, 3 power factor.
fn electrical_figure(j: &Job, t: usize, k: usize, which: u8) -> f64 {
    match (reading(j, t, k).and_then(|r| r.electrical), which) {
        (Some(ElectricalInput::Power { input }), 0) => input.value,
        (Some(ElectricalInput::ThreePhase { voltage, .. }), 1) => voltage.value,
        (Some(ElectricalInput::ThreePhase { current, .. }), 2) => current.value,
        (Some(ElectricalInput::ThreePhase { power_factor, .. }), 3) => power_factor,
        _ => f64::NAN,
    }
}

fn set_electrical_figure(j: &mut Job, t: usize, k: usize, which: u8, v: f64) {
    let Some(r) = reading_mut(j, t, k) else {
        return;
    };
    match (&mut r.electrical, which) {
        (Some(ElectricalInput::Power { input }), 0) => input.value = v,
        (Some(ElectricalInput::ThreePhase { voltage, .. }), 1) => voltage.value = v,
        (Some(ElectricalInput::ThreePhase { current, .. }), 2) => current.value = v,
        (Some(ElectricalInput::ThreePhase { power_factor, .. }), 3) => *power_factor = v,
        _ => {}
    }
}

fn speed_of(j: &Job, t: usize, k: usize) -> Option<f64> {
    reading(j, t, k).and_then(|r| r.speed).map(|x| x.value)
}

fn set_speed(j: &mut Job, t: usize, k: usize, v: Option<f64>) {
    if let Some(r) = reading_mut(j, t, k) {
        r.speed = v.map(AngularVelocity::new::<uom::si::angular_velocity::radian_per_second>);
    }
}

fn torque_of(j: &Job, t: usize, k: usize) -> Option<f64> {
    reading(j, t, k).and_then(|r| r.torque).map(|x| x.value)
}

fn set_torque(j: &mut Job, t: usize, k: usize, v: Option<f64>) {
    if let Some(r) = reading_mut(j, t, k) {
        r.torque = v.map(Torque::new::<uom::si::torque::newton_meter>);
    }
}

#[component]
fn ReadingEditor(t: usize, k: usize) -> impl IntoView {
    let state = use_job();
    let kind = Memo::new(move |_| state.job.with(|j| electrical_kind(j, t, k)));
    let remove = move |_| {
        state.job.update(|j| {
            if let Some(x) = test_mut(j, t) {
                if k < x.readings.len() {
                    x.readings.remove(k);
                }
            }
        })
    };
    let figure = move |field: &'static FieldSpec, which: u8| {
        view! {
            <NumberField field=field at=[t, k]
                get=move |j: &Job| electrical_figure(j, t, k, which)
                set=move |j: &mut Job, v| set_electrical_figure(j, t, k, which, v) />
        }
    };
    view! {
        <fieldset class="card reading" data-reading=k>
            <legend>{format!("Reading {}", k + 1)}</legend>
            <div class="field-grid">
                <NumberField field=&fields::TEST_PRESSURE at=[t, k]
                    get=move |j: &Job| reading(j, t, k).map_or(f64::NAN, |r| r.pressure.value)
                    set=move |j: &mut Job, v| if let Some(r) = reading_mut(j, t, k) { r.pressure.value = v } />
                <NumberField field=&fields::TEST_FLOW at=[t, k]
                    get=move |j: &Job| reading(j, t, k).map_or(f64::NAN, |r| r.flow.value)
                    set=move |j: &mut Job, v| if let Some(r) = reading_mut(j, t, k) { r.flow.value = v } />
                <OptionalNumberField field=&fields::SHAFT_SPEED at=[t, k]
                    placeholder=Signal::derive(|| "estimated from the load".to_string())
                    get=move |j: &Job| speed_of(j, t, k)
                    set=move |j: &mut Job, v| set_speed(j, t, k, v) />
                <ChoiceField field=&fields::MOTOR_INPUT at=[t, k]
                    options=vec![
                        ("none", "Not read".to_string()),
                        ("power", "Power meter, kW".to_string()),
                        ("three_phase", "Volts, amps, power factor".to_string()),
                    ]
                    get=move |j: &Job| electrical_kind(j, t, k)
                    set=move |j: &mut Job, v: &str| set_electrical_kind(j, t, k, v) />
                {move || match kind.get() {
                    "power" => figure(&fields::INPUT_POWER, 0).into_any(),
                    "three_phase" => view! {
                        {figure(&fields::LINE_VOLTAGE, 1)}
                        {figure(&fields::LINE_CURRENT, 2)}
                        {figure(&fields::POWER_FACTOR, 3)}
                    }.into_any(),
                    _ => ().into_any(),
                }}
                <OptionalNumberField field=&fields::SHAFT_TORQUE at=[t, k]
                    placeholder=Signal::derive(|| "not measured".to_string())
                    get=move |j: &Job| torque_of(j, t, k)
                    set=move |j: &mut Job, v| set_torque(j, t, k, v) />
            </div>
            <button type="button" class="button quiet" data-action="remove-reading" on:click=remove>"Remove this reading"</button>
        </fieldset>
    }
}

#[component]
fn TestResults(t: usize) -> impl IntoView {
    let state = use_job();
    let outcome = Memo::new(move |_| {
        let report = state
            .pump_tests
            .with(|r| r.get(t)?.as_ref().ok().cloned())?;
        state.job.with(|j| Some((test(j, t)?.clone(), report)))
    });
    move || {
        match outcome.get() {
        None => view! { <p class="empty-note" data-test-result="waiting">"Results appear once every figure of the test is in and valid."</p> }.into_any(),
        Some((x, report)) => view! { <TestFindings t=t test=x report=report /> }.into_any(),
    }
    }
}

#[component]
fn TestFindings(t: usize, test: PumpTest, report: TestReport) -> impl IntoView {
    let state = use_job();
    let u = state.job.with_untracked(|j| j.units);
    let used = report.readings_used;
    let (class, verdict_text, data) = verdict_words(&test, &report);
    let trend_text = state.job.with_untracked(|j| {
        let tr = efficiency::trend(&j.pump_tests, t, &j.wear)?;
        let when = j.pump_tests.get(tr.earlier)?.date.clone();
        let days = tr.days.map_or(String::new(), |d| format!(", {d} days before"));
        Some(match tr.volumetric_change {
            Some(c) => format!("Since the test of {when}{days}: {:+.1} points of volumetric efficiency at rated pressure.", c * 100.0),
            None => format!("An earlier test of this pump ({when}{days}): no change to show until both tests are judged."),
        })
    });
    let estimated = report
        .readings
        .iter()
        .any(|x| x.speed_from == SpeedFrom::Slip);
    let rows = test
        .readings
        .iter()
        .zip(&report.readings)
        .enumerate()
        .map(|(k, (r, x))| {
            view! {
                <tr>
                    <th scope="row">{k + 1}</th>
                    <td>{Measure::Pressure.format(u, r.pressure.value)}</td>
                    <td>{Measure::Flow.format(u, r.flow.value)}</td>
                    <td>{match x.speed_from {
                        SpeedFrom::Slip => format!("≈{}", Measure::ShaftSpeed.format(u, x.speed.value)),
                        _ => Measure::ShaftSpeed.format(u, x.speed.value),
                    }}</td>
                    <td>{percent(x.volumetric)}</td>
                    <td>{Measure::Power.format(u, x.hydraulic.value)}</td>
                    <td>{x.shaft.map(|q| q.value).map_or("–".into(), |w| Measure::Power.format(u, w))}</td>
                    <td>{percent(x.overall)}</td>
                    <td>{percent(x.hydromechanical)}</td>
                </tr>
            }
        })
        .collect_view();
    let problems = report.problems.clone();
    view! {
        <h2>"What the readings say"</h2>
        <p class={class} data-verdict=data data-readings-used=used role="status">{verdict_text}</p>
        {trend_text.map(|t| view! { <p class="trend" data-trend="true">{t}</p> })}
        <p>{format!("Theoretical flow at the motor's full-load speed of {}: {}. Motor efficiency at full load: {} (less at part load).", Measure::ShaftSpeed.with_unit(u, test.speed.value), Measure::Flow.with_unit(u, report.theoretical_flow.value), percent(report.motor_efficiency))}</p>
        {(!problems.is_empty()).then(|| view! {
            <ul class="test-problems" role="alert">
                {problems.into_iter().map(|p| view! { <li data-problem=p.field.clone()>{p.message}</li> }).collect_view()}
            </ul>
        })}
        <div class="table-wrap">
            <table class="needs readings-table">
                <thead><tr>
                    <th scope="col">"#"</th>
                    <th scope="col">"Pressure"<span class="unit-head">{Measure::Pressure.label(u)}</span></th>
                    <th scope="col">"Flow"<span class="unit-head">{Measure::Flow.label(u)}</span></th>
                    <th scope="col">"Speed"<span class="unit-head">{Measure::ShaftSpeed.label(u)}</span></th>
                    <th scope="col">"Volu­metric"</th>
                    <th scope="col">"Out"<span class="unit-head">{Measure::Power.label(u)}</span></th>
                    <th scope="col">"Shaft"<span class="unit-head">{Measure::Power.label(u)}</span></th>
                    <th scope="col">"Overall"</th>
                    <th scope="col">"Mech­anical"</th>
                </tr></thead>
                <tbody>{rows}</tbody>
            </table>
        </div>
        {estimated.then(|| view! { <p class="hint">"≈ speed estimated from the motor's slip at the load drawn: a tachometer reading replaces it."</p> })}
        <FlowChart test=test.clone() report=report.clone() units=u />
        <CopyToDesign t=t />
    }
}

/// Flow against pressure at the motor's full-load speed: the theoretical flow, the readings
/// (brought to that speed by the engine), and the leakage line out to the rated pressure.
/// Plotting only: every figure is the engine's.
#[component]
fn FlowChart(test: PumpTest, report: TestReport, units: UnitSystem) -> impl IntoView {
    let (w, h, pad) = (320.0, 210.0, 36.0);
    let p_max = test
        .readings
        .iter()
        .map(|r| r.pressure.value)
        .fold(test.rated_pressure.value, f64::max)
        * 1.05;
    let q_max = report
        .readings
        .iter()
        .map(|r| r.flow_at_full_load_speed.value)
        .fold(report.theoretical_flow.value, f64::max)
        * 1.1;
    if !(p_max > 0.0 && q_max > 0.0) {
        return ().into_any();
    }
    let x = move |p: f64| pad + (w - 2.0 * pad) * p / p_max;
    let y = move |q: f64| h - pad - (h - 2.0 * pad) * (q / q_max).max(0.0);
    let theory = y(report.theoretical_flow.value);
    let line = report.leakage.map(|l| {
        let rated = test.rated_pressure;
        let at = |p| l.flow_at(p).value;
        view! { <line x1=x(0.0) y1=y(at(rated * 0.0)) x2=x(rated.value) y2=y(at(rated)) class="fit" /> }
    });
    let dots = test
        .readings
        .iter()
        .zip(&report.readings)
        .map(|(r, at)| view! { <circle cx=x(r.pressure.value) cy=y(at.flow_at_full_load_speed.value) r="5" class="reading-dot" /> })
        .collect_view();
    let axis_p = format!("{} ({})", "Pressure", Measure::Pressure.label(units));
    let axis_q = format!("{} ({})", "Flow", Measure::Flow.label(units));
    view! {
        <figure class="flow-chart">
            <svg viewBox=format!("0 0 {w} {h}") role="img" aria-label="Flow against pressure: theoretical flow, readings and leakage line">
                <line x1=pad y1=h - pad x2=w - pad y2=h - pad class="axis" />
                <line x1=pad y1=pad x2=pad y2=h - pad class="axis" />
                <line x1=pad y1=theory x2=w - pad y2=theory class="theory" />
                {line}
                {dots}
                <text x=w - pad y=h - pad + 16.0 class="tick" text-anchor="end">{axis_p}</text>
                <text x=pad y=pad - 8.0 class="tick">{axis_q}</text>
                <text x=pad + 4.0 y=theory - 4.0 class="tick">{Measure::Flow.format(units, report.theoretical_flow.value)}</text>
                <line x1=x(test.rated_pressure.value) y1=h - pad x2=x(test.rated_pressure.value) y2=h - pad + 4.0 class="axis" />
                <text x=x(test.rated_pressure.value) y=h - pad + 28.0 class="tick" text-anchor="middle">{format!("rated {}", Measure::Pressure.format(units, test.rated_pressure.value))}</text>
            </svg>
            <figcaption>"At the motor's full-load speed. Dashed: what the pump sweeps. Dots: the readings. Line: the leakage line to the rated pressure."</figcaption>
        </figure>
    }
    .into_any()
}

/// Copies the measured efficiencies into a chosen pump of a chosen design.
#[component]
fn CopyToDesign(t: usize) -> impl IntoView {
    let state = use_job();
    let design = RwSignal::new(0usize);
    let pump = RwSignal::new(usize::MAX);
    let note = RwSignal::new(None::<String>);
    let designs = move || {
        state
            .job
            .with(|j| j.designs.iter().map(|d| d.name.clone()).collect::<Vec<_>>())
    };
    let pumps = move || {
        state
            .job
            .with(|j| j.designs.get(design.get()).map_or(0, |d| d.pump_count()))
    };
    let copy = move |_| {
        let d = design.get_untracked();
        let job = state.job.get_untracked();
        let u = job.units;
        let Some(x) = job.pump_tests.get(t) else {
            return;
        };
        let Some(report) = state
            .pump_tests
            .with_untracked(|r| r.get(t).and_then(|r| r.as_ref().ok().cloned()))
        else {
            note.set(Some(
                "Nothing to copy: the test has figures still to correct.".into(),
            ));
            return;
        };
        let measured = match efficiency::measured_pump(x, &report) {
            Ok(m) => m,
            Err(why) => {
                note.set(Some(why.message(u)));
                return;
            }
        };
        let Some(chosen) = job.designs.get(d) else {
            return;
        };
        let p = pump
            .get_untracked()
            .min(chosen.pump_count().saturating_sub(1));
        let changed = match efficiency::apply_to_design(chosen, p, &measured) {
            Ok(changed) => changed,
            Err(why) => {
                note.set(Some(why.message(u)));
                return;
            }
        };
        let name = changed.name.clone();
        state.job.update(|j| {
            if let Some(slot) = j.designs.get_mut(d) {
                *slot = changed;
            }
        });
        note.set(Some(format!(
            "Copied into “{name}”, pump {}: volumetric {} at {}{}.",
            p + 1,
            percent(Some(measured.volumetric)),
            Measure::Pressure.with_unit(u, measured.at_pressure.value),
            measured.hydromechanical.map_or(String::new(), |h| format!(
                ", hydromechanical {} (its drag set to zero: the measured figure includes it)",
                percent(Some(h))
            ))
        )));
    };
    view! {
        <h2>"Use these figures"</h2>
        <div class="field-grid">
            <div class="field">
                <label for="copy-design">"Into the power unit"</label>
                <select id="copy-design" on:change=move |ev| design.set(event_target_value(&ev).parse().unwrap_or(0))>
                    {move || designs().into_iter().enumerate().map(|(i, n)| view! { <option value=i selected=move || design.get() == i>{n}</option> }).collect_view()}
                </select>
            </div>
            <div class="field">
                <label for="copy-pump">"Its pump"</label>
                <select id="copy-pump" on:change=move |ev| pump.set(event_target_value(&ev).parse().unwrap_or(0))>
                    {move || { let n = pumps(); (0..n).map(|i| view! {
                        <option value=i selected=move || pump.get().min(n.saturating_sub(1)) == i>
                            {if i + 1 == n { format!("Pump {} (to the relief)", i + 1) } else { format!("Pump {}", i + 1) }}
                        </option>
                    }).collect_view() }}
                </select>
            </div>
        </div>
        <button type="button" class="button primary" data-action="copy-efficiencies" on:click=copy>"Copy the measured efficiencies"</button>
        {move || note.get().map(|t| view! { <p class="save-note" role="status" data-copied="true">{t}</p> })}
    }
}

/// Where the verdict draws its lines, kept in the job.
#[component]
fn WearLines() -> impl IntoView {
    view! {
        <details class="staging-options">
            <summary>"Where the verdict draws its lines"</summary>
            <p class="hint">"Judged on the volumetric efficiency the leakage line predicts at the rated pressure. Defaults: good from 90 %, worn below 80 % (typical for gear and vane pumps; the maker's figures come first)."</p>
            <div class="field-grid">
                <NumberField field=&fields::GOOD_FROM
                    get=|j: &Job| j.wear.good_from set=|j: &mut Job, v| j.wear.good_from = v />
                <NumberField field=&fields::WORN_BELOW
                    get=|j: &Job| j.wear.worn_below set=|j: &mut Job, v| j.wear.worn_below = v />
            </div>
        </details>
    }
}
