//! The retrofit comparison in words and figures, as the quote area and the printed report
//! show it: which rows the table has, and each cell's text, rounded for a customer or exact.
//! Pure (no browser), so the browser tests can work out what the screen must say.
//!
//! [`Precision::ForCustomer`] gives three significant figures (the engine's `for_customer`),
//! the payback to a tenth of a year under ten years, whole years above, "under a month",
//! "over 100 years", "at once (no retrofit price entered)" ([`payback_text`]);
//! [`Precision::Exact`] gives six significant figures, on the quote area's "Exact" switch and
//! in the report's "Exact figures". Digits are grouped by a narrow space ([`grouped`]). A
//! design that makes fewer parts an hour than the baseline gets a note: part of its saving is
//! output not made ([`fewer_parts_note`]). What each heat load asks of a cooler is one
//! sentence ([`cooling`]).

use phasewise_engine::quote::{for_customer, payback_for_customer, QuoteColumn};
use phasewise_engine::units::{Measure, UnitSystem};
use phasewise_engine::uom::si::energy::kilowatt_hour;
use phasewise_engine::uom::si::power::kilowatt;

/// How a figure is shown: rounded as a quote gives it, or as the engine computed it.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default)]
pub enum Precision {
    #[default]
    ForCustomer,
    Exact,
}

/// One row of the comparison.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Row {
    MotorSize,
    PumpSpeed,
    PeakLoad,
    RmsLoad,
    CycleTime,
    PartsPerHour,
    EnergyPerCycle,
    AnnualEnergy,
    AnnualCost,
    HeatLoad,
    Co2,
    EnergySaved,
    CostSaved,
    HeatSaved,
    Co2Saved,
    Payback,
}

impl Row {
    /// The rows about each design on its own, in the table's order.
    pub const DESIGN: [Row; 11] = [
        Row::MotorSize,
        Row::PumpSpeed,
        Row::PeakLoad,
        Row::RmsLoad,
        Row::CycleTime,
        Row::PartsPerHour,
        Row::EnergyPerCycle,
        Row::AnnualEnergy,
        Row::AnnualCost,
        Row::HeatLoad,
        Row::Co2,
    ];

    /// The rows against the baseline.
    pub const SAVING: [Row; 5] = [
        Row::EnergySaved,
        Row::CostSaved,
        Row::HeatSaved,
        Row::Co2Saved,
        Row::Payback,
    ];

    /// The row's name in the page (`data-quote-row`): stable, tests find cells by it.
    pub fn key(self) -> &'static str {
        match self {
            Row::MotorSize => "motor",
            Row::PumpSpeed => "pump-speed",
            Row::PeakLoad => "peak",
            Row::RmsLoad => "rms",
            Row::CycleTime => "cycle-time",
            Row::PartsPerHour => "parts-per-hour",
            Row::EnergyPerCycle => "energy-per-cycle",
            Row::AnnualEnergy => "annual-energy",
            Row::AnnualCost => "annual-cost",
            Row::HeatLoad => "heat",
            Row::Co2 => "co2",
            Row::EnergySaved => "energy-saved",
            Row::CostSaved => "cost-saved",
            Row::HeatSaved => "heat-saved",
            Row::Co2Saved => "co2-saved",
            Row::Payback => "payback",
        }
    }

    pub fn label(self) -> &'static str {
        match self {
            Row::MotorSize => "Motor rated power",
            Row::PumpSpeed => "Pump speed",
            Row::PeakLoad => "Motor load, peak",
            Row::RmsLoad => "Motor load, RMS",
            Row::CycleTime => "Cycle time",
            Row::PartsPerHour => "Parts an hour",
            Row::EnergyPerCycle => "Energy per cycle",
            Row::AnnualEnergy => "Energy a year",
            Row::AnnualCost => "Running cost a year",
            Row::HeatLoad => "Heat into the oil",
            Row::Co2 => "CO₂ a year",
            Row::EnergySaved => "Energy saved a year",
            Row::CostSaved => "Cost saved a year",
            Row::HeatSaved => "Less heat into the oil",
            Row::Co2Saved => "CO₂ saved a year",
            Row::Payback => "Simple payback",
        }
    }

    /// Whether the comparison has this row: CO2 only with a grid factor.
    pub fn shown_for(self, columns: &[QuoteColumn]) -> bool {
        match self {
            Row::Co2 | Row::Co2Saved => columns.iter().any(|c| c.co2_kg_per_year.is_some()),
            _ => true,
        }
    }
}

/// A number with its digits grouped in threes by a narrow space (ISO 80000-1: the group
/// mark that reads the same with a decimal point or a decimal comma).
pub fn grouped(value: f64, decimals: usize) -> String {
    if !value.is_finite() {
        return "–".into();
    }
    let text = format!("{:.decimals$}", value.abs());
    let (whole, fraction) = match text.split_once('.') {
        Some((w, f)) => (w, Some(f)),
        None => (text.as_str(), None),
    };
    let mut out = String::new();
    for (i, c) in whole.chars().enumerate() {
        if i > 0 && (whole.len() - i) % 3 == 0 {
            out.push('\u{202F}');
        }
        out.push(c);
    }
    if let Some(f) = fraction {
        out.push('.');
        out.push_str(f);
    }
    let zero = text.chars().all(|c| c == '0' || c == '.');
    if value < 0.0 && !zero {
        out.insert(0, '-');
    }
    out
}

/// `value` to `significant` figures, with the decimals that leaves.
fn figures(value: f64, significant: u32) -> String {
    // Below a millionth of a millionth of its unit a figure is nothing: shown as zero.
    let rounded = if value.abs() < 1e-12 {
        0.0
    } else {
        for_customer(value, significant)
    };
    let magnitude = if rounded == 0.0 {
        0
    } else {
        rounded.abs().log10().floor() as i32
    };
    grouped(
        rounded,
        (significant as i32 - 1 - magnitude).max(0) as usize,
    )
}

/// `value` to three significant figures: what a customer reads.
fn three_figures(value: f64) -> String {
    figures(value, 3)
}

/// The figures shown for a value: three for a customer, six for the exact column (more than
/// any input is known to, so nothing the engine computed is hidden).
fn number(value: f64, precision: Precision) -> String {
    match precision {
        Precision::ForCustomer => figures(value, 3),
        Precision::Exact => figures(value, 6),
    }
}

/// A quantity in the job's units.
fn quantity(measure: Measure, units: UnitSystem, si: f64, precision: Precision) -> String {
    format!(
        "{} {}",
        number(measure.shown(units, si), precision),
        measure.label(units)
    )
}

fn plain(value: f64, unit: &str, precision: Precision) -> String {
    let number = number(value, precision);
    if unit.is_empty() {
        number
    } else {
        format!("{number} {unit}")
    }
}

/// A payback period in years. For a customer: to a tenth of a year under ten years, whole
/// years above, and in words at the ends of the scale.
pub fn payback_text(years: Option<f64>, precision: Precision) -> String {
    match (years, precision) {
        (None, _) => "no saving".into(),
        (Some(y), Precision::Exact) => format!("{} years", figures(y, 6)),
        (Some(y), Precision::ForCustomer) if y <= 0.0 => {
            "at once (no retrofit price entered)".into()
        }
        (Some(y), Precision::ForCustomer) if y < 1.0 / 12.0 => "under a month".into(),
        (Some(y), Precision::ForCustomer) if y > 100.0 => "over 100 years".into(),
        (Some(y), Precision::ForCustomer) => {
            let y = payback_for_customer(y);
            let text = if y >= 10.0 {
                grouped(y, 0)
            } else {
                grouped(y, 1)
            };
            format!("{text} years")
        }
    }
}

/// Says when a design makes fewer parts an hour than the baseline: part of its energy saving
/// is then output not made, which a quote must not hide.
pub fn fewer_parts_note(c: &QuoteColumn, baseline: &QuoteColumn) -> Option<String> {
    let (mine, theirs) = (c.parts_per_hour, baseline.parts_per_hour);
    (mine < theirs * 0.995).then(|| {
        format!(
            "“{}” makes {} parts an hour against {} for “{}”: some of its saving comes from making fewer parts. Compare the energy per cycle (per part).",
            c.name,
            three_figures(mine),
            three_figures(theirs),
            baseline.name
        )
    })
}

/// The text of one cell; none where the row says nothing of this design (the baseline's
/// savings, CO2 without a grid factor).
pub fn cell(
    row: Row,
    c: &QuoteColumn,
    units: UnitSystem,
    currency: &str,
    precision: Precision,
) -> Option<String> {
    let power = |w: f64| quantity(Measure::Power, units, w, precision);
    let saving = c.against_baseline.as_ref();
    Some(match row {
        // A rating is a size off a list: exact, it is shown as rated.
        Row::MotorSize => match precision {
            Precision::ForCustomer => power(c.motor_rated.value),
            Precision::Exact => Measure::Power.with_unit(units, c.motor_rated.value),
        },
        Row::PumpSpeed => {
            let (slowest, fastest) = c.pump_speed;
            let rpm = |w: f64| Measure::ShaftSpeed.with_unit(units, w);
            if c.driven {
                format!("variable, {} to {}", rpm(slowest), rpm(fastest))
            } else {
                format!("fixed, {}", rpm(fastest))
            }
        }
        Row::PeakLoad => power(c.peak_shaft.value),
        Row::RmsLoad => power(c.rms_shaft.value),
        Row::CycleTime => quantity(Measure::Duration, units, c.cycle_time.value, precision),
        Row::PartsPerHour => plain(c.parts_per_hour, "", precision),
        Row::EnergyPerCycle => {
            quantity(Measure::Energy, units, c.energy_per_cycle.value, precision)
        }
        Row::AnnualEnergy => plain(c.annual_energy.get::<kilowatt_hour>(), "kWh", precision),
        Row::AnnualCost => plain(c.annual_cost, currency, precision),
        Row::HeatLoad => quantity(Measure::Heat, units, c.heat_load.value, precision),
        Row::Co2 => plain(c.co2_kg_per_year?, "kg", precision),
        Row::EnergySaved => plain(saving?.energy_kwh_per_year, "kWh", precision),
        Row::CostSaved => plain(saving?.cost_per_year, currency, precision),
        Row::HeatSaved => quantity(Measure::Heat, units, saving?.heat_load.value, precision),
        Row::Co2Saved => plain(saving?.co2_kg_per_year?, "kg", precision),
        Row::Payback => payback_text(saving?.payback_years, precision),
    })
}

/// What a design's heat load means for cooling, in one sentence.
pub fn cooling(c: &QuoteColumn, units: UnitSystem, precision: Precision) -> String {
    if c.heat_load.value <= 0.0 {
        return "No heat goes into the oil: no cooler is needed for this cycle.".into();
    }
    let heat = quantity(Measure::Heat, units, c.heat_load.value, precision);
    // Cooler ratings are given in both kW and Btu/h: the other one in brackets.
    let other = match units {
        UnitSystem::Si => format!("{} Btu/h", number(c.heat_load_btu_per_hour, precision)),
        UnitSystem::UsCustomary => {
            format!("{} kW", number(c.heat_load.get::<kilowatt>(), precision))
        }
    };
    let rise = quantity(
        Measure::RisePerHour,
        units,
        c.oil_rise_k_per_hour,
        precision,
    );
    format!(
        "A cooler must take away {heat} ({other}) for as long as the machine runs, at the oil \
         temperature you mean to hold. With none, the oil warms {rise} while it runs, less what \
         the tank and pipes shed."
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn digits_group_in_threes() {
        assert_eq!(grouped(1234567.891, 2), "1\u{202F}234\u{202F}567.89");
        assert_eq!(grouped(999.0, 0), "999");
        assert_eq!(grouped(-12300.0, 0), "-12\u{202F}300");
        assert_eq!(grouped(-0.001, 1), "0.0");
        assert_eq!(three_figures(16_012.3), "16\u{202F}000");
        assert_eq!(three_figures(0.012_34), "0.0123");
        assert_eq!(three_figures(7.456), "7.46");
        // Rounding up into the next power of ten takes that power's decimals.
        assert_eq!(three_figures(999.6), "1\u{202F}000");
        assert_eq!(three_figures(-999.6), "-1\u{202F}000");
        assert_eq!(three_figures(0.099_96), "0.100");
        assert_eq!(figures(30_914.123_4, 6), "30\u{202F}914.1");
        assert_eq!(figures(1e-310, 3), "0.00");
        assert_eq!(three_figures(0.0), "0.00");
    }

    #[test]
    fn payback_reads_in_tenths_under_ten_years() {
        assert_eq!(
            payback_text(Some(0.9375), Precision::ForCustomer),
            "0.9 years"
        );
        assert_eq!(
            payback_text(Some(0.9375), Precision::Exact),
            "0.937500 years"
        );
        assert_eq!(
            payback_text(Some(0.0), Precision::ForCustomer),
            "at once (no retrofit price entered)"
        );
        assert_eq!(
            payback_text(Some(0.02), Precision::ForCustomer),
            "under a month"
        );
        assert_eq!(
            payback_text(Some(3e15), Precision::ForCustomer),
            "over 100 years"
        );
        assert_eq!(payback_text(Some(12.4), Precision::ForCustomer), "12 years");
        assert_eq!(
            payback_text(Some(1.02), Precision::ForCustomer),
            "1.0 years"
        );
        assert_eq!(payback_text(None, Precision::ForCustomer), "no saving");
    }
}
