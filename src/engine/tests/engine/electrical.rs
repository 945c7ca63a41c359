//! What the motor draws from the line (engine `electrical`): the nameplate met at full load, a
//! maker's part-load power factors, the no-load current, the current rising with the load, and
//! in every running phase of a solved cycle the current and power factor that give the
//! ledger's input (sqrt(3) V I PF), with a finding where a clamp-meter reading differs.

use crate::common::*;
use phasewise_engine::electrical::{full_load_power_factor, line_draw, NO_LOAD_CURRENT_SHARE};
use phasewise_engine::finding::Finding;
use phasewise_engine::motor::{ElectricalRating, Motor};
use phasewise_engine::units::HORSEPOWER;
use phasewise_engine::valve::{IdlePath, ReliefKind};
use phasewise_engine::{solve, Job};
use uom::si::electric_current::ampere;
use uom::si::electric_potential::volt;
use uom::si::f64::{ElectricCurrent, ElectricPotential};

fn rating(volts: f64, amps: f64, power_factor: Option<f64>) -> ElectricalRating {
    ElectricalRating {
        voltage: ElectricPotential::new::<volt>(volts),
        full_load_current: ElectricCurrent::new::<ampere>(amps),
        power_factor,
    }
}

/// The current and power factor at shaft load `load` (a share of the rating), with the input
/// the engine's part-load loss model gives.
fn at_load(m: &Motor, r: &ElectricalRating, load: f64) -> (f64, f64) {
    let shaft = m.rated_power.value * load;
    let input = shaft + m.loss(shaft);
    let draw = line_draw(m, r, kw(input / 1e3), kw(shaft / 1e3));
    (draw.current.get::<ampere>(), draw.power_factor)
}

/// At full load the motor draws its nameplate current; with no power factor printed, the one
/// the rest of the nameplate gives: P / (eta sqrt(3) V I) (the relation of the US DOE's MEASUR
/// motor power factor calculation). 7.5 kW, 90 %, 400 V, 15 A: 7,500 / (0.9 x 1.7321 x 400 x
/// 15) = 0.8019.
#[test]
fn the_nameplate_is_met_at_full_load() {
    let m = motor(7.5, 1455.0, 0.90);
    let r = rating(400.0, 15.0, None);
    assert_close(
        full_load_power_factor(&m, &r),
        0.8019,
        1e-4,
        "PF from the nameplate",
    );
    let (current, pf) = at_load(&m, &r, 1.0);
    assert_close(current, 15.0, 1e-12, "full-load current");
    assert_close(pf, full_load_power_factor(&m, &r), 1e-12, "full-load PF");
}

/// A maker's published datasheet, for illustration (MQSP-100L14FC, 3 hp, 460 V, 1740 rpm):
/// efficiency 89.5 / 90.5 / 89.0 % and power factor 0.87 / 0.82 / 0.72 at full, 3/4 and 1/2
/// load. Given its efficiencies, the model's power factor is within 0.05 at 3/4 and 1/2 load
/// (the model's no-load current is a rule of thumb, a third of full load; this small motor's
/// own is higher, so the model is a little high at half load); and the engine's part-load loss
/// model (a typical fixed share of the full-load loss) gives its efficiency there within one
/// point.
#[test]
fn part_load_power_factor_follows_a_makers_datasheet() {
    let rated = 3.0 * HORSEPOWER;
    let m = motor(rated / 1e3, 1740.0, 0.895);
    let full_load_amps = rated / (0.895 * 3f64.sqrt() * 460.0 * 0.87);
    let r = rating(460.0, full_load_amps, Some(0.87));
    for (load, efficiency, published) in [(0.75, 0.905, 0.82), (0.5, 0.89, 0.72)] {
        let shaft = rated * load;
        let draw = line_draw(&m, &r, kw(shaft / efficiency / 1e3), kw(shaft / 1e3));
        assert!(
            (draw.power_factor - published).abs() <= 0.05,
            "at {load}: {} against {published}",
            draw.power_factor
        );
        let modelled = shaft / (shaft + m.loss(shaft));
        assert!(
            (modelled - efficiency).abs() <= 0.01,
            "efficiency at {load}: {modelled} against {efficiency}"
        );
    }
}

/// Unloaded, the motor draws about a third of its full-load current (EASA, "No-load current
/// basics", 2005: a rule of thumb, common practice), nearly all of it magnetising, so its
/// power factor is low ("At no load, power factor can drop below 0.20", UConn ITAC training
/// notes on electric motors).
#[test]
fn unloaded_the_motor_draws_a_third_of_its_current_at_a_low_power_factor() {
    let m = motor(7.5, 1455.0, 0.90);
    let r = rating(400.0, 15.0, None);
    let (current, pf) = at_load(&m, &r, 0.0);
    assert!(current >= 15.0 * NO_LOAD_CURRENT_SHARE, "{current}");
    assert!(current <= 15.0 * NO_LOAD_CURRENT_SHARE * 1.01, "{current}");
    assert!(pf < 0.2, "{pf}");
}

/// The current rises with the load, and so does the power factor up to full load, for small
/// and large motors, with the power factor printed or not.
#[test]
fn the_current_and_the_power_factor_rise_with_the_load() {
    let cases = [
        (motor(2.2, 1420.0, 0.84), rating(400.0, 4.9, None)),
        (motor(7.5, 1455.0, 0.90), rating(400.0, 15.0, Some(0.82))),
        (motor(90.0, 1485.0, 0.95), rating(690.0, 95.0, Some(0.86))),
        (motor(37.0, 2950.0, 0.93), rating(460.0, 58.7, Some(0.85))),
    ];
    for (m, r) in cases {
        let mut last = (0.0, 0.0);
        for step in 0..=24 {
            let load = f64::from(step) * 0.05;
            let (current, pf) = at_load(&m, &r, load);
            if step > 0 {
                assert!(
                    current > last.0,
                    "current at {load}: {current} after {}",
                    last.0
                );
                if load <= 1.0 {
                    assert!(pf > last.1, "PF at {load}: {pf} after {}", last.1);
                }
            }
            last = (current, pf);
        }
    }
}

/// A high-low press with the motor's electrical nameplate, its last phase idling with the
/// motor stopped.
fn press_with_nameplate() -> Job {
    let mut cycle = high_low_cycle();
    cycle.push(idle("motor off", 20.0));
    let mut m = motor(11.0, 1460.0, 0.91);
    m.electrical = Some(rating(400.0, 21.5, None));
    let mut d = design(
        "as found",
        m,
        vec![stage(
            fixed_pump(40.0, 0.93, 200.0, 0.88, 0.2),
            50.0,
            3.0,
            0.5,
        )],
        fixed_pump(8.0, 0.93, 200.0, 0.88, 0.1),
        relief(ReliefKind::PilotOperated, 140.0, 80.0, 0.97),
        cycle.len(),
    );
    d.phase_settings.last_mut().unwrap().idle_path = IdlePath::MotorStopped;
    job(cycle, vec![d])
}

/// In every running phase sqrt(3) V I PF is the ledger's electrical input; a stopped phase
/// draws nothing and shows no current.
#[test]
fn the_current_and_the_ledger_agree_in_every_phase() {
    let report = solve(&press_with_nameplate()).unwrap();
    let phases = &report.designs[0].phases;
    for phase in phases {
        match (&phase.line, phase.point.motor_running) {
            (Some(line), true) => {
                let input = 3f64.sqrt() * 400.0 * line.current.get::<ampere>() * line.power_factor;
                assert_close(
                    input,
                    phase.ledger.electrical_input.value,
                    1e-9,
                    &phase.name,
                );
            }
            (None, false) => {}
            (line, running) => panic!("{}: {line:?} while running {running}", phase.name),
        }
    }
    assert!(phases.last().unwrap().line.is_none());
}

/// A clamp-meter reading more than a tenth of the full-load current away from the model's
/// figure is a finding naming both; one closer is not.
#[test]
fn a_current_read_far_from_the_models_is_a_finding() {
    let expected = solve(&press_with_nameplate()).unwrap().designs[0].phases[1]
        .line
        .unwrap()
        .current
        .get::<ampere>();
    for (read, finding) in [
        (expected + 1.0, false),
        (expected + 3.0, true),
        (expected - 3.0, true),
    ] {
        let mut j = press_with_nameplate();
        j.designs[0].phase_settings[1].measured_current =
            Some(ElectricCurrent::new::<ampere>(read));
        let report = solve(&j).unwrap();
        let found: Vec<&Finding> = report.designs[0].phases[1]
            .findings
            .iter()
            .filter(|f| matches!(f, Finding::CurrentDiffers { .. }))
            .collect();
        assert_eq!(
            found.len(),
            usize::from(finding),
            "{read} A against {expected} A"
        );
        if let Some(f) = found.first() {
            let words = f.describe(j.units);
            assert!(words.contains(&format!("{read:.1} A")), "{words}");
            assert!(words.contains(&format!("{expected:.1} A")), "{words}");
        }
    }
}

/// A nameplate whose rating, efficiency, voltage and current would need a power factor above
/// 1 is refused at the current.
#[test]
fn a_nameplate_that_cannot_be_is_refused_at_the_current() {
    let mut j = press_with_nameplate();
    j.designs[0].motor.electrical = Some(rating(400.0, 12.0, None));
    let errors = solve(&j).unwrap_err();
    assert_eq!(errors.len(), 1, "{errors:?}");
    assert_eq!(
        errors[0].field,
        "designs[0].motor.electrical.full_load_current_a"
    );
    assert!(
        errors[0].message.contains("power factor of 1.45"),
        "{}",
        errors[0].message
    );
}

fn timed(kw_in: f64, seconds: f64) -> phasewise_engine::ledger::TimedLedger {
    let ledger = phasewise_engine::ledger::PowerLedger {
        electrical_input: kw(kw_in),
        useful_power: kw(kw_in),
        ..Default::default()
    };
    phasewise_engine::ledger::TimedLedger::fixed_speed(ledger, s(seconds), true)
}

/// A utility bills demand as the highest average power over its demand interval (15 minutes,
/// common practice): a cycle much shorter than that is billed its average power, not its peak;
/// a longer one the worst window. Worked by hand: 10 kW for 10 s and 2 kW for 20 s average
/// 4.667 kW (900 s is 30 whole cycles); 20 kW for 600 s and 2 kW for 1,800 s give, at worst,
/// the 600 s of 20 kW and 300 s of 2 kW: 12,600 kJ / 900 s = 14 kW.
#[test]
fn demand_is_the_highest_average_over_the_interval() {
    use phasewise_engine::ledger::highest_average_over;
    let short = [timed(10.0, 10.0), timed(2.0, 20.0)];
    assert_close(
        highest_average_over(&short, 900.0),
        14_000.0 / 3.0,
        1e-12,
        "short",
    );
    let long = [timed(2.0, 1000.0), timed(20.0, 600.0), timed(2.0, 800.0)];
    assert_close(highest_average_over(&long, 900.0), 14_000.0, 1e-12, "long");
}

/// A demand charge adds twelve months of the billed demand to the yearly cost; a tariff that
/// asks for a power factor the cycle does not reach gets a note, one it reaches none.
#[test]
fn the_tariffs_demand_and_reactive_charges_are_counted() {
    let plain = solve(&press_with_nameplate()).unwrap().designs[0].totals;
    assert!(plain.demand.is_none());
    let mut j = press_with_nameplate();
    j.site.demand_charge = Some(10.0);
    j.site.power_factor_threshold = Some(0.95);
    let report = solve(&j).unwrap();
    let totals = report.designs[0].totals;
    let demand = totals.demand.unwrap();
    assert_close(
        demand.annual_cost,
        12.0 * demand.billed_demand.value / 1e3 * 10.0,
        1e-12,
        "demand cost",
    );
    assert_close(
        totals.annual_cost,
        plain.annual_cost + demand.annual_cost,
        1e-12,
        "cost",
    );
    // The cycle is short against the 15 minutes, so the billed demand is about its average:
    // a window holds whole cycles and a part of one, at most one cycle's worth of the peak.
    let (average, peak) = (
        totals.average_electrical.value,
        totals.peak_electrical.value,
    );
    let billed = demand.billed_demand.value;
    let most = average + (peak - average) * totals.cycle_time.value / 900.0;
    assert!(
        billed >= average && billed <= most,
        "{average} <= {billed} <= {most}"
    );
    let notes = |j: &Job| {
        solve(j).unwrap().designs[0]
            .findings
            .iter()
            .filter(|f| matches!(f, Finding::PowerFactorBelowTariff { .. }))
            .count()
    };
    assert_eq!(notes(&j), 1);
    j.site.power_factor_threshold = Some(0.3);
    assert_eq!(notes(&j), 0);
}
