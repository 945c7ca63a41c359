//! How the app is shown, apart from the job: the presenter view and high contrast, kept on
//! the device, and the switches that change them. Its own context (`RwSignal<Display>`).
//!
//! The presenter view (one switch in the results area, "Presenter view"; kept under
//! `phasewise.display`, read at start): large type, results first, and beside
//! the cycle, power-unit and valve-settings areas a panel (`results::PresenterPanel`) with the
//! shown power unit's headline figures, each with the value it had when the field now being
//! changed was entered (a struck-through ghost: typing "250" compares with the figure before
//! the "2", not after the "25"), and its ledger chart, so a change and what it moves share one
//! 1920x1080 screen; the floating figures strip steps aside there.
//! Size rule (style/main.css): farthest seat at 6 image heights (common practice), a capital
//! there at least 10 arcminutes (twice the acuity-1.0 letter of ISO 8596): a cap height of
//! 18.9 px on a 1080-line image, about 0.7 of the font size, so no text under 27 px. The
//! browser test measures every visible text, chart text scaled as drawn.

use leptos::prelude::*;

/// How the app is shown; not part of the job, but kept on the device (`DISPLAY_KEY`) so a
/// workshop's projector opens in the presenter view it was left in.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default, serde::Serialize, serde::Deserialize)]
pub struct Display {
    /// Type legible from the back of a room, results first, and beside an area where figures
    /// are typed, the figures and chart they move (see the module doc).
    #[serde(default)]
    pub presenter: bool,
    /// Black, white and yellow, for glare or a dim corner.
    #[serde(default)]
    pub high_contrast: bool,
}

/// Where the display switches are kept on the device.
pub const DISPLAY_KEY: &str = "phasewise.display";

impl Display {
    /// The switches as kept on the device (none kept, or unreadable: the plain view).
    pub fn from_stored(text: Option<&str>) -> Display {
        text.and_then(|t| serde_json::from_str(t).ok())
            .unwrap_or_default()
    }
}

/// The switches as the device last kept them, kept again on each change.
pub fn keep_display() -> RwSignal<Display> {
    use gloo_storage::Storage as _;
    let stored = gloo_storage::LocalStorage::raw()
        .get_item(DISPLAY_KEY)
        .ok()
        .flatten();
    let display = RwSignal::new(Display::from_stored(stored.as_deref()));
    Effect::new(move |_| {
        let shown = display.get();
        if let Ok(text) = serde_json::to_string(&shown) {
            // A full or refused storage only forgets the switch; nothing else depends on it.
            let _ = gloo_storage::LocalStorage::raw().set_item(DISPLAY_KEY, &text);
        }
    });
    display
}

pub fn use_display() -> RwSignal<Display> {
    expect_context::<RwSignal<Display>>()
}

/// The display switches: presenter view and high contrast.
#[component]
pub fn DisplaySwitches() -> impl IntoView {
    let display = use_display();
    let toggle = move |name: &'static str, get: fn(&Display) -> bool, flip: fn(&mut Display)| {
        view! {
            <button
                type="button"
                class="toggle"
                aria-pressed=move || if display.with(get) { "true" } else { "false" }
                on:click=move |_| display.update(flip)
            >
                {name}
            </button>
        }
    };
    view! {
        <div class="segmented" role="group" aria-label="Display">
            {toggle("Presenter view", |d| d.presenter, |d| d.presenter = !d.presenter)}
            {toggle("High contrast", |d| d.high_contrast, |d| d.high_contrast = !d.high_contrast)}
        </div>
    }
}
