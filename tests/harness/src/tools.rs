//! Finds the build and test tools, and installs whichever is missing.
//!
//! Everything comes from a package registry (crates.io, npm, Debian), never a downloaded
//! binary. Each check is a `--version` call, so a machine that has everything pays well under
//! a second. Each version, and why it is that one, is on its constant or install step below.
//!
//! # wasm-opt
//!
//! Debian's binaryen (wasm-opt 108) runs without error but re-points wasm-bindgen's externref
//! table export, and the module dies at start-up in Chromium
//! (`WebAssembly.Table.set(): Argument 1 is invalid for table`). Checked on this app on
//! 2026-12-01: its `wasm-opt -Oz` output (101,795 bytes), served in place of ours, fails
//! `cargo xtask smoke` with exactly that console error. Two alternatives produce a working
//! module: the npm package `binaryen@132`, which installs in seconds, and the `wasm-opt` crate
//! 0.116.1, which takes about ten minutes to build. We use the npm package. `Trunk.toml` pins `wasm_opt = "version_132"`, so Trunk
//! refuses any other wasm-opt it might find on PATH. Do not set `strip = true` in the release
//! profile: it removes the module's target-features section and wasm-opt then misreads newer
//! instructions. The browser test `a_broken_wasm_module_is_caught` proves the smoke tests fail
//! on a module that does not start.
//!
//! Measured on the app shell (2026-12-01, the release profile in `size`), bytes:
//!
//! | wasm module | raw | gzip |
//! |---|---|---|
//! | as wasm-bindgen writes it | 186,296 | 64,755 |
//! | after wasm-opt 132 `-Oz` | 100,706 | 43,243 |
//!
//! wasm-opt takes 46 % off the raw module and 33 % off what is sent. `cargo xtask size`
//! prints both on every build.

use std::ffi::OsString;
use std::path::{Path, PathBuf};
use std::process::Command;

/// Trunk 0.22 and later need a newer rustc than this machine's 1.95.
pub const TRUNK_VERSION: &str = "0.21.14";
/// binaryen from the npm registry. Debian's wasm-opt (108) re-points wasm-bindgen's externref
/// table and the module dies at start-up; 132 produces a working module.
pub const BINARYEN_VERSION: &str = "132";
pub const WASM_TARGET: &str = "wasm32-unknown-unknown";
/// Debian's packages put them here.
pub const CHROMIUM: &str = "/usr/bin/chromium";
pub const CHROMEDRIVER: &str = "/usr/bin/chromedriver";
/// How Chromium is started for the tests and Lighthouse: headless, and as root here with no
/// sandbox; nothing that phones home, because the closed network refuses it and floods the
/// log. Each start adds its own fresh profile.
pub const CHROMIUM_FLAGS: [&str; 10] = [
    "--headless=new",
    "--no-sandbox",
    "--disable-gpu",
    "--disable-dev-shm-usage",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
    "--disable-quic",
    "--no-first-run",
    "--no-default-browser-check",
];

/// The tool search path to build with: wasm-opt 132 and cargo's installs ahead of the rest.
#[derive(Debug, Clone)]
pub struct BuildTools {
    pub path: OsString,
}

/// Makes sure the wasm target, trunk, wasm-bindgen-cli (at the version in Cargo.lock) and
/// wasm-opt are present, installing what is missing.
pub fn prepare_build(root: &Path) -> Result<BuildTools, String> {
    let tools = BuildTools::search_path()?;

    ensure_wasm_target()?;

    let trunk_wanted = format!("trunk {TRUNK_VERSION}");
    ensure(&tools, "trunk", &trunk_wanted, || {
        cargo_install(&["trunk", "--locked", "--version", TRUNK_VERSION])
    })?;

    let bindgen = pinned_version(&root.join("Cargo.lock"), "wasm-bindgen")?;
    // Without --locked: with it, the install fails on a webpki-roots version the index lacks.
    ensure(
        &tools,
        "wasm-bindgen",
        &format!("wasm-bindgen {bindgen}"),
        || cargo_install(&["wasm-bindgen-cli", "--force", "--version", &bindgen]),
    )?;

    ensure(
        &tools,
        "wasm-opt",
        &format!("version {BINARYEN_VERSION}"),
        install_binaryen,
    )?;
    Ok(tools)
}

/// Poppler's `pdftotext`: the print test reads the report's PDF back with it (and renders its
/// pages with `pdftoppm`, same package).
pub const PDFTOTEXT: &str = "/usr/bin/pdftotext";

/// Makes sure Debian's chromium and chromium-driver are installed, and poppler-utils for the
/// report's PDF.
pub fn prepare_browser() -> Result<(), String> {
    if Path::new(CHROMIUM).is_file() && Path::new(CHROMEDRIVER).is_file() {
        say(&format!(
            "chromium and chromedriver: found in {}",
            Path::new(CHROMIUM).parent().unwrap().display()
        ));
    } else {
        apt_install(&["chromium", "chromium-driver"])?;
    }
    if Path::new(PDFTOTEXT).is_file() {
        say("pdftotext and pdftoppm (poppler-utils): found");
        Ok(())
    } else {
        apt_install(&["poppler-utils"])
    }
}

impl BuildTools {
    /// wasm-opt 132 and cargo's installs ahead of the rest of PATH, without checking that
    /// anything is there (see [`prepare_build`]).
    pub fn search_path() -> Result<BuildTools, String> {
        BuildTools::ahead_of_path(vec![
            binaryen_dir().join("node_modules").join(".bin"),
            cargo_home().join("bin"),
        ])
    }

    /// `dirs` searched first, then PATH.
    pub fn ahead_of_path(mut dirs: Vec<PathBuf>) -> Result<BuildTools, String> {
        dirs.extend(std::env::split_paths(
            &std::env::var_os("PATH").unwrap_or_default(),
        ));
        let path = std::env::join_paths(dirs).map_err(|e| format!("cannot build PATH: {e}"))?;
        Ok(BuildTools { path })
    }

    /// A command that finds its program on this search path.
    pub fn command(&self, program: &str) -> Command {
        let mut command = Command::new(self.find(program).unwrap_or_else(|| program.into()));
        command.env("PATH", &self.path);
        command
    }

    fn find(&self, program: &str) -> Option<PathBuf> {
        std::env::split_paths(&self.path)
            .map(|dir| dir.join(program))
            .find(|candidate| candidate.is_file())
    }

    /// What `program --version` prints, if the program runs.
    pub fn version(&self, program: &str) -> Option<String> {
        let out = self.command(program).arg("--version").output().ok()?;
        out.status
            .success()
            .then(|| String::from_utf8_lossy(&out.stdout).trim().to_string())
    }
}

/// Makes sure `program --version` on `tools`' path names `wanted`, running `install` if not
/// (and checking again after).
pub fn ensure(
    tools: &BuildTools,
    program: &str,
    wanted: &str,
    install: impl FnOnce() -> Result<(), String>,
) -> Result<(), String> {
    match tools.version(program) {
        Some(found) if found.contains(wanted) => {
            say(&format!("{program}: {found}"));
            return Ok(());
        }
        Some(found) => say(&format!(
            "{program}: found {found}, need {wanted}; installing"
        )),
        None => say(&format!("{program}: not found; installing ({wanted})")),
    }
    install()?;
    match tools.version(program) {
        Some(found) if found.contains(wanted) => {
            say(&format!("{program}: {found}"));
            Ok(())
        }
        other => Err(format!(
            "{program} was installed but `{program} --version` gives {other:?}, not {wanted}"
        )),
    }
}

fn ensure_wasm_target() -> Result<(), String> {
    let installed = Command::new("rustup")
        .args(["target", "list", "--installed"])
        .output()
        .map_err(|e| format!("rustup is needed to add the {WASM_TARGET} target: {e}"))?;
    if String::from_utf8_lossy(&installed.stdout)
        .lines()
        .any(|l| l.trim() == WASM_TARGET)
    {
        say(&format!("rust target {WASM_TARGET}: installed"));
        return Ok(());
    }
    run(Command::new("rustup").args(["target", "add", WASM_TARGET]))
}

fn cargo_install(args: &[&str]) -> Result<(), String> {
    run(
        Command::new(std::env::var_os("CARGO").unwrap_or_else(|| "cargo".into()))
            .arg("install")
            .args(args),
    )
}

fn install_binaryen() -> Result<(), String> {
    npm_install(&binaryen_dir(), &format!("binaryen@{BINARYEN_VERSION}"))
}

/// Installs `package` (name@version) from the npm registry into `dir`, installing Node.js and
/// npm from Debian first if they are missing.
pub fn npm_install(dir: &Path, package: &str) -> Result<(), String> {
    if Command::new("npm").arg("--version").output().is_err() {
        apt_install(&["nodejs", "npm"])?;
    }
    std::fs::create_dir_all(dir).map_err(|e| format!("cannot create {}: {e}", dir.display()))?;
    run(Command::new("npm")
        .args(["install", "--no-audit", "--no-fund", "--prefix"])
        .arg(dir)
        .arg(package))
}

fn apt_install(packages: &[&str]) -> Result<(), String> {
    let as_root = Command::new("id")
        .arg("-u")
        .output()
        .map(|o| String::from_utf8_lossy(&o.stdout).trim() == "0")
        .unwrap_or(false);
    let apt = |args: &[&str]| {
        let mut command = if as_root {
            Command::new("apt-get")
        } else {
            Command::new("sudo")
        };
        if !as_root {
            command.arg("apt-get");
        }
        command.args(args).env("DEBIAN_FRONTEND", "noninteractive");
        run(&mut command)
    };
    say(&format!(
        "installing Debian packages: {}",
        packages.join(" ")
    ));
    apt(&["update", "-q"])?;
    let mut install = vec!["install", "-y", "-q"];
    install.extend_from_slice(packages);
    apt(&install)
}

/// The version of `package` that Cargo.lock pins.
pub fn pinned_version(lock: &Path, package: &str) -> Result<String, String> {
    let text = std::fs::read_to_string(lock).map_err(|e| {
        format!(
            "cannot read {}: {e} (it is committed with the project)",
            lock.display()
        )
    })?;
    let wanted = format!("name = \"{package}\"");
    let mut lines = text.lines();
    while let Some(line) = lines.next() {
        if line.trim() == wanted {
            if let Some(version) = lines
                .next()
                .and_then(|l| l.trim().strip_prefix("version = "))
            {
                return Ok(version.trim_matches('"').to_string());
            }
        }
    }
    Err(format!("{} does not list {package}", lock.display()))
}

fn cargo_home() -> PathBuf {
    std::env::var_os("CARGO_HOME")
        .map(PathBuf::from)
        .unwrap_or_else(|| home().join(".cargo"))
}

/// Where the npm-installed tools live: one copy per machine, shared by every clone.
pub fn cache_dir() -> PathBuf {
    std::env::var_os("XDG_CACHE_HOME")
        .map(PathBuf::from)
        .unwrap_or_else(|| home().join(".cache"))
        .join("phasewise")
}

/// Where wasm-opt is installed.
pub fn binaryen_dir() -> PathBuf {
    cache_dir().join(format!("binaryen-{BINARYEN_VERSION}"))
}

fn home() -> PathBuf {
    std::env::var_os("HOME")
        .map(PathBuf::from)
        .unwrap_or_else(|| PathBuf::from("/root"))
}

/// Runs a command in the foreground, its output going to the terminal.
pub fn run(command: &mut Command) -> Result<(), String> {
    say(&format!("running {command:?}"));
    let status = command
        .status()
        .map_err(|e| format!("could not start {:?}: {e}", command.get_program()))?;
    if status.success() {
        Ok(())
    } else {
        Err(format!("{:?} failed ({status})", command.get_program()))
    }
}

pub fn say(message: &str) {
    eprintln!("[xtask] {message}");
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reads_the_pinned_wasm_bindgen_from_the_lock_file() {
        let lock = crate::project_root().join("Cargo.lock");
        let version = pinned_version(&lock, "wasm-bindgen").unwrap();
        // The app's Cargo.toml pins it with `=`; the lock must agree.
        let manifest = std::fs::read_to_string(crate::project_root().join("Cargo.toml")).unwrap();
        assert!(
            manifest.contains(&format!("wasm-bindgen = \"={version}\"")),
            "{version}"
        );
    }

    #[test]
    fn a_package_the_lock_lacks_is_an_error() {
        let lock = crate::project_root().join("Cargo.lock");
        assert!(pinned_version(&lock, "no-such-package-here").is_err());
    }
}
