//! The oil-and-heat area: the oil (how much, how thick, how hot it works), the tank, a warm-up
//! read at the machine, and what the engine's heat balance says of each power unit: where the
//! oil settles with and without its cooler, how long it takes to get there, what each path
//! sheds, and the cooler the target temperature needs (`engine::heat`).

use super::field::{ChoiceField, NumberField, OptionalNumberField};
use super::icons::CautionIcon;
use super::shared::{DesignTabs, StaleNotice};
use super::state::use_job;
use crate::engine::fields;
use crate::engine::heat::{AirAround, FieldWarmUp, Settling, Tank, TankSize, TemperatureReading};
use crate::engine::site::WorkingTemperature;
use crate::engine::units::{Measure, UnitSystem};
use crate::engine::viscosity::{OilViscosity, COMMON_MINERAL_OIL};
use crate::engine::{DesignReport, Job};
use leptos::prelude::*;
use uom::si::f64::{Area, KinematicViscosity, Mass, ThermodynamicTemperature, Time};
use uom::si::kinematic_viscosity::square_meter_per_second;
use uom::si::thermodynamic_temperature::kelvin;

fn k(v: f64) -> ThermodynamicTemperature {
    ThermodynamicTemperature::new::<kelvin>(v)
}

#[component]
pub fn HeatArea() -> impl IntoView {
    let state = use_job();
    let report = move || state.result.get().ok().or_else(|| state.last_good.get());
    view! {
        <section class="area heat" aria-labelledby="area-title">
            <div class="area-head">
                <h1 id="area-title">"Oil and heat"</h1>
            </div>
            <p class="purpose">{super::area::Area::Heat.purpose()}</p>
            <super::shared::ExampleBanner />
            <StaleNotice />
            <DesignTabs />
            {move || report().map(|r| {
                let d = state.design_index().min(r.designs.len().saturating_sub(1));
                let units = state.units();
                let check = r.warm_up;
                view! {
                    <SettlingView design=r.designs[d].clone() units=units />
                    {check.map(|c| view! { <WarmUpCheckView check=c units=units /> })}
                }
            })}
            <OilCard />
            <TankCard />
            <WarmUpReadCard />
        </section>
    }
}

fn given_as(j: &Job) -> &'static str {
    match j.oil.viscosity {
        OilViscosity::Grade { .. } => "grade",
        OilViscosity::Measured { .. } => "measured",
    }
}

/// A switch keeps what the oil's line already says: the grade's two points, or the measured
/// points' grade and index.
fn set_given_as(j: &mut Job, v: &str) {
    let line = j.oil.viscosity.line().ok();
    let at = |c: f64| {
        line.map(|l| l.at(k(c + 273.15)))
            .unwrap_or(KinematicViscosity::new::<square_meter_per_second>(f64::NAN))
    };
    j.oil.viscosity = match v {
        "measured" => OilViscosity::Measured {
            at_40: at(40.0),
            at_100: at(100.0),
        },
        _ => match j.oil.viscosity {
            OilViscosity::Measured { at_40, at_100 } => {
                let (nu40, nu100) = (at_40.value * 1e6, at_100.value * 1e6);
                match crate::engine::viscosity::viscosity_index(nu40, nu100) {
                    Some(vi) => OilViscosity::Grade {
                        grade: nu40,
                        viscosity_index: vi,
                    },
                    None => COMMON_MINERAL_OIL,
                }
            }
            grade => grade,
        },
    };
}

fn grade_figure(j: &Job, which: u8) -> f64 {
    match j.oil.viscosity {
        OilViscosity::Grade {
            grade,
            viscosity_index,
        } => [grade, viscosity_index][usize::from(which)],
        OilViscosity::Measured { .. } => f64::NAN,
    }
}

fn set_grade_figure(j: &mut Job, which: u8, v: f64) {
    if let OilViscosity::Grade {
        grade,
        viscosity_index,
    } = &mut j.oil.viscosity
    {
        *[grade, viscosity_index][usize::from(which)] = v;
    }
}

fn measured_figure(j: &Job, which: u8) -> f64 {
    match j.oil.viscosity {
        OilViscosity::Measured { at_40, at_100 } => [at_40, at_100][usize::from(which)].value,
        OilViscosity::Grade { .. } => f64::NAN,
    }
}

fn set_measured_figure(j: &mut Job, which: u8, v: f64) {
    if let OilViscosity::Measured { at_40, at_100 } = &mut j.oil.viscosity {
        [at_40, at_100][usize::from(which)].value = v;
    }
}

fn set_by(j: &Job) -> &'static str {
    match j.oil.working_temperature {
        WorkingTemperature::Entered { .. } => "entered",
        WorkingTemperature::Settled => "settled",
    }
}

#[component]
fn OilCard() -> impl IntoView {
    let state = use_job();
    let mineral_hint = move || {
        let oil = crate::engine::job::Oil::mineral(Default::default());
        let u = state.units();
        format!(
            "Mineral oil is typically about {} and {} (the report lists the source). An oil's data sheet gives its ISO grade and viscosity index; if it is not known, VG 46 with an index of 100 is a common mineral oil.",
            Measure::Density.with_unit(u, oil.density.value),
            Measure::SpecificHeat.with_unit(u, oil.specific_heat.value)
        )
    };
    // Memos, so an edit redraws these fields only when the choice changes (a redraw while
    // typing would take the cursor out of the field).
    let entered = Memo::new(move |_| state.job.with(|j| set_by(j) == "entered"));
    let by_grade = Memo::new(move |_| state.job.with(|j| given_as(j) == "grade"));
    view! {
        <div class="card" data-card="oil">
            <h2>"The oil"</h2>
            <div class="field-grid">
                <NumberField field=&fields::OIL_VOLUME
                    get=|j: &Job| j.oil.volume.value set=|j: &mut Job, v| j.oil.volume.value = v />
                <NumberField field=&fields::OIL_DENSITY
                    get=|j: &Job| j.oil.density.value set=|j: &mut Job, v| j.oil.density.value = v />
                <NumberField field=&fields::OIL_SPECIFIC_HEAT
                    get=|j: &Job| j.oil.specific_heat.value set=|j: &mut Job, v| j.oil.specific_heat.value = v />
                <ChoiceField field=&fields::OIL_GIVEN_AS
                    options=vec![("grade", "its grade and viscosity index".to_string()), ("measured", "its viscosity at 40 and 100 °C".to_string())]
                    get=given_as set=set_given_as />
                {move || if by_grade.get() {
                    view! {
                        <NumberField field=&fields::OIL_GRADE
                            get=|j: &Job| grade_figure(j, 0) set=|j: &mut Job, v| set_grade_figure(j, 0, v) />
                        <NumberField field=&fields::VISCOSITY_INDEX
                            get=|j: &Job| grade_figure(j, 1) set=|j: &mut Job, v| set_grade_figure(j, 1, v) />
                    }.into_any()
                } else {
                    view! {
                        <NumberField field=&fields::VISCOSITY_AT_40
                            get=|j: &Job| measured_figure(j, 0) set=|j: &mut Job, v| set_measured_figure(j, 0, v) />
                        <NumberField field=&fields::VISCOSITY_AT_100
                            get=|j: &Job| measured_figure(j, 1) set=|j: &mut Job, v| set_measured_figure(j, 1, v) />
                    }.into_any()
                }}
                <ChoiceField field=&fields::WORKING_TEMPERATURE_SET_BY
                    options=vec![("settled", "where the heat balance settles it".to_string()), ("entered", "as read on the tank".to_string())]
                    get=set_by
                    set=|j: &mut Job, v: &str| j.oil.working_temperature = if v == "settled" {
                        WorkingTemperature::Settled
                    } else {
                        WorkingTemperature::Entered { temperature: k(WorkingTemperature::default_kelvin()) }
                    } />
                {move || entered.get().then(|| view! {
                    <NumberField field=&fields::WORKING_TEMPERATURE
                        get=|j: &Job| match j.oil.working_temperature { WorkingTemperature::Entered { temperature } => temperature.value, WorkingTemperature::Settled => f64::NAN }
                        set=|j: &mut Job, v| j.oil.working_temperature = WorkingTemperature::Entered { temperature: k(v) } />
                })}
                <NumberField field=&fields::TARGET_TEMPERATURE
                    get=|j: &Job| j.oil.target_temperature.value set=|j: &mut Job, v| j.oil.target_temperature = k(v) />
            </div>
            <p class="hint">{mineral_hint}</p>
        </div>
    }
}

fn tank_figure(j: &Job, which: u8) -> f64 {
    match j.tank.map(|t| t.size) {
        Some(TankSize::Box {
            length,
            width,
            oil_depth,
        }) => [length, width, oil_depth][usize::from(which)].value,
        Some(TankSize::WettedArea { area }) if which == 3 => area.value,
        _ => f64::NAN,
    }
}

fn set_tank_figure(j: &mut Job, which: u8, v: f64) {
    match j.tank.as_mut().map(|t| &mut t.size) {
        Some(TankSize::Box {
            length,
            width,
            oil_depth,
        }) if which < 3 => [length, width, oil_depth][usize::from(which)].value = v,
        Some(TankSize::WettedArea { area }) if which == 3 => area.value = v,
        _ => {}
    }
}

fn tank_given_as(j: &Job) -> &'static str {
    match j.tank.map(|t| t.size) {
        Some(TankSize::WettedArea { .. }) => "area",
        _ => "box",
    }
}

fn air(j: &Job) -> &'static str {
    match j.tank.map(|t| t.air) {
        Some(AirAround::Still) => "still",
        Some(AirAround::Forced) => "forced",
        _ => "normal",
    }
}

#[component]
fn TankCard() -> impl IntoView {
    let state = use_job();
    let described = Memo::new(move |_| state.job.with(|j| j.tank.is_some()));
    let boxed = Memo::new(move |_| state.job.with(|j| tank_given_as(j) == "box"));
    let describe = move |_| state.job.update(|j| j.tank = Some(Tank::first()));
    // Without a tank nothing settles: the temperature goes back to being entered.
    let remove = move |_| {
        state.job.update(|j| {
            j.tank = None;
            if j.oil.working_temperature == WorkingTemperature::Settled {
                j.oil.working_temperature = WorkingTemperature::default();
            }
        })
    };
    view! {
        <div class="card" data-card="tank">
            <h2>"The tank"</h2>
            {move || if described.get() {
                view! {
                    <div class="field-grid">
                        <ChoiceField field=&fields::TANK_GIVEN_AS
                            options=vec![("box", "its inside size".to_string()), ("area", "its wetted wall area".to_string())]
                            get=tank_given_as
                            set=|j: &mut Job, v: &str| if let Some(t) = &mut j.tank {
                                let area = t.wetted_area();
                                t.size = if v == "area" {
                                    TankSize::WettedArea { area: Area::new::<uom::si::area::square_meter>(area) }
                                } else {
                                    Tank::first().size
                                };
                            } />
                        {move || if boxed.get() {
                            view! {
                                <NumberField field=&fields::TANK_LENGTH
                                    get=|j: &Job| tank_figure(j, 0) set=|j: &mut Job, v| set_tank_figure(j, 0, v) />
                                <NumberField field=&fields::TANK_WIDTH
                                    get=|j: &Job| tank_figure(j, 1) set=|j: &mut Job, v| set_tank_figure(j, 1, v) />
                                <NumberField field=&fields::TANK_OIL_DEPTH
                                    get=|j: &Job| tank_figure(j, 2) set=|j: &mut Job, v| set_tank_figure(j, 2, v) />
                            }.into_any()
                        } else {
                            view! {
                                <NumberField field=&fields::TANK_AREA
                                    get=|j: &Job| tank_figure(j, 3) set=|j: &mut Job, v| set_tank_figure(j, 3, v) />
                            }.into_any()
                        }}
                        <ChoiceField field=&fields::TANK_AIR
                            options=vec![
                                ("still", "still: a corner, a pit, an enclosure".to_string()),
                                ("normal", "a normal workshop".to_string()),
                                ("forced", "a fan blows on it".to_string()),
                            ]
                            get=air
                            set=|j: &mut Job, v: &str| if let Some(t) = &mut j.tank {
                                t.air = match v { "still" => AirAround::Still, "forced" => AirAround::Forced, _ => AirAround::Normal };
                            } />
                        <NumberField field=&fields::AMBIENT
                            get=|j: &Job| j.tank.map_or(f64::NAN, |t| t.ambient.value)
                            set=|j: &mut Job, v| if let Some(t) = &mut j.tank { t.ambient = k(v) } />
                        <OptionalNumberField field=&fields::STEEL_MASS
                            placeholder=Signal::derive(|| "not known: the oil alone".to_string())
                            get=|j: &Job| j.tank.and_then(|t| t.steel_mass).map(|m| m.value)
                            set=|j: &mut Job, v| if let Some(t) = &mut j.tank { t.steel_mass = v.map(Mass::new::<uom::si::mass::kilogram>) } />
                    </div>
                    <button type="button" class="button quiet" data-action="remove-tank" on:click=remove>"Leave the tank out"</button>
                }.into_any()
            } else {
                view! {
                    <p class="empty-note">"Describe the tank to see where the oil settles, how long it takes to warm up, and the cooler a target temperature needs."</p>
                    <button type="button" class="button" data-action="describe-tank" on:click=describe>"Describe the tank"</button>
                }.into_any()
            }}
        </div>
    }
}

fn reading_figure(j: &Job, second: bool, time: bool) -> f64 {
    j.warm_up.map_or(f64::NAN, |w| {
        let r = if second { w.second } else { w.first };
        if time {
            r.time.value
        } else {
            r.oil.value
        }
    })
}

fn set_reading_figure(j: &mut Job, second: bool, time: bool, v: f64) {
    if let Some(w) = &mut j.warm_up {
        let r = if second { &mut w.second } else { &mut w.first };
        if time {
            r.time.value = v;
        } else {
            r.oil.value = v;
        }
    }
}

#[component]
fn WarmUpReadCard() -> impl IntoView {
    let state = use_job();
    let entered = Memo::new(move |_| state.job.with(|j| j.warm_up.is_some()));
    let start = move |_| {
        state.job.update(|j| {
            let empty = TemperatureReading {
                time: Time::new::<uom::si::time::second>(f64::NAN),
                oil: k(f64::NAN),
            };
            j.warm_up = Some(FieldWarmUp {
                first: TemperatureReading {
                    time: Time::new::<uom::si::time::second>(0.0),
                    ..empty
                },
                second: empty,
            });
        })
    };
    let remove = move |_| state.job.update(|j| j.warm_up = None);
    view! {
        <div class="card" data-card="warm-up-read">
            <h2>"A warm-up read at the machine"</h2>
            <p class="hint">"Start the machine cold and cycling, and read the tank's thermometer twice, some minutes apart: the rise shows the heat really going into the oil, set beside the heat the model puts in."</p>
            {move || if entered.get() {
                view! {
                    <div class="field-grid">
                        <NumberField field=&fields::FIRST_READING_TIME
                            get=|j: &Job| reading_figure(j, false, true) set=|j: &mut Job, v| set_reading_figure(j, false, true, v) />
                        <NumberField field=&fields::FIRST_READING_OIL
                            get=|j: &Job| reading_figure(j, false, false) set=|j: &mut Job, v| set_reading_figure(j, false, false, v) />
                        <NumberField field=&fields::SECOND_READING_TIME
                            get=|j: &Job| reading_figure(j, true, true) set=|j: &mut Job, v| set_reading_figure(j, true, true, v) />
                        <NumberField field=&fields::SECOND_READING_OIL
                            get=|j: &Job| reading_figure(j, true, false) set=|j: &mut Job, v| set_reading_figure(j, true, false, v) />
                    </div>
                    <button type="button" class="button quiet" data-action="remove-warm-up" on:click=remove>"Leave the readings out"</button>
                }.into_any()
            } else {
                view! {
                    <button type="button" class="button" data-action="read-warm-up" on:click=start>"Enter two readings"</button>
                }.into_any()
            }}
        </div>
    }
}

fn temperature(u: UnitSystem, k_value: f64) -> String {
    Measure::Temperature.with_unit(u, k_value)
}

fn settling_words(u: UnitSystem, s: Settling) -> String {
    match s {
        Settling::At(t) => temperature(u, t),
        Settling::Above(t) => format!("above {}: it does not settle", temperature(u, t)),
    }
}

#[component]
fn SettlingView(design: DesignReport, units: UnitSystem) -> impl IntoView {
    let u = units;
    let oil = design.oil.clone();
    let working = format!(
        "Worked out with the oil at {}, where it is {} thick.",
        temperature(u, oil.working_temperature),
        Measure::Viscosity.with_unit(u, oil.viscosity)
    );
    let Some(b) = oil.balance else {
        return view! {
            <div class="card" data-card="settling">
                <h2>{format!("{}: the oil", design.name)}</h2>
                <p>{working}</p>
                <p class="empty-note">"Describe the tank to see where the oil settles."</p>
            </div>
        }
        .into_any();
    };
    let heat = |w: f64| Measure::Heat.with_unit(u, w);
    let without = b.without_cooler.map(|s| settling_words(u, s));
    let time = b
        .warm_up
        .as_ref()
        .and_then(|w| w.time_to_steady)
        .map(|s| format!("{:.0} min", s / 60.0));
    let needed = if b.cooler_duty <= 0.0 {
        format!(
            "The tank alone holds the oil at {}: no cooler needed for it.",
            temperature(u, b.target)
        )
    } else {
        format!(
            "To hold the oil at {} a cooler must take away {}{}.",
            temperature(u, b.target),
            heat(b.cooler_duty),
            b.cooler_needed.map_or(String::new(), |w| format!(
                ": a cooler rated at least {} (heat per degree of oil above coolant)",
                Measure::HeatPerKelvin.with_unit(u, w)
            ))
        )
    };
    let chart = b
        .warm_up
        .clone()
        .map(|w| view! { <WarmUpChart curve=w.curve units=u /> });
    view! {
        <div class="card" data-card="settling">
            <h2>{format!("{}: where the oil settles", design.name)}</h2>
            <dl class="figures">
                <div class="figure"><dt>"Settles at"</dt><dd data-figure="steady">{settling_words(u, b.steady)}</dd></div>
                {without.map(|w| view! { <div class="figure"><dt>"Without its cooler"</dt><dd data-figure="without-cooler">{w}</dd></div> })}
                {time.map(|t| view! { <div class="figure"><dt>"From cold to within 1 K of it"</dt><dd data-figure="time-to-steady">{t}</dd></div> })}
                <div class="figure"><dt>"Heat into the oil there"</dt><dd>{heat(b.heat_in)}</dd></div>
                <div class="figure"><dt>"Shed by the tank's walls"</dt><dd>{heat(b.tank_sheds)}</dd></div>
                <div class="figure"><dt>"Taken by the cooler"</dt><dd>{heat(b.cooler_removes)}</dd></div>
            </dl>
            <p>{working}</p>
            <p data-figure="cooler-needed">{needed}</p>
            {chart}
            <p class="inline-caution">
                <CautionIcon />
                <span>"Figures from a model: the oil's and seals' makers' limits, and the cooler maker's rating, decide. Hot oil and hot tank walls burn: let them cool before work."</span>
            </p>
        </div>
    }
    .into_any()
}

/// The warm-up from cold: temperature against time, in the job's units.
#[component]
fn WarmUpChart(curve: Vec<(f64, f64)>, units: UnitSystem) -> impl IntoView {
    let (w, h, pad) = (320.0, 160.0, 30.0);
    let last_t = curve.last().map_or(1.0, |p| p.0).max(1.0);
    let shown = |k: f64| Measure::Temperature.shown(units, k);
    let lo = curve
        .iter()
        .map(|p| shown(p.1))
        .fold(f64::INFINITY, f64::min);
    let hi = curve
        .iter()
        .map(|p| shown(p.1))
        .fold(f64::NEG_INFINITY, f64::max);
    let span = (hi - lo).max(1.0);
    let x = move |t: f64| pad + (w - 2.0 * pad) * t / last_t;
    let y = move |v: f64| h - pad - (h - 2.0 * pad) * (v - lo) / span;
    let points: String = curve
        .iter()
        .map(|&(t, kv)| format!("{:.1},{:.1}", x(t), y(shown(kv))))
        .collect::<Vec<_>>()
        .join(" ");
    let label = Measure::Temperature.label(units);
    let described = format!(
        "The oil warms from {lo:.0} {label} to {hi:.0} {label} over {:.0} minutes.",
        last_t / 60.0
    );
    view! {
        <figure class="warm-up-chart">
            <svg viewBox=format!("0 0 {w} {h}") role="img" aria-label=described.clone() data-chart="warm-up">
                <line x1=pad y1=h - pad x2=w - pad y2=h - pad class="axis" />
                <line x1=pad y1=pad x2=pad y2=h - pad class="axis" />
                <polyline points=points class="warm-up-line" fill="none" />
                <text x=pad y=pad - 8.0 class="tick">{format!("{hi:.0} {label}")}</text>
                <text x=pad y=h - 8.0 class="tick">{format!("{lo:.0} {label}")}</text>
                <text x=w - pad y=h - 8.0 class="tick" text-anchor="end">{format!("{:.0} min", last_t / 60.0)}</text>
            </svg>
            <figcaption>{described}</figcaption>
        </figure>
    }
}

#[component]
fn WarmUpCheckView(check: crate::engine::heat::WarmUpCheck, units: UnitSystem) -> impl IntoView {
    let heat = |w: f64| Measure::Heat.with_unit(units, w);
    let verdict = check.describe();
    view! {
        <div class="card" data-card="warm-up-check">
            <h2>"The warm-up read, against the model"</h2>
            <dl class="figures">
                <div class="figure"><dt>"Heat going into the oil, from the readings"</dt><dd data-figure="measured-heat">{heat(check.measured)}</dd></div>
                <div class="figure"><dt>{format!("The model's, at {}", temperature(units, check.mean))}</dt><dd data-figure="model-heat">{heat(check.model)}</dd></div>
            </dl>
            <p>{verdict}</p>
        </div>
    }
}

fn cooler_figure(j: &Job, d: usize, which: u8) -> f64 {
    j.designs
        .get(d)
        .and_then(|x| x.cooler)
        .map_or(f64::NAN, |c| {
            [
                c.coolant_temperature.value,
                c.rated_heat.value,
                c.rated_difference.value,
            ][usize::from(which)]
        })
}

fn set_cooler_figure(j: &mut Job, d: usize, which: u8, v: f64) {
    if let Some(c) = j.designs.get_mut(d).and_then(|x| x.cooler.as_mut()) {
        match which {
            0 => c.coolant_temperature.value = v,
            1 => c.rated_heat.value = v,
            _ => c.rated_difference.value = v,
        }
    }
}

fn suction_figure(j: &Job, d: usize, length: bool) -> f64 {
    j.designs
        .get(d)
        .and_then(|x| x.suction_line.as_ref())
        .map_or(f64::NAN, |l| {
            if length {
                l.length.value
            } else {
                l.inner_diameter.value
            }
        })
}

fn set_suction_figure(j: &mut Job, d: usize, length: bool, v: f64) {
    if let Some(l) = j.designs.get_mut(d).and_then(|x| x.suction_line.as_mut()) {
        if length {
            l.length.value = v;
        } else {
            l.inner_diameter.value = v;
        }
    }
}

/// A power unit's oil cooler and suction line, each added when the unit has one: the cooler's
/// figures come off its nameplate or data sheet.
#[component]
pub fn CoolerAndSuction(d: usize) -> impl IntoView {
    use crate::engine::heat::{Coolant, Cooler};
    let state = use_job();
    let has_cooler = Memo::new(move |_| {
        state
            .job
            .with(|j| j.designs.get(d).is_some_and(|x| x.cooler.is_some()))
    });
    let has_suction = Memo::new(move |_| {
        state
            .job
            .with(|j| j.designs.get(d).is_some_and(|x| x.suction_line.is_some()))
    });
    let add_cooler = move |_| {
        state.job.update(|j| {
            let air = j.tank.map_or(k(298.15), |t| t.ambient);
            if let Some(x) = j.designs.get_mut(d) {
                x.cooler = Some(Cooler {
                    coolant: Coolant::Air,
                    coolant_temperature: air,
                    rated_heat: uom::si::f64::Power::new::<uom::si::power::watt>(f64::NAN),
                    rated_difference: uom::si::f64::TemperatureInterval::new::<
                        uom::si::temperature_interval::kelvin,
                    >(f64::NAN),
                });
            }
        })
    };
    let add_suction = move |_| {
        state.job.update(|j| {
            if let Some(x) = j.designs.get_mut(d) {
                x.suction_line = Some(crate::engine::lines::Line {
                    inner_diameter: uom::si::f64::Length::new::<uom::si::length::meter>(f64::NAN),
                    length: uom::si::f64::Length::new::<uom::si::length::meter>(f64::NAN),
                    fittings: vec![],
                });
            }
        })
    };
    view! {
        <h2>"Cooler and suction line"</h2>
        {move || if has_cooler.get() {
            view! {
                <div class="field-grid" data-part="cooler">
                    <ChoiceField field=&fields::COOLANT at=[d]
                        options=vec![("air", "air (a fan-blown cooler)".to_string()), ("water", "water".to_string())]
                        get=move |j: &Job| match j.designs.get(d).and_then(|x| x.cooler).map(|c| c.coolant) { Some(Coolant::Water) => "water", _ => "air" }
                        set=move |j: &mut Job, v: &str| if let Some(c) = j.designs.get_mut(d).and_then(|x| x.cooler.as_mut()) {
                            c.coolant = if v == "water" { Coolant::Water } else { Coolant::Air };
                        } />
                    <NumberField field=&fields::COOLANT_TEMPERATURE at=[d]
                        get=move |j: &Job| cooler_figure(j, d, 0) set=move |j: &mut Job, v| set_cooler_figure(j, d, 0, v) />
                    <NumberField field=&fields::COOLER_RATED_HEAT at=[d]
                        get=move |j: &Job| cooler_figure(j, d, 1) set=move |j: &mut Job, v| set_cooler_figure(j, d, 1, v) />
                    <NumberField field=&fields::COOLER_RATED_DIFFERENCE at=[d]
                        get=move |j: &Job| cooler_figure(j, d, 2) set=move |j: &mut Job, v| set_cooler_figure(j, d, 2, v) />
                </div>
                <p class="hint">"A cooler's rating is the heat it takes away with the oil entering a stated number of degrees above the coolant entering: both are on its data sheet."</p>
                <button type="button" class="button quiet" data-action="remove-cooler"
                    on:click=move |_| state.job.update(|j| if let Some(x) = j.designs.get_mut(d) { x.cooler = None })>"No cooler"</button>
            }.into_any()
        } else {
            view! { <button type="button" class="button" data-action="add-cooler" on:click=add_cooler>"Add an oil cooler"</button> }.into_any()
        }}
        {move || if has_suction.get() {
            view! {
                <div class="field-grid" data-part="suction-line">
                    <NumberField field=&fields::SUCTION_LINE_DIAMETER at=[d]
                        get=move |j: &Job| suction_figure(j, d, false) set=move |j: &mut Job, v| set_suction_figure(j, d, false, v) />
                    <NumberField field=&fields::SUCTION_LINE_LENGTH at=[d]
                        get=move |j: &Job| suction_figure(j, d, true) set=move |j: &mut Job, v| set_suction_figure(j, d, true, v) />
                </div>
                <button type="button" class="button quiet" data-action="remove-suction-line"
                    on:click=move |_| state.job.update(|j| if let Some(x) = j.designs.get_mut(d) { x.suction_line = None })>"Leave the suction line out"</button>
            }.into_any()
        } else {
            view! { <button type="button" class="button" data-action="add-suction-line" on:click=add_suction>"Describe the suction line"</button> }.into_any()
        }}
        <a class="button quiet" href=super::area::Area::Heat.href() data-link="heat">"Where the oil settles"</a>
    }
}
