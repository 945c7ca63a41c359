//! The size report: every file of the release build, raw and gzip'd, by kind.
//!
//! # Release profile
//!
//! `cargo xtask size --profiles` builds the release once per variant, each changing one
//! setting, and prints this table (bytes of the wasm module; measured 2026-12-01 on the shell,
//! with `panic = "abort"` as the base of the other rows):
//!
//! | profile | raw, no wasm-opt | gzip, no wasm-opt | raw, wasm-opt -Oz | gzip, wasm-opt -Oz |
//! |---|---|---|---|---|
//! | **kept: `opt-level = "z"`, `lto = true`, `codegen-units = 1`, default panic** | 186,296 | 64,755 | 100,706 | 43,243 |
//! | `panic = "abort"` | 187,119 | 64,923 | 100,998 | 43,371 |
//! | `panic = "abort"`, `opt-level = "s"` | 185,117 | 63,269 | 108,918 | 44,491 |
//! | `panic = "abort"`, `opt-level = 3` | 221,776 | 67,370 | 149,928 | 51,392 |
//! | `panic = "abort"`, `lto = "thin"` | 255,385 | 81,208 | 119,343 | 49,971 |
//! | `panic = "abort"`, `lto = false` | 269,427 | 85,509 | 122,995 | 51,710 |
//! | `panic = "abort"`, `codegen-units = 16` | 188,182 | 65,732 | 104,467 | 44,453 |
//!
//! So: `z` beats `s` by 2.5 % gzip once wasm-opt has run (`s` is smaller before it); fat LTO
//! saves 13 to 16 %; one codegen unit saves 2.5 %; `panic = "abort"` gains nothing (a panic
//! aborts on wasm32-unknown-unknown either way) and measured 128 bytes larger, so the default
//! is kept. Re-measure when the bundle grows: the ranking can change.
//!
//! # Recorded figures
//!
//! Recorded by `cargo xtask size --no-build` at each release (bytes; gzip at best level):
//!
//! | date | what changed | wasm raw | wasm gzip | everything gzip | other |
//! |---|---|---|---|---|---|
//! | 2026-12-01 | jobs on the device, share links, offline copy | 1,069,194 | 411,501 | 440,646 | counter 7.68x gzip; latency median 3.2 ms at 4x; solve 4.8 µs; staging 72 ms |
//! | 2026-12-02 | settings advice, staging search, pump check | 1,206,778 | 490,792 | 520,743 | staging 45 ms after the window fixes |
//! | 2026-12-02 | quote and report | 1,349,446 | 549,118 | 580,133 | |
//! | 2026-12-02 | field-truth work (relief read dead-headed, slip, motor classes) | 1,395,976 | 568,277 | 599,297 | |
//! | 2026-12-04 | walk-through fixes, presenter view | 1,528,080 | 619,802 | 652,696 | counter 17.7x gzip |
//! | 2026-12-04 | engine and formats as crates, one-way layers | 1,527,943 | 619,667 | 652,562 | |
//! | 2026-12-05 | oil and lines: viscosity, line losses, heat balance | 1,815,269 | 726,880 | | solve 5.0 µs (full heat balance 904 µs) |
//! | 2026-12-05 | variable-speed drives | 1,915,934 | 757,443 | 790,613 | staging in Chromium: demo 5,532 candidates 437 ms; 10 phases 20,874 candidates 980 ms (in slices, with progress) |
//! | 2026-12-05 | first load: erased component types, the module split (first screen and four parts), static first view, gzip'd serving | main 888,278; all 1,657,604 | main 349,002; all 696,185 | 732,263 | first screen 9.17x the counter (was 21.72x for everything); Lighthouse mobile median of 9: 0.95, LCP 2.85 s (counter 1.00, 1.05 s); edit to figures at 4x CPU 10.3 ms median (16.3 before; Colebrook-White by Newton) |
//!
//! # Where the first screen's bytes go
//!
//! `twiggy` on the split main module before wasm-opt (`target/wasm-split/main.wasm`,
//! 2026-12-05, 1,010 KB of code): serde's code for reading and writing the job is the largest
//! share (306 KB, 30 %: the job file's internally tagged enums and the flattened phase kind
//! each instantiate their fields' readers several times), then `core` (formatting, 134 KB),
//! tachys (views, 117 KB), read-only data (112 KB), reactive_graph (93 KB), the UI (89 KB) and
//! the engine's own code (76 KB).

use std::path::{Path, PathBuf};

/// One shipped file.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct FileSize {
    pub path: PathBuf,
    pub kind: &'static str,
    pub raw: u64,
    pub gzip: u64,
}

/// The kinds the report totals, in the order it prints them.
pub const KINDS: [&str; 5] = ["wasm", "js", "css", "html", "other"];

/// Measures every file under `dist`, gzip at the best level (what a server would send).
pub fn measure(dist: &Path) -> std::io::Result<Vec<FileSize>> {
    let mut files = Vec::new();
    walk(dist, &mut files)?;
    let mut sizes = files
        .into_iter()
        .map(|path| {
            let bytes = std::fs::read(&path)?;
            Ok(FileSize {
                kind: kind_of(&path),
                raw: bytes.len() as u64,
                gzip: gzip_len(&bytes)?,
                path: path.strip_prefix(dist).unwrap_or(&path).to_path_buf(),
            })
        })
        .collect::<std::io::Result<Vec<_>>>()?;
    sizes.sort_by(|a, b| (kind_rank(a.kind), &a.path).cmp(&(kind_rank(b.kind), &b.path)));
    Ok(sizes)
}

pub(crate) fn walk(dir: &Path, out: &mut Vec<PathBuf>) -> std::io::Result<()> {
    for entry in std::fs::read_dir(dir)? {
        let path = entry?.path();
        if path.is_dir() {
            walk(&path, out)?;
        } else {
            out.push(path);
        }
    }
    Ok(())
}

pub fn kind_of(path: &Path) -> &'static str {
    match path.extension().and_then(|e| e.to_str()) {
        Some("wasm") => "wasm",
        Some("js") | Some("mjs") => "js",
        Some("css") => "css",
        Some("html") => "html",
        _ => "other",
    }
}

fn kind_rank(kind: &str) -> usize {
    KINDS.iter().position(|k| *k == kind).unwrap_or(KINDS.len())
}

/// The size of `bytes` as the static server sends them.
pub fn gzip_len(bytes: &[u8]) -> std::io::Result<u64> {
    Ok(crate::server::gzip(bytes)?.len() as u64)
}

/// The wasm module as wasm-bindgen left it, before wasm-opt: Trunk keeps it under
/// `target/wasm-bindgen/release/`. `None` before the first release build.
pub fn before_wasm_opt(target: &Path) -> Option<FileSize> {
    let dir = target.join("wasm-bindgen").join("release");
    let path = std::fs::read_dir(&dir)
        .ok()?
        .filter_map(|e| e.ok().map(|e| e.path()))
        .find(|p| p.extension().is_some_and(|e| e == "wasm"))?;
    let bytes = std::fs::read(&path).ok()?;
    Some(FileSize {
        kind: "wasm",
        raw: bytes.len() as u64,
        gzip: gzip_len(&bytes).ok()?,
        path,
    })
}

/// The report as printed: a row per file, a total per kind, and the grand total.
pub fn report(sizes: &[FileSize]) -> String {
    let mut out = format!("{:<44} {:>22} {:>22}\n", "file", "raw", "gzip");
    for file in sizes {
        out += &format!(
            "{:<44} {:>22} {:>22}\n",
            file.path.display(),
            human(file.raw),
            human(file.gzip)
        );
    }
    out += &format!("{}\n", "-".repeat(90));
    for kind in KINDS {
        let (raw, gzip) = total(sizes.iter().filter(|f| f.kind == kind));
        if raw > 0 {
            out += &format!(
                "{:<44} {:>22} {:>22}\n",
                format!("all {kind}"),
                human(raw),
                human(gzip)
            );
        }
    }
    let (raw, gzip) = total(sizes.iter());
    out += &format!(
        "{:<44} {:>22} {:>22}\n",
        "everything",
        human(raw),
        human(gzip)
    );
    out
}

fn total<'a>(files: impl Iterator<Item = &'a FileSize>) -> (u64, u64) {
    files.fold((0, 0), |(raw, gzip), f| (raw + f.raw, gzip + f.gzip))
}

/// Whether the first screen does without this file: a part loaded on demand (see
/// `crate::split`) or the service worker, which starts once the app runs.
pub fn on_demand(path: &Path) -> bool {
    let name = path.file_name().and_then(|n| n.to_str()).unwrap_or("");
    name.contains("-split_") || name.contains("-chunk_") || name == crate::offline::WORKER
}

/// Raw and gzip bytes of the code and style the first screen fetches: every wasm, js and css
/// file but those [`on_demand`].
pub fn first_screen(sizes: &[FileSize]) -> (u64, u64) {
    total(
        sizes
            .iter()
            .filter(|f| f.is_code_or_style() && !on_demand(&f.path)),
    )
}

/// Raw and gzip bytes of all code and style (wasm, js, css), on demand or not.
pub fn code_and_style(sizes: &[FileSize]) -> (u64, u64) {
    total(sizes.iter().filter(|f| f.is_code_or_style()))
}

impl FileSize {
    /// Wasm, JavaScript or CSS: what the first-screen comparison counts.
    fn is_code_or_style(&self) -> bool {
        matches!(self.kind, "wasm" | "js" | "css")
    }
}

/// Bytes, and KiB to one decimal, so a report can be read and compared by eye.
pub fn human(bytes: u64) -> String {
    format!("{bytes} B ({:.1} KiB)", bytes as f64 / 1024.0)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn gzip_shrinks_repetitive_text_and_measures_what_it_writes() {
        let text = "phase ".repeat(1000);
        let gz = gzip_len(text.as_bytes()).unwrap();
        assert!(gz < 100, "{gz}");
        // An empty input still has gzip's 18-byte header and trailer, plus an empty block.
        assert!((18..=24).contains(&gzip_len(b"").unwrap()));
    }

    #[test]
    fn the_first_screen_leaves_out_the_parts_and_the_worker() {
        let f = |path: &str, gzip| FileSize {
            path: path.into(),
            kind: kind_of(Path::new(path)),
            raw: gzip * 2,
            gzip,
        };
        let build = [
            f("app-1a_bg.wasm", 100),
            f("app-1a.js", 10),
            f("app-1a-parts.js", 3),
            f("main-2b.css", 5),
            f("public/boot.js", 1),
            f("app-1a-split_answers.wasm", 50),
            f("app-1a-chunk_7.wasm", 20),
            f("service-worker.js", 2),
            f("index.html", 4),
            f("public/icon-192.png", 9),
        ];
        assert_eq!(first_screen(&build), (238, 119));
        assert_eq!(code_and_style(&build), (382, 191));
    }

    #[test]
    fn report_totals_each_kind() {
        let f = |path: &str, raw, gzip| FileSize {
            path: path.into(),
            kind: kind_of(Path::new(path)),
            raw,
            gzip,
        };
        let report = report(&[
            f("a_bg.wasm", 2048, 1024),
            f("a.js", 100, 50),
            f("b.js", 100, 50),
            f("index.html", 10, 5),
        ]);
        assert!(report.contains("all js"));
        assert!(
            report
                .lines()
                .any(|l| l.starts_with("all js") && l.contains("200 B") && l.contains("100 B")),
            "{report}"
        );
        assert!(
            report
                .lines()
                .any(|l| l.starts_with("everything") && l.contains("2258 B")),
            "{report}"
        );
        assert!(!report.contains("all css"));
    }
}
