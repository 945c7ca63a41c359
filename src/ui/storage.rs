//! Jobs kept on this device: the storage I/O around [`crate::formats::library`], the autosave,
//! the watch on other windows, and files offered for download. Its own context ([`Storage`]),
//! apart from the open job's ([`JobState`]) and from the jobs area that shows it.
//!
//! - Opening or starting a job goes through `JobState::replace_job` (here through
//!   [`Storage::replace_job`], with no autosave for the change itself), which drops everything
//!   kept for the job before (its last good report, undo, typed text).
//! - The autosave ([`keep_saved`]) writes 400 ms after the last edit, only an entry that reads
//!   back equal (`library::entry_to_store`); while a field is left empty or holds text the
//!   copy saved before is kept and the jobs area says why.
//! - A write that fails because storage is full says so at the save status and leaves the old
//!   value in place (a failed `setItem` changes nothing), so the last good copy is what
//!   reloads.
//! - A `storage` event for the open job's key with text this window did not write means
//!   another window saved it: autosave stops and the user chooses "load the other window's
//!   version" or "keep mine and save it" (in the jobs area).
//! - Downloads are offered from here: a job file, all jobs, a damaged entry as found; the
//!   ledger of the design shown downloads as CSV from the results area
//!   (`formats::ledger_csv`): a row per phase and a whole-cycle row of time-weighted averages,
//!   in the units shown.

use super::state::JobState;
use crate::engine::Job;
use crate::formats::library::{self, Entry};
use gloo_storage::Storage as _;
use leptos::prelude::*;
use wasm_bindgen::JsCast;

/// What this device keeps of the jobs, and how the open job stands against it.
#[derive(Clone, Copy)]
pub struct Storage {
    /// The open job, which the autosave keeps.
    pub state: JobState,
    /// The stored id of the open job; none until it is first saved.
    pub current: RwSignal<Option<String>>,
    pub save_note: RwSignal<SaveNote>,
    /// What storage holds, as last read.
    pub library: RwSignal<Vec<Entry>>,
    /// The text this window last wrote for the open job: a storage event with other text
    /// means another window changed it.
    pub last_written: StoredValue<Option<String>>,
    /// Set when the job is replaced by an opened one, so the autosave does not fire for it.
    pub skip_save: StoredValue<bool>,
    /// The last job entry deleted from the library (id, stored text), until undone.
    pub deleted_entry: RwSignal<Option<(String, String)>>,
    /// A one-off message for the jobs area (a job arrived by a link, or a link was unreadable):
    /// whether it is good news, and the sentence.
    pub notice: RwSignal<Option<(bool, String)>>,
    /// The autosave waiting for the edits to pause, if one is.
    pub pending_save: StoredValue<Option<leptos::prelude::TimeoutHandle>>,
}

impl Storage {
    /// The storage of the open job `state`, stored under `saved` (its id and when it was saved)
    /// if it is, with what storage holds.
    pub fn new(state: JobState, saved: Option<(String, f64)>, library: Vec<Entry>) -> Storage {
        Storage {
            state,
            save_note: RwSignal::new(match saved {
                Some((_, at_ms)) => SaveNote::Saved { at_ms },
                None => SaveNote::NotSaved,
            }),
            current: RwSignal::new(saved.map(|(id, _)| id)),
            library: RwSignal::new(library),
            last_written: StoredValue::new(None),
            skip_save: StoredValue::new(false),
            deleted_entry: RwSignal::new(None),
            pending_save: StoredValue::new(None),
            notice: RwSignal::new(None),
        }
    }

    /// Puts another job in place of the open one (opened, or started new), with no autosave
    /// for the change itself.
    pub fn replace_job(&self, job: Job) {
        self.skip_save.set_value(true);
        self.state.replace_job(job);
    }
}

pub fn use_storage() -> Storage {
    expect_context::<Storage>()
}

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
pub(super) fn stored_names(storage: &Storage) -> Vec<String> {
    storage.library.with_untracked(|l| {
        l.iter()
            .filter_map(|e| match e {
                Entry::Good { saved, .. } => Some(saved.job.name.clone()),
                Entry::Damaged { .. } => None,
            })
            .collect()
    })
}

/// The ids of every stored entry, damaged ones included, so a new id never takes theirs.
pub(super) fn stored_ids(storage: &Storage) -> Vec<String> {
    storage
        .library
        .with_untracked(|l| l.iter().map(|e| e.id().to_string()).collect())
}

pub(super) fn strs(v: &[String]) -> Vec<&str> {
    v.iter().map(String::as_str).collect()
}

/// Saves the open job under its id (a new one if it has none yet).
pub fn save_now(storage: &Storage) {
    let id = storage.current.get_untracked().unwrap_or_else(|| {
        let taken = stored_ids(storage);
        library::new_id(now_ms(), &strs(&taken))
    });
    let at = now_ms();
    let text = match storage
        .state
        .job
        .with_untracked(|j| library::entry_to_store(j, at))
    {
        Ok(text) => text,
        Err(why) => {
            // A job never saved yet (a new, empty one) waits for its numbers: nothing is lost.
            storage
                .save_note
                .set(if storage.current.get_untracked().is_some() {
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
            storage.last_written.set_value(Some(text));
            storage.current.set(Some(id));
            storage.save_note.set(SaveNote::Saved { at_ms: at });
            storage.library.set(load_all());
        }
        Err(message) => storage.save_note.set(SaveNote::Failed(message)),
    }
}

/// Writes an autosave that is still waiting for its moment (before the page reloads).
/// Not while another window's change waits for the user's choice.
pub fn flush_pending(storage: &Storage) {
    if let Some(handle) = storage.pending_save.get_value() {
        handle.clear();
        storage.pending_save.set_value(None);
        if storage.save_note.get_untracked() != SaveNote::Conflict {
            save_now(storage);
        }
    }
}

/// Opens a stored job (without saving it again).
pub(super) fn open(storage: &Storage, id: &str, job: Job) {
    // A waiting autosave belonged to the job being closed: callers flush it first where it
    // should be kept; here it must not fire for the job being opened.
    if let Some(handle) = storage.pending_save.get_value() {
        handle.clear();
        storage.pending_save.set_value(None);
    }
    storage.replace_job(job);
    storage.current.set(Some(id.to_string()));
    let _ = write(library::LAST_OPEN_KEY, id);
    let raw = local_storage()
        .ok()
        .and_then(|s| s.get_item(&library::key_of(id)).ok().flatten());
    storage.last_written.set_value(raw);
    storage.save_note.set(SaveNote::Saved { at_ms: now_ms() });
}

/// Starts the autosave (a moment after the last edit) and the watch on other windows.
pub fn keep_saved(storage: Storage) {
    let timer = storage.pending_save;
    Effect::new(move |first: Option<()>| {
        storage.state.job.track();
        if first.is_none() || std::mem::take(&mut *storage.skip_save.write_value()) {
            return;
        }
        if storage.save_note.get_untracked() == SaveNote::Conflict {
            return;
        }
        // A user's edit makes an example theirs (the mark and the invented words go); this
        // runs the effect once more, which then saves it.
        if storage.state.job.with_untracked(|j| j.example) {
            storage.state.job.update(crate::engine::demo::claim);
            return;
        }
        if let Some(handle) = timer.get_value() {
            handle.clear();
        }
        let handle = set_timeout_with_handle(
            move || {
                timer.set_value(None);
                // Another window may have saved this job since the edit: then the user chooses.
                if storage.save_note.get_untracked() != SaveNote::Conflict {
                    save_now(&storage);
                }
            },
            std::time::Duration::from_millis(400),
        )
        .ok();
        timer.set_value(handle);
    });
    let listener =
        window_event_listener(leptos::ev::storage, move |event: web_sys::StorageEvent| {
            storage.library.set(load_all());
            let Some(id) = storage.current.get_untracked() else {
                return;
            };
            if event.key().as_deref() == Some(library::key_of(&id).as_str())
                && event.new_value() != storage.last_written.get_value()
            {
                storage.save_note.set(SaveNote::Conflict);
            }
        });
    on_cleanup(move || listener.remove());
}

/// Offers text as a file download.
pub(super) fn download(name: &str, text: &str) {
    download_as(name, "application/json", text);
}

/// Offers text of a media type as a file download.
pub fn download_as(name: &str, media_type: &str, text: &str) {
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

/// A file name from a job name: letters, digits and dashes.
pub fn file_stem(name: &str) -> String {
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
