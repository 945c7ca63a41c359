//! The release build: Trunk, fully offline, into `dist/` with hashed file names.

use crate::tools::{run, say, BuildTools};
use std::path::Path;
use std::time::Instant;

/// Fetches the crates (the only step that may use the network), then builds offline.
pub fn release(tools: &BuildTools, root: &Path) -> Result<(), String> {
    run(tools.command("cargo").arg("fetch").current_dir(root))?;
    let started = Instant::now();
    // Offline is set in Trunk.toml too, so a hand-run `trunk build --release` behaves the same.
    run(tools
        .command("trunk")
        .args(["build", "--release", "--offline"])
        .current_dir(root))?;
    say(&format!(
        "release build into dist/ took {:.1} s",
        started.elapsed().as_secs_f64()
    ));
    Ok(())
}
