//! The power ledger: where every watt of a phase goes, and the cycle's totals built from it.

use super::finding::Finding;
use super::job::{Oil, Site};
use super::motor::Motor;
use super::units::{BTU_IT, KILOWATT_HOUR};
use serde::Serialize;
use uom::si::f64::{Energy, Power, Time};

/// One phase's power, from the electrical input down to useful work. The items add up to
/// the input exactly (to rounding): see [`PowerLedger::imbalance`].
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Default)]
pub struct PowerLedger {
    #[serde(rename = "electrical_input_w")]
    pub electrical_input: Power,
    /// The motor's own loss (to the air, not the oil).
    #[serde(rename = "motor_loss_w")]
    pub motor_loss: Power,
    /// Leakage, friction and drag inside the pumps.
    #[serde(rename = "pump_internal_loss_w")]
    pub pump_internal_loss: Power,
    /// Unloaded pumps' flow across their unloading valves.
    #[serde(rename = "unloading_loss_w")]
    pub unloading_loss: Power,
    /// Flow over the relief valve at system pressure.
    #[serde(rename = "relief_loss_w")]
    pub relief_loss: Power,
    /// The flow control's drop from pump pressure to what the load needs.
    #[serde(rename = "metering_loss_w")]
    pub metering_loss: Power,
    /// Lines, valves, check valves, back pressure, an open valve centre.
    #[serde(rename = "line_valve_loss_w")]
    pub line_valve_loss: Power,
    /// Force times speed at the cylinder (or the direct demand's flow times pressure).
    #[serde(rename = "useful_power_w")]
    pub useful_power: Power,
}

/// One item of the ledger: where a share of the electrical input ends up.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
pub enum LedgerItem {
    UsefulWork,
    Relief,
    FlowControl,
    Unloading,
    LinesAndValves,
    InsidePumps,
    Motor,
}

impl LedgerItem {
    /// Every item, useful work first and the motor's loss last: the order charts stack them.
    pub const ALL: [LedgerItem; 7] = [
        LedgerItem::UsefulWork,
        LedgerItem::Relief,
        LedgerItem::FlowControl,
        LedgerItem::Unloading,
        LedgerItem::LinesAndValves,
        LedgerItem::InsidePumps,
        LedgerItem::Motor,
    ];

    /// The item in the trade's words.
    pub const fn name(self) -> &'static str {
        match self {
            LedgerItem::UsefulWork => "Useful work",
            LedgerItem::Relief => "Relief valve",
            LedgerItem::FlowControl => "Flow control",
            LedgerItem::Unloading => "Unloading valves",
            LedgerItem::LinesAndValves => "Lines and valves",
            LedgerItem::InsidePumps => "Inside the pumps",
            LedgerItem::Motor => "Motor",
        }
    }
}

impl PowerLedger {
    /// The power going to one item.
    pub fn part(&self, item: LedgerItem) -> Power {
        match item {
            LedgerItem::UsefulWork => self.useful_power,
            LedgerItem::Relief => self.relief_loss,
            LedgerItem::FlowControl => self.metering_loss,
            LedgerItem::Unloading => self.unloading_loss,
            LedgerItem::LinesAndValves => self.line_valve_loss,
            LedgerItem::InsidePumps => self.pump_internal_loss,
            LedgerItem::Motor => self.motor_loss,
        }
    }

    /// The motor's shaft output: the pumps' input.
    pub fn shaft_power(&self) -> Power {
        self.electrical_input - self.motor_loss
    }

    /// Power turned into heat in the oil: every hydraulic loss and the pumps' internal loss.
    pub fn heat_into_oil(&self) -> Power {
        self.pump_internal_loss
            + self.unloading_loss
            + self.relief_loss
            + self.metering_loss
            + self.line_valve_loss
    }

    /// The items' sum less the electrical input, over the input: zero when the ledger closes.
    pub fn imbalance(&self) -> f64 {
        let items = self.motor_loss + self.heat_into_oil() + self.useful_power;
        let input = self.electrical_input.value;
        if input == 0.0 {
            items.value.abs()
        } else {
            (items.value - input) / input
        }
    }
}

/// The cycle as a whole, for one design.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct CycleTotals {
    #[serde(rename = "cycle_time_s")]
    pub cycle_time: Time,
    /// Electrical energy drawn per cycle.
    #[serde(rename = "energy_per_cycle_j")]
    pub energy_per_cycle: Energy,
    #[serde(rename = "average_electrical_w")]
    pub average_electrical: Power,
    #[serde(rename = "peak_electrical_w")]
    pub peak_electrical: Power,
    #[serde(rename = "rms_electrical_w")]
    pub rms_electrical: Power,
    #[serde(rename = "average_shaft_w")]
    pub average_shaft: Power,
    /// The highest shaft power in any phase: checked against rating x service factor.
    #[serde(rename = "peak_shaft_w")]
    pub peak_shaft: Power,
    /// The root-mean-square shaft power over the cycle: what the motor is sized on.
    #[serde(rename = "rms_shaft_w")]
    pub rms_shaft: Power,
    /// Average heat into the oil.
    #[serde(rename = "heat_load_w")]
    pub heat_load: Power,
    pub heat_load_btu_per_hour: f64,
    /// How fast the oil warms with no cooler.
    pub oil_rise_k_per_minute: f64,
    pub annual_energy_kwh: f64,
    /// In the site's currency.
    pub annual_cost: f64,
}

/// Sums a cycle's phases: (ledger, duration in s) pairs.
pub fn cycle_totals(phases: &[(PowerLedger, f64)], site: &Site, oil: &Oil) -> CycleTotals {
    let mut time = 0.0;
    let (mut energy, mut shaft_energy, mut heat_energy) = (0.0, 0.0, 0.0);
    let (mut el_sq, mut shaft_sq) = (0.0, 0.0);
    let (mut peak_el, mut peak_shaft) = (0.0f64, 0.0f64);
    for (ledger, t) in phases {
        let el = ledger.electrical_input.value;
        let shaft = ledger.shaft_power().value;
        time += t;
        energy += el * t;
        shaft_energy += shaft * t;
        heat_energy += ledger.heat_into_oil().value * t;
        el_sq += el * el * t;
        shaft_sq += shaft * shaft * t;
        peak_el = peak_el.max(el);
        peak_shaft = peak_shaft.max(shaft);
    }
    // Validation makes every duration positive, so the cycle time is too.
    let average = |x: f64| if time > 0.0 { x / time } else { 0.0 };
    let heat = average(heat_energy);
    let heat_capacity = oil.volume.value * oil.density.value * oil.specific_heat.value;
    let annual_energy_kwh =
        average(energy) * site.operating_hours_per_year * 3600.0 / KILOWATT_HOUR;
    CycleTotals {
        cycle_time: Time::new::<uom::si::time::second>(time),
        energy_per_cycle: Energy::new::<uom::si::energy::joule>(energy),
        average_electrical: watts(average(energy)),
        peak_electrical: watts(peak_el),
        rms_electrical: watts(average(el_sq).sqrt()),
        average_shaft: watts(average(shaft_energy)),
        peak_shaft: watts(peak_shaft),
        rms_shaft: watts(average(shaft_sq).sqrt()),
        heat_load: watts(heat),
        heat_load_btu_per_hour: heat * 3600.0 / BTU_IT,
        oil_rise_k_per_minute: heat * 60.0 / heat_capacity,
        annual_energy_kwh,
        annual_cost: annual_energy_kwh * site.tariff_per_kwh,
    }
}

/// What the motor's sizing says about the cycle: the RMS load against what it may carry
/// continuously (rating x service factor), the peak against what it may carry briefly (rating x
/// peak allowance). The staging search sizes motors on the same two criteria.
pub fn motor_findings(motor: &Motor, totals: &CycleTotals) -> Vec<Finding> {
    let rated = motor.rated_power.value;
    let mut findings = Vec::new();
    let continuous = rated * motor.service_factor;
    if totals.rms_shaft.value > continuous * (1.0 + 1e-9) {
        findings.push(Finding::MotorRmsOverload {
            rms_w: totals.rms_shaft.value,
            limit_w: continuous,
        });
    }
    let limit = rated * motor.peak_allowance;
    if totals.peak_shaft.value > limit * (1.0 + 1e-9) {
        findings.push(Finding::MotorPeakOverload {
            peak_w: totals.peak_shaft.value,
            limit_w: limit,
        });
    }
    findings
}

/// A proposed design against the baseline.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Comparison {
    pub baseline: String,
    pub proposed: String,
    /// Positive when the proposal draws less.
    #[serde(rename = "average_power_saved_w")]
    pub average_power_saved: Power,
    #[serde(rename = "heat_load_saved_w")]
    pub heat_load_saved: Power,
    /// Positive when the proposal needs a smaller motor.
    #[serde(rename = "rms_shaft_saved_w")]
    pub rms_shaft_saved: Power,
    /// Positive when the proposal's cycle is longer.
    #[serde(rename = "cycle_time_change_s")]
    pub cycle_time_change: Time,
    pub annual_energy_saved_kwh: f64,
    pub annual_cost_saved: f64,
    /// The retrofit price over the yearly saving; none when nothing is saved.
    pub payback_years: Option<f64>,
}

/// A saving smaller than this share of the baseline's figure is rounding noise between two
/// solves of the same machine, not a saving.
pub const NOISE: f64 = 1e-9;

/// `saved` with rounding noise against `baseline` taken as zero.
pub fn denoised(saved: f64, baseline: f64) -> f64 {
    if saved.abs() <= NOISE * baseline.abs() {
        0.0
    } else {
        saved
    }
}

/// The retrofit price over the cost saved a year; none when nothing is saved (or only noise
/// against the baseline's cost).
pub fn simple_payback(retrofit_price: f64, cost_saved: f64, baseline_cost: f64) -> Option<f64> {
    (denoised(cost_saved, baseline_cost) > 0.0).then(|| retrofit_price / cost_saved)
}

pub fn compare(
    baseline: (&str, &CycleTotals),
    proposed: (&str, &CycleTotals),
    retrofit_price: f64,
) -> Comparison {
    let (b, p) = (baseline.1, proposed.1);
    let saved = b.annual_cost - p.annual_cost;
    Comparison {
        baseline: baseline.0.to_string(),
        proposed: proposed.0.to_string(),
        average_power_saved: b.average_electrical - p.average_electrical,
        heat_load_saved: b.heat_load - p.heat_load,
        rms_shaft_saved: b.rms_shaft - p.rms_shaft,
        cycle_time_change: p.cycle_time - b.cycle_time,
        annual_energy_saved_kwh: b.annual_energy_kwh - p.annual_energy_kwh,
        annual_cost_saved: saved,
        payback_years: simple_payback(retrofit_price, saved, b.annual_cost),
    }
}

pub(crate) fn watts(w: f64) -> Power {
    Power::new::<uom::si::power::watt>(w)
}

#[cfg(test)]
mod tests {
    use super::*;
    use uom::si::f64::{AngularVelocity, Energy};

    fn totals(rms_w: f64, peak_w: f64) -> CycleTotals {
        let w = watts;
        CycleTotals {
            cycle_time: Time::new::<uom::si::time::second>(10.0),
            energy_per_cycle: Energy::new::<uom::si::energy::joule>(0.0),
            average_electrical: w(0.0),
            peak_electrical: w(0.0),
            rms_electrical: w(0.0),
            average_shaft: w(0.0),
            peak_shaft: w(peak_w),
            rms_shaft: w(rms_w),
            heat_load: w(0.0),
            heat_load_btu_per_hour: 0.0,
            oil_rise_k_per_minute: 0.0,
            annual_energy_kwh: 0.0,
            annual_cost: 0.0,
        }
    }

    fn motor(service_factor: f64, peak_allowance: f64) -> Motor {
        Motor {
            rated_power: watts(10_000.0),
            full_load_speed: AngularVelocity::new::<uom::si::angular_velocity::revolution_per_minute>(
                1450.0,
            ),
            full_load_efficiency: 0.9,
            fixed_loss_share: 0.35,
            service_factor,
            peak_allowance,
        }
    }

    #[test]
    fn the_rms_is_judged_on_the_service_factor_and_the_peak_on_the_peak_allowance() {
        let rms = |f: &[Finding]| {
            f.iter()
                .any(|f| matches!(f, Finding::MotorRmsOverload { .. }))
        };
        let peak = |f: &[Finding]| {
            f.iter()
                .any(|f| matches!(f, Finding::MotorPeakOverload { .. }))
        };
        // 11 kW RMS on a 10 kW motor: over at service factor 1.0, within 1.15.
        assert!(rms(&motor_findings(&motor(1.0, 1.25), &totals(11e3, 11e3))));
        assert!(!rms(&motor_findings(
            &motor(1.15, 1.25),
            &totals(11e3, 11e3)
        )));
        // A 13 kW peak: over 1.25 x 10 kW = 12.5 kW, within 1.5 x 10 kW.
        assert!(peak(&motor_findings(&motor(1.0, 1.25), &totals(9e3, 13e3))));
        assert!(!peak(&motor_findings(&motor(1.0, 1.5), &totals(9e3, 13e3))));
        // The peak allowance, not the service factor, judges the peak.
        assert!(peak(&motor_findings(&motor(1.4, 1.25), &totals(9e3, 13e3))));
        assert!(motor_findings(&motor(1.0, 1.25), &totals(10e3, 12.5e3)).is_empty());
    }
}
