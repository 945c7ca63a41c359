//! The motor-check area: a motor's nameplate and readings from a power meter, a clamp meter or
//! a tachometer, and what the engine makes of them (`engine::motor_load`): its load by each
//! method that applies, which to trust and why, its efficiency, and a verdict with what a
//! right-sized motor would save a year.

use super::field::{ChoiceField, NumberField, OptionalNumberField, TextField};
use super::icons::CautionIcon;
use super::shared::{efficiency_from_key, efficiency_source_key, efficiency_source_options};
use super::state::use_job;
use crate::engine::fields;
use crate::engine::motor_check::{LineReading, MotorCheck, MotorNameplate, MotorReading};
use crate::engine::motor_load::{MotorCheckReport, MotorVerdict};
use crate::engine::pump_test::MotorEfficiency;
use crate::engine::Job;
use leptos::prelude::*;
use uom::si::angular_velocity::radian_per_second;
use uom::si::electric_current::ampere;
use uom::si::electric_potential::volt;
use uom::si::f64::{AngularVelocity, ElectricCurrent, ElectricPotential, Power};
use uom::si::power::watt;

fn check(j: &Job, c: usize) -> Option<&MotorCheck> {
    j.motor_checks.get(c)
}

fn check_mut(j: &mut Job, c: usize) -> Option<&mut MotorCheck> {
    j.motor_checks.get_mut(c)
}

fn reading(j: &Job, c: usize, k: usize) -> Option<&MotorReading> {
    check(j, c)?.readings.get(k)
}

fn reading_mut(j: &mut Job, c: usize, k: usize) -> Option<&mut MotorReading> {
    check_mut(j, c)?.readings.get_mut(k)
}

/// A new check of the shown power unit's motor, from its nameplate as the job has it (the user
/// corrects what differs); none while the job has no power unit.
fn new_check(j: &Job, d: usize) -> Option<MotorCheck> {
    let d = d.min(j.designs.len().checked_sub(1)?);
    let motor = j.designs[d].motor;
    let today = js_sys::Date::new_0()
        .to_iso_string()
        .as_string()
        .unwrap_or_default();
    let electrical = motor.electrical;
    Some(MotorCheck {
        motor: "Main motor".into(),
        date: today.get(..10).unwrap_or("").to_string(),
        notes: String::new(),
        design: d,
        nameplate: MotorNameplate {
            rated_power: motor.rated_power,
            voltage: electrical.map_or(ElectricPotential::new::<volt>(f64::NAN), |e| e.voltage),
            full_load_current: electrical.map_or(ElectricCurrent::new::<ampere>(f64::NAN), |e| {
                e.full_load_current
            }),
            full_load_speed: motor.full_load_speed,
            efficiency: MotorEfficiency::Entered {
                efficiency: motor.full_load_efficiency,
            },
            power_factor: electrical.and_then(|e| e.power_factor),
            synchronous_speed: None,
        },
        readings: vec![MotorReading::default()],
    })
}

#[component]
pub fn MotorCheckArea() -> impl IntoView {
    let state = use_job();
    let shown = RwSignal::new(0usize);
    let count = Memo::new(move |_| state.job.with(|j| j.motor_checks.len()));
    let labels = Memo::new(move |_| {
        state.job.with(|j| {
            j.motor_checks
                .iter()
                .map(|c| format!("{} · {}", c.motor, c.date))
                .collect::<Vec<_>>()
        })
    });
    let start = move |_| {
        let d = state.design_index();
        state.job.update(|j| {
            if let Some(c) = new_check(j, d) {
                j.motor_checks.push(c);
            }
        });
        shown.set(count.get_untracked().saturating_sub(1));
    };
    let current = move || shown.get().min(count.get().saturating_sub(1));
    view! {
        <section class="area motor-check" aria-labelledby="area-title">
            <div class="area-head">
                <h1 id="area-title">"Motor check"</h1>
            </div>
            <p class="purpose">"How loaded a motor is and how efficient, from a power meter, a clamp meter or a tachometer, and whether it is the right size."</p>
            <p class="inline-caution">
                <CautionIcon />
                <span>"Readings on live conductors are work for a qualified electrician with a meter rated for the supply (CAT III or above), the terminal box closed and guards in place."</span>
            </p>
            <div class="segmented test-tabs" role="group" aria-label="Check shown">
                {move || labels.get().into_iter().enumerate().map(|(i, label)| view! {
                    <button type="button" class="toggle" aria-pressed=move || if current() == i { "true" } else { "false" }
                        on:click=move |_| shown.set(i)>{label}</button>
                }).collect_view()}
            </div>
            <button type="button" class="button" data-action="new-motor-check" on:click=start>"Start a motor check"</button>
            {move || if count.get() == 0 {
                view! { <p class="empty-note">"No check yet. Start one: it takes the shown power unit's motor, and each reading can be a power meter's kW, a clamp meter's volts and amps, or a shaft speed."</p> }.into_any()
            } else {
                let c = current();
                view! { <CheckEditor c=c /> <CheckResults c=c /> }.into_any()
            }}
        </section>
    }
}

fn efficiency_source(j: &Job, c: usize) -> &'static str {
    check(j, c).map_or("entered", |x| efficiency_source_key(x.nameplate.efficiency))
}

/// A switch to the nameplate leaves its figure to be typed.
fn set_efficiency_source(j: &mut Job, c: usize, v: &str) {
    if let Some(x) = check_mut(j, c) {
        x.nameplate.efficiency = efficiency_from_key(v, f64::NAN);
    }
}

#[component]
fn CheckEditor(c: usize) -> impl IntoView {
    let state = use_job();
    let readings = Memo::new(move |_| {
        state
            .job
            .with(|j| check(j, c).map_or(0, |x| x.readings.len()))
    });
    let designs = Memo::new(move |_| {
        state.job.with(|j| {
            j.designs
                .iter()
                .enumerate()
                .map(|(i, d)| (DESIGN_KEYS[i.min(DESIGN_KEYS.len() - 1)], d.name.clone()))
                .collect::<Vec<_>>()
        })
    });
    let add = move |_| {
        state.job.update(|j| {
            if let Some(x) = check_mut(j, c) {
                x.readings.push(MotorReading::default());
            }
        })
    };
    let remove = move |_| {
        state.job.update(|j| {
            if c < j.motor_checks.len() {
                j.motor_checks.remove(c);
            }
        })
    };
    let plate = move |j: &Job| check(j, c).map(|x| x.nameplate);
    fn plate_mut(j: &mut Job, c: usize) -> Option<&mut MotorNameplate> {
        check_mut(j, c).map(|x| &mut x.nameplate)
    }
    view! {
        <h2>"The motor"</h2>
        <div class="field-grid">
            <TextField field=&fields::CHECKED_MOTOR at=[c]
                get=move |j: &Job| check(j, c).map_or(String::new(), |x| x.motor.clone())
                set=move |j: &mut Job, v| if let Some(x) = check_mut(j, c) { x.motor = v } />
            <TextField field=&fields::CHECK_DATE at=[c]
                get=move |j: &Job| check(j, c).map_or(String::new(), |x| x.date.clone())
                set=move |j: &mut Job, v| if let Some(x) = check_mut(j, c) { x.date = v } />
            {move || (designs.get().len() > 1).then(|| view! {
                <ChoiceField field=&fields::CHECK_DESIGN at=[c]
                    options=designs.get()
                    get=move |j: &Job| DESIGN_KEYS[check(j, c).map_or(0, |x| x.design).min(DESIGN_KEYS.len() - 1)]
                    set=move |j: &mut Job, v: &str| if let Some(x) = check_mut(j, c) { x.design = DESIGN_KEYS.iter().position(|k| *k == v).unwrap_or(0) } />
            })}
            <NumberField field=&fields::CHECK_RATED_POWER at=[c]
                get=move |j: &Job| plate(j).map_or(f64::NAN, |p| p.rated_power.value)
                set=move |j: &mut Job, v| if let Some(p) = plate_mut(j, c) { p.rated_power = Power::new::<watt>(v) } />
            <NumberField field=&fields::CHECK_VOLTAGE at=[c]
                get=move |j: &Job| plate(j).map_or(f64::NAN, |p| p.voltage.value)
                set=move |j: &mut Job, v| if let Some(p) = plate_mut(j, c) { p.voltage = ElectricPotential::new::<volt>(v) } />
            <NumberField field=&fields::CHECK_FULL_LOAD_CURRENT at=[c]
                get=move |j: &Job| plate(j).map_or(f64::NAN, |p| p.full_load_current.value)
                set=move |j: &mut Job, v| if let Some(p) = plate_mut(j, c) { p.full_load_current = ElectricCurrent::new::<ampere>(v) } />
            <NumberField field=&fields::CHECK_FULL_LOAD_SPEED at=[c]
                get=move |j: &Job| plate(j).map_or(f64::NAN, |p| p.full_load_speed.value)
                set=move |j: &mut Job, v| if let Some(p) = plate_mut(j, c) { p.full_load_speed = AngularVelocity::new::<radian_per_second>(v) } />
            <OptionalNumberField field=&fields::CHECK_SYNCHRONOUS_SPEED at=[c]
                placeholder=Signal::derive(move || synchronous_hint(&state.job.read(), c))
                get=move |j: &Job| plate(j).and_then(|p| p.synchronous_speed).map(|s| s.value)
                set=move |j: &mut Job, v| if let Some(p) = plate_mut(j, c) { p.synchronous_speed = v.map(AngularVelocity::new::<radian_per_second>) } />
            <ChoiceField field=&fields::CHECK_EFFICIENCY_FROM at=[c]
                options=efficiency_source_options()
                get=move |j: &Job| efficiency_source(j, c)
                set=move |j: &mut Job, v: &str| set_efficiency_source(j, c, v) />
            {move || (efficiency_source(&state.job.read(), c) == "entered").then(|| view! {
                <NumberField field=&fields::CHECK_EFFICIENCY at=[c]
                    get=move |j: &Job| match plate(j).map(|p| p.efficiency) { Some(MotorEfficiency::Entered { efficiency }) => efficiency, _ => f64::NAN }
                    set=move |j: &mut Job, v| if let Some(p) = plate_mut(j, c) { p.efficiency = MotorEfficiency::Entered { efficiency: v } } />
            })}
            <OptionalNumberField field=&fields::CHECK_POWER_FACTOR at=[c]
                placeholder=Signal::derive(|| "not printed".to_string())
                get=move |j: &Job| plate(j).and_then(|p| p.power_factor)
                set=move |j: &mut Job, v| if let Some(p) = plate_mut(j, c) { p.power_factor = v } />
        </div>
        <TextField field=&fields::CHECK_NOTES at=[c]
            get=move |j: &Job| check(j, c).map_or(String::new(), |x| x.notes.clone())
            set=move |j: &mut Job, v| if let Some(x) = check_mut(j, c) { x.notes = v } />
        <h2>"Readings"</h2>
        <p class="hint">"Take readings across the cycle, the working phases included: the verdict rests on the highest load read."</p>
        {move || (0..readings.get()).map(|k| view! { <MotorReadingEditor c=c k=k /> }).collect_view()}
        <button type="button" class="button wide" data-action="add-motor-reading" on:click=add>"Add a reading"</button>
        <button type="button" class="button danger" data-action="delete-motor-check" on:click=remove>"Delete this check"</button>
    }
}

/// The keys of the power-unit choice (a choice's keys are fixed strings).
const DESIGN_KEYS: [&str; 8] = ["0", "1", "2", "3", "4", "5", "6", "7"];

/// What applies while the synchronous speed is left empty: the one inferred, or none.
fn synchronous_hint(j: &Job, c: usize) -> String {
    let inferred = check(j, c)
        .and_then(|x| crate::engine::motor::synchronous_speed(x.nameplate.full_load_speed, None));
    match inferred {
        Some(s) => format!(
            "taken as {} from the full-load speed",
            crate::engine::units::Measure::ShaftSpeed.format(j.units, s)
        ),
        None => "not known: no slip method".to_string(),
    }
}

/// One figure of a reading's line (0 voltage, 1 current, 2 power factor).
fn line_figure(j: &Job, c: usize, k: usize, which: u8) -> Option<f64> {
    let line = reading(j, c, k)?.line?;
    match which {
        0 => Some(line.voltage.value),
        1 => Some(line.current.value),
        _ => line.power_factor,
    }
}

/// Sets one figure of a reading's line; the line goes when its volts and amps are both empty
/// (a figure left out of a line the other has is a missing number, said at the field).
fn set_line_figure(j: &mut Job, c: usize, k: usize, which: u8, v: Option<f64>) {
    let Some(r) = reading_mut(j, c, k) else {
        return;
    };
    let mut line = r.line.unwrap_or(LineReading {
        voltage: ElectricPotential::new::<volt>(f64::NAN),
        current: ElectricCurrent::new::<ampere>(f64::NAN),
        power_factor: None,
    });
    match which {
        0 => line.voltage.value = v.unwrap_or(f64::NAN),
        1 => line.current.value = v.unwrap_or(f64::NAN),
        _ => line.power_factor = v,
    }
    let empty =
        line.voltage.value.is_nan() && line.current.value.is_nan() && line.power_factor.is_none();
    r.line = (!empty).then_some(line);
}

#[component]
fn MotorReadingEditor(c: usize, k: usize) -> impl IntoView {
    let state = use_job();
    let remove = move |_| {
        state.job.update(|j| {
            if let Some(x) = check_mut(j, c) {
                if k < x.readings.len() {
                    x.readings.remove(k);
                }
            }
        })
    };
    let line = move |field: &'static crate::engine::fields::FieldSpec,
                     which: u8,
                     placeholder: &'static str| {
        view! {
            <OptionalNumberField field=field at=[c, k]
                placeholder=Signal::derive(move || placeholder.to_string())
                get=move |j: &Job| line_figure(j, c, k, which)
                set=move |j: &mut Job, v| set_line_figure(j, c, k, which, v) />
        }
    };
    view! {
        <fieldset class="card reading" data-motor-reading=k>
            <legend>{format!("Reading {}", k + 1)}</legend>
            <div class="field-grid">
                <OptionalNumberField field=&fields::READ_INPUT at=[c, k]
                    placeholder=Signal::derive(|| "not read".to_string())
                    get=move |j: &Job| reading(j, c, k).and_then(|r| r.input).map(|p| p.value)
                    set=move |j: &mut Job, v| if let Some(r) = reading_mut(j, c, k) { r.input = v.map(Power::new::<watt>) } />
                {line(&fields::READ_VOLTAGE, 0, "not read")}
                {line(&fields::READ_CURRENT, 1, "not read")}
                {line(&fields::READ_POWER_FACTOR, 2, "not given")}
                <OptionalNumberField field=&fields::READ_SPEED at=[c, k]
                    placeholder=Signal::derive(|| "not read".to_string())
                    get=move |j: &Job| reading(j, c, k).and_then(|r| r.speed).map(|s| s.value)
                    set=move |j: &mut Job, v| if let Some(r) = reading_mut(j, c, k) { r.speed = v.map(AngularVelocity::new::<radian_per_second>) } />
            </div>
            <button type="button" class="button quiet" data-action="remove-motor-reading" on:click=remove>"Remove this reading"</button>
        </fieldset>
    }
}

#[component]
fn CheckResults(c: usize) -> impl IntoView {
    let state = use_job();
    let outcome = Memo::new(move |_| {
        state
            .motor_checks
            .with(|r| r.get(c)?.as_ref().ok().cloned())
    });
    move || {
        match outcome.get() {
        None => view! { <p class="empty-note" data-motor-result="waiting">"Results appear once every figure of the check is in and valid."</p> }.into_any(),
        Some(report) => view! { <CheckFindings report=report /> }.into_any(),
    }
    }
}

#[component]
fn CheckFindings(report: MotorCheckReport) -> impl IntoView {
    let state = use_job();
    let (units, currency) = state
        .job
        .with_untracked(|j| (j.units, j.site.currency.clone()));
    let words = report.describe(units, &currency);
    let verdict = match report.verdict {
        MotorVerdict::Oversized { .. } => "oversized",
        MotorVerdict::WellLoaded { .. } => "well-loaded",
        MotorVerdict::Overloaded { .. } => "overloaded",
        MotorVerdict::NotJudged => "not-judged",
    };
    view! {
        <div class="card motor-verdict" data-motor-verdict=verdict>
            <h2>"What the readings say"</h2>
            <p>{words.verdict}</p>
            <ul class="motor-readings">
                {words.readings.into_iter().map(|r| view! { <li>{r}</li> }).collect_view()}
            </ul>
            {(!report.problems.is_empty()).then(|| view! {
                <ul class="test-problems" role="alert">
                    {report.problems.iter().map(|p| view! { <li data-problem=p.field.clone()>{p.message.clone()}</li> }).collect_view()}
                </ul>
            })}
            <p class="hint">"A right size is the smallest standard motor of the staging options that carries the power unit's cycle (its RMS and peak); before changing a motor, check its starting duty and the maker's data."</p>
        </div>
    }
}
