//! The safety cautions: what anyone adjusting a hydraulic power unit must keep in mind,
//! and what the app's figures are (estimates) and are not (a licence to exceed a rating).

use leptos::prelude::*;

/// The hazards and rules, each a short sentence a technician can take in at a glance.
pub const CAUTIONS: [(&str, &str); 5] = [
    (
        "Oil under pressure cuts and injects.",
        "A pinhole leak or a loose fitting can push oil through skin. It looks small and is not: \
         get medical help at once and say it is a high-pressure injection injury. Never feel for \
         a leak with your hand.",
    ),
    (
        "Stored energy stays after the motor stops.",
        "Accumulators, trapped oil and raised loads keep their energy. A hose that lets go can \
         whip; a load held by oil can drop when a valve opens. Keep clear of both.",
    ),
    (
        "Lock out before you adjust.",
        "Settings are changed only by a qualified person, with the machine locked out and tagged \
         and every pressure released, accumulators included.",
    ),
    (
        "Stay under every rating.",
        "No valve is ever set above the rating of the weakest part on its line: pumps, hoses, \
         fittings, cylinders and valves.",
    ),
    (
        "Come up slowly, confirm on a gauge.",
        "After a change, raise pressure in small steps and check it on a gauge you trust \
         (common practice).",
    ),
];

/// What the figures are, and what comes before them.
pub const ESTIMATE_NOTE: &str =
    "Phasewise's figures are engineering estimates worked from what you enter. \
     The makers' data for each component, local codes and licensed practice come first: where \
     they differ from this app, follow them.";

/// The cautions page, reachable from the top bar of every area.
#[component]
pub fn SafetyPage() -> impl IntoView {
    view! {
        <section class="safety" aria-labelledby="safety-title">
            <h1 id="safety-title">"Safety"</h1>
            <p class="purpose">
                "Hydraulic machines store energy and run at pressures that injure. "
                "Read this before you change any setting."
            </p>
            <ol class="caution-list">
                {CAUTIONS
                    .into_iter()
                    .map(|(rule, detail)| {
                        view! {
                            <li class="caution">
                                <strong>{rule}</strong>
                                " "
                                <span>{detail}</span>
                            </li>
                        }
                    })
                    .collect_view()}
            </ol>
            <p class="estimate-note">{ESTIMATE_NOTE}</p>
        </section>
    }
}
