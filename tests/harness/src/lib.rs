//! Phasewise's tooling, kept out of the app crate so the app stays lean.
//!
//! - [`tools`]: finds or installs what a build needs (wasm target, trunk, wasm-bindgen-cli,
//!   wasm-opt, chromium), so the README's two commands work on a fresh Debian machine;
//! - [`build`]: the offline release build with Trunk into `dist/`;
//! - [`size`]: the raw and gzip size report of `dist/`;
//! - [`split`]: the release module split into the first screen's part and parts on demand;
//! - [`lighthouse`]: Lighthouse's mobile preset on the app and the counter, side by side;
//! - [`server`]: a small static file server on 127.0.0.1, used by `cargo xtask serve` and by
//!   the browser tests;
//! - [`browser`]: headless Chromium driven through chromedriver over WebDriver, and the
//!   [`browser::AppSession`] fixture that the tests in `tests/harness/tests/` build on.

pub mod browser;
pub mod build;
pub mod lighthouse;
pub mod offline;
pub mod server;
pub mod size;
pub mod split;
pub mod tools;

use std::path::{Path, PathBuf};

/// The project's top folder (where the app's Cargo.toml is).
pub fn project_root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .ancestors()
        .nth(2)
        .expect("tests/harness sits two folders below the project root")
        .to_path_buf()
}

/// Where the release build is written.
pub fn dist_dir() -> PathBuf {
    project_root().join("dist")
}

/// The shared cargo target folder (one for the whole workspace, so nothing builds twice).
pub fn target_dir() -> PathBuf {
    std::env::var_os("CARGO_TARGET_DIR")
        .map(PathBuf::from)
        .unwrap_or_else(|| project_root().join("target"))
}
