//! Seals a release build for offline use and for its Content Security Policy.
//!
//! Run by Trunk's post-build hook (`cargo xtask seal`, see Trunk.toml) on the staged build,
//! before Trunk moves it to `dist/`:
//! - writes `service-worker.js` from `src/offline/service-worker.js`, with the list of every
//!   file of the build and a cache version made from their contents (so any change to any file
//!   makes a new worker and a new cache, and an unchanged build keeps its cache);
//! - makes Trunk's loader in `index.html` fetch the module once the static first view is
//!   painted ([`module_after_first_paint`]);
//! - puts the page's Content Security Policy into `index.html`: only the page's own files, the
//!   one inline loader script Trunk writes (by its SHA-256, so no other inline script runs),
//!   and what WebAssembly needs; no other origin for anything.
//!
//! The list names the page itself as `./`; the version is the first 16 hex digits of a
//! SHA-256 over every file's name and bytes and the template, and the cache is
//! `phasewise-<version>`. The worker precaches the list on install, serves
//! every same-origin GET from its cache first (file names are content-hashed, so that is
//! always right; a navigation gets the cached page), and on activation deletes every other
//! `phasewise-` cache.
//!
//! The policy, put first in the head: `default-src 'none'`; scripts only from the page's
//! origin, plus Trunk's one inline loader by its SHA-256, plus `'wasm-unsafe-eval'`
//! (WebAssembly compilation); styles, images, fetches, the manifest and the worker only from
//! the page's origin; no base URI, forms or plugins (downloads are navigations to `blob:`
//! addresses, which the policy does not govern). The app sets no style attributes, so styles
//! need no inline allowance.

use base64::Engine as _;
use sha2::{Digest, Sha256};
use std::path::{Path, PathBuf};

/// The worker's file name in the build (its scope is the whole app).
pub const WORKER: &str = "service-worker.js";

/// What a seal did, for the build log and the size note.
#[derive(Debug, PartialEq, Eq)]
pub struct Sealed {
    pub version: String,
    pub files: Vec<(String, u64)>,
}

impl Sealed {
    pub fn total_bytes(&self) -> u64 {
        self.files.iter().map(|(_, n)| n).sum()
    }
}

/// The policy, with the hashes of the page's inline scripts. `style-src` has no inline
/// allowance: the app sets no style attributes (the charts use SVG presentation attributes).
pub fn policy(inline_script_hashes: &[String]) -> String {
    let hashes: String = inline_script_hashes
        .iter()
        .map(|h| format!(" 'sha256-{h}'"))
        .collect();
    format!(
        "default-src 'none'; script-src 'self' 'wasm-unsafe-eval'{hashes}; style-src 'self'; \
         img-src 'self'; connect-src 'self'; manifest-src 'self'; worker-src 'self'; \
         base-uri 'none'; form-action 'none'; object-src 'none'"
    )
}

/// The bodies of the inline `<script>` elements of `html` (those with no `src`).
pub fn inline_scripts(html: &str) -> Vec<&str> {
    let mut found = Vec::new();
    let mut rest = html;
    while let Some(start) = rest.find("<script") {
        let after = &rest[start..];
        let Some(open_end) = after.find('>') else {
            break;
        };
        let tag = &after[..open_end];
        let body_start = open_end + 1;
        let Some(close) = after[body_start..].find("</script>") else {
            break;
        };
        if !tag.contains(" src=") {
            found.push(&after[body_start..body_start + close]);
        }
        rest = &after[body_start + close..];
    }
    found
}

/// The CSP `sha256-` source for a script body.
pub fn script_hash(body: &str) -> String {
    base64::engine::general_purpose::STANDARD.encode(Sha256::digest(body.as_bytes()))
}

/// `html` with the policy as the first element of its head (it must precede every script).
pub fn with_policy(html: &str) -> Result<String, String> {
    if html.contains("Content-Security-Policy") {
        return Err("index.html already has a Content-Security-Policy".into());
    }
    let hashes: Vec<String> = inline_scripts(html).into_iter().map(script_hash).collect();
    let head = html.find("<head>").ok_or("index.html has no <head>")? + "<head>".len();
    let meta = format!(
        "\n    <meta http-equiv=\"Content-Security-Policy\" content=\"{}\" />",
        policy(&hashes)
    );
    Ok(format!("{}{meta}{}", &html[..head], &html[head..]))
}

/// Trunk's loader script.
const TRUNK_INIT: &str = "const wasm = await init(";

/// What the loader waits for before fetching the module: the browser's report of the page's
/// first contentful paint (the first view's text on screen; a first paint of the background
/// alone and animation frames come before it), or a second at most, for a page that is not
/// painted (a tab in the background).
const AFTER_FIRST_PAINT: &str = "await new Promise((painted) => {
  setTimeout(painted, 1000);
  try {
    new PerformanceObserver((list, observer) => {
      if (list.getEntriesByName(\"first-contentful-paint\").length) { observer.disconnect(); painted(); }
    }).observe({ type: \"paint\", buffered: true });
  } catch (e) { painted(); }
});
";

/// `html` with Trunk's loader fetching the wasm module only after the page's static first view
/// has been painted. On a weak signal that view then shows while the module downloads,
/// instead of the module's fetch competing with the stylesheet it needs; the fetch starts
/// once the first frame is shown.
pub fn module_after_first_paint(html: &str) -> Result<String, String> {
    match html.matches(TRUNK_INIT).count() {
        1 => Ok(html.replace(TRUNK_INIT, &format!("{AFTER_FIRST_PAINT}{TRUNK_INIT}"))),
        n => Err(format!(
            "index.html has {n} Trunk loaders (`{TRUNK_INIT}`), not one: has Trunk's loader changed?"
        )),
    }
}

/// Every file under `dir` as a path relative to it with `/` separators, sorted.
fn files_under(dir: &Path) -> Result<Vec<PathBuf>, String> {
    let mut files = Vec::new();
    crate::size::walk(dir, &mut files)
        .map_err(|e| format!("cannot list {}: {e}", dir.display()))?;
    let mut relative: Vec<PathBuf> = files
        .into_iter()
        .filter_map(|p| p.strip_prefix(dir).ok().map(Path::to_path_buf))
        .collect();
    relative.sort();
    Ok(relative)
}

/// Seals the build in `dir` with the worker template at `template`.
pub fn seal(dir: &Path, template: &Path) -> Result<Sealed, String> {
    let index = dir.join("index.html");
    let html = std::fs::read_to_string(&index)
        .map_err(|e| format!("cannot read {}: {e}", index.display()))?;
    std::fs::write(&index, with_policy(&module_after_first_paint(&html)?)?)
        .map_err(|e| format!("cannot write {}: {e}", index.display()))?;

    let mut digest = Sha256::new();
    let mut files = Vec::new();
    for relative in files_under(dir)? {
        let name = relative.to_string_lossy().replace('\\', "/");
        if name == WORKER {
            continue;
        }
        let bytes =
            std::fs::read(dir.join(&relative)).map_err(|e| format!("cannot read {name}: {e}"))?;
        digest.update(name.as_bytes());
        digest.update([0]);
        digest.update(&bytes);
        files.push((name, bytes.len() as u64));
    }
    let template_text = std::fs::read_to_string(template)
        .map_err(|e| format!("cannot read {}: {e}", template.display()))?;
    digest.update(template_text.as_bytes());
    let version: String = digest.finalize()[..8]
        .iter()
        .map(|b| format!("{b:02x}"))
        .collect();
    let worker = worker_script(&template_text, &version, &files)?;
    std::fs::write(dir.join(WORKER), worker).map_err(|e| format!("cannot write {WORKER}: {e}"))?;
    Ok(Sealed { version, files })
}

/// The template with the version and the file list filled in. The page itself is cached as
/// `./` (the address every visit starts from), not as `index.html`.
pub fn worker_script(
    template: &str,
    version: &str,
    files: &[(String, u64)],
) -> Result<String, String> {
    if !template.contains("__PHASEWISE_VERSION__") || !template.contains("__PHASEWISE_FILES__") {
        return Err("the service worker template lacks its placeholders".into());
    }
    let urls: Vec<String> = files
        .iter()
        .map(|(name, _)| {
            if name == "index.html" {
                "./".to_string()
            } else {
                format!("./{name}")
            }
        })
        .collect();
    let list = serde_json::to_string(&urls).map_err(|e| e.to_string())?;
    Ok(template
        .replace("__PHASEWISE_VERSION__", version)
        .replace("__PHASEWISE_FILES__", &list))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_module_is_fetched_after_the_first_paint() {
        let html = "<script type=\"module\">\nimport init from '/a.js';\nconst wasm = await init({ module_or_path: '/a_bg.wasm' });\n</script>";
        let out = module_after_first_paint(html).unwrap();
        let wait = out.find("PerformanceObserver").unwrap();
        assert!(wait < out.find(TRUNK_INIT).unwrap(), "{out}");
        assert!(module_after_first_paint("<p>no loader</p>").is_err());
        assert!(module_after_first_paint(&format!("{html}{html}")).is_err());
    }

    const PAGE: &str = "<!doctype html><html><head><title>t</title>\n<script type=\"module\">\nimport init from '/a.js';\n</script><script src=\"/x.js\"></script></head><body></body></html>";

    #[test]
    fn the_policy_admits_exactly_the_inline_loader() {
        let sealed = with_policy(PAGE).unwrap();
        let body = "\nimport init from '/a.js';\n";
        assert_eq!(inline_scripts(PAGE), vec![body]);
        // FIPS 180-2, appendix B.1: SHA-256 of "abc" is ba7816bf...f20015ad; here in base64.
        assert_eq!(
            script_hash("abc"),
            "ungWv48Bz+pBQUDeXa4iI7ADYaOWF3qctBD/YfIAFa0="
        );
        assert!(sealed.contains(&format!("'sha256-{}'", script_hash(body))));
        assert!(sealed.find("Content-Security-Policy").unwrap() < sealed.find("<script").unwrap());
        assert!(with_policy(&sealed).is_err(), "sealing twice is refused");
    }

    #[test]
    fn the_version_follows_the_contents() {
        let dir = std::env::temp_dir().join(format!("phasewise-seal-{}", std::process::id()));
        let _ = std::fs::remove_dir_all(&dir);
        std::fs::create_dir_all(dir.join("public")).unwrap();
        let template = dir.join("template.js");
        std::fs::write(
            &template,
            "const V = \"__PHASEWISE_VERSION__\"; const F = __PHASEWISE_FILES__;",
        )
        .unwrap();
        let build = |icon: &str| {
            let page = PAGE.replace(
                "import init from '/a.js';\n",
                "import init from '/a.js';\nconst wasm = await init({});\n",
            );
            std::fs::write(dir.join("index.html"), page).unwrap();
            std::fs::write(dir.join("public/icon.svg"), icon).unwrap();
            let _ = std::fs::remove_file(dir.join(WORKER));
            seal(&dir, &template).unwrap()
        };
        let first = build("<svg/>");
        let again = build("<svg/>");
        let changed = build("<svg></svg>");
        assert_eq!(first.version, again.version);
        assert_ne!(first.version, changed.version);
        let names: Vec<&str> = first.files.iter().map(|(n, _)| n.as_str()).collect();
        assert_eq!(names, ["index.html", "public/icon.svg", "template.js"]);
        let worker = std::fs::read_to_string(dir.join(WORKER)).unwrap();
        assert!(
            worker.contains(r#"["./","./public/icon.svg","./template.js"]"#),
            "{worker}"
        );
        assert!(worker.contains(&changed.version));
        let _ = std::fs::remove_dir_all(&dir);
    }
}
