//! Exact unit definitions, and the trade's units for showing results.
//!
//! The engine computes in SI base units. These constants are the exact definitions of NIST
//! SP 811 (Appendix B) and the SI brochure, because uom 0.38 ships some of them rounded
//! (its psi is 8.7e-8 relative off, its US gallon is 3.785412 L, and its `btu` is the
//! thermochemical one). [`us`] makes each a uom unit of our own, so results and tests read
//! `p.get::<psi>()` instead of repeating a factor; [`pascals`], [`watts`] and their kin turn
//! the inner solve's plain SI numbers into quantities.

use serde::{Deserialize, Serialize};
use uom::si::energy::kilowatt_hour;
use uom::si::f64::{AngularVelocity, Energy, Power, Pressure, Time, VolumeRate};
use uom::si::power::kilowatt;
use uom::si::pressure::bar;
use uom::si::time::second;
use uom::si::volume_rate::liter_per_minute;

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
/// The foot and the avoirdupois pound, m and kg (exact, NIST SP 811).
pub const FOOT: f64 = 12.0 * INCH;
pub const POUND: f64 = 0.453_592_37;
/// One litre per minute in cubic metres per second (exact).
pub const LITRE_PER_MINUTE: f64 = 1e-3 / 60.0;
/// One US gallon per minute in cubic metres per second (exact).
pub const GALLON_PER_MINUTE: f64 = US_GALLON / 60.0;
/// One kilowatt-hour in joules (exact).
pub const KILOWATT_HOUR: f64 = 3.6e6;
/// One revolution per minute in radians per second (exact).
pub const REVOLUTION_PER_MINUTE: f64 = std::f64::consts::TAU / 60.0;

/// The trade's US customary units as uom units at NIST SP 811's exact definitions (uom's own
/// are rounded, see the module doc). Each is defined once, from the constants above, so no
/// other file repeats a conversion factor: `Pressure::new::<psi>(3000.0)`.
pub mod us {
    /// psi, a pound-force per square inch.
    pub mod pressure {
        unit! {
            system: uom::si;
            quantity: uom::si::pressure;
            @psi: crate::units::PSI; "psi", "pound-force per square inch",
                "pounds-force per square inch";
        }
    }
    /// The US gallon of 231 cubic inches.
    pub mod volume {
        unit! {
            system: uom::si;
            quantity: uom::si::volume;
            @us_gallon: crate::units::US_GALLON; "gal", "US gallon", "US gallons";
        }
    }
    /// US gallons per minute.
    pub mod volume_rate {
        unit! {
            system: uom::si;
            quantity: uom::si::volume_rate;
            @gallon_per_minute: crate::units::GALLON_PER_MINUTE; "gpm", "US gallon per minute",
                "US gallons per minute";
        }
    }
    /// Mechanical horsepower, and the Btu_IT per hour heat loads are quoted in.
    pub mod power {
        unit! {
            system: uom::si;
            quantity: uom::si::power;
            @horsepower: crate::units::HORSEPOWER; "hp", "horsepower", "horsepower";
            @btu_it_per_hour: crate::units::BTU_IT / 3600.0; "Btu/h",
                "British thermal unit (IT) per hour", "British thermal units (IT) per hour";
        }
    }
    /// The International Table Btu.
    pub mod energy {
        unit! {
            system: uom::si;
            quantity: uom::si::energy;
            @btu_it: crate::units::BTU_IT; "Btu", "British thermal unit (IT)",
                "British thermal units (IT)";
        }
    }
}

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
    /// A pressure in this system's unit, e.g. "210.0 bar" or "3046 psi".
    pub fn pressure(self, p: Pressure) -> String {
        match self {
            UnitSystem::Si => format!("{:.1} bar", p.get::<bar>()),
            UnitSystem::UsCustomary => format!("{:.0} psi", p.get::<us::pressure::psi>()),
        }
    }

    /// A flow, e.g. "45.0 L/min" or "11.9 gpm".
    pub fn flow(self, q: VolumeRate) -> String {
        match self {
            UnitSystem::Si => format!("{:.1} L/min", q.get::<liter_per_minute>()),
            UnitSystem::UsCustomary => {
                format!("{:.1} gpm", q.get::<us::volume_rate::gallon_per_minute>())
            }
        }
    }

    /// A shaft speed, e.g. "1450 rpm" (the same in both systems).
    pub fn shaft_speed(self, w: uom::si::f64::AngularVelocity) -> String {
        format!("{:.0} rpm", w.value / REVOLUTION_PER_MINUTE)
    }

    /// A power, e.g. "7.50 kW" or "10.06 hp".
    pub fn power(self, p: Power) -> String {
        match self {
            UnitSystem::Si => format!("{:.2} kW", p.get::<kilowatt>()),
            UnitSystem::UsCustomary => format!("{:.2} hp", p.get::<us::power::horsepower>()),
        }
    }
}

/// Quantities from the plain SI numbers the inner solve works in.
pub fn pascals(v: f64) -> Pressure {
    Pressure::new::<uom::si::pressure::pascal>(v)
}

pub fn watts(v: f64) -> Power {
    Power::new::<uom::si::power::watt>(v)
}

pub fn seconds_of(v: f64) -> Time {
    Time::new::<second>(v)
}

pub fn joules(v: f64) -> Energy {
    Energy::new::<uom::si::energy::joule>(v)
}

pub fn cubic_metres_per_second(v: f64) -> VolumeRate {
    VolumeRate::new::<uom::si::volume_rate::cubic_meter_per_second>(v)
}

pub fn radians_per_second(v: f64) -> AngularVelocity {
    AngularVelocity::new::<uom::si::angular_velocity::radian_per_second>(v)
}

pub fn kilowatt_hours(v: f64) -> Energy {
    Energy::new::<kilowatt_hour>(v)
}

/// Writes an energy as kilowatt-hours in a job's report, where yearly figures have always been
/// kept in kWh (`#[serde(serialize_with = "...")]`).
pub fn as_kilowatt_hours<S: serde::Serializer>(e: &Energy, s: S) -> Result<S::Ok, S::Error> {
    s.serialize_f64(e.get::<kilowatt_hour>())
}

/// What a number on screen measures: it decides the unit shown beside it in each system, the
/// decimals, and the conversion to and from the SI value the engine keeps.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
pub enum Measure {
    Pressure,
    Flow,
    Power,
    /// Bores, rods and strokes.
    Length,
    Force,
    Displacement,
    /// Cylinder speed.
    Speed,
    /// Motor shaft speed.
    ShaftSpeed,
    Duration,
    /// An efficiency or share, kept as a fraction.
    Percent,
    OilVolume,
    Density,
    SpecificHeat,
    /// Heat load, shown in kW or Btu/h.
    Heat,
    /// Oil temperature rise rate, kept in K/min.
    RiseRate,
    /// Energy, kept in J, shown in kWh.
    Energy,
    /// A plain multiplier (a service factor).
    Factor,
    /// Shaft torque, kept in N.m.
    Torque,
    /// Line voltage, kept in V.
    Voltage,
    /// Line current, kept in A.
    Current,
    /// Running hours in a year.
    HoursPerYear,
    /// Electricity price per kWh, in the job's currency.
    Tariff,
    /// A demand charge per kW of billed demand a month, in the job's currency.
    DemandCharge,
    /// A sum in the job's currency (the unit is the job's own label, not shown here).
    Money,
    /// Grid emission factor, kg CO2 per kWh.
    GridFactor,
    /// Oil temperature rise per hour of running, kept in K/h.
    RisePerHour,
    /// A temperature, kept in kelvin, shown in degC or degF.
    Temperature,
    /// A temperature difference, kept in K.
    TemperatureDifference,
    /// Kinematic viscosity, kept in m^2/s, shown in mm^2/s (cSt).
    Viscosity,
    /// A wall or tank area, kept in m^2.
    Area,
    /// A mass, kept in kg.
    Mass,
    /// A line's inner diameter or length, kept in m.
    LineSize,
    /// Heat rejected per kelvin of temperature difference, kept in W/K.
    HeatPerKelvin,
    /// A plain count or figure with no unit (a loss coefficient, a viscosity index).
    Number,
    /// A converter's apparent power, kept in VA, shown in kVA.
    ApparentPower,
}

impl Measure {
    /// The unit's label, how many SI units one shown unit is, and the decimals shown.
    pub fn unit(self, system: UnitSystem) -> (&'static str, f64, usize) {
        use UnitSystem::{Si, UsCustomary as Us};
        match (self, system) {
            (Measure::Pressure, Si) => ("bar", BAR, 1),
            (Measure::Pressure, Us) => ("psi", PSI, 0),
            (Measure::Flow, Si) => ("L/min", LITRE_PER_MINUTE, 1),
            (Measure::Flow, Us) => ("gpm", GALLON_PER_MINUTE, 2),
            (Measure::Power, Si) => ("kW", 1e3, 2),
            (Measure::Power, Us) => ("hp", HORSEPOWER, 2),
            (Measure::Length, Si) => ("mm", 1e-3, 1),
            (Measure::Length, Us) => ("in", INCH, 3),
            (Measure::Force, Si) => ("kN", 1e3, 2),
            (Measure::Force, Us) => ("lbf", POUND_FORCE, 0),
            (Measure::Displacement, Si) => ("cm³/rev", 1e-6, 2),
            (Measure::Displacement, Us) => ("in³/rev", INCH * INCH * INCH, 3),
            (Measure::Speed, Si) => ("m/s", 1.0, 3),
            (Measure::Speed, Us) => ("in/s", INCH, 2),
            (Measure::ShaftSpeed, _) => ("rpm", REVOLUTION_PER_MINUTE, 0),
            (Measure::Duration, _) => ("s", 1.0, 2),
            (Measure::Percent, _) => ("%", 0.01, 1),
            (Measure::OilVolume, Si) => ("L", 1e-3, 0),
            (Measure::OilVolume, Us) => ("gal", US_GALLON, 1),
            (Measure::Density, _) => ("kg/m³", 1.0, 0),
            (Measure::SpecificHeat, _) => ("kJ/(kg·K)", 1e3, 2),
            (Measure::Heat, Si) => ("kW", 1e3, 2),
            (Measure::Heat, Us) => ("Btu/h", BTU_IT / 3600.0, 0),
            (Measure::RiseRate, Si) => ("K/min", 1.0, 2),
            (Measure::RiseRate, Us) => ("°F/min", 1.0 / 1.8, 2),
            (Measure::Energy, _) => ("kWh", KILOWATT_HOUR, 3),
            (Measure::Factor, _) => ("×", 1.0, 2),
            (Measure::Torque, Si) => ("N·m", 1.0, 1),
            (Measure::Torque, Us) => ("lbf·ft", POUND_FORCE * 12.0 * INCH, 1),
            (Measure::Voltage, _) => ("V", 1.0, 0),
            (Measure::Current, _) => ("A", 1.0, 1),
            (Measure::HoursPerYear, _) => ("h/year", 1.0, 0),
            (Measure::Tariff, _) => ("per kWh", 1.0, 3),
            (Measure::DemandCharge, _) => ("per kW·month", 1.0, 2),
            (Measure::Money, _) => ("", 1.0, 0),
            (Measure::GridFactor, _) => ("kg/kWh", 1.0, 3),
            (Measure::RisePerHour, Si) => ("K/h", 1.0, 1),
            (Measure::RisePerHour, Us) => ("°F/h", 1.0 / 1.8, 1),
            (Measure::Temperature, Si) => ("°C", 1.0, 1),
            (Measure::Temperature, Us) => ("°F", 1.0 / 1.8, 0),
            (Measure::TemperatureDifference, Si) => ("K", 1.0, 1),
            (Measure::TemperatureDifference, Us) => ("°F", 1.0 / 1.8, 1),
            (Measure::Viscosity, _) => ("mm²/s", 1e-6, 1),
            (Measure::Area, Si) => ("m²", 1.0, 2),
            (Measure::Area, Us) => ("ft²", FOOT * FOOT, 1),
            (Measure::Mass, Si) => ("kg", 1.0, 0),
            (Measure::Mass, Us) => ("lb", POUND, 0),
            (Measure::LineSize, Si) => ("mm", 1e-3, 1),
            (Measure::LineSize, Us) => ("in", INCH, 3),
            (Measure::HeatPerKelvin, Si) => ("W/K", 1.0, 0),
            (Measure::HeatPerKelvin, Us) => ("Btu/(h·°F)", BTU_IT / 3600.0 * 1.8, 0),
            (Measure::Number, _) => ("", 1.0, 2),
            (Measure::ApparentPower, _) => ("kVA", 1e3, 1),
        }
    }

    /// What the shown unit's zero is in SI (only temperatures have one that is not zero).
    fn zero(self, system: UnitSystem) -> f64 {
        match (self, system) {
            (Measure::Temperature, UnitSystem::Si) => 273.15,
            // 0 degF is (0 - 32) / 1.8 + 273.15 K.
            (Measure::Temperature, UnitSystem::UsCustomary) => 273.15 - 32.0 / 1.8,
            _ => 0.0,
        }
    }

    pub fn label(self, system: UnitSystem) -> &'static str {
        self.unit(system).0
    }

    /// The SI value in the shown unit.
    pub fn shown(self, system: UnitSystem, si: f64) -> f64 {
        (si - self.zero(system)) / self.unit(system).1
    }

    /// The SI value of a number typed in the shown unit.
    pub fn from_shown(self, system: UnitSystem, shown: f64) -> f64 {
        shown * self.unit(system).1 + self.zero(system)
    }

    /// The SI value as shown: its number at the unit's decimals, without the unit.
    pub fn format(self, system: UnitSystem, si: f64) -> String {
        let decimals = self.unit(system).2;
        let shown = self.shown(system, si);
        if !shown.is_finite() {
            return "–".to_string();
        }
        // No "-0.0": a value that rounds to zero is shown as zero.
        let text = format!("{shown:.decimals$}");
        if text
            .trim_start_matches('-')
            .chars()
            .all(|c| c == '0' || c == '.')
        {
            text.trim_start_matches('-').to_string()
        } else {
            text
        }
    }

    /// The SI value with its unit, e.g. "210.0 bar".
    pub fn with_unit(self, system: UnitSystem, si: f64) -> String {
        format!("{} {}", self.format(system, si), self.label(system))
    }
}

/// A number as typed into a field: a decimal point or a decimal comma, an optional sign and
/// exponent. `None` for anything else, empty included ("inf" and "NaN" are not numbers here).
pub fn parse_number(text: &str) -> Option<f64> {
    let text = text.trim();
    if text.is_empty()
        || !text
            .chars()
            .all(|c| c.is_ascii_digit() || matches!(c, '.' | ',' | '-' | '+' | 'e' | 'E'))
    {
        return None;
    }
    if !text.chars().any(|c| c.is_ascii_digit()) {
        return None;
    }
    text.replace(',', ".")
        .parse::<f64>()
        .ok()
        .filter(|v| v.is_finite())
}

/// A list of numbers typed in a measure's shown unit ("8, 16, 25", "8 16 25" or "8; 16; 25";
/// "6,3" is a decimal comma), as SI values; or what is wrong with it.
pub fn parse_list(text: &str, measure: Measure, system: UnitSystem) -> Result<Vec<f64>, String> {
    // Semicolons, spaces or a comma with a space after it separate; a comma between digits
    // is a decimal comma ("6,3" is one size).
    let items: Vec<String> = if text.contains(';') {
        text.split(';').map(str::to_string).collect()
    } else {
        text.replace(", ", " ")
            .split_whitespace()
            .map(str::to_string)
            .collect()
    };
    let mut values = Vec::new();
    for item in items.iter().map(|i| i.trim()).filter(|i| !i.is_empty()) {
        let item = item.trim_end_matches(',');
        match parse_number(item) {
            Some(v) if v > 0.0 => values.push(measure.from_shown(system, v)),
            Some(_) => return Err(format!("{item} is not more than zero")),
            None => return Err(format!("“{item}” is not a number")),
        }
    }
    if values.is_empty() {
        return Err("type at least one value".into());
    }
    Ok(values)
}

/// SI values as a list in a measure's shown unit, for [`parse_list`] to read back.
pub fn format_list(values: &[f64], measure: Measure, system: UnitSystem) -> String {
    values
        .iter()
        .map(|v| {
            let shown = measure.shown(system, *v);
            // Enough digits that the list reads back to the same sizes.
            let text = format!("{shown:.3}");
            text.trim_end_matches('0').trim_end_matches('.').to_string()
        })
        .collect::<Vec<_>>()
        .join(", ")
}

/// Seconds, shown to a tenth: durations in a machine cycle.
pub fn seconds(t: Time) -> String {
    format!("{:.1} s", t.get::<second>())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn lists_of_sizes_read_in_either_decimal_mark() {
        let cc = |v: &[f64]| v.iter().map(|x| x * 1e-6).collect::<Vec<_>>();
        let read = |t| parse_list(t, Measure::Displacement, UnitSystem::Si);
        for text in ["8, 16, 25", "8 16 25", "8; 16; 25", "8, 16, 25,"] {
            let got = read(text).unwrap();
            for (a, b) in got.iter().zip(cc(&[8.0, 16.0, 25.0])) {
                assert!((a - b).abs() < 1e-18, "{text}");
            }
        }
        let got = read("6,3; 12,5").unwrap();
        assert!((got[0] - 6.3e-6).abs() < 1e-18 && (got[1] - 12.5e-6).abs() < 1e-18);
        let one = read("6,3").unwrap();
        assert_eq!(one.len(), 1, "a decimal comma, not two sizes");
        assert!(read("8,16,25").is_err(), "ambiguous: said, not guessed");
        assert!(read("8, x").unwrap_err().contains("“x”"));
        assert!(read("8, -1").unwrap_err().contains("not more than zero"));
        assert!(read(" ").is_err());
        let back = format_list(
            &cc(&[2.5, 6.3, 160.0]),
            Measure::Displacement,
            UnitSystem::Si,
        );
        assert_eq!(back, "2.5, 6.3, 160");
    }

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
        // 1 hp = 2544.4336 Btu_IT/h (derived from NIST SP 811, Appendix B), to the printed digits.
        assert!(close(HORSEPOWER / (BTU_IT / 3600.0), 2544.4336, 1e-8));
    }

    #[test]
    fn the_projects_uom_units_are_the_exact_definitions() {
        use super::us;
        use uom::si::f64::{Energy, Volume};
        // NIST SP 811 (2008), Appendix B.8 and B.9, as above: each unit is its constant.
        assert_eq!(Pressure::new::<us::pressure::psi>(1.0).value, PSI);
        assert_eq!(Volume::new::<us::volume::us_gallon>(1.0).value, US_GALLON);
        assert_eq!(
            VolumeRate::new::<us::volume_rate::gallon_per_minute>(1.0).value,
            GALLON_PER_MINUTE
        );
        assert_eq!(Power::new::<us::power::horsepower>(1.0).value, HORSEPOWER);
        assert_eq!(Energy::new::<us::energy::btu_it>(1.0).value, BTU_IT);
        assert!(close(
            Power::new::<us::power::btu_it_per_hour>(1.0).value,
            0.293_071_070_172_2,
            1e-12
        ));
        // Read back in the unit, a figure is the figure typed.
        let p = Pressure::new::<us::pressure::psi>(3000.0);
        assert!(close(p.get::<us::pressure::psi>(), 3000.0, 1e-15));
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
    fn typed_numbers_take_a_point_or_a_comma_and_nothing_else() {
        assert_eq!(parse_number("12,5"), Some(12.5));
        assert_eq!(parse_number(" 210 "), Some(210.0));
        assert_eq!(parse_number("-3.5"), Some(-3.5));
        assert_eq!(parse_number("1e3"), Some(1000.0));
        for bad in [
            "", "  ", "abc", "inf", "NaN", "1.2.3", "12 bar", "-", ",", "1e999",
        ] {
            assert_eq!(parse_number(bad), None, "{bad:?}");
        }
    }

    #[test]
    fn every_measure_converts_there_and_back_in_both_systems() {
        use Measure::*;
        let all = [
            Pressure,
            Flow,
            Power,
            Length,
            Force,
            Displacement,
            Speed,
            ShaftSpeed,
            Duration,
            Percent,
            OilVolume,
            Density,
            SpecificHeat,
            Heat,
            RiseRate,
            Energy,
            Factor,
            Torque,
            Voltage,
            Current,
            Temperature,
            TemperatureDifference,
            Viscosity,
            Area,
            Mass,
            LineSize,
            ApparentPower,
            HeatPerKelvin,
        ];
        for m in all {
            for system in [UnitSystem::Si, UnitSystem::UsCustomary] {
                let si = 123.456;
                assert!(
                    close(m.from_shown(system, m.shown(system, si)), si, 1e-12),
                    "{m:?} {system:?}"
                );
                assert!(!m.label(system).is_empty());
            }
        }
        // From the exact definitions: 1 in = 25.4 mm, 1 lbf = 4.4482216152605 N (NIST SP 811).
        assert_eq!(Length.format(UnitSystem::UsCustomary, 0.0254), "1.000");
        assert_eq!(Force.format(UnitSystem::Si, 4_448.221_615_260_5), "4.45");
        assert_eq!(Pressure.with_unit(UnitSystem::Si, 210e5), "210.0 bar");
        assert_eq!(Pressure.format(UnitSystem::Si, -1.0), "0.0");
        assert_eq!(Pressure.format(UnitSystem::Si, f64::NAN), "–");
        // Temperatures have their own zero: 323.15 K is 50 degC and 122 degF; water freezes
        // at 32 degF (the Celsius and Fahrenheit definitions, NIST SP 811).
        assert_eq!(Temperature.with_unit(UnitSystem::Si, 323.15), "50.0 °C");
        assert_eq!(
            Temperature.with_unit(UnitSystem::UsCustomary, 323.15),
            "122 °F"
        );
        assert!(close(
            Temperature.from_shown(UnitSystem::UsCustomary, 32.0),
            273.15,
            1e-12
        ));
        assert_eq!(
            TemperatureDifference.format(UnitSystem::UsCustomary, 10.0),
            "18.0"
        );
    }

    #[test]
    fn display_in_either_system() {
        use super::us::{power::horsepower, pressure::psi};
        assert_eq!(
            UnitSystem::Si.pressure(Pressure::new::<bar>(210.0)),
            "210.0 bar"
        );
        assert_eq!(
            UnitSystem::UsCustomary.pressure(Pressure::new::<psi>(1000.0)),
            "1000 psi"
        );
        let q = VolumeRate::new::<liter_per_minute>(45.0);
        assert_eq!(UnitSystem::Si.flow(q), "45.0 L/min");
        assert_eq!(
            UnitSystem::UsCustomary.power(Power::new::<horsepower>(10.0)),
            "10.00 hp"
        );
    }
}
