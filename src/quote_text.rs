//! The retrofit comparison in words and figures, as the quote area and the printed report
//! show it: which rows the table has, and each cell's text, rounded for a customer or exact.
//! Pure (no browser), so the browser tests can work out what the screen must say.

use crate::engine::quote::{for_customer, payback_for_customer, QuoteColumn};
use crate::engine::units::{Measure, UnitSystem};

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
    pub const DESIGN: [Row; 10] = [
        Row::MotorSize,
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
            Row::MotorSize => "Motor size",
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
            Row::HeatSaved => "Less heat for the cooler",
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

/// `value` to three significant figures, with the decimals that leaves.
fn three_figures(value: f64) -> String {
    let rounded = for_customer(value, 3);
    let magnitude = if rounded == 0.0 {
        0
    } else {
        rounded.abs().log10().floor() as i32
    };
    grouped(rounded, (2 - magnitude).max(0) as usize)
}

/// A quantity in the job's units: three figures for a customer, the unit's own decimals exact.
fn quantity(measure: Measure, units: UnitSystem, si: f64, precision: Precision) -> String {
    let shown = measure.shown(units, si);
    let number = match precision {
        Precision::ForCustomer => three_figures(shown),
        Precision::Exact => grouped(shown, measure.unit(units).2),
    };
    format!("{number} {}", measure.label(units))
}

fn plain(value: f64, unit: &str, exact_decimals: usize, precision: Precision) -> String {
    let number = match precision {
        Precision::ForCustomer => three_figures(value),
        Precision::Exact => grouped(value, exact_decimals),
    };
    if unit.is_empty() {
        number
    } else {
        format!("{number} {unit}")
    }
}

/// A payback period in years.
pub fn payback_text(years: Option<f64>, precision: Precision) -> String {
    match years {
        None => "no saving".into(),
        Some(y) => {
            let y = match precision {
                Precision::ForCustomer => payback_for_customer(y),
                Precision::Exact => y,
            };
            let text = match precision {
                Precision::ForCustomer if y >= 10.0 => grouped(y, 0),
                Precision::ForCustomer => grouped(y, 1),
                Precision::Exact => grouped(y, 3),
            };
            format!("{text} years")
        }
    }
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
        // A rating is a size off a list, not a measurement: shown as it is.
        Row::MotorSize => Measure::Power.with_unit(units, c.motor_rated_w),
        Row::PeakLoad => power(c.peak_shaft_w),
        Row::RmsLoad => power(c.rms_shaft_w),
        Row::CycleTime => quantity(Measure::Duration, units, c.cycle_time_s, precision),
        Row::PartsPerHour => plain(c.parts_per_hour, "", 1, precision),
        Row::EnergyPerCycle => quantity(Measure::Energy, units, c.energy_per_cycle_j, precision),
        Row::AnnualEnergy => plain(c.annual_energy_kwh, "kWh", 1, precision),
        Row::AnnualCost => plain(c.annual_cost, currency, 2, precision),
        Row::HeatLoad => quantity(Measure::Heat, units, c.heat_load_w, precision),
        Row::Co2 => plain(c.co2_kg_per_year?, "kg", 1, precision),
        Row::EnergySaved => plain(saving?.energy_kwh_per_year, "kWh", 1, precision),
        Row::CostSaved => plain(saving?.cost_per_year, currency, 2, precision),
        Row::HeatSaved => quantity(Measure::Heat, units, saving?.heat_load_w, precision),
        Row::Co2Saved => plain(saving?.co2_kg_per_year?, "kg", 1, precision),
        Row::Payback => payback_text(saving?.payback_years, precision),
    })
}

/// What a design's heat load means for cooling, in one sentence.
pub fn cooling(c: &QuoteColumn, units: UnitSystem, precision: Precision) -> String {
    let heat = quantity(Measure::Heat, units, c.heat_load_w, precision);
    let other = match units {
        UnitSystem::Si => format!(
            "{} Btu/h",
            three_or_exact(c.heat_load_btu_per_hour, precision)
        ),
        UnitSystem::UsCustomary => format!("{} kW", three_or_exact(c.heat_load_w / 1e3, precision)),
    };
    let rise =
        quantity(Measure::RiseRate, units, c.oil_rise_k_per_hour, precision).replace("/min", "");
    if c.heat_load_w <= 0.0 {
        return "No heat goes into the oil: no cooler is needed for this cycle.".into();
    }
    format!(
        "A cooler must take away {heat} ({other}) for as long as the machine runs, at the oil \
         temperature you mean to hold. With none, the oil warms {rise} an hour of running, \
         less what the tank and pipes shed."
    )
}

fn three_or_exact(value: f64, precision: Precision) -> String {
    match precision {
        Precision::ForCustomer => three_figures(value),
        Precision::Exact => grouped(value, 2),
    }
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
    }

    #[test]
    fn payback_reads_in_tenths_under_ten_years() {
        assert_eq!(
            payback_text(Some(0.9375), Precision::ForCustomer),
            "0.9 years"
        );
        assert_eq!(payback_text(Some(0.9375), Precision::Exact), "0.938 years");
        assert_eq!(payback_text(Some(12.4), Precision::ForCustomer), "12 years");
        assert_eq!(
            payback_text(Some(1.02), Precision::ForCustomer),
            "1.0 years"
        );
        assert_eq!(payback_text(None, Precision::ForCustomer), "no saving");
    }
}
