//! The cycle area: the machine's phases in order, each opened to edit its figures.

use super::field::{ChoiceField, NumberField, TextField, UnitSwitch};
use super::shared::ExampleBanner;
use super::state::use_job;
use crate::engine::cycle::*;
use crate::engine::fields;
use crate::engine::Job;
use leptos::prelude::*;
use uom::si::f64::*;

/// A new phase of a kind, with everyday figures to start from.
pub fn new_phase(kind: &str, name: &str) -> Phase {
    use uom::si::{
        force::kilonewton, length::millimeter, pressure::bar, time::second,
        volume_rate::liter_per_minute,
    };
    let kind = match kind {
        "move" => PhaseKind::Move(MovePhase {
            cylinder: Cylinder {
                bore: Length::new::<millimeter>(100.0),
                rod: Length::new::<millimeter>(56.0),
                stroke: Length::new::<millimeter>(300.0),
            },
            direction: Direction::Extend,
            load: Load::Force {
                force: Force::new::<kilonewton>(10.0),
            },
            line_loss: Pressure::new::<bar>(3.0),
            lines: None,
            speed: SpeedRule::AllPumpFlow,
            target_time: None,
        }),
        "hold" => PhaseKind::Hold(HoldPhase {
            pressure: Pressure::new::<bar>(100.0),
            duration: Time::new::<second>(5.0),
            mode: HoldMode::HeldByPump,
        }),
        "direct" => PhaseKind::Direct(DirectPhase {
            flow: VolumeRate::new::<liter_per_minute>(20.0),
            pressure: Pressure::new::<bar>(50.0),
            duration: Time::new::<second>(5.0),
        }),
        _ => PhaseKind::Idle(IdlePhase {
            duration: Time::new::<second>(10.0),
        }),
    };
    Phase {
        name: name.into(),
        kind,
    }
}

fn kind_key(kind: &PhaseKind) -> &'static str {
    match kind {
        PhaseKind::Move(_) => "move",
        PhaseKind::Hold(_) => "hold",
        PhaseKind::Idle(_) => "idle",
        PhaseKind::Direct(_) => "direct",
    }
}

fn kind_label(key: &str) -> &'static str {
    match key {
        "move" => "Cylinder stroke",
        "hold" => "Hold at pressure",
        "direct" => "Flow and pressure",
        _ => "Idle",
    }
}

/// The phase editor's view of a move phase, for field lenses.
fn move_of(job: &Job, i: usize) -> Option<&MovePhase> {
    match &job.cycle.get(i)?.kind {
        PhaseKind::Move(m) => Some(m),
        _ => None,
    }
}

fn move_of_mut(job: &mut Job, i: usize) -> Option<&mut MovePhase> {
    match &mut job.cycle.get_mut(i)?.kind {
        PhaseKind::Move(m) => Some(m),
        _ => None,
    }
}

#[component]
pub fn CycleArea() -> impl IntoView {
    let state = use_job();
    // Memos, so the list is rebuilt when its length changes, not on every keystroke.
    let count = Memo::new(move |_| state.job.with(|j| j.cycle.len()));
    let add = move |_: leptos::ev::MouseEvent| {
        state.job.update(|j| {
            let n = j.cycle.len();
            j.insert_phase(n, new_phase("move", &format!("Phase {}", n + 1)));
        });
        state.open_phase.set(Some(count.get_untracked() - 1));
    };
    view! {
        <section class="area" aria-labelledby="area-title">
            <div class="area-head">
                <h1 id="area-title">"Machine cycle"</h1>
                <UnitSwitch />
            </div>
            <ExampleBanner />
            <super::shared::LiveSummary />
            <p class="purpose">"The phases the machine repeats, in order. Open a phase to change its figures."</p>
            <UndoBar />
            <ol class="phase-list">
                {move || (0..count.get()).map(|i| view! { <PhaseCard index=i /> }).collect_view()}
            </ol>
            <button type="button" class="button wide" on:click=add>"Add a phase"</button>
        </section>
    }
}

/// Offers to bring back the last deleted phase.
#[component]
fn UndoBar() -> impl IntoView {
    let state = use_job();
    move || {
        state.deleted.get().map(|removed| {
            let name = removed.phase.name.clone();
            view! {
                <div class="undo-bar" role="status">
                    <span>{format!("Deleted “{name}”.")}</span>
                    <button
                        type="button"
                        class="button"
                        on:click=move |_| {
                            if let Some(removed) = state.deleted.get_untracked() {
                                let index = removed.index;
                                state.job.update(|j| j.restore_phase(removed));
                                state.deleted.set(None);
                                state.open_phase.set(Some(index));
                            }
                        }
                    >
                        "Undo"
                    </button>
                </div>
            }
        })
    }
}

/// One phase: its summary, its tools, and (when open) its fields.
#[component]
fn PhaseCard(index: usize) -> impl IntoView {
    let state = use_job();
    let name = move || {
        state.job.with(|j| {
            j.cycle
                .get(index)
                .map(|p| p.name.clone())
                .unwrap_or_default()
        })
    };
    let kind = Memo::new(move |_| {
        state.job.with(|j| {
            j.cycle
                .get(index)
                .map(|p| kind_key(&p.kind))
                .unwrap_or("idle")
        })
    });
    let kind = move || kind.get();
    let open = move || state.open_phase.get() == Some(index);
    let count = Memo::new(move |_| state.job.with(|j| j.cycle.len()));
    let count = move || count.get();
    let toggle = move |_| {
        state
            .open_phase
            .update(|o| *o = if *o == Some(index) { None } else { Some(index) })
    };
    let up = move |_: leptos::ev::MouseEvent| {
        state.job.update(|j| j.move_phase_down(index - 1));
        state.open_phase.set(Some(index - 1));
    };
    let down = move |_: leptos::ev::MouseEvent| {
        state.job.update(|j| j.move_phase_down(index));
        state.open_phase.set(Some(index + 1));
    };
    let copy = move |_: leptos::ev::MouseEvent| {
        state.job.update(|j| j.duplicate_phase(index));
        state.open_phase.set(Some(index + 1));
    };
    let delete = move |_: leptos::ev::MouseEvent| {
        let mut removed = None;
        state.job.update(|j| removed = j.remove_phase(index));
        state.deleted.set(removed);
        state.open_phase.set(None);
    };
    let has_error = move || {
        let prefix = format!("cycle[{index}].");
        state.result.with(|r| {
            r.as_ref()
                .err()
                .is_some_and(|es| es.iter().any(|e| e.field.starts_with(&prefix)))
        })
    };
    view! {
        <li class="phase-card" class:open=open class:invalid=has_error data-phase=index>
            <button type="button" class="phase-head" aria-expanded=move || if open() { "true" } else { "false" } on:click=toggle>
                <span class="phase-number">{index + 1}</span>
                <span class="phase-name">{name}</span>
                <span class="phase-kind">{move || kind_label(kind())}</span>
            </button>
            <Show when=open>
                <div class="phase-tools">
                    <button type="button" class="button" disabled=move || { index == 0 } on:click=up aria-label="Move this phase earlier">"Earlier"</button>
                    <button type="button" class="button" disabled=move || { index + 1 >= count() } on:click=down aria-label="Move this phase later">"Later"</button>
                    <button type="button" class="button" on:click=copy>"Duplicate"</button>
                    <button type="button" class="button danger" disabled=move || { count() <= 1 } on:click=delete>"Delete"</button>
                </div>
                <div class="phase-fields">
                    <TextField
                        field=&fields::PHASE_NAME
                        at=[index]
                        get=move |j: &Job| j.cycle.get(index).map(|p| p.name.clone()).unwrap_or_default()
                        set=move |j: &mut Job, v| {
                            if let Some(p) = j.cycle.get_mut(index) {
                                p.name = v;
                            }
                        }
                    />
                    <ChoiceField
                        field=&fields::PHASE_KIND
                        at=[index]
                        options=["move", "hold", "idle", "direct"].iter().map(|k| (*k, kind_label(k).to_string())).collect()
                        get=move |j: &Job| j.cycle.get(index).map(|p| kind_key(&p.kind)).unwrap_or("idle")
                        set=move |j: &mut Job, key| {
                            if let Some(p) = j.cycle.get_mut(index) {
                                if kind_key(&p.kind) != key {
                                    p.kind = new_phase(key, "").kind;
                                }
                            }
                        }
                    />
                    {move || match kind() {
                        "move" => view! { <MoveFields index=index /> }.into_any(),
                        "hold" => view! { <HoldFields index=index /> }.into_any(),
                        "direct" => view! { <DirectFields index=index /> }.into_any(),
                        _ => view! { <IdleFields index=index /> }.into_any(),
                    }}
                </div>
            </Show>
        </li>
    }
}

#[component]
fn MoveFields(index: usize) -> impl IntoView {
    let state = use_job();
    let load_key = move |j: &Job| match move_of(j, index).map(|m| m.load) {
        Some(Load::Pressure { .. }) => "pressure",
        _ => "force",
    };
    let speed_key = move |j: &Job| match move_of(j, index).map(|m| m.speed) {
        Some(SpeedRule::MeteredSpeed { .. }) => "metered_speed",
        Some(SpeedRule::MeteredFlow { .. }) => "metered_flow",
        _ => "all_pump_flow",
    };
    let load_is_force = Memo::new(move |_| state.job.with(|j| load_key(j) == "force"));
    let load_is_force = move || load_is_force.get();
    let speed = Memo::new(move |_| state.job.with(speed_key));
    let speed = move || speed.get();
    view! {
        <ChoiceField
            field=&fields::DIRECTION
            at=[index]
            options=vec![("extend", "Extend (full bore)".into()), ("retract", "Retract (annulus)".into())]
            get=move |j: &Job| match move_of(j, index).map(|m| m.direction) {
                Some(Direction::Retract) => "retract",
                _ => "extend",
            }
            set=move |j: &mut Job, key| {
                if let Some(m) = move_of_mut(j, index) {
                    m.direction = if key == "retract" { Direction::Retract } else { Direction::Extend };
                }
            }
        />
        <NumberField field=&fields::BORE at=[index]
            get=move |j: &Job| move_of(j, index).map_or(f64::NAN, |m| m.cylinder.bore.value)
            set=move |j: &mut Job, v| if let Some(m) = move_of_mut(j, index) { m.cylinder.bore.value = v } />
        <NumberField field=&fields::ROD at=[index]
            get=move |j: &Job| move_of(j, index).map_or(f64::NAN, |m| m.cylinder.rod.value)
            set=move |j: &mut Job, v| if let Some(m) = move_of_mut(j, index) { m.cylinder.rod.value = v } />
        <NumberField field=&fields::STROKE at=[index]
            get=move |j: &Job| move_of(j, index).map_or(f64::NAN, |m| m.cylinder.stroke.value)
            set=move |j: &mut Job, v| if let Some(m) = move_of_mut(j, index) { m.cylinder.stroke.value = v } />
        <ChoiceField
            field=&fields::LOAD_GIVEN_AS
            at=[index]
            options=vec![("force", "A force".into()), ("pressure", "A gauge pressure".into())]
            get=load_key
            set=move |j: &mut Job, key| {
                if let Some(m) = move_of_mut(j, index) {
                    m.give_load_as_pressure(key == "pressure");
                }
            }
        />
        {move || if load_is_force() {
            view! {
                <NumberField field=&fields::LOAD_FORCE at=[index]
                    get=move |j: &Job| match move_of(j, index).map(|m| m.load) { Some(Load::Force { force }) => force.value, _ => f64::NAN }
                    set=move |j: &mut Job, v| if let Some(m) = move_of_mut(j, index) { m.load = Load::Force { force: Force::new::<uom::si::force::newton>(v) } } />
            }.into_any()
        } else {
            view! {
                <NumberField field=&fields::LOAD_PRESSURE at=[index]
                    get=move |j: &Job| match move_of(j, index).map(|m| m.load) { Some(Load::Pressure { pressure }) => pressure.value, _ => f64::NAN }
                    set=move |j: &mut Job, v| if let Some(m) = move_of_mut(j, index) { m.load = Load::Pressure { pressure: Pressure::new::<uom::si::pressure::pascal>(v) } } />
            }.into_any()
        }}
        <NumberField field=&fields::LINE_LOSS at=[index]
            get=move |j: &Job| move_of(j, index).map_or(f64::NAN, |m| m.line_loss.value)
            set=move |j: &mut Job, v| if let Some(m) = move_of_mut(j, index) { m.line_loss.value = v } />
        <super::lines::MoveLinesFields index=index />
        <ChoiceField
            field=&fields::SPEED_RULE
            at=[index]
            options=vec![
                ("all_pump_flow", "As fast as the pumps allow".into()),
                ("metered_speed", "Metered to a speed".into()),
                ("metered_flow", "Metered to a flow".into()),
            ]
            get=speed_key
            set=move |j: &mut Job, key| {
                if let Some(m) = move_of_mut(j, index) {
                    m.speed = match key {
                        "metered_speed" => SpeedRule::MeteredSpeed { speed: Velocity::new::<uom::si::velocity::meter_per_second>(0.05) },
                        "metered_flow" => SpeedRule::MeteredFlow { flow: VolumeRate::new::<uom::si::volume_rate::liter_per_minute>(20.0) },
                        _ => SpeedRule::AllPumpFlow,
                    };
                }
            }
        />
        {move || match speed() {
            "metered_speed" => Some(view! {
                <NumberField field=&fields::METERED_SPEED at=[index]
                    get=move |j: &Job| match move_of(j, index).map(|m| m.speed) { Some(SpeedRule::MeteredSpeed { speed }) => speed.value, _ => f64::NAN }
                    set=move |j: &mut Job, v| if let Some(m) = move_of_mut(j, index) { m.speed = SpeedRule::MeteredSpeed { speed: Velocity::new::<uom::si::velocity::meter_per_second>(v) } } />
            }.into_any()),
            "metered_flow" => Some(view! {
                <NumberField field=&fields::METERED_FLOW at=[index]
                    get=move |j: &Job| match move_of(j, index).map(|m| m.speed) { Some(SpeedRule::MeteredFlow { flow }) => flow.value, _ => f64::NAN }
                    set=move |j: &mut Job, v| if let Some(m) = move_of_mut(j, index) { m.speed = SpeedRule::MeteredFlow { flow: VolumeRate::new::<uom::si::volume_rate::cubic_meter_per_second>(v) } } />
            }.into_any()),
            _ => None,
        }}
    }
}

#[component]
fn HoldFields(index: usize) -> impl IntoView {
    let hold = move |j: &Job| match j.cycle.get(index).map(|p| &p.kind) {
        Some(PhaseKind::Hold(h)) => Some(*h),
        _ => None,
    };
    fn hold_mut(j: &mut Job, index: usize) -> Option<&mut HoldPhase> {
        match j.cycle.get_mut(index).map(|p| &mut p.kind) {
            Some(PhaseKind::Hold(h)) => Some(h),
            _ => None,
        }
    }
    view! {
        <NumberField field=&fields::HOLD_PRESSURE at=[index]
            get=move |j: &Job| hold(j).map_or(f64::NAN, |h| h.pressure.value)
            set=move |j: &mut Job, v| if let Some(h) = hold_mut(j, index) { h.pressure.value = v } />
        <NumberField field=&fields::DURATION at=[index]
            get=move |j: &Job| hold(j).map_or(f64::NAN, |h| h.duration.value)
            set=move |j: &mut Job, v| if let Some(h) = hold_mut(j, index) { h.duration.value = v } />
        <ChoiceField
            field=&fields::HELD_BY
            at=[index]
            options=vec![("held_by_pump", "The pump, over the relief".into()), ("locked_by_check", "A check valve (pump free to unload)".into())]
            get=move |j: &Job| match hold(j).map(|h| h.mode) { Some(HoldMode::LockedByCheck) => "locked_by_check", _ => "held_by_pump" }
            set=move |j: &mut Job, key| if let Some(h) = hold_mut(j, index) {
                h.mode = if key == "locked_by_check" { HoldMode::LockedByCheck } else { HoldMode::HeldByPump };
            }
        />
    }
}

#[component]
fn IdleFields(index: usize) -> impl IntoView {
    view! {
        <NumberField field=&fields::DURATION at=[index]
            get=move |j: &Job| match j.cycle.get(index).map(|p| &p.kind) { Some(PhaseKind::Idle(i)) => i.duration.value, _ => f64::NAN }
            set=move |j: &mut Job, v| if let Some(PhaseKind::Idle(i)) = j.cycle.get_mut(index).map(|p| &mut p.kind) { i.duration.value = v } />
        <p class="hint">"Where the pump flow goes while idle is set per power unit, in the Power unit area."</p>
    }
}

#[component]
fn DirectFields(index: usize) -> impl IntoView {
    fn direct(j: &Job, index: usize) -> Option<&DirectPhase> {
        match j.cycle.get(index).map(|p| &p.kind) {
            Some(PhaseKind::Direct(d)) => Some(d),
            _ => None,
        }
    }
    fn direct_mut(j: &mut Job, index: usize) -> Option<&mut DirectPhase> {
        match j.cycle.get_mut(index).map(|p| &mut p.kind) {
            Some(PhaseKind::Direct(d)) => Some(d),
            _ => None,
        }
    }
    view! {
        <NumberField field=&fields::DIRECT_FLOW at=[index]
            get=move |j: &Job| direct(j, index).map_or(f64::NAN, |d| d.flow.value)
            set=move |j: &mut Job, v| if let Some(d) = direct_mut(j, index) { d.flow.value = v } />
        <NumberField field=&fields::DIRECT_PRESSURE at=[index]
            get=move |j: &Job| direct(j, index).map_or(f64::NAN, |d| d.pressure.value)
            set=move |j: &mut Job, v| if let Some(d) = direct_mut(j, index) { d.pressure.value = v } />
        <NumberField field=&fields::DURATION at=[index]
            get=move |j: &Job| direct(j, index).map_or(f64::NAN, |d| d.duration.value)
            set=move |j: &mut Job, v| if let Some(d) = direct_mut(j, index) { d.duration.value = v } />
    }
}
