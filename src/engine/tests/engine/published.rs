//! The engine against published values. Each check names its source beside it; the
//! tolerances: 1e-12 against exact definitions, 0.5 % against textbook answers (which round
//! their intermediate steps).

use crate::common::*;
use phasewise_engine::cycle::{
    Cylinder, Direction, HoldMode, Load, MovePhase, Phase, PhaseKind, SpeedRule,
};
use phasewise_engine::ledger::{cycle_totals, PowerLedger, TimedLedger};
use phasewise_engine::units::{GALLON_PER_MINUTE, HORSEPOWER, PSI};
use phasewise_engine::valve::ReliefKind;
use phasewise_engine::{solve, PumpState};
use uom::si::f64::{Power, Pressure, VolumeRate};

fn pressure_load(name: &str, load_bar: f64) -> Phase {
    Phase {
        name: name.into(),
        kind: PhaseKind::Move(MovePhase {
            cylinder: Cylinder {
                bore: mm(100.0),
                rod: mm(50.0),
                stroke: mm(100.0),
            },
            direction: Direction::Extend,
            load: Load::Pressure {
                pressure: bar_(load_bar),
            },
            line_loss: bar_(0.0),
            lines: None,
            speed: SpeedRule::AllPumpFlow,
            target_time: None,
        }),
    }
}

#[test]
fn pump_efficiencies_of_esposito_example_5_9() {
    // Esposito, Fluid Power with Applications, Example 5-9 (SI): 100 cm^3/rev at 1000 rpm,
    // 0.0015 m^3/s measured at 70 bar with 120 N.m input torque: volumetric 0.900,
    // hydromechanical 0.9284, overall 83.56 %, theoretical torque 111.41 N.m.
    let pump = fixed_pump(100.0, 0.900, 70.0, 0.9284, 0.0);
    let d = design(
        "test",
        motor(30.0, 1000.0, 0.92),
        vec![],
        pump,
        relief(ReliefKind::PilotOperated, 200.0, 100.0, 0.97),
        1,
    );
    let report = solve(&job(vec![pressure_load("work at 70 bar", 70.0)], vec![d])).unwrap();
    let phase = &report.designs[0].phases[0];
    let point = &phase.point.pumps[0];
    assert_eq!(point.state, PumpState::Feeding);
    assert_close(
        in_bar(point.outlet_pressure),
        70.0,
        1e-12,
        "outlet pressure",
    );
    // The volumetric efficiency is stated at this pressure, so the flow is exactly 0.9 x theoretical.
    assert_close(point.flow.value, 0.0015, 1e-12, "flow, m^3/s");
    let omega = 1000.0 * std::f64::consts::TAU / 60.0;
    assert_close(
        point.shaft_power.value / omega,
        120.0,
        0.005,
        "input torque, N.m",
    );
    assert_close(
        point.shaft_power.value * 0.9284 / omega,
        111.41,
        0.005,
        "theoretical torque, N.m",
    );
    let hydraulic = point.flow.value * point.outlet_pressure.value;
    assert_close(
        hydraulic / point.shaft_power.value,
        0.8356,
        0.005,
        "overall efficiency",
    );
}

#[test]
fn volumetric_efficiency_of_hydraulics_and_pneumatics_2023() {
    // Hydraulics & Pneumatics (2023): 100 cm^3/rev at 1000 rpm is 100 L/min theoretical;
    // 90 L/min measured at 207 bar is 90 % volumetric efficiency.
    let pump = fixed_pump(100.0, 0.90, 207.0, 0.9, 0.0);
    let d = design(
        "test",
        motor(60.0, 1000.0, 0.92),
        vec![],
        pump,
        relief(ReliefKind::PilotOperated, 250.0, 100.0, 0.97),
        1,
    );
    let report = solve(&job(vec![pressure_load("work", 207.0)], vec![d])).unwrap();
    assert_close(
        in_lpm(report.designs[0].phases[0].point.pumps[0].flow),
        90.0,
        1e-12,
        "flow at 207 bar, L/min",
    );
}

/// One ideal pump of `gpm` at 1200 rpm, and a relief set to pass `relief_gpm` at `setting_psi`.
fn us_unit(gpm: f64, setting_psi: f64, relief_gpm: f64) -> phasewise_engine::power_unit::Design {
    let cc = gpm * GALLON_PER_MINUTE * 60.0 / 1200.0 * 1e6;
    let mut r = relief(ReliefKind::PilotOperated, 0.0, 0.0, 0.9);
    r.setting = Pressure::new::<uom::si::pressure::pascal>(setting_psi * PSI);
    r.rated_flow = uom::si::f64::VolumeRate::new::<uom::si::volume_rate::cubic_meter_per_second>(
        relief_gpm * GALLON_PER_MINUTE,
    );
    design(
        "test",
        motor(30.0, 1200.0, 0.92),
        vec![],
        ideal_pump(cc),
        r,
        1,
    )
}

#[test]
fn relief_heat_of_esposito_example_8_2() {
    // Esposito, Example 8-2: 20 gpm over a relief valve at 1000 psi is 11.67 hp of heat.
    // The relief passes its rated 20 gpm at exactly its 1000 psi setting.
    let d = us_unit(20.0, 1000.0, 20.0);
    let report = solve(&job(
        vec![hold("hold", 900.0 / 14.5, 10.0, HoldMode::HeldByPump)],
        vec![d],
    ))
    .unwrap();
    let phase = &report.designs[0].phases[0];
    assert_close(
        phase.point.system_pressure.value / PSI,
        1000.0,
        1e-9,
        "relief pressure, psi",
    );
    assert_close(
        phase.ledger.relief_loss.value / HORSEPOWER,
        11.67,
        0.005,
        "relief heat, hp",
    );
    assert_close(
        phase.ledger.heat_into_oil().value / HORSEPOWER,
        11.67,
        0.005,
        "heat into the oil, hp",
    );
}

#[test]
fn unloading_loss_of_esposito_example_8_3() {
    // Esposito, Example 8-3: 20 gpm through an unloading valve at 25 psi is 0.292 hp.
    let mut d = us_unit(2.0, 1000.0, 2.0);
    let cc = 20.0 * GALLON_PER_MINUTE * 60.0 / 1200.0 * 1e6;
    let mut s = stage(ideal_pump(cc), 0.0, 0.0, 0.0);
    s.unloading.setting = Pressure::new::<uom::si::pressure::pascal>(500.0 * PSI);
    s.unloading.unloaded_drop = Pressure::new::<uom::si::pressure::pascal>(25.0 * PSI);
    d.unloading_stages.push(s);
    let report = solve(&job(
        vec![hold("hold", 50.0, 10.0, HoldMode::HeldByPump)],
        vec![d],
    ))
    .unwrap();
    let phase = &report.designs[0].phases[0];
    assert_eq!(phase.point.pumps[0].state, PumpState::Unloaded);
    assert_close(
        phase.ledger.unloading_loss.value / HORSEPOWER,
        0.292,
        0.005,
        "unloading loss, hp",
    );
}

#[test]
fn hydraulic_horsepower_of_engineering_toolbox() {
    // Engineering ToolBox, "Hydraulic horsepower": 20 gpm at 1500 psi is 17.5 hp.
    let d = us_unit(20.0, 3000.0, 20.0);
    let demand = direct(
        "demand",
        in_lpm(VolumeRate::new::<gallon_per_minute>(20.0)),
        in_bar(Pressure::new::<psi>(1500.0)),
        10.0,
    );
    let report = solve(&job(vec![demand], vec![d])).unwrap();
    let useful = report.designs[0].phases[0].ledger.useful_power;
    assert_close(useful.value / HORSEPOWER, 17.5, 0.005, "useful power, hp");
}

/// A phase with the motor running, drawing `electrical_kw` for `seconds`.
fn ledger_of(electrical_kw: f64, relief_kw: f64, seconds: f64) -> TimedLedger {
    let w = |kw: f64| Power::new::<uom::si::power::kilowatt>(kw);
    TimedLedger::fixed_speed(
        PowerLedger {
            electrical_input: w(electrical_kw),
            relief_loss: w(relief_kw),
            useful_power: w(electrical_kw - relief_kw),
            ..PowerLedger::default()
        },
        s(seconds),
        true,
    )
}

#[test]
fn rms_power_over_a_duty_cycle() {
    // P_rms = sqrt(sum(P_i^2 t_i) / sum(t_i)), the method of Machine Design's and Power &
    // Motion's motor-sizing articles: 10 kW for 2 s and 2 kW for 8 s give
    // sqrt((100 x 2 + 4 x 8) / 10) = sqrt(23.2) = 4.8166 kW.
    let j = job(vec![], vec![]);
    let totals = cycle_totals(
        &[ledger_of(10.0, 0.0, 2.0), ledger_of(2.0, 0.0, 8.0)],
        &j.site,
        &j.oil,
    );
    assert_close(
        in_kw(totals.rms_electrical),
        23.2f64.sqrt(),
        1e-12,
        "RMS, kW",
    );
    assert_close(in_kw(totals.average_electrical), 3.6, 1e-12, "average, kW");
    assert_close(in_kw(totals.peak_electrical), 10.0, 1e-12, "peak, kW");
}

#[test]
fn heat_load_in_btu_per_hour() {
    // 1 hp = 2544.4336 Btu_IT/h (derived from NIST SP 811's exact definitions, Appendix B).
    let j = job(vec![], vec![]);
    let one_hp = HORSEPOWER / 1e3;
    let totals = cycle_totals(&[ledger_of(2.0 * one_hp, one_hp, 5.0)], &j.site, &j.oil);
    assert_close(totals.heat_load_btu_per_hour, 2544.4336, 1e-8, "Btu_IT/h");
    // Oil temperature rise with no cooler = heat / (volume x density x specific heat):
    // 745.7 W into 200 L of Esposito's oil (895 kg/m^3, 1.8 kJ/(kg.K)) is
    // 745.69987 x 60 / (0.2 x 895 x 1800) K/min (from the definitions).
    assert_close(
        totals.oil_rise_k_per_minute,
        HORSEPOWER * 60.0 / (0.2 * 895.0 * 1800.0),
        1e-12,
        "K/min",
    );
}
