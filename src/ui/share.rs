//! Sharing a job by link and QR code, and taking in a job that arrives by a link. The packing
//! and the QR modules come from [`crate::formats::share`]; this only shows them and stores the job.
//!
//! On start, and on a `hashchange`, [`receive`] reads a `#share=` fragment with
//! `share::unpack` (inflated to at most the import limit, then `library::parse_import`, so the
//! same checks as a file), stores the job (or opens the stored one it equals, its name aside
//! from a " (2)" given on arrival, so a link opened twice adds one job), says so in the jobs
//! area, and replaces the address with `#/jobs` so a reload does not add it again.
//!
//! The QR code stays black on white in every display mode, and "Show the code large" fills
//! the screen for a projector.

use super::state::use_job;
use super::storage::{load_all, now_ms, open, stored_ids, stored_names, strs, write, Storage};
use crate::engine::Job;
use crate::formats::library::{self, Entry};
use crate::formats::share;
use leptos::prelude::*;
use wasm_bindgen::JsValue;

/// If `fragment` carries a job, adds it to the jobs on this device (or opens the stored one it
/// equals, so opening a link twice adds it once) and says so; then takes the job out of the
/// address, so a reload does not bring it in again. False when the fragment carries none.
pub fn receive(storage: &Storage, fragment: &str) -> bool {
    let Some(payload) = share::payload_in(fragment) else {
        return false;
    };
    // What was typed in the open job a moment ago is written before another job opens.
    super::storage::flush_pending(storage);
    let notice = match share::unpack(payload, &[]) {
        Err(why) => (
            false,
            format!("The shared link could not be read: {why}. Nothing was added."),
        ),
        Ok(job) => {
            // The same job, perhaps stored under " (2)" because its name was taken on arrival.
            let same = storage.library.with_untracked(|l| {
                l.iter().find_map(|e| match e {
                    Entry::Good { id, saved }
                        if library::is_name_of(&saved.job.name, &job.name)
                            && Job {
                                name: job.name.clone(),
                                ..saved.job.clone()
                            } == job =>
                    {
                        Some(id.clone())
                    }
                    _ => None,
                })
            });
            if let Some((id, stored)) =
                same.and_then(|id| stored_job(storage, &id).map(|j| (id, j)))
            {
                let name = stored.name.clone();
                open(storage, &id, stored);
                (
                    true,
                    format!(
                        "“{name}” from the shared link is already on this device; it is open now."
                    ),
                )
            } else {
                let mut job = job;
                job.name = library::unique_name(&job.name, &strs(&stored_names(storage)));
                let id = library::new_id(now_ms(), &strs(&stored_ids(storage)));
                match write(&library::key_of(&id), &library::write_entry(&job, now_ms())) {
                    Ok(()) => {
                        storage.library.set(load_all());
                        let name = job.name.clone();
                        open(storage, &id, job);
                        (
                            true,
                            format!("Added “{name}” from the shared link; it is open now."),
                        )
                    }
                    Err(why) => (false, format!("The shared job was not added: {why}")),
                }
            }
        }
    };
    storage.notice.set(Some(notice));
    if let Ok(history) = window().history() {
        let _ = history.replace_state_with_url(&JsValue::NULL, "", Some("#/jobs"));
    }
    true
}

/// The stored job under `id`, as the library last read it.
fn stored_job(storage: &Storage, id: &str) -> Option<Job> {
    storage.library.with_untracked(|l| {
        l.iter().find_map(|e| match e {
            Entry::Good { id: this, saved } if this == id => Some(saved.job.clone()),
            _ => None,
        })
    })
}

/// The page's address without its fragment: where a share link points.
fn app_address() -> String {
    let location = window().location();
    format!(
        "{}{}",
        location.origin().unwrap_or_default(),
        location.pathname().unwrap_or_default()
    )
}

/// Puts text on the clipboard where the browser allows it (a secure page, a user's tap).
fn copy_to_clipboard(text: &str) -> bool {
    let navigator = window().navigator();
    let Ok(clipboard) = js_sys::Reflect::get(&navigator, &"clipboard".into()) else {
        return false;
    };
    let Ok(write_text) = js_sys::Reflect::get(&clipboard, &"writeText".into()) else {
        return false;
    };
    let Some(write_text) = wasm_bindgen::JsCast::dyn_ref::<js_sys::Function>(&write_text) else {
        return false;
    };
    write_text
        .call1(&clipboard, &JsValue::from_str(text))
        .is_ok()
}

/// The open job as a link and a QR code, made when asked and kept up to date while shown.
#[component]
pub fn SharePanel() -> impl IntoView {
    let state = use_job();
    let shown = RwSignal::new(false);
    let large = RwSignal::new(false);
    let copied = RwSignal::new(false);
    let address = StoredValue::new(app_address());
    // No link for a job that would not read back (a field holds no number yet): say why.
    let made = Memo::new(move |_| {
        shown.get().then(|| {
            state.job.with(|job| {
                crate::formats::library::job_file(job)
                    .map(|_| share::link(&address.get_value(), job))
            })
        })
    });
    let link = Memo::new(move |_| made.get().and_then(Result::ok));
    let blocked = move || made.get().and_then(Result::err);
    let drawing = Memo::new(move |_| link.get().map(|l| share::qr(&l)));
    let copy = move |_: leptos::ev::MouseEvent| {
        if let Some(l) = link.get_untracked() {
            copied.set(copy_to_clipboard(&l));
        }
    };
    view! {
        <div class="card share">
            <h2>"Share this job"</h2>
            <p class="hint">"The link holds the whole job. Whoever opens it in Phasewise gets a copy on their device; nothing is sent anywhere else."</p>
            <Show
                when=move || shown.get()
                fallback=move || view! {
                    <button type="button" class="button" data-action="make-link" on:click=move |_| shown.set(true)>"Make a link and a QR code"</button>
                }
            >
                <div class="field">
                    <label for="share-link">"Link"</label>
                    <input id="share-link" type="text" readonly prop:value=move || link.get().unwrap_or_default() on:focus={|ev: leptos::ev::FocusEvent| event_target::<web_sys::HtmlInputElement>(&ev).select()} />
                </div>
                <div class="row-tools">
                    <button type="button" class="button" on:click=copy>{move || if copied.get() { "Copied" } else { "Copy the link" }}</button>
                    <button type="button" class="button" data-action="qr-large" on:click=move |_| large.set(true)>"Show the code large"</button>
                </div>
                {move || blocked().map(|why| view! {
                    <p class="save-note failed" role="status" data-share-blocked="true">{format!("No link yet: {why}.")}</p>
                })}
                {move || match drawing.get() {
                    Some(Ok(qr)) => view! {
                        <button
                            type="button"
                            class="qr-frame"
                            class:large=move || large.get()
                            aria-label="QR code of the share link; tap to close the large view"
                            on:click=move |_| large.set(false)
                        >
                            <svg class="qr" viewBox=format!("0 0 {0} {0}", qr.size) role="img" aria-hidden="true" shape-rendering="crispEdges">
                                <rect width=qr.size height=qr.size fill="#fff" />
                                <path d=qr.path fill="#000" />
                            </svg>
                        </button>
                    }.into_any(),
                    Some(Err(why)) => view! { <p class="save-note failed">{why}</p> }.into_any(),
                    None => ().into_any(),
                }}
            </Show>
        </div>
    }
}
