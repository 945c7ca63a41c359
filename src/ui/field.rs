//! Input fields. A number field shows its value in the job's units and keeps what was typed,
//! even when it is not a valid number: the job then holds NaN (or the negative, or the zero)
//! and the engine's validation message for that field appears under it.

use super::state::use_job;
use crate::engine::fields::FieldSpec;
use crate::engine::units::{parse_number, Measure, UnitSystem};
use crate::engine::Job;
use leptos::prelude::*;
use std::sync::Arc;

/// An HTML id from a field path: `cycle[2].cylinder.bore_m` gives `f-cycle-2-cylinder-bore_m`.
pub fn field_id(path: &str) -> String {
    let mut id = String::from("f-");
    for c in path.chars() {
        match c {
            '[' | '.' => id.push('-'),
            ']' => {}
            c => id.push(c),
        }
    }
    id
}

fn same(a: f64, b: f64) -> bool {
    a == b || (a.is_nan() && b.is_nan())
}

/// The text a field shows for a value: empty for a value that is not a number yet.
fn shown_text(measure: Measure, system: UnitSystem, si: f64) -> String {
    if si.is_finite() {
        measure.format(system, si)
    } else {
        String::new()
    }
}

/// A field's label and its path in the job file (as the engine names it in its errors), from
/// its declaration: `at` fills the indices of the lists it sits in, outermost first (the
/// phase, the power unit, ...); `label` replaces the declared one where it depends on the
/// index ("Remote stage 2").
fn label_and_path(field: &FieldSpec, at: &[usize], label: Option<String>) -> (String, String) {
    (
        label.unwrap_or_else(|| field.label.to_string()),
        field.at(at),
    )
}

/// The unit a number field shows: the one its declaration gives (every number declares one).
fn measure_of(field: &FieldSpec) -> Measure {
    debug_assert!(field.measure.is_some(), "{} declares no unit", field.key);
    field.measure.unwrap_or(Measure::Factor)
}

/// A number in the job, edited in the job's units.
#[component]
pub fn NumberField(
    /// The field as the engine declares it: its label, path and unit.
    field: &'static FieldSpec,
    #[prop(into, optional)] at: Vec<usize>,
    #[prop(into, optional)] label: Option<String>,
    get: impl Fn(&Job) -> f64 + Send + Sync + 'static,
    set: impl Fn(&mut Job, f64) + Send + Sync + 'static,
) -> impl IntoView {
    let (label, path) = label_and_path(field, &at, label);
    // Empty text is a missing number: the job holds NaN and validation says so.
    number_input(
        label,
        path,
        measure_of(field),
        None,
        Arc::new(get),
        Arc::new(move |j: &mut Job, v: Option<f64>| set(j, v.unwrap_or(f64::NAN))),
    )
}

/// A number the job may leave out: empty text leaves it out, and the placeholder says what
/// applies then ("as found: 2.4").
#[component]
pub fn OptionalNumberField(
    field: &'static FieldSpec,
    #[prop(into, optional)] at: Vec<usize>,
    #[prop(into, optional)] label: Option<String>,
    #[prop(into)] placeholder: Signal<String>,
    get: impl Fn(&Job) -> Option<f64> + Send + Sync + 'static,
    set: impl Fn(&mut Job, Option<f64>) + Send + Sync + 'static,
) -> impl IntoView {
    let (label, path) = label_and_path(field, &at, label);
    number_input(
        label,
        path,
        measure_of(field),
        Some(placeholder),
        Arc::new(move |j: &Job| get(j).unwrap_or(f64::NAN)),
        Arc::new(set),
    )
}

type Getter = Arc<dyn Fn(&Job) -> f64 + Send + Sync>;
/// Receives `None` for empty text, `Some(NaN)` for text that is not a number.
type Setter = Arc<dyn Fn(&mut Job, Option<f64>) + Send + Sync>;

fn number_input(
    label: String,
    path: String,
    measure: Measure,
    placeholder: Option<Signal<String>>,
    get: Getter,
    set: Setter,
) -> impl IntoView {
    let state = use_job();
    let model = {
        let get = get.clone();
        move || state.job.with(|j| get(j))
    };
    let units = move || state.units();
    // A field left holding text that is no number shows that text again, not an empty box.
    let kept = state.job.with_untracked(|j| get(j)).is_nan().then(|| {
        state
            .typed_text
            .with_value(|typed| typed.get(&path).cloned())
    });
    let text = RwSignal::new(kept.flatten().unwrap_or_else(|| {
        shown_text(
            measure,
            state.job.with_untracked(|j| j.units),
            state.job.with_untracked(|j| get(j)),
        )
    }));
    // What this field last showed or wrote: a different model value or unit system means the
    // job changed elsewhere (undo, a unit switch, another field), so the text is redrawn.
    let shown = StoredValue::new((
        state.job.with_untracked(|j| get(j)),
        state.job.with_untracked(|j| j.units),
    ));
    Effect::new({
        let model = model.clone();
        move |_| {
            let (value, system) = (model(), units());
            let (last_value, last_system) = shown.get_value();
            if !same(value, last_value) || system != last_system {
                text.set(shown_text(measure, system, value));
                shown.set_value((value, system));
            }
        }
    });
    let path_typed = path.clone();
    let on_input = move |ev: leptos::ev::Event| {
        let raw = event_target_value(&ev);
        let system = units();
        let typed = (!raw.trim().is_empty())
            .then(|| parse_number(&raw).map_or(f64::NAN, |n| measure.from_shown(system, n)));
        let path = path_typed.clone();
        state.typed_text.update_value(|kept| match typed {
            Some(n) if n.is_nan() => {
                kept.insert(path, raw.clone());
            }
            _ => {
                kept.remove(&path);
            }
        });
        text.set(raw);
        shown.set_value((typed.unwrap_or(f64::NAN), system));
        let set = set.clone();
        state.job.update(|j| set(j, typed));
    };
    let id = field_id(&path);
    let error_id = format!("{id}-error");
    let error = {
        let path = path.clone();
        Memo::new(move |_| state.error_for(&path))
    };
    view! {
        <div class="field" class:invalid=move || error.get().is_some()>
            <label for=id.clone()>{label}</label>
            <div class="input-row">
                <input
                    id=id
                    type="text"
                    inputmode="decimal"
                    autocomplete="off"
                    spellcheck="false"
                    data-path=path
                    prop:value=move || text.get()
                    placeholder=move || placeholder.map(|p| p.get())
                    aria-invalid=move || error.get().is_some().then_some("true")
                    aria-describedby=error_id.clone()
                    on:input=on_input
                />
                <span class="unit">{move || measure.label(units())}</span>
            </div>
            <p class="field-error" id=error_id role="status">
                // Left empty, the field needs a value (the engine sees no number either way).
                {move || error.get().map(|e| if text.with(|t| t.trim().is_empty()) { "needs a value".to_string() } else { e })}
            </p>
        </div>
    }
}

/// A text in the job (a name).
#[component]
pub fn TextField(
    field: &'static FieldSpec,
    #[prop(into, optional)] at: Vec<usize>,
    get: impl Fn(&Job) -> String + Send + Sync + 'static,
    set: impl Fn(&mut Job, String) + Send + Sync + 'static,
) -> impl IntoView {
    let (label, path) = label_and_path(field, &at, None);
    let state = use_job();
    let id = field_id(&path);
    let error_id = format!("{id}-error");
    let error = {
        let path = path.clone();
        Memo::new(move |_| state.error_for(&path))
    };
    let value = move || state.job.with(|j| get(j));
    view! {
        <div class="field" class:invalid=move || error.get().is_some()>
            <label for=id.clone()>{label}</label>
            <input
                id=id
                type="text"
                autocomplete="off"
                data-path=path
                prop:value=value
                aria-describedby=error_id.clone()
                on:input=move |ev| {
                    let v = event_target_value(&ev);
                    state.job.update(|j| set(j, v));
                }
            />
            <p class="field-error" id=error_id role="status">
                {move || error.get()}
            </p>
        </div>
    }
}

/// A choice among a few options, each (value key, label).
#[component]
pub fn ChoiceField(
    field: &'static FieldSpec,
    #[prop(into, optional)] at: Vec<usize>,
    options: Vec<(&'static str, String)>,
    get: impl Fn(&Job) -> &'static str + Send + Sync + 'static,
    set: impl Fn(&mut Job, &str) + Send + Sync + 'static,
) -> impl IntoView {
    let (label, path) = label_and_path(field, &at, None);
    let state = use_job();
    let id = field_id(&path);
    let error = {
        let path = path.clone();
        Memo::new(move |_| state.error_for(&path))
    };
    let get = Arc::new(get);
    let current = move || state.job.with(|j| get(j));
    view! {
        <div class="field" class:invalid=move || error.get().is_some()>
            <label for=id.clone()>{label}</label>
            <select
                id=id
                data-path=path
                on:change=move |ev| {
                    let v = event_target_value(&ev);
                    state.job.update(|j| set(j, &v));
                }
            >
                {options
                    .into_iter()
                    .map(|(key, text)| {
                        let current = current.clone();
                        view! {
                            <option value=key selected=move || current() == key>
                                {text}
                            </option>
                        }
                    })
                    .collect_view()}
            </select>
            <p class="field-error" role="status">
                {move || error.get()}
            </p>
        </div>
    }
}

/// The unit-system switch, per job.
#[component]
pub fn UnitSwitch() -> impl IntoView {
    let state = use_job();
    let button = move |system: UnitSystem, text: &'static str| {
        view! {
            <button
                type="button"
                class="toggle"
                aria-pressed=move || if state.units() == system { "true" } else { "false" }
                on:click=move |_| state.job.update(|j| j.units = system)
            >
                {text}
            </button>
        }
    };
    view! {
        <div class="segmented" role="group" aria-label="Units">
            {button(UnitSystem::Si, "bar · L/min · kW")}
            {button(UnitSystem::UsCustomary, "psi · gpm · hp")}
        </div>
    }
}
