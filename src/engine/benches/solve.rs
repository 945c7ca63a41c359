//! How long one solve takes: a 12-phase cycle on a three-pump unit (an invented baler).
//!
//!     cargo bench -p phasewise-engine --bench solve
//!
//! Prints the time per solve (the best of several batches, and their median). Target: under
//! 20 microseconds, so a staging search over tens of thousands of designs stays interactive.
//! Then the time of a whole staging search with the default lists.

// The engine tests' builders; the bench uses a few of them.
#[path = "../tests/engine/common.rs"]
#[allow(dead_code, unused_imports)]
mod common;

use common::*;
use phasewise_engine::cycle::{Direction, HoldMode, SpeedRule};
use phasewise_engine::valve::{ActiveLimit, IdlePath, ReliefKind};
use std::hint::black_box;
use std::time::Instant;

fn baler_job() -> phasewise_engine::Job {
    let ram = |name, force, stroke, direction, speed| {
        move_phase(name, 160.0, 90.0, stroke, direction, force, 5.0, speed)
    };
    let cycle = vec![
        ram(
            "fast forward",
            8.0,
            900.0,
            Direction::Extend,
            SpeedRule::AllPumpFlow,
        ),
        ram(
            "pre-compress",
            150.0,
            200.0,
            Direction::Extend,
            SpeedRule::AllPumpFlow,
        ),
        ram(
            "compress",
            320.0,
            120.0,
            Direction::Extend,
            SpeedRule::AllPumpFlow,
        ),
        hold("dwell", 170.0, 3.0, HoldMode::HeldByPump),
        direct("decompress", 5.0, 20.0, 0.8),
        ram(
            "return",
            10.0,
            1220.0,
            Direction::Retract,
            SpeedRule::AllPumpFlow,
        ),
        idle("door open", 6.0),
        ram(
            "tie-off advance",
            6.0,
            300.0,
            Direction::Extend,
            metered_speed(0.08),
        ),
        hold("tie", 60.0, 4.0, HoldMode::LockedByCheck),
        ram(
            "tie-off return",
            4.0,
            300.0,
            Direction::Retract,
            SpeedRule::AllPumpFlow,
        ),
        direct("eject", 60.0, 45.0, 2.5),
        idle("load", 20.0),
    ];
    let mut d = design(
        "three pumps",
        motor(45.0, 1480.0, 0.93),
        vec![
            stage(fixed_pump(90.0, 0.94, 210.0, 0.9, 0.6), 60.0, 4.0, 0.5),
            stage(fixed_pump(45.0, 0.94, 210.0, 0.9, 0.4), 120.0, 4.0, 0.5),
        ],
        fixed_pump(16.0, 0.94, 210.0, 0.9, 0.2),
        relief(ReliefKind::PilotOperated, 210.0, 250.0, 0.97),
        cycle.len(),
    );
    d.remote_stages = vec![bar_(80.0)];
    d.phase_settings[8].limit = ActiveLimit::Remote { stage: 0 };
    d.phase_settings[11].idle_path = IdlePath::Vented;
    job(cycle, vec![d])
}

/// The baler with its lines described (25 mm pressure and 32 mm return lines, 6 m each, with
/// four elbows), its pumps' efficiency stated at 40 degC, a 1.2 x 0.8 m tank with 0.6 m of oil
/// in a normal workshop and a 15 kW water cooler: the oil settles where the heat balance says.
fn baler_with_oil_job() -> phasewise_engine::Job {
    use phasewise_engine::cycle::PhaseKind;
    use phasewise_engine::heat::{AirAround, Coolant, Cooler, Tank, TankSize};
    use phasewise_engine::lines::{Fitting, FittingKind, Line, MoveLines};
    use uom::si::f64::{Power, TemperatureInterval, ThermodynamicTemperature};
    let celsius =
        ThermodynamicTemperature::new::<uom::si::thermodynamic_temperature::degree_celsius>;
    let mut job = baler_job();
    let line = |d| Line {
        inner_diameter: mm(d),
        length: mm(6000.0),
        fittings: vec![Fitting {
            kind: FittingKind::Elbow90,
            count: 4,
        }],
    };
    for phase in &mut job.cycle {
        if let PhaseKind::Move(m) = &mut phase.kind {
            m.lines = Some(MoveLines {
                pressure_line: line(25.0),
                return_line: line(32.0),
            });
        }
    }
    let d = &mut job.designs[0];
    for stage in &mut d.unloading_stages {
        stage.pump.efficiency_temperature = Some(celsius(40.0));
    }
    d.base_pump.efficiency_temperature = Some(celsius(40.0));
    d.cooler = Some(Cooler {
        coolant: Coolant::Water,
        coolant_temperature: celsius(20.0),
        rated_heat: Power::new::<uom::si::power::kilowatt>(15.0),
        rated_difference: TemperatureInterval::new::<uom::si::temperature_interval::kelvin>(25.0),
    });
    job.tank = Some(Tank {
        size: TankSize::Box {
            length: mm(1200.0),
            width: mm(800.0),
            oil_depth: mm(600.0),
        },
        air: AirAround::Normal,
        ambient: celsius(25.0),
        steel_mass: None,
    });
    job.oil.working_temperature = phasewise_engine::site::WorkingTemperature::Settled;
    job
}

/// Best and median microseconds per call of `f` over 15 batches.
fn time(f: impl Fn()) -> (f64, f64) {
    time_in(20_000, f)
}

/// Best and median microseconds per call of `f` over 15 batches of `per_batch` calls.
fn time_in(per_batch: usize, f: impl Fn()) -> (f64, f64) {
    let mut batches: Vec<f64> = (0..15)
        .map(|_| {
            let start = Instant::now();
            for _ in 0..per_batch {
                f();
            }
            start.elapsed().as_secs_f64() / per_batch as f64 * 1e6
        })
        .collect();
    batches.sort_by(f64::total_cmp);
    (batches[0], batches[batches.len() / 2])
}

fn main() {
    let job = baler_job();
    phasewise_engine::solve(&job).expect("the benchmark job is valid");
    let (best, median) = time(|| {
        black_box(phasewise_engine::solve(black_box(&job)).ok());
    });
    println!("solve, 12 phases, 3 pumps, 1 design: {best:.2} us best, {median:.2} us median (15 batches of 20000)");
    let (best, median) = time(|| {
        black_box(phasewise_engine::validate::validate(black_box(&job)).ok());
    });
    println!("  of which validation: {best:.2} us best, {median:.2} us median");

    // The same with the oil: lines at every move, leakage by viscosity, and the heat balance
    // (where the oil settles with and without the cooler, the warm-up, the cooler needed):
    // a few dozen solves of the cycle at the temperatures the searches try.
    let oily = baler_with_oil_job();
    let report = phasewise_engine::solve(&oily).expect("the benchmark job is valid");
    let (best, median) = time_in(200, || {
        black_box(phasewise_engine::solve(black_box(&oily)).ok());
    });
    println!(
        "solve with lines, tank and cooler (settles at {:.1} degC): {best:.1} us best, {median:.1} us median (15 batches of 200)",
        report.designs[0].oil.working_temperature - 273.15
    );
    // The lines and leakage alone: the oil at an entered temperature, no heat balance.
    let mut lines_only = oily.clone();
    lines_only.tank = None;
    lines_only.oil.working_temperature = phasewise_engine::site::WorkingTemperature::default();
    let (best, median) = time(|| {
        black_box(phasewise_engine::solve(black_box(&lines_only)).ok());
    });
    println!("  lines and leakage at an entered temperature, no tank: {best:.2} us best, {median:.2} us median");

    // The staging search with the default lists (over 5,000 candidates) on the same 12-phase
    // cycle. Target in the browser: under 200 ms (the wasm build is measured there).
    let options = phasewise_engine::staging::StagingOptions::default();
    let mut runs: Vec<(f64, phasewise_engine::staging::SearchResult)> = (0..5)
        .map(|_| {
            let start = Instant::now();
            let found = phasewise_engine::staging::search(black_box(&job), &options).unwrap();
            (start.elapsed().as_secs_f64() * 1e3, found)
        })
        .collect();
    runs.sort_by(|a, b| a.0.total_cmp(&b.0));
    let (ms, found) = &runs[runs.len() / 2];
    println!(
        "staging search, 12 phases: {} candidates ({} feasible) in {ms:.1} ms median of 5 (best {:.1} ms)",
        found.evaluated, found.feasible, runs[0].0
    );
}
