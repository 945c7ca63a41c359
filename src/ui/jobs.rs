//! Jobs kept on this device: the storage I/O around `library`, the autosave, the watch on
//! other windows, and the jobs area.

use super::field::TextField;
use super::state::use_job;
use super::state::JobState;
use crate::engine::Job;
use crate::formats::library::{self, Entry};
use gloo_storage::Storage as _;
use leptos::prelude::*;
use wasm_bindgen::JsCast;

/// How the open job stands against what is stored.
#[derive(Clone, Debug, PartialEq)]
pub enum SaveNote {
    /// Not saved yet (the example, until it is changed).
    NotSaved,
    Saved {
        at_ms: f64,
    },
    /// The last change could not be written; the stored copy is the one before it.
    Failed(String),
    /// Another window changed this job; saving waits for the user's choice.
    Conflict,
}

pub(super) fn local_storage() -> Result<web_sys::Storage, String> {
    // gloo-storage's `raw()` throws where storage is switched off: ask the window first.
    match window().local_storage() {
        Ok(Some(_)) => Ok(gloo_storage::LocalStorage::raw()),
        _ => Err("this browser does not let Phasewise keep jobs (private browsing, or storage switched off)".into()),
    }
}

pub fn now_ms() -> f64 {
    js_sys::Date::now()
}

/// Every job entry in storage, read (good or damaged), newest first.
pub fn load_all() -> Vec<Entry> {
    let Ok(storage) = local_storage() else {
        return Vec::new();
    };
    let count = storage.length().unwrap_or(0);
    let keys: Vec<String> = (0..count)
        .filter_map(|i| storage.key(i).ok().flatten())
        .collect();
    let entries = keys
        .iter()
        .filter_map(|key| {
            let id = library::id_of(key)?;
            let raw = storage.get_item(key).ok().flatten()?;
            Some(library::read_entry(id, &raw))
        })
        .collect();
    library::sorted(entries)
}

/// Writes one entry; a full storage gets its own message, and leaves the old value in place.
pub(super) fn write(key: &str, text: &str) -> Result<(), String> {
    let storage = local_storage()?;
    storage.set_item(key, text).map_err(|e| {
        let name = e.dyn_ref::<web_sys::DomException>().map(|d| d.name()).unwrap_or_default();
        if name == "QuotaExceededError" {
            "this device's storage for Phasewise is full, so the last change is not saved (the copy before it is kept). Export or delete some jobs to make room.".to_string()
        } else {
            format!("the job could not be saved ({name})")
        }
    })
}

/// The job to open at start among the stored `entries`: the one open last, else the newest,
/// else the example; with its id and when it was saved.
pub fn startup_job(entries: &[Entry]) -> (Job, Option<(String, f64)>) {
    let last = local_storage()
        .ok()
        .and_then(|s| s.get_item(library::LAST_OPEN_KEY).ok().flatten());
    let good = |e: &Entry| match e {
        Entry::Good { id, saved } => {
            Some((saved.job.clone(), Some((id.clone(), saved.changed_ms))))
        }
        Entry::Damaged { .. } => None,
    };
    entries
        .iter()
        .find(|e| Some(e.id()) == last.as_deref())
        .and_then(good)
        .or_else(|| entries.iter().find_map(good))
        .unwrap_or_else(|| (crate::engine::demo::scrap_baler(), None))
}

/// The names of the stored jobs that read (damaged entries have none).
pub(super) fn stored_names(state: &JobState) -> Vec<String> {
    state.library.with_untracked(|l| {
        l.iter()
            .filter_map(|e| match e {
                Entry::Good { saved, .. } => Some(saved.job.name.clone()),
                Entry::Damaged { .. } => None,
            })
            .collect()
    })
}

/// The ids of every stored entry, damaged ones included, so a new id never takes theirs.
pub(super) fn stored_ids(state: &JobState) -> Vec<String> {
    state
        .library
        .with_untracked(|l| l.iter().map(|e| e.id().to_string()).collect())
}

pub(super) fn strs(v: &[String]) -> Vec<&str> {
    v.iter().map(String::as_str).collect()
}

/// Saves the open job under its id (a new one if it has none yet).
pub fn save_now(state: &JobState) {
    let id = state.current.get_untracked().unwrap_or_else(|| {
        let taken = stored_ids(state);
        library::new_id(now_ms(), &strs(&taken))
    });
    let at = now_ms();
    let text = match state.job.with_untracked(|j| library::entry_to_store(j, at)) {
        Ok(text) => text,
        Err(why) => {
            // A job never saved yet (a new, empty one) waits for its numbers: nothing is lost.
            state.save_note.set(if state.current.get_untracked().is_some() {
                SaveNote::Failed(why)
            } else {
                SaveNote::NotSaved
            });
            return;
        }
    };
    match write(&library::key_of(&id), &text) {
        Ok(()) => {
            let _ = write(library::LAST_OPEN_KEY, &id);
            state.last_written.set_value(Some(text));
            state.current.set(Some(id));
            state.save_note.set(SaveNote::Saved { at_ms: at });
            state.library.set(load_all());
        }
        Err(message) => state.save_note.set(SaveNote::Failed(message)),
    }
}

/// Writes an autosave that is still waiting for its moment (before the page reloads).
/// Not while another window's change waits for the user's choice.
pub fn flush_pending(state: &JobState) {
    if let Some(handle) = state.pending_save.get_value() {
        handle.clear();
        state.pending_save.set_value(None);
        if state.save_note.get_untracked() != SaveNote::Conflict {
            save_now(state);
        }
    }
}

/// Opens a stored job (without saving it again).
pub(super) fn open(state: &JobState, id: &str, job: Job) {
    // A waiting autosave belonged to the job being closed: callers flush it first where it
    // should be kept; here it must not fire for the job being opened.
    if let Some(handle) = state.pending_save.get_value() {
        handle.clear();
        state.pending_save.set_value(None);
    }
    state.replace_job(job);
    state.current.set(Some(id.to_string()));
    let _ = write(library::LAST_OPEN_KEY, id);
    let raw = local_storage()
        .ok()
        .and_then(|s| s.get_item(&library::key_of(id)).ok().flatten());
    state.last_written.set_value(raw);
    state.save_note.set(SaveNote::Saved { at_ms: now_ms() });
}

/// Starts the autosave (a moment after the last edit) and the watch on other windows.
pub fn keep_saved(state: JobState) {
    let timer = state.pending_save;
    Effect::new(move |first: Option<()>| {
        state.job.track();
        if first.is_none() || std::mem::take(&mut *state.skip_save.write_value()) {
            return;
        }
        if state.save_note.get_untracked() == SaveNote::Conflict {
            return;
        }
        // A user's edit makes an example theirs (the mark and the invented words go); this
        // runs the effect once more, which then saves it.
        if state.job.with_untracked(|j| j.example) {
            state.job.update(crate::engine::demo::claim);
            return;
        }
        if let Some(handle) = timer.get_value() {
            handle.clear();
        }
        let handle = set_timeout_with_handle(
            move || {
                timer.set_value(None);
                // Another window may have saved this job since the edit: then the user chooses.
                if state.save_note.get_untracked() != SaveNote::Conflict {
                    save_now(&state);
                }
            },
            std::time::Duration::from_millis(400),
        )
        .ok();
        timer.set_value(handle);
    });
    let listener =
        window_event_listener(leptos::ev::storage, move |event: web_sys::StorageEvent| {
            state.library.set(load_all());
            let Some(id) = state.current.get_untracked() else {
                return;
            };
            if event.key().as_deref() == Some(library::key_of(&id).as_str())
                && event.new_value() != state.last_written.get_value()
            {
                state.save_note.set(SaveNote::Conflict);
            }
        });
    on_cleanup(move || listener.remove());
}

/// Offers text as a file download.
fn download(name: &str, text: &str) {
    download_as(name, "application/json", text);
}

/// Offers text of a media type as a file download.
pub(super) fn download_as(name: &str, media_type: &str, text: &str) {
    let parts = js_sys::Array::of1(&wasm_bindgen::JsValue::from_str(text));
    let options = web_sys::BlobPropertyBag::new();
    options.set_type(media_type);
    let Ok(blob) = web_sys::Blob::new_with_str_sequence_and_options(&parts, &options) else {
        return;
    };
    let Ok(url) = web_sys::Url::create_object_url_with_blob(&blob) else {
        return;
    };
    if let Ok(a) = document().create_element("a") {
        if let Ok(a) = a.dyn_into::<web_sys::HtmlAnchorElement>() {
            a.set_href(&url);
            a.set_download(name);
            a.click();
        }
    }
    let _ = web_sys::Url::revoke_object_url(&url);
}

fn when(ms: f64) -> String {
    let date = js_sys::Date::new(&wasm_bindgen::JsValue::from_f64(ms));
    String::from(date.to_locale_string("en-GB", &wasm_bindgen::JsValue::UNDEFINED))
}

/// The line saying whether the open job is saved.
#[component]
pub fn SaveStatus() -> impl IntoView {
    let state = use_job();
    move || {
        let (class, text) = match state.save_note.get() {
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
    // A new job starts empty or as a copy of the open one: the user says which, and nothing
    // comes from the example unseen.
    let choosing = RwSignal::new(false);
    let start = move |job: Job| {
        flush_pending(&state);
        state.replace_job(job);
        state.current.set(None);
        state.save_note.set(SaveNote::NotSaved);
        choosing.set(false);
        save_now(&state);
    };
    let new_blank = move |_: leptos::ev::MouseEvent| {
        let taken = stored_names(&state);
        let (units, currency) = state.job.with_untracked(|j| (j.units, j.site.currency.clone()));
        start(Job::blank(library::unique_name("New job", &strs(&taken)), units, currency));
    };
    let new_copy = move |_: leptos::ev::MouseEvent| {
        let taken = stored_names(&state);
        let mut job = state.job.get_untracked();
        job.name = library::unique_name(&format!("{} (copy)", job.name), &strs(&taken));
        start(job);
    };
    let restore = move |_: leptos::ev::MouseEvent| {
        if let Some((id, raw)) = state.deleted_entry.get_untracked() {
            if write(&library::key_of(&id), &raw).is_ok() {
                state.deleted_entry.set(None);
                state.library.set(load_all());
            }
        }
    };
    view! {
        <section class="area" aria-labelledby="area-title">
            <div class="area-head">
                <h1 id="area-title">"Jobs on this device"</h1>
            </div>
            <SaveStatus />
            {move || state.notice.get().map(|(ok, text)| view! {
                <p class=if ok { "save-note" } else { "save-note failed" } role="status" data-share-note="true">{text}</p>
            })}
            <OfflineNote />
            <Conflict />
            <div class="card">
                <h2>"Open now"</h2>
                <TextField label="Job name" path="name" get=|j: &Job| j.name.clone() set=|j: &mut Job, v| j.name = v />
                <TextField label="Site" path="site.location" get=|j: &Job| j.site.location.clone() set=|j: &mut Job, v| j.site.location = v />
                <TextField label="Notes" path="notes" get=|j: &Job| j.notes.clone() set=|j: &mut Job, v| j.notes = v />
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
            {move || state.deleted_entry.get().map(|_| view! {
                <div class="undo-bar" role="status">
                    <span>"Job deleted."</span>
                    <button type="button" class="button" on:click=restore>"Undo"</button>
                </div>
            })}
            <ul class="job-list">
                {move || state.library.get().into_iter().map(|entry| view! { <JobRow entry=entry /> }).collect_view()}
            </ul>
        </section>
    }
}

#[component]
fn JobRow(entry: Entry) -> impl IntoView {
    let state = use_job();
    match entry {
        Entry::Good { id, saved } => {
            let is_open = {
                let id = id.clone();
                Memo::new(move |_| state.current.get().as_deref() == Some(id.as_str()))
            };
            let open_it = {
                let (id, job) = (id.clone(), saved.job.clone());
                move |_: leptos::ev::MouseEvent| {
                    flush_pending(&state);
                    open(&state, &id, job.clone())
                }
            };
            let duplicate = {
                let job = saved.job.clone();
                move |_: leptos::ev::MouseEvent| {
                    let taken = stored_names(&state);
                    let mut copy = job.clone();
                    copy.name = library::unique_name(&job.name, &strs(&taken));
                    let ids = stored_ids(&state);
                    let new = library::new_id(now_ms(), &strs(&ids));
                    if write(
                        &library::key_of(&new),
                        &library::write_entry(&copy, now_ms()),
                    )
                    .is_ok()
                    {
                        state.library.set(load_all());
                    }
                }
            };
            let delete = {
                let id = id.clone();
                move |_: leptos::ev::MouseEvent| {
                    let Ok(storage) = local_storage() else { return };
                    let key = library::key_of(&id);
                    if let Ok(Some(raw)) = storage.get_item(&key) {
                        let _ = storage.remove_item(&key);
                        state.deleted_entry.set(Some((id.clone(), raw)));
                        state.library.set(load_all());
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
                        state.library.set(load_all());
                        return;
                    };
                    let mut job = current.job.clone();
                    job.name = name.clone();
                    if let Some(problem) = crate::engine::validate::validate(&job)
                        .err()
                        .and_then(|errors| errors.into_iter().find(|e| e.field == "name"))
                    {
                        rename_problem.set(Some(problem.message));
                        return;
                    }
                    let others: Vec<String> = stored_names(&state)
                        .into_iter()
                        .filter(|n| *n != current.job.name)
                        .collect();
                    job.name = library::unique_name(&name, &strs(&others));
                    match write(&library::key_of(&id), &library::write_entry(&job, now_ms())) {
                        Ok(()) => {
                            renaming.set(false);
                            rename_problem.set(None);
                            state.library.set(load_all());
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
    let state = use_job();
    let keep_mine = move |_: leptos::ev::MouseEvent| {
        state.save_note.set(SaveNote::NotSaved);
        save_now(&state);
    };
    let take_theirs = move |_: leptos::ev::MouseEvent| {
        let Some(id) = state.current.get_untracked() else {
            return;
        };
        let raw = local_storage()
            .ok()
            .and_then(|s| s.get_item(&library::key_of(&id)).ok().flatten());
        match raw.map(|raw| library::read_entry(&id, &raw)) {
            Some(Entry::Good { saved, .. }) => open(&state, &id, saved.job),
            _ => state.save_note.set(SaveNote::Failed(
                "the other window's version cannot be read; yours is still here".into(),
            )),
        }
    };
    move || {
        (state.save_note.get() == SaveNote::Conflict).then(|| view! {
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
        let text = state.library.with_untracked(|l| {
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
            let taken = stored_names(&state);
            match library::parse_import(&text, &strs(&taken)) {
                Err(why) => message.set(Some((false, format!("Nothing imported: {why}.")))),
                Ok(jobs) => {
                    let mut ids = stored_ids(&state);
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
                    state.library.set(load_all());
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

/// A file name from a job name: letters, digits and dashes.
pub(super) fn file_stem(name: &str) -> String {
    let stem: String = name
        .chars()
        .map(|c| {
            if c.is_alphanumeric() {
                c.to_ascii_lowercase()
            } else {
                '-'
            }
        })
        .collect();
    let stem = stem
        .split('-')
        .filter(|s| !s.is_empty())
        .collect::<Vec<_>>()
        .join("-");
    if stem.is_empty() {
        "job".into()
    } else {
        stem
    }
}
