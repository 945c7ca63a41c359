//! The retrofit comparison as a customer reads it: every design of a job side by side, with
//! the figures a quote needs (motor size, cycle time and parts per hour, energy and cost per
//! year, heat, savings and simple payback against the baseline, CO2 from the site's grid
//! factor), and the rounding that keeps false precision out of a quote while the exact values
//! stay in the report.

use super::job::Job;
use super::JobReport;
use serde::Serialize;

/// One design's column of the comparison. Exact values; round with [`for_customer`] to show.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct QuoteColumn {
    pub name: String,
    pub motor_rated_w: f64,
    pub peak_shaft_w: f64,
    pub rms_shaft_w: f64,
    pub cycle_time_s: f64,
    /// 3600 / cycle time: one part per cycle.
    pub parts_per_hour: f64,
    pub energy_per_cycle_j: f64,
    pub annual_energy_kwh: f64,
    /// Average heat into the oil (W): what a cooler must take away at steady temperature.
    pub heat_load_w: f64,
    pub annual_cost: f64,
    /// Annual kWh x the site's grid factor; none when the site gives none.
    pub co2_kg_per_year: Option<f64>,
    /// Against the baseline (none for the baseline itself): energy and cost saved per year
    /// (negative when the design costs more), and the retrofit price over the cost saved
    /// (none when nothing is saved).
    pub against_baseline: Option<Saving>,
}

#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Saving {
    pub energy_kwh_per_year: f64,
    pub cost_per_year: f64,
    pub co2_kg_per_year: Option<f64>,
    pub payback_years: Option<f64>,
}

/// The comparison of every design of `job`, from its solved `report`.
pub fn columns(job: &Job, report: &JobReport) -> Vec<QuoteColumn> {
    let grid = job.site.grid_factor;
    let baseline = report.designs.first().map(|d| &d.totals);
    job.designs
        .iter()
        .zip(&report.designs)
        .enumerate()
        .map(|(i, (design, r))| {
            let t = &r.totals;
            let against_baseline = baseline.filter(|_| i > 0).map(|b| {
                let energy = b.annual_energy_kwh - t.annual_energy_kwh;
                let cost = b.annual_cost - t.annual_cost;
                Saving {
                    energy_kwh_per_year: energy,
                    cost_per_year: cost,
                    co2_kg_per_year: grid.map(|g| energy * g),
                    payback_years: (cost > 0.0).then(|| job.site.retrofit_price / cost),
                }
            });
            let cycle = t.cycle_time.value;
            QuoteColumn {
                name: design.name.clone(),
                motor_rated_w: design.motor.rated_power.value,
                peak_shaft_w: t.peak_shaft.value,
                rms_shaft_w: t.rms_shaft.value,
                cycle_time_s: cycle,
                parts_per_hour: if cycle > 0.0 { 3600.0 / cycle } else { 0.0 },
                energy_per_cycle_j: t.energy_per_cycle.value,
                annual_energy_kwh: t.annual_energy_kwh,
                heat_load_w: t.heat_load.value,
                annual_cost: t.annual_cost,
                co2_kg_per_year: grid.map(|g| t.annual_energy_kwh * g),
                against_baseline,
            }
        })
        .collect()
}

/// `value` to `significant` figures (at least 1): what a customer's quote shows. 12,345 kWh
/// at three figures is 12,300; 0.0123 is 0.0123. Zero and non-finite values come back as
/// they are.
pub fn for_customer(value: f64, significant: u32) -> f64 {
    if value == 0.0 || !value.is_finite() {
        return value;
    }
    let digits = significant.max(1) as i32;
    let magnitude = value.abs().log10().floor() as i32;
    let scale = 10f64.powi(digits - 1 - magnitude);
    let rounded = (value * scale).round() / scale;
    // Dividing again by the scale can leave a tail (0.1 + 0.2): print-clean it.
    let decimals = (digits - 1 - magnitude).max(0) as usize;
    format!("{rounded:.decimals$}").parse().unwrap_or(rounded)
}

/// A payback period as a quote gives it: to a tenth of a year under ten years, whole years
/// above.
pub fn payback_for_customer(years: f64) -> f64 {
    if years < 10.0 {
        (years * 10.0).round() / 10.0
    } else {
        years.round()
    }
}
