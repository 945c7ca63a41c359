//! The app's frame in a real, headless Chromium: it starts, has no console errors, fits a
//! phone without sideways scrolling, and every area (the safety notes included) is reachable.

use phasewise::ui::area::Area;
use phasewise_harness::browser::{area_shown, AppSession, Viewport, APP_READY};
use std::io::{BufRead, BufReader};
use std::process::{Command, Stdio};
use std::time::Duration;

#[tokio::test]
async fn the_frame_renders_on_a_phone_without_errors_or_sideways_overflow() {
    let app = AppSession::start("frame_on_phone", Viewport::PHONE).await;
    let b = &app.browser;
    assert_eq!(
        b.inner_size().await,
        (390, 844),
        "the phone viewport is emulated exactly"
    );
    assert_eq!(b.text(".shell .brand-name").await, "Phasewise");
    assert_eq!(
        b.client().title().await.unwrap(),
        format!("{} · Phasewise", Area::START.title())
    );
    let nav = b
        .eval("return document.querySelectorAll('nav.areas a').length;")
        .await;
    assert_eq!(nav.as_u64(), Some(Area::NAV.len() as u64));
    // During a normal start the failure sentence was never shown: it is still hidden.
    let failed_shown = b
        .eval("const f = document.querySelector('.boot-failed'); return f ? !f.hidden : 'no sentence';")
        .await;
    assert_eq!(
        failed_shown, false,
        "the failure sentence stays hidden on a normal start"
    );
    // The start-up notice is hidden once the app is up.
    let boot = b
        .eval("return getComputedStyle(document.querySelector('.boot')).display;")
        .await;
    assert_eq!(boot, "none");
    assert_eq!(b.sideways_overflow().await, 0);
    // Every link and button is at least a 48 px touch target.
    let small = b
        .eval(
            "return [...document.querySelectorAll('a, button')].filter(e => { \
               const r = e.getBoundingClientRect(); return r.width > 0 && (r.height < 48 || r.width < 48); \
             }).map(e => e.outerHTML.slice(0, 80));",
        )
        .await;
    assert_eq!(small, serde_json::json!([]), "touch targets under 48 px");
    b.screenshot("start").await;
    app.finish().await;
}

#[tokio::test]
async fn every_area_is_reachable_from_the_navigation_and_safety_from_every_area() {
    let app = AppSession::start("every_area", Viewport::PHONE).await;
    let b = &app.browser;
    for area in Area::NAV {
        b.click(&format!("nav.areas a[href='{}']", area.href()))
            .await;
        b.wait_for(&area_shown(area.slug()))
            .await;
        assert_eq!(b.text("main h1").await, area.title());
        let current = b.eval("return document.querySelector('nav.areas a[aria-current=page]').getAttribute('href');").await;
        assert_eq!(current, area.href().as_str());
        assert_eq!(b.sideways_overflow().await, 0, "{area:?}");
        b.screenshot(area.slug()).await;

        // The safety notes are one tap away from here.
        b.click(&format!(".topbar a[href='{}']", Area::Safety.href()))
            .await;
        b.wait_for("main[data-area='safety']").await;
        assert_eq!(b.text("main h1").await, Area::Safety.title());
        b.client().back().await.unwrap();
        b.wait_for(&area_shown(area.slug()))
            .await;
    }
    b.click(&format!(".topbar a[href='{}']", Area::Safety.href()))
        .await;
    // The count waits for the safety page itself, not only the click.
    b.wait_for("main[data-area='safety'] .caution").await;
    let cautions = b
        .eval("return document.querySelectorAll('.caution').length;")
        .await;
    assert!(
        cautions.as_u64().unwrap_or(0) >= 4,
        "cautions listed: {cautions}"
    );
    assert_eq!(b.sideways_overflow().await, 0);
    b.screenshot("safety").await;
    app.finish().await;
}

#[tokio::test]
async fn a_link_to_an_area_opens_that_area() {
    let app = AppSession::start("deep_links", Viewport::PHONE).await;
    let b = &app.browser;
    let unknown = [(String::from("#/no-such-area"), Area::START)];
    for (fragment, area) in Area::ALL.map(|a| (a.href(), a)).into_iter().chain(unknown) {
        // A fresh load of the address, as when a link or bookmark is opened.
        b.goto(&app.url(&fragment)).await;
        b.client().refresh().await.unwrap();
        b.wait_for(&area_shown(area.slug()))
            .await;
        assert_eq!(b.text("main h1").await, area.title(), "{fragment}");
    }
    app.finish().await;
}

#[tokio::test]
async fn the_layout_holds_from_a_small_phone_to_a_projector() {
    for (name, viewport) in [
        ("small-phone", Viewport::SMALL_PHONE),
        ("tablet", Viewport::TABLET),
        ("laptop", Viewport::LAPTOP),
        ("projector", Viewport::PROJECTOR),
    ] {
        let app = AppSession::start_at("layouts", viewport, &Area::Settings.href()).await;
        let b = &app.browser;
        assert_eq!(
            b.inner_size().await,
            (viewport.width as i64, viewport.height as i64),
            "{name}"
        );
        assert_eq!(b.sideways_overflow().await, 0, "{name}");
        // On a phone the areas sit below the page; from a tablet up, beside it.
        let nav_beside_page = b
            .eval("const n = document.querySelector('nav.areas').getBoundingClientRect(), \
                   m = document.querySelector('main').getBoundingClientRect(); return n.right <= m.left;")
            .await;
        assert_eq!(nav_beside_page, viewport.width >= 768, "{name}");
        // Seven areas across the narrowest phone: every label whole, none cut short.
        let cut = b
            .eval(
                "return [...document.querySelectorAll('.area-label')] \
                   .filter(l => l.scrollWidth > l.clientWidth).map(l => l.textContent);",
            )
            .await;
        assert_eq!(cut, serde_json::json!([]), "{name}: navigation labels cut");
        b.screenshot(name).await;
        app.finish().await;
    }
}

/// The check that guards against a wasm-opt that breaks the module: a build whose wasm does not
/// start must fail the smoke test, with the error in the console.
#[tokio::test]
async fn a_broken_wasm_module_is_caught() {
    let broken = phasewise_harness::browser::unique_dir("broken-dist");
    copy_dir(&phasewise_harness::dist_dir(), &broken);
    let mut corrupted = 0;
    for entry in std::fs::read_dir(&broken).unwrap() {
        let path = entry.unwrap().path();
        // The main module (the parts load only on demand, after the start).
        if path.to_string_lossy().ends_with("_bg.wasm") {
            // A valid header, then garbage: the module fails to compile, as a mis-optimised one fails to start.
            std::fs::write(&path, b"\0asm\x01\0\0\0\x01\xff\xff\xff\xff").unwrap();
            corrupted += 1;
        }
    }
    assert_eq!(corrupted, 1, "the release build ships one main wasm module");
    let app = AppSession::open("broken_module", Viewport::PHONE, &broken, "").await;
    let started = app
        .browser
        .try_wait_for(APP_READY, Duration::from_secs(5))
        .await;
    assert!(
        started.is_none(),
        "a corrupted module must not render the app"
    );
    let errors = app.browser.console_errors().await;
    assert!(
        !errors.is_empty(),
        "the start-up failure must reach the console"
    );
    // ... and the page says so, in place of the loading bar.
    let said = app
        .browser
        .eval("const f = document.querySelector('.boot-failed'); return !!f && !f.hidden && f.getBoundingClientRect().height > 0;")
        .await;
    assert_eq!(
        said, true,
        "the failure sentence shows after a real failure"
    );
    app.browser.screenshot("broken").await;
    app.browser.close().await;
    std::fs::remove_dir_all(&broken).unwrap();
}

/// The README's serve command prints an address; the app must be there.
#[tokio::test]
async fn the_serve_command_serves_the_app_at_the_address_it_prints() {
    let port = phasewise_harness::browser::free_port();
    // --no-build: this run's release build is already in dist/ (and a nested build would wait
    // on the cargo lock that this test run holds).
    let mut serve = KillOnDrop(
        Command::new(env!("CARGO_BIN_EXE_xtask"))
            .args(["serve", "--no-build", "--port", &port.to_string()])
            .stdout(Stdio::piped())
            .stderr(Stdio::null())
            .spawn()
            .unwrap(),
    );
    let mut line = String::new();
    BufReader::new(serve.0.stdout.take().unwrap())
        .read_line(&mut line)
        .unwrap();
    let url = line
        .split_whitespace()
        .find(|w| w.starts_with("http://"))
        .unwrap_or_else(|| panic!("no address in {line:?}"));
    assert_eq!(url, format!("http://127.0.0.1:{port}/"));

    let browser =
        phasewise_harness::browser::Browser::launch("serve_command", Viewport::PHONE).await;
    browser.goto(url).await;
    browser.wait_for(APP_READY).await;
    assert!(browser.console_errors().await.is_empty());
    browser.close().await;
}

/// Ends the serve command however the test ends.
struct KillOnDrop(std::process::Child);

impl Drop for KillOnDrop {
    fn drop(&mut self) {
        let _ = self.0.kill();
        let _ = self.0.wait();
    }
}

fn copy_dir(from: &std::path::Path, to: &std::path::Path) {
    std::fs::create_dir_all(to).unwrap();
    for entry in std::fs::read_dir(from).unwrap() {
        let entry = entry.unwrap();
        let target = to.join(entry.file_name());
        if entry.file_type().unwrap().is_dir() {
            copy_dir(&entry.path(), &target);
        } else {
            std::fs::copy(entry.path(), target).unwrap();
        }
    }
}

/// Opens `area` by its address and waits until the page is its page.
async fn open_area(b: &phasewise_harness::browser::Browser, area: Area) {
    b.eval(&format!("location.hash = '{}'; return null;", area.href()))
        .await;
    let title = format!("{} · Phasewise", area.title());
    for _ in 0..100 {
        if b.client().title().await.unwrap() == title {
            // The area's part, then one more frame for its own content.
            b.wait_for(phasewise_harness::browser::APP_READY).await;
            tokio::time::sleep(Duration::from_millis(150)).await;
            return;
        }
        tokio::time::sleep(Duration::from_millis(50)).await;
    }
    panic!("{area:?} did not open");
}

/// Flips one of the display switches (on the results area) by its label.
async fn flip(b: &phasewise_harness::browser::Browser, label: &str) {
    open_area(b, Area::Results).await;
    let found = b
        .eval(&format!(
            "const t = [...document.querySelectorAll('button.toggle')].find(x => x.textContent === '{label}'); \
             if (t) t.click(); return !!t;"
        ))
        .await;
    assert_eq!(found, true, "the {label} switch");
}

/// Every area, in each display mode (as it comes, high contrast, presenter view), passes WCAG 2.2 AA
/// contrast (success criterion 1.4.3) for every visible piece of text.
#[tokio::test]
async fn every_area_passes_wcag_aa_contrast_in_every_display_mode() {
    let app = AppSession::start_at("contrast", Viewport::LAPTOP, &Area::Results.href()).await;
    let b = &app.browser;
    let mut failures = Vec::new();
    for (mode, switch) in [
        ("as it comes", None),
        ("high contrast", Some("High contrast")),
        ("presenter view", Some("Presenter view")),
    ] {
        if let Some(label) = switch {
            flip(b, label).await;
        }
        for area in Area::ALL {
            open_area(b, area).await;
            for f in b.contrast_failures().await {
                failures.push(format!("{mode}, {}: {f}", area.title()));
            }
        }
        b.screenshot(&mode.replace(' ', "-")).await;
        if let Some(label) = switch {
            flip(b, label).await;
        }
    }
    assert!(failures.is_empty(), "{}", failures.join("\n"));
    app.finish().await;
}

/// ISO 1219-1 draws a hydraulic pump's triangle filled (a hollow one means air): the
/// power-unit area's icon follows it.
#[tokio::test]
async fn the_pump_icon_has_the_filled_triangle_of_a_hydraulic_pump() {
    let app = AppSession::start("pump_icon", Viewport::PHONE).await;
    let b = &app.browser;
    let fill = b
        .eval(&format!(
            "const t = document.querySelector(\"nav.areas a[href='{}'] svg .flow-triangle\"); \
             return t ? getComputedStyle(t).fill : 'no triangle';",
            Area::PowerUnit.href()
        ))
        .await;
    let fill = fill.as_str().unwrap_or_default().to_string();
    assert!(
        fill != "none" && fill != "no triangle" && !fill.contains("rgba(0, 0, 0, 0)"),
        "the triangle's fill: {fill}"
    );
    app.finish().await;
}
