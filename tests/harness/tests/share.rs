//! Jobs sent by link and QR code, in headless Chromium: a link opened in a fresh browser
//! profile adds the same job (once, however often it is opened); the QR code on screen reads
//! back as that link; a damaged link says so and adds nothing.

use phasewise_harness::browser::{foreign_requests, AppSession, Browser, Viewport, APP_READY};
use serde_json::Value;

const STORED_JOBS: &str = "return Object.keys(localStorage).filter(k => k.startsWith('phasewise.job.')).map(k => JSON.parse(localStorage.getItem(k)).job);";

/// Reads the QR code in a screenshot, as a phone's camera app would (rqrr).
fn read_qr(png: &std::path::Path) -> String {
    let image = image::open(png)
        .expect("the screenshot is a PNG")
        .to_luma8();
    let mut prepared = rqrr::PreparedImage::prepare_from_greyscale(
        image.width() as usize,
        image.height() as usize,
        |x, y| image.get_pixel(x as u32, y as u32).0[0],
    );
    let grids = prepared.detect_grids();
    assert_eq!(grids.len(), 1, "one QR code in {}", png.display());
    let (_, text) = grids[0].decode().expect("the QR code decodes");
    text
}

#[tokio::test]
async fn a_shared_link_adds_the_same_job_in_a_fresh_browser_and_its_qr_code_reads_back() {
    let app = AppSession::start_at("share_send", Viewport::PHONE, "#/jobs").await;
    let b = &app.browser;
    b.fill("input[data-path='name']", "Press 4, sent by link")
        .await;
    b.wait_for_text("[data-save-note]", |t| {
        t.starts_with("Saved on this device")
    })
    .await;
    b.click("[data-action='make-link']").await;
    let link = b.value("#share-link").await;
    assert!(
        link.starts_with(&format!("{}#share=1.", app.server.url())),
        "{link}"
    );
    let shot = b.screenshot_of(".qr-frame", "qr").await;
    assert_eq!(read_qr(&shot), link, "the QR code holds the link");
    // The large view, for a projector, reads the same.
    b.click("[data-action='qr-large']").await;
    b.wait_for(".qr-frame.large").await;
    let large = b.screenshot("qr-large").await;
    assert_eq!(read_qr(&large), link);
    // A tap anywhere on it closes it.
    b.click(".qr-frame.large").await;
    b.wait_for(".qr-frame:not(.large)").await;
    let sent = b.eval(STORED_JOBS).await;
    assert_eq!(sent.as_array().map(Vec::len), Some(1));

    let other = Browser::launch("share_receive", Viewport::PHONE).await;
    other.goto(&link).await;
    other.wait_for(APP_READY).await;
    let note = other
        .wait_for_text("[data-share-note]", |t| t.starts_with("Added"))
        .await;
    assert!(note.contains("Press 4, sent by link"), "{note}");
    assert_eq!(
        other.eval(STORED_JOBS).await,
        sent,
        "the same job, unchanged"
    );
    assert_eq!(other.eval("return location.hash;").await, "#/jobs");
    // Opening the link again adds nothing new: pasted into the open app (a fragment change)...
    other.goto(&link).await;
    other.wait_for(APP_READY).await;
    other
        .wait_for_text("[data-share-note]", |t| {
            t.contains("already on this device")
        })
        .await;
    assert_eq!(other.eval(STORED_JOBS).await, sent);
    // ... or opened afresh.
    other.goto("about:blank").await;
    other.goto(&link).await;
    other.wait_for(APP_READY).await;
    other
        .wait_for_text("[data-share-note]", |t| {
            t.contains("already on this device")
        })
        .await;
    assert_eq!(other.eval(STORED_JOBS).await, sent);
    other.screenshot("received").await;
    assert_eq!(other.console_errors().await, Vec::<String>::new());
    assert_eq!(
        foreign_requests(&other.requests().await, &app.server.url()),
        Vec::<String>::new()
    );
    other.close().await;
    app.finish().await;
}

#[tokio::test]
async fn a_damaged_link_says_so_and_adds_nothing() {
    let app = AppSession::start("share_damaged", Viewport::PHONE).await;
    let b = &app.browser;
    let link = {
        let job = phasewise::engine::demo::scrap_baler();
        let full = phasewise::formats::share::link(&app.server.url(), &job);
        full[..full.len() - 40].to_string()
    };
    b.goto(&link).await;
    b.wait_for(APP_READY).await;
    b.wait_for_text("[data-share-note]", |t| {
        t.contains("could not be read") && t.contains("Nothing was added")
    })
    .await;
    assert_eq!(b.eval(STORED_JOBS).await, Value::Array(vec![]));
    b.screenshot("damaged-link").await;
    app.finish().await;
}

#[tokio::test]
async fn a_link_whose_name_is_taken_is_added_beside_it_once() {
    let app = AppSession::start_at("share_name_taken", Viewport::PHONE, "#/jobs").await;
    let b = &app.browser;
    b.fill("input[data-path='name']", "Yard baler").await;
    b.wait_for_text("li.job-row.current h3", |t| t == "Yard baler")
        .await;
    let mut theirs = phasewise::engine::demo::scrap_baler();
    theirs.name = "Yard baler".into();
    theirs.site.location = "Their yard".into();
    let link = phasewise::formats::share::link(&app.server.url(), &theirs);
    b.goto(&link).await;
    b.wait_for(APP_READY).await;
    b.wait_for_text("[data-share-note]", |t| {
        t.contains("Added “Yard baler (2)”")
    })
    .await;
    for _ in 0..2 {
        b.goto("about:blank").await;
        b.goto(&link).await;
        b.wait_for(APP_READY).await;
        b.wait_for_text("[data-share-note]", |t| {
            t.contains("“Yard baler (2)” from the shared link is already")
        })
        .await;
    }
    let names = b.eval("return Object.keys(localStorage).filter(k => k.startsWith('phasewise.job.')).map(k => JSON.parse(localStorage.getItem(k)).job.name).sort();").await;
    assert_eq!(names, serde_json::json!(["Yard baler", "Yard baler (2)"]));
    app.finish().await;
}
