//! Properties over random jobs. CI runs a few thousand cases per property; for a long run:
//!
//!     PHASEWISE_CASES=100000 cargo test --release -p phasewise-engine --test engine properties -- --nocapture
//!
//! which prints how many cases each property ran. The generated units are plausible designs:
//! the relief is rated for the pumps' full flow, and the vent pressure plus a check valve's
//! cracking stays under the unloading drop, as on an ordinary unit.

use crate::common::*;
use phasewise_engine::cycle::*;
use phasewise_engine::drive::{
    ConverterClass, ConverterLoss, DriveKind, HoldSpeed, IdleSpeed, MotorCooling, VariableSpeed,
};
use phasewise_engine::job::Job;
use phasewise_engine::power_unit::{Design, PhaseSetting, UnloadingStage};
use phasewise_engine::pump::{Pump, PumpControl};
use phasewise_engine::valve::*;
use phasewise_engine::{solve, Finding, JobReport};
use proptest::prelude::*;
use proptest::test_runner::{Config, TestCaseError, TestRunner};
use uom::si::f64::{Force, Volume, VolumeRate};

fn cases() -> u32 {
    std::env::var("PHASEWISE_CASES")
        .ok()
        .and_then(|c| c.parse().ok())
        .unwrap_or(2000)
}

/// Runs `property` over `strategy` for the configured number of cases and prints the count.
fn check<S: Strategy>(
    name: &str,
    strategy: S,
    property: impl Fn(S::Value) -> Result<(), TestCaseError>,
) where
    S::Value: std::fmt::Debug,
{
    let cases = cases();
    let config = Config {
        cases,
        max_global_rejects: cases * 20,
        failure_persistence: None,
        ..Config::default()
    };
    let mut runner = TestRunner::new(config);
    if let Err(e) = runner.run(&strategy, property) {
        panic!("{name}: {e}");
    }
    eprintln!("{name}: {cases} cases passed");
}

fn pump(max_cc: f64) -> impl Strategy<Value = Pump> {
    (
        2.0..max_cc,
        0.80..=1.0f64,
        100.0..250.0f64,
        0.80..=1.0f64,
        0.0..0.5f64,
        prop::option::weighted(0.2, 60.0..250.0f64),
    )
        .prop_map(|(cc, vol, at, hm, drag, compensator)| {
            let mut p = fixed_pump(cc, vol, at, hm, drag);
            p.rated_pressure = bar_(400.0);
            if let Some(setting) = compensator {
                p.control = PumpControl::Compensated {
                    setting: bar_(setting),
                };
            }
            p
        })
}

fn stage_strategy(vent: f64) -> impl Strategy<Value = UnloadingStage> {
    (pump(80.0), 20.0..200.0f64, 0.0..1.0f64, 0.2..3.0f64)
        .prop_map(move |(p, setting, check, extra)| stage(p, setting, vent + check + extra, check))
}

fn phase() -> impl Strategy<Value = Phase> {
    let speed = prop_oneof![
        Just(SpeedRule::AllPumpFlow),
        (0.005..0.5f64).prop_map(metered_speed),
        (1.0..200.0f64).prop_map(|q| SpeedRule::MeteredFlow { flow: lpm(q) }),
    ];
    let load = prop_oneof![
        (0.0..400.0f64).prop_map(|kn| Load::Force {
            force: Force::new::<uom::si::force::kilonewton>(kn)
        }),
        (0.0..300.0f64).prop_map(|b| Load::Pressure { pressure: bar_(b) }),
    ];
    let moving = (
        25.0..200.0f64,
        0.1..0.9f64,
        10.0..1000.0f64,
        any::<bool>(),
        load,
        0.0..20.0f64,
        speed,
    )
        .prop_map(|(bore, rod, stroke, extend, load, line, speed)| {
            PhaseKind::Move(MovePhase {
                cylinder: Cylinder {
                    bore: mm(bore),
                    rod: mm(bore * rod),
                    stroke: mm(stroke),
                },
                direction: if extend {
                    Direction::Extend
                } else {
                    Direction::Retract
                },
                load,
                line_loss: bar_(line),
                lines: None,
                speed,
                target_time: None,
            })
        });
    let holding = (10.0..300.0f64, 0.1..60.0f64, any::<bool>()).prop_map(|(b, t, by_pump)| {
        hold(
            "",
            b,
            t,
            if by_pump {
                HoldMode::HeldByPump
            } else {
                HoldMode::LockedByCheck
            },
        )
        .kind
    });
    let idling = (0.1..300.0f64).prop_map(|t| idle("", t).kind);
    let demand =
        (0.0..200.0f64, 0.0..300.0f64, 0.1..60.0f64).prop_map(|(q, b, t)| direct("", q, b, t).kind);
    prop_oneof![3 => moving, 1 => holding, 2 => idling, 1 => demand].prop_map(|kind| Phase {
        name: "phase".into(),
        kind,
    })
}

fn setting(pilot: bool, remotes: usize) -> impl Strategy<Value = PhaseSetting> {
    (0..3usize, 0..4usize, 0..remotes.max(1), 0.0..5.0f64).prop_map(
        move |(limit, path, stage, drop)| {
            let limit = match limit {
                1 if pilot && remotes > 0 => ActiveLimit::Remote { stage },
                2 if pilot => ActiveLimit::Vented,
                _ => ActiveLimit::Main,
            };
            let idle_path = match path {
                1 if pilot => IdlePath::Vented,
                2 => IdlePath::OpenCentre { drop: bar_(drop) },
                3 => IdlePath::MotorStopped,
                _ => IdlePath::OverLimit,
            };
            PhaseSetting {
                limit,
                idle_path,
                measured_current: None,
            }
        },
    )
}

fn design_strategy(phases: usize) -> impl Strategy<Value = Design> {
    (any::<bool>(), 0.5..2.0f64, 0..4usize, 0..=3usize).prop_flat_map(
        move |(pilot, vent, remotes, stages)| {
            let remotes = if pilot { remotes } else { 0 };
            (
                (
                    2.0..100.0f64,
                    900.0..3600.0f64,
                    0.75..0.97f64,
                    0.0..=1.0f64,
                    1.0..1.25f64,
                ),
                prop::collection::vec(stage_strategy(vent), stages),
                pump(40.0),
                (50.0..300.0f64, 0.70..0.99f64, 1.0..3.0f64),
                prop::collection::vec(10.0..300.0f64, remotes),
                prop::collection::vec(setting(pilot, remotes), phases),
            )
                .prop_map(
                    move |(m, stages, base, (set, crack, margin), remote_bars, settings)| {
                        let mut motor = motor(m.0, m.1, m.2);
                        motor.fixed_loss_share = m.3;
                        motor.service_factor = m.4;
                        // An electrical nameplate consistent with a 0.85 full-load power
                        // factor at 400 V, so every running phase has a line current.
                        motor.electrical = Some(phasewise_engine::motor::ElectricalRating {
                            voltage: uom::si::f64::ElectricPotential::new::<
                                uom::si::electric_potential::volt,
                            >(400.0),
                            full_load_current: uom::si::f64::ElectricCurrent::new::<
                                uom::si::electric_current::ampere,
                            >(
                                m.0 * 1e3 / (m.2 * 3f64.sqrt() * 400.0 * 0.85)
                            ),
                            power_factor: None,
                        });
                        let kind = if pilot {
                            ReliefKind::PilotOperated
                        } else {
                            ReliefKind::DirectActing
                        };
                        let mut d = design(
                            "design",
                            motor,
                            stages,
                            base,
                            relief(kind, set, 1.0, crack),
                            phases,
                        );
                        // Rated for the pumps' full flow, with a margin.
                        let rps = m.1 / 60.0;
                        let swept: f64 = d.pumps().map(|p| p.displacement.value * rps).sum();
                        d.relief.rated_flow = VolumeRate::new::<
                            uom::si::volume_rate::cubic_meter_per_second,
                        >(swept * margin);
                        d.remote_stages = remote_bars.into_iter().map(bar_).collect();
                        d.vent_pressure = bar_(vent);
                        d.phase_settings = settings;
                        d
                    },
                )
        },
    )
}

/// A variable-speed drive for a motor, its speeds as shares of the motor's full-load speed.
/// A drive's figures: slowest and fastest speed over the motor's, converter rating over the
/// motor's, its losses, holds, idles and cooling.
type DriveFigures = (
    f64,
    f64,
    f64,
    ConverterLoss,
    HoldSpeed,
    IdleSpeed,
    MotorCooling,
);

fn drive_strategy() -> impl Strategy<Value = DriveFigures> {
    (
        0.02..0.6f64,
        1.0..1.5f64,
        0.8..2.0f64,
        prop_oneof![
            (0.005..0.08f64).prop_map(|share| ConverterLoss::Stated { share }),
            // A maker's eight figures rise with current and with frequency.
            (0.002..0.02f64, 0.0..0.01f64, 0.0..0.03f64).prop_map(|(base, by_f, by_i)| {
                ConverterLoss::Points {
                    shares: phasewise_engine::drive::STANDARD_POINTS
                        .map(|(f, i)| base + by_f * f / 90.0 + by_i * i / 100.0),
                }
            }),
            prop_oneof![Just(ConverterClass::IE1), Just(ConverterClass::IE2)]
                .prop_map(|class| ConverterLoss::Class { class }),
        ],
        prop_oneof![
            Just(HoldSpeed::MinimumAgainstRelief),
            Just(HoldSpeed::MakeUpLeakage)
        ],
        prop_oneof![Just(IdleSpeed::Minimum), Just(IdleSpeed::Stopped)],
        prop_oneof![
            Just(MotorCooling::SelfCooled),
            Just(MotorCooling::SeparateFan)
        ],
    )
}

/// Puts a drive from [`drive_strategy`] on `design`.
fn drive_on(design: &mut Design, (min, max, rating, loss, hold, idle, cooling): DriveFigures) {
    let base = design.motor.full_load_speed;
    design.drive = Some(VariableSpeed {
        kind: DriveKind::InductionOnInverter,
        min_speed: base * min,
        max_speed: base * max,
        converter_rating: design.motor.rated_power * (rating / 0.75),
        converter_loss: loss,
        hold,
        idle,
        cooling,
    });
}

fn job_strategy() -> impl Strategy<Value = Job> {
    (1..=12usize).prop_flat_map(|n| {
        (
            prop::collection::vec(phase(), n),
            prop::collection::vec(
                (
                    design_strategy(n),
                    prop::option::weighted(0.3, drive_strategy()),
                ),
                1..=2,
            ),
            20.0..2000.0f64,
        )
            .prop_map(|(cycle, designs, litres)| {
                let designs = designs
                    .into_iter()
                    .map(|(mut d, drive)| {
                        if let Some(drive) = drive {
                            drive_on(&mut d, drive);
                        }
                        d
                    })
                    .collect();
                let mut j = job(cycle, designs);
                j.oil.volume = Volume::new::<uom::si::volume::liter>(litres);
                j
            })
    })
}

fn solved(job: &Job) -> Result<JobReport, TestCaseError> {
    solve(job).map_err(|e| TestCaseError::fail(format!("a valid job was refused: {e:?}")))
}

#[test]
fn the_ledger_closes_and_every_number_is_finite() {
    check("ledger closes", job_strategy(), |job| {
        let report = solved(&job)?;
        for (design, unit) in report.designs.iter().zip(&job.designs) {
            for phase in &design.phases {
                let l = &phase.ledger;
                prop_assert!(
                    l.imbalance().abs() < 1e-9,
                    "{}: imbalance {:e} in {l:?}",
                    phase.name,
                    l.imbalance()
                );
                let items = [
                    l.electrical_input,
                    l.motor_loss,
                    l.drive_loss,
                    l.pump_internal_loss,
                    l.unloading_loss,
                    l.relief_loss,
                    l.metering_loss,
                    l.line_valve_loss,
                    l.useful_power,
                ];
                for item in items {
                    prop_assert!(
                        item.value.is_finite()
                            && item.value >= -1e-9 * l.electrical_input.value.max(1.0),
                        "{l:?}"
                    );
                }
                // The line current and power factor give the ledger's input: sqrt(3) V I PF.
                match (phase.line, phase.point.motor_running) {
                    (Some(line), true) => {
                        let input = 3f64.sqrt() * 400.0 * line.current.value * line.power_factor;
                        prop_assert!(
                            (input - l.electrical_input.value).abs()
                                <= 1e-9 * l.electrical_input.value.max(1.0),
                            "{input} against {l:?}"
                        );
                        prop_assert!((0.0..=1.0).contains(&line.power_factor), "{line:?}");
                    }
                    (None, false) => {}
                    // A converter-fed motor's line current is not modelled.
                    (None, true) if unit.drive.is_some() => {}
                    (line, running) => {
                        prop_assert!(false, "line {line:?} while running {running}")
                    }
                }
                let p = &phase.point;
                for x in [
                    p.system_pressure.value,
                    p.actuator_flow.value,
                    p.relief_flow.value,
                    p.duration.value,
                ] {
                    prop_assert!(x.is_finite() && x >= 0.0, "{p:?}");
                }
                prop_assert!(p.duration.value > 0.0, "{p:?}");
                // On a drive the speed chosen keeps within its range (zero only stopped).
                match (&unit.drive, p.shaft_speed) {
                    (None, None) => {}
                    (Some(drive), Some(speed)) if !p.motor_running => {
                        prop_assert!(speed.value == 0.0, "{drive:?} stopped at {speed:?}")
                    }
                    (Some(drive), Some(speed)) => prop_assert!(
                        speed.value >= drive.min_speed.value * (1.0 - 1e-12)
                            && speed.value <= drive.max_speed.value * (1.0 + 1e-12),
                        "{speed:?} outside {drive:?}"
                    ),
                    (drive, speed) => prop_assert!(false, "{drive:?} with a speed {speed:?}"),
                }
            }
            let t = &design.totals;
            for x in [
                t.cycle_time.value,
                t.energy_per_cycle.value,
                t.rms_shaft.value,
                t.heat_load.value,
                t.heat_load_btu_per_hour,
                t.oil_rise_k_per_minute,
                t.annual_energy.get::<uom::si::energy::kilowatt_hour>(),
                t.annual_cost,
            ] {
                prop_assert!(x.is_finite() && x >= 0.0, "{t:?}");
            }
            for f in &design.findings {
                prop_assert!(!f.describe(job.units).contains("NaN"));
            }
        }
        Ok(())
    });
}

#[test]
fn venting_an_idle_on_fixed_pumps_never_raises_its_energy() {
    check("venting idles", job_strategy(), |mut job| {
        // Venting needs a pilot-operated relief; make sure the cycle has an idle over the limit.
        // On fixed pumps: a compensated pump dead-headed at its setting draws only its leakage
        // power, which can be less than pumping full flow across a vented relief.
        for design in &mut job.designs {
            design.relief.kind = ReliefKind::PilotOperated;
            design.base_pump.control = PumpControl::Fixed;
            for s in &mut design.unloading_stages {
                s.pump.control = PumpControl::Fixed;
            }
        }
        if !job.cycle.iter().enumerate().any(|(i, p)| {
            matches!(p.kind, PhaseKind::Idle(_))
                && job.designs[0].phase_settings[i].idle_path == IdlePath::OverLimit
        }) {
            job.cycle.push(idle("idle", 30.0));
            for design in &mut job.designs {
                design.phase_settings.push(PhaseSetting::default());
            }
        }
        let design = &job.designs[0];
        let idles: Vec<usize> = job
            .cycle
            .iter()
            .enumerate()
            .filter(|(i, p)| {
                matches!(p.kind, PhaseKind::Idle(_))
                    && design.phase_settings[*i].idle_path == IdlePath::OverLimit
            })
            .map(|(i, _)| i)
            .collect();
        let before = solved(&job)?;
        for &i in &idles {
            job.designs[0].phase_settings[i].idle_path = IdlePath::Vented;
        }
        let after = solved(&job)?;
        for &i in &idles {
            let energy = |r: &JobReport| {
                r.designs[0].phases[i].ledger.electrical_input.value
                    * r.designs[0].phases[i].point.duration.value
            };
            prop_assert!(
                energy(&after) <= energy(&before) * (1.0 + 1e-9) + 1e-9,
                "idle {i}: {} J vented against {} J",
                energy(&after),
                energy(&before)
            );
        }
        Ok(())
    });
}

#[test]
fn lowering_a_needlessly_high_limit_in_a_metered_phase_never_raises_its_loss() {
    // On fixed pumps (a compensated pump's dead-head can cost less than dumping at a lower
    // limit), and keeping the lower limit above every unloading setting, so the
    // staging stays as it was: then only the pressure the surplus is dumped at falls.
    check(
        "lower metered limit",
        (job_strategy(), 0.0..1.0f64),
        |(mut job, pick)| {
            let d = &mut job.designs[0];
            d.relief.kind = ReliefKind::PilotOperated;
            d.base_pump.control = PumpControl::Fixed;
            for s in &mut d.unloading_stages {
                s.pump.control = PumpControl::Fixed;
            }
            let design = &job.designs[0];
            let before = solved(&job)?;
            let Some(i) = before.designs[0].phases.iter().enumerate().position(|(i, p)| {
            matches!(&job.cycle[i].kind, PhaseKind::Move(m) if !matches!(m.speed, SpeedRule::AllPumpFlow))
                && design.phase_settings[i].limit == ActiveLimit::Main
                && p.findings.is_empty()
        }) else {
            return Err(TestCaseError::reject("no cleanly metered phase on the main limit"));
        };
            let PhaseKind::Move(m) = &job.cycle[i].kind else {
                unreachable!()
            };
            let area = m.cylinder.working_area_m2(m.direction);
            let need = match m.load {
                Load::Force { force } => force.value / area,
                Load::Pressure { pressure } => pressure.value,
            } + m.line_loss.value;
            let crack = design.relief.cracking_fraction;
            let highest_unloading = design
                .unloading_stages
                .iter()
                .map(|s| s.unloading.setting.value)
                .fold(0.0, f64::max);
            let floor = (need / crack).max(highest_unloading / crack) * 1.001;
            let main = design.relief.setting.value;
            prop_assume!(floor < main);
            let remote = floor + pick * (main - floor);
            let loss = |r: &JobReport| {
                let l = &r.designs[0].phases[i].ledger;
                (l.electrical_input - l.useful_power).value
            };
            job.designs[0]
                .remote_stages
                .push(uom::si::f64::Pressure::new::<uom::si::pressure::pascal>(
                    remote,
                ));
            let stage = job.designs[0].remote_stages.len() - 1;
            job.designs[0].phase_settings[i].limit = ActiveLimit::Remote { stage };
            let after = solved(&job)?;
            prop_assert!(
                loss(&after) <= loss(&before) * (1.0 + 1e-9) + 1e-9,
                "loss {} W at the lower limit against {} W",
                loss(&after),
                loss(&before)
            );
            Ok(())
        },
    );
}

#[test]
fn more_displacement_never_lengthens_a_move_that_takes_all_pump_flow() {
    check(
        "more displacement",
        (job_strategy(), 1.0..2.0f64),
        |(mut job, factor)| {
            let before = solved(&job)?;
            job.designs[0].base_pump.displacement *= factor;
            for s in &mut job.designs[0].unloading_stages {
                s.pump.displacement *= factor;
            }
            let after = solved(&job)?;
            for (i, phase) in job.cycle.iter().enumerate() {
                let PhaseKind::Move(m) = &phase.kind else {
                    continue;
                };
                let stalled = |r: &JobReport| {
                    r.designs[0].phases[i]
                        .findings
                        .iter()
                        .any(|f| matches!(f, Finding::Stall { .. }))
                };
                // Above its full-load speed a drive holds the motor to its power: a bigger pump
                // turns slower there, leaks more (slip grows with size) and its relief passes
                // more (its setting read with the pumps' full flow), so the same power can move
                // the cylinder slower. Only phases at the drive's top speed are compared.
                let power_limited = |r: &JobReport| {
                    let top = job.designs[0].drive.map(|d| d.max_speed.value);
                    let speed = r.designs[0].phases[i].point.shaft_speed.map(|w| w.value);
                    matches!((top, speed), (Some(top), Some(w)) if w < top * (1.0 - 1e-12))
                };
                if m.speed != SpeedRule::AllPumpFlow
                    || stalled(&before)
                    || stalled(&after)
                    || power_limited(&before)
                    || power_limited(&after)
                {
                    continue;
                }
                let t = |r: &JobReport| r.designs[0].phases[i].point.duration.value;
                prop_assert!(
                    t(&after) <= t(&before) * (1.0 + 1e-9),
                    "phase {i}: {} s with x{factor} displacement against {} s",
                    t(&after),
                    t(&before)
                );
            }
            Ok(())
        },
    );
}

/// Puts `bad` into the numeric field number `which` of a job (counting every field below).
fn spoil(job: &mut Job, which: usize, bad: f64) {
    let d = &mut job.designs[0];
    let mut fields: Vec<&mut f64> = vec![
        &mut d.motor.rated_power.value,
        &mut d.motor.full_load_speed.value,
        &mut d.motor.full_load_efficiency,
        &mut d.motor.fixed_loss_share,
        &mut d.motor.service_factor,
        &mut d.motor.peak_allowance,
        &mut d.base_pump.displacement.value,
        &mut d.base_pump.volumetric_efficiency,
        &mut d.base_pump.efficiency_pressure.value,
        &mut d.base_pump.hydromechanical_efficiency,
        &mut d.base_pump.drag_power.value,
        &mut d.base_pump.rated_pressure.value,
        &mut d.relief.setting.value,
        &mut d.relief.rated_flow.value,
        &mut d.relief.cracking_fraction,
        &mut d.vent_pressure.value,
        &mut job.site.operating_hours_per_year,
        &mut job.site.tariff_per_kwh,
        &mut job.site.retrofit_price,
        &mut job.oil.volume.value,
        &mut job.oil.density.value,
        &mut job.oil.specific_heat.value,
    ];
    for stage in &mut d.unloading_stages {
        fields.push(&mut stage.unloading.setting.value);
        fields.push(&mut stage.check.cracking.value);
        fields.push(&mut stage.pump.displacement.value);
    }
    for phase in &mut job.cycle {
        match &mut phase.kind {
            PhaseKind::Move(m) => {
                fields.push(&mut m.cylinder.bore.value);
                fields.push(&mut m.cylinder.stroke.value);
                fields.push(&mut m.line_loss.value);
            }
            PhaseKind::Hold(h) => fields.push(&mut h.duration.value),
            PhaseKind::Idle(i) => fields.push(&mut i.duration.value),
            PhaseKind::Direct(x) => fields.push(&mut x.pressure.value),
        }
    }
    let n = fields.len();
    *fields[which % n] = bad;
}

#[test]
fn an_invalid_job_is_always_a_typed_error_and_never_a_panic() {
    let bad = prop_oneof![
        Just(f64::NAN),
        Just(f64::INFINITY),
        Just(f64::NEG_INFINITY),
        Just(-1.0),
        Just(1e30)
    ];
    check(
        "invalid input",
        (job_strategy(), any::<usize>(), bad),
        |(mut job, which, bad)| {
            spoil(&mut job, which, bad);
            // The other public entry points refuse it too, with errors, never a panic.
            prop_assert!(phasewise_engine::settings::advise(&job, 0).is_err());
            prop_assert!(phasewise_engine::answer(&job).is_err());
            match solve(&job) {
                Ok(_) => Err(TestCaseError::fail(format!("{bad} was accepted"))),
                Err(errors) => {
                    prop_assert!(!errors.is_empty());
                    for e in &errors {
                        prop_assert!(
                            !e.field.is_empty()
                                && !e.message.is_empty()
                                && !e.message.contains("NaN"),
                            "{e:?}"
                        );
                    }
                    Ok(())
                }
            }
        },
    );
}

#[test]
fn any_text_read_as_a_job_file_is_a_job_or_a_reason() {
    let text = prop_oneof![
        ".{0,200}",
        job_strategy().prop_flat_map(|j| {
            let json = j.to_json();
            let len = json.len();
            (Just(json), 0..len).prop_map(|(json, cut)| json[..cut].to_string())
        })
    ];
    check("job file text", text, |text| {
        let _ = Job::from_json(&text);
        Ok(())
    });
}

/// On any valid job the advice keeps its own rules: no proposed limit below a compensated pump's
/// floor (a relief at or below the compensator takes the pump's whole flow; the margin above it
/// is common practice), and an action that draws more is never worded as a saving.
#[test]
fn the_advice_keeps_its_own_rules_on_any_job() {
    use phasewise_engine::settings::{self, Action};
    check("advice rules", job_strategy(), |job| {
        if solve(&job).is_err() {
            return Ok(());
        }
        for (d, design) in job.designs.iter().enumerate() {
            let floor = settings::compensator_floor(design, &job.advice);
            let advice =
                settings::advise(&job, d).map_err(|e| TestCaseError::fail(format!("{e:?}")))?;
            for a in &advice {
                if let (
                    Some(f),
                    Some(Action::LimitPhase { pressure, .. } | Action::SetMain { pressure }),
                ) = (floor, a.action)
                {
                    prop_assert!(pressure.value >= f * (1.0 - 1e-9), "{a:?} below {f}");
                }
                if let Some(effect) = a.effect(job.units).map(|e| e.to_lowercase()) {
                    if a.annual_saving_kwh < -0.5 {
                        prop_assert!(effect.contains("costs"), "{effect} / {a:?}");
                        prop_assert!(!effect.contains("aves") || a.saving.value > 0.5, "{effect}");
                    }
                    let in_phase = matches!(
                        a.action,
                        Some(Action::LimitPhase { .. } | Action::VentPhase { .. })
                    );
                    if in_phase && a.saving.value < -0.5 {
                        prop_assert!(effect.contains("more in the phase"), "{effect} / {a:?}");
                    }
                    if !in_phase {
                        prop_assert!(!effect.contains("in the phase"), "{effect} / {a:?}");
                    }
                }
            }
        }
        Ok(())
    });
}

/// With every hold and idle kept at the drive's minimum speed, on a single fixed pump (no
/// unloading valve for the pressure to cross), a lower minimum speed never raises the energy
/// of the cycle: what runs at the minimum only sweeps less oil over the relief.
#[test]
fn a_lower_minimum_speed_never_raises_a_driven_cycle_s_energy() {
    check(
        "lower minimum speed",
        (job_strategy(), drive_strategy(), 0.1..1.0f64),
        |(mut job, drive, lower)| {
            let d = &mut job.designs[0];
            d.unloading_stages.clear();
            d.base_pump.control = PumpControl::Fixed;
            let (_, max, rating, loss, _, _, cooling) = drive;
            drive_on(
                d,
                (
                    drive.0,
                    max,
                    rating,
                    loss,
                    HoldSpeed::MinimumAgainstRelief,
                    IdleSpeed::Minimum,
                    cooling,
                ),
            );
            let swept = |d: &Design| {
                d.base_pump.displacement.value * d.motor.full_load_speed.value
                    / std::f64::consts::TAU
            };
            d.relief.rated_flow =
                VolumeRate::new::<uom::si::volume_rate::cubic_meter_per_second>(swept(d) * 1.5);
            let energy = |r: &JobReport| r.designs[0].totals.energy_per_cycle.value;
            let before = solved(&job)?;
            if let Some(drive) = &mut job.designs[0].drive {
                drive.min_speed *= lower;
            }
            let after = solved(&job)?;
            prop_assert!(
                energy(&after) <= energy(&before) * (1.0 + 1e-9) + 1e-9,
                "{} J with the minimum x{lower} against {} J",
                energy(&after),
                energy(&before)
            );
            Ok(())
        },
    );
}
