//! Files out of and into the app, in headless Chromium: the downloads themselves (a job, all
//! jobs, a design's ledger as CSV) read back equal to what the engine holds; export all, clear
//! storage, import gives the same jobs; a job with an empty number field is neither exported
//! nor shared (it would not read back); a job is renamed from the list without opening it.

use phasewise::engine::{demo::scrap_baler, solve, Job};
use phasewise_harness::browser::{area_shown, AppSession, Browser, Viewport, APP_READY};
use serde_json::Value;

const STORED_JOBS: &str = "return Object.keys(localStorage).filter(k => k.startsWith('phasewise.job.')).map(k => JSON.parse(localStorage.getItem(k)).job);";

/// A stored job as the engine reads it (JSON numbers compare by value there, not by spelling).
fn as_job(value: &Value) -> Job {
    serde_json::from_value(value.clone()).expect("a stored job reads back")
}

/// The stored jobs, by name.
fn jobs(values: &Value) -> Vec<Job> {
    let mut jobs: Vec<Job> = values.as_array().unwrap().iter().map(as_job).collect();
    jobs.sort_by(|a, b| a.name.cmp(&b.name));
    jobs
}

/// Waits until a job of this name is stored (the autosave waits for typing to pause).
async fn stored_as(b: &Browser, name: &str) {
    for _ in 0..100 {
        if jobs(&b.eval(STORED_JOBS).await)
            .iter()
            .any(|j| j.name == name)
        {
            return;
        }
        tokio::time::sleep(std::time::Duration::from_millis(50)).await;
    }
    panic!("no job named {name} was stored");
}

#[tokio::test]
async fn export_all_then_clear_then_import_gives_the_same_jobs() {
    let app = AppSession::start_at("export_round_trip", Viewport::PHONE, "#/jobs").await;
    let b = &app.browser;
    let downloads = b.allow_downloads().await;
    b.fill("input[data-path='name']", "Shear, bay 2").await;
    stored_as(b, "Shear, bay 2").await;
    b.click("button[data-action='new-job']").await;
    b.click("button[data-new='copy']").await;
    b.fill("input[data-path='name']", "Test rig").await;
    stored_as(b, "Test rig").await;
    let originals = b.eval(STORED_JOBS).await;
    assert_eq!(jobs(&originals).len(), 2);

    // One job: the open one, in the documented job file format.
    b.click("button[data-export='one']").await;
    let (name, text) = b.downloaded(&downloads, ".phasewise.json").await;
    assert_eq!(name, "test-rig.phasewise.json");
    let one = Job::from_json(&text).expect("the download is a job file");
    assert_eq!(one, jobs(&originals)[1]);

    b.click("button[data-export='all']").await;
    let (_, bundle) = b.downloaded(&downloads, "all-jobs.phasewise.json").await;
    b.eval("localStorage.clear();").await;
    b.client().refresh().await.unwrap();
    b.wait_for(APP_READY).await;
    assert_eq!(b.eval(STORED_JOBS).await, Value::Array(vec![]));
    let file = downloads.join("all-jobs.phasewise.json");
    assert!(bundle.len() > 100);
    b.wait_for("#import-file")
        .await
        .send_keys(&file.display().to_string())
        .await
        .unwrap();
    b.wait_for_text("[data-import-note]", |t| t == "Imported 2 jobs.")
        .await;
    let imported = b.eval(STORED_JOBS).await;
    assert_eq!(
        jobs(&imported),
        jobs(&originals),
        "the jobs are equal to the originals"
    );
    app.finish().await;
}

#[tokio::test]
async fn the_ledger_csv_holds_the_engines_figures() {
    let app = AppSession::start_at("ledger_csv", Viewport::PHONE, "#/results").await;
    let b = &app.browser;
    let downloads = b.allow_downloads().await;
    b.click("[data-action='ledger-csv']").await;
    let (name, csv) = b.downloaded(&downloads, "-ledger.csv").await;
    assert!(name.starts_with("scrap-baler"), "{name}");
    // The engine's own answer for the same (example) job, natively.
    let report = solve(&scrap_baler()).unwrap();
    let design = &report.designs[0];
    assert_eq!(
        csv,
        phasewise::formats::ledger_csv::ledger_csv(
            design,
            phasewise::engine::units::UnitSystem::Si
        )
    );
    let rows: Vec<&str> = csv.trim_end().split("\r\n").collect();
    assert_eq!(rows.len(), design.phases.len() + 2);
    app.finish().await;
}

#[tokio::test]
async fn a_job_is_renamed_from_the_list_without_opening_it() {
    let app = AppSession::start_at("rename_in_list", Viewport::PHONE, "#/jobs").await;
    let b = &app.browser;
    // The open job is saved (and opened last), so the other one stays closed after a reload.
    b.fill("input[data-path='name']", "Open one").await;
    stored_as(b, "Open one").await;
    let mut other = scrap_baler();
    other.name = "Old name".into();
    other.example = false;
    let text = phasewise::formats::library::write_entry(&other, 1.0);
    b.eval(&format!(
        "localStorage.setItem('phasewise.job.zz-other', {});",
        serde_json::to_string(&text).unwrap()
    ))
    .await;
    b.client().refresh().await.unwrap();
    b.wait_for(APP_READY).await;
    let open_before = b.value("input[data-path='name']").await;
    b.click("li[data-job='zz-other'] [data-action='rename']")
        .await;
    b.fill("#rename-zz-other", "").await;
    b.click("li[data-job='zz-other'] [data-action='rename-save']")
        .await;
    b.wait_for_text("li[data-job='zz-other'] .field-error", |t| {
        t.contains("give the job a name")
    })
    .await;
    b.fill("#rename-zz-other", "Baler, yard 3").await;
    b.click("li[data-job='zz-other'] [data-action='rename-save']")
        .await;
    b.wait_for_text("li[data-job='zz-other'] h3", |t| t == "Baler, yard 3")
        .await;
    let stored = b
        .eval("return JSON.parse(localStorage.getItem('phasewise.job.zz-other')).job;")
        .await;
    let mut expected = other.clone();
    expected.name = "Baler, yard 3".into();
    assert_eq!(as_job(&stored), expected, "only the name changed");
    assert_eq!(
        b.value("input[data-path='name']").await,
        open_before,
        "the open job is untouched"
    );
    app.finish().await;
}

#[tokio::test]
async fn a_job_with_a_field_holding_no_number_is_neither_exported_nor_shared() {
    let app = AppSession::start_at("half_typed_export", Viewport::PHONE, "#/quote").await;
    let b = &app.browser;
    let downloads = b.allow_downloads().await;
    // The electricity price emptied: the job holds no number there yet.
    b.fill("input[data-path='site.tariff_per_kwh']", "").await;
    b.wait_for_text("#f-site-tariff_per_kwh-error", |t| !t.is_empty())
        .await;
    b.click("nav.areas a[href='#/jobs']").await;
    b.click("button[data-export='one']").await;
    b.wait_for_text("[data-import-note]", |t| {
        t.starts_with("Not exported: a field holds no number yet")
    })
    .await;
    b.click("[data-action='make-link']").await;
    b.wait_for_text("[data-share-blocked]", |t| t.starts_with("No link yet"))
        .await;
    assert_eq!(b.count("svg.qr").await, 0, "no QR code of a half-typed job");
    assert_eq!(b.value("#share-link").await, "");
    tokio::time::sleep(std::time::Duration::from_millis(500)).await;
    let files = std::fs::read_dir(&downloads).unwrap().count();
    assert_eq!(files, 0, "nothing was downloaded");
    app.finish().await;
}

/// "Start a new job" asks where from: nothing (empty fields, no phases, nothing of the
/// example), or a copy of the open job with every figure in view. An empty job waits, unsaved,
/// until its fields hold numbers, and every area copes with it.
#[tokio::test]
async fn a_new_job_starts_empty_or_as_a_copy_the_user_chose() {
    let app = AppSession::start_at("new_job", Viewport::PHONE, "#/jobs").await;
    let b = &app.browser;
    b.click("button[data-action='new-job']").await;
    b.click("button[data-new='copy']").await;
    b.wait_for_text("h1", |t| t == "Jobs on this device").await;
    assert_eq!(
        b.value("input[data-path='name']").await,
        "Scrap baler (example) (copy)"
    );
    // A copy of the example is still the example, and says so.
    b.click("nav.areas a[href='#/cycle']").await;
    b.wait_for(".example-banner").await;
    b.click("nav.areas a[href='#/jobs']").await;

    b.click("button[data-action='new-job']").await;
    b.click("button[data-new='blank']").await;
    assert_eq!(b.value("input[data-path='name']").await, "New job");
    b.wait_for_text("[data-save-note]", |t| {
        t == "Not saved yet: it is saved on this device once every marked field holds a number."
    })
    .await;
    b.click("nav.areas a[href='#/cycle']").await;
    b.wait_for_text("h1", |t| t == "Machine cycle").await;
    assert_eq!(b.count("li[data-phase]").await, 0);
    assert_eq!(b.count(".example-banner").await, 0);
    b.click("nav.areas a[href='#/unit']").await;
    for path in [
        "designs[0].motor.rated_power_w",
        "designs[0].base_pump.displacement_m3_per_rev",
        "designs[0].relief.setting_pa",
    ] {
        let input = format!("input[data-path='{path}']");
        assert_eq!(b.value(&input).await, "", "{path}");
        let error = format!("#{}-error", phasewise::ui::field::field_id(path));
        assert_eq!(b.text(&error).await, "needs a value", "{path}");
    }
    // Every area shows an empty job without a fault or a figure from nowhere.
    for area in phasewise::ui::area::Area::ALL {
        // Moved by the address's fragment, as a link does: the page is not reloaded.
        b.eval(&format!("window.location.hash = '{}';", area.href()))
            .await;
        b.wait_for(&area_shown(area.slug()))
            .await;
        let text = b.eval("return document.body.innerText;").await;
        let text = text.as_str().unwrap_or_default().to_string();
        assert!(
            !text.contains("NaN") && !text.contains("Infinity"),
            "{area:?}: {text}"
        );
    }
    b.eval("window.location.hash = '#/jobs';").await;
    b.wait_for(&area_shown("jobs")).await;
    assert_eq!(
        b.value("input[data-path='name']").await,
        "New job",
        "the empty job is still open"
    );
    assert_eq!(b.console_errors().await, Vec::<String>::new());
    app.finish().await;
}
