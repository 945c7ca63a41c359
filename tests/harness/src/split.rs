//! Splits the release module into the part the first screen needs and parts loaded on demand.
//!
//! The app marks each on-demand part with Leptos's `#[lazy]` (see `src/ui/parts.rs`). Trunk
//! cannot split by itself: the split works on cargo's raw module, which keeps its relocations
//! (`-Clink-arg=--emit-relocs`, set in `.cargo/config.toml`), before wasm-bindgen, and Trunk
//! has no hook there. So the post-build step (`cargo xtask seal`) does it after Trunk, from the
//! raw module Trunk built, the way cargo-leptos's `--split` does:
//!
//! 1. `wasm_split_cli_support::transform` writes the main module, one `split_*.wasm` per lazy
//!    part, `chunk_*.wasm` for code several parts share, and the JavaScript loader;
//! 2. wasm-bindgen runs again on the main module, with `--keep-lld-exports` (the loader needs
//!    the function table export), and its output replaces Trunk's under Trunk's hashed names,
//!    so the page's loader script is unchanged;
//! 3. wasm-opt `-Oz` runs on every module (Trunk's own wasm-opt is off for the app, see
//!    index.html, since its output would be replaced);
//! 4. every part and the loader are renamed after Trunk's hashed name, so two builds' parts
//!    can never be mixed by a cache (the loader fetches them relative to itself).
//!
//! A build with no split point (the counter) loses only the linker sections, and is optimised
//! the same way.

use crate::tools::BuildTools;
use std::process::Command;
use std::path::{Path, PathBuf};

/// What the split wrote, for the build log.
#[derive(Debug, Default)]
pub struct Split {
    /// The main module's file name.
    pub main: String,
    /// The on-demand parts' file names (lazy parts and shared chunks), and the loader's.
    pub parts: Vec<String>,
}

/// The import module the wasm-split macros leave in a module until it is split.
const PLACEHOLDER: &[u8] = b"__wasm_split_placeholder__";

/// Splits the build staged in `staging`, whose raw cargo module is in `raw_dir`.
/// `None` when the module has nothing to split.
pub fn split(
    tools: &BuildTools,
    staging: &Path,
    raw_dir: &Path,
    scratch: &Path,
    optimise: bool,
) -> Result<Option<Split>, String> {
    let (stem, bin) = trunk_names(staging)?;
    let raw_path = raw_dir.join(format!("{bin}.wasm"));
    let raw = std::fs::read(&raw_path)
        .map_err(|e| format!("cannot read the raw module {}: {e}", raw_path.display()))?;
    if !raw.windows(PLACEHOLDER.len()).any(|w| w == PLACEHOLDER) {
        // Nothing to split: drop the relocations the build flag kept (a build without that
        // flag would not have them, and binaryen mishandles a module that has them), then
        // optimise as a split build is (Trunk's wasm-opt is off for both).
        let staged = staging.join(format!("{stem}_bg.wasm"));
        let bytes = std::fs::read(&staged)
            .map_err(|e| format!("cannot read {}: {e}", staged.display()))?;
        std::fs::write(&staged, without_link_sections(&bytes)?)
            .map_err(|e| format!("cannot write {}: {e}", staged.display()))?;
        if optimise {
            quietly(tools.command("wasm-opt").args(["-Oz", "--output"]).arg(&staged).arg(&staged))?;
        }
        return Ok(None);
    }
    let _ = std::fs::remove_dir_all(scratch);
    std::fs::create_dir_all(scratch)
        .map_err(|e| format!("cannot create {}: {e}", scratch.display()))?;
    let parts_dir = scratch.join("parts");
    let main_raw = scratch.join("main.wasm");
    let main_js = format!("./{stem}.js");
    let loader = format!("./{stem}-parts.js");
    let written = {
        let mut options = wasm_split_cli_support::Options::new(&raw);
        options.output_dir = &parts_dir;
        options.main_out_path = &main_raw;
        options.main_module = &main_js;
        options.link_name = &loader;
        wasm_split_cli_support::transform(options)
            .map_err(|e| format!("splitting {} failed: {e:#}", raw_path.display()))?
    };

    // wasm-bindgen on the split main module, as Trunk ran it plus the function table export.
    let bound = scratch.join("bound");
    quietly(tools
        .command("wasm-bindgen")
        .args(["--target", "web", "--keep-lld-exports", "--no-demangle", "--no-typescript", "--out-name", &bin, "--out-dir"])
        .arg(&bound)
        .arg(&main_raw))?;
    let copy = |from: PathBuf, to: PathBuf| {
        std::fs::copy(&from, &to)
            .map(|_| ())
            .map_err(|e| format!("cannot copy {} to {}: {e}", from.display(), to.display()))
    };
    let main_wasm = staging.join(format!("{stem}_bg.wasm"));
    copy(bound.join(format!("{bin}.js")), staging.join(format!("{stem}.js")))?;
    copy(bound.join(format!("{bin}_bg.wasm")), main_wasm.clone())?;

    // Each part under a name of this build's own; the loader names them, so it is rewritten.
    let loader_file = parts_dir.join(loader.trim_start_matches("./"));
    let mut loader_text = std::fs::read_to_string(&loader_file)
        .map_err(|e| format!("cannot read the split loader {}: {e}", loader_file.display()))?;
    let mut parts = Vec::new();
    for module in &written.split_modules {
        let name = module
            .file_name()
            .and_then(|n| n.to_str())
            .ok_or_else(|| format!("a split part has no file name: {}", module.display()))?;
        let renamed = format!("{stem}-{name}");
        let quoted = format!("\"./{name}\"");
        if !loader_text.contains(&quoted) {
            return Err(format!("the split loader does not name {name}"));
        }
        loader_text = loader_text.replace(&quoted, &format!("\"./{renamed}\""));
        copy(module.clone(), staging.join(&renamed))?;
        parts.push(renamed);
    }
    let loader_name = loader.trim_start_matches("./").to_string();
    std::fs::write(staging.join(&loader_name), loader_text)
        .map_err(|e| format!("cannot write the split loader: {e}"))?;

    // wasm-opt on every module of a release (Trunk's own is off: it would optimise a module
    // that is replaced here).
    if optimise {
        for wasm in std::iter::once(main_wasm).chain(parts.iter().map(|p| staging.join(p))) {
            quietly(tools.command("wasm-opt").args(["-Oz", "--output"]).arg(&wasm).arg(&wasm))?;
        }
    }
    parts.push(loader_name);
    Ok(Some(Split {
        main: format!("{stem}_bg.wasm"),
        parts,
    }))
}

/// `module` without its linker sections (`linking`, `reloc.*`): custom sections only the
/// split reads. Every other section is copied as it is.
pub fn without_link_sections(module: &[u8]) -> Result<Vec<u8>, String> {
    let bad = || "not a WebAssembly module (a section runs past the end)".to_string();
    if module.len() < 8 || &module[..4] != b"\0asm" {
        return Err("not a WebAssembly module (no header)".into());
    }
    let leb = |at: &mut usize| -> Result<usize, String> {
        let (mut value, mut shift) = (0usize, 0);
        loop {
            let byte = *module.get(*at).ok_or_else(bad)?;
            *at += 1;
            value |= ((byte & 0x7f) as usize) << shift;
            if byte < 0x80 {
                return Ok(value);
            }
            shift += 7;
            if shift > 35 {
                return Err(bad());
            }
        }
    };
    let mut out = module[..8].to_vec();
    let mut at = 8;
    while at < module.len() {
        let start = at;
        let id = module[at];
        at += 1;
        let size = leb(&mut at)?;
        let end = at.checked_add(size).filter(|e| *e <= module.len()).ok_or_else(bad)?;
        let linker = id == 0 && {
            let mut name_at = at;
            let length = leb(&mut name_at)?;
            let name = module.get(name_at..name_at + length).ok_or_else(bad)?;
            name == b"linking" || name.starts_with(b"reloc.")
        };
        if !linker {
            out.extend_from_slice(&module[start..end]);
        }
        at = end;
    }
    Ok(out)
}

/// Runs a tool, showing its output only when it fails (one line per module would bury the
/// build log; wasm-opt warns about the name section's unknown subsection on every part).
fn quietly(command: &mut Command) -> Result<(), String> {
    let out = command
        .output()
        .map_err(|e| format!("could not start {:?}: {e}", command.get_program()))?;
    if out.status.success() {
        Ok(())
    } else {
        Err(format!(
            "{:?} failed ({}): {}",
            command.get_program(),
            out.status,
            String::from_utf8_lossy(&out.stderr)
        ))
    }
}

/// Trunk's hashed stem (`phasewise-1a2b…`) and the binary's name (`phasewise`), from the
/// JavaScript file Trunk staged.
fn trunk_names(staging: &Path) -> Result<(String, String), String> {
    let entries = std::fs::read_dir(staging)
        .map_err(|e| format!("cannot list {}: {e}", staging.display()))?;
    let mut stems = entries
        .filter_map(|e| e.ok())
        .filter_map(|e| e.file_name().to_str().map(str::to_string))
        .filter(|n| n.ends_with("_bg.wasm"))
        .map(|n| n.trim_end_matches("_bg.wasm").to_string());
    let stem = stems
        .next()
        .ok_or_else(|| format!("{} holds no wasm module from Trunk", staging.display()))?;
    if stems.next().is_some() {
        return Err(format!("{} holds more than one wasm module", staging.display()));
    }
    let bin = stem
        .rsplit_once('-')
        .map(|(bin, _hash)| bin.to_string())
        .ok_or_else(|| format!("{stem}: not a Trunk file name (binary-hash)"))?;
    Ok((stem, bin))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn drops_only_the_linker_sections() {
        let custom = |name: &str, body: &[u8]| {
            let mut payload = vec![name.len() as u8];
            payload.extend_from_slice(name.as_bytes());
            payload.extend_from_slice(body);
            let mut section = vec![0u8, payload.len() as u8];
            section.extend(payload);
            section
        };
        let header = b"\0asm\x01\0\0\0".to_vec();
        let type_section = vec![1u8, 4, 1, 0x60, 0, 0];
        let module: Vec<u8> = [
            header.clone(),
            type_section.clone(),
            custom("linking", &[2, 0]),
            custom("reloc.CODE", &[9, 9, 9]),
            custom("name", &[1, 2]),
        ]
        .concat();
        let lean = without_link_sections(&module).unwrap();
        assert_eq!(lean, [header, type_section, custom("name", &[1, 2])].concat());
        assert!(without_link_sections(b"\0asm\x01\0\0\0\x01\x09").is_err());
        assert!(without_link_sections(b"hello").is_err());
    }

    #[test]
    fn reads_the_binary_name_from_trunks_hashed_file() {
        let dir = std::env::temp_dir().join(format!("phasewise-split-names-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        std::fs::write(dir.join("phasewise-0a1b2c_bg.wasm"), b"").unwrap();
        std::fs::write(dir.join("phasewise-0a1b2c.js"), b"").unwrap();
        assert_eq!(
            trunk_names(&dir).unwrap(),
            ("phasewise-0a1b2c".to_string(), "phasewise".to_string())
        );
        std::fs::write(dir.join("other-99_bg.wasm"), b"").unwrap();
        assert!(trunk_names(&dir).is_err());
    }
}
