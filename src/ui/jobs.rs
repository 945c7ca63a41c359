//! The jobs area: the jobs kept on this device ([`super::storage`]), opened, copied, renamed,
//! deleted, exported and imported, and the line saying whether the open job is saved.
//!
//! "Start a new job" asks where from: nothing (`Job::blank`: no phases, one power unit whose
//! machine figures are empty, the units and currency carried over; it is saved once every
//! field holds a number, and says so) or a copy of the open job. Nothing comes from the example
//! unseen.
//!
//! A job is renamed from the list without opening it (the engine's validation judges the name;
//! a taken name gets " (2)"). Damaged entries are listed with their reason and offered as
//! downloads; export and import follow `formats::library`. When another window has saved the
//! open job, the choice between its version and this one is offered here.

use super::field::TextField;
use super::state::use_job;
use super::storage::{
    download, file_stem, flush_pending, load_all, local_storage, now_ms, open, save_now,
    stored_ids, stored_names, strs, use_storage, write, SaveNote,
};
use crate::engine::fields;
use crate::engine::Job;
use crate::formats::library::{self, Entry};
use leptos::prelude::*;
use wasm_bindgen::JsCast;

fn when(ms: f64) -> String {
    let date = js_sys::Date::new(&wasm_bindgen::JsValue::from_f64(ms));
    String::from(date.to_locale_string("en-GB", &wasm_bindgen::JsValue::UNDEFINED))
}

/// The line saying whether the open job is saved.
#[component]
pub fn SaveStatus() -> impl IntoView {
    let state = use_job();
    let storage = use_storage();
    move || {
        let (class, text) = match storage.save_note.get() {
            SaveNote::NotSaved if state.job.with(|j| j.example) => ("save-note", "Not saved yet: the example is saved on this device once you change it.".to_string()),
            SaveNote::NotSaved => ("save-note", "Not saved yet: it is saved on this device once every marked field holds a number.".to_string()),
            SaveNote::Saved { at_ms } => ("save-note", format!("Saved on this device, {}.", when(at_ms))),
            SaveNote::Failed(why) => ("save-note failed", format!("Not saved: {why}")),
            SaveNote::Conflict => ("save-note failed", "This job was changed in another window. Choose which version to keep below; nothing is saved until you do.".to_string()),
        };
        view! { <p class=class role="status" data-save-note="true">{text}</p> }
    }
}

/// Whether the app itself is kept on the device yet.
#[component]
fn OfflineNote() -> impl IntoView {
    let offline = super::offline::use_offline();
    move || {
        let text = if offline.kept.get() {
            "The app is kept on this device: it and these jobs open with no network."
        } else {
            "The app is not kept on this device yet: open it once with a network (in a browser that allows it) to use it with none."
        };
        view! { <p class="hint offline-note">{text}</p> }
    }
}

#[component]
pub fn JobsArea() -> impl IntoView {
    let state = use_job();
    let storage = use_storage();
    // A new job starts empty or as a copy of the open one: the user says which, and nothing
    // comes from the example unseen.
    let choosing = RwSignal::new(false);
    let start = move |job: Job| {
        flush_pending(&storage);
        storage.replace_job(job);
        storage.current.set(None);
        storage.save_note.set(SaveNote::NotSaved);
        choosing.set(false);
        save_now(&storage);
    };
    let new_blank = move |_: leptos::ev::MouseEvent| {
        let taken = stored_names(&storage);
        let (units, currency) = state
            .job
            .with_untracked(|j| (j.units, j.site.currency.clone()));
        start(Job::blank(
            library::unique_name("New job", &strs(&taken)),
            units,
            currency,
        ));
    };
    let new_copy = move |_: leptos::ev::MouseEvent| {
        let taken = stored_names(&storage);
        let mut job = state.job.get_untracked();
        job.name = library::unique_name(&format!("{} (copy)", job.name), &strs(&taken));
        start(job);
    };
    let restore = move |_: leptos::ev::MouseEvent| {
        if let Some((id, raw)) = storage.deleted_entry.get_untracked() {
            if write(&library::key_of(&id), &raw).is_ok() {
                storage.deleted_entry.set(None);
                storage.library.set(load_all());
            }
        }
    };
    view! {
        <section class="area" aria-labelledby="area-title">
            <div class="area-head">
                <h1 id="area-title">"Jobs on this device"</h1>
            </div>
            <SaveStatus />
            {move || storage.notice.get().map(|(ok, text)| view! {
                <p class=if ok { "save-note" } else { "save-note failed" } role="status" data-share-note="true">{text}</p>
            })}
            <OfflineNote />
            <Conflict />
            <div class="card">
                <h2>"Open now"</h2>
                <TextField field=&fields::JOB_NAME get=|j: &Job| j.name.clone() set=|j: &mut Job, v| j.name = v />
                <TextField field=&fields::SITE get=|j: &Job| j.site.location.clone() set=|j: &mut Job, v| j.site.location = v />
                <TextField field=&fields::NOTES get=|j: &Job| j.notes.clone() set=|j: &mut Job, v| j.notes = v />
            </div>
            <button type="button" class="button wide" data-action="new-job" aria-expanded=move || choosing.get().to_string()
                on:click=move |_| choosing.update(|c| *c = !*c)>"Start a new job"</button>
            {move || choosing.get().then(|| view! {
                <div class="card new-job" role="group" aria-label="Start the new job from">
                    <p>"Start the new job from:"</p>
                    <button type="button" class="button wide" data-new="blank" on:click=new_blank>
                        "Nothing: empty fields to fill in from the machine"
                    </button>
                    <button type="button" class="button wide" data-new="copy" on:click=new_copy>
                        {move || format!("A copy of “{}”, every figure as it is", state.job.with(|j| j.name.clone()))}
                    </button>
                    <button type="button" class="button" on:click=move |_| choosing.set(false)>"Cancel"</button>
                </div>
            })}
            <Transfer />
            <super::share::SharePanel />
            {move || storage.deleted_entry.get().map(|_| view! {
                <div class="undo-bar" role="status">
                    <span>"Job deleted."</span>
                    <button type="button" class="button" on:click=restore>"Undo"</button>
                </div>
            })}
            <ul class="job-list">
                {move || storage.library.get().into_iter().map(|entry| view! { <JobRow entry=entry /> }).collect_view()}
            </ul>
        </section>
    }
}

#[component]
fn JobRow(entry: Entry) -> impl IntoView {
    let storage = use_storage();
    match entry {
        Entry::Good { id, saved } => {
            let is_open = {
                let id = id.clone();
                Memo::new(move |_| storage.current.get().as_deref() == Some(id.as_str()))
            };
            let open_it = {
                let (id, job) = (id.clone(), saved.job.clone());
                move |_: leptos::ev::MouseEvent| {
                    flush_pending(&storage);
                    open(&storage, &id, job.clone())
                }
            };
            let duplicate = {
                let job = saved.job.clone();
                move |_: leptos::ev::MouseEvent| {
                    let taken = stored_names(&storage);
                    let mut copy = job.clone();
                    copy.name = library::unique_name(&job.name, &strs(&taken));
                    let ids = stored_ids(&storage);
                    let new = library::new_id(now_ms(), &strs(&ids));
                    if write(
                        &library::key_of(&new),
                        &library::write_entry(&copy, now_ms()),
                    )
                    .is_ok()
                    {
                        storage.library.set(load_all());
                    }
                }
            };
            let delete = {
                let id = id.clone();
                move |_: leptos::ev::MouseEvent| {
                    let Ok(device) = local_storage() else { return };
                    let key = library::key_of(&id);
                    if let Ok(Some(raw)) = device.get_item(&key) {
                        let _ = device.remove_item(&key);
                        storage.deleted_entry.set(Some((id.clone(), raw)));
                        storage.library.set(load_all());
                    }
                }
            };
            let renaming = RwSignal::new(false);
            let new_name = RwSignal::new(saved.job.name.clone());
            let rename_problem = RwSignal::new(None::<String>);
            let rename = {
                let id = id.clone();
                move || {
                    let name = new_name.get_untracked().trim().to_string();
                    // The entry as stored now, not as listed: another window may have changed it.
                    let stored = local_storage()
                        .ok()
                        .and_then(|s| s.get_item(&library::key_of(&id)).ok().flatten())
                        .map(|raw| library::read_entry(&id, &raw));
                    let Some(Entry::Good { saved: current, .. }) = stored else {
                        rename_problem.set(Some(
                            "this job is no longer stored as it was listed; nothing was changed"
                                .into(),
                        ));
                        storage.library.set(load_all());
                        return;
                    };
                    let mut job = current.job.clone();
                    job.name = name.clone();
                    if let Some(problem) =
                        crate::engine::validate::validate(&job)
                            .err()
                            .and_then(|errors| {
                                errors
                                    .into_iter()
                                    .find(|e| e.field == fields::JOB_NAME.at(&[]))
                            })
                    {
                        rename_problem.set(Some(problem.message));
                        return;
                    }
                    let others: Vec<String> = stored_names(&storage)
                        .into_iter()
                        .filter(|n| *n != current.job.name)
                        .collect();
                    job.name = library::unique_name(&name, &strs(&others));
                    match write(&library::key_of(&id), &library::write_entry(&job, now_ms())) {
                        Ok(()) => {
                            renaming.set(false);
                            rename_problem.set(None);
                            storage.library.set(load_all());
                        }
                        Err(why) => rename_problem.set(Some(why)),
                    }
                }
            };
            let rename_on_enter = {
                let rename = rename.clone();
                move |ev: leptos::ev::KeyboardEvent| {
                    if ev.key() == "Enter" {
                        rename();
                    }
                }
            };
            let input_id = format!("rename-{id}");
            let name = saved.job.name.clone();
            let detail = format!(
                "{}{} phases, {} power units · changed {}",
                if saved.job.site.location.is_empty() {
                    String::new()
                } else {
                    format!("{} · ", saved.job.site.location)
                },
                saved.job.cycle.len(),
                saved.job.designs.len(),
                when(saved.changed_ms)
            );
            view! {
                <li class="card job-row" class:current=move || is_open.get() data-job=id.clone()>
                    <h3>{name}</h3>
                    <p class="hint">{detail}</p>
                    <div class="row-tools">
                        <button type="button" class="button" disabled=move || is_open.get() on:click=open_it>
                            {move || if is_open.get() { "Open now" } else { "Open" }}
                        </button>
                        <button type="button" class="button" on:click=duplicate>"Duplicate"</button>
                        <button type="button" class="button" data-action="rename" disabled=move || is_open.get() title="The open job is renamed above" on:click=move |_| renaming.set(true)>"Rename"</button>
                        <button type="button" class="button danger" disabled=move || is_open.get() on:click=delete title="Open another job to delete this one">"Delete"</button>
                    </div>
                    <Show when=move || renaming.get() && !is_open.get()>
                        <div class="field rename" class:invalid=move || rename_problem.with(Option::is_some)>
                            <label for=input_id.clone()>"New name"</label>
                            <input
                                id=input_id.clone()
                                type="text"
                                prop:value=move || new_name.get()
                                on:input=move |ev| new_name.set(event_target_value(&ev))
                                on:keydown=rename_on_enter.clone()
                            />
                            {move || rename_problem.get().map(|p| view! { <p class="field-error" role="alert">{p}</p> })}
                            <div class="row-tools">
                                <button type="button" class="button primary" data-action="rename-save" on:click={
                                    let rename = rename.clone();
                                    move |_| rename()
                                }>"Save the name"</button>
                                <button type="button" class="button" on:click=move |_| { renaming.set(false); rename_problem.set(None); }>"Cancel"</button>
                            </div>
                        </div>
                    </Show>
                </li>
            }
            .into_any()
        }
        Entry::Damaged { id, raw, reason } => {
            let file = format!("phasewise-damaged-{id}.json");
            view! {
                <li class="card job-row damaged" data-damaged=id.clone()>
                    <h3>"A saved job that cannot be read"</h3>
                    <p>{format!("It is kept unchanged on this device: {reason}.")}</p>
                    <button type="button" class="button" on:click=move |_| download(&file, &raw)>"Download it as a file"</button>
                </li>
            }
            .into_any()
        }
    }
}

/// The choice offered when another window changed the open job.
#[component]
fn Conflict() -> impl IntoView {
    let storage = use_storage();
    let keep_mine = move |_: leptos::ev::MouseEvent| {
        storage.save_note.set(SaveNote::NotSaved);
        save_now(&storage);
    };
    let take_theirs = move |_: leptos::ev::MouseEvent| {
        let Some(id) = storage.current.get_untracked() else {
            return;
        };
        let raw = local_storage()
            .ok()
            .and_then(|s| s.get_item(&library::key_of(&id)).ok().flatten());
        match raw.map(|raw| library::read_entry(&id, &raw)) {
            Some(Entry::Good { saved, .. }) => open(&storage, &id, saved.job),
            _ => storage.save_note.set(SaveNote::Failed(
                "the other window's version cannot be read; yours is still here".into(),
            )),
        }
    };
    move || {
        (storage.save_note.get() == SaveNote::Conflict).then(|| view! {
            <div class="row-tools conflict">
                <button type="button" class="button" on:click=take_theirs>"Load the other window's version"</button>
                <button type="button" class="button danger" on:click=keep_mine>"Keep mine and save it"</button>
            </div>
        })
    }
}

/// Export of the open job or of all jobs, and import from a file.
#[component]
fn Transfer() -> impl IntoView {
    let state = use_job();
    let storage = use_storage();
    let message = RwSignal::new(None::<(bool, String)>);
    let export_one = move |_: leptos::ev::MouseEvent| {
        let (name, file) = state
            .job
            .with_untracked(|j| (j.name.clone(), library::job_file(j)));
        match file {
            Ok(text) => download(&format!("{}.phasewise.json", file_stem(&name)), &text),
            Err(why) => message.set(Some((false, format!("Not exported: {why}.")))),
        }
    };
    let export_all = move |_: leptos::ev::MouseEvent| {
        let text = storage.library.with_untracked(|l| {
            let jobs: Vec<&Job> = l
                .iter()
                .filter_map(|e| {
                    if let Entry::Good { saved, .. } = e {
                        Some(&saved.job)
                    } else {
                        None
                    }
                })
                .collect();
            library::export_all(&jobs)
        });
        download("all-jobs.phasewise.json", &text);
    };
    let import = move |ev: leptos::ev::Event| {
        let Some(input) = ev
            .target()
            .and_then(|t| t.dyn_into::<web_sys::HtmlInputElement>().ok())
        else {
            return;
        };
        let Some(file) = input.files().and_then(|f| f.get(0)) else {
            return;
        };
        input.set_value("");
        if file.size() > library::IMPORT_LIMIT_BYTES as f64 {
            message.set(Some((
                false,
                format!(
                    "Nothing imported: the file is {} KB; a Phasewise file is at most {} KB.",
                    file.size() as u64 / 1024,
                    library::IMPORT_LIMIT_BYTES / 1024
                ),
            )));
            return;
        }
        leptos::task::spawn_local(async move {
            let text = match wasm_bindgen_futures::JsFuture::from(file.text()).await {
                Ok(text) => text.as_string().unwrap_or_default(),
                Err(_) => {
                    message.set(Some((
                        false,
                        "Nothing imported: the file could not be read.".into(),
                    )));
                    return;
                }
            };
            let taken = stored_names(&storage);
            match library::parse_import(&text, &strs(&taken)) {
                Err(why) => message.set(Some((false, format!("Nothing imported: {why}.")))),
                Ok(jobs) => {
                    let mut ids = stored_ids(&storage);
                    let mut failed = None;
                    for job in &jobs {
                        let id = library::new_id(now_ms(), &strs(&ids));
                        if let Err(why) =
                            write(&library::key_of(&id), &library::write_entry(job, now_ms()))
                        {
                            failed = Some(why);
                            break;
                        }
                        ids.push(id);
                    }
                    storage.library.set(load_all());
                    message.set(Some(match failed {
                        Some(why) => (false, format!("Not every job was imported: {why}")),
                        None => (
                            true,
                            format!(
                                "Imported {} job{}.",
                                jobs.len(),
                                if jobs.len() == 1 { "" } else { "s" }
                            ),
                        ),
                    }));
                }
            }
        });
    };
    view! {
        <div class="card transfer">
            <h2>"Move jobs in and out"</h2>
            <div class="row-tools">
                <button type="button" class="button" data-export="one" on:click=export_one>"Export this job"</button>
                <button type="button" class="button" data-export="all" on:click=export_all>"Export all jobs"</button>
            </div>
            <div class="field">
                <label for="import-file">"Import jobs from a file"</label>
                <input id="import-file" type="file" accept=".json,application/json" on:change=import />
            </div>
            {move || message.get().map(|(ok, text)| view! {
                <p class=if ok { "save-note" } else { "save-note failed" } role="status" data-import-note="true">{text}</p>
            })}
        </div>
    }
}
