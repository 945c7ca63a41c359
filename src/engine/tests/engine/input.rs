//! Bad input: every problem is a typed error naming its field, in words a technician
//! understands; job files are read back unchanged or refused with a reason.

use crate::common::*;
use phasewise_engine::cycle::{Direction, PhaseKind, SpeedRule};
use phasewise_engine::valve::{ActiveLimit, IdlePath, ReliefKind};
use phasewise_engine::{solve, Job, JobFileError, SCHEMA_VERSION};

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
