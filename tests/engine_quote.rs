//! The retrofit comparison's figures (engine `quote`) on a hand-worked invented case, and the
//! rounding a customer's quote uses. No published annual-energy-cost example is named yet: the
//! case below is our own, worked in its comments.

mod common;
use common::*;
use phasewise::engine::quote::{self, for_customer, payback_for_customer};
use phasewise::engine::{CycleTotals, JobReport};
use uom::si::f64::{Energy, Power, Time};

fn totals(cycle_s: f64, kwh: f64, cost: f64, heat_w: f64) -> CycleTotals {
    let w = |v: f64| Power::new::<uom::si::power::watt>(v);
    CycleTotals {
        cycle_time: Time::new::<uom::si::time::second>(cycle_s),
        energy_per_cycle: Energy::new::<uom::si::energy::joule>(
            kwh / 4000.0 * 3.6e6 * cycle_s / 3600.0,
        ),
        average_electrical: w(kwh / 4000.0 * 1e3),
        peak_electrical: w(0.0),
        rms_electrical: w(0.0),
        average_shaft: w(0.0),
        peak_shaft: w(9e3),
        rms_shaft: w(6e3),
        heat_load: w(heat_w),
        heat_load_btu_per_hour: 0.0,
        oil_rise_k_per_minute: 0.0,
        annual_energy_kwh: kwh,
        annual_cost: cost,
    }
}

#[test]
fn a_retrofit_worked_by_hand() {
    // Invented: 4000 h a year at 0.20 per kWh, retrofit 3000. As found averages 10 kW: 40,000
    // kWh, 8,000 a year; proposed 6 kW: 24,000 kWh, 4,800 a year. Saved 16,000 kWh and 3,200
    // a year: payback 3000 / 3200 = 0.9375 years. Grid 0.4 kg/kWh: 16,000 and 9,600 kg a
    // year, 6,400 kg saved. Cycles of 30 s and 32 s: 120 and 112.5 parts an hour.
    let mut job = job(vec![idle("wait", 30.0)], vec![]);
    let d = design(
        "As found",
        motor(15.0, 1500.0, 0.9),
        vec![],
        ideal_pump(40.0),
        relief(
            phasewise::engine::valve::ReliefKind::PilotOperated,
            150.0,
            80.0,
            0.97,
        ),
        1,
    );
    let mut p = d.clone();
    p.name = "Proposed".into();
    p.motor.rated_power = kw(11.0);
    job.designs = vec![d, p];
    job.site.grid_factor = Some(0.4);
    assert_eq!(
        (
            job.site.operating_hours_per_year,
            job.site.tariff_per_kwh,
            job.site.retrofit_price
        ),
        (4000.0, 0.20, 3000.0)
    );
    let report = JobReport {
        designs: vec![
            phasewise::engine::DesignReport {
                name: "As found".into(),
                phases: vec![],
                totals: totals(30.0, 40_000.0, 8_000.0, 7_000.0),
                findings: vec![],
            },
            phasewise::engine::DesignReport {
                name: "Proposed".into(),
                phases: vec![],
                totals: totals(32.0, 24_000.0, 4_800.0, 3_500.0),
                findings: vec![],
            },
        ],
        comparisons: vec![],
    };
    let c = quote::columns(&job, &report);
    assert_eq!(c.len(), 2);
    assert!(c[0].against_baseline.is_none());
    assert_eq!(c[0].motor_rated_w, 15e3);
    assert_eq!(c[1].motor_rated_w, 11e3);
    assert_close(c[0].parts_per_hour, 120.0, 1e-12, "parts per hour");
    assert_close(c[1].parts_per_hour, 112.5, 1e-12, "parts per hour");
    assert_close(c[0].co2_kg_per_year.unwrap(), 16_000.0, 1e-12, "CO2");
    assert_close(c[1].co2_kg_per_year.unwrap(), 9_600.0, 1e-12, "CO2");
    let s = c[1].against_baseline.unwrap();
    assert_close(s.energy_kwh_per_year, 16_000.0, 1e-12, "kWh saved");
    assert_close(s.cost_per_year, 3_200.0, 1e-12, "cost saved");
    assert_close(s.co2_kg_per_year.unwrap(), 6_400.0, 1e-12, "CO2 saved");
    assert_close(s.payback_years.unwrap(), 0.9375, 1e-12, "payback");
    assert_eq!(payback_for_customer(s.payback_years.unwrap()), 0.9);

    // A design that costs more has no payback; no grid factor, no CO2.
    job.site.grid_factor = None;
    let mut worse = report.clone();
    worse.designs[1].totals = totals(30.0, 45_000.0, 9_000.0, 8_000.0);
    let c = quote::columns(&job, &worse);
    let s = c[1].against_baseline.unwrap();
    assert_eq!(
        (s.payback_years, s.co2_kg_per_year, c[1].co2_kg_per_year),
        (None, None, None)
    );
    assert_close(s.cost_per_year, -1_000.0, 1e-12, "costs more");
}

#[test]
fn a_quote_shows_no_false_precision() {
    assert_eq!(for_customer(12_345.0, 3), 12_300.0);
    assert_eq!(for_customer(0.012_345, 3), 0.0123);
    assert_eq!(for_customer(-987.6, 2), -990.0);
    assert_eq!(for_customer(0.1 + 0.2, 1), 0.3);
    assert_eq!(for_customer(99.96, 3), 100.0);
    assert_eq!(for_customer(0.0, 3), 0.0);
    assert!(for_customer(f64::NAN, 3).is_nan());
    assert_eq!(payback_for_customer(0.9375), 0.9);
    assert_eq!(payback_for_customer(12.6), 13.0);
}
