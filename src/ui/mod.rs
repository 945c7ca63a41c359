//! The Leptos front end: the app's frame, its navigation and its pages.
//!
//! The UI edits a job and shows what the engine returns; it holds no physics.

pub mod area;
mod charts;
mod cycle;
mod display;
mod drive;
pub mod field;
mod heat;
mod icons;
pub mod jobs;
mod lines;
mod motor_check;
mod offline;
mod parts;
mod power_unit;
mod pump_test;
mod quote;
mod report;
mod results;
mod safety;
mod share;
mod shared;
mod staging_panel;
pub mod state;
mod storage;
mod undo;
mod valve_settings;

use area::Area;
use icons::{area_icon, CautionIcon, Logo};
use leptos::prelude::*;

/// The whole app: a top bar with the safety link, the current area's page, and the
/// navigation bar (at the bottom on a phone, at the side on a wider screen).
#[component]
pub fn App() -> impl IntoView {
    // The job open last, else the newest saved, else (first start) the example.
    // Storage is read once at start: for the job to open and for the library list.
    let entries = storage::load_all();
    let (job, saved) = storage::startup_job(&entries);
    let state = state::JobState::new(job);
    provide_context(state);
    let kept = storage::Storage::new(state, saved, entries);
    provide_context(kept);
    storage::keep_saved(kept);
    let display = display::keep_display();
    provide_context(display);
    provide_context(offline::start());
    let area = RwSignal::new(area_in_address());
    let fetching = parts::Fetching(RwSignal::new(false));
    provide_context(fetching);
    // A job arriving by a share link is taken in (from its part); the address then names the
    // jobs area.
    let take_in = move || {
        let fragment = window().location().hash().unwrap_or_default();
        parts::receive_shared(kept, fragment, move || area.set(area_in_address()));
    };
    take_in();

    let listener = window_event_listener(leptos::ev::hashchange, move |_| {
        // A share link pasted into the address bar of an open app.
        take_in();
        area.set(area_in_address());
        // A new area starts at its top, as a new page would.
        window().scroll_to_with_x_and_y(0.0, 0.0);
    });
    on_cleanup(move || listener.remove());

    Effect::new(move |_| document().set_title(&format!("{} · Phasewise", area.get().title())));

    let marks_current = move |this: Area| move || (area.get() == this).then_some("page");

    view! {
        <div
            class="shell"
            class:presenter=move || display.with(|d| d.presenter)
            class:contrast=move || display.with(|d| d.high_contrast)
        >
            <header class="topbar">
                <a class="brand" href=Area::START.href() aria-label="Phasewise: back to the start">
                    <Logo />
                    <span class="brand-name">"Phasewise"</span>
                </a>
                <a
                    class="safety-link"
                    href=Area::Safety.href()
                    aria-current=marks_current(Area::Safety)
                >
                    <CautionIcon />
                    <span>{Area::Safety.nav_label()}</span>
                </a>
            </header>
            <main
                id="main"
                class="page"
                data-area=move || area.get().slug()
                aria-busy=move || fetching.0.get().then_some("true")
            >
                <offline::NewerVersionNotice />
                {move || parts::page(area.get())}
            </main>
            // Beside an area where figures are typed, the figures they move.
            {move || (display.with(|d| d.presenter) && area.get().takes_figures())
                .then(|| view! { <results::PresenterPanel /> })}
            <nav class="areas" aria-label="Areas">
                {Area::NAV
                    .into_iter()
                    .map(|this| {
                        view! {
                            <a class="area-link" href=this.href() aria-current=marks_current(this)>
                                {area_icon(this)}
                                <span class="area-label">{this.nav_label()}</span>
                            </a>
                        }
                    })
                    .collect_view()}
            </nav>
        </div>
    }
}

/// The area named by the page's address.
fn area_in_address() -> Area {
    Area::from_fragment(&window().location().hash().unwrap_or_default())
}
