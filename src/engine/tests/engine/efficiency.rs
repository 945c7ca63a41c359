//! The pump field test (engine `efficiency`) and the motor efficiency classes (engine
//! `motor`): published examples and tables, each with its source beside the check; the same
//! physics in US customary and SI; the leakage fit on exact synthetic readings; bad readings
//! get their messages and no figure; the speed of each reading from the motor's slip and its
//! shaft power from the motor's part-load model; what is copied into a design; how many
//! readings a verdict needs; tests in date order.

use crate::common::*;
use phasewise_engine::efficiency::{
    self, ElectricalInput, MeasuredPump, MotorEfficiency, NotCopied, PumpTest, Reading, SpeedFrom,
    Verdict, WearPolicy,
};
use phasewise_engine::motor::{
    EfficiencyClass, Motor, TYPICAL_FIXED_LOSS_SHARE, TYPICAL_PEAK_ALLOWANCE,
};
use phasewise_engine::units::{UnitSystem, GALLON_PER_MINUTE, HORSEPOWER, INCH, PSI};
use phasewise_engine::validate::validate_pump_test;
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
        speed: None,
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
        synchronous_speed: None,
        rated_pressure: bar_(210.0),
        motor_rated_power: kw(22.0),
        motor_efficiency: MotorEfficiency::Entered { efficiency: 0.92 },
        readings,
    }
}

fn assess(t: &PumpTest) -> efficiency::TestReport {
    efficiency::assess(t, &WearPolicy::default(), UnitSystem::Si).expect("a valid test")
}

fn rpm(v: f64) -> AngularVelocity {
    AngularVelocity::new::<revolution_per_minute>(v)
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
    assert_close(in_lpm(report.theoretical_flow), 100.0, 1e-12, "theoretical");
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
    // IEC 60034-30-1, 50 Hz, 4-pole, nominal full-load efficiency; printed tables: 1e-6.
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
    // The same through the project's uom units (39.98 cm^3/rev, 66.24 L/min, 103.42 bar in
    // SI): the figures must agree to the last digits.
    si.displacement = Volume::new::<uom::si::volume::cubic_meter>(2.44 * cubic_inch);
    si.readings[0].flow = VolumeRate::new::<gallon_per_minute>(17.5);
    si.readings[0].pressure = uom::si::f64::Pressure::new::<psi>(1500.0);
    let (a, b) = (
        efficiency::assess(&us, &WearPolicy::default(), UnitSystem::UsCustomary).unwrap(),
        assess(&si),
    );
    assert_close(
        a.theoretical_flow.value,
        b.theoretical_flow.value,
        1e-12,
        "theoretical",
    );
    let (ra, rb) = (&a.readings[0], &b.readings[0]);
    assert_close(
        ra.volumetric.unwrap(),
        rb.volumetric.unwrap(),
        1e-12,
        "volumetric",
    );
    assert_close(ra.overall.unwrap(), rb.overall.unwrap(), 1e-12, "overall");
    // Hydraulic power: gpm x psi / 1714.2857 hp (exact from NIST SP 811, Appendix B).
    assert_close(
        ra.hydraulic.value / HORSEPOWER,
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
    assert_close(in_lpm(line.zero_pressure_flow), 60.0, 1e-9, "intercept");
    assert_close(
        in_lpm(m3s(line.leakage_per_pa * bar_(1.0).value)),
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
    // One reading: the line from the theoretical flow through it (drawn, but no verdict).
    let one = assess(&test_of(40.0, 1500.0, vec![reading(100.0, lpm(54.0))]));
    let line = one.leakage.unwrap();
    assert_close(
        line.zero_pressure_flow.value,
        lpm(60.0).value,
        1e-12,
        "through theoretical",
    );
    // 6 L/min lost at 100 bar: 12.6 at 210 bar, 47.4 / 60 = 79 %.
    assert_close(
        line.volumetric_at_rated,
        47.4 / 60.0,
        1e-9,
        "one reading at rated",
    );
    assert!(!line.fitted);
    // The same line through two readings: worn.
    let worn = assess(&test_of(
        40.0,
        1500.0,
        vec![reading(50.0, lpm(57.0)), reading(100.0, lpm(54.0))],
    ));
    assert!(
        matches!(worn.verdict, Verdict::Worn { .. }),
        "{:?}",
        worn.verdict
    );
    // Between the lines: 4 L/min lost per 100 bar, 8.4 L/min at 210 bar is 86 %.
    let mid = assess(&test_of(
        40.0,
        1500.0,
        vec![reading(50.0, lpm(58.0)), reading(100.0, lpm(56.0))],
    ));
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
    assert_eq!(report.readings[0].input.map(|q| q.value), None);
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
    // Leakage 0.03 and 0.05 L/min per bar from the 60 L/min swept (invented).
    let first = test_of(
        40.0,
        1500.0,
        vec![reading(50.0, lpm(58.5)), reading(100.0, lpm(57.0))],
    );
    let mut later = test_of(
        40.0,
        1500.0,
        vec![reading(50.0, lpm(57.5)), reading(100.0, lpm(55.0))],
    );
    later.date = "2027-05-29".into();
    let mut other = test_of(
        40.0,
        1500.0,
        vec![reading(50.0, lpm(55.0)), reading(100.0, lpm(50.0))],
    );
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
    assert_eq!(measured.at_pressure.value, 70e5);
    let job = phasewise_engine::demo::scrap_baler();
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
    assert_eq!(
        efficiency::apply_to_design(&job.designs[0], 2, &measured),
        Err(NotCopied::NoSuchPump { pump: 2, pumps: 2 })
    );
    let mut changed = job.clone();
    changed.designs[0] = d;
    assert!(phasewise_engine::solve(&changed).is_ok());
}

/// A 22 kW four-pole motor on 50 Hz, 1465 rpm at full load, 93 % efficient there, driving a
/// healthy 40 cm^3/rev pump; read at 20 bar, 59.7 L/min, 3.2 kW drawn: a light load (invented).
fn light_load_test() -> PumpTest {
    let mut r = reading(20.0, lpm(59.7));
    r.electrical = Some(ElectricalInput::Power { input: kw(3.2) });
    let mut t = test_of(40.0, 1465.0, vec![r]);
    t.motor_efficiency = MotorEfficiency::Entered { efficiency: 0.93 };
    t
}

/// The test's motor in the engine's part-load model (motor.rs), with the typical fixed share
/// of the loss.
fn the_motor(efficiency: f64) -> Motor {
    Motor {
        rated_power: kw(22.0),
        full_load_speed: rpm(1465.0),
        full_load_efficiency: efficiency,
        fixed_loss_share: TYPICAL_FIXED_LOSS_SHARE,
        service_factor: 1.0,
        peak_allowance: TYPICAL_PEAK_ALLOWANCE,
        electrical: None,
    }
}

/// The shaft power for an input, by bisection on input = shaft + loss(shaft): worked apart
/// from the engine's closed form.
fn shaft_by_bisection(m: &Motor, input: f64) -> f64 {
    let (mut lo, mut hi) = (0.0, input);
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if mid + m.loss(mid) < input {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    0.5 * (lo + hi)
}

#[test]
fn a_light_load_reading_is_worked_at_the_slip_corrected_speed() {
    // At the nameplate 1465 rpm the pump sweeps 58.6 L/min, less than the 59.7 L/min read: the
    // nameplate speed would reject a healthy pump. Lightly loaded, the motor turns nearer its
    // synchronous 1500 rpm (the nearest 120 f / poles above 1465 rpm: common practice), with
    // the 35 rpm full-load slip in proportion to the load (common practice).
    let t = light_load_test();
    assert!(in_lpm(lpm(40.0 * 1465.0 / 1000.0)) < 59.7);
    assert_close(
        efficiency::synchronous_speed(&t).unwrap(),
        rpm(1500.0).value,
        1e-12,
        "synchronous",
    );
    let report = assess(&t);
    assert!(report.problems.is_empty(), "{:?}", report.problems);
    let r = &report.readings[0];
    assert_eq!(r.speed_from, SpeedFrom::Slip);
    // The load from the shaft power the motor gives for 3.2 kW: 2,605 W, 11.8 % of rating;
    // 1500 - 35 x 0.118 = 1495.9 rpm, sweeping 59.83 L/min: 99.8 % volumetric.
    let shaft = shaft_by_bisection(&the_motor(0.93), 3200.0);
    let load = shaft / 22_000.0;
    assert_close(r.load_share.unwrap(), load, 1e-9, "load share");
    let n = 1500.0 - 35.0 * load;
    assert_close(r.speed.value, rpm(n).value, 1e-9, "speed");
    assert_close(n, 1495.86, 1e-5, "speed in rpm, by hand");
    assert_close(
        r.volumetric.unwrap(),
        59.7 / (40.0 * n / 1000.0),
        1e-9,
        "volumetric",
    );
    assert!(matches!(
        report.verdict,
        Verdict::NotJudged // one reading: no verdict
    ));

    // A tachometer reading replaces the estimate.
    let mut measured = t.clone();
    measured.readings[0].speed = Some(rpm(1497.0));
    let report = assess(&measured);
    let r = &report.readings[0];
    assert_eq!(r.speed_from, SpeedFrom::Measured);
    assert_close(
        r.volumetric.unwrap(),
        59.7 / 59.88,
        1e-9,
        "at the measured speed",
    );

    // An entered synchronous speed is used as entered; with none known (a full-load speed of
    // a round 1500 rpm is itself synchronous) the entered speed is taken throughout.
    let mut entered = t.clone();
    entered.synchronous_speed = Some(rpm(1500.0));
    assert_eq!(assess(&entered).readings, assess(&t).readings);
    let mut round = t.clone();
    round.speed = rpm(1500.0);
    assert_eq!(efficiency::synchronous_speed(&round), None);
    assert_eq!(assess(&round).readings[0].speed_from, SpeedFrom::Nameplate);
    // 1750 rpm is a four-pole motor on 60 Hz (1800 rpm).
    let mut sixty = t.clone();
    sixty.speed = rpm(1750.0);
    assert_close(
        efficiency::synchronous_speed(&sixty).unwrap(),
        rpm(1800.0).value,
        1e-12,
        "60 Hz",
    );

    // Files written before readings had speeds read the same: the test's speed is the
    // full-load speed, no synchronous speed, no speed per reading.
    let old = r#"{"pump": "pump 1", "date": "2026-11-30", "displacement_m3_per_rev": 4e-5,
        "speed_rad_per_s": 153.41444, "rated_pressure_pa": 2.1e7, "motor_rated_power_w": 22000,
        "motor_efficiency": {"from": "entered", "efficiency": 0.93},
        "readings": [{"pressure_pa": 2e6, "flow_m3_per_s": 0.000995,
                      "electrical": {"as": "power", "input_w": 3200}}]}"#;
    let old: PumpTest = serde_json::from_str(old).unwrap();
    assert_eq!(old.synchronous_speed, None);
    assert_eq!(old.readings[0].speed, None);
    assert!(assess(&old).problems.is_empty());
}

#[test]
fn shaft_power_from_the_input_follows_the_motors_part_load_efficiency() {
    // The part-load model of motor.rs: a fixed share of the full-load loss plus the rest
    // growing with the square of the load. At 3.2 kW drawn by a 22 kW motor (light load) its
    // efficiency is well below the full-load 93 %, so the shaft gets less than 3.2 x 0.93.
    let report = assess(&light_load_test());
    let shaft = report.readings[0].shaft.map(|q| q.value).unwrap();
    assert!(shaft < 3200.0 * 0.93 - 100.0, "{shaft}");
    let m = the_motor(0.93);
    // input = shaft + loss(shaft), to rounding.
    assert_close(shaft + m.loss(shaft), 3200.0, 1e-12, "power balance");
    assert_close(shaft, shaft_by_bisection(&m, 3200.0), 1e-9, "bisection");
    assert_close(shaft, 2605.34, 1e-5, "by hand");
    assert_close(
        report.readings[0].overall.unwrap(),
        1990.0 / shaft,
        1e-12,
        "overall",
    );
    // At the rated load the full-load efficiency holds exactly (its definition).
    assert_close(
        efficiency::shaft_for_input(&m, 22_000.0 / 0.93),
        22_000.0,
        1e-12,
        "full load",
    );
    // An input below what the motor draws running light is a misreading: no shaft figure.
    let mut t = light_load_test();
    t.readings[0].electrical = Some(ElectricalInput::Power { input: kw(0.4) });
    let report = assess(&t);
    assert_eq!(report.readings[0].shaft.map(|q| q.value), None);
    assert!(report
        .problems
        .iter()
        .any(|p| p.field == "readings[0].electrical" && p.message.contains("no load")));
}

#[test]
fn copying_a_measured_hydromechanical_efficiency_zeroes_the_drag() {
    // Esposito's Example 5-9 reading (120 N.m at 70 bar, 100 cm^3/rev, 1000 rpm) and one at
    // 20 bar: the measured hydromechanical efficiency holds the drag already.
    let mut r = reading(70.0, m3s(0.0015));
    r.torque = Some(newton_metres(120.0));
    let t = test_of(100.0, 1000.0, vec![reading(20.0, m3s(0.00162)), r]);
    let measured = efficiency::measured_pump(&t, &assess(&t)).unwrap();
    let job = phasewise_engine::demo::scrap_baler();
    assert!(job.designs[0].base_pump.drag_power.value > 0.0);
    let d = efficiency::apply_to_design(&job.designs[0], 1, &measured).unwrap();
    assert_eq!(d.base_pump.drag_power.value, 0.0);
    // Only the volumetric efficiency measured: the drag stays.
    let volumetric_only = MeasuredPump {
        hydromechanical: None,
        ..measured
    };
    let d = efficiency::apply_to_design(&job.designs[0], 0, &volumetric_only).unwrap();
    assert_eq!(
        d.unloading_stages[0].pump.drag_power,
        job.designs[0].unloading_stages[0].pump.drag_power
    );
}

#[test]
fn an_efficiency_no_pump_has_is_never_copied() {
    // A dead-headed reading (no flow at 200 bar) puts the line's volumetric efficiency at
    // zero there: refused with a reason, never copied (a design cannot run such a pump).
    let t = test_of(
        40.0,
        1500.0,
        vec![reading(20.0, lpm(57.0)), reading(200.0, lpm(0.0))],
    );
    let why = efficiency::measured_pump(&t, &assess(&t)).unwrap_err();
    assert!(
        matches!(why, NotCopied::Volumetric { volumetric, .. } if volumetric <= 0.0),
        "{why:?}"
    );
    assert!(why.message(UnitSystem::Si).contains("no working pump has"));
    // Nor put into a design by hand.
    let design = &phasewise_engine::demo::scrap_baler().designs[0];
    for (volumetric, hydromechanical) in [
        (0.0, None),
        (-0.1, None),
        (1.2, None),
        (f64::NAN, None),
        (0.9, Some(0.0)),
        (0.9, Some(1.1)),
    ] {
        let m = MeasuredPump {
            volumetric,
            at_pressure: bar_(100.0),
            at_speed: AngularVelocity::new::<uom::si::angular_velocity::radian_per_second>(150.0),
            hydromechanical,
        };
        assert!(
            efficiency::apply_to_design(design, 1, &m).is_err(),
            "{volumetric} {hydromechanical:?}"
        );
    }
    // No believable reading: nothing to copy.
    let t = test_of(40.0, 1500.0, vec![reading(100.0, lpm(70.0))]);
    assert_eq!(
        efficiency::measured_pump(&t, &assess(&t)),
        Err(NotCopied::NoBelievableReading)
    );
}

#[test]
fn a_verdict_rests_on_two_or_more_believable_readings() {
    // Three readings, two of them more than the pump sweeps (60 L/min): one believable point
    // gives no verdict, and the report says on how many readings it rests.
    let t = test_of(
        40.0,
        1500.0,
        vec![
            reading(100.0, lpm(57.0)),
            reading(150.0, lpm(70.0)),
            reading(200.0, lpm(80.0)),
        ],
    );
    let report = assess(&t);
    assert_eq!(report.verdict, Verdict::NotJudged);
    assert_eq!((report.readings_used, report.readings_rejected), (1, 2));
    // Two believable readings at one pressure: still one point.
    let same = assess(&test_of(
        40.0,
        1500.0,
        vec![reading(100.0, lpm(57.0)), reading(100.0, lpm(57.2))],
    ));
    assert_eq!(same.verdict, Verdict::NotJudged);
    assert_eq!(same.readings_used, 2);
    // Two at different pressures: judged, on two.
    let two = assess(&test_of(
        40.0,
        1500.0,
        vec![
            reading(50.0, lpm(59.0)),
            reading(150.0, lpm(57.0)),
            reading(200.0, lpm(80.0)),
        ],
    ));
    assert!(
        matches!(two.verdict, Verdict::Good { .. }),
        "{:?}",
        two.verdict
    );
    assert_eq!((two.readings_used, two.readings_rejected), (2, 1));
    assert_eq!(efficiency::READINGS_FOR_VERDICT, 2);
}

#[test]
fn tests_are_ordered_by_date_not_by_text() {
    // 2026-9-5 is before 2026-10-01, though "9" sorts after "1" as text.
    let mut september = test_of(
        40.0,
        1500.0,
        vec![reading(50.0, lpm(58.5)), reading(100.0, lpm(57.0))],
    );
    september.date = "2026-9-5".into();
    let mut october = september.clone();
    october.date = "2026-10-01".into();
    let tests = vec![september, october];
    let t = efficiency::trend(&tests, 1, &WearPolicy::default()).unwrap();
    assert_eq!(t.earlier, 0);
    // 25 days left of September, then 1 October.
    assert_eq!(t.days, Some(26));
    assert_eq!(efficiency::trend(&tests, 0, &WearPolicy::default()), None);
    assert_eq!(
        efficiency::day_number("2026-9-5"),
        efficiency::day_number("2026-09-05")
    );
    // The civil calendar: no 30 February; 29 February only in a leap year.
    assert_eq!(efficiency::day_number("2026-02-30"), None);
    assert_eq!(efficiency::day_number("2026-2-29"), None);
    assert!(efficiency::day_number("2024-2-29").is_some());
    assert_eq!(efficiency::day_number("2026-04-31"), None);
}

#[test]
fn an_invalid_test_is_refused_not_assessed() {
    // assess checks the test itself and names each field within it, as validate_pump_test
    // names it within the job.
    let mut t = light_load_test();
    t.displacement = Volume::new::<cubic_centimeter>(f64::NAN);
    t.synchronous_speed = Some(rpm(1400.0));
    t.readings[0].speed = Some(rpm(-5.0));
    let errors = efficiency::assess(&t, &WearPolicy::default(), UnitSystem::Si).unwrap_err();
    let fields: Vec<&str> = errors.iter().map(|e| e.field.as_str()).collect();
    assert_eq!(
        fields,
        [
            "displacement_m3_per_rev",
            "synchronous_speed_rad_per_s",
            "readings[0].speed_rad_per_s"
        ]
    );
    let in_job = validate_pump_test(&t, 3, UnitSystem::Si);
    assert_eq!(in_job.len(), 3);
    assert_eq!(in_job[1].field, "pump_tests[3].synchronous_speed_rad_per_s");
    assert!(in_job[1].message.contains("above the full-load speed"));
    // A synchronous speed far above the full-load speed is a typing slip.
    let mut far = light_load_test();
    far.synchronous_speed = Some(rpm(3000.0));
    assert!(validate_pump_test(&far, 0, UnitSystem::Si)
        .iter()
        .any(|e| e.field == "pump_tests[0].synchronous_speed_rad_per_s"));
    // No readings, an empty motor rating: refused, never a panic.
    let mut empty = light_load_test();
    empty.readings.clear();
    empty.motor_rated_power = kw(0.0);
    assert!(efficiency::assess(&empty, &WearPolicy::default(), UnitSystem::Si).is_err());
    assert!(validate_pump_test(&light_load_test(), 0, UnitSystem::Si).is_empty());
}

/// A test switched to a nameplate efficiency starts from the baseline motor's figure, and from
/// a typical one (0.9, common practice) while that motor has none yet.
#[test]
fn a_switch_to_a_nameplate_figure_starts_from_the_baseline_motor() {
    use phasewise_engine::efficiency::nameplate_efficiency_offered;
    let mut job = phasewise_engine::demo::scrap_baler();
    job.designs[0].motor.full_load_efficiency = 0.87;
    assert_eq!(nameplate_efficiency_offered(&job), 0.87);
    let blank = phasewise_engine::Job::blank(
        "New job".into(),
        phasewise_engine::units::UnitSystem::Si,
        "EUR".into(),
    );
    assert_eq!(nameplate_efficiency_offered(&blank), 0.9);
}
