//! Bad input: every problem is a typed error naming its field, in words a technician
//! understands; job files are read back unchanged or refused with a reason.

use crate::common::*;
use phasewise_engine::cycle::{Direction, PhaseKind, SpeedRule};
use phasewise_engine::heat::TankSize;
use phasewise_engine::site::WorkingTemperature;
use phasewise_engine::valve::{ActiveLimit, IdlePath, ReliefKind};
use phasewise_engine::viscosity::OilViscosity;
use phasewise_engine::{solve, Job, JobFileError, SCHEMA_VERSION};
use uom::si::f64::KinematicViscosity;
use uom::si::kinematic_viscosity::square_millimeter_per_second;

fn good_job() -> Job {
    let cycle = vec![
        move_phase(
            "approach",
            80.0,
            45.0,
            250.0,
            Direction::Extend,
            4.0,
            3.0,
            SpeedRule::AllPumpFlow,
        ),
        hold(
            "hold",
            90.0,
            3.0,
            phasewise_engine::cycle::HoldMode::HeldByPump,
        ),
        idle("idle", 8.0),
    ];
    let d = design(
        "as found",
        motor(7.5, 1450.0, 0.89),
        vec![stage(
            fixed_pump(25.0, 0.93, 180.0, 0.88, 0.15),
            40.0,
            3.0,
            0.5,
        )],
        fixed_pump(6.0, 0.93, 180.0, 0.88, 0.1),
        relief(ReliefKind::PilotOperated, 140.0, 60.0, 0.97),
        cycle.len(),
    );
    job(cycle, vec![d])
}

/// The errors of a job after `edit`, as (field, message) pairs.
fn errors_after(edit: impl FnOnce(&mut Job)) -> Vec<(String, String)> {
    let mut j = good_job();
    edit(&mut j);
    match solve(&j) {
        Ok(_) => vec![],
        Err(errors) => errors.into_iter().map(|e| (e.field, e.message)).collect(),
    }
}

/// The errors of a job after `edit`, as (field, words) pairs.
fn words_after(edit: impl FnOnce(&mut Job)) -> Vec<(String, String)> {
    let mut j = good_job();
    edit(&mut j);
    solve(&j)
        .err()
        .unwrap_or_default()
        .into_iter()
        .map(|e| (e.field, e.words))
        .collect()
}

fn cylinder(j: &mut Job) -> &mut phasewise_engine::cycle::Cylinder {
    match &mut j.cycle[0].kind {
        PhaseKind::Move(m) => &mut m.cylinder,
        _ => unreachable!(),
    }
}

#[test]
fn the_good_job_solves() {
    assert!(solve(&good_job()).is_ok());
}

#[test]
fn a_rod_as_thick_as_the_bore_is_refused_at_the_rod() {
    let errors = errors_after(|j| cylinder(j).rod = cylinder(j).bore);
    assert_eq!(
        errors,
        [(
            "cycle[0].cylinder.rod_m".to_string(),
            "the rod must be thinner than the bore".to_string()
        )]
    );
}

#[test]
fn negative_zero_and_not_a_number_say_which() {
    // (the stroke typed, what the field says)
    let cases = [
        (-10.0, "cannot be negative"),
        (0.0, "must be more than zero"),
        (f64::NAN, "is not a number: type a value"),
        (f64::INFINITY, "is not a number: type a value"),
    ];
    for (stroke, said) in cases {
        let errors = errors_after(|j| cylinder(j).stroke = mm(stroke));
        assert_eq!(errors[0].1, said, "a stroke of {stroke} mm");
    }
    let idle_zero = errors_after(|j| j.cycle[2].kind = idle("idle", 0.0).kind);
    assert_eq!(
        idle_zero,
        [(
            "cycle[2].duration_s".to_string(),
            "must be more than zero".to_string()
        )]
    );
}

/// A length, a force or a time out of range is said in the field's own unit and the job's
/// unit system, rounded as the field shows it: never the stored metres with float noise.
#[test]
fn an_absurd_length_is_refused_in_the_fields_own_unit_without_float_noise() {
    let bore = |j: &mut Job| {
        if let PhaseKind::Move(m) = &mut j.cycle[0].kind {
            m.cylinder.bore = mm(999_999_999_999.999);
        }
    };
    let errors = errors_after(bore);
    assert_eq!(errors[0].0, "cycle[0].cylinder.bore_m");
    assert_eq!(
        errors[0].1,
        "1000000000000.0 mm is more than any machine has: at most 50000.0 mm"
    );
    let errors = errors_after(|j| {
        j.units = phasewise_engine::units::UnitSystem::UsCustomary;
        bore(j);
    });
    assert!(
        errors[0].1.ends_with("at most 1968.504 in"),
        "{}",
        errors[0].1
    );
}

#[test]
fn an_absurd_pressure_is_refused_with_the_limit_in_the_jobs_units() {
    let errors = errors_after(|j| j.designs[0].relief.setting = bar_(25_000.0));
    assert_eq!(errors[0].0, "designs[0].relief.setting_pa");
    assert_eq!(
        errors[0].1,
        "25000.0 bar is more than any machine has: at most 2000.0 bar"
    );
    let errors = errors_after(|j| {
        j.units = phasewise_engine::units::UnitSystem::UsCustomary;
        j.designs[0].relief.setting = bar_(25_000.0);
    });
    assert!(
        errors[0].1.ends_with("at most 29008 psi"),
        "{}",
        errors[0].1
    );
}

#[test]
fn efficiencies_must_be_above_zero_and_at_most_one() {
    let over = errors_after(|j| j.designs[0].base_pump.volumetric_efficiency = 1.2);
    assert_eq!(
        over,
        [(
            "designs[0].base_pump.volumetric_efficiency".to_string(),
            "120.0 % is more than 100 %".to_string()
        )]
    );
    let zero = errors_after(|j| j.designs[0].motor.full_load_efficiency = 0.0);
    assert_eq!(zero[0].0, "designs[0].motor.full_load_efficiency");
    assert!(errors_after(|j| j.designs[0].base_pump.hydromechanical_efficiency = 1.0).is_empty());
}

#[test]
fn structure_errors_name_the_part() {
    let no_phases = errors_after(|j| {
        j.cycle.clear();
        j.designs[0].phase_settings.clear();
    });
    assert_eq!(
        no_phases[0],
        (
            "cycle".to_string(),
            "add at least one phase to the cycle".to_string()
        )
    );
    let mismatch = errors_after(|j| {
        j.designs[0].phase_settings.pop();
    });
    assert_eq!(mismatch[0].0, "designs[0].phase_settings");
    assert_eq!(
        mismatch[0].1,
        "has settings for 2 phases but the cycle has 3"
    );
    let no_stage =
        errors_after(|j| j.designs[0].phase_settings[1].limit = ActiveLimit::Remote { stage: 0 });
    assert_eq!(
        no_stage[0].1,
        "remote stage 1 does not exist (the unit has 0)"
    );
    let too_many = errors_after(|j| {
        let s = j.designs[0].unloading_stages[0];
        j.designs[0].unloading_stages = vec![s; 4];
    });
    assert_eq!(
        too_many[0],
        (
            "designs[0].unloading_stages".to_string(),
            "at most 4 pumps on one motor".to_string()
        )
    );
    assert!(errors_after(|j| j.name = "  ".into())[0].0 == "name");
}

#[test]
fn a_direct_acting_relief_cannot_be_vented_or_take_remote_stages() {
    let errors = errors_after(|j| {
        j.designs[0].relief.kind = ReliefKind::DirectActing;
        j.designs[0].phase_settings[2].idle_path = IdlePath::Vented;
        j.designs[0].remote_stages = vec![bar_(60.0)];
    });
    let fields: Vec<&str> = errors.iter().map(|(f, _)| f.as_str()).collect();
    assert_eq!(
        fields,
        [
            "designs[0].remote_stages_pa",
            "designs[0].phase_settings[2].idle_path"
        ]
    );
    assert!(errors
        .iter()
        .all(|(_, m)| m.contains("direct-acting relief has no vent port")));
}

#[test]
fn every_error_is_reported_at_once() {
    let errors = errors_after(|j| {
        cylinder(j).stroke = mm(-1.0);
        j.designs[0].motor.rated_power = kw(0.0);
        j.oil.volume = uom::si::f64::Volume::new::<uom::si::volume::liter>(f64::NAN);
    });
    assert_eq!(errors.len(), 3, "{errors:?}");
}

#[test]
fn a_job_file_reads_back_unchanged() {
    let original = good_job();
    let text = original.to_json();
    assert!(
        text.contains(&format!("\"schema_version\": {SCHEMA_VERSION}")),
        "{text}"
    );
    assert_eq!(Job::from_json(&text).unwrap(), original);
}

/// A format-1 file (a relief's setting read at its rated flow) reads into today's meaning (the
/// pressure with the pumps' dead-head flow over it) with every solved figure as it was.
#[test]
fn a_format_1_file_reads_into_todays_relief_setting_with_the_same_answer() {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures");
    let text = std::fs::read_to_string(dir.join("trim-press.job.json")).unwrap();
    assert!(
        text.contains("\"schema_version\": 1"),
        "the fixture is format 1"
    );
    let job = Job::from_json(&text).unwrap();
    assert_eq!(job.schema_version, SCHEMA_VERSION);
    // The same job read as if it were already format 2: the old numbers, the new meaning.
    let as_if_new = Job::from_json(&text.replacen(
        "\"schema_version\": 1",
        &format!("\"schema_version\": {SCHEMA_VERSION}"),
        1,
    ))
    .unwrap();
    let (upgraded, unconverted) = (solve(&job).unwrap(), solve(&as_if_new).unwrap());
    let before: serde_json::Value = serde_json::from_str(
        &std::fs::read_to_string(dir.join("trim-press.format-1.report.json")).unwrap(),
    )
    .unwrap();
    let old = &before["designs"];
    let mut moved = false;
    for (d, design) in upgraded.designs.iter().enumerate() {
        // The setting now reads lower: at the pumps' flow, not the valve's larger rated flow.
        assert!(
            job.designs[d].relief.setting < as_if_new.designs[d].relief.setting,
            "design {d}"
        );
        for (i, phase) in design.phases.iter().enumerate() {
            let was = &old[d]["phases"][i]["point"];
            let close = |now: f64, key: &str| {
                let then = was[key].as_f64().unwrap();
                assert_close(now, then, 1e-9, &format!("design {d} phase {i} {key}"));
            };
            close(phase.point.system_pressure.value, "system_pressure_pa");
            close(phase.point.relief_flow.value, "relief_flow_m3_per_s");
            close(phase.point.duration.value, "duration_s");
            let input = old[d]["phases"][i]["ledger"]["electrical_input_w"]
                .as_f64()
                .unwrap();
            assert_close(phase.ledger.electrical_input.value, input, 1e-9, "input");
            let other = &unconverted.designs[d].phases[i].point;
            moved |= (other.system_pressure - phase.point.system_pressure)
                .value
                .abs()
                > 1.0;
        }
    }
    assert!(
        moved,
        "reading the old numbers in the new meaning changes the answer"
    );
}

#[test]
fn a_corrupt_or_newer_file_is_refused_with_a_reason() {
    assert!(matches!(
        Job::from_json("{not json"),
        Err(JobFileError::Unreadable(_))
    ));
    assert!(matches!(
        Job::from_json("[]"),
        Err(JobFileError::Unreadable(_))
    ));
    let truncated = &good_job().to_json()[..400];
    assert!(matches!(
        Job::from_json(truncated),
        Err(JobFileError::Unreadable(_))
    ));
    let newer = good_job().to_json().replace(
        &format!("\"schema_version\": {SCHEMA_VERSION}"),
        &format!("\"schema_version\": {}", SCHEMA_VERSION + 1),
    );
    let err = Job::from_json(&newer).unwrap_err();
    assert_eq!(
        err,
        JobFileError::TooNew {
            version: SCHEMA_VERSION + 1
        }
    );
    assert!(err.to_string().contains("newer Phasewise"));
    let text_in_number =
        good_job()
            .to_json()
            .replacen("\"stroke_m\": 0.25", "\"stroke_m\": \"a lot\"", 1);
    assert!(matches!(
        Job::from_json(&text_in_number),
        Err(JobFileError::Unreadable(_))
    ));
}

/// A job with every kind of field filled in: the checks fixture with a direct phase, a move
/// given a load pressure and a metered flow and a longest time, open-centre idles, remote
/// stages, a motor's electrical nameplate and a current read, compensated stage pumps, a pump's speed, prices, a grid factor, a cycle time and a
/// reading with volts, amps, a shaft speed and a torque.
fn every_field_job() -> serde_json::Value {
    use serde_json::json;
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures");
    let text = std::fs::read_to_string(dir.join("trim-press-checks.job.json")).unwrap();
    // Read and written again, so the advice margins and wear lines left out are there.
    let text = Job::from_json(&text).unwrap().to_json();
    let mut j: serde_json::Value = serde_json::from_str(&text).unwrap();
    let cycle = j["cycle"].as_array_mut().unwrap();
    let mut clamp = cycle[1].clone();
    clamp["load"] = json!({"type": "pressure", "pressure_pa": 3e6});
    clamp["speed"] = json!({"rule": "metered_flow", "flow_m3_per_s": 3e-4});
    clamp["target_time_s"] = json!(4.0);
    let line = json!({"inner_diameter_m": 0.012, "length_m": 3.0, "fittings": [
        {"kind": {"type": "elbow90"}, "count": 2},
        {"kind": {"type": "coefficient", "k": 1.5}, "count": 1},
        {"kind": {"type": "equivalent_length", "length_m": 0.5}, "count": 1}]});
    clamp["lines"] = json!({"pressure_line": line, "return_line": line});
    cycle.push(json!({"name": "tool", "kind": "direct", "flow_m3_per_s": 2e-4, "pressure_pa": 5e6, "duration_s": 3.0}));
    cycle.push(clamp);
    let idle = cycle.iter().position(|p| p["kind"] == "idle").unwrap();
    for d in j["designs"].as_array_mut().unwrap() {
        let settings = d["phase_settings"].as_array_mut().unwrap();
        settings.push(settings[0].clone());
        settings.push(settings[0].clone());
        settings[idle]["idle_path"] = json!({"path": "open_centre", "drop_pa": 5e5});
        d["base_pump"]["efficiency_speed_rad_per_s"] = json!(150.0);
        d["retrofit_price"] = json!(1000.0);
        d["remote_stages_pa"] = json!([8e6]);
        d["motor"]["electrical"] =
            json!({"voltage_v": 400.0, "full_load_current_a": 30.0, "power_factor": 0.85});
        d["phase_settings"][0]["measured_current_a"] = json!(12.0);
        d["base_pump"]["efficiency_oil_k"] = json!(313.15);
        d["cooler"] = json!({"coolant": "water", "coolant_k": 293.15, "rated_heat_w": 3000.0,
            "rated_difference_k": 25.0});
        d["suction_line"] = line.clone();
        d["drive"] = json!({"kind": "induction_on_inverter", "min_speed_rad_per_s": 30.0,
            "max_speed_rad_per_s": 160.0, "converter_rating_va": 20000.0,
            "converter_loss": {"from": "stated", "share": 0.03}, "hold": "make_up_leakage", "idle": "stopped",
            "cooling": "self_cooled"});
        for s in d["unloading_stages"].as_array_mut().unwrap() {
            s["pump"]["control"] = json!({"type": "compensated", "setting_pa": 1.5e7});
        }
    }
    // The last power unit's converter by its maker's eight figures, the others' by one.
    let last = j["designs"].as_array().unwrap().len() - 1;
    j["designs"][last]["drive"]["converter_loss"] = json!({"from": "points", "shares": [0.01, 0.012, 0.018, 0.011, 0.014, 0.021, 0.016, 0.024]});
    j["oil"]["viscosity"] = json!({"given_as": "grade", "grade": 46.0, "viscosity_index": 100.0});
    j["oil"]["working_temperature"] = json!({"set_by": "entered", "temperature_k": 318.15});
    j["oil"]["target_k"] = json!(328.15);
    j["tank"] = json!({"size": {"given_as": "box", "length_m": 1.0, "width_m": 0.6,
        "oil_depth_m": 0.4}, "air": "normal", "ambient_k": 298.15, "steel_mass_kg": 150.0});
    j["warm_up"] = json!({"first": {"time_s": 0.0, "oil_k": 293.15},
        "second": {"time_s": 600.0, "oil_k": 298.15}});
    j["site"]["grid_kg_co2_per_kwh"] = json!(0.4);
    j["site"]["demand_charge_per_kw_month"] = json!(12.0);
    j["site"]["power_factor_threshold"] = json!(0.9);
    j["staging"] = json!({"displacements_m3_per_rev": [1e-5, 2e-5], "speeds_rad_per_s": [150.0],
        "max_pumps": 2, "compensated": true, "drives": true, "drive_min_speeds_rad_per_s": [31.4], "motor_steps": "iec_kw", "service_factor": 1.15,
        "peak_allowance": 1.25, "cycle_time_target_s": 30.0});
    j["pump_tests"][0]["synchronous_speed_rad_per_s"] = json!(157.0);
    j["pump_tests"][1]["motor_efficiency"] = json!({"from": "entered", "efficiency": 0.9});
    j["motor_checks"] = json!([{"motor": "main", "date": "2026-11-30", "design": 0,
        "nameplate": {"rated_power_w": 7500.0, "voltage_v": 400.0, "full_load_current_a": 15.0,
            "full_load_speed_rad_per_s": 152.4, "efficiency": {"from": "entered", "efficiency": 0.9},
            "power_factor": 0.82, "synchronous_speed_rad_per_s": 157.08},
        "readings": [{"input_w": 5000.0, "speed_rad_per_s": 155.0,
            "line": {"voltage_v": 400.0, "current_a": 10.0, "power_factor": 0.8}}]}]);
    j["pump_tests"][0]["readings"].as_array_mut().unwrap().push(json!({
        "pressure_pa": 1.2e7, "flow_m3_per_s": 9e-4, "speed_rad_per_s": 150.0, "torque_n_m": 50.0,
        "electrical": {"as": "three_phase", "line_voltage_v": 400.0, "line_current_a": 20.0, "power_factor": 0.85}}));
    j
}

/// Every number made -1 (a count or a stage index made 0 or past the end), every name blank
/// and every date unreadable.
fn spoil(value: &mut serde_json::Value, key: &str) {
    use serde_json::Value;
    match value {
        Value::Number(_) => {
            *value = match key {
                "schema_version" | "max_pumps" => 0.into(),
                "count" => 1.into(),
                "stage" | "design" => 9.into(),
                _ => (-1.0).into(),
            }
        }
        Value::String(s) if key == "name" || key == "pump" || key == "motor" => s.clear(),
        Value::String(s) if key == "date" => *s = "yesterday".into(),
        Value::Object(fields) => fields.iter_mut().for_each(|(k, v)| spoil(v, k)),
        Value::Array(items) => items.iter_mut().for_each(|v| spoil(v, key)),
        _ => {}
    }
}

/// Every path validation can name is a declared field, found again from the path; and every
/// field declared with a check is checked.
#[test]
fn every_field_validation_names_is_declared_and_every_declared_check_is_made() {
    use phasewise_engine::fields::{self, Check};
    use phasewise_engine::validate::{validate, validate_motor_check, validate_pump_test};
    let mut spoiled = every_field_job();
    spoil(&mut spoiled, "");
    let spoiled = Job::from_json(&spoiled.to_string()).unwrap();
    let good = Job::from_json(&every_field_job().to_string()).unwrap();
    assert!(solve(&good).is_ok(), "{:?}", solve(&good).err());
    let mut jobs = vec![spoiled];
    // The problems between fields, each in its own job.
    let edits: &[fn(&mut Job)] = &[
        |j| j.cycle.clear(),
        |j| j.designs.clear(),
        |j| j.pump_tests[0].readings.clear(),
        |j| j.motor_checks[0].readings.clear(),
        |j| j.wear.worn_below = 0.95,
        |j| {
            j.designs[0].phase_settings.pop();
        },
        |j| {
            let s = j.designs[0].unloading_stages[0];
            j.designs[0].unloading_stages = vec![s; 4];
        },
        |j| {
            j.designs[0].relief.kind = ReliefKind::DirectActing;
            j.designs[0].phase_settings[0].limit = ActiveLimit::Vented;
            j.designs[0].phase_settings[0].idle_path = IdlePath::Vented;
        },
        |j| {
            let d = &mut j.designs[0];
            for p in d.unloading_stages.iter_mut().map(|s| &mut s.pump) {
                p.efficiency_pressure = bar_(1.0);
            }
            d.base_pump.efficiency_pressure = bar_(1.0);
        },
        |j| cylinder(j).rod = cylinder(j).bore,
        |j| {
            let s = &mut j.designs[0].unloading_stages[0].unloading;
            s.unloaded_drop = s.setting;
        },
        |j| j.pump_tests[0].synchronous_speed = Some(j.pump_tests[0].speed),
        |j| {
            j.oil.viscosity = OilViscosity::Measured {
                at_40: KinematicViscosity::new::<square_millimeter_per_second>(-1.0),
                at_100: KinematicViscosity::new::<square_millimeter_per_second>(-1.0),
            }
        },
        |j| {
            j.oil.viscosity = OilViscosity::Measured {
                at_40: KinematicViscosity::new::<square_millimeter_per_second>(46.0),
                at_100: KinematicViscosity::new::<square_millimeter_per_second>(60.0),
            }
        },
        |j| {
            // A grade 2 oil is thinner than 2 mm^2/s at 100 degC for any usual index.
            j.oil.viscosity = OilViscosity::Grade {
                grade: 2.0,
                viscosity_index: 100.0,
            }
        },
        |j| {
            j.oil.working_temperature = WorkingTemperature::Settled;
            j.tank = None;
        },
        |j| {
            if let Some(tank) = &mut j.tank {
                tank.size = TankSize::WettedArea {
                    area: uom::si::f64::Area::new::<uom::si::area::square_meter>(-1.0),
                };
            }
        },
        |j| {
            if let Some(w) = &mut j.warm_up {
                std::mem::swap(&mut w.first.time, &mut w.second.time);
            }
        },
    ];
    for edit in edits {
        let mut j = good.clone();
        edit(&mut j);
        jobs.push(j);
    }
    let mut named = Vec::new();
    for (n, job) in jobs.iter().enumerate() {
        let mut errors = validate(job).err().unwrap_or_default();
        for (i, test) in job.pump_tests.iter().enumerate() {
            errors.extend(validate_pump_test(test, i, job.units));
        }
        for (i, check) in job.motor_checks.iter().enumerate() {
            errors.extend(validate_motor_check(check, i, job, job.units));
        }
        assert!(!errors.is_empty(), "job {n} has no error");
        for e in errors {
            let spec = fields::spec_of(&e.field, job);
            let spec = spec.unwrap_or_else(|| panic!("no field declared for {}", e.field));
            let indices: Vec<usize> = (e.field.split('[').skip(1))
                .map(|s| s.split(']').next().unwrap().parse().unwrap())
                .collect();
            assert_eq!(
                spec.at(&indices),
                e.field,
                "built again from its declaration"
            );
            assert_eq!(e.words, spec.words(), "named in words as declared");
            named.push(spec);
        }
    }
    let unchecked: Vec<&str> = fields::ALL
        .iter()
        .filter(|s| s.check != Check::Free && !named.contains(s))
        .map(|s| s.key)
        .collect();
    assert!(
        unchecked.is_empty(),
        "declared with a check but never reported: {unchecked:?}"
    );
    for spec in [
        &fields::PHASES,
        &fields::LIMIT,
        &fields::IDLE_PATH,
        &fields::READINGS,
    ] {
        assert!(named.contains(&spec), "{}", spec.key);
    }
}

/// An error names its field in a sentence as the form would: its label in lower case, or the
/// words declared where the label alone does not say which ("relief setting" for the relief's
/// "Setting"); a phase's key is read by the phase's kind (a hold's pressure is the pressure to
/// hold).
#[test]
fn an_error_names_its_field_in_words() {
    type Edit = fn(&mut Job);
    let cases: [(&str, Edit); 6] = [
        ("cycle[0].cylinder.bore_m", |j| {
            cylinder(j).bore.value = -1.0
        }),
        ("cycle[1].pressure_pa", |j| match &mut j.cycle[1].kind {
            PhaseKind::Hold(h) => h.pressure.value = f64::NAN,
            _ => unreachable!(),
        }),
        ("designs[0].relief.setting_pa", |j| {
            j.designs[0].relief.setting.value = 0.0
        }),
        ("designs[0].unloading_stages[0].unloading.setting_pa", |j| {
            j.designs[0].unloading_stages[0].unloading.setting.value = f64::NAN
        }),
        ("designs[0].motor.rated_power_w", |j| {
            j.designs[0].motor.rated_power.value = -5.0
        }),
        ("name", |j| j.name = " ".into()),
    ];
    let expected = [
        "bore",
        "pressure to hold",
        "relief setting",
        "unloading setting",
        "motor rated power",
        "job name",
    ];
    for ((field, edit), words) in cases.into_iter().zip(expected) {
        assert_eq!(
            words_after(edit),
            vec![(field.to_string(), words.to_string())],
            "{field}"
        );
    }
}
