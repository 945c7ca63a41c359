//! The oil, the lines and the heat balance through the whole solve: lines whose drop follows
//! the flow and the oil, leakage that follows viscosity, and where the oil settles. Invented
//! machines; figures worked by hand in the comments where a hand can work them.

use crate::common::*;
use phasewise_engine::cycle::{Direction, PhaseKind, SpeedRule};
use phasewise_engine::heat::{AirAround, Coolant, Cooler, Settling, Tank, TankSize};
use phasewise_engine::lines::{Fitting, FittingKind, Line, MoveLines};
use phasewise_engine::site::WorkingTemperature;
use phasewise_engine::valve::ReliefKind;
use phasewise_engine::viscosity::OilViscosity;
use phasewise_engine::{solve, Finding, Job};
use uom::si::f64::{Area, Power, TemperatureInterval, ThermodynamicTemperature};
use uom::si::thermodynamic_temperature::degree_celsius;

const C0: f64 = 273.15;

fn celsius(c: f64) -> ThermodynamicTemperature {
    ThermodynamicTemperature::new::<degree_celsius>(c)
}

fn line(d_mm: f64, length_m: f64) -> Line {
    Line {
        inner_diameter: mm(d_mm),
        length: mm(length_m * 1000.0),
        fittings: vec![Fitting {
            kind: FittingKind::Elbow90,
            count: 4,
        }],
    }
}

/// An invented 30 L/min unit (20 cm^3/rev at 1500 rpm, 95 % at 200 bar) on a 63/36 cylinder:
/// extend 300 mm against 20 kN, retract against 2 kN, then idle 10 s.
fn machine(lines: Option<MoveLines>) -> Job {
    let mut cycle = vec![
        move_phase(
            "extend",
            63.0,
            36.0,
            300.0,
            Direction::Extend,
            20.0,
            0.0,
            SpeedRule::AllPumpFlow,
        ),
        move_phase(
            "retract",
            63.0,
            36.0,
            300.0,
            Direction::Retract,
            2.0,
            0.0,
            SpeedRule::AllPumpFlow,
        ),
        idle("load", 10.0),
    ];
    for phase in cycle.iter_mut().take(2) {
        if let PhaseKind::Move(m) = &mut phase.kind {
            m.lines = lines.clone();
        }
    }
    let design = design(
        "as found",
        motor(11.0, 1500.0, 0.9),
        vec![],
        fixed_pump(20.0, 0.95, 200.0, 0.9, 0.2),
        relief(ReliefKind::PilotOperated, 160.0, 60.0, 0.9),
        3,
    );
    job(cycle, vec![design])
}

fn lines(d_mm: f64) -> MoveLines {
    MoveLines {
        pressure_line: line(d_mm, 4.0),
        return_line: line(d_mm, 4.0),
    }
}

fn at(job: &mut Job, c: f64) {
    job.oil.working_temperature = WorkingTemperature::Entered {
        temperature: celsius(c),
    };
}

/// The lines' drop is in the ledger as line loss (drop at the pump x the actuator's flow),
/// the ledger still closes, and the retract's return line carries the bore over the annulus
/// times what goes in: 63^2 / (63^2 - 36^2) = 1.4848.
#[test]
fn the_lines_drop_is_in_the_ledger_and_a_retract_returns_more() {
    let job = machine(Some(lines(10.0)));
    let report = solve(&job).unwrap();
    for phase in &report.designs[0].phases[..2] {
        let l = phase.lines.expect("lines at the move's flow");
        let q = phase.point.actuator_flow.value;
        assert_close(
            phase.ledger.line_valve_loss.value,
            l.drop_at_pump * q,
            1e-9,
            "line loss",
        );
        let items = phase.ledger.motor_loss
            + phase.ledger.pump_internal_loss
            + phase.ledger.unloading_loss
            + phase.ledger.relief_loss
            + phase.ledger.metering_loss
            + phase.ledger.line_valve_loss
            + phase.ledger.useful_power;
        assert_close(
            items.value,
            phase.ledger.electrical_input.value,
            1e-9,
            "ledger",
        );
    }
    let retract = report.designs[0].phases[1].lines.unwrap();
    let ratio = retract.return_line.velocity.value / retract.pressure_line.velocity.value;
    assert_close(
        ratio,
        63.0f64.powi(2) / (63.0f64.powi(2) - 36.0f64.powi(2)),
        1e-9,
        "ratio",
    );
}

/// A thicker oil (colder) never gives a lower line loss at the same flow; a thinner one
/// leaks more in the pump, so the move takes longer.
#[test]
fn colder_oil_loses_more_in_the_lines_and_leaks_less() {
    let mut last_drop = f64::INFINITY;
    let mut last_time = 0.0;
    for c in [20.0, 30.0, 40.0, 50.0, 60.0, 70.0] {
        let mut job = machine(Some(lines(10.0)));
        job.designs[0].base_pump.efficiency_temperature = Some(celsius(50.0));
        at(&mut job, c);
        let report = solve(&job).unwrap();
        let extend = &report.designs[0].phases[0];
        let drop = extend.lines.unwrap().drop_at_pump;
        assert!(drop <= last_drop, "{c} degC: {drop} after {last_drop}");
        assert!(extend.point.duration.value >= last_time, "{c} degC");
        last_drop = drop;
        last_time = extend.point.duration.value;
    }
}

/// Leakage stated at 50 degC: at the working temperature of 50 degC the pump gives what it
/// did before; where the oil is half as thick the leakage doubles (slip flow goes as pressure
/// over viscosity). 30 L/min swept, 5 % lost at 200 bar: 1.5 L/min, 0.0075 L/min per bar.
#[test]
fn leakage_follows_viscosity() {
    let mut job = machine(None);
    job.cycle.truncate(1);
    job.designs[0].phase_settings.truncate(1);
    let flow_at = |job: &Job| in_lpm(solve(job).unwrap().designs[0].phases[0].point.actuator_flow);
    let plain = flow_at(&job);
    job.designs[0].base_pump.efficiency_temperature = Some(celsius(50.0));
    at(&mut job, 50.0);
    assert_close(
        flow_at(&job),
        plain,
        1e-9,
        "stated at the working temperature",
    );
    // Find where the oil is half as thick as at 50 degC, by its own line.
    let line = job.oil.viscosity.line().unwrap();
    let half = line.at(celsius(50.0)).value / 2.0;
    let (mut lo, mut hi) = (50.0, 150.0);
    for _ in 0..60 {
        let mid = 0.5 * (lo + hi);
        if line.at(celsius(mid)).value > half {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    at(&mut job, lo);
    let pressure = 20e3 / (std::f64::consts::PI / 4.0 * 0.063f64.powi(2)) / 1e5;
    let expected = plain - 0.0075 * pressure;
    assert_close(flow_at(&job), expected, 1e-6, "twice the leakage");
}

fn tank() -> Tank {
    Tank {
        size: TankSize::WettedArea {
            area: Area::new::<uom::si::area::square_meter>(1.5),
        },
        air: AirAround::Normal,
        ambient: celsius(25.0),
        steel_mass: None,
    }
}

fn water_cooler(kw_at_25k: f64) -> Cooler {
    Cooler {
        coolant: Coolant::Water,
        coolant_temperature: celsius(20.0),
        rated_heat: Power::new::<uom::si::power::kilowatt>(kw_at_25k),
        rated_difference: TemperatureInterval::new::<uom::si::temperature_interval::kelvin>(25.0),
    }
}

/// Where the oil settles, heat in equals heat out to 1e-9 relative, with the phases worked
/// out at that temperature; the warm-up starts at the air's temperature and ends within a
/// kelvin of it.
#[test]
fn the_oil_settles_where_heat_in_equals_heat_out() {
    let mut job = machine(Some(lines(10.0)));
    job.designs[0].base_pump.efficiency_temperature = Some(celsius(50.0));
    job.oil.working_temperature = WorkingTemperature::Settled;
    job.tank = Some(tank());
    job.designs[0].cooler = Some(water_cooler(1.0));
    let report = solve(&job).unwrap();
    let d = &report.designs[0];
    let balance = d.oil.balance.as_ref().unwrap();
    let Settling::At(steady) = balance.steady else {
        panic!("does not settle")
    };
    assert_close(
        d.oil.working_temperature,
        steady,
        1e-12,
        "worked out where it settles",
    );
    assert_close(
        d.totals.heat_load.value,
        balance.heat_in,
        1e-12,
        "heat in at steady",
    );
    assert_close(
        balance.heat_in,
        balance.tank_sheds + balance.cooler_removes,
        1e-9,
        "heat in = heat out",
    );
    let warm = balance.warm_up.as_ref().unwrap();
    assert_eq!(warm.curve[0], (0.0, C0 + 25.0));
    assert!((warm.curve.last().unwrap().1 - steady).abs() <= 0.5);
    let without = balance.without_cooler.unwrap().kelvin();
    assert!(
        without > steady,
        "{without} without the cooler, {steady} with"
    );
}

/// A bigger cooler never gives a hotter oil; too much heat for the tank is a finding.
#[test]
fn a_bigger_cooler_never_gives_a_hotter_oil() {
    let mut last = f64::INFINITY;
    for kw in [0.0, 0.5, 1.0, 2.0, 4.0, 8.0] {
        let mut job = machine(Some(lines(10.0)));
        job.oil.working_temperature = WorkingTemperature::Settled;
        job.tank = Some(tank());
        job.designs[0].cooler = (kw > 0.0).then(|| water_cooler(kw));
        let report = solve(&job).unwrap();
        let steady = report.designs[0].oil.working_temperature;
        assert!(steady <= last, "{kw} kW: {steady} after {last}");
        last = steady;
    }
    let mut hot = machine(None);
    hot.oil.working_temperature = WorkingTemperature::Settled;
    hot.tank = Some(Tank {
        size: TankSize::WettedArea {
            area: Area::new::<uom::si::area::square_meter>(0.05),
        },
        ..tank()
    });
    let report = solve(&hot).unwrap();
    assert!(report.designs[0]
        .findings
        .iter()
        .any(|f| matches!(f, Finding::OilDoesNotSettle { .. })));
}

/// A 6 mm line carrying 30 L/min goes 17.7 m/s, far past the 6 m/s common practice allows in
/// a pressure line: a finding offering sqrt(17.7 / 6) x 6 = 10.3 mm.
#[test]
fn a_fast_line_is_a_finding_with_the_diameter_that_would_do() {
    let job = machine(Some(lines(6.0)));
    let report = solve(&job).unwrap();
    let extend = &report.designs[0].phases[0];
    let q = extend.point.actuator_flow.value;
    let v = q / (std::f64::consts::PI / 4.0 * 0.006f64.powi(2));
    let found = extend.findings.iter().find_map(|f| match f {
        Finding::LineTooFast {
            velocity, diameter, ..
        } => Some((velocity.value, diameter.value)),
        _ => None,
    });
    let (velocity, diameter) = found.expect("a finding");
    assert_close(velocity, v, 1e-9, "velocity");
    assert_close(diameter, 0.006 * (v / 6.0).sqrt(), 1e-9, "diameter");
}

/// An oil given by two measured viscosities works as one given by its grade and the index
/// they make (ASTM D2270), and a field warm-up gives the heat that matches the model's when
/// the readings follow the model's own warm-up.
#[test]
fn an_oil_by_its_points_and_a_warm_up_read_in_the_field() {
    let mut job = machine(Some(lines(10.0)));
    at(&mut job, 45.0);
    let by_grade = solve(&job).unwrap();
    let line = job.oil.viscosity.line().unwrap();
    job.oil.viscosity = OilViscosity::Measured {
        at_40: line.at(celsius(40.0)),
        at_100: line.at(celsius(100.0)),
    };
    let by_points = solve(&job).unwrap();
    assert_close(
        by_points.designs[0].totals.energy_per_cycle.value,
        by_grade.designs[0].totals.energy_per_cycle.value,
        1e-9,
        "same oil",
    );
    // Readings taken off the model's own warm-up give back the model's heat (within the
    // curve's sampling of the heat, 1 %).
    job.tank = Some(tank());
    job.designs[0].cooler = Some(water_cooler(8.0));
    job.oil.working_temperature = WorkingTemperature::Settled;
    let report = solve(&job).unwrap();
    let curve = &report.designs[0]
        .oil
        .balance
        .as_ref()
        .unwrap()
        .warm_up
        .as_ref()
        .unwrap()
        .curve;
    let (a, b) = (curve[2], curve[4]);
    job.warm_up = Some(phasewise_engine::heat::FieldWarmUp {
        first: phasewise_engine::heat::TemperatureReading {
            time: s(a.0),
            oil: ThermodynamicTemperature::new::<uom::si::thermodynamic_temperature::kelvin>(a.1),
        },
        second: phasewise_engine::heat::TemperatureReading {
            time: s(b.0),
            oil: ThermodynamicTemperature::new::<uom::si::thermodynamic_temperature::kelvin>(b.1),
        },
    });
    let check = solve(&job).unwrap().warm_up.unwrap();
    assert_close(
        check.measured,
        check.model,
        0.01,
        "field heat against the model's",
    );
}
