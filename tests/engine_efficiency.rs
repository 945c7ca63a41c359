//! The pump field test (engine `efficiency`) and the motor efficiency classes (engine
//! `motor`): published examples and tables, each with its source beside the check
//! (../shared/REFERENCES.md); the same physics in US customary and SI; the leakage fit on exact
//! synthetic readings; bad readings get their messages and no figure.

mod common;
use common::*;
use phasewise::engine::efficiency::{
    self, ElectricalInput, MotorEfficiency, PumpTest, Reading, Verdict, WearPolicy,
};
use phasewise::engine::motor::EfficiencyClass;
use phasewise::engine::units::{UnitSystem, GALLON_PER_MINUTE, HORSEPOWER, INCH, PSI};
use phasewise::engine::validate::validate_pump_test;
use uom::si::angular_velocity::revolution_per_minute;
use uom::si::f64::{
    AngularVelocity, ElectricCurrent, ElectricPotential, Power, Torque, Volume, VolumeRate,
};
use uom::si::volume::cubic_centimeter;

fn m3s(v: f64) -> VolumeRate {
    VolumeRate::new::<uom::si::volume_rate::cubic_meter_per_second>(v)
}

fn newton_metres(v: f64) -> Torque {
    Torque::new::<uom::si::torque::newton_meter>(v)
}

fn reading(bar: f64, flow: VolumeRate) -> Reading {
    Reading {
        pressure: bar_(bar),
        flow,
        electrical: None,
        torque: None,
    }
}

fn test_of(cc: f64, rpm: f64, readings: Vec<Reading>) -> PumpTest {
    PumpTest {
        pump: "pump 1".into(),
        date: "2026-11-30".into(),
        notes: String::new(),
        displacement: Volume::new::<cubic_centimeter>(cc),
        speed: AngularVelocity::new::<revolution_per_minute>(rpm),
        rated_pressure: bar_(210.0),
        motor_rated_power: kw(22.0),
        motor_efficiency: MotorEfficiency::Entered { efficiency: 0.92 },
        readings,
    }
}

fn assess(t: &PumpTest) -> efficiency::TestReport {
    efficiency::assess(t, &WearPolicy::default(), UnitSystem::Si)
}

#[test]
fn esposito_example_5_9_si() {
    // Esposito, Fluid Power with Applications, Example 5-9: 100 cm^3/rev at 1000 rpm,
    // 0.0015 m^3/s at 70 bar with 120 N.m input torque: volumetric 0.900, hydromechanical
    // 0.9284, overall 83.56 %, theoretical torque 111.41 N.m. (Textbook answers: 0.5 %.)
    let mut r = reading(70.0, m3s(0.0015));
    r.torque = Some(newton_metres(120.0));
    let t = test_of(100.0, 1000.0, vec![r]);
    let report = assess(&t);
    let got = &report.readings[0];
    assert_close(got.volumetric.unwrap(), 0.900, 5e-3, "volumetric");
    assert_close(
        got.hydromechanical.unwrap(),
        0.9284,
        5e-3,
        "hydromechanical",
    );
    assert_close(got.overall.unwrap(), 0.8356, 5e-3, "overall");
    // Theoretical torque = hydromechanical x actual torque.
    assert_close(
        got.hydromechanical.unwrap() * 120.0,
        111.41,
        5e-3,
        "theoretical torque",
    );
    assert!(got.shaft_from_torque);
    assert!(report.problems.is_empty(), "{:?}", report.problems);
}

#[test]
fn hydraulics_and_pneumatics_volumetric_efficiency_example() {
    // Hydraulics & Pneumatics (2023): 100 cm^3/rev at 1000 rpm is 100 L/min theoretical;
    // 90 L/min measured at 207 bar is 90 % volumetric efficiency.
    let t = test_of(100.0, 1000.0, vec![reading(207.0, lpm(90.0))]);
    let report = assess(&t);
    assert_close(
        in_lpm(m3s(report.theoretical_flow)),
        100.0,
        1e-12,
        "theoretical",
    );
    assert_close(
        report.readings[0].volumetric.unwrap(),
        0.90,
        1e-12,
        "volumetric",
    );
}

#[test]
fn three_phase_input_power_example() {
    // Hydraulics & Pneumatics, "Rightsize your electric motors": 460 V, 37 A, PF 0.76 is
    // 22,404 W; driving 25.1 hp (18,725 W) of load the motor is 83.6 % efficient.
    let input = ElectricalInput::ThreePhase {
        voltage: ElectricPotential::new::<uom::si::electric_potential::volt>(460.0),
        current: ElectricCurrent::new::<uom::si::electric_current::ampere>(37.0),
        power_factor: 0.76,
    };
    assert_close(input.watts(), 22_404.0, 5e-3, "input power");
    assert_close(25.1 * HORSEPOWER, 18_725.0, 5e-3, "25.1 hp");
    assert_close(18_725.0 / input.watts(), 0.836, 5e-3, "motor efficiency");

    // The same reading in a test with a torque gives the motor's efficiency as measured:
    // 18,725 W at 1800 rpm is 99.34 N.m.
    let torque = 18_725.0 / (1800.0 * std::f64::consts::TAU / 60.0);
    let mut r = reading(150.0, lpm(60.0));
    r.electrical = Some(input);
    r.torque = Some(newton_metres(torque));
    let mut t = test_of(40.0, 1800.0, vec![r]);
    t.motor_rated_power = kw(22.0);
    let report = assess(&t);
    assert_close(
        report.readings[0].motor_efficiency_measured.unwrap(),
        0.836,
        5e-3,
        "measured motor efficiency",
    );
}

#[test]
fn iec_and_nema_table_values() {
    // IEC 60034-30-1, 50 Hz, 4-pole (REFERENCES.md); printed tables: 1e-6.
    let kw_sizes = [5.5, 7.5, 11.0, 15.0, 22.0, 30.0, 37.0];
    let tables = [
        (
            EfficiencyClass::Ie2,
            [87.7, 88.7, 89.8, 90.6, 91.6, 92.3, 92.7],
        ),
        (
            EfficiencyClass::Ie3,
            [89.6, 90.4, 91.4, 92.1, 93.0, 93.6, 93.9],
        ),
        (
            EfficiencyClass::Ie4,
            [91.9, 92.6, 93.3, 93.9, 94.5, 94.9, 95.2],
        ),
    ];
    for (class, values) in tables {
        for (k, v) in kw_sizes.iter().zip(values) {
            let got = class.nominal_efficiency(kw(*k)).unwrap();
            assert_close(got * 100.0, v, 1e-6, &format!("{class:?} {k} kW"));
        }
    }
    // NEMA MG 1 Table 12-12, NEMA Premium, 60 Hz, 4-pole, enclosed.
    for (hp, v) in [
        (10.0, 91.7),
        (15.0, 92.4),
        (20.0, 93.0),
        (25.0, 93.6),
        (30.0, 93.6),
        (40.0, 94.1),
        (50.0, 94.5),
    ] {
        let got = EfficiencyClass::NemaPremium
            .nominal_efficiency(Power::new::<uom::si::power::watt>(hp * HORSEPOWER))
            .unwrap();
        assert_close(got * 100.0, v, 1e-6, &format!("NEMA Premium {hp} hp"));
    }
}

#[test]
fn ie3_between_sizes_follows_the_published_formula() {
    // UK SI 2021/745 Schedule 16, Table 28, IE3 4-pole: eta = A x^3 + B x^2 + C x + D,
    // x = log10(P / 1 kW), A 0.0773, B -1.8951, C 9.2984, D 83.7025. At 11 kW the formula gives
    // 91.42 % against the table's 91.4: the table is the formula rounded.
    let formula = |kw: f64| {
        let x = f64::log10(kw);
        ((0.0773 * x - 1.8951) * x + 9.2984) * x + 83.7025
    };
    assert_close(formula(11.0), 91.4, 5e-4, "formula at a table size");
    let got = EfficiencyClass::Ie3.nominal_efficiency(kw(18.5)).unwrap() * 100.0;
    assert_close(got, formula(18.5), 1e-12, "18.5 kW");
    assert!(got > 92.1 && got < 93.0);
    // Outside the table: the nameplate figure is asked for.
    assert!(EfficiencyClass::Ie2.nominal_efficiency(kw(45.0)).is_err());
    let mut t = test_of(40.0, 1450.0, vec![reading(100.0, lpm(55.0))]);
    t.motor_rated_power = kw(90.0);
    t.motor_efficiency = MotorEfficiency::Class {
        class: EfficiencyClass::Ie4,
    };
    let report = assess(&t);
    assert_eq!(report.motor_efficiency, None);
    assert!(report
        .problems
        .iter()
        .any(|p| p.field == "motor_efficiency"
            && p.message.contains("enter the nameplate efficiency")));
}

#[test]
fn us_customary_and_si_readings_give_the_same_physics() {
    // 2.44 in^3/rev at 1750 rpm, 17.5 gpm at 1500 psi, 15 kW drawn (invented readings):
    // entered through the US units, or as the SI values they convert to, the same figures.
    let cubic_inch = INCH * INCH * INCH;
    let mut us = test_of(1.0, 1750.0, vec![]);
    us.displacement = Volume::new::<uom::si::volume::cubic_meter>(2.44 * cubic_inch);
    let mut r = reading(0.0, m3s(17.5 * GALLON_PER_MINUTE));
    r.pressure = uom::si::f64::Pressure::new::<uom::si::pressure::pascal>(1500.0 * PSI);
    r.electrical = Some(ElectricalInput::Power { input: kw(15.0) });
    us.readings = vec![r];
    let mut si = us.clone();
    // The same in SI units, typed as a metric user would: 39.98 cm^3/rev, 66.24 L/min,
    // 103.42 bar.
    si.displacement = Volume::new::<cubic_centimeter>(2.44 * 16.387064);
    si.readings[0].flow = lpm(17.5 * 3.785411784);
    si.readings[0].pressure = bar_(1500.0 * 0.068_947_572_931_683_6);
    let (a, b) = (
        efficiency::assess(&us, &WearPolicy::default(), UnitSystem::UsCustomary),
        assess(&si),
    );
    assert_close(a.theoretical_flow, b.theoretical_flow, 1e-12, "theoretical");
    let (ra, rb) = (&a.readings[0], &b.readings[0]);
    assert_close(
        ra.volumetric.unwrap(),
        rb.volumetric.unwrap(),
        1e-12,
        "volumetric",
    );
    assert_close(ra.overall.unwrap(), rb.overall.unwrap(), 1e-12, "overall");
    // Hydraulic power: gpm x psi / 1714.2857 hp (REFERENCES.md, exact).
    assert_close(
        ra.hydraulic_w / HORSEPOWER,
        17.5 * 1500.0 / (12000.0 / 7.0),
        1e-12,
        "hydraulic hp",
    );
}

#[test]
fn the_leakage_fit_recovers_a_known_line() {
    // Exact synthetic readings: 40 cm^3/rev at 1500 rpm sweeps 60 L/min; leakage 0.02 L/min
    // per bar (invented): flow = 60 - 0.02 p. At the rated 210 bar the line gives 55.8 L/min,
    // 93.0 %.
    let readings = [20.0, 80.0, 140.0, 200.0]
        .iter()
        .map(|p| reading(*p, lpm(60.0 - 0.02 * p)))
        .collect();
    let report = assess(&test_of(40.0, 1500.0, readings));
    let line = report.leakage.unwrap();
    assert_eq!(line.readings, 4);
    assert_close(
        in_lpm(m3s(line.zero_pressure_flow)),
        60.0,
        1e-9,
        "intercept",
    );
    assert_close(
        line.leakage_per_pa * 1e5 / phasewise::engine::units::LITRE_PER_MINUTE,
        0.02,
        1e-9,
        "leakage per bar",
    );
    assert_close(line.volumetric_at_rated, 55.8 / 60.0, 1e-9, "at rated");
    assert_eq!(
        report.verdict,
        Verdict::Good {
            volumetric_at_rated: line.volumetric_at_rated
        }
    );
    // One reading: the line from the theoretical flow through it.
    let one = assess(&test_of(40.0, 1500.0, vec![reading(100.0, lpm(54.0))]));
    let line = one.leakage.unwrap();
    assert_close(
        line.zero_pressure_flow,
        lpm(60.0).value,
        1e-12,
        "through theoretical",
    );
    // 6 L/min lost at 100 bar: 12.6 at 210 bar, 47.4 / 60 = 79 %: worn.
    assert_close(
        line.volumetric_at_rated,
        47.4 / 60.0,
        1e-9,
        "one reading at rated",
    );
    assert!(matches!(one.verdict, Verdict::Worn { .. }));
    // Between the lines: 8.4 L/min lost at 210 bar is 86 %.
    let mid = assess(&test_of(40.0, 1500.0, vec![reading(100.0, lpm(56.0))]));
    assert!(
        matches!(mid.verdict, Verdict::Watch { .. }),
        "{:?}",
        mid.verdict
    );
}

#[test]
fn readings_that_cannot_be_right_get_a_message_and_no_figure() {
    // More flow than the pump sweeps (60 L/min): the meter or the displacement.
    let report = assess(&test_of(40.0, 1500.0, vec![reading(50.0, lpm(63.0))]));
    assert_eq!(report.readings[0].volumetric, None);
    assert_eq!(report.verdict, Verdict::NotJudged);
    let p = &report.problems[0];
    assert_eq!(p.field, "readings[0].flow_m3_per_s");
    assert!(p
        .message
        .contains("check the meter range or the displacement"));

    // An efficiency above 100 %: 60 L/min at 200 bar is 20 kW of hydraulic power, but the
    // motor drew 15 kW.
    let mut r = reading(200.0, lpm(58.0));
    r.electrical = Some(ElectricalInput::Power { input: kw(15.0) });
    let report = assess(&test_of(40.0, 1500.0, vec![r]));
    assert_eq!(report.readings[0].overall, None);
    assert!(report
        .problems
        .iter()
        .any(|p| p.message.contains("above 100 %")));

    // A current no 22 kW motor could draw for long: 400 V, 120 A, PF 0.85 is 70.7 kW.
    let mut r = reading(100.0, lpm(55.0));
    r.electrical = Some(ElectricalInput::ThreePhase {
        voltage: ElectricPotential::new::<uom::si::electric_potential::volt>(400.0),
        current: ElectricCurrent::new::<uom::si::electric_current::ampere>(120.0),
        power_factor: 0.85,
    });
    let report = assess(&test_of(40.0, 1500.0, vec![r]));
    assert_eq!(report.readings[0].input_w, None);
    assert!(report
        .problems
        .iter()
        .any(|p| p.field == "readings[0].electrical" && p.message.contains("clamp meter")));

    // Flow rising with pressure.
    let report = assess(&test_of(
        40.0,
        1500.0,
        vec![reading(50.0, lpm(55.0)), reading(150.0, lpm(57.0))],
    ));
    assert_eq!(report.leakage, None);
    assert!(report.problems.iter().any(|p| p.field == "readings"));

    // A power factor outside (0, 1], an empty label, no readings: messages at the fields.
    let mut t = test_of(40.0, 1500.0, vec![reading(100.0, lpm(55.0))]);
    t.readings[0].electrical = Some(ElectricalInput::ThreePhase {
        voltage: ElectricPotential::new::<uom::si::electric_potential::volt>(400.0),
        current: ElectricCurrent::new::<uom::si::electric_current::ampere>(30.0),
        power_factor: 1.2,
    });
    t.pump = " ".into();
    t.date = "30/11/2026".into();
    let errors = validate_pump_test(&t, 2, UnitSystem::Si);
    let fields: Vec<&str> = errors.iter().map(|e| e.field.as_str()).collect();
    assert!(fields.contains(&"pump_tests[2].readings[0].electrical.power_factor"));
    assert!(fields.contains(&"pump_tests[2].pump"));
    assert!(fields.contains(&"pump_tests[2].date"));
    t.readings.clear();
    t.displacement = Volume::new::<cubic_centimeter>(f64::NAN);
    let errors = validate_pump_test(&t, 0, UnitSystem::Si);
    assert!(errors.iter().any(|e| e.field == "pump_tests[0].readings"));
    assert!(errors
        .iter()
        .any(|e| e.field == "pump_tests[0].displacement_m3_per_rev" && !e.message.contains("NaN")));
    // Valid figures: no message.
    assert!(validate_pump_test(
        &test_of(40.0, 1500.0, vec![reading(100.0, lpm(55.0))]),
        0,
        UnitSystem::Si
    )
    .is_empty());
}

#[test]
fn a_later_test_of_the_same_pump_shows_the_trend() {
    let first = test_of(40.0, 1500.0, vec![reading(100.0, lpm(57.0))]);
    let mut later = test_of(40.0, 1500.0, vec![reading(100.0, lpm(55.0))]);
    later.date = "2027-05-29".into();
    let mut other = test_of(40.0, 1500.0, vec![reading(100.0, lpm(50.0))]);
    other.pump = "pump 2".into();
    let tests = vec![later, other, first];
    let t = efficiency::trend(&tests, 0, &WearPolicy::default()).unwrap();
    assert_eq!(t.earlier, 2);
    // 2026-11-30 to 2027-05-29: 31 (December) + 31 + 28 + 31 + 30 + 29 = 180 days.
    assert_eq!(t.days, Some(180));
    // At 210 bar: 57 -> 53.7 L/min (89.5 %), 55 -> 49.5 L/min (82.5 %): down 7 points.
    assert_close(t.volumetric_change.unwrap(), -0.07, 1e-9, "change");
    assert_eq!(efficiency::trend(&tests, 2, &WearPolicy::default()), None);
    assert_eq!(efficiency::day_number("1970-01-01"), Some(0));
    assert_eq!(efficiency::day_number("2000-03-01"), Some(11_017));
}

#[test]
fn the_measured_efficiencies_go_into_a_design() {
    let mut r = reading(70.0, m3s(0.0015));
    r.torque = Some(newton_metres(120.0));
    let t = test_of(100.0, 1000.0, vec![reading(20.0, m3s(0.00162)), r]);
    let report = assess(&t);
    let measured = efficiency::measured_pump(&t, &report).unwrap();
    assert_eq!(measured.at_pressure_pa, 70e5);
    let job = phasewise::engine::demo::scrap_baler();
    let d = efficiency::apply_to_design(&job.designs[0], 1, &measured).unwrap();
    assert_close(
        d.base_pump.volumetric_efficiency,
        measured.volumetric,
        1e-12,
        "copied",
    );
    assert_eq!(d.base_pump.efficiency_pressure, bar_(70.0));
    assert_eq!(
        Some(d.base_pump.hydromechanical_efficiency),
        report.readings[1].hydromechanical
    );
    assert_eq!(d.unloading_stages, job.designs[0].unloading_stages);
    assert!(efficiency::apply_to_design(&job.designs[0], 2, &measured).is_none());
    let mut changed = job.clone();
    changed.designs[0] = d;
    assert!(phasewise::engine::solve(&changed).is_ok());
}
