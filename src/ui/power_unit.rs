//! The power-unit area: each design's motor, pumps, valves, and the pressure limit it uses in
//! each phase.

use super::field::{ChoiceField, NumberField, OptionalNumberField, TextField, UnitSwitch};
use super::shared::{DesignTabs, OlderBaselineNotice, SettingsCaution};
use super::state::use_job;
use crate::engine::cycle::PhaseKind;
use crate::engine::fields;
use crate::engine::motor::ElectricalRating;
use crate::engine::power_unit::{Design, UnloadingStage, MAX_PUMPS};
use crate::engine::pump::{Pump, PumpControl};
use crate::engine::units::Measure;
use crate::engine::valve::{ActiveLimit, CheckValve, IdlePath, ReliefKind, UnloadingValve};
use crate::engine::Job;
use leptos::prelude::*;
use uom::si::electric_current::ampere;
use uom::si::electric_potential::volt;
use uom::si::f64::{ElectricCurrent, ElectricPotential, Pressure};
use uom::si::pressure::{bar, pascal};

/// The pump at place `p` in shaft order (stages, then the base pump) of design `d`.
fn pump(j: &Job, d: usize, p: usize) -> Option<&Pump> {
    let design = j.designs.get(d)?;
    match design.unloading_stages.get(p) {
        Some(stage) => Some(&stage.pump),
        None if p == design.unloading_stages.len() => Some(&design.base_pump),
        None => None,
    }
}

fn pump_mut(j: &mut Job, d: usize, p: usize) -> Option<&mut Pump> {
    let design = j.designs.get_mut(d)?;
    let stages = design.unloading_stages.len();
    if p < stages {
        Some(&mut design.unloading_stages[p].pump)
    } else if p == stages {
        Some(&mut design.base_pump)
    } else {
        None
    }
}

/// Where pump `p` of power unit `d` sits, as its fields' indices: an unloading stage's pump
/// (`[d, p]`) or the base pump (`[d]`).
fn pump_at(j: &Job, d: usize, p: usize) -> Vec<usize> {
    let stages = j.designs.get(d).map_or(0, |x| x.unloading_stages.len());
    if p < stages {
        vec![d, p]
    } else {
        vec![d]
    }
}

fn design(j: &Job, d: usize) -> Option<&Design> {
    j.designs.get(d)
}

fn design_mut(j: &mut Job, d: usize) -> Option<&mut Design> {
    j.designs.get_mut(d)
}

#[component]
pub fn UnitArea() -> impl IntoView {
    let state = use_job();
    let add_design = move |_: leptos::ev::MouseEvent| {
        let from = state.design_index();
        state.job.update(|j| {
            let name = j.next_proposal_name();
            let copy = match j.designs.get(from) {
                // A copy of the baseline remembers which "as found" it was made from.
                Some(baseline) if from == 0 => Design::proposal_from(baseline, name),
                Some(other) => Design {
                    name,
                    ..other.clone()
                },
                None => return,
            };
            j.designs.push(copy);
        });
        state
            .design
            .set(state.job.with_untracked(|j| j.designs.len() - 1));
    };
    let remove_design = move |_: leptos::ev::MouseEvent| {
        let d = state.design_index();
        if state.job.with_untracked(|j| j.designs.len()) <= 1 {
            return;
        }
        let name = state
            .job
            .with_untracked(|j| j.designs.get(d).map(|x| x.name.clone()).unwrap_or_default());
        state.change_with_undo("unit", format!("Removed “{name}”"), |j| {
            j.designs.remove(d);
        });
        state.design.set(d.saturating_sub(1));
    };
    let designs = Memo::new(move |_| state.job.with(|j| j.designs.len()));
    let designs = move || designs.get();
    let shown = Memo::new(move |_| state.design_index());
    view! {
        <section class="area" aria-labelledby="area-title">
            <div class="area-head">
                <h1 id="area-title">"Power unit"</h1>
                <UnitSwitch />
            </div>
            <super::shared::ExampleBanner />
            <super::shared::LiveSummary />
            <DesignTabs />
            <super::undo::UndoChange place="unit" />
            <OlderBaselineNotice place="unit" />
            <div class="row-tools">
                <button type="button" class="button" on:click=add_design>"Copy as a new proposed power unit"</button>
                <button type="button" class="button danger" data-action="remove-design" disabled=move || { designs() <= 1 } on:click=remove_design>"Remove this power unit"</button>
            </div>
            {move || {
                let d = shown.get();
                view! { <DesignEditor d=d /> }
            }}
        </section>
    }
}

#[component]
fn DesignEditor(d: usize) -> impl IntoView {
    let state = use_job();
    let pumps = Memo::new(move |_| {
        state
            .job
            .with(|j| design(j, d).map_or(0, |x| x.pump_count()))
    });
    let pumps = move || pumps.get();
    let add_pump = move |_: leptos::ev::MouseEvent| {
        state.job.update(|j| {
            if let Some(x) = design_mut(j, d) {
                if x.pump_count() < MAX_PUMPS {
                    let pump = x.base_pump;
                    x.unloading_stages.insert(
                        0,
                        UnloadingStage {
                            pump,
                            unloading: UnloadingValve {
                                setting: Pressure::new::<bar>(60.0),
                                unloaded_drop: Pressure::new::<uom::si::pressure::pascal>(
                                    crate::engine::valve::TYPICAL_UNLOADED_DROP_PA,
                                ),
                            },
                            check: CheckValve {
                                cracking: Pressure::new::<uom::si::pressure::pascal>(
                                    crate::engine::valve::TYPICAL_CHECK_CRACKING_PA,
                                ),
                            },
                        },
                    );
                }
            }
        })
    };
    let remotes = Memo::new(move |_| {
        state
            .job
            .with(|j| design(j, d).map_or(0, |x| x.remote_stages.len()))
    });
    let remotes = move || remotes.get();
    let phases = Memo::new(move |_| state.job.with(|j| j.cycle.len()));
    let phases = move || phases.get();
    view! {
        <TextField field=&fields::DESIGN_NAME at=[d]
            get=move |j: &Job| design(j, d).map(|x| x.name.clone()).unwrap_or_default()
            set=move |j: &mut Job, v| if let Some(x) = design_mut(j, d) { x.name = v } />

        <h2>"Motor"</h2>
        <div class="field-grid">
            <NumberField field=&fields::MOTOR_RATED_POWER at=[d]
                get=move |j: &Job| design(j, d).map_or(f64::NAN, |x| x.motor.rated_power.value)
                set=move |j: &mut Job, v| if let Some(x) = design_mut(j, d) { x.motor.rated_power.value = v } />
            <NumberField field=&fields::MOTOR_SPEED at=[d]
                get=move |j: &Job| design(j, d).map_or(f64::NAN, |x| x.motor.full_load_speed.value)
                set=move |j: &mut Job, v| if let Some(x) = design_mut(j, d) { x.motor.full_load_speed.value = v } />
            <NumberField field=&fields::MOTOR_EFFICIENCY at=[d]
                get=move |j: &Job| design(j, d).map_or(f64::NAN, |x| x.motor.full_load_efficiency)
                set=move |j: &mut Job, v| if let Some(x) = design_mut(j, d) { x.motor.full_load_efficiency = v } />
            <NumberField field=&fields::MOTOR_FIXED_LOSS at=[d]
                get=move |j: &Job| design(j, d).map_or(f64::NAN, |x| x.motor.fixed_loss_share)
                set=move |j: &mut Job, v| if let Some(x) = design_mut(j, d) { x.motor.fixed_loss_share = v } />
            <NumberField field=&fields::MOTOR_SERVICE_FACTOR at=[d]
                get=move |j: &Job| design(j, d).map_or(f64::NAN, |x| x.motor.service_factor)
                set=move |j: &mut Job, v| if let Some(x) = design_mut(j, d) { x.motor.service_factor = v } />
            <NumberField field=&fields::MOTOR_PEAK_ALLOWANCE at=[d]
                get=move |j: &Job| design(j, d).map_or(f64::NAN, |x| x.motor.peak_allowance)
                set=move |j: &mut Job, v| if let Some(x) = design_mut(j, d) { x.motor.peak_allowance = v } />
        </div>
        <MotorNameplateFields d=d />
        <a class="button quiet" href=crate::ui::area::Area::MotorCheck.href() data-link="motor-check">"Check this motor at the machine"</a>
        <super::drive::DriveFields d=d />

        <h2>"Pumps, in shaft order"</h2>
        <SettingsCaution />
        {move || (0..pumps()).map(|p| view! { <PumpEditor d=d p=p /> }).collect_view()}
        <button type="button" class="button wide" disabled=move || { pumps() >= MAX_PUMPS } on:click=add_pump>
            "Add a pump with an unloading valve"
        </button>

        <h2>"Relief valve"</h2>
        <SettingsCaution />
        <div class="field-grid">
            <ChoiceField field=&fields::RELIEF_KIND at=[d]
                options=vec![("pilot_operated", "Pilot-operated".into()), ("direct_acting", "Direct-acting".into())]
                get=move |j: &Job| match design(j, d).map(|x| x.relief.kind) { Some(ReliefKind::DirectActing) => "direct_acting", _ => "pilot_operated" }
                set=move |j: &mut Job, key| if let Some(x) = design_mut(j, d) {
                    let kind = if key == "direct_acting" { ReliefKind::DirectActing } else { ReliefKind::PilotOperated };
                    if kind != x.relief.kind {
                        x.relief.kind = kind;
                        x.relief.cracking_fraction = kind.typical_cracking_fraction();
                    }
                } />
            <NumberField field=&fields::RELIEF_SETTING at=[d]
                get=move |j: &Job| design(j, d).map_or(f64::NAN, |x| x.relief.setting.value)
                set=move |j: &mut Job, v| if let Some(x) = design_mut(j, d) { x.relief.setting.value = v } />
            <NumberField field=&fields::RELIEF_RATED_FLOW at=[d]
                get=move |j: &Job| design(j, d).map_or(f64::NAN, |x| x.relief.rated_flow.value)
                set=move |j: &mut Job, v| if let Some(x) = design_mut(j, d) { x.relief.rated_flow.value = v } />
            <NumberField field=&fields::RELIEF_CRACKING at=[d]
                get=move |j: &Job| design(j, d).map_or(f64::NAN, |x| x.relief.cracking_fraction)
                set=move |j: &mut Job, v| if let Some(x) = design_mut(j, d) { x.relief.cracking_fraction = v } />
            <NumberField field=&fields::VENT_PRESSURE at=[d]
                get=move |j: &Job| design(j, d).map_or(f64::NAN, |x| x.vent_pressure.value)
                set=move |j: &mut Job, v| if let Some(x) = design_mut(j, d) { x.vent_pressure.value = v } />
        </div>
        <p class="hint" data-hint="relief-setting">{move || state.job.with(|j| {
            let u = j.units;
            design(j, d).map(|x| {
                let cracking = x.relief.cracking_pressure().value;
                format!(
                    "The setting is what the gauge reads with the pump dead-headed, its whole flow crossing the valve; remote stages and the vent are read the same way. The valve starts to open below it, at about {} (cracking), and the pressure rises above it as more flow crosses (override).",
                    if cracking.is_finite() { Measure::Pressure.with_unit(u, cracking) } else { "the cracking share of the setting".into() }
                )
            })
        })}</p>
        <h3>"Remote pilot stages"</h3>
        {move || (0..remotes()).map(|r| view! {
            <div class="stage-row">
                <NumberField field=&fields::REMOTE_STAGES at=[d, r] label=format!("Remote stage {}", r + 1)
                    get=move |j: &Job| design(j, d).and_then(|x| x.remote_stages.get(r)).map_or(f64::NAN, |p| p.value)
                    set=move |j: &mut Job, v| if let Some(p) = design_mut(j, d).and_then(|x| x.remote_stages.get_mut(r)) { p.value = v } />
                <button type="button" class="button danger" on:click=move |_| state.job.update(|j| {
                    if let Some(x) = design_mut(j, d) {
                        if r < x.remote_stages.len() {
                            x.remote_stages.remove(r);
                            // Phases on a later stage keep their stage; one on the removed stage returns to the main setting.
                            for s in &mut x.phase_settings {
                                s.limit = match s.limit {
                                    ActiveLimit::Remote { stage } if stage == r => ActiveLimit::Main,
                                    ActiveLimit::Remote { stage } if stage > r => ActiveLimit::Remote { stage: stage - 1 },
                                    other => other,
                                };
                            }
                        }
                    }
                })>"Remove"</button>
            </div>
        }).collect_view()}
        <button type="button" class="button wide" on:click=move |_| state.job.update(|j| {
            if let Some(x) = design_mut(j, d) {
                let first = x.new_remote_stage();
                x.remote_stages.push(first);
            }
        })>"Add a remote pilot stage"</button>

        <super::heat::CoolerAndSuction d=d />

        <h2>"Limit in each phase"</h2>
        <p class="hint">"Which pressure limit governs each phase, and where the flow goes while idle."</p>
        {move || (0..phases()).map(|i| view! { <PhaseLimit d=d i=i /> }).collect_view()}
    }
}

#[component]
fn PumpEditor(d: usize, p: usize) -> impl IntoView {
    let state = use_job();
    let this_pump = move || state.job.with(|j| pump_at(j, d, p));
    let is_stage = Memo::new(move |_| {
        state
            .job
            .with(|j| design(j, d).is_some_and(|x| p < x.unloading_stages.len()))
    });
    let is_stage = move || is_stage.get();
    let compensated = Memo::new(move |_| {
        state.job.with(|j| {
            matches!(
                pump(j, d, p).map(|x| x.control),
                Some(PumpControl::Compensated { .. })
            )
        })
    });
    let compensated = move || compensated.get();
    let remove = move |_: leptos::ev::MouseEvent| {
        state.job.update(|j| {
            if let Some(x) = design_mut(j, d) {
                if p < x.unloading_stages.len() {
                    x.unloading_stages.remove(p);
                }
            }
        })
    };
    view! {
        <fieldset class="pump-card">
            <legend>{move || if is_stage() { format!("Pump {} (unloads)", p + 1) } else { format!("Pump {} (to the relief)", p + 1) }}</legend>
            <div class="field-grid">
                <NumberField field=&fields::DISPLACEMENT at=this_pump()
                    get=move |j: &Job| pump(j, d, p).map_or(f64::NAN, |x| x.displacement.value)
                    set=move |j: &mut Job, v| if let Some(x) = pump_mut(j, d, p) { x.displacement.value = v } />
                <NumberField field=&fields::VOLUMETRIC_EFFICIENCY at=this_pump()
                    get=move |j: &Job| pump(j, d, p).map_or(f64::NAN, |x| x.volumetric_efficiency)
                    set=move |j: &mut Job, v| if let Some(x) = pump_mut(j, d, p) { x.volumetric_efficiency = v } />
                <NumberField field=&fields::EFFICIENCY_PRESSURE at=this_pump()
                    get=move |j: &Job| pump(j, d, p).map_or(f64::NAN, |x| x.efficiency_pressure.value)
                    set=move |j: &mut Job, v| if let Some(x) = pump_mut(j, d, p) { x.efficiency_pressure.value = v } />
                <OptionalNumberField field=&fields::EFFICIENCY_SPEED at=this_pump()
                    placeholder=Signal::derive(move || state.job.with(|j| design(j, d).map_or(String::new(), |x| format!("the motor's: {}", Measure::ShaftSpeed.with_unit(j.units, x.motor.full_load_speed.value)))))
                    get=move |j: &Job| pump(j, d, p).and_then(|x| x.efficiency_speed.map(|w| w.value))
                    set=move |j: &mut Job, v| if let Some(x) = pump_mut(j, d, p) { x.efficiency_speed = v.map(uom::si::f64::AngularVelocity::new::<uom::si::angular_velocity::radian_per_second>) } />
                <OptionalNumberField field=&fields::EFFICIENCY_TEMPERATURE at=this_pump()
                    placeholder=Signal::derive(|| "the working temperature: leakage not scaled".to_string())
                    get=move |j: &Job| pump(j, d, p).and_then(|x| x.efficiency_temperature.map(|t| t.value))
                    set=move |j: &mut Job, v| if let Some(x) = pump_mut(j, d, p) { x.efficiency_temperature = v.map(uom::si::f64::ThermodynamicTemperature::new::<uom::si::thermodynamic_temperature::kelvin>) } />
                <NumberField field=&fields::HYDROMECHANICAL_EFFICIENCY at=this_pump()
                    get=move |j: &Job| pump(j, d, p).map_or(f64::NAN, |x| x.hydromechanical_efficiency)
                    set=move |j: &mut Job, v| if let Some(x) = pump_mut(j, d, p) { x.hydromechanical_efficiency = v } />
                <NumberField field=&fields::DRAG_POWER at=this_pump()
                    get=move |j: &Job| pump(j, d, p).map_or(f64::NAN, |x| x.drag_power.value)
                    set=move |j: &mut Job, v| if let Some(x) = pump_mut(j, d, p) { x.drag_power.value = v } />
                <NumberField field=&fields::PUMP_RATED_PRESSURE at=this_pump()
                    get=move |j: &Job| pump(j, d, p).map_or(f64::NAN, |x| x.rated_pressure.value)
                    set=move |j: &mut Job, v| if let Some(x) = pump_mut(j, d, p) { x.rated_pressure.value = v } />
                <ChoiceField field=&fields::PUMP_CONTROL at=this_pump()
                    options=vec![("fixed", "Fixed displacement".into()), ("compensated", "Pressure-compensated".into())]
                    get=move |j: &Job| if matches!(pump(j, d, p).map(|x| x.control), Some(PumpControl::Compensated { .. })) { "compensated" } else { "fixed" }
                    set=move |j: &mut Job, key| if let Some(x) = pump_mut(j, d, p) {
                        x.control = if key == "compensated" { PumpControl::Compensated { setting: x.first_compensator_setting() } } else { PumpControl::Fixed };
                    } />
                {move || compensated().then(|| view! {
                    <NumberField field=&fields::COMPENSATOR_SETTING at=this_pump()
                        get=move |j: &Job| match pump(j, d, p).map(|x| x.control) { Some(PumpControl::Compensated { setting }) => setting.value, _ => f64::NAN }
                        set=move |j: &mut Job, v| if let Some(x) = pump_mut(j, d, p) { x.control = PumpControl::Compensated { setting: Pressure::new::<pascal>(v) } } />
                })}
                {move || is_stage().then(|| view! {
                    <NumberField field=&fields::UNLOADING_SETTING at=[d, p]
                        get=move |j: &Job| design(j, d).and_then(|x| x.unloading_stages.get(p)).map_or(f64::NAN, |s| s.unloading.setting.value)
                        set=move |j: &mut Job, v| if let Some(s) = design_mut(j, d).and_then(|x| x.unloading_stages.get_mut(p)) { s.unloading.setting.value = v } />
                    <NumberField field=&fields::UNLOADED_DROP at=[d, p]
                        get=move |j: &Job| design(j, d).and_then(|x| x.unloading_stages.get(p)).map_or(f64::NAN, |s| s.unloading.unloaded_drop.value)
                        set=move |j: &mut Job, v| if let Some(s) = design_mut(j, d).and_then(|x| x.unloading_stages.get_mut(p)) { s.unloading.unloaded_drop.value = v } />
                    <NumberField field=&fields::CHECK_CRACKING at=[d, p]
                        get=move |j: &Job| design(j, d).and_then(|x| x.unloading_stages.get(p)).map_or(f64::NAN, |s| s.check.cracking.value)
                        set=move |j: &mut Job, v| if let Some(s) = design_mut(j, d).and_then(|x| x.unloading_stages.get_mut(p)) { s.check.cracking.value = v } />
                })}
            </div>
            {move || is_stage().then(|| view! {
                <button type="button" class="button danger" on:click=remove>"Remove this pump"</button>
            })}
        </fieldset>
    }
}

#[component]
fn PhaseLimit(d: usize, i: usize) -> impl IntoView {
    let state = use_job();
    let name = move || {
        state
            .job
            .with(|j| j.cycle.get(i).map(|p| p.name.clone()).unwrap_or_default())
    };
    let is_idle = Memo::new(move |_| {
        state
            .job
            .with(|j| matches!(j.cycle.get(i).map(|p| &p.kind), Some(PhaseKind::Idle(_))))
    });
    let is_idle = move || is_idle.get();
    let has_nameplate = Memo::new(move |_| {
        state
            .job
            .with(|j| design(j, d).is_some_and(|x| x.motor.electrical.is_some()))
    });
    let has_nameplate = move || has_nameplate.get();
    let options = move || {
        state.job.with(|j| {
            let mut options = vec![("main".to_string(), "Main setting".to_string())];
            if let Some(x) = design(j, d) {
                for (r, p) in x.remote_stages.iter().enumerate() {
                    options.push((
                        format!("remote-{r}"),
                        format!(
                            "Remote stage {} ({})",
                            r + 1,
                            Measure::Pressure.with_unit(j.units, p.value)
                        ),
                    ));
                }
                if x.relief.kind.has_vent_port() {
                    options.push(("vented".into(), "Vented".into()));
                }
            }
            options
        })
    };
    let current = move || {
        state.job.with(|j| {
            match design(j, d)
                .and_then(|x| x.phase_settings.get(i))
                .map(|s| s.limit)
            {
                Some(ActiveLimit::Remote { stage }) => format!("remote-{stage}"),
                Some(ActiveLimit::Vented) => "vented".into(),
                _ => "main".into(),
            }
        })
    };
    let set_limit = move |ev: leptos::ev::Event| {
        let key = event_target_value(&ev);
        state.job.update(|j| {
            if let Some(s) = design_mut(j, d).and_then(|x| x.phase_settings.get_mut(i)) {
                s.limit = match key.as_str() {
                    "vented" => ActiveLimit::Vented,
                    k => k
                        .strip_prefix("remote-")
                        .and_then(|n| n.parse().ok())
                        .map_or(ActiveLimit::Main, |stage| ActiveLimit::Remote { stage }),
                };
            }
        })
    };
    let limit_id = format!("limit-{d}-{i}");
    view! {
        <div class="phase-limit">
            <div class="field">
                <label for=limit_id.clone()>{move || format!("{}. {}", i + 1, name())}</label>
                <select id=limit_id data-path=fields::LIMIT.at(&[d, i]) on:change=set_limit>
                    {move || {
                        let now = current();
                        options()
                            .into_iter()
                            .map(|(key, text)| {
                                let selected = key == now;
                                view! { <option value=key selected=selected>{text}</option> }
                            })
                            .collect_view()
                    }}
                </select>
            </div>
            {move || is_idle().then(|| view! { <IdlePathField d=d i=i /> })}
            {move || has_nameplate().then(|| view! { <CurrentReadField d=d i=i /> })}
        </div>
    }
}

/// The motor's electrical nameplate, entered on demand: with it the results show each phase's
/// line current and power factor, and a clamp-meter reading per phase can be set beside them.
#[component]
fn MotorNameplateFields(d: usize) -> impl IntoView {
    let state = use_job();
    let entered = Memo::new(move |_| {
        state
            .job
            .with(|j| design(j, d).is_some_and(|x| x.motor.electrical.is_some()))
    });
    let rating = move |j: &Job| design(j, d).and_then(|x| x.motor.electrical);
    fn rating_mut(j: &mut Job, d: usize) -> Option<&mut ElectricalRating> {
        design_mut(j, d).and_then(|x| x.motor.electrical.as_mut())
    }
    let add = move |_| {
        state.job.update(|j| {
            if let Some(x) = design_mut(j, d) {
                x.motor.electrical = Some(ElectricalRating {
                    voltage: ElectricPotential::new::<volt>(f64::NAN),
                    full_load_current: ElectricCurrent::new::<ampere>(f64::NAN),
                    power_factor: None,
                });
            }
        })
    };
    let remove = move |_| {
        state.job.update(|j| {
            if let Some(x) = design_mut(j, d) {
                x.motor.electrical = None;
                for s in &mut x.phase_settings {
                    s.measured_current = None;
                }
            }
        })
    };
    view! {
        <h3>"Electrical nameplate"</h3>
        <p class="hint">"With it, the results show each phase's line current and power factor, to compare with a clamp meter."</p>
        {move || if entered.get() {
            view! {
                <div class="field-grid">
                    <NumberField field=&fields::MOTOR_VOLTAGE at=[d]
                        get=move |j: &Job| rating(j).map_or(f64::NAN, |r| r.voltage.value)
                        set=move |j: &mut Job, v| if let Some(r) = rating_mut(j, d) { r.voltage.value = v } />
                    <NumberField field=&fields::MOTOR_FULL_LOAD_CURRENT at=[d]
                        get=move |j: &Job| rating(j).map_or(f64::NAN, |r| r.full_load_current.value)
                        set=move |j: &mut Job, v| if let Some(r) = rating_mut(j, d) { r.full_load_current.value = v } />
                    <OptionalNumberField field=&fields::MOTOR_POWER_FACTOR at=[d]
                        placeholder=Signal::derive(|| "from the rest of the nameplate".to_string())
                        get=move |j: &Job| rating(j).and_then(|r| r.power_factor)
                        set=move |j: &mut Job, v| if let Some(r) = rating_mut(j, d) { r.power_factor = v } />
                </div>
                <button type="button" class="button quiet" data-action="remove-nameplate" on:click=remove>"Leave the electrical nameplate out"</button>
            }.into_any()
        } else {
            view! {
                <button type="button" class="button wide" data-action="add-nameplate" on:click=add>"Enter the electrical nameplate"</button>
            }.into_any()
        }}
    }
}

/// A clamp-meter reading of the line current in phase `i`, with the model's figure as its
/// placeholder (the engine compares them and says when they differ).
#[component]
fn CurrentReadField(d: usize, i: usize) -> impl IntoView {
    let state = use_job();
    let model = Signal::derive(move || {
        let units = state.units();
        state.result.with(|r| {
            r.as_ref()
                .ok()
                .and_then(|r| r.designs.get(d))
                .and_then(|x| x.phases.get(i))
                .and_then(|p| p.line)
                .map_or_else(
                    || "not read".to_string(),
                    |l| {
                        format!(
                            "model: {}",
                            Measure::Current.with_unit(units, l.current.value)
                        )
                    },
                )
        })
    });
    view! {
        <OptionalNumberField field=&fields::MEASURED_CURRENT at=[d, i]
            placeholder=model
            get=move |j: &Job| design(j, d).and_then(|x| x.phase_settings.get(i)).and_then(|s| s.measured_current.map(|a| a.value))
            set=move |j: &mut Job, v| if let Some(s) = design_mut(j, d).and_then(|x| x.phase_settings.get_mut(i)) { s.measured_current = v.map(ElectricCurrent::new::<ampere>) } />
    }
}

#[component]
fn IdlePathField(d: usize, i: usize) -> impl IntoView {
    let state = use_job();
    let path = move |j: &Job| {
        design(j, d)
            .and_then(|x| x.phase_settings.get(i))
            .map(|s| s.idle_path)
    };
    let open_centre = Memo::new(move |_| {
        state
            .job
            .with(|j| matches!(path(j), Some(IdlePath::OpenCentre { .. })))
    });
    let open_centre = move || open_centre.get();
    view! {
        <ChoiceField field=&fields::IDLE_PATH at=[d, i]
            options=vec![
                ("over_limit", "Over the limit above".into()),
                ("vented", "Vented relief".into()),
                ("open_centre", "Through an open-centre valve".into()),
                ("motor_stopped", "Motor stopped".into()),
            ]
            get=move |j: &Job| match path(j) {
                Some(IdlePath::Vented) => "vented",
                Some(IdlePath::OpenCentre { .. }) => "open_centre",
                Some(IdlePath::MotorStopped) => "motor_stopped",
                _ => "over_limit",
            }
            set=move |j: &mut Job, key| if let Some(s) = design_mut(j, d).and_then(|x| x.phase_settings.get_mut(i)) {
                s.idle_path = match key {
                    "vented" => IdlePath::Vented,
                    "open_centre" => IdlePath::OpenCentre { drop: Pressure::new::<bar>(5.0) },
                    "motor_stopped" => IdlePath::MotorStopped,
                    _ => IdlePath::OverLimit,
                };
            } />
        {move || open_centre().then(|| view! {
            <NumberField field=&fields::OPEN_CENTRE_DROP at=[d, i]
                get=move |j: &Job| match path(j) { Some(IdlePath::OpenCentre { drop }) => drop.value, _ => f64::NAN }
                set=move |j: &mut Job, v| if let Some(s) = design_mut(j, d).and_then(|x| x.phase_settings.get_mut(i)) { s.idle_path = IdlePath::OpenCentre { drop: Pressure::new::<pascal>(v) } } />
        })}
    }
}
