//! Lighthouse on the app and on the plain Leptos counter, side by side in one run.
//!
//! `cargo xtask lighthouse` serves both release builds from this process's static server (so
//! both are sent gzip'd, as a real host sends them) and runs Lighthouse's default preset
//! (mobile: simulated slow 4G and a CPU four times slower) on each in turn, several rounds,
//! alternating, so a noisy machine slows both alike. It prints every round and the median.
//! Each run starts Chromium with a fresh profile: a first visit, no service worker yet.
//!
//! Lighthouse comes from the npm registry (`lighthouse@13`, one copy per machine beside
//! wasm-opt, see [`crate::tools`]); it drives Debian's Chromium.

use crate::tools;
use serde_json::Value;
use std::path::{Path, PathBuf};
use std::process::Command;

/// The Lighthouse release line used (13 runs on this machine's Node.js 20, though it asks
/// for 22; checked 2026-12-05).
pub const LIGHTHOUSE_VERSION: &str = "13";

/// The figures of one Lighthouse run that the targets name, and those that explain them.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Figures {
    /// Performance score, 0 to 1.
    pub performance: f64,
    /// Milliseconds.
    pub first_contentful_paint: f64,
    pub largest_contentful_paint: f64,
    pub total_blocking_time: f64,
    pub speed_index: f64,
    /// Unitless.
    pub cumulative_layout_shift: f64,
}

impl Figures {
    /// Reads Lighthouse's JSON report (`lhr`).
    pub fn from_report(report: &Value) -> Result<Figures, String> {
        let audit = |id: &str| {
            report["audits"][id]["numericValue"]
                .as_f64()
                .ok_or_else(|| format!("the Lighthouse report has no figure for {id}"))
        };
        Ok(Figures {
            performance: report["categories"]["performance"]["score"]
                .as_f64()
                .ok_or("the Lighthouse report has no performance score (did the page load?)")?,
            first_contentful_paint: audit("first-contentful-paint")?,
            largest_contentful_paint: audit("largest-contentful-paint")?,
            total_blocking_time: audit("total-blocking-time")?,
            speed_index: audit("speed-index")?,
            cumulative_layout_shift: audit("cumulative-layout-shift")?,
        })
    }

    /// The median of each figure over `runs` (taken figure by figure).
    pub fn median(runs: &[Figures]) -> Option<Figures> {
        if runs.is_empty() {
            return None;
        }
        let median = |pick: fn(&Figures) -> f64| {
            let mut values: Vec<f64> = runs.iter().map(pick).collect();
            values.sort_by(f64::total_cmp);
            let n = values.len();
            if n % 2 == 1 {
                values[n / 2]
            } else {
                (values[n / 2 - 1] + values[n / 2]) / 2.0
            }
        };
        Some(Figures {
            performance: median(|f| f.performance),
            first_contentful_paint: median(|f| f.first_contentful_paint),
            largest_contentful_paint: median(|f| f.largest_contentful_paint),
            total_blocking_time: median(|f| f.total_blocking_time),
            speed_index: median(|f| f.speed_index),
            cumulative_layout_shift: median(|f| f.cumulative_layout_shift),
        })
    }

    /// One row of the printed table.
    pub fn row(&self, name: &str) -> String {
        format!(
            "{name:<28} {:>11.2} {:>8.0} {:>8.0} {:>8.0} {:>8.0} {:>7.3}",
            self.performance,
            self.first_contentful_paint,
            self.largest_contentful_paint,
            self.total_blocking_time,
            self.speed_index,
            self.cumulative_layout_shift
        )
    }
}

/// The table's heading, matching [`Figures::row`].
pub fn heading() -> String {
    format!(
        "{:<28} {:>11} {:>8} {:>8} {:>8} {:>8} {:>7}",
        "", "performance", "FCP ms", "LCP ms", "TBT ms", "SI ms", "CLS"
    )
}

/// Where Lighthouse is installed: one copy per machine, shared by every clone.
pub fn install_dir() -> PathBuf {
    tools::cache_dir().join(format!("lighthouse-{LIGHTHOUSE_VERSION}"))
}

/// Makes sure Lighthouse is installed, installing it from the npm registry if not; gives
/// its program.
pub fn prepare() -> Result<PathBuf, String> {
    let bin = install_dir().join("node_modules").join(".bin");
    // Node.js comes from PATH, behind Lighthouse's own folder.
    let tools = tools::BuildTools::ahead_of_path(vec![bin.clone()])?;
    tools::ensure(&tools, "lighthouse", &format!("{LIGHTHOUSE_VERSION}."), || {
        tools::npm_install(&install_dir(), &format!("lighthouse@{LIGHTHOUSE_VERSION}"))
    })?;
    Ok(bin.join("lighthouse"))
}

/// Runs Lighthouse once on `url`, keeping its JSON report at `report`.
pub fn run(lighthouse: &Path, url: &str, report: &Path) -> Result<Figures, String> {
    let flags = tools::CHROMIUM_FLAGS.join(" ");
    let out = Command::new(lighthouse)
        .arg(url)
        .args([
            "--only-categories=performance",
            "--output=json",
            "--quiet",
            &format!("--chrome-flags={flags}"),
        ])
        .arg(format!("--output-path={}", report.display()))
        .env("CHROME_PATH", tools::CHROMIUM)
        .output()
        .map_err(|e| format!("could not start lighthouse: {e}"))?;
    if !out.status.success() {
        return Err(format!(
            "lighthouse failed on {url}: {}",
            String::from_utf8_lossy(&out.stderr)
        ));
    }
    let text = std::fs::read_to_string(report)
        .map_err(|e| format!("cannot read {}: {e}", report.display()))?;
    let value: Value = serde_json::from_str(&text)
        .map_err(|e| format!("{} is not Lighthouse's JSON: {e}", report.display()))?;
    if let Some(error) = value["runtimeError"]["message"].as_str() {
        return Err(format!("lighthouse could not measure {url}: {error}"));
    }
    Figures::from_report(&value)
}

#[cfg(test)]
mod tests {
    use super::*;
    use serde_json::json;

    fn report(score: f64, lcp: f64) -> Value {
        let figure = |v: f64| json!({ "numericValue": v });
        json!({
            "categories": { "performance": { "score": score } },
            "audits": {
                "first-contentful-paint": figure(900.0),
                "largest-contentful-paint": figure(lcp),
                "total-blocking-time": figure(10.0),
                "speed-index": figure(1000.0),
                "cumulative-layout-shift": figure(0.0),
            }
        })
    }

    #[test]
    fn reads_the_figures_of_a_report_and_refuses_one_without_a_score() {
        let figures = Figures::from_report(&report(0.97, 1800.0)).unwrap();
        assert_eq!(figures.performance, 0.97);
        assert_eq!(figures.largest_contentful_paint, 1800.0);
        let mut failed = report(0.5, 1.0);
        failed["categories"]["performance"]["score"] = Value::Null;
        assert!(Figures::from_report(&failed).is_err());
    }

    #[test]
    fn the_median_is_taken_figure_by_figure() {
        let runs: Vec<Figures> = [(0.9, 3000.0), (1.0, 1000.0), (0.95, 2000.0)]
            .iter()
            .map(|(s, l)| Figures::from_report(&report(*s, *l)).unwrap())
            .collect();
        let median = Figures::median(&runs).unwrap();
        assert_eq!(
            (median.performance, median.largest_contentful_paint),
            (0.95, 2000.0)
        );
        assert_eq!(
            Figures::median(&runs[..2]).unwrap().largest_contentful_paint,
            2000.0
        );
        assert!(Figures::median(&[]).is_none());
    }
}
