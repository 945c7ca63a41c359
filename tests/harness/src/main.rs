//! `cargo xtask`: the project's task runner (the alias is in `.cargo/config.toml`).
//!
//!   cargo xtask serve [--port N] [--no-build]   build the release and serve it on 127.0.0.1
//!   cargo xtask test [-- ARGS]                  every test: native, then the browser tests
//!   cargo xtask build                           the release build into dist/
//!   cargo xtask size [--no-build]               raw and gzip sizes of dist/
//!   cargo xtask setup                           install whatever tool is missing
//!
//! Each command first installs what it needs and is missing (see `tools`).

use phasewise_harness::{build, dist_dir, project_root, server::StaticServer, size, tools};
use std::process::ExitCode;
use std::time::Instant;

const USAGE: &str = "usage: cargo xtask <serve [--port N] [--no-build] | test [-- CARGO-TEST-ARGS] | build | size [--no-build] | setup>";

fn main() -> ExitCode {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let started = Instant::now();
    let result = match args.first().map(String::as_str) {
        Some("serve") => serve(&args[1..]),
        Some("test") => test(&args[1..]),
        Some("build") => release_build().map(|_| ()),
        Some("size") => size_report(&args[1..]),
        Some("setup") => tools::prepare_build(&project_root()).and_then(|_| tools::prepare_browser()),
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
    cargo.current_dir(&root).args(["test", "--workspace", "--no-fail-fast"]);
    if !passthrough.is_empty() {
        cargo.arg("--").args(passthrough);
    }
    let outcome = tools::run(&mut cargo);
    tools::say(&format!("tests took {:.1} s", started.elapsed().as_secs_f64()));
    outcome
}

fn size_report(args: &[String]) -> Result<(), String> {
    if !args.iter().any(|a| a == "--no-build") {
        release_build()?;
    }
    let sizes = size::measure(&dist_dir()).map_err(|e| format!("cannot measure dist/: {e}"))?;
    print!("{}", size::report(&sizes));
    Ok(())
}
