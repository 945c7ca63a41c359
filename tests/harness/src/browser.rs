//! Headless Chromium, driven through chromedriver over WebDriver.
//!
//! Every [`Browser`] has its own chromedriver, its own Chromium and a fresh, empty profile
//! folder, so no test sees another's storage, cache or service worker. The browser's console
//! is collected through chromedriver's log endpoint, so an error while the wasm module starts
//! (a broken module, a panic) fails the test that caused it. Every request the page makes is
//! collected the same way (chromedriver's performance log), so a session can prove it never
//! asked any origin but its own.
//!
//! A new browser test is a few lines (see `tests/harness/tests/shell.rs`):
//!
//! ```no_run
//! # async fn example() {
//! use phasewise_harness::browser::{AppSession, Viewport};
//! let app = AppSession::start("my_test", Viewport::PHONE).await;
//! app.browser.click("a[href='#/results']").await;
//! app.browser.screenshot("results").await;
//! app.finish().await; // fails on any console error
//! # }
//! ```
//!
//! The same as a whole test in `tests/harness/tests/*.rs`, started at an address:
//!
//! ```rust,ignore
//! #[tokio::test]
//! async fn results_show_the_demo_job() {
//!     let app = AppSession::start_at("results_demo", Viewport::PHONE, "#/results").await;
//!     assert_eq!(app.browser.text("main h1").await, "Results");
//!     app.browser.screenshot("results").await;
//!     app.finish().await;
//! }
//! ```
//!
//! # What each test gets
//!
//! The tests run in Debian's headless Chromium, driven by chromedriver over WebDriver with the
//! fantoccini crate. Each test:
//! - serves the release build (`dist/`) itself on a free port of 127.0.0.1
//!   ([`StaticServer`], stopped when dropped, or earlier with `stop()` to take the network
//!   away);
//! - gets its own chromedriver, Chromium and empty profile (above);
//! - runs at an exact viewport ([`Viewport::PHONE`] is 390x844; also `SMALL_PHONE`, `TABLET`,
//!   `LAPTOP`, `PROJECTOR`), emulated through Chromium's device metrics;
//! - writes screenshots to `target/screenshots/<test name>/`, beside chromedriver's log;
//! - ends with `app.finish()`, which fails on any console error (chromedriver's `se/log`) and
//!   on any request to an origin other than the test server's (every request the page sends
//!   is read from chromedriver's performance log: `Network.requestWillBeSent`).
//!
//! Helpers on [`Browser`]: `click` (scrolls the element clear of the sticky bars first), `fill`
//! (select all, delete, type: real key events, so a field sees what a user's typing gives it),
//! `choose`, `value`, `text`, `count`, `wait_for_text`, `eval`, `eval_async`, `devtools` (a
//! DevTools Protocol command), `screenshot`, `screenshot_of` (one element), `requests`,
//! `allow_downloads` and `downloaded` (a download's name and text, through
//! `Browser.setDownloadBehavior`), `contrast_failures` (WCAG AA contrast of what is shown).
//! Expected figures are the engine's own, run natively on the same job (`phasewise` is a
//! dev-dependency of the harness) and formatted with the same `Measure`.
//!
//! The tests need a current `dist/`: `cargo xtask test` builds it first. Run one browser test
//! alone with `cargo xtask test -- the_frame_renders` (or, with `dist/` current,
//! `cargo test -p phasewise-harness --test shell`). A chromedriver whose port was taken by
//! another test's server before it bound it is started again on a new port (three tries, each
//! said in the test's output). Chromium's path can be changed with `PHASEWISE_CHROMIUM` and
//! `PHASEWISE_CHROMEDRIVER`.

use crate::server::StaticServer;
use crate::tools::{CHROMEDRIVER, CHROMIUM};
use fantoccini::wd::WebDriverCompatibleCommand;
use fantoccini::{Client, ClientBuilder, Locator};
use serde_json::{json, Value};
use std::net::{TcpListener, TcpStream};
use std::path::{Path, PathBuf};
use std::process::{Child, Command, Stdio};
use std::sync::Mutex;
use std::time::{Duration, Instant};

/// The page size a test runs at (CSS pixels), emulated exactly through Chromium's device
/// metrics, so the layout seen is the layout a device of that size gets.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Viewport {
    pub width: u32,
    pub height: u32,
    /// A touch device that honours the page's viewport meta tag, as a phone does.
    pub mobile: bool,
}

impl Viewport {
    /// A common portrait phone.
    pub const PHONE: Viewport = Viewport {
        width: 390,
        height: 844,
        mobile: true,
    };
    /// A small, older phone.
    pub const SMALL_PHONE: Viewport = Viewport {
        width: 360,
        height: 640,
        mobile: true,
    };
    /// A portrait tablet.
    pub const TABLET: Viewport = Viewport {
        width: 820,
        height: 1180,
        mobile: true,
    };
    /// A laptop screen.
    pub const LAPTOP: Viewport = Viewport {
        width: 1280,
        height: 720,
        mobile: false,
    };
    /// A workshop projector.
    pub const PROJECTOR: Viewport = Viewport {
        width: 1920,
        height: 1080,
        mobile: false,
    };
}

/// A headless Chromium with a fresh profile. Dropping it ends chromedriver and the browser.
pub struct Browser {
    client: Option<Client>,
    driver: Child,
    profile: PathBuf,
    shots: PathBuf,
    console: Mutex<Vec<LogEntry>>,
    requests: Mutex<Vec<String>>,
}

/// One line of the browser's console.
#[derive(Debug, Clone, PartialEq)]
pub struct LogEntry {
    /// chromedriver's level: SEVERE for errors and uncaught exceptions, WARNING, INFO, ...
    pub level: String,
    pub message: String,
}

impl Browser {
    /// Opens phase `i`'s card in the cycle editor, unless it is open already.
    pub async fn open_phase(&self, i: usize) {
        if self.count(&format!("li[data-phase='{i}'].open")).await == 0 {
            self.click(&format!("li[data-phase='{i}'] .phase-head"))
                .await;
        }
        self.wait_for(&format!("li[data-phase='{i}'].open")).await;
    }

    /// Starts chromedriver and a headless Chromium at `viewport`. Screenshots go to
    /// `target/screenshots/<test>/`.
    pub async fn launch(test: &str, viewport: Viewport) -> Browser {
        let chromium = std::env::var("PHASEWISE_CHROMIUM").unwrap_or_else(|_| CHROMIUM.into());
        let chromedriver =
            std::env::var("PHASEWISE_CHROMEDRIVER").unwrap_or_else(|_| CHROMEDRIVER.into());
        assert!(
            Path::new(&chromium).is_file() && Path::new(&chromedriver).is_file(),
            "{chromium} and {chromedriver} are needed: `cargo xtask test` installs them"
        );
        let profile = unique_dir(test);
        std::fs::create_dir_all(&profile).expect("create the browser profile folder");
        let shots = crate::target_dir().join("screenshots").join(test);
        std::fs::create_dir_all(&shots).expect("create the screenshot folder");

        let mut metrics =
            json!({ "width": viewport.width, "height": viewport.height, "pixelRatio": 2.0 });
        if !viewport.mobile {
            metrics["mobile"] = json!(false);
            metrics["touch"] = json!(false);
        }
        let capabilities = json!({
            "browserName": "chrome",
            "goog:loggingPrefs": { "browser": "ALL", "performance": "ALL" },
            "goog:chromeOptions": {
                "binary": chromium,
                "args": crate::tools::CHROMIUM_FLAGS
                    .iter()
                    .map(|f| f.to_string())
                    .chain([format!("--user-data-dir={}", profile.display())])
                    .collect::<Vec<_>>(),
                "mobileEmulation": { "deviceMetrics": metrics },
                "perfLoggingPrefs": { "enableNetwork": true, "enablePage": false },
            },
        });
        let Value::Object(capabilities) = capabilities else {
            unreachable!()
        };
        // A port picked free can be taken by another test's server before chromedriver binds
        // it (chromedriver then listens on IPv6 alone and the session cannot connect): such a
        // start is tried again on a new port, a few times, before the test fails.
        let mut attempt = 0;
        let (client, driver) = loop {
            attempt += 1;
            let (mut driver, port) = start_chromedriver(&chromedriver, &shots);
            match ClientBuilder::new(hyper_util::client::legacy::connect::HttpConnector::new())
                .capabilities(capabilities.clone())
                .connect(&format!("http://127.0.0.1:{port}"))
                .await
            {
                Ok(client) => break (client, driver),
                Err(e) => {
                    let _ = driver.kill();
                    let _ = driver.wait();
                    if attempt == 3 {
                        panic!("chromedriver would not open Chromium ({attempt} tries): {e}");
                    }
                    eprintln!(
                        "chromedriver on port {port} did not answer ({e}); trying a new port"
                    );
                }
            }
        };
        Browser {
            client: Some(client),
            driver,
            profile,
            shots,
            console: Mutex::new(Vec::new()),
            requests: Mutex::new(Vec::new()),
        }
    }

    /// The WebDriver client, for anything the helpers below do not cover.
    pub fn client(&self) -> &Client {
        self.client.as_ref().expect("browser is open")
    }

    pub async fn goto(&self, url: &str) {
        self.client()
            .goto(url)
            .await
            .unwrap_or_else(|e| panic!("cannot open {url}: {e}"));
    }

    /// Waits up to `timeout` for an element to appear; `None` if it does not.
    pub async fn try_wait_for(
        &self,
        css: &str,
        timeout: Duration,
    ) -> Option<fantoccini::elements::Element> {
        self.client()
            .wait()
            .at_most(timeout)
            .every(Duration::from_millis(50))
            .for_element(Locator::Css(css))
            .await
            .ok()
    }

    /// Waits up to ten seconds for an element, and fails the test if it never appears.
    pub async fn wait_for(&self, css: &str) -> fantoccini::elements::Element {
        match self.try_wait_for(css, Duration::from_secs(10)).await {
            Some(element) => element,
            None => {
                let shot = self.screenshot("missing-element").await;
                panic!(
                    "no element matches `{css}` after 10 s (screenshot: {}); console: {:?}",
                    shot.display(),
                    self.console_errors().await
                )
            }
        }
    }

    /// Scrolls an element to the middle of the screen, clear of the sticky bars.
    async fn scroll_to_middle(&self, element: &fantoccini::elements::Element) {
        let arg = serde_json::to_value(element).expect("an element reference serialises");
        let _ = self
            .client()
            .execute("arguments[0].scrollIntoView({block: 'center'});", vec![arg])
            .await;
    }

    /// Scrolls the element to the middle of the screen, as a user would before tapping it
    /// (WebDriver only scrolls what is off screen, not what a sticky bar covers), and taps it.
    pub async fn click(&self, css: &str) {
        let element = self.wait_for(css).await;
        self.scroll_to_middle(&element).await;
        element
            .click()
            .await
            .unwrap_or_else(|e| panic!("cannot click `{css}`: {e}"));
    }

    /// Replaces the text of an input as a user would: select all, delete, type (so every key
    /// fires `input`, the deletion included).
    pub async fn fill(&self, css: &str, text: &str) {
        // WebDriver key codes: Control, "a", release modifiers, Backspace.
        const SELECT_ALL_AND_DELETE: &str = "\u{E009}a\u{E000}\u{E003}";
        let input = self.wait_for(css).await;
        input
            .send_keys(&format!("{SELECT_ALL_AND_DELETE}{text}"))
            .await
            .unwrap_or_else(|e| panic!("cannot type into `{css}`: {e}"));
    }

    /// An input's current value.
    pub async fn value(&self, css: &str) -> String {
        self.wait_for(css)
            .await
            .prop("value")
            .await
            .ok()
            .flatten()
            .unwrap_or_default()
    }

    /// Picks an option of a `<select>` by its value.
    pub async fn choose(&self, css: &str, value: &str) {
        self.wait_for(css)
            .await
            .select_by_value(value)
            .await
            .unwrap_or_else(|e| panic!("cannot choose {value} in `{css}`: {e}"));
    }

    /// How many elements match `css` right now.
    pub async fn count(&self, css: &str) -> usize {
        self.client()
            .find_all(Locator::Css(css))
            .await
            .map(|v| v.len())
            .unwrap_or(0)
    }

    /// Waits up to ten seconds until the text of `css` satisfies `ok`, and returns it.
    pub async fn wait_for_text(&self, css: &str, ok: impl Fn(&str) -> bool) -> String {
        let started = Instant::now();
        loop {
            let text = match self.client().find(Locator::Css(css)).await {
                Ok(element) => element.text().await.unwrap_or_default(),
                Err(_) => String::new(),
            };
            if ok(&text) {
                return text;
            }
            if started.elapsed() > Duration::from_secs(10) {
                let shot = self.screenshot("text-timeout").await;
                panic!(
                    "`{css}` still reads {text:?} after 10 s (screenshot: {})",
                    shot.display()
                );
            }
            tokio::time::sleep(Duration::from_millis(50)).await;
        }
    }

    /// Where this test's screenshots (and any other file kept for a look) go.
    pub fn shots_dir(&self) -> &Path {
        &self.shots
    }

    /// Saves a PNG of one element (scrolled to the middle of the screen) as `target/screenshots/<test>/<name>.png`.
    pub async fn screenshot_of(&self, css: &str, name: &str) -> PathBuf {
        let path = self.shots.join(format!("{name}.png"));
        let element = self.wait_for(css).await;
        self.scroll_to_middle(&element).await;
        match element.screenshot().await {
            Ok(png) => std::fs::write(&path, png).expect("write screenshot"),
            Err(e) => eprintln!("screenshot {name} failed: {e}"),
        }
        path
    }

    /// The visible text of the first element matching `css`.
    pub async fn text(&self, css: &str) -> String {
        self.wait_for(css)
            .await
            .text()
            .await
            .unwrap_or_else(|e| panic!("cannot read `{css}`: {e}"))
    }

    /// Runs JavaScript in the page (`return ...` gives a value back).
    pub async fn eval(&self, script: &str) -> Value {
        self.client()
            .execute(script, vec![])
            .await
            .unwrap_or_else(|e| panic!("script failed: {e}\n{script}"))
    }

    /// The open job as stored by the autosave (the first job entry in local storage), once a
    /// stored copy satisfies `ok`; fails after 5 s.
    pub async fn stored_job_when(&self, ok: impl Fn(&Value) -> bool) -> Value {
        const STORED_JOB: &str = "const k = Object.keys(localStorage).find(k => k.startsWith('phasewise.job.')); return k ? JSON.parse(localStorage.getItem(k)).job : null;";
        for _ in 0..100 {
            let stored = self.eval(STORED_JOB).await;
            if !stored.is_null() && ok(&stored) {
                return stored;
            }
            tokio::time::sleep(Duration::from_millis(50)).await;
        }
        panic!("the job was never saved as expected");
    }

    /// Every visible piece of text whose contrast with what is behind it falls short of WCAG 2.2
    /// AA (success criterion 1.4.3: 4.5:1, or 3:1 for large text: 24 px, or 18.66 px bold),
    /// with the ratio and where it is. Colours are read as computed, blended over every
    /// translucent background and ancestor opacity down to an opaque one; SVG text is read by
    /// its fill. Text over a background image (none in the app) is skipped.
    pub async fn contrast_failures(&self) -> Vec<String> {
        const CHECK: &str = r#"
const parse = c => { const m = c && c.match(/rgba?\(([^)]+)\)/); if (!m) return null;
  const p = m[1].split(',').map(s => parseFloat(s)); return { r: p[0], g: p[1], b: p[2], a: p.length > 3 ? p[3] : 1 }; };
const over = (top, under) => ({ r: top.r * top.a + under.r * (1 - top.a), g: top.g * top.a + under.g * (1 - top.a),
  b: top.b * top.a + under.b * (1 - top.a), a: 1 });
const lum = ({ r, g, b }) => { const f = v => { v /= 255; return v <= 0.04045 ? v / 12.92 : Math.pow((v + 0.055) / 1.055, 2.4); };
  return 0.2126 * f(r) + 0.7152 * f(g) + 0.0722 * f(b); };
const behind = el => { const layers = []; for (let e = el; e; e = e.parentElement) { const s = getComputedStyle(e);
    if (s.backgroundImage !== 'none') return null; const c = parse(s.backgroundColor);
    if (c && c.a > 0) { layers.push(c); if (c.a >= 1) break; } }
  let bg = { r: 255, g: 255, b: 255, a: 1 }; for (let i = layers.length - 1; i >= 0; i--) bg = over(layers[i], bg); return bg; };
const opacity = el => { let o = 1; for (let e = el; e; e = e.parentElement) o *= parseFloat(getComputedStyle(e).opacity); return o; };
const out = [], seen = new Set(), walk = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
while (walk.nextNode()) { const t = walk.currentNode, el = t.parentElement;
  if (!el || !t.textContent.trim() || seen.has(el)) continue; seen.add(el);
  const r = el.getBoundingClientRect(); if (r.width === 0 || r.height === 0) continue;
  const s = getComputedStyle(el); if (s.visibility === 'hidden') continue;
  const svg = el.closest('svg'); let fg = parse(svg ? s.fill : s.color); const bg = behind(svg || el);
  if (!fg || !bg) continue; fg = { ...fg, a: fg.a * opacity(el) }; const f = over(fg, bg);
  const a = lum(f), b = lum(bg), ratio = (Math.max(a, b) + 0.05) / (Math.min(a, b) + 0.05);
  const size = parseFloat(s.fontSize), bold = parseInt(s.fontWeight) >= 700;
  const need = size >= 24 || (bold && size >= 18.66) ? 3 : 4.5;
  if (ratio < need - 0.005) out.push(ratio.toFixed(2) + ' < ' + need + ': "' + t.textContent.trim().slice(0, 40) + '" in ' + el.tagName.toLowerCase() + '.' + String(el.className.baseVal ?? el.className).replace(/ /g, '.')); }
return out;"#;
        match self.eval(CHECK).await {
            Value::Array(items) => items
                .into_iter()
                .map(|v| v.as_str().unwrap_or_default().to_string())
                .collect(),
            other => vec![format!("the check did not run: {other}")],
        }
    }

    /// How far the page reaches past the right edge of the viewport, in CSS pixels (0 when
    /// nothing overflows sideways).
    pub async fn sideways_overflow(&self) -> i64 {
        let value = self
            .eval("const d = document.documentElement; return Math.max(d.scrollWidth, document.body.scrollWidth) - d.clientWidth;")
            .await;
        value
            .as_i64()
            .unwrap_or_else(|| panic!("not a number: {value}"))
    }

    /// The viewport's size as the page sees it.
    pub async fn inner_size(&self) -> (i64, i64) {
        let v = self
            .eval("return [window.innerWidth, window.innerHeight];")
            .await;
        (v[0].as_i64().unwrap_or(-1), v[1].as_i64().unwrap_or(-1))
    }

    /// Saves a PNG of the viewport as `target/screenshots/<test>/<name>.png`.
    pub async fn screenshot(&self, name: &str) -> PathBuf {
        let path = self.shots.join(format!("{name}.png"));
        match self.client().screenshot().await {
            Ok(png) => std::fs::write(&path, png).expect("write screenshot"),
            Err(e) => eprintln!("screenshot {name} failed: {e}"),
        }
        path
    }

    /// Every console line so far (chromedriver hands each over once; they are kept here).
    pub async fn console(&self) -> Vec<LogEntry> {
        let fresh = self
            .client()
            .issue_cmd(BrowserLog { kind: "browser" })
            .await
            .unwrap_or_else(|e| panic!("cannot read the console: {e}"));
        let mut kept = self.console.lock().unwrap();
        for entry in fresh.as_array().into_iter().flatten() {
            kept.push(LogEntry {
                level: entry["level"].as_str().unwrap_or("").to_string(),
                message: entry["message"].as_str().unwrap_or("").to_string(),
            });
        }
        kept.clone()
    }

    /// The address of every request the page has sent so far, in order.
    pub async fn requests(&self) -> Vec<String> {
        let fresh = self
            .client()
            .issue_cmd(BrowserLog {
                kind: "performance",
            })
            .await
            .unwrap_or_else(|e| panic!("cannot read the performance log: {e}"));
        let mut kept = self.requests.lock().unwrap();
        for entry in fresh.as_array().into_iter().flatten() {
            let Some(text) = entry["message"].as_str() else {
                continue;
            };
            let Ok(event) = serde_json::from_str::<Value>(text) else {
                continue;
            };
            if event["message"]["method"] == "Network.requestWillBeSent" {
                if let Some(url) = event["message"]["params"]["request"]["url"].as_str() {
                    kept.push(url.to_string());
                }
            }
        }
        kept.clone()
    }

    /// The console's errors and uncaught exceptions so far.
    pub async fn console_errors(&self) -> Vec<String> {
        self.console()
            .await
            .into_iter()
            .filter(|e| e.level == "SEVERE")
            .map(|e| e.message)
            .collect()
    }

    /// Sends a DevTools Protocol command, e.g. `("Emulation.setCPUThrottlingRate", {"rate": 4})`.
    pub async fn devtools(&self, command: &str, params: Value) -> Value {
        let body = json!({ "cmd": command, "params": params }).to_string();
        self.client()
            .issue_cmd(DevTools { body })
            .await
            .unwrap_or_else(|e| panic!("{command} failed: {e}"))
    }

    /// Lets the page download files, into a fresh folder of this browser's own, and returns it.
    pub async fn allow_downloads(&self) -> PathBuf {
        let folder = self.profile.join("downloads");
        std::fs::create_dir_all(&folder).expect("create the download folder");
        self.devtools(
            "Browser.setDownloadBehavior",
            json!({ "behavior": "allow", "downloadPath": folder.display().to_string() }),
        )
        .await;
        folder
    }

    /// Waits up to ten seconds for a finished download whose name ends with `suffix` in
    /// `folder`; its name and text.
    pub async fn downloaded(&self, folder: &Path, suffix: &str) -> (String, String) {
        let started = Instant::now();
        loop {
            let names: Vec<String> = std::fs::read_dir(folder)
                .map(|d| {
                    d.filter_map(|e| e.ok())
                        .map(|e| e.file_name().to_string_lossy().into_owned())
                        .collect()
                })
                .unwrap_or_default();
            // Chromium writes to a `.crdownload` file and renames it when done.
            let writing = names.iter().any(|n| n.ends_with(".crdownload"));
            if let Some(name) = names
                .iter()
                .find(|n| n.ends_with(suffix))
                .filter(|_| !writing)
            {
                match std::fs::read_to_string(folder.join(name)) {
                    Ok(text) if !text.is_empty() => return (name.clone(), text),
                    _ => {}
                }
            }
            if started.elapsed() > Duration::from_secs(10) {
                panic!("no download ending {suffix} after 10 s; the folder holds {names:?}");
            }
            tokio::time::sleep(Duration::from_millis(100)).await;
        }
    }

    /// Runs asynchronous JavaScript: the script calls `arguments[arguments.length - 1](value)`.
    pub async fn eval_async(&self, script: &str) -> Value {
        self.client()
            .execute_async(script, vec![])
            .await
            .unwrap_or_else(|e| panic!("script failed: {e}\n{script}"))
    }

    /// Ends the session cleanly.
    pub async fn close(mut self) {
        if let Some(client) = self.client.take() {
            let _ = client.close().await;
        }
    }
}

impl Drop for Browser {
    fn drop(&mut self) {
        // End chromedriver's whole process group (Chromium and its helpers with it).
        let _ = Command::new("kill")
            .args(["-KILL", "--", &format!("-{}", self.driver.id())])
            .status();
        let _ = self.driver.kill();
        let _ = self.driver.wait();
        let _ = std::fs::remove_dir_all(&self.profile);
    }
}

/// A Chrome DevTools Protocol command, through chromedriver's `goog/cdp/execute`.
#[derive(Debug)]
struct DevTools {
    body: String,
}

impl WebDriverCompatibleCommand for DevTools {
    fn endpoint(
        &self,
        base: &url::Url,
        session: Option<&str>,
    ) -> Result<url::Url, url::ParseError> {
        base.join(&format!(
            "session/{}/goog/cdp/execute",
            session.unwrap_or_default()
        ))
    }

    fn method_and_body(&self, _: &url::Url) -> (http::Method, Option<String>) {
        (http::Method::POST, Some(self.body.clone()))
    }
}

/// chromedriver's log endpoint (outside the W3C command set, so fantoccini has no method for
/// it): `browser` is the console, `performance` the DevTools events asked for at launch.
#[derive(Debug)]
struct BrowserLog {
    kind: &'static str,
}

impl WebDriverCompatibleCommand for BrowserLog {
    fn endpoint(
        &self,
        base: &url::Url,
        session: Option<&str>,
    ) -> Result<url::Url, url::ParseError> {
        base.join(&format!("session/{}/se/log", session.unwrap_or_default()))
    }

    fn method_and_body(&self, _: &url::Url) -> (http::Method, Option<String>) {
        (
            http::Method::POST,
            Some(json!({ "type": self.kind }).to_string()),
        )
    }
}

/// The release build served on loopback and opened in a fresh browser: the fixture most
/// browser tests start from.
pub struct AppSession {
    pub server: StaticServer,
    pub browser: Browser,
}

impl AppSession {
    /// Serves `dist/`, opens the app at `viewport` and waits until its frame is on screen.
    pub async fn start(test: &str, viewport: Viewport) -> AppSession {
        Self::start_at(test, viewport, "").await
    }

    /// As [`AppSession::start`], opening the app at a fragment such as `#/results`.
    pub async fn start_at(test: &str, viewport: Viewport, fragment: &str) -> AppSession {
        let app = Self::open(test, viewport, &crate::dist_dir(), fragment).await;
        app.wait_until_ready().await;
        app
    }

    /// Serves `folder` and opens it, without waiting for the app (for tests of broken builds).
    pub async fn open(test: &str, viewport: Viewport, folder: &Path, fragment: &str) -> AppSession {
        assert!(
            folder.join("index.html").is_file(),
            "{} has no release build: run `cargo xtask test`, which builds it first",
            folder.display()
        );
        let server = StaticServer::start(folder, "127.0.0.1:0").expect("start the static server");
        let browser = Browser::launch(test, viewport).await;
        browser.goto(&format!("{}{fragment}", server.url())).await;
        AppSession { server, browser }
    }

    /// The page address of an area, e.g. `url("#/jobs")`.
    pub fn url(&self, fragment: &str) -> String {
        format!("{}{fragment}", self.server.url())
    }

    /// Waits until the wasm module has started and drawn the app's frame.
    pub async fn wait_until_ready(&self) {
        self.browser.wait_for(APP_READY).await;
    }

    /// Fails on any console error or any request to another origin, then closes the browser.
    pub async fn finish(self) {
        let errors = self.browser.console_errors().await;
        assert!(
            errors.is_empty(),
            "the browser console has errors: {errors:#?}"
        );
        let foreign = foreign_requests(&self.browser.requests().await, &self.server.url());
        assert!(
            foreign.is_empty(),
            "the page asked other origins: {foreign:#?}"
        );
        self.browser.close().await;
    }
}

/// The requests in `requests` that went anywhere but `own` (the app's address, ending in `/`).
/// Addresses of data the page made itself (`data:`, `blob:`) are not requests to anyone, nor
/// are the browser's own pages (`chrome:`, `chrome-untrusted:`, `about:`: the blank or new tab
/// before the app opens; newer Chromium builds load parts of their new-tab page that way).
pub fn foreign_requests(requests: &[String], own: &str) -> Vec<String> {
    const NOT_A_NETWORK: [&str; 5] = ["data:", "blob:", "chrome:", "chrome-untrusted:", "about:"];
    requests
        .iter()
        .filter(|url| !(url.starts_with(own) || NOT_A_NETWORK.iter().any(|s| url.starts_with(s))))
        .cloned()
        .collect()
}

/// Present once the app has mounted and the area's page is there: the main area carries the
/// current area's name, and is not busy fetching the area's part.
pub const APP_READY: &str = "main[data-area]:not([aria-busy])";

/// Present once the area named `slug` is shown, its part fetched (see [`APP_READY`]).
pub fn area_shown(slug: &str) -> String {
    format!("main[data-area='{slug}']:not([aria-busy])")
}

/// The app's number or text input for a field path of the job file (`cycle[0].cylinder.bore_m`).
pub fn field(path: &str) -> String {
    format!("input[data-path='{path}']")
}

/// A folder under the system temp folder that no other test or run uses.
pub fn unique_dir(label: &str) -> PathBuf {
    static COUNTER: std::sync::atomic::AtomicU32 = std::sync::atomic::AtomicU32::new(0);
    let n = COUNTER.fetch_add(1, std::sync::atomic::Ordering::SeqCst);
    let nanos = std::time::SystemTime::now()
        .duration_since(std::time::UNIX_EPOCH)
        .map(|d| d.subsec_nanos())
        .unwrap_or(0);
    std::env::temp_dir().join(format!(
        "phasewise-{label}-{}-{n}-{nanos}",
        std::process::id()
    ))
}

/// A port nobody listens on right now.
pub fn free_port() -> u16 {
    TcpListener::bind("127.0.0.1:0")
        .and_then(|l| l.local_addr())
        .map(|a| a.port())
        .expect("a free port")
}

/// Starts chromedriver on a free port, its log beside the screenshots (so a failed start can
/// be read after the test), in its own process group (so dropping the browser can end
/// Chromium's helpers too); returns once the port answers.
fn start_chromedriver(chromedriver: &str, shots: &Path) -> (Child, u16) {
    let port = free_port();
    let log =
        std::fs::File::create(shots.join("chromedriver.log")).expect("create chromedriver log");
    let mut command = Command::new(chromedriver);
    command
        .arg(format!("--port={port}"))
        .stdout(Stdio::from(log.try_clone().expect("log handle")))
        .stderr(Stdio::from(log));
    std::os::unix::process::CommandExt::process_group(&mut command, 0);
    let driver = command
        .spawn()
        .unwrap_or_else(|e| panic!("cannot start {chromedriver}: {e}"));
    wait_for_port(port, Duration::from_secs(20));
    (driver, port)
}

fn wait_for_port(port: u16, timeout: Duration) {
    let started = Instant::now();
    while TcpStream::connect(("127.0.0.1", port)).is_err() {
        assert!(
            started.elapsed() < timeout,
            "chromedriver did not listen on port {port} within {timeout:?}"
        );
        std::thread::sleep(Duration::from_millis(50));
    }
}
