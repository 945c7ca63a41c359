//! How the app is shown, apart from the job: the presenter view and high contrast, kept on
//! the device, and the switches that change them. Its own context (`RwSignal<Display>`).

use leptos::prelude::*;

/// How the app is shown; not part of the job, but kept on the device (`DISPLAY_KEY`) so a
/// workshop's projector opens in the presenter view it was left in.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default, serde::Serialize, serde::Deserialize)]
pub struct Display {
    /// Type legible from the back of a room, results first, and beside an area where figures
    /// are typed, the figures and chart they move (see DEVELOPERS.md, "Presenter view").
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
        text.and_then(|t| serde_json::from_str(t).ok()).unwrap_or_default()
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
