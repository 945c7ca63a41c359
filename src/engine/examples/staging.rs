//! `cargo run --release -p phasewise-engine --example staging -- [job.json]`: the pump-staging search with the
//! job's options (the demo job when no file is given): counts, the best candidates and the
//! motor-size trade-off.

use phasewise_engine::uom::si::{energy::kilojoule, power::kilowatt, pressure::bar};

fn main() {
    let job = match std::env::args().nth(1) {
        Some(path) => {
            let text = std::fs::read_to_string(&path).expect("readable file");
            phasewise_engine::Job::from_json(&text).expect("a job file")
        }
        None => phasewise_engine::demo::scrap_baler(),
    };
    if let Err(errors) = phasewise_engine::solve(&job) {
        for e in errors {
            println!("{}: {}", e.field, e.message);
        }
        std::process::exit(1);
    }
    let started = std::time::Instant::now();
    let found = phasewise_engine::staging::search(&job, &job.staging).unwrap();
    println!(
        "{} candidates, {} serve the cycle, {:.1} ms",
        found.evaluated,
        found.feasible,
        started.elapsed().as_secs_f64() * 1e3
    );
    for c in &found.best {
        let cc: Vec<String> = c
            .spec
            .displacements
            .iter()
            .map(|d| format!("{:.1}", d * 1e6))
            .collect();
        let settings: Vec<String> = c
            .design
            .unloading_stages
            .iter()
            .map(|s| format!("{:.0}", s.unloading.setting.get::<bar>()))
            .collect();
        println!(
            "{} cm3/rev{} at {:.0} rpm: motor {:.1} kW, cycle {:.2} s, {:.1} kJ/cycle, RMS {:.2} kW, peak {:.2} kW, main {:.0} bar, unloading [{}] bar",
            cc.join(" + "),
            match c.spec.min_speed {
                Some(min) => format!(" on a drive from {:.0} rpm", min * 60.0 / std::f64::consts::TAU),
                None if c.spec.compensated => " compensated".to_string(),
                None => String::new(),
            },
            c.spec.speed * 60.0 / std::f64::consts::TAU,
            c.motor.get::<kilowatt>(),
            c.cycle_time.value,
            c.energy_per_cycle.get::<kilojoule>(),
            c.rms_shaft.get::<kilowatt>(),
            c.peak_shaft.get::<kilowatt>(),
            c.design.relief.setting.get::<bar>(),
            settings.join(", ")
        );
    }
    for t in &found.frontier {
        println!(
            "{:?}, motor {:.1} kW: shortest cycle {:.2} s",
            t.kind,
            t.motor / 1e3,
            t.cycle_time
        );
    }
}
