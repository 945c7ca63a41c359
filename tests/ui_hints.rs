//! On-screen words: a hint says "typical" and keeps its source for the report's list of
//! sources, so no screen but the report shows "(from memory)" or an author's name. A scan of
//! the UI's text (its string literals), the report excepted.

use std::path::Path;

/// Authors of the published sources behind the app's figures, whom only the report may name.
const AUTHORS: [&str; 6] = ["Esposito", "Rabie", "Casey", "Çengel", "Cengel", "Cowern"];

fn literals(code: &str) -> Vec<String> {
    // Text between double quotes, outside `//` comments: enough for the UI's view! texts and
    // format! strings (no string in the UI holds an escaped quote before a hint word).
    let mut out = Vec::new();
    for line in code.lines() {
        let line = line.split("//").next().unwrap_or_default();
        let mut parts = line.split('"');
        parts.next();
        while let (Some(inside), _) = (parts.next(), parts.next()) {
            out.push(inside.to_string());
        }
    }
    out
}

#[test]
fn no_screen_but_the_report_says_from_memory_or_names_an_author() {
    let ui = Path::new(env!("CARGO_MANIFEST_DIR")).join("src/ui");
    let mut found = Vec::new();
    for entry in std::fs::read_dir(&ui).unwrap() {
        let path = entry.unwrap().path();
        if path.file_name().is_some_and(|n| n == "report.rs") {
            continue;
        }
        let code = std::fs::read_to_string(&path).unwrap();
        for text in literals(&code) {
            let lower = text.to_lowercase();
            if lower.contains("from memory") || AUTHORS.iter().any(|a| text.contains(a)) {
                found.push(format!("{}: {text}", path.display()));
            }
        }
    }
    assert!(found.is_empty(), "{found:#?}");
}

/// One name for one thing on every screen, in the report, the CSV and the engine's messages:
/// each pair is a name retired and the one used instead.
const RETIRED: [(&str, &str); 17] = [
    ("Pump check", "Pump test"),
    ("Safety first", "Safety"),
    ("Safety notes", "Safety"),
    ("Cautions", "Safety"),
    ("Motor size", "Motor rated power"),
    ("Motor rating", "Motor rated power"),
    ("Heat load saved", "Less heat into the oil"),
    ("Less heat for the cooler", "Less heat into the oil"),
    ("Heat into oil", "Heat into the oil"),
    ("CO2", "CO₂"),
    ("peak allowed", "Peak allowance"),
    ("Peak over rating", "Peak allowance"),
    ("Proposal", "Proposed (a proposed power unit)"),
    ("Motor loss", "Inside the motor"),
    ("Useful power", "Useful work"),
    ("last on the shaft", "Pump N (to the relief)"),
    ("system line", "the pump to the relief"),
];

/// The words a power unit is no longer called on screen (the code's `Design` keeps its name).
const NOT_A_POWER_UNIT: [&str; 4] = ["design", "designs", "Design", "Designs"];

#[test]
fn every_thing_has_one_name_wherever_it_is_shown() {
    let root = Path::new(env!("CARGO_MANIFEST_DIR"));
    let mut files: Vec<_> = std::fs::read_dir(root.join("src/ui"))
        .unwrap()
        .map(|e| e.unwrap().path())
        .collect();
    for shown in [
        "src/formats/quote_text.rs",
        "src/formats/ledger_csv.rs",
        "src/engine/finding.rs",
        "src/engine/quote.rs",
        "src/engine/efficiency.rs",
        "src/engine/validate.rs",
        "src/engine/ledger.rs",
        "src/engine/motor.rs",
        "src/engine/staging.rs",
    ] {
        files.push(root.join(shown));
    }
    for part in std::fs::read_dir(root.join("src/engine/settings")).unwrap() {
        files.push(part.unwrap().path());
    }
    let mut found = Vec::new();
    for path in &files {
        let code = std::fs::read_to_string(path).unwrap();
        for text in literals(&code) {
            // A source's title is its own.
            let text = text.replace("Machine Design", "");
            for (old, new) in RETIRED {
                if text.contains(old) {
                    found.push(format!(
                        "{}: “{old}” in {text:?}: say “{new}”",
                        path.display()
                    ));
                }
            }
            // Words, where a path (`designs[0]`), a class (`design-tabs`) or a key stays whole;
            // a literal that is a key alone (`"designs"`) is no text shown.
            if text.chars().all(|c| c.is_ascii_lowercase() || c == '_') {
                continue;
            }
            let words = text.split(|c: char| !(c.is_alphanumeric() || "-_[.".contains(c)));
            for word in words {
                let word = word.trim_end_matches('.');
                if NOT_A_POWER_UNIT.contains(&word) {
                    found.push(format!(
                        "{}: “{word}” in {text:?}: say “power unit”",
                        path.display()
                    ));
                }
            }
        }
    }
    assert!(found.is_empty(), "{found:#?}");
}
