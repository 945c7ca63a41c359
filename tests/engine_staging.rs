//! The pump-staging search (engine `staging`): it finds the same best candidate as a
//! brute-force enumeration written out here; a larger list of sizes never makes the best worse;
//! every candidate it keeps meets the phase times and sizes its motor on the RMS and the peak.

mod common;
use common::*;
use phasewise::engine::cycle::{Direction, SpeedRule};
use phasewise::engine::demo::scrap_baler;
use phasewise::engine::staging::{self, Candidate, Spec, StagingOptions};
use phasewise::engine::valve::ReliefKind;
use phasewise::engine::Job;
use uom::si::angular_velocity::revolution_per_minute;
use uom::si::f64::{AngularVelocity, Volume};
use uom::si::volume::cubic_centimeter;

/// cm^3/rev in m^3/rev, converted as the options are.
fn cc(v: f64) -> f64 {
    Volume::new::<cubic_centimeter>(v).value
}

fn options(sizes: &[f64], max_pumps: usize) -> StagingOptions {
    StagingOptions {
        displacements: sizes
            .iter()
            .map(|s| Volume::new::<cubic_centimeter>(*s))
            .collect(),
        speeds: vec![AngularVelocity::new::<revolution_per_minute>(1450.0)],
        max_pumps,
        ..StagingOptions::default()
    }
}

fn key(c: &Candidate) -> (f64, f64, f64) {
    (c.motor_w, c.energy_per_cycle_j, c.cycle_time_s)
}

/// An invented high-low press, slow as found: a single 25 cm^3/rev pump on a 15 kW motor at
/// 1450 rpm, main 210 bar, an idle over the relief.
fn slow_press() -> Job {
    let cycle = vec![
        move_phase(
            "approach",
            100.0,
            56.0,
            300.0,
            Direction::Extend,
            5.0,
            4.0,
            SpeedRule::AllPumpFlow,
        ),
        move_phase(
            "press",
            100.0,
            56.0,
            40.0,
            Direction::Extend,
            100.0,
            4.0,
            SpeedRule::AllPumpFlow,
        ),
        move_phase(
            "return",
            100.0,
            56.0,
            340.0,
            Direction::Retract,
            3.0,
            6.0,
            SpeedRule::AllPumpFlow,
        ),
        idle("unload parts", 20.0),
    ];
    let d = design(
        "As found",
        motor(15.0, 1450.0, 0.9),
        vec![],
        fixed_pump(25.0, 0.92, 200.0, 0.9, 0.3),
        relief(ReliefKind::PilotOperated, 210.0, 100.0, 0.97),
        4,
    );
    job(cycle, vec![d])
}

#[test]
fn the_search_agrees_with_a_brute_force_enumeration() {
    for job in [slow_press(), scrap_baler()] {
        let opts = options(&[8.0, 16.0, 40.0, 63.0], 2);
        let speed = opts.speeds[0].value;
        // Written out by hand: 4 singles, 10 pairs (larger size on the unloading stage), 4
        // compensated singles.
        let sizes = [63.0, 40.0, 16.0, 8.0];
        let mut all: Vec<Spec> = sizes
            .iter()
            .map(|&s| Spec {
                displacements: vec![cc(s)],
                speed,
                compensated: false,
            })
            .collect();
        for (i, &a) in sizes.iter().enumerate() {
            for &b in &sizes[i..] {
                all.push(Spec {
                    displacements: vec![cc(a), cc(b)],
                    speed,
                    compensated: false,
                });
            }
        }
        all.extend(sizes.iter().map(|&s| Spec {
            displacements: vec![cc(s)],
            speed,
            compensated: true,
        }));
        assert_eq!(staging::specs(&opts).len(), all.len());

        let targets = staging::targets(&job, &opts).unwrap();
        let mut brute: Vec<Candidate> = all
            .iter()
            .filter_map(|s| staging::evaluate(&job, &opts, &targets, s))
            .collect();
        brute.sort_by(|a, b| key(a).partial_cmp(&key(b)).unwrap());
        let found = staging::search(&job, &opts);
        assert_eq!(found.evaluated, all.len());
        assert_eq!(found.feasible, brute.len());
        assert!(
            !brute.is_empty(),
            "{}: some candidate serves the cycle",
            job.name
        );
        assert_eq!(found.best[0], brute[0], "{}", job.name);
        assert_eq!(found.best.len(), brute.len().min(staging::KEPT));
    }
}

#[test]
fn a_longer_list_of_sizes_never_makes_the_best_worse() {
    let job = slow_press();
    let lists: [&[f64]; 4] = [
        &[16.0],
        &[16.0, 40.0],
        &[8.0, 16.0, 40.0],
        &[8.0, 16.0, 25.0, 40.0, 63.0],
    ];
    let mut last: Option<(f64, f64, f64)> = None;
    for sizes in lists {
        let found = staging::search(&job, &options(sizes, 3));
        if let Some(best) = found.best.first() {
            if let Some(previous) = last {
                assert!(
                    key(best) <= previous,
                    "{sizes:?}: {:?} after {previous:?}",
                    key(best)
                );
            }
            last = Some(key(best));
        }
    }
    assert!(last.is_some());
}

#[test]
fn kept_candidates_meet_the_times_and_size_their_motor_on_rms_and_peak() {
    let job = slow_press();
    let opts = options(&[8.0, 16.0, 25.0, 40.0, 63.0], 3);
    let targets = staging::targets(&job, &opts).unwrap();
    let found = staging::search(&job, &opts);
    assert!(!found.best.is_empty());
    // The as-found single pump is among the candidates, so the best is at most its motor.
    let as_found = staging::evaluate(
        &job,
        &opts,
        &targets,
        &Spec {
            displacements: vec![cc(25.0)],
            speed: opts.speeds[0].value,
            compensated: false,
        },
    )
    .expect("the as-found pump serves");
    assert!(key(&found.best[0]) <= key(&as_found));
    let steps = opts.motor_steps.ratings_w();
    for c in &found.best {
        let report = phasewise::engine::solve(&Job {
            designs: vec![job.designs[0].clone(), c.design.clone()],
            ..job.clone()
        })
        .unwrap();
        let r = &report.designs[1];
        for (phase, limit) in r.phases.iter().zip(&targets.phase_times) {
            if let Some(t) = limit {
                assert!(
                    phase.point.duration.value <= t * (1.0 + 1e-9),
                    "{} too slow",
                    phase.name
                );
            }
        }
        assert!(c.motor_w * opts.service_factor >= r.totals.rms_shaft.value);
        assert!(c.motor_w * opts.peak_allowance >= r.totals.peak_shaft.value);
        // The next smaller step would not do.
        if let Some(smaller) = steps.iter().rev().find(|&&s| s < c.motor_w) {
            assert!(
                smaller * opts.service_factor < r.totals.rms_shaft.value
                    || smaller * opts.peak_allowance < r.totals.peak_shaft.value
            );
        }
        assert_eq!(c.design.motor.rated_power.value, c.motor_w);
    }
    // Unloading the large pump in the press lets a smaller motor serve than the as-found 15 kW.
    assert!(found.best[0].motor_w < 15e3, "{:?}", found.best[0].spec);
}

#[test]
fn the_default_lists_give_over_five_thousand_candidates() {
    // 18 sizes: 18 singles + 171 pairs + 1140 triples + 18 compensated, at 4 speeds.
    assert_eq!(
        staging::specs(&StagingOptions::default()).len(),
        4 * (18 + 171 + 1140 + 18)
    );
}

#[test]
fn applying_a_candidate_changes_only_the_proposed_design() {
    let job = slow_press();
    let found = staging::search(&job, &options(&[8.0, 16.0, 40.0], 2));
    let (after, target) = staging::apply_candidate(&job, 0, &found.best[0]);
    assert_eq!(target, 1);
    assert_eq!(after.designs[0], job.designs[0]);
    assert_eq!(after.designs[1].name, "Proposed");
    assert_eq!(
        after.designs[1].pump_count(),
        found.best[0].spec.displacements.len()
    );
    assert!(phasewise::engine::solve(&after).is_ok());
}
