//! The pump-staging search in the settings area: its options (kept in the job), a run in
//! slices with a progress bar so the page stays responsive, the best candidates, the trade-off
//! between motor size and cycle time, and one action that makes a candidate the proposed
//! design. The search itself is `engine::staging`.

use super::field::{NumberField, OptionalNumberField};
use super::state::use_job;
use crate::engine::cycle::PhaseKind;
use crate::engine::fields::{self, FieldSpec};
use crate::engine::motor::EfficiencyClass;
use crate::engine::staging::{
    self, Candidate, CandidateKind, MotorSteps, Search, SearchResult, Trade,
};
use crate::engine::units::{format_list, parse_list, Measure, UnitSystem};
use crate::engine::Job;
use leptos::prelude::*;
use std::cell::RefCell;
use std::rc::Rc;
use uom::si::f64::Time;

/// Candidates evaluated between two looks at the clock.
const BATCH: usize = 50;
/// How long one slice may keep the thread before the page gets it back (ms): about a frame,
/// so taps and the progress bar stay live; longer slices waste less on the hand-overs (each
/// costs a timer's few milliseconds).
const SLICE_MS: f64 = 16.0;

#[derive(Clone, Debug, PartialEq)]
enum Run {
    Idle,
    Running { done: usize, total: usize },
    Finished { result: SearchResult, ms: f64 },
}

#[component]
pub fn StagingPanel() -> impl IntoView {
    let state = use_job();
    let run = RwSignal::new(Run::Idle);
    let note = RwSignal::new(None::<String>);
    // Each search has a number; a slice of an older one (the job changed, the area closed)
    // stops instead of running on.
    let generation = StoredValue::new(0u64);
    // Any change to the job makes earlier results stale: they go (applying one changes the
    // job too, and its note says what happened).
    Effect::new(move |first: Option<()>| {
        state.job.track();
        if first.is_some() {
            generation.update_value(|g| *g += 1);
            run.set(Run::Idle);
        }
    });
    on_cleanup(move || generation.update_value(|g| *g += 1));
    let start = move |_: leptos::ev::MouseEvent| {
        if state.result.with_untracked(|r| r.is_err()) {
            return;
        }
        let job = state.job.get_untracked();
        let options = job.staging.clone();
        // The results area says what to fix when the job or its options are invalid.
        let Ok(search) = Search::new(job, options) else {
            return;
        };
        let search = Rc::new(RefCell::new(search));
        let total = search.borrow().total();
        generation.update_value(|g| *g += 1);
        let mine = generation.get_value();
        run.set(Run::Running { done: 0, total });
        note.set(None);
        step(search, run, js_sys::Date::now(), move || {
            generation.try_get_value() == Some(mine)
        });
    };
    let apply = move |candidate: Candidate| {
        let shown = state.design_index();
        let (job, target) = state
            .job
            .with_untracked(|j| staging::apply_candidate(j, shown, &candidate));
        let Some(name) = job.designs.get(target).map(|x| x.name.clone()) else {
            return;
        };
        state.change_with_undo(
            "staging",
            format!("Gave “{name}” the candidate's pumps and motor"),
            |j| *j = job,
        );
        state.design.set(target);
        note.set(Some(format!("“{name}” now has this candidate's pumps, motor and settings. The baseline is unchanged.")));
    };
    view! {
        <section class="card staging" aria-labelledby="staging-title">
            <h2 id="staging-title">"Try other pumps"</h2>
            <p class="hint">"Every combination of one to three fixed pumps from the sizes below, at each motor speed, with unloading and relief settings from the rules above; a single pressure-compensated pump; and a single fixed pump on a variable-speed drive: each solved over the whole cycle. Ranked by the smallest standard motor that carries it, then by energy."</p>
            <StagingOptionsEditor />
            <button type="button" class="button primary" data-action="search" on:click=start
                disabled=move || matches!(run.get(), Run::Running { .. }) || state.result.with(|r| r.is_err())>
                "Search"
            </button>
            {move || match run.get() {
                Run::Idle => ().into_any(),
                Run::Running { done, total } => view! {
                    <div class="search-progress" role="status">
                        <progress max=total value=done></progress>
                        <span>{format!("{done} of {total} candidates")}</span>
                    </div>
                }.into_any(),
                Run::Finished { result, ms } => view! { <Found result=result ms=ms apply=apply /> }.into_any(),
            }}
            {move || note.get().map(|t| view! { <p class="save-note" role="status" data-staging-applied="true">{t}</p> })}
            <super::undo::UndoChange place="staging" />
        </section>
    }
}

/// Evaluates one slice, shows the progress, and hands the thread back before the next.
fn step(
    search: Rc<RefCell<Search>>,
    run: RwSignal<Run>,
    started_ms: f64,
    current: impl Fn() -> bool + Clone + 'static,
) {
    if !current() {
        return;
    }
    let (done, total) = {
        let mut s = search.borrow_mut();
        let slice_started = js_sys::Date::now();
        loop {
            s.run(BATCH);
            if s.done() >= s.total() || js_sys::Date::now() - slice_started >= SLICE_MS {
                break;
            }
        }
        (s.done(), s.total())
    };
    if done < total {
        run.set(Run::Running { done, total });
        set_timeout(
            move || step(search, run, started_ms, current),
            std::time::Duration::ZERO,
        );
    } else {
        let result = search.borrow().result();
        run.set(Run::Finished {
            result,
            ms: js_sys::Date::now() - started_ms,
        });
    }
}

#[component]
fn Found(
    result: SearchResult,
    ms: f64,
    apply: impl Fn(Candidate) + Copy + Send + Sync + 'static,
) -> impl IntoView {
    let state = use_job();
    let u = state.job.with_untracked(|j| j.units);
    let summary = format!(
        "{} candidates searched, {} serve the cycle, in {:.0} ms.",
        result.evaluated, result.feasible, ms
    );
    let empty = result.best.is_empty();
    view! {
        <p class="search-summary" data-search-evaluated=result.evaluated data-search-ms=format!("{ms:.1}")>{summary}</p>
        {empty.then(|| view! { <p class="empty-note">"No candidate meets the move times with a standard motor. Give a move more time under “How fast it must stay”, or add sizes or speeds."</p> })}
        <ol class="candidates">
            {result.best.into_iter().enumerate().map(|(i, c)| {
                let pumps = c.spec.displacements.iter().map(|d| Measure::Displacement.with_unit(u, *d)).collect::<Vec<_>>().join(" + ");
                let top = Measure::ShaftSpeed.with_unit(u, c.spec.speed);
                let how = match c.spec.min_speed {
                    Some(min) => format!(" on a variable-speed drive, {} to {top}", Measure::ShaftSpeed.with_unit(u, min)),
                    None if c.spec.compensated => format!(" (pressure-compensated) at {top}"),
                    None => format!(" at {top}"),
                };
                let line = format!(
                    "{pumps}{how}; motor {}; cycle {}; {} per cycle",
                    motor_label(c.motor.value, u),
                    Measure::Duration.with_unit(u, c.cycle_time.value),
                    Measure::Energy.with_unit(u, c.energy_per_cycle.value),
                );
                let candidate = c.clone();
                view! {
                    <li class="candidate" data-rank=i + 1>
                        <p>{line}</p>
                        <button type="button" class="button" data-action="use-candidate" on:click=move |_| apply(candidate.clone())>
                            "Make this the proposed power unit"
                        </button>
                    </li>
                }
            }).collect_view()}
        </ol>
        <TradeOff frontier=result.frontier units=u />
    }
}

fn motor_label(w: f64, u: UnitSystem) -> String {
    format!("{} {}", motor_size(w, u), Measure::Power.label(u))
}

/// A motor size as a number in the unit system's power unit, with no unit.
fn motor_size(w: f64, u: UnitSystem) -> String {
    trim(Measure::Power.shown(u, w))
}

fn trim(v: f64) -> String {
    let t = format!("{v:.2}");
    t.trim_end_matches('0').trim_end_matches('.').to_string()
}

/// The kinds of design on the trade-off chart, in its order, with their legend words and
/// CSS class.
const KINDS: [(CandidateKind, &str, &str); 3] = [
    (CandidateKind::Staged, "Staged fixed pumps", "kind-staged"),
    (
        CandidateKind::Compensated,
        "Pressure-compensated pump",
        "kind-compensated",
    ),
    (
        CandidateKind::VariableSpeed,
        "Variable-speed drive",
        "kind-drive",
    ),
];

/// The shortest cycle each motor size reaches, for each kind of design: a group of bars per
/// motor size, smallest motor on the left; the group's shortest cycle written above it.
#[component]
fn TradeOff(frontier: Vec<Trade>, units: UnitSystem) -> impl IntoView {
    let mut motors: Vec<f64> = frontier.iter().map(|t| t.motor).collect();
    motors.sort_by(f64::total_cmp);
    motors.dedup();
    if frontier.len() < 2 {
        return ().into_any();
    }
    let kinds: Vec<_> = KINDS
        .iter()
        .filter(|(k, _, _)| frontier.iter().any(|t| t.kind == *k))
        .copied()
        .collect();
    let (w, h, pad) = (320.0, 180.0, 36.0);
    let t_max = frontier.iter().map(|f| f.cycle_time).fold(0.0, f64::max) * 1.1;
    let n = motors.len() as f64;
    let group = (w - 2.0 * pad) / n;
    let bar = (group * 0.8 / kinds.len() as f64).min(16.0);
    let x = move |i: usize| pad + group * (i as f64 + 0.5);
    let y = move |t: f64| h - pad - (h - 2.0 * pad) * (t / t_max);
    let described = frontier
        .iter()
        .map(|t| {
            let words = KINDS.iter().find(|k| k.0 == t.kind).map_or("", |k| k.1);
            format!(
                "{words}, motor {}: {:.1} s",
                motor_label(t.motor, units),
                t.cycle_time
            )
        })
        .collect::<Vec<_>>()
        .join("; ");
    view! {
        <figure class="trade-off">
            <svg viewBox=format!("0 0 {w} {h}") role="img" aria-label=format!("Shortest cycle time against motor size, by kind of power unit: {described}")>
                <line x1=pad y1=h - pad x2=w - pad y2=h - pad class="axis" />
                <line x1=pad y1=pad x2=pad y2=h - pad class="axis" />
                {motors.iter().enumerate().map(|(i, m)| {
                    let here: Vec<(usize, f64, &'static str, &'static str)> = kinds.iter().enumerate().filter_map(|(k, (kind, words, class))| {
                        frontier.iter().find(|t| t.kind == *kind && t.motor == *m).map(|t| (k, t.cycle_time, *words, *class))
                    }).collect();
                    let shortest = here.iter().map(|h| h.1).fold(f64::INFINITY, f64::min);
                    // Written above the group's tallest bar, so no bar runs through it.
                    let longest = here.iter().map(|h| h.1).fold(0.0, f64::max);
                    let left = x(i) - bar * kinds.len() as f64 / 2.0;
                    view! {
                        <g>
                            {here.into_iter().map(|(k, t, words, class)| view! {
                                <rect x=left + bar * k as f64 y=y(t) width=bar height={(h - pad) - y(t)} class=format!("bar {class}")>
                                    <title>{format!("{words}, motor {}: {t:.1} s", motor_label(*m, units))}</title>
                                </rect>
                            }).collect_view()}
                            // The number only: ten sizes' units would run into each other on a phone.
                            <text x=x(i) y=h - pad + 14.0 class="tick" text-anchor="middle">{motor_size(*m, units)}</text>
                            <text x=x(i) y=y(longest) - 4.0 class="tick" text-anchor="middle">{format!("{shortest:.1}")}</text>
                        </g>
                    }
                }).collect_view()}
            </svg>
            <figcaption>{format!(
                "Shortest cycle (s) each motor size ({}) reaches, by kind of power unit.",
                Measure::Power.label(units)
            )}</figcaption>
            <ul class="legend">
                {kinds.iter().map(|(_, words, class)| view! {
                    <li><span class=format!("swatch {class}")></span>{*words}</li>
                }).collect_view()}
            </ul>
        </figure>
    }
    .into_any()
}

fn sizes(j: &Job) -> Vec<f64> {
    j.staging.displacements.iter().map(|v| v.value).collect()
}

fn set_sizes(j: &mut Job, values: Vec<f64>) {
    j.staging.displacements = values
        .into_iter()
        .map(uom::si::f64::Volume::new::<uom::si::volume::cubic_meter>)
        .collect();
}

fn speeds(j: &Job) -> Vec<f64> {
    j.staging.speeds.iter().map(|v| v.value).collect()
}

fn set_speeds(j: &mut Job, values: Vec<f64>) {
    j.staging.speeds = values
        .into_iter()
        .map(uom::si::f64::AngularVelocity::new::<uom::si::angular_velocity::radian_per_second>)
        .collect();
}

/// The search's options, kept in the job.
#[component]
fn StagingOptionsEditor() -> impl IntoView {
    view! {
        <details class="staging-options">
            <summary>"What to choose from"</summary>
            <ListField field=&fields::PUMP_SIZES
                get=sizes set=set_sizes />
            <p class="hint">"Default: the R10 preferred numbers from 2.5 to 160 cm³/rev, as pumps are typically sized."</p>
            <ListField field=&fields::MOTOR_SPEEDS
                get=speeds set=set_speeds />
            <p class="hint">"Default: 4- and 6-pole motors at 50 and 60 Hz, typical full-load speeds."</p>
            <super::field::ChoiceField field=&fields::MOST_PUMPS
                options=vec![("1", "One".to_string()), ("2", "Two".to_string()), ("3", "Three".to_string())]
                get=|j: &Job| match j.staging.max_pumps { 1 => "1", 2 => "2", _ => "3" }
                set=|j: &mut Job, v: &str| j.staging.max_pumps = v.parse().unwrap_or(3) />
            <super::field::ChoiceField field=&fields::TRY_COMPENSATED
                options=vec![("yes", "Yes".to_string()), ("no", "No".to_string())]
                get=|j: &Job| if j.staging.compensated { "yes" } else { "no" }
                set=|j: &mut Job, v: &str| j.staging.compensated = v == "yes" />
            <super::field::ChoiceField field=&fields::TRY_DRIVES
                options=vec![("yes", "Yes".to_string()), ("no", "No".to_string())]
                get=|j: &Job| if j.staging.drives { "yes" } else { "no" }
                set=|j: &mut Job, v: &str| j.staging.drives = v == "yes" />
            <DriveMinSpeeds />
            <super::field::ChoiceField field=&fields::MOTOR_STEPS
                options=vec![("iec", "IEC, kW".to_string()), ("nema", "NEMA, hp".to_string())]
                get=|j: &Job| match j.staging.motor_steps { MotorSteps::IecKw => "iec", MotorSteps::NemaHp => "nema" }
                set=|j: &mut Job, v: &str| j.staging.motor_steps = if v == "nema" { MotorSteps::NemaHp } else { MotorSteps::IecKw } />
            <super::field::ChoiceField field=&fields::EFFICIENCY_CLASS
                options=vec![
                    ("usual", "As the sizes: IE3 for kW, NEMA Premium for hp".to_string()),
                    ("ie2", "IE2".to_string()),
                    ("ie3", "IE3".to_string()),
                    ("ie4", "IE4".to_string()),
                    ("nema_premium", "NEMA Premium".to_string()),
                ]
                get=|j: &Job| match j.staging.efficiency_class {
                    None => "usual",
                    Some(EfficiencyClass::Ie2) => "ie2",
                    Some(EfficiencyClass::Ie3) => "ie3",
                    Some(EfficiencyClass::Ie4) => "ie4",
                    Some(EfficiencyClass::NemaPremium) => "nema_premium",
                }
                set=|j: &mut Job, v: &str| j.staging.efficiency_class = match v {
                    "ie2" => Some(EfficiencyClass::Ie2),
                    "ie3" => Some(EfficiencyClass::Ie3),
                    "ie4" => Some(EfficiencyClass::Ie4),
                    "nema_premium" => Some(EfficiencyClass::NemaPremium),
                    _ => None,
                } />
            <p class="hint">"Each candidate's motor is taken at its class's nominal efficiency for its own size (IEC 60034-30-1, 5.5 to 37 kW; NEMA MG 1, 10 to 50 hp); a size outside those takes the figure at the nearer end."</p>
            <NumberField field=&fields::STAGING_SERVICE_FACTOR
                get=|j: &Job| j.staging.service_factor set=|j: &mut Job, v| j.staging.service_factor = v />
            <NumberField field=&fields::STAGING_PEAK_ALLOWANCE
                get=|j: &Job| j.staging.peak_allowance set=|j: &mut Job, v| j.staging.peak_allowance = v />
        </details>
        <LongestTimes />
    }
}

/// The slowest speeds drive candidates are tried at, while drives are tried (a Memo, so typing
/// keeps the field).
#[component]
fn DriveMinSpeeds() -> impl IntoView {
    let state = use_job();
    let trying = Memo::new(move |_| state.job.with(|j| j.staging.drives));
    move || {
        trying.get().then(|| view! {
            <ListField field=&fields::DRIVE_MIN_SPEEDS get=min_speeds set=set_min_speeds />
            <p class="hint">"Each size is tried as one fixed pump on a variable-speed drive: at most each motor speed above, at least each of these. Default: 300 and 600 rpm, common minimum speeds for gear and vane pumps; your pump's maker states its own."</p>
        })
    }
}

fn min_speeds(j: &Job) -> Vec<f64> {
    j.staging.drive_min_speeds.iter().map(|v| v.value).collect()
}

fn set_min_speeds(j: &mut Job, values: Vec<f64>) {
    j.staging.drive_min_speeds = values
        .into_iter()
        .map(uom::si::f64::AngularVelocity::new::<uom::si::angular_velocity::radian_per_second>)
        .collect();
}

/// The longest each move and the cycle may take, for the search: empty keeps a move as fast
/// as it is with the baseline design, and leaves the cycle free within its moves' times.
#[component]
fn LongestTimes() -> impl IntoView {
    let state = use_job();
    // Only the list of moves redraws the fields, so typing in one keeps its focus.
    let moves = Memo::new(move |_| {
        state.job.with(|j| {
            j.cycle
                .iter()
                .enumerate()
                .filter(|(_, p)| matches!(p.kind, PhaseKind::Move(_)))
                .map(|(i, p)| (i, p.name.clone()))
                .collect::<Vec<_>>()
        })
    });
    let as_found = move |i: Option<usize>| {
        let u = state.units();
        state.last_good.with(|r| {
            r.as_ref()
                .and_then(|r| r.designs.first())
                .and_then(|d| match i {
                    Some(i) => d.phases.get(i).map(|p| p.point.duration.value),
                    None => Some(d.totals.cycle_time.value),
                })
                .map_or(String::new(), |t| {
                    format!("as found: {}", Measure::Duration.format(u, t))
                })
        })
    };
    view! {
        <details class="staging-options" open>
            <summary>"How fast it must stay"</summary>
            <p class="hint">"A candidate must make each move in no more than its time here, and the whole cycle in no more than the cycle time. Leave a move empty to keep it as fast as it is now."</p>
            <div class="field-grid">
                {move || moves.get().into_iter().map(|(i, name)| view! {
                    <OptionalNumberField field=&fields::TARGET_TIME at=[i] label=format!("{}. {name}", i + 1)
                        placeholder=Signal::derive(move || as_found(Some(i)))
                        get=move |j: &Job| move_target(j, i)
                        set=move |j: &mut Job, v| set_move_target(j, i, v) />
                }).collect_view()}
                <OptionalNumberField field=&fields::CYCLE_TIME_TARGET
                    placeholder=Signal::derive(move || as_found(None).replace("as found", "free; as found"))
                    get=cycle_target set=set_cycle_target />
            </div>
        </details>
    }
}

fn seconds(s: f64) -> Time {
    Time::new::<uom::si::time::second>(s)
}

fn cycle_target(j: &Job) -> Option<f64> {
    j.staging.cycle_time_target.map(|t| t.value)
}

fn set_cycle_target(j: &mut Job, v: Option<f64>) {
    j.staging.cycle_time_target = v.map(seconds);
}

fn move_target(j: &Job, i: usize) -> Option<f64> {
    match j.cycle.get(i).map(|p| &p.kind) {
        Some(PhaseKind::Move(m)) => m.target_time.map(|t| t.value),
        _ => None,
    }
}

fn set_move_target(j: &mut Job, i: usize, v: Option<f64>) {
    if let Some(PhaseKind::Move(m)) = j.cycle.get_mut(i).map(|p| &mut p.kind) {
        m.target_time = v.map(seconds);
    }
}

/// A list of numbers in the job's units; what does not read is said at the field and the job
/// keeps its last good list.
#[component]
fn ListField(
    /// The list's figures as the engine declares them; the field names the whole list.
    field: &'static FieldSpec,
    get: impl Fn(&Job) -> Vec<f64> + Send + Sync + 'static,
    set: impl Fn(&mut Job, Vec<f64>) + Send + Sync + 'static,
) -> impl IntoView {
    let (label, path) = (field.label, field.at(&[]));
    let measure = field.measure.unwrap_or(Measure::Factor);
    let state = use_job();
    let units = state.job.with_untracked(|j| j.units);
    let text = RwSignal::new(
        state
            .job
            .with_untracked(|j| format_list(&get(j), measure, units)),
    );
    let problem = RwSignal::new(None::<String>);
    let id = path.replace(['.', '[', ']'], "-");
    let error_id = format!("{id}-error");
    let on_change = move |ev: leptos::ev::Event| {
        let typed = event_target_value(&ev);
        text.set(typed.clone());
        match parse_list(&typed, measure, state.job.with_untracked(|j| j.units)) {
            Ok(values) => {
                problem.set(None);
                state.job.update(|j| set(j, values));
            }
            Err(why) => problem.set(Some(why)),
        }
    };
    view! {
        <div class="field" class:invalid=move || problem.with(Option::is_some)>
            <label for=id.clone()>{format!("{label} ({})", measure.label(units))}</label>
            <input id=id.clone() type="text" inputmode="decimal" data-path=path
                prop:value=move || text.get() on:change=on_change
                aria-describedby=error_id.clone() />
            <p class="field-error" id=error_id role="alert">{move || problem.get().unwrap_or_default()}</p>
        </div>
    }
}
