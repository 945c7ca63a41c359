//! The app's pictures, drawn as inline SVG so they need no file, no font and no network.
//! Line icons on a 24-unit grid take their colour from the text around them. Only the pump is
//! drawn after an ISO 1219-1 symbol, and drawn as the standard draws it; the rest are pictures
//! (a loop, bars, a dial, a trace, a sheet, a folder) that resemble none of its symbols.

use super::area::Area;
use leptos::prelude::*;

/// The Phasewise mark: a cycle's pressure trace stepping through its phases.
#[component]
pub fn Logo() -> impl IntoView {
    view! {
        <svg class="logo" viewBox="0 0 32 32" width="32" height="32" aria-hidden="true">
            <rect x="1" y="1" width="30" height="30" rx="8" class="logo-plate" />
            <path d="M6 22h5V9h7v5h4v8h4" class="logo-trace" />
        </svg>
    }
}

/// The warning triangle beside the safety link.
#[component]
pub fn CautionIcon() -> impl IntoView {
    line_icon(CAUTION)
}

/// A warning triangle with an exclamation mark.
const CAUTION: &str = "M12 3.5 22 20.5H2Z M12 10v4.5 M12 17.5v.01";

/// The icon of an area in the navigation bar.
pub fn area_icon(area: Area) -> AnyView {
    line_icon(match area {
        // A loop closing on itself: the repeating machine cycle.
        Area::Cycle => "M19.5 12a7.5 7.5 0 1 1-2.2-5.3 M19.5 4v4h-4",
        // A hydraulic pump as ISO 1219-1 draws one: a circle with the flow triangle pointing
        // out, filled (a hollow triangle means air).
        Area::PowerUnit => return pump_icon().into_any(),
        // Stacked bars: the power ledger.
        Area::Results => "M4 20h16 M7 17v-6 M12 17V6 M17 17v-9",
        // A gauge dial and needle: pressure settings.
        Area::Settings => "M4.5 17a7.5 7.5 0 1 1 15 0 M12 17l3.5-4.5 M4 20h16",
        // A meter trace: readings taken from a running pump.
        Area::PumpTest => "M3 13h4l2.5-6 4 11 2.5-5H21",
        // A circle with a tick for the shaft and a lead out: a motor being read.
        Area::MotorCheck => "M12 5a7 7 0 1 1 0 14a7 7 0 1 1 0-14 M12 12l3-3 M19 12h3",
        // A thermometer with its bulb: the oil's temperature.
        Area::Heat => "M10 4a2 2 0 0 1 4 0v10a4 4 0 1 1-4 0Z M12 9v7",
        // A sheet with a total line under two figures: the quote.
        Area::Quote | Area::Report => "M6 3h9l3 3v15H6Z M9 10h6 M9 13.5h6 M9 17.5h6",
        // A folder: jobs kept on the device.
        Area::Jobs => "M3 6.5h6l2 2h10V19H3Z",
        Area::Safety => CAUTION,
    })
    .into_any()
}

fn pump_icon() -> impl IntoView {
    view! {
        <svg class="icon" viewBox="0 0 24 24" width="24" height="24" aria-hidden="true">
            <path d="M12 4.5a7.5 7.5 0 1 1 0 15a7.5 7.5 0 1 1 0-15" />
            <path class="flow-triangle" d="M12 4.5l3 5h-6Z" />
        </svg>
    }
}

fn line_icon(path: &'static str) -> impl IntoView {
    view! {
        <svg class="icon" viewBox="0 0 24 24" width="24" height="24" aria-hidden="true">
            <path d=path />
        </svg>
    }
}
