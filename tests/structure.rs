//! The code's shape, checked from its source: no browser or UI crate among the dependencies of
//! the engine or the formats layer; the engine's modules a one-way stack, each using only those
//! below it; and no cycle among the UI's modules. A plain scan of the text is enough: modules
//! name each other as `super::module` or `crate::module`.

use std::path::Path;

/// The engine's modules from the bottom up. A module may use only those before it; a new
/// module takes its place here (see DEVELOPERS.md, "Layers inside").
const STACK: [&str; 29] = [
    // Quantities and the parts of a machine.
    "numeric",
    "units",
    "pump",
    "valve",
    "viscosity",
    "lines",
    "cycle",
    "heat",
    "site",
    "motor",
    "electrical",
    "drive",
    "finding",
    // What the job keeps.
    "policy",
    "pump_test",
    "motor_check",
    "power_unit",
    "delivery",
    "job",
    "demo",
    "fields",
    // The algorithms.
    "validate",
    "ledger",
    "solve",
    "settings",
    "staging",
    "efficiency",
    "motor_load",
    "quote",
];

/// Crates that would tie a layer to the browser or the UI.
const BROWSER_OR_UI: [&str; 8] = [
    "leptos",
    "web-sys",
    "js-sys",
    "wasm-bindgen",
    "wasm-bindgen-futures",
    "gloo-storage",
    "gloo",
    "console_error_panic_hook",
];

fn engine_dir() -> std::path::PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("src/engine")
}

/// The code of a module file without its tests (they sit at the end, after `#[cfg(test)]`)
/// and without line comments.
fn code_of(text: &str) -> String {
    let text = text.split("#[cfg(test)]").next().unwrap_or_default();
    text.lines()
        .map(|l| l.split("//").next().unwrap_or_default())
        .collect::<Vec<_>>()
        .join("\n")
}

/// The first path segment after each `super::` or `crate::`, including each item of a
/// `super::{a, b::c}` group.
fn modules_named(code: &str) -> Vec<String> {
    let mut named = Vec::new();
    for prefix in ["super::", "crate::"] {
        for (at, _) in code.match_indices(prefix) {
            let rest = &code[at + prefix.len()..];
            if let Some(group) = rest.strip_prefix('{') {
                let mut depth = 0;
                let mut item = String::new();
                let mut items = Vec::new();
                for c in group.chars() {
                    match c {
                        '{' => depth += 1,
                        '}' if depth == 0 => break,
                        '}' => depth -= 1,
                        ',' if depth == 0 => items.push(std::mem::take(&mut item)),
                        _ if depth == 0 => item.push(c),
                        _ => {}
                    }
                }
                items.push(item);
                for item in items {
                    let head = item
                        .trim()
                        .split("::")
                        .next()
                        .unwrap_or_default()
                        .to_string();
                    if !head.is_empty() {
                        named.push(head);
                    }
                }
            } else {
                let head: String = rest
                    .chars()
                    .take_while(|c| c.is_alphanumeric() || *c == '_')
                    .collect();
                named.push(head);
            }
        }
    }
    named
}

#[test]
fn the_scan_finds_single_and_grouped_paths() {
    let code = "use super::job::Job;\nuse super::{pump::Pump, valve::{A, B}};\nlet x = crate::units::BAR; // super::quote\n";
    let mut found = modules_named(&code_of(code));
    found.sort();
    assert_eq!(found, ["job", "pump", "units", "valve"]);
}

#[test]
fn each_engine_module_uses_only_those_below_it() {
    let mut problems = Vec::new();
    // (module, file, whether `super::` in it names the crate's modules): a module split
    // into a folder names the crate's modules as `crate::`, and `super::` there is the module.
    let mut files = Vec::new();
    for entry in std::fs::read_dir(engine_dir()).unwrap() {
        let path = entry.unwrap().path();
        let name = path.file_stem().unwrap().to_string_lossy().to_string();
        if path.extension().is_some_and(|e| e == "rs") && name != "lib" {
            files.push((name, path, true));
        } else if path.join("mod.rs").is_file() {
            for part in std::fs::read_dir(&path).unwrap() {
                let part = part.unwrap().path();
                let top = part.file_name().is_some_and(|f| f == "mod.rs");
                files.push((name.clone(), part, top));
            }
        }
    }
    assert!(
        files.len() > STACK.len(),
        "the scan found {} files",
        files.len()
    );
    for (name, path, super_is_crate) in &files {
        let Some(rank) = STACK.iter().position(|m| m == name) else {
            problems.push(format!("{name}: not in STACK; give it its place"));
            continue;
        };
        let code = code_of(&std::fs::read_to_string(path).unwrap());
        let code = if *super_is_crate {
            code
        } else {
            code.replace("super::", "")
        };
        for used in modules_named(&code) {
            match STACK.iter().position(|m| *m == used) {
                Some(r) if r < rank => {}
                Some(_) if used == *name => {}
                Some(_) => problems.push(format!("{name} uses {used}, which sits above it")),
                None => problems.push(format!(
                    "{name} uses `{used}` from the crate root; name the module that holds it"
                )),
            }
        }
    }
    assert!(problems.is_empty(), "{}", problems.join("\n"));
}

/// The `[dependencies]` names of a manifest.
fn dependencies(manifest: &Path) -> Vec<String> {
    let text = std::fs::read_to_string(manifest).unwrap();
    let mut in_dependencies = false;
    let mut names = Vec::new();
    for line in text.lines().map(str::trim) {
        if line.starts_with('[') {
            in_dependencies = line == "[dependencies]";
        } else if in_dependencies && !line.is_empty() && !line.starts_with('#') {
            if let Some((name, _)) = line.split_once('=') {
                names.push(name.trim().to_string());
            }
        }
    }
    names
}

#[test]
fn the_engine_and_the_formats_depend_on_no_browser_or_ui_crate() {
    for manifest in [
        engine_dir().join("Cargo.toml"),
        Path::new(env!("CARGO_MANIFEST_DIR")).join("src/formats/Cargo.toml"),
    ] {
        let names = dependencies(&manifest);
        assert!(
            names.iter().any(|n| n == "serde"),
            "{names:?} read from {manifest:?}"
        );
        for name in &names {
            assert!(
                !BROWSER_OR_UI.contains(&name.as_str()),
                "{} depends on {name}",
                manifest.display()
            );
        }
    }
}

/// The UI's modules and the sibling modules each names (`super::x` or `crate::ui::x`), from
/// its code without tests; the frame (`mod.rs`), which declares them all, is left out.
fn ui_graph() -> Vec<(String, Vec<String>)> {
    let ui = Path::new(env!("CARGO_MANIFEST_DIR")).join("src/ui");
    let mut graph = Vec::new();
    for entry in std::fs::read_dir(ui).unwrap() {
        let path = entry.unwrap().path();
        let name = path.file_stem().unwrap().to_string_lossy().to_string();
        if path.extension().is_none_or(|e| e != "rs") || name == "mod" {
            continue;
        }
        let code =
            code_of(&std::fs::read_to_string(&path).unwrap()).replace("crate::ui::", "super::");
        let mut uses: Vec<String> = modules_named(&code.replace("crate::", "outside::"))
            .into_iter()
            .filter(|m| *m != name)
            .collect();
        uses.sort();
        uses.dedup();
        graph.push((name, uses));
    }
    graph.sort();
    graph
}

/// A cycle in `graph` as a path (`a -> b -> a`), if there is one.
fn a_cycle(graph: &[(String, Vec<String>)]) -> Option<String> {
    fn visit(
        node: &str,
        graph: &[(String, Vec<String>)],
        path: &mut Vec<String>,
        done: &mut Vec<String>,
    ) -> Option<String> {
        if let Some(at) = path.iter().position(|p| p == node) {
            let mut cycle = path[at..].to_vec();
            cycle.push(node.to_string());
            return Some(cycle.join(" -> "));
        }
        if done.iter().any(|d| d == node) {
            return None;
        }
        path.push(node.to_string());
        let next = graph
            .iter()
            .find(|(n, _)| n == node)
            .map(|(_, u)| u.clone());
        for used in next.unwrap_or_default() {
            if let Some(cycle) = visit(&used, graph, path, done) {
                return Some(cycle);
            }
        }
        path.pop();
        done.push(node.to_string());
        None
    }
    let mut done = Vec::new();
    graph
        .iter()
        .find_map(|(node, _)| visit(node, graph, &mut Vec::new(), &mut done))
}

#[test]
fn a_cycle_is_found_and_named() {
    let graph = |edges: &[(&str, &[&str])]| -> Vec<(String, Vec<String>)> {
        edges
            .iter()
            .map(|(n, u)| (n.to_string(), u.iter().map(|x| x.to_string()).collect()))
            .collect()
    };
    assert_eq!(
        a_cycle(&graph(&[("a", &["b"]), ("b", &["c"]), ("c", &[])])),
        None
    );
    assert_eq!(
        a_cycle(&graph(&[("a", &["b"]), ("b", &["c"]), ("c", &["a"])])).as_deref(),
        Some("a -> b -> c -> a")
    );
}

#[test]
fn no_ui_module_depends_on_itself_through_others() {
    let graph = ui_graph();
    assert!(
        graph.len() >= 20,
        "the scan found {} UI modules",
        graph.len()
    );
    let names: Vec<&String> = graph.iter().map(|(n, _)| n).collect();
    for (name, uses) in &graph {
        for used in uses {
            assert!(
                names.contains(&used),
                "{name} names `{used}`, which is no UI module"
            );
        }
    }
    assert_eq!(a_cycle(&graph), None, "a cycle among the UI's modules");
}
