//! `cargo xtask`: the project's task runner (the alias is in `.cargo/config.toml`).
//!
//!   cargo xtask serve [--port N] [--no-build]   build the release and serve it on 127.0.0.1
//!   cargo xtask test [-- ARGS]                  every test: native, then the browser tests
//!   cargo xtask build                           the release build into dist/
//!   cargo xtask size [--no-build | --profiles]  raw and gzip sizes of dist/, or of each release-profile variant
//!   cargo xtask size --counter                  the app's bundle against a plain Leptos counter, same profile
//!   cargo xtask latency [--no-build]            time from an edit to updated figures in Chromium, 1x and 4x CPU
//!   cargo xtask lighthouse [--no-build] [--rounds N]  Lighthouse (mobile) on the app and the counter, side by side
//!   cargo xtask smoke URL                       open a served Phasewise in headless Chromium and check it starts
//!   cargo xtask setup                           install whatever tool is missing
//!   cargo xtask seal [DIR]                      Trunk's post-build hook: service worker and CSP
//!
//! Each command first installs what it needs and is missing (see `tools`).

use phasewise_harness::{build, dist_dir, project_root, server::StaticServer, size, tools};
use std::process::ExitCode;
use std::time::Instant;

const USAGE: &str = "usage: cargo xtask <serve [--port N] [--no-build] | test [-- CARGO-TEST-ARGS] | build | size [--no-build | --profiles] | size --counter | latency [--no-build] | lighthouse [--no-build] [--rounds N] | smoke URL | setup>";

fn main() -> ExitCode {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let started = Instant::now();
    let result = match args.first().map(String::as_str) {
        Some("serve") => serve(&args[1..]),
        Some("test") => test(&args[1..]),
        Some("build") => release_build().map(|_| ()),
        Some("size") => size_report(&args[1..]),
        Some("smoke") => smoke(&args[1..]),
        Some("latency") => latency(&args[1..]),
        Some("lighthouse") => lighthouse(&args[1..]),
        Some("seal") => seal(&args[1..]),
        Some("setup") => {
            tools::prepare_build(&project_root()).and_then(|_| tools::prepare_browser())
        }
        _ => Err(USAGE.to_string()),
    };
    match result {
        Ok(()) => {
            tools::say(&format!("done in {:.1} s", started.elapsed().as_secs_f64()));
            ExitCode::SUCCESS
        }
        Err(message) => {
            eprintln!("[xtask] error: {message}");
            ExitCode::FAILURE
        }
    }
}

/// Trunk's post-build hook: seals the staged build (Trunk names it in TRUNK_STAGING_DIR).
fn seal(args: &[String]) -> Result<(), String> {
    let dir = args
        .first()
        .map(std::path::PathBuf::from)
        .or_else(|| std::env::var_os("TRUNK_STAGING_DIR").map(Into::into))
        .ok_or("seal needs the build folder: as an argument, or TRUNK_STAGING_DIR from Trunk")?;
    // Split first: the worker must list the parts, and the policy is written once.
    let profile = std::env::var("TRUNK_PROFILE").unwrap_or_else(|_| "release".into());
    let target = phasewise_harness::target_dir();
    let raw_dir = target.join(tools::WASM_TARGET).join(&profile);
    let build_tools = tools::BuildTools::search_path()?;
    if let Some(split) = phasewise_harness::split::split(
        &build_tools,
        &dir,
        &raw_dir,
        &target.join("wasm-split"),
        profile == "release",
    )? {
        tools::say(&format!(
            "split the module: {} for the first screen, {} on demand: {}",
            split.main,
            split.parts.len(),
            split.parts.join(", ")
        ));
    }
    let template = project_root().join("src/offline/service-worker.js");
    let sealed = phasewise_harness::offline::seal(&dir, &template)?;
    tools::say(&format!(
        "sealed the build: content security policy in index.html; service worker version {} precaches {} files, {}",
        sealed.version,
        sealed.files.len(),
        size::human(sealed.total_bytes())
    ));
    Ok(())
}

fn release_build() -> Result<tools::BuildTools, String> {
    let root = project_root();
    let tools = tools::prepare_build(&root)?;
    build::release(&tools, &root)?;
    Ok(tools)
}

fn serve(args: &[String]) -> Result<(), String> {
    let mut port: u16 = 8080;
    let mut build = true;
    let mut rest = args.iter();
    while let Some(arg) = rest.next() {
        match arg.as_str() {
            "--port" => {
                port = rest
                    .next()
                    .and_then(|p| p.parse().ok())
                    .ok_or("--port needs a port number, e.g. --port 8080")?
            }
            "--no-build" => build = false,
            other => return Err(format!("serve does not take `{other}`\n{USAGE}")),
        }
    }
    if build {
        release_build()?;
    }
    let server = StaticServer::start(dist_dir(), ("127.0.0.1", port)).map_err(|e| {
        format!("cannot serve dist/ on 127.0.0.1:{port}: {e} (another server there? try --port)")
    })?;
    // The one line a user (and the serve test) looks for.
    println!("Phasewise is served at {} (Ctrl-C stops it)", server.url());
    server.wait();
    Ok(())
}

fn test(args: &[String]) -> Result<(), String> {
    let root = project_root();
    let passthrough: Vec<&String> = args.iter().skip_while(|a| *a != "--").skip(1).collect();
    let tools = release_build()?;
    tools::prepare_browser()?;
    let started = Instant::now();
    // One cargo invocation for the native and the browser tests, sharing one target folder.
    let mut cargo = tools.command("cargo");
    cargo
        .current_dir(&root)
        .args(["test", "--workspace", "--no-fail-fast"]);
    if !passthrough.is_empty() {
        cargo.arg("--").args(passthrough);
    }
    let outcome = tools::run(&mut cargo);
    tools::say(&format!(
        "tests took {:.1} s",
        started.elapsed().as_secs_f64()
    ));
    outcome
}

fn size_report(args: &[String]) -> Result<(), String> {
    if args.iter().any(|a| a == "--profiles") {
        return profile_sizes();
    }
    if args.iter().any(|a| a == "--counter") {
        return counter_comparison();
    }
    if !args.iter().any(|a| a == "--no-build") {
        release_build()?;
    }
    let sizes = size::measure(&dist_dir()).map_err(|e| format!("cannot measure dist/: {e}"))?;
    print!("{}", size::report(&sizes));
    if let Some(raw) = size::before_wasm_opt(&phasewise_harness::target_dir()) {
        println!(
            "{:<44} {:>22} {:>22}",
            "wasm before wasm-opt",
            size::human(raw.raw),
            size::human(raw.gzip)
        );
    }
    Ok(())
}

/// Builds the release once per profile variant (each changes one setting of the profile in
/// Cargo.toml) and prints the wasm sizes, so every setting's worth is measured.
/// About a minute and a half a variant on two cores.
fn profile_sizes() -> Result<(), String> {
    const VARIANTS: [(&str, &[(&str, &str)]); 7] = [
        ("chosen: z, fat LTO, 1 codegen unit", &[]),
        ("opt-level = \"s\"", &[("OPT_LEVEL", "s")]),
        ("opt-level = 3", &[("OPT_LEVEL", "3")]),
        ("lto = \"thin\"", &[("LTO", "thin")]),
        ("lto = false", &[("LTO", "false")]),
        ("codegen-units = 16", &[("CODEGEN_UNITS", "16")]),
        ("panic = \"abort\"", &[("PANIC", "abort")]),
    ];
    let root = project_root();
    let tools = tools::prepare_build(&root)?;
    let out_root = phasewise_harness::target_dir().join("profile-sizes");
    let mut rows = Vec::new();
    for (i, (name, overrides)) in VARIANTS.iter().enumerate() {
        let dist = out_root.join(i.to_string());
        let mut trunk = tools.command("trunk");
        trunk
            .args(["build", "--release", "--offline", "--dist"])
            .arg(&dist)
            .current_dir(&root);
        for (key, value) in *overrides {
            trunk.env(format!("CARGO_PROFILE_RELEASE_{key}"), value);
        }
        tools::run(&mut trunk)?;
        let wasm = size::measure(&dist)
            .map_err(|e| format!("cannot measure {}: {e}", dist.display()))?
            .into_iter()
            .find(|f| f.kind == "wasm")
            .ok_or("the build has no wasm file")?;
        let before = size::before_wasm_opt(&phasewise_harness::target_dir())
            .ok_or("no wasm-bindgen output")?;
        rows.push(format!(
            "| {name} | {} | {} | {} | {} |",
            before.raw, before.gzip, wasm.raw, wasm.gzip
        ));
    }
    println!("| profile | wasm raw, no wasm-opt | gzip, no wasm-opt | wasm raw, wasm-opt -Oz | gzip, wasm-opt -Oz |");
    println!("|---|---|---|---|---|");
    for row in rows {
        println!("{row}");
    }
    Ok(())
}

/// Checks a Phasewise served anywhere (this machine's serve command, or a static host after a
/// release): at phone size the app must start with no console error and no sideways overflow.
fn smoke(args: &[String]) -> Result<(), String> {
    use phasewise_harness::browser::{Browser, Viewport, APP_READY};
    let url = args
        .first()
        .ok_or("smoke needs the address to check, e.g. http://127.0.0.1:8080/")?;
    tools::prepare_browser()?;
    let runtime = tokio::runtime::Builder::new_current_thread()
        .enable_all()
        .build()
        .map_err(|e| format!("cannot start the async runtime: {e}"))?;
    runtime.block_on(async {
        let browser = Browser::launch("smoke", Viewport::PHONE).await;
        browser.goto(url).await;
        let ready = browser.try_wait_for(APP_READY, std::time::Duration::from_secs(15)).await.is_some();
        let shot = browser.screenshot("phone").await;
        let errors = browser.console_errors().await;
        let overflow = if ready { browser.sideways_overflow().await } else { 0 };
        browser.close().await;
        tools::say(&format!("screenshot: {}", shot.display()));
        match (ready, errors.is_empty(), overflow) {
            (true, true, 0) => {
                println!("{url}: Phasewise started, no console errors, no sideways overflow at 390x844");
                Ok(())
            }
            _ => Err(format!(
                "{url}: started: {ready}; console errors: {errors:?}; sideways overflow: {overflow} px"
            )),
        }
    })
}

/// Where the counter's release build goes.
fn counter_dist() -> std::path::PathBuf {
    phasewise_harness::target_dir().join("counter-dist")
}

/// Builds the plain Leptos counter with the app's release profile into [`counter_dist`].
fn counter_build(tools: &tools::BuildTools) -> Result<(), String> {
    let root = project_root();
    tools::run(
        tools
            .command("trunk")
            // The target first: `--offline` takes an optional value and would swallow it.
            .args([
                "build",
                "tests/counter/index.html",
                "--release",
                "--offline",
                "--dist",
            ])
            .arg(counter_dist())
            .current_dir(&root),
    )
}

/// Builds the app and a plain Leptos counter with the same release profile, in one run, and
/// prints what each ships (wasm + js + css, raw and gzip): the app's first screen (without the
/// parts loaded on demand) and every part, each against the counter.
fn counter_comparison() -> Result<(), String> {
    let tools = release_build()?;
    counter_build(&tools)?;
    let counter_dist = counter_dist();
    let measure = |dir: &std::path::Path| {
        size::measure(dir).map_err(|e| format!("cannot measure {}: {e}", dir.display()))
    };
    let (app, counter) = (measure(&dist_dir())?, measure(&counter_dist)?);
    let row = |name: &str, (raw, gzip): (u64, u64)| {
        println!("{name:<44} {:>22} {:>22}", size::human(raw), size::human(gzip))
    };
    let ratio = |name: &str, (a_raw, a_gz): (u64, u64), (c_raw, c_gz): (u64, u64)| {
        println!(
            "{name:<44} {:>22} {:>22}",
            format!("{:.2}x", a_raw as f64 / c_raw as f64),
            format!("{:.2}x", a_gz as f64 / c_gz as f64)
        )
    };
    println!("{:<44} {:>22} {:>22}", "wasm + js + css", "raw", "gzip");
    let first = (size::first_screen(&app), size::first_screen(&counter));
    let all = (size::code_and_style(&app), size::code_and_style(&counter));
    row("Phasewise, first screen", first.0);
    row("Phasewise, every part", all.0);
    row("plain Leptos counter", first.1);
    ratio("first screen against the counter", first.0, first.1);
    ratio("every part against the counter", all.0, all.1);
    Ok(())
}

/// Lighthouse's mobile preset on the app and on the counter, served by one server process,
/// alternating for `--rounds` rounds (default 3); prints every run and the medians.
fn lighthouse(args: &[String]) -> Result<(), String> {
    use phasewise_harness::lighthouse::{self, Figures};
    let rounds: usize = match args.iter().position(|a| a == "--rounds") {
        Some(i) => args
            .get(i + 1)
            .and_then(|n| n.parse().ok())
            .filter(|n| *n > 0)
            .ok_or("--rounds needs a whole number above 0, e.g. --rounds 3")?,
        None => 3,
    };
    if !args.iter().any(|a| a == "--no-build") {
        let tools = release_build()?;
        counter_build(&tools)?;
    }
    tools::prepare_browser()?;
    let program = lighthouse::prepare()?;
    let app = StaticServer::start(dist_dir(), "127.0.0.1:0")
        .map_err(|e| format!("cannot serve dist/: {e}"))?;
    let counter = StaticServer::start(counter_dist(), "127.0.0.1:0")
        .map_err(|e| format!("cannot serve the counter (build it first): {e}"))?;
    let reports = phasewise_harness::target_dir().join("lighthouse");
    std::fs::create_dir_all(&reports).map_err(|e| format!("cannot create {}: {e}", reports.display()))?;
    let sites = [("Phasewise", app.url()), ("plain Leptos counter", counter.url())];
    let mut runs: Vec<Vec<Figures>> = vec![Vec::new(); sites.len()];
    println!("{}", lighthouse::heading());
    for round in 1..=rounds {
        for ((name, url), runs) in sites.iter().zip(runs.iter_mut()) {
            let slug = name.split(' ').next_back().unwrap_or(name).to_lowercase();
            let report = reports.join(format!("{slug}-{round}.json"));
            let figures = lighthouse::run(&program, url, &report)?;
            println!("{}", figures.row(&format!("{name}, round {round}")));
            runs.push(figures);
        }
    }
    println!("{}", "-".repeat(85));
    for ((name, _), runs) in sites.iter().zip(&runs) {
        if let Some(median) = Figures::median(runs) {
            println!("{}", median.row(&format!("{name}, median")));
        }
    }
    tools::say(&format!("the JSON reports are in {}", reports.display()));
    Ok(())
}

/// Times edits in headless Chromium at phone size: a load typed into the cycle area, until the
/// live figures above it change. Prints median, 90th percentile and worst, unthrottled and with
/// the CPU slowed 4x through the DevTools protocol.
fn latency(args: &[String]) -> Result<(), String> {
    use phasewise_harness::browser::{Browser, Viewport, APP_READY};
    if !args.iter().any(|a| a == "--no-build") {
        release_build()?;
    }
    tools::prepare_browser()?;
    let server = StaticServer::start(dist_dir(), "127.0.0.1:0")
        .map_err(|e| format!("cannot serve dist/: {e}"))?;
    let runtime = tokio::runtime::Builder::new_current_thread()
        .enable_all()
        .build()
        .map_err(|e| format!("cannot start the async runtime: {e}"))?;
    runtime.block_on(async {
        let b = Browser::launch("latency", Viewport::PHONE).await;
        b.goto(&server.url()).await;
        b.wait_for(APP_READY).await;
        b.click("li[data-phase='1'] .phase-head").await;
        b.wait_for("input[data-path='cycle[1].load.force_n']").await;
        for rate in [1, 4] {
            b.devtools("Emulation.setCPUThrottlingRate", serde_json::json!({ "rate": rate })).await;
            let times = b.eval_async(EDIT_TIMING).await;
            let mut times: Vec<f64> = times.as_array().into_iter().flatten().filter_map(|t| t.as_f64()).collect();
            if times.is_empty() {
                return Err(format!("no timings came back: {times:?}"));
            }
            times.sort_by(f64::total_cmp);
            let at = |q: f64| times[((times.len() - 1) as f64 * q).round() as usize];
            println!(
                "edit to updated figures, CPU {rate}x slower: median {:.2} ms, 90th percentile {:.2} ms, worst {:.2} ms ({} edits)",
                at(0.5),
                at(0.9),
                at(1.0),
                times.len()
            );
        }
        b.close().await;
        Ok(())
    })
}

/// Types 40 alternating loads and times each until the live average power changes.
const EDIT_TIMING: &str = r#"
const done = arguments[arguments.length - 1];
const input = document.querySelector("input[data-path='cycle[1].load.force_n']");
const times = [];
(async () => {
  for (let k = 0; k < 40; k++) {
    const target = document.querySelector("[data-live='average']");
    const before = target.textContent;
    const t0 = performance.now();
    await new Promise((resolve) => {
      const observer = new MutationObserver(() => {
        if (document.querySelector("[data-live='average']").textContent !== before) { observer.disconnect(); resolve(); }
      });
      observer.observe(document.querySelector(".live-summary").parentNode, { subtree: true, childList: true, characterData: true });
      input.value = k % 2 ? "300" : "250";
      input.dispatchEvent(new Event("input", { bubbles: true }));
    });
    times.push(performance.now() - t0);
    await new Promise((r) => setTimeout(r, 20));
  }
  done(times);
})();
"#;
