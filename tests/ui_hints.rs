//! On-screen words: a hint says "typical" and keeps its source for the report's list of
//! sources, so no screen but the report shows "(from memory)" or an author's name. A scan of
//! the UI's text (its string literals), the report excepted.

use std::path::Path;

/// The authors our sources name (REFERENCES.md and the report's list of sources).
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
