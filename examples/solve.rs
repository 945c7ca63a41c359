//! Solves a job file and prints the full report as JSON (or why it cannot):
//!
//!     cargo run --example solve -- job.json
//!
//! Exit status 0 with the report on stdout; 2 with the input errors (a JSON list of
//! `{field, message}`) or the file's problem on stderr; 1 if the file cannot be read.

fn main() -> std::process::ExitCode {
    let Some(path) = std::env::args().nth(1) else {
        eprintln!("usage: cargo run --example solve -- JOB.json");
        return std::process::ExitCode::from(1);
    };
    let text = match std::fs::read_to_string(&path) {
        Ok(text) => text,
        Err(e) => {
            eprintln!("cannot read {path}: {e}");
            return std::process::ExitCode::from(1);
        }
    };
    match phasewise::engine::solve_json(&text) {
        Ok(report) => {
            println!("{report}");
            std::process::ExitCode::SUCCESS
        }
        Err(problem) => {
            eprintln!("{problem}");
            std::process::ExitCode::from(2)
        }
    }
}
