//! `cargo run -p phasewise-engine --example advice -- [job.json]`: the settings advice for every design of a job
//! (the demo job when no file is given), in words.

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
    for (d, design) in job.designs.iter().enumerate() {
        println!("== {}", design.name);
        let advice = match phasewise_engine::settings::advise(&job, d) {
            Ok(advice) => advice,
            Err(errors) => {
                for e in errors {
                    println!("{}: {}", e.field, e.message);
                }
                std::process::exit(1);
            }
        };
        for a in advice {
            let text = a.describe(&job);
            println!("[{:?}] {}\n  {}", a.severity, text.title, text.explanation);
            if let Some(action) = text.action {
                match text.effect {
                    Some(effect) => println!("  -> {action}. {effect}"),
                    None => println!("  -> {action}."),
                }
            }
        }
    }
}
