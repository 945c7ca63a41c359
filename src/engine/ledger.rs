//! The power ledger: where every watt of a phase goes, and the cycle's totals built from it.

use super::finding::Finding;
use super::motor::{Motor, RMS_LONGEST_CYCLE_S, STOPPED_COOLING_SHARE};
use super::site::{Oil, Site};
use super::units::{kilowatt_hours, seconds_of, watts};
use super::units::{BTU_IT, KILOWATT_HOUR};
use serde::Serialize;
use uom::si::energy::kilowatt_hour;
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
    /// A variable-speed drive's converter loss (to the cabinet's air); none at fixed speed.
    #[serde(rename = "drive_loss_w", skip_serializing_if = "is_nothing")]
    pub drive_loss: Power,
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

fn is_nothing(power: &Power) -> bool {
    power.value == 0.0
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
    Drive,
}

impl LedgerItem {
    /// How many items there are.
    pub const COUNT: usize = 8;

    /// Every item, useful work first and the motor's and drive's losses last: the order charts
    /// stack them.
    pub const ALL: [LedgerItem; LedgerItem::COUNT] = [
        LedgerItem::UsefulWork,
        LedgerItem::Relief,
        LedgerItem::FlowControl,
        LedgerItem::Unloading,
        LedgerItem::LinesAndValves,
        LedgerItem::InsidePumps,
        LedgerItem::Motor,
        LedgerItem::Drive,
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
            LedgerItem::Motor => "Inside the motor",
            LedgerItem::Drive => "Inside the drive",
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
            LedgerItem::Drive => self.drive_loss,
        }
    }

    /// The motor's shaft output: the pumps' input.
    pub fn shaft_power(&self) -> Power {
        self.electrical_input - self.motor_loss - self.drive_loss
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
        let items = self.motor_loss + self.drive_loss + self.heat_into_oil() + self.useful_power;
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
    /// The root-mean-square electrical input over the cycle's time (stopped time counts in
    /// full: this is the supply's figure, not the motor's heating).
    #[serde(rename = "rms_electrical_w")]
    pub rms_electrical: Power,
    #[serde(rename = "average_shaft_w")]
    pub average_shaft: Power,
    /// The highest shaft load in any phase: checked against rating x peak allowance. Below
    /// the motor's full-load speed (on a variable-speed drive) a phase's load is its torque at
    /// that speed (shaft power over speed share): the torque is what strains and heats it.
    #[serde(rename = "peak_shaft_w")]
    pub peak_shaft: Power,
    /// The root-mean-square shaft load (as for the peak) over the cycle: what the motor is
    /// sized on. Each second counts by how well the motor cools in it: stopped at
    /// [`STOPPED_COOLING_SHARE`] of running time (a stopped motor cools less), and on a
    /// variable-speed drive as its cooling allows at that speed
    /// ([`MotorCooling::cooling_weight`](super::drive::MotorCooling::cooling_weight)), so a
    /// cycle with stopped idles has a higher RMS than its plain time average:
    /// sqrt(sum(P^2 t) / sum(w t)).
    #[serde(rename = "rms_shaft_w")]
    pub rms_shaft: Power,
    /// Average heat into the oil.
    #[serde(rename = "heat_load_w")]
    pub heat_load: Power,
    pub heat_load_btu_per_hour: f64,
    /// How fast the oil warms with no cooler.
    pub oil_rise_k_per_minute: f64,
    #[serde(
        rename = "annual_energy_kwh",
        serialize_with = "super::units::as_kilowatt_hours"
    )]
    pub annual_energy: Energy,
    /// In the site's currency: the energy at the tariff, and the demand charge when the site
    /// has one.
    pub annual_cost: f64,
    /// The highest average electrical input over the tariff's demand interval, with what it
    /// costs a year (twelve months of the site's demand charge); absent when the site has no
    /// demand charge.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub demand: Option<DemandCharge>,
}

#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct DemandCharge {
    #[serde(rename = "billed_demand_w")]
    pub billed_demand: Power,
    pub annual_cost: f64,
}

/// The highest average of the cycle's electrical input over any window of `interval` seconds,
/// the cycle repeating. The input is constant within a phase, so a window's average changes
/// linearly between the starts where one of its ends crosses a phase boundary: the highest is
/// at one of those.
pub fn highest_average_over(phases: &[TimedLedger], interval: f64) -> f64 {
    let time: f64 = phases.iter().map(|p| p.duration.value).sum();
    if time <= 0.0 || interval <= 0.0 {
        return 0.0;
    }
    let power = |p: &TimedLedger| p.ledger.electrical_input.value;
    // Energy from the cycle's start to time t, the cycle repeating.
    let energy_to = |t: f64| {
        let cycles = (t / time).floor();
        let mut e = cycles
            * phases
                .iter()
                .map(|p| power(p) * p.duration.value)
                .sum::<f64>();
        let mut left = t - cycles * time;
        for p in phases {
            let d = p.duration.value.min(left);
            e += power(p) * d;
            left -= d;
            if left <= 0.0 {
                break;
            }
        }
        e
    };
    let mut boundaries = vec![0.0];
    for p in phases {
        boundaries.push(boundaries.last().unwrap_or(&0.0) + p.duration.value);
    }
    boundaries
        .iter()
        .flat_map(|&b| [b, (b - interval).rem_euclid(time)])
        .map(|start| (energy_to(start + interval) - energy_to(start)) / interval)
        .fold(0.0, f64::max)
}

/// One phase as the cycle's totals see it.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct TimedLedger {
    pub ledger: PowerLedger,
    /// How long the phase lasts.
    pub duration: Time,
    /// Whether the motor turns in the phase (an idle may stop it).
    pub motor_running: bool,
    /// The shaft's speed as a share of the motor's full-load speed (1 at fixed speed).
    pub speed_share: f64,
    /// How well the motor cools in the phase against running at full-load speed (1 running at
    /// fixed speed, [`STOPPED_COOLING_SHARE`] stopped).
    pub cooling_weight: f64,
}

impl TimedLedger {
    /// A phase of a motor at fixed speed: running at full speed, or stopped.
    pub fn fixed_speed(ledger: PowerLedger, duration: Time, motor_running: bool) -> TimedLedger {
        TimedLedger {
            ledger,
            duration,
            motor_running,
            speed_share: if motor_running { 1.0 } else { 0.0 },
            cooling_weight: if motor_running {
                1.0
            } else {
                STOPPED_COOLING_SHARE
            },
        }
    }

    /// The shaft load that strains and heats the motor as this phase does: its shaft power,
    /// over its speed share below full-load speed (the phase's torque at full-load speed).
    pub fn motor_load(&self) -> f64 {
        let shaft = self.ledger.shaft_power().value;
        if self.speed_share > 0.0 && self.speed_share < 1.0 {
            shaft / self.speed_share
        } else {
            shaft
        }
    }
}

/// Sums a cycle's phases.
pub fn cycle_totals(phases: &[TimedLedger], site: &Site, oil: &Oil) -> CycleTotals {
    let mut time = 0.0;
    // The time the motor's RMS load is averaged over: stopped time counts less.
    let mut cooling_time = 0.0;
    let (mut energy, mut shaft_energy, mut heat_energy) = (0.0, 0.0, 0.0);
    let (mut el_sq, mut shaft_sq) = (0.0, 0.0);
    let (mut peak_el, mut peak_shaft) = (0.0f64, 0.0f64);
    for phase in phases {
        let (ledger, t) = (&phase.ledger, &phase.duration.value);
        let el = ledger.electrical_input.value;
        let shaft = ledger.shaft_power().value;
        let load = phase.motor_load();
        time += t;
        cooling_time += phase.cooling_weight * t;
        energy += el * t;
        shaft_energy += shaft * t;
        heat_energy += ledger.heat_into_oil().value * t;
        el_sq += el * el * t;
        shaft_sq += load * load * t;
        peak_el = peak_el.max(el);
        peak_shaft = peak_shaft.max(load);
    }
    // Validation makes every duration positive, so the cycle time is too.
    let average = |x: f64| if time > 0.0 { x / time } else { 0.0 };
    let heat = average(heat_energy);
    let heat_capacity = oil.heat_capacity();
    let annual_energy_kwh =
        average(energy) * site.operating_hours_per_year * 3600.0 / KILOWATT_HOUR;
    let demand = site.demand_charge.map(|per_kw_month| {
        let billed = highest_average_over(phases, super::site::DEMAND_INTERVAL_S);
        DemandCharge {
            billed_demand: watts(billed),
            annual_cost: 12.0 * billed / 1e3 * per_kw_month,
        }
    });
    CycleTotals {
        cycle_time: Time::new::<uom::si::time::second>(time),
        energy_per_cycle: Energy::new::<uom::si::energy::joule>(energy),
        average_electrical: watts(average(energy)),
        peak_electrical: watts(peak_el),
        rms_electrical: watts(average(el_sq).sqrt()),
        average_shaft: watts(average(shaft_energy)),
        peak_shaft: watts(peak_shaft),
        rms_shaft: watts(if cooling_time > 0.0 {
            (shaft_sq / cooling_time).sqrt()
        } else {
            0.0
        }),
        heat_load: watts(heat),
        heat_load_btu_per_hour: heat * 3600.0 / BTU_IT,
        oil_rise_k_per_minute: heat * 60.0 / heat_capacity,
        annual_energy: kilowatt_hours(annual_energy_kwh),
        annual_cost: annual_energy_kwh * site.tariff_per_kwh
            + demand.map_or(0.0, |d| d.annual_cost),
        demand,
    }
}

/// How many times a cycle the motor starts: once after each span of phases with it stopped
/// (the cycle repeats, so a span at its end runs on into the span at its start).
pub fn motor_starts_per_cycle(phases: &[TimedLedger]) -> usize {
    let n = phases.len();
    (0..n)
        .filter(|&i| !phases[i].motor_running && phases[(i + 1) % n].motor_running)
        .count()
}

/// What the motor's sizing says about the cycle: the RMS load against what it may carry
/// continuously (rating x service factor), the peak against what it may carry briefly (rating x
/// peak allowance); the staging search sizes motors on the same two criteria. Then whether the
/// RMS can be trusted (a cycle longer than [`RMS_LONGEST_CYCLE_S`] whose peak the motor could
/// not carry continuously), and the starts an hour when idles stop the motor, against what a
/// motor of its size and speed may take ([`Motor::allowed_starts_per_hour`]).
///
/// On a variable-speed drive (`driven`) the RMS load counts each second by the motor's cooling
/// at its speed: when only that puts the RMS over the limit (with every running second cooled
/// as at full speed it would not be), the finding says the motor runs too slowly at too much
/// torque for its cooling. A converter ramps the motor up, so its stops are not starts.
pub fn motor_findings(
    motor: &Motor,
    totals: &CycleTotals,
    phases: &[TimedLedger],
    driven: bool,
) -> Vec<Finding> {
    let rated = motor.rated_power.value;
    let mut findings = Vec::new();
    let continuous = rated * motor.service_factor;
    if totals.rms_shaft.value > continuous * (1.0 + 1e-9) {
        let rms = watts(totals.rms_shaft.value);
        let limit = watts(continuous);
        findings.push(
            if !driven || rms_cooled_at_full_speed(phases) > continuous * (1.0 + 1e-9) {
                Finding::MotorRmsOverload { rms, limit }
            } else {
                let slowest = phases
                    .iter()
                    .filter(|p| p.motor_running)
                    .map(|p| p.speed_share)
                    .fold(f64::INFINITY, f64::min);
                Finding::MotorHotAtLowSpeed {
                    rms,
                    limit,
                    slowest_share: slowest,
                }
            },
        );
    }
    let limit = rated * motor.peak_allowance;
    if totals.peak_shaft.value > limit * (1.0 + 1e-9) {
        findings.push(Finding::MotorPeakOverload {
            peak: watts(totals.peak_shaft.value),
            limit: watts(limit),
        });
    }
    let cycle = totals.cycle_time.value;
    if cycle > RMS_LONGEST_CYCLE_S && totals.peak_shaft.value > continuous * (1.0 + 1e-9) {
        findings.push(Finding::RmsCycleTooLong {
            cycle: seconds_of(cycle),
            longest: seconds_of(RMS_LONGEST_CYCLE_S),
        });
    }
    let starts = if driven {
        0
    } else {
        motor_starts_per_cycle(phases)
    };
    if starts > 0 && cycle > 0.0 {
        let per_hour = starts as f64 * 3600.0 / cycle;
        let allowed = motor.allowed_starts_per_hour();
        if per_hour > allowed * (1.0 + 1e-9) {
            findings.push(Finding::MotorStartsTooOften {
                starts_per_hour: per_hour,
                allowed_per_hour: allowed,
            });
        }
    }
    findings
}

/// The cycle's RMS motor load with every running second cooled as at full-load speed.
fn rms_cooled_at_full_speed(phases: &[TimedLedger]) -> f64 {
    let (mut squares, mut cooling) = (0.0, 0.0);
    for p in phases {
        let t = p.duration.value;
        let load = p.motor_load();
        squares += load * load * t;
        cooling += if p.motor_running {
            1.0f64.max(p.cooling_weight)
        } else {
            p.cooling_weight
        } * t;
    }
    if cooling > 0.0 {
        (squares / cooling).sqrt()
    } else {
        0.0
    }
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
    #[serde(
        rename = "annual_energy_saved_kwh",
        serialize_with = "super::units::as_kilowatt_hours"
    )]
    pub annual_energy_saved: Energy,
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
        annual_energy_saved: kilowatt_hours(
            b.annual_energy.get::<kilowatt_hour>() - p.annual_energy.get::<kilowatt_hour>(),
        ),
        annual_cost_saved: saved,
        payback_years: simple_payback(retrofit_price, saved, b.annual_cost),
    }
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
            annual_energy: kilowatt_hours(0.0),
            annual_cost: 0.0,
            demand: None,
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
            electrical: None,
        }
    }

    fn phase(shaft_w: f64, seconds: f64, running: bool) -> TimedLedger {
        TimedLedger::fixed_speed(
            PowerLedger {
                electrical_input: watts(shaft_w),
                useful_power: watts(shaft_w),
                ..PowerLedger::default()
            },
            seconds_of(seconds),
            running,
        )
    }

    #[test]
    fn a_start_follows_each_span_of_stopped_phases_round_the_cycle() {
        let cycle = |running: &[bool]| {
            running
                .iter()
                .map(|r| phase(1.0, 1.0, *r))
                .collect::<Vec<_>>()
        };
        assert_eq!(motor_starts_per_cycle(&cycle(&[true, true])), 0);
        assert_eq!(motor_starts_per_cycle(&cycle(&[false, false])), 0);
        assert_eq!(motor_starts_per_cycle(&cycle(&[true, false])), 1);
        assert_eq!(
            motor_starts_per_cycle(&cycle(&[true, false, false, true])),
            1
        );
        assert_eq!(
            motor_starts_per_cycle(&cycle(&[true, false, true, false])),
            2
        );
        // A stop at the end runs on into the one at the start: one span.
        assert_eq!(motor_starts_per_cycle(&cycle(&[false, true, false])), 1);
        assert_eq!(motor_starts_per_cycle(&[]), 0);
    }

    #[test]
    fn stopped_time_counts_a_third_in_the_shaft_rms_only() {
        // 3 kW for 10 s, stopped 30 s: sqrt(9e6 x 10 / (10 + 30 / 3)) = 2121.32 W; the supply's
        // RMS over the plain 40 s, sqrt(9e6 x 10 / 40) = 1500 W.
        let site = Site {
            location: String::new(),
            operating_hours_per_year: 1000.0,
            tariff_per_kwh: 0.2,
            currency: "EUR".into(),
            retrofit_price: 0.0,
            grid_factor: None,
            demand_charge: None,
            power_factor_threshold: None,
        };
        let oil = Oil::mineral(uom::si::f64::Volume::new::<uom::si::volume::liter>(100.0));
        let t = cycle_totals(
            &[phase(3e3, 10.0, true), phase(0.0, 30.0, false)],
            &site,
            &oil,
        );
        assert!((t.rms_shaft.value - (9e6f64 * 10.0 / 20.0).sqrt()).abs() < 1e-9);
        assert!((t.rms_electrical.value - 1500.0).abs() < 1e-9);
        assert_eq!(t.cycle_time.value, 40.0);
        // All stopped: nothing, not a NaN.
        let t = cycle_totals(&[phase(0.0, 30.0, false)], &site, &oil);
        assert_eq!(t.rms_shaft.value, 0.0);
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
        assert!(rms(&motor_findings(
            &motor(1.0, 1.25),
            &totals(11e3, 11e3),
            &[],
            false
        )));
        assert!(!rms(&motor_findings(
            &motor(1.15, 1.25),
            &totals(11e3, 11e3),
            &[],
            false
        )));
        // A 13 kW peak: over 1.25 x 10 kW = 12.5 kW, within 1.5 x 10 kW.
        assert!(peak(&motor_findings(
            &motor(1.0, 1.25),
            &totals(9e3, 13e3),
            &[],
            false
        )));
        assert!(!peak(&motor_findings(
            &motor(1.0, 1.5),
            &totals(9e3, 13e3),
            &[],
            false
        )));
        // The peak allowance, not the service factor, judges the peak.
        assert!(peak(&motor_findings(
            &motor(1.4, 1.25),
            &totals(9e3, 13e3),
            &[],
            false
        )));
        assert!(motor_findings(&motor(1.0, 1.25), &totals(10e3, 12.5e3), &[], false).is_empty());
    }
}
