//! `cargo run --example advice -- [job.json]`: the settings advice for every design of a job
//! (the demo job when no file is given), in words.

fn main() {
    let job = match std::env::args().nth(1) {
        Some(path) => {
            let text = std::fs::read_to_string(&path).expect("readable file");
            phasewise::engine::Job::from_json(&text).expect("a job file")
        }
        None => phasewise::engine::demo::scrap_baler(),
    };
    if let Err(errors) = phasewise::engine::solve(&job) {
        for e in errors {
            println!("{}: {}", e.field, e.message);
        }
        std::process::exit(1);
    }
    for (d, design) in job.designs.iter().enumerate() {
        println!("== {}", design.name);
        for a in phasewise::engine::settings::advise(&job, d) {
            let text = a.describe(&job);
            println!("[{:?}] {}\n  {}", a.severity, text.title, text.explanation);
            if let Some(action) = text.action {
                println!(
                    "  -> {action} (saves {:.0} W in the phase, {:.0} kWh a year)",
                    a.saving_w, a.annual_saving_kwh
                );
            }
        }
    }
}
