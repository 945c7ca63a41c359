//! Jobs kept on the device, in headless Chromium: a change is saved and survives a reload; a
//! damaged entry is kept, reported and offered as a file while the rest opens; a full storage
//! says so and keeps the last good copy; so does a field left holding no number.

use phasewise_harness::browser::{AppSession, Browser, Viewport, APP_READY};

async fn reload(b: &Browser) {
    b.client().refresh().await.unwrap();
    b.wait_for(APP_READY).await;
}

async fn rename_open_job(b: &Browser, name: &str) {
    b.click("nav.areas a[href='#/jobs']").await;
    b.fill("input[data-path='name']", name).await;
    b.wait_for_text("[data-save-note]", |t| {
        t.starts_with("Saved on this device")
    })
    .await;
}

#[tokio::test]
async fn a_saved_job_survives_a_reload_unchanged() {
    let app = AppSession::start("save_reload", Viewport::PHONE).await;
    let b = &app.browser;
    b.click("nav.areas a[href='#/jobs']").await;
    assert!(b
        .text("[data-save-note]")
        .await
        .starts_with("Not saved yet"));
    rename_open_job(b, "Baler, north bay").await;
    let stored = b
        .eval(
            "return Object.keys(localStorage).filter(k => k.startsWith('phasewise.job.')).length;",
        )
        .await;
    assert_eq!(stored, 1);
    let before = b.eval("const k = Object.keys(localStorage).find(k => k.startsWith('phasewise.job.')); return JSON.parse(localStorage.getItem(k)).job;").await;
    reload(b).await;
    b.click("nav.areas a[href='#/jobs']").await;
    assert_eq!(b.value("input[data-path='name']").await, "Baler, north bay");
    assert!(b
        .text("li.job-row.current h3")
        .await
        .contains("Baler, north bay"));
    // Opening it saved nothing new: the stored job is what was saved.
    let after = b.eval("const k = Object.keys(localStorage).find(k => k.startsWith('phasewise.job.')); return JSON.parse(localStorage.getItem(k)).job;").await;
    assert_eq!(before, after);
    b.screenshot("jobs").await;
    app.finish().await;
}

#[tokio::test]
async fn a_damaged_entry_is_kept_and_reported_while_the_rest_opens() {
    let app = AppSession::start("damaged_entry", Viewport::PHONE).await;
    let b = &app.browser;
    rename_open_job(b, "Good job").await;
    b.eval("localStorage.setItem('phasewise.job.zz-broken', '{\"format\":\"phasewise-saved-job\", oops');").await;
    reload(b).await;
    b.click("nav.areas a[href='#/jobs']").await;
    b.wait_for("li[data-damaged='zz-broken']").await;
    assert!(b
        .text("li[data-damaged='zz-broken']")
        .await
        .contains("kept unchanged"));
    assert_eq!(b.value("input[data-path='name']").await, "Good job");
    // Another edit saves the good job and leaves the damaged text exactly as it was.
    rename_open_job(b, "Good job, edited").await;
    let kept = b
        .eval("return localStorage.getItem('phasewise.job.zz-broken');")
        .await;
    assert_eq!(kept, "{\"format\":\"phasewise-saved-job\", oops");
    b.click("li[data-damaged='zz-broken'] .button").await;
    b.screenshot("damaged").await;
    app.finish().await;
}

#[tokio::test]
async fn a_field_holding_no_number_keeps_the_last_good_copy() {
    let app = AppSession::start("half_typed", Viewport::PHONE).await;
    let b = &app.browser;
    rename_open_job(b, "Saved before the slip").await;
    let stored = "const k = Object.keys(localStorage).find(k => k.startsWith('phasewise.job.')); return localStorage.getItem(k);";
    let before = b.eval(stored).await;
    b.click("nav.areas a[href='#/settings']").await;
    let field = "input[data-path='staging.cycle_time_target_s']";
    b.fill(field, "a minute").await;
    b.wait_for_text("#f-staging-cycle_time_target_s-error", |t| !t.is_empty())
        .await;
    b.click("nav.areas a[href='#/jobs']").await;
    b.wait_for_text("[data-save-note]", |t| {
        t.contains("a field holds no number yet")
    })
    .await;
    assert_eq!(b.eval(stored).await, before, "the stored copy is untouched");
    reload(b).await;
    b.click("nav.areas a[href='#/jobs']").await;
    assert_eq!(
        b.value("input[data-path='name']").await,
        "Saved before the slip"
    );
    assert_eq!(
        b.count("li.job-row.damaged").await,
        0,
        "nothing reads as damaged"
    );
    app.finish().await;
}

#[tokio::test]
async fn a_full_storage_says_so_and_keeps_the_last_good_copy() {
    let app = AppSession::start("quota", Viewport::PHONE).await;
    let b = &app.browser;
    rename_open_job(b, "Before the storage filled").await;
    // Fill the storage with other data until the browser refuses more.
    b.eval(
        "let n = 0; \
         for (const size of [256 * 1024, 1024, 32, 1]) { \
           const chunk = 'x'.repeat(size); \
           try { for (;;) { localStorage.setItem('f' + n, chunk); n++; } } catch (e) {} \
         } \
         return n;",
    )
    .await;
    b.fill(
        "input[data-path='name']",
        "After the storage filled, with a much longer name than before",
    )
    .await;
    b.wait_for_text("[data-save-note]", |t| {
        t.contains("storage for Phasewise is full")
    })
    .await;
    b.screenshot("full").await;
    reload(b).await;
    b.click("nav.areas a[href='#/jobs']").await;
    assert_eq!(
        b.value("input[data-path='name']").await,
        "Before the storage filled"
    );
    app.finish().await;
}

#[tokio::test]
async fn a_change_in_another_window_is_noticed_and_not_overwritten() {
    let app = AppSession::start("two_windows", Viewport::PHONE).await;
    let b = &app.browser;
    rename_open_job(b, "Shared job").await;
    let first = b.client().window().await.unwrap();
    let second = b.client().new_window(true).await.unwrap();
    b.client().switch_to_window(second.handle).await.unwrap();
    b.goto(&app.url("#/jobs")).await;
    b.wait_for(APP_READY).await;
    b.fill("input[data-path='name']", "Changed in the second window")
        .await;
    b.wait_for_text("[data-save-note]", |t| {
        t.starts_with("Saved on this device")
    })
    .await;
    b.client().switch_to_window(first).await.unwrap();
    b.wait_for_text("[data-save-note]", |t| {
        t.contains("changed in another window")
    })
    .await;
    // Typing here now does not overwrite the other window's save.
    b.fill("input[data-path='name']", "Typed in the first window")
        .await;
    tokio::time::sleep(std::time::Duration::from_millis(800)).await;
    let stored = b.eval("const k = Object.keys(localStorage).find(k => k.startsWith('phasewise.job.')); return JSON.parse(localStorage.getItem(k)).job.name;").await;
    assert_eq!(stored, "Changed in the second window");
    b.screenshot("conflict").await;
    // Taking the other version ends the conflict.
    b.click(".conflict .button:nth-child(1)").await;
    b.wait_for_text("[data-save-note]", |t| {
        t.starts_with("Saved on this device")
    })
    .await;
    assert_eq!(
        b.value("input[data-path='name']").await,
        "Changed in the second window"
    );
    app.finish().await;
}

/// Writes `text` to a file of the test's own and returns its path.
fn temp_file(name: &str, text: &[u8]) -> String {
    let dir = phasewise_harness::browser::unique_dir("import");
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join(name);
    std::fs::write(&path, text).unwrap();
    path.display().to_string()
}

#[tokio::test]
async fn an_import_adds_its_jobs_beside_same_named_ones_and_a_bad_file_changes_nothing() {
    let app = AppSession::start("import", Viewport::PHONE).await;
    let b = &app.browser;
    rename_open_job(b, "Baler").await;
    let mut second = phasewise::engine::demo::scrap_baler();
    second.name = "Baler".into();
    let third = phasewise::engine::demo::scrap_baler();
    let file = temp_file(
        "two.json",
        phasewise::formats::library::export_all(&[&second, &third]).as_bytes(),
    );
    let stored =
        "return Object.keys(localStorage).filter(k => k.startsWith('phasewise.job.')).length;";
    b.wait_for("#import-file")
        .await
        .send_keys(&file)
        .await
        .unwrap();
    b.wait_for_text("[data-import-note]", |t| t == "Imported 2 jobs.")
        .await;
    assert_eq!(b.eval(stored).await, 3);
    let names = b.eval("return [...document.querySelectorAll('li.job-row h3')].map(h => h.textContent).sort();").await;
    assert_eq!(
        names,
        serde_json::json!(["Baler", "Baler (2)", "Scrap baler (example)"])
    );
    for (name, bytes, says) in [
        (
            "broken.json",
            b"{\"format\": \"phasewise-jobs\", \"jobs\": [" as &[u8],
            "not JSON",
        ),
        (
            "other.json",
            b"{\"hello\": \"world\"}",
            "not a Phasewise job file",
        ),
        ("picture.png", b"\x89PNG\r\n\x1a\n\0\0\0\rIHDR", "not JSON"),
    ] {
        let path = temp_file(name, bytes);
        b.wait_for("#import-file")
            .await
            .send_keys(&path)
            .await
            .unwrap();
        b.wait_for_text("[data-import-note]", |t| {
            t.starts_with("Nothing imported") && t.contains(says)
        })
        .await;
        assert_eq!(b.eval(stored).await, 3, "{name} changed nothing");
    }
    let big = temp_file("big.json", &vec![b' '; 3 * 1024 * 1024]);
    b.wait_for("#import-file")
        .await
        .send_keys(&big)
        .await
        .unwrap();
    b.wait_for_text("[data-import-note]", |t| t.contains("at most 2048 KB"))
        .await;
    assert_eq!(b.eval(stored).await, 3);
    b.screenshot("imported").await;
    app.finish().await;
}
