//! Says everything the engine says about a job file, as one JSON document (or why it cannot):
//! each design's report, the findings in words, the settings advice with its actions and
//! solved figures, and each pump test's assessment and trend (its shape: the doc of
//! `phasewise_engine::answer`):
//!
//!     cargo run -p phasewise-engine --example solve -- job.json
//!     cargo run -p phasewise-engine --example solve        (the demo job)
//!
//! Exit status 0 with the document on stdout; 2 with the input errors (a JSON list of
//! `{field, message}`) or the file's problem on stderr; 1 if the file cannot be read.

fn main() -> std::process::ExitCode {
    let text = match std::env::args().nth(1) {
        None => phasewise_engine::demo::scrap_baler().to_json(),
        Some(path) => match std::fs::read_to_string(&path) {
            Ok(text) => text,
            Err(e) => {
                eprintln!("cannot read {path}: {e}");
                return std::process::ExitCode::from(1);
            }
        },
    };
    match phasewise_engine::solve_json(&text) {
        Ok(answer) => {
            println!("{answer}");
            std::process::ExitCode::SUCCESS
        }
        Err(problem) => {
            eprintln!("{problem}");
            std::process::ExitCode::from(2)
        }
    }
}
