//! Exact unit definitions, and the trade's units for showing results.
//!
//! The engine computes in SI base units. These constants are the exact definitions of NIST
//! SP 811 (Appendix B) and the SI brochure, because uom 0.38 ships some of them rounded
//! (its psi is 8.7e-8 relative off, its US gallon is 3.785412 L, and its `btu` is the
//! thermochemical one).

use serde::{Deserialize, Serialize};

/// One inch in metres (exact).
pub const INCH: f64 = 0.0254;
/// One US gallon in cubic metres: 231 cubic inches (exact).
pub const US_GALLON: f64 = 231.0 * INCH * INCH * INCH;
/// One pound-force in newtons: 0.45359237 kg x 9.80665 m/s^2 (exact).
pub const POUND_FORCE: f64 = 0.453_592_37 * 9.806_65;
/// One psi in pascals: a pound-force per square inch (exact by definition).
pub const PSI: f64 = POUND_FORCE / (INCH * INCH);
/// One mechanical horsepower (550 ft.lbf/s) in watts (exact by definition).
pub const HORSEPOWER: f64 = 550.0 * 12.0 * INCH * POUND_FORCE;
/// One Btu (International Table) in joules (exact).
pub const BTU_IT: f64 = 1_055.055_852_62;
/// One bar in pascals (exact).
pub const BAR: f64 = 1e5;
/// One litre per minute in cubic metres per second (exact).
pub const LITRE_PER_MINUTE: f64 = 1e-3 / 60.0;
/// One US gallon per minute in cubic metres per second (exact).
pub const GALLON_PER_MINUTE: f64 = US_GALLON / 60.0;
/// One kilowatt-hour in joules (exact).
pub const KILOWATT_HOUR: f64 = 3.6e6;

/// The units a job is shown in. It changes what is displayed, never the physics.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(rename_all = "snake_case")]
pub enum UnitSystem {
    /// bar, L/min, kW, mm, cm^3/rev, kN, degC
    #[default]
    Si,
    /// psi, gpm, hp, in, in^3/rev, lbf, degF
    UsCustomary,
}

impl UnitSystem {
    /// A pressure (Pa) in this system's unit, e.g. "210.0 bar" or "3046 psi".
    pub fn pressure(self, pa: f64) -> String {
        match self {
            UnitSystem::Si => format!("{:.1} bar", pa / BAR),
            UnitSystem::UsCustomary => format!("{:.0} psi", pa / PSI),
        }
    }

    /// A flow (m^3/s), e.g. "45.0 L/min" or "11.9 gpm".
    pub fn flow(self, m3_per_s: f64) -> String {
        match self {
            UnitSystem::Si => format!("{:.1} L/min", m3_per_s / LITRE_PER_MINUTE),
            UnitSystem::UsCustomary => format!("{:.1} gpm", m3_per_s / GALLON_PER_MINUTE),
        }
    }

    /// A power (W), e.g. "7.50 kW" or "10.06 hp".
    pub fn power(self, w: f64) -> String {
        match self {
            UnitSystem::Si => format!("{:.2} kW", w / 1e3),
            UnitSystem::UsCustomary => format!("{:.2} hp", w / HORSEPOWER),
        }
    }
}

/// Seconds, shown to a tenth: durations in a machine cycle.
pub fn seconds(s: f64) -> String {
    format!("{s:.1} s")
}

#[cfg(test)]
mod tests {
    use super::*;

    fn close(a: f64, b: f64, rel: f64) -> bool {
        (a - b).abs() <= rel * b.abs()
    }

    #[test]
    #[allow(clippy::excessive_precision)] // the digits as SP 811 prints them
    fn exact_definitions_of_nist_sp_811() {
        // NIST SP 811 (2008), Appendix B.8 and B.9; the values printed there, to 1e-12 relative.
        assert!(close(US_GALLON, 3.785_411_784e-3, 1e-12));
        assert!(close(POUND_FORCE, 4.448_221_615_260_5, 1e-12));
        assert!(close(PSI, 6_894.757_293_168_361, 1e-12));
        assert!(close(HORSEPOWER, 745.699_871_582_270_2, 1e-12));
        // 1 Btu_IT/h = 0.2930710701722 W (from the exact Btu_IT, SP 811 B.8).
        assert!(close(BTU_IT / 3600.0, 0.293_071_070_172_2, 1e-12));
    }

    #[test]
    fn hydraulic_power_rules_follow_from_the_definitions() {
        // kW = L/min x bar / 600 (exact from the SI definitions).
        let w = LITRE_PER_MINUTE * BAR;
        assert!(close(w / 1e3, 1.0 / 600.0, 1e-12));
        // hp = gpm x psi / (12000/7) = gpm x psi / 1714.2857... (exact from SP 811 units).
        let hp = GALLON_PER_MINUTE * PSI / HORSEPOWER;
        assert!(close(hp, 7.0 / 12_000.0, 1e-12));
        // 1 hp = 2544.4336 Btu_IT/h (REFERENCES: derived from SP 811), to the printed digits.
        assert!(close(HORSEPOWER / (BTU_IT / 3600.0), 2544.4336, 1e-8));
    }

    #[test]
    fn uom_agrees_within_its_rounding() {
        use uom::si::f64::{Pressure, VolumeRate};
        use uom::si::pressure::psi;
        use uom::si::volume_rate::gallon_per_minute;
        // uom 0.38 ships SP 811's rounded psi and a 7-digit gallon: agreement to 1e-6 only.
        assert!(close(Pressure::new::<psi>(1.0).value, PSI, 1e-6));
        assert!(close(
            VolumeRate::new::<gallon_per_minute>(1.0).value,
            GALLON_PER_MINUTE,
            1e-6
        ));
    }

    #[test]
    fn published_hydraulic_horsepower() {
        // Engineering ToolBox, "Hydraulic horsepower": 20 gpm at 1500 psi is 17.5 hp.
        let hp = 20.0 * GALLON_PER_MINUTE * 1500.0 * PSI / HORSEPOWER;
        assert!(close(hp, 17.5, 0.005), "{hp}");
    }

    #[test]
    fn display_in_either_system() {
        assert_eq!(UnitSystem::Si.pressure(210e5), "210.0 bar");
        assert_eq!(UnitSystem::UsCustomary.pressure(1000.0 * PSI), "1000 psi");
        assert_eq!(UnitSystem::Si.flow(45.0 * LITRE_PER_MINUTE), "45.0 L/min");
        assert_eq!(UnitSystem::UsCustomary.power(10.0 * HORSEPOWER), "10.00 hp");
    }
}
