//! Golden files: each `tests/fixtures/NAME.job.json` is solved as `cargo run -p phasewise-engine --example solve`
//! would, and the output must equal `NAME.report.json` (or, for a job with input errors,
//! `NAME.errors.json`). These guard against unintended change, so they are regression
//! checks, not references: the fixtures are invented jobs.
//!
//! After a deliberate change to the engine, check the differences, then re-record with
//! `PHASEWISE_BLESS=1 cargo test -p phasewise-engine --test engine golden`.

use std::path::Path;

#[test]
fn job_files_solve_to_their_recorded_output() {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures");
    let bless = std::env::var_os("PHASEWISE_BLESS").is_some();
    let mut checked = 0;
    let mut entries: Vec<_> = std::fs::read_dir(&dir)
        .unwrap()
        .map(|e| e.unwrap().path())
        .collect();
    entries.sort();
    for job in entries {
        let Some(name) = job
            .file_name()
            .and_then(|n| n.to_str())
            .and_then(|n| n.strip_suffix(".job.json"))
        else {
            continue;
        };
        let text = std::fs::read_to_string(&job).unwrap();
        let (output, kind) = match phasewise_engine::solve_json(&text) {
            Ok(report) => (report, "report"),
            Err(errors) => (errors, "errors"),
        };
        let golden = dir.join(format!("{name}.{kind}.json"));
        if bless {
            std::fs::write(&golden, format!("{output}\n")).unwrap();
        } else {
            let expected = std::fs::read_to_string(&golden).unwrap_or_else(|_| {
                panic!(
                    "{} is missing: record it with PHASEWISE_BLESS=1",
                    golden.display()
                )
            });
            assert_eq!(
                output.trim_end(),
                expected.trim_end(),
                "{name}: the output differs from {}",
                golden.display()
            );
        }
        checked += 1;
    }
    assert!(
        checked >= 2,
        "only {checked} fixtures found in {}",
        dir.display()
    );
}
