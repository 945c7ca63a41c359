//! The app kept on the device, in headless Chromium: after one visit it starts, and its saved
//! jobs open, with the server gone; a new build is fetched beside the old one and offered;
//! the page's Content Security Policy refuses other origins and stray scripts; the manifest
//! reads cleanly. Every session here (as everywhere, see `AppSession::finish`) also proves the
//! page asked no origin but its own.

use phasewise::ui::area::Area;
use phasewise_harness::browser::{area_shown, foreign_requests, AppSession, Browser, Viewport, APP_READY};
use phasewise_harness::{browser::unique_dir, dist_dir, size::on_demand};
use std::path::Path;
use std::time::Duration;

/// Waits until the service worker is active and controls the page.
async fn wait_until_kept(b: &Browser) {
    let controlled = b
        .eval_async(
            "const done = arguments[arguments.length - 1];
             navigator.serviceWorker.ready.then(() => {
               const check = () => navigator.serviceWorker.controller ? done(true) : setTimeout(check, 50);
               check();
             });",
        )
        .await;
    assert_eq!(controlled, true);
}

fn copy_dir(from: &Path, to: &Path) {
    std::fs::create_dir_all(to).unwrap();
    for entry in std::fs::read_dir(from).unwrap() {
        let path = entry.unwrap().path();
        let target = to.join(path.file_name().unwrap());
        if path.is_dir() {
            copy_dir(&path, &target);
        } else {
            std::fs::copy(&path, &target).unwrap();
        }
    }
}

#[tokio::test]
async fn after_one_visit_the_app_and_its_jobs_start_with_no_server() {
    let mut app = AppSession::start("offline_start", Viewport::PHONE).await;
    wait_until_kept(&app.browser).await;
    let b = &app.browser;
    b.click("nav.areas a[href='#/jobs']").await;
    b.wait_for_text(".offline-note", |t| t.contains("no network"))
        .await;
    b.fill("input[data-path='name']", "Basement press").await;
    b.wait_for_text("[data-save-note]", |t| {
        t.starts_with("Saved on this device")
    })
    .await;

    app.server.stop();
    let address = app.server.addr();
    assert!(
        std::net::TcpStream::connect_timeout(&address, Duration::from_millis(500)).is_err(),
        "the server still answers"
    );
    let b = &app.browser;
    // A real new start: leave the page, then come back to it.
    b.goto("about:blank").await;
    b.goto(&app.url("#/jobs")).await;
    b.wait_for(APP_READY).await;
    assert_eq!(
        b.eval("return navigator.serviceWorker.controller !== null;")
            .await,
        true,
        "the page came from the kept copy"
    );
    b.wait_for_text("li.job-row.current h3", |t| t.contains("Basement press"))
        .await;
    // Opening another area and coming back works from the device alone.
    b.click("nav.areas a[href='#/results']").await;
    b.wait_for("[data-total]").await;
    b.screenshot("results-offline").await;
    // The quote report too, as the sales engineer opens it at the machine.
    b.click("nav.areas a[href='#/quote']").await;
    b.click("[data-action='open-report']").await;
    b.wait_for_text("[data-report-job]", |t| t == "Basement press")
        .await;
    b.wait_for("[data-quote-table='customer']").await;
    b.screenshot("report-offline").await;
    app.finish().await;
}

/// The parts of the build the first screen does without (see `phasewise_harness::split`).
fn parts_in_build() -> Vec<String> {
    let mut parts: Vec<String> = std::fs::read_dir(dist_dir())
        .unwrap()
        .filter_map(|e| e.unwrap().file_name().into_string().ok())
        .filter(|n| n.ends_with(".wasm") && on_demand(Path::new(n)))
        .collect();
    parts.sort();
    parts
}

#[tokio::test]
async fn the_first_screen_fetches_no_part_and_every_part_opens_offline() {
    let parts = parts_in_build();
    assert!(
        parts.iter().any(|p| p.contains("-split_answers")),
        "the build has no on-demand parts: {parts:?}"
    );
    let mut app = AppSession::start("offline_parts", Viewport::PHONE).await;
    let b = &app.browser;
    // The machine cycle, the first screen, is up without any part.
    b.wait_for("[data-live='average']").await;
    let fetched: Vec<String> = b
        .requests()
        .await
        .into_iter()
        .filter(|url| on_demand(Path::new(url.split(['?', '#']).next().unwrap_or(url))))
        .collect();
    assert_eq!(fetched, Vec::<String>::new(), "the first screen fetched parts");
    wait_until_kept(b).await;
    // The worker keeps every part, not only the first screen's.
    let kept = b
        .eval_async(
            "const done = arguments[arguments.length - 1];
             caches.keys().then(names => caches.open(names[0])).then(c => c.keys())
               .then(requests => done(requests.map(r => new URL(r.url).pathname.slice(1)).sort()));",
        )
        .await;
    let kept: Vec<String> = kept
        .as_array()
        .unwrap()
        .iter()
        .filter_map(|v| v.as_str().map(str::to_string))
        .collect();
    for part in &parts {
        assert!(kept.contains(part), "{part} is not kept: {kept:?}");
    }

    app.server.stop();
    let b = &app.browser;
    b.goto("about:blank").await;
    b.goto(&app.url("#/cycle")).await;
    b.wait_for(APP_READY).await;
    // Every area, each from its part, with the server gone.
    for area in Area::ALL {
        b.eval(&format!("location.hash = '{}'; return null;", area.href()))
            .await;
        b.wait_for_text(&format!("{} h1", area_shown(area.slug())), |t| {
            t == area.title()
        })
        .await;
        assert!(
            b.try_wait_for(".part-missing", Duration::from_millis(50))
                .await
                .is_none(),
            "{}",
            area.title()
        );
    }
    b.screenshot("report-offline").await;
    // A shared link, taken in by the jobs part, offline.
    let mut job = phasewise::engine::demo::scrap_baler();
    job.name = "Shed baler".into();
    b.goto(&phasewise::formats::share::link(&app.server.url(), &job))
        .await;
    b.wait_for(APP_READY).await;
    b.wait_for_text("[data-share-note]", |t| t.contains("Shed baler"))
        .await;
    b.wait_for_text("li.job-row.current h3", |t| t.contains("Shed baler"))
        .await;
    app.finish().await;
}

#[tokio::test]
async fn a_part_that_cannot_be_fetched_is_said_so_and_can_be_tried_again() {
    // A build with one part missing, as on a first visit cut off before the worker kept it.
    let site = unique_dir("missing-part");
    copy_dir(&dist_dir(), &site);
    let answers = parts_in_build()
        .into_iter()
        .find(|p| p.contains("-split_answers"))
        .unwrap();
    let aside = unique_dir("missing-part-aside");
    std::fs::create_dir_all(&aside).unwrap();
    let kept_aside = aside.join(&answers);
    std::fs::rename(site.join(&answers), &kept_aside).unwrap();
    let app = AppSession::open("missing_part", Viewport::PHONE, &site, "#/results").await;
    app.wait_until_ready().await;
    let b = &app.browser;
    b.wait_for_text(".part-missing", |t| t.contains("not on this device yet"))
        .await;
    // Which area it is, and a retry a gloved finger can hit.
    assert_eq!(b.text("main h1").await, "Results");
    let height = b
        .eval("return document.querySelector('.part-missing button').getBoundingClientRect().height;")
        .await;
    assert!(height.as_f64().unwrap() >= 48.0, "{height}");
    b.screenshot("part-missing").await;
    // The frame still works: the cycle opens, and the part loads once it is there again.
    b.click("nav.areas a[href='#/cycle']").await;
    b.wait_for("[data-live='average']").await;
    b.click("nav.areas a[href='#/results']").await;
    b.wait_for_text(".part-missing", |t| t.contains("not on this device yet"))
        .await;
    std::fs::rename(&kept_aside, site.join(&answers)).unwrap();
    b.click(".part-missing button").await;
    b.wait_for("[data-total]").await;
    // The failed fetch is a console error by nature, so this session ends without `finish`.
    app.browser.close().await;
    let _ = std::fs::remove_dir_all(&site);
    let _ = std::fs::remove_dir_all(&aside);
}

#[tokio::test]
async fn a_new_build_is_fetched_beside_the_old_and_offered() {
    let site = unique_dir("next-build");
    copy_dir(&dist_dir(), &site);
    let app = AppSession::open("next_build", Viewport::PHONE, &site, "").await;
    app.wait_until_ready().await;
    let b = &app.browser;
    wait_until_kept(b).await;
    let first = b
        .eval_async("const done = arguments[arguments.length - 1]; caches.keys().then(done);")
        .await;
    assert_eq!(first.as_array().map(Vec::len), Some(1), "{first}");
    assert!(b
        .try_wait_for(".newer-version", Duration::from_millis(300))
        .await
        .is_none());

    // The next build: its worker differs (its cache version is new).
    let worker = site.join("service-worker.js");
    let text = std::fs::read_to_string(&worker).unwrap();
    let version = first[0].as_str().unwrap().trim_start_matches("phasewise-");
    std::fs::write(&worker, text.replace(version, "next-build")).unwrap();
    b.eval_async(
        "const done = arguments[arguments.length - 1];
         navigator.serviceWorker.getRegistration().then(r => r.update()).then(() => done(true));",
    )
    .await;
    b.wait_for_text(".newer-version", |t| t.contains("newer version"))
        .await;
    b.screenshot("newer-version").await;
    b.eval("window.oldPage = true;").await;
    b.click(".newer-version .button.primary").await;
    // The old page goes: a new one, under the new worker, takes its place.
    let mut reloaded = false;
    for _ in 0..100 {
        tokio::time::sleep(Duration::from_millis(100)).await;
        if let Ok(v) = b
            .client()
            .execute("return window.oldPage === undefined;", vec![])
            .await
        {
            if v == true {
                reloaded = true;
                break;
            }
        }
    }
    assert!(reloaded, "the page did not reload");
    // The page reloads under the new worker, and the old cache is gone. Asked again and again
    // from here, since the reload ends any script still running in the page.
    let wanted = serde_json::json!(["phasewise-next-build"]);
    let mut caches = serde_json::Value::Null;
    for _ in 0..100 {
        tokio::time::sleep(Duration::from_millis(100)).await;
        let asked = b
            .client()
            .execute_async(
                "const done = arguments[arguments.length - 1]; caches.keys().then(done);",
                vec![],
            )
            .await;
        if let Ok(keys) = asked {
            caches = keys;
            if caches == wanted {
                break;
            }
        }
    }
    assert_eq!(caches, wanted);
    b.wait_for(APP_READY).await;
    assert!(b
        .try_wait_for(".newer-version", Duration::from_millis(300))
        .await
        .is_none());
    app.finish().await;
    let _ = std::fs::remove_dir_all(&site);
}

#[tokio::test]
async fn the_policy_refuses_other_origins_and_stray_scripts() {
    let app = AppSession::start("content_policy", Viewport::PHONE).await;
    let b = &app.browser;
    let refused = b
        .eval_async(
            "const done = arguments[arguments.length - 1];
             const seen = [];
             document.addEventListener('securitypolicyviolation', e => seen.push(e.effectiveDirective));
             const s = document.createElement('script');
             s.textContent = 'window.strayRan = true;';
             document.head.appendChild(s);
             fetch('http://127.0.0.2:9/elsewhere').catch(() => {}).finally(() =>
               setTimeout(() => done({ seen, strayRan: window.strayRan === true }), 200));",
        )
        .await;
    assert_eq!(refused["strayRan"], false, "{refused}");
    let seen: Vec<&str> = refused["seen"]
        .as_array()
        .unwrap()
        .iter()
        .filter_map(|v| v.as_str())
        .collect();
    assert!(seen.contains(&"script-src-elem"), "{refused}");
    assert!(seen.contains(&"connect-src"), "{refused}");
    // The refused fetch never left the page.
    let requests = b.requests().await;
    assert_eq!(
        foreign_requests(&requests, &app.server.url()),
        Vec::<String>::new()
    );
    // The refusals are console errors on purpose, so this session ends without `finish`.
    app.browser.close().await;
}

#[tokio::test]
async fn the_manifest_reads_cleanly_and_its_icons_load() {
    let app = AppSession::start("manifest", Viewport::PHONE).await;
    let b = &app.browser;
    let manifest = b
        .devtools("Page.getAppManifest", serde_json::json!({}))
        .await;
    assert_eq!(manifest["errors"], serde_json::json!([]), "{manifest}");
    let parsed: serde_json::Value =
        serde_json::from_str(manifest["data"].as_str().unwrap()).unwrap();
    assert_eq!(parsed["display"], "standalone");
    assert_eq!(parsed["short_name"], "Phasewise");
    let loaded = b
        .eval_async(
            "const done = arguments[arguments.length - 1];
             fetch('/public/manifest.webmanifest').then(r => r.json()).then(m =>
               Promise.all(m.icons.map(i => fetch(new URL(i.src, location.origin + '/public/')).then(r => r.ok && r.headers.get('content-type') === i.type))))
               .then(done);",
        )
        .await;
    assert_eq!(loaded, serde_json::json!([true, true, true, true]));
    app.finish().await;
}
