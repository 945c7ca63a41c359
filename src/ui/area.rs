//! The app's areas and their addresses.
//!
//! Areas live in the URL fragment (`#/cycle`), not the path, so the app works from any static
//! folder and from the offline cache without a server that rewrites paths, and a link or a
//! bookmark opens the same area.

/// One screen of the app.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Area {
    /// The machine cycle: its phases in order.
    Cycle,
    /// The power unit: motor, pumps, unloading and relief valves.
    PowerUnit,
    /// Operating points, the power ledger and the cycle totals.
    Results,
    /// The pressure setting each valve should have, phase by phase.
    Settings,
    /// A pump's efficiency from readings taken at the machine.
    PumpTest,
    /// A motor's load and efficiency from readings taken at the machine; reached from the
    /// power unit's motor and from the pump test.
    MotorCheck,
    /// The oil, the tank and where the oil's temperature settles; reached from the results,
    /// the quote's site and the power unit's cooler.
    Heat,
    /// The designs side by side for a retrofit quote: cost, savings, payback.
    Quote,
    /// The quote as a page to print or save as PDF; reached from the quote area.
    Report,
    /// Jobs kept on this device, and their export and sharing.
    Jobs,
    /// The safety cautions; reachable from every area.
    Safety,
}

impl Area {
    /// Where a visitor lands when the address names no area.
    pub const START: Area = Area::Cycle;

    /// The areas in the navigation bar, in working order. Safety is not among them: it has
    /// its own button in the top bar so that it is one tap away from everywhere. Nor is the
    /// printable report: it opens from the quote area, as a document does. Nor the motor
    /// check: it opens from the power unit's motor, so seven items still fit a phone. Nor the
    /// oil and heat: it opens from the results, the quote and the power unit's cooler.
    pub const NAV: [Area; 7] = [
        Area::Cycle,
        Area::PowerUnit,
        Area::Results,
        Area::Settings,
        Area::PumpTest,
        Area::Quote,
        Area::Jobs,
    ];

    /// Every area, for code that must treat them all (tests, the router).
    pub const ALL: [Area; 11] = [
        Area::Cycle,
        Area::PowerUnit,
        Area::Results,
        Area::Settings,
        Area::PumpTest,
        Area::MotorCheck,
        Area::Heat,
        Area::Quote,
        Area::Report,
        Area::Jobs,
        Area::Safety,
    ];

    /// Whether the user types the machine's figures here: the presenter view shows the
    /// figures they move beside it.
    pub fn takes_figures(self) -> bool {
        matches!(self, Area::Cycle | Area::PowerUnit | Area::Settings)
    }

    /// The area's name in the address: stable, because links and bookmarks carry it.
    pub fn slug(self) -> &'static str {
        match self {
            Area::Cycle => "cycle",
            Area::PowerUnit => "unit",
            Area::Results => "results",
            Area::Settings => "settings",
            Area::PumpTest => "pump-test",
            Area::MotorCheck => "motor-check",
            Area::Heat => "heat",
            Area::Quote => "quote",
            Area::Report => "report",
            Area::Jobs => "jobs",
            Area::Safety => "safety",
        }
    }

    /// The link to the area, as a fragment.
    pub fn href(self) -> String {
        format!("#/{}", self.slug())
    }

    /// The area named by a URL fragment (`#/results`, `#results`, `#/results/`); any other
    /// fragment, empty included, gives the start area rather than an error page.
    pub fn from_fragment(fragment: &str) -> Area {
        let slug = fragment.trim_start_matches('#').trim_matches('/');
        Area::ALL
            .into_iter()
            .find(|area| area.slug().eq_ignore_ascii_case(slug))
            .unwrap_or(Area::START)
    }

    /// The heading of the area's page.
    pub fn title(self) -> &'static str {
        match self {
            Area::Cycle => "Machine cycle",
            Area::PowerUnit => "Power unit",
            Area::Results => "Results",
            Area::Settings => "Valve settings",
            Area::PumpTest => "Pump test",
            Area::MotorCheck => "Motor check",
            Area::Heat => "Oil and heat",
            Area::Quote => "Retrofit quote",
            Area::Report => "Quote report",
            Area::Jobs => "Jobs on this device",
            Area::Safety => "Safety",
        }
    }

    /// The label under the area's icon in the navigation bar: short enough that seven fit
    /// across a 360 px phone.
    pub fn nav_label(self) -> &'static str {
        match self {
            Area::Cycle => "Cycle",
            Area::PowerUnit => "Unit",
            Area::Results => "Results",
            Area::Settings => "Valve settings",
            Area::PumpTest => "Pump test",
            Area::MotorCheck => "Motor check",
            Area::Heat => "Heat",
            Area::Quote => "Quote",
            Area::Report => "Report",
            Area::Jobs => "Jobs",
            Area::Safety => "Safety",
        }
    }

    /// One sentence saying what the area is for, shown under its heading.
    pub fn purpose(self) -> &'static str {
        match self {
            Area::Cycle => {
                "The phases the machine repeats, in order: approach, work, hold, return, idle."
            }
            Area::PowerUnit => {
                "The motor and pumps, the unloading and check valves, the relief valve and its pilot stages."
            }
            Area::Results => {
                "Each phase's pressure and flow, where every kilowatt goes, the heat into the oil, and the yearly energy and cost."
            }
            Area::Settings => {
                "The relief, remote pilot and unloading settings each phase needs, with the margins they keep."
            }
            Area::PumpTest => {
                "A pump's volumetric and overall efficiency from flow, pressure, speed and motor readings."
            }
            Area::MotorCheck => {
                "How loaded a motor is and how efficient, from a power meter, a clamp meter or a tachometer."
            }
            Area::Heat => {
                "The oil and the tank: where the oil's temperature settles, how long it takes to warm up, and the cooler a target temperature needs."
            }
            Area::Quote => {
                "Every power unit of the job side by side: what each costs to run, what the retrofit saves, and when it pays for itself."
            }
            Area::Report => {
                "The quote as a document: print it, or save it as a PDF, for the customer and the file."
            }
            Area::Jobs => "Jobs saved on this device: open, copy, export and share them.",
            Area::Safety => {
                "Read this before you change any setting on a hydraulic machine."
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_area_round_trips_through_its_link() {
        for area in Area::ALL {
            assert_eq!(Area::from_fragment(&area.href()), area, "{area:?}");
        }
    }

    #[test]
    fn fragment_variants_name_the_same_area() {
        for fragment in [
            "#/results",
            "#results",
            "#/results/",
            "results",
            "#/RESULTS",
        ] {
            assert_eq!(Area::from_fragment(fragment), Area::Results, "{fragment}");
        }
    }

    #[test]
    fn unknown_or_empty_fragment_lands_on_the_start_area() {
        for fragment in ["", "#", "#/", "#/no-such-area", "#/cycle/extra", "#//"] {
            assert_eq!(Area::from_fragment(fragment), Area::START, "{fragment}");
        }
    }

    #[test]
    fn slugs_are_unique_and_url_safe() {
        for (i, a) in Area::ALL.iter().enumerate() {
            assert!(a.slug().chars().all(|c| c.is_ascii_lowercase() || c == '-'));
            for b in &Area::ALL[i + 1..] {
                assert_ne!(a.slug(), b.slug());
            }
        }
    }

    #[test]
    fn navigation_holds_every_area_but_safety_the_report_and_the_motor_check_once() {
        for area in Area::ALL {
            let count = Area::NAV.iter().filter(|&&a| a == area).count();
            let kept_out = matches!(
                area,
                Area::Safety | Area::Report | Area::MotorCheck | Area::Heat
            );
            assert_eq!(count, usize::from(!kept_out), "{area:?}");
        }
    }

    #[test]
    fn nav_labels_fit_a_narrow_phone() {
        // Seven items across 360 px leave 51 px each: a label is a word or two short enough to
        // fit there on at most two lines (the browser test checks no label is cut).
        for area in Area::NAV {
            let label = area.nav_label();
            assert!(label.split(' ').all(|w| w.chars().count() <= 8), "{area:?}");
            assert!(label.split(' ').count() <= 2, "{area:?}");
        }
    }

    #[test]
    fn nav_labels_name_what_the_area_holds() {
        // Each label is a word of its area's heading, so the bar and the page say one thing,
        // and none reads as the app's preferences or as a part's data sheet.
        for area in Area::ALL {
            let label = area.nav_label();
            assert!(
                area.title().to_lowercase().contains(&label.to_lowercase()),
                "{area:?}: “{label}” is not in “{}”",
                area.title()
            );
            assert!(
                !["Settings", "Options", "Preferences", "Pump"].contains(&label),
                "{area:?}"
            );
        }
    }
}
