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
    /// Jobs kept on this device, and their export and sharing.
    Jobs,
    /// The safety cautions; reachable from every area.
    Safety,
}

impl Area {
    /// Where a visitor lands when the address names no area.
    pub const START: Area = Area::Cycle;

    /// The areas in the navigation bar, in working order. Safety is not among them: it has
    /// its own button in the top bar so that it is one tap away from everywhere.
    pub const NAV: [Area; 6] = [
        Area::Cycle,
        Area::PowerUnit,
        Area::Results,
        Area::Settings,
        Area::PumpTest,
        Area::Jobs,
    ];

    /// Every area, for code that must treat them all (tests, the router).
    pub const ALL: [Area; 7] = [
        Area::Cycle,
        Area::PowerUnit,
        Area::Results,
        Area::Settings,
        Area::PumpTest,
        Area::Jobs,
        Area::Safety,
    ];

    /// The area's name in the address: stable, because links and bookmarks carry it.
    pub fn slug(self) -> &'static str {
        match self {
            Area::Cycle => "cycle",
            Area::PowerUnit => "unit",
            Area::Results => "results",
            Area::Settings => "settings",
            Area::PumpTest => "pump-test",
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
            Area::Settings => "Pressure settings",
            Area::PumpTest => "Pump check",
            Area::Jobs => "Jobs on this device",
            Area::Safety => "Safety first",
        }
    }

    /// The label under the area's icon in the navigation bar: short enough that six fit
    /// across a 360 px phone.
    pub fn nav_label(self) -> &'static str {
        match self {
            Area::Cycle => "Cycle",
            Area::PowerUnit => "Unit",
            Area::Results => "Results",
            Area::Settings => "Settings",
            Area::PumpTest => "Pump",
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
    fn navigation_holds_every_area_but_safety_once() {
        for area in Area::ALL {
            let count = Area::NAV.iter().filter(|&&a| a == area).count();
            assert_eq!(count, usize::from(area != Area::Safety), "{area:?}");
        }
    }

    #[test]
    fn nav_labels_fit_a_narrow_phone() {
        // Six items across 360 px leave 60 px each; at the bar's 12 px type about 8 characters fit.
        for area in Area::NAV {
            assert!(area.nav_label().chars().count() <= 8, "{area:?}");
        }
    }
}
