//! The parts of the app that load on demand, so the first screen waits only for what it shows.
//!
//! The first screen is the frame, the machine cycle (where a new visitor starts) and the safety
//! cautions (always at hand, even if a part cannot be fetched). Every other area's page, and
//! taking in a shared job, is a split point: its code sits in a wasm part of its own, fetched
//! the first time it is opened (`cargo xtask seal` splits the module after the build, see
//! tests/harness/src/split.rs). The service worker keeps every part on the device from the
//! first visit, so opening one offline works as before.
//!
//! Each split point is `fallible`: a part that cannot be fetched (no network, and the worker
//! has not kept it yet) is said so on the page, with a retry, instead of stopping the app.
//! Code shared by several parts goes into shared parts; code the first screen uses as well
//! stays in the first part.

use super::area::Area;
use super::storage::Storage;
use leptos::prelude::*;
use leptos::wasm_split::{wasm_split, SplitLoaderError};

/// Whether a part is being fetched for the page: the page says it is busy meanwhile
/// (`aria-busy`, for screen readers and for the browser tests).
#[derive(Clone, Copy)]
pub struct Fetching(pub RwSignal<bool>);

/// A part of the app that could not be fetched (the loader's own words are in the console).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct PartMissing;

impl From<SplitLoaderError> for PartMissing {
    fn from(_: SplitLoaderError) -> PartMissing {
        PartMissing
    }
}

/// An area's page: built at once when the first screen has it, else from its part, with a
/// short notice while the part arrives.
pub fn page(area: Area) -> AnyView {
    match area {
        Area::Cycle => view! { <super::cycle::CycleArea /> }.into_any(),
        Area::Safety => view! { <super::safety::SafetyPage /> }.into_any(),
        other => view! { <OnDemand area=other /> }.into_any(),
    }
}

#[component]
fn OnDemand(area: Area) -> impl IntoView {
    // Bumped by "Try again", which fetches the part anew.
    let attempt = RwSignal::new(0u32);
    let fetching = use_context::<Fetching>().map(|f| f.0);
    let busy = move |on: bool| {
        if let Some(f) = fetching {
            f.set(on)
        }
    };
    // Another area opened before this one's part arrived.
    on_cleanup(move || busy(false));
    view! {
        <Suspense fallback=|| view! { <p class="part-loading" role="status">"Opening…"</p> }>
            {move || {
                attempt.track();
                Suspend::new(async move {
                    busy(true);
                    let loaded = load(area).await;
                    busy(false);
                    match loaded {
                        Ok(page) => page,
                        Err(PartMissing) => view! {
                            <section class="area" aria-labelledby="area-title">
                                <h1 id="area-title">{area.title()}</h1>
                                <div class="part-missing" role="alert">
                                    <p>
                                        "This part of Phasewise is not on this device yet and could not be fetched. "
                                        "Connect to a network once and try again; after that it works offline."
                                    </p>
                                    <button
                                        type="button"
                                        class="button primary"
                                        on:click=move |_| attempt.update(|n| *n += 1)
                                    >
                                        "Try again"
                                    </button>
                                </div>
                            </section>
                        }
                        .into_any(),
                    }
                })
            }}
        </Suspense>
    }
}

/// The page of an area from its part.
async fn load(area: Area) -> Result<AnyView, PartMissing> {
    match area {
        Area::PowerUnit => power_unit().await,
        Area::Results => results().await,
        Area::Settings => settings().await,
        Area::PumpTest => pump_test().await,
        Area::MotorCheck => motor_check().await,
        Area::Heat => heat().await,
        Area::Quote => quote().await,
        Area::Report => report().await,
        Area::Jobs => jobs().await,
        Area::Cycle | Area::Safety => Ok(page(area)),
    }
}

// Four parts, each fetched whole the first time one of its areas opens: the power unit
// (opened right after the cycle); the answers (results, valve settings with the staging
// search, oil and heat, the quote and its report); the field checks (pump test, motor check);
// and the jobs (the library, import and export, sharing and its QR code, and taking in a shared
// link). One part per area measured 87 shared chunks, many of a few hundred bytes, each one
// more request on a slow link; areas opened together share a part instead.

/// An area's page as a split point in `part`: `name()` loads the part, then builds the page.
macro_rules! page_in_part {
    ($name:ident, $part:ident, $($area:ident)::+) => {
        #[wasm_split($part, wasm_split_path = ::leptos::wasm_split, fallible)]
        fn $name() -> Result<AnyView, PartMissing> {
            Ok($($area)::+().into_any())
        }
    };
}

page_in_part!(power_unit, power_unit, super::power_unit::UnitArea);
page_in_part!(results, answers, super::results::ResultsArea);
page_in_part!(settings, answers, super::valve_settings::SettingsArea);
page_in_part!(heat, answers, super::heat::HeatArea);
page_in_part!(quote, answers, super::quote::QuoteArea);
page_in_part!(report, answers, super::report::ReportArea);
page_in_part!(pump_test, field_checks, super::pump_test::PumpCheckArea);
page_in_part!(motor_check, field_checks, super::motor_check::MotorCheckArea);
page_in_part!(jobs, jobs, super::jobs::JobsArea);

/// Takes in a job that arrived by a share link (see [`super::share::receive`]); true when the
/// fragment carried one.
#[wasm_split(jobs, wasm_split_path = ::leptos::wasm_split, fallible)]
fn take_in_shared(storage: Storage, fragment: String) -> Result<bool, PartMissing> {
    Ok(super::share::receive(&storage, &fragment))
}

/// Takes in the job a share link in `fragment` carries, if any, from its part; `then` runs
/// once it is in (the address then names the jobs area). A part that cannot be fetched leaves
/// the link in the address, to be taken in on the next start.
pub fn receive_shared(storage: Storage, fragment: String, then: impl FnOnce() + 'static) {
    if crate::formats::share::payload_in(&fragment).is_none() {
        return;
    }
    leptos::task::spawn_local(async move {
        match take_in_shared(storage, fragment).await {
            Ok(_) => then(),
            Err(PartMissing) => storage.notice.set(Some((
                false,
                "The shared link could not be opened yet: connect to a network and reload the page."
                    .into(),
            ))),
        }
    });
}
