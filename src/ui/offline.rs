//! The app kept on the device: registers the service worker that the release build carries
//! (`service-worker.js`, written at build time by `cargo xtask seal`,
//! tests/harness/src/offline.rs), and tells the user when a newer version has been fetched and
//! is waiting.
//!
//! A newer build's worker installs beside the running one and waits; this module notices
//! (`updatefound`, then `installed` while a worker controls the page) and shows "A newer
//! version of Phasewise is ready on this device."; "Restart with it" writes any pending
//! autosave, asks the waiting worker to take over (`skipWaiting` on a message), and reloads on
//! `controllerchange` (or at once, if another window has already handed over). A worker that
//! started installing before the app registered (the browser checks as the page loads) is
//! watched too. The jobs area says whether the app is kept on the device
//! (`navigator.serviceWorker.ready`).
//!
//! Only release builds register the worker. A development build (`trunk serve`, on the same
//! address as `cargo xtask serve`) unregisters any worker a release build left there, so after
//! one reload it is never served a cached copy. Service workers need a secure page:
//! `https://`, or `http://127.0.0.1`/`localhost` as `cargo xtask serve` gives. On plain
//! `http://` from another machine the app runs but is not kept for offline use, and the jobs
//! area says so.
//!
//! The manifest (`public/manifest.webmanifest`) names the app, its colours (ink `#16222c`),
//! standalone display, and its icons: the SVG, 192 and 512 px PNGs and a 512 px maskable one
//! (the logo inside the safe zone), rendered from SVG by headless Chromium:
//! `chromium --headless=new --screenshot=icon-512.png --window-size=512,512 icon.html`.

use leptos::prelude::*;
use wasm_bindgen::prelude::*;
use wasm_bindgen::JsCast;
use wasm_bindgen_futures::JsFuture;
use web_sys::{ServiceWorkerContainer, ServiceWorkerRegistration, ServiceWorkerState};

/// What the page knows about its offline copy.
#[derive(Clone, Copy)]
pub struct Offline {
    /// Every file of this version is kept on the device: the app starts with no network.
    pub kept: RwSignal<bool>,
    /// A newer version is on the device, waiting for the user to restart with it.
    pub newer_waiting: RwSignal<bool>,
}

pub fn use_offline() -> Offline {
    expect_context::<Offline>()
}

/// The browser's service-worker container, where there is one (not on plain http from another
/// machine, nor in some private modes).
fn container() -> Option<ServiceWorkerContainer> {
    let navigator = window().navigator();
    js_sys::Reflect::has(&navigator, &JsValue::from_str("serviceWorker"))
        .unwrap_or(false)
        .then(|| navigator.service_worker())
}

/// Registers the worker and watches for a newer one.
pub fn start() -> Offline {
    let offline = Offline {
        kept: RwSignal::new(false),
        newer_waiting: RwSignal::new(false),
    };
    let Some(container) = container() else {
        return offline;
    };
    // A development build (`trunk serve`) changes on every save: caching it would only hide
    // the changes. It removes a worker that a release build on the same address left, so the
    // next reload comes from the server.
    if cfg!(debug_assertions) {
        wasm_bindgen_futures::spawn_local(async move {
            let Ok(found) = JsFuture::from(container.get_registration()).await else {
                return;
            };
            if let Ok(registration) = found.dyn_into::<ServiceWorkerRegistration>() {
                if let Ok(done) = registration.unregister() {
                    let _ = JsFuture::from(done).await;
                    leptos::logging::log!("development build: removed the offline copy a release build left; reload for fresh files");
                }
            }
        });
        return offline;
    }
    // A page that already had a worker is being updated when a new one installs; on the first
    // visit, the first worker installing is not news.
    let had_worker = container.controller().is_some();
    wasm_bindgen_futures::spawn_local(async move {
        let registration = match JsFuture::from(container.register("service-worker.js")).await {
            Ok(r) => r.unchecked_into::<ServiceWorkerRegistration>(),
            Err(e) => {
                leptos::logging::warn!("the app could not be kept for offline use: {e:?}");
                return;
            }
        };
        if registration.waiting().is_some() && had_worker {
            offline.newer_waiting.set(true);
        }
        let watched = registration.clone();
        let on_update = Closure::<dyn FnMut()>::new(move || {
            if let Some(worker) = watched.installing() {
                watch_install(worker, offline);
            }
        });
        registration.set_onupdatefound(Some(on_update.as_ref().unchecked_ref()));
        on_update.forget();
        // The browser looks for a new worker as the page loads, before the app registers: one
        // may be installing already, its `updatefound` gone by.
        if let Some(worker) = registration.installing() {
            watch_install(worker, offline);
        }
        if let Some(ready) = self::container().and_then(|c| c.ready().ok()) {
            if JsFuture::from(ready).await.is_ok() {
                offline.kept.set(true);
            }
        }
    });
    offline
}

fn container_controls() -> bool {
    container().and_then(|c| c.controller()).is_some()
}

/// Tells the page once `worker` has installed beside the one that controls the page.
fn watch_install(worker: web_sys::ServiceWorker, offline: Offline) {
    let this = worker.clone();
    let on_state = Closure::<dyn FnMut()>::new(move || {
        if this.state() == ServiceWorkerState::Installed && container_controls() {
            offline.newer_waiting.set(true);
        }
    });
    worker.set_onstatechange(Some(on_state.as_ref().unchecked_ref()));
    on_state.forget();
}

/// Hands over to the waiting version, then reloads once it has taken over.
fn restart_with_newer() {
    let Some(container) = container() else { return };
    let reload = Closure::<dyn FnMut()>::new(|| {
        let _ = window().location().reload();
    });
    container.set_oncontrollerchange(Some(reload.as_ref().unchecked_ref()));
    reload.forget();
    wasm_bindgen_futures::spawn_local(async move {
        let Ok(found) = JsFuture::from(container.get_registration()).await else {
            return;
        };
        let Some(registration) = found.dyn_into::<ServiceWorkerRegistration>().ok() else {
            return;
        };
        match registration.waiting() {
            Some(waiting) => {
                let message = js_sys::Object::new();
                let _ = js_sys::Reflect::set(&message, &"kind".into(), &"use-new-version".into());
                let _ = waiting.post_message(&message);
            }
            // Another window has already handed over: the newer version is in charge, so a
            // reload is all that is left.
            None => {
                let _ = window().location().reload();
            }
        }
    });
}

/// A strip at the top of the page while a newer version waits.
#[component]
pub fn NewerVersionNotice() -> impl IntoView {
    let offline = use_offline();
    let dismissed = RwSignal::new(false);
    let restart = move |_| {
        // Whatever was typed in the last moment is written before the page reloads.
        super::storage::flush_pending(&super::storage::use_storage());
        restart_with_newer();
    };
    view! {
        <Show when=move || offline.newer_waiting.get() && !dismissed.get()>
            <div class="newer-version" role="status">
                <p>"A newer version of Phasewise is ready on this device."</p>
                <div class="actions">
                    <button type="button" class="button primary" on:click=restart>"Restart with it"</button>
                    <button type="button" class="button" on:click=move |_| dismissed.set(true)>"Later"</button>
                </div>
            </div>
        </Show>
    }
}
