//! A variable-speed proposal made on a phone, in headless Chromium: "as found" copied, put on
//! a drive that stops the pumps in idles, and its speed in each phase and its saving shown as
//! the engine works them out (run natively on the job the page stored).

use phasewise::engine::units::Measure;
use phasewise::engine::{quote, solve, Job};
use phasewise::formats::quote_text::{self, Precision, Row};
use phasewise_harness::browser::{AppSession, Viewport};

#[tokio::test]
async fn a_variable_speed_proposal_made_on_a_phone_shows_its_speeds_and_saving() {
    let app = AppSession::start_at("drive_proposal", Viewport::PHONE, "#/unit").await;
    let b = &app.browser;
    b.click(".design-tabs [data-design='0']").await;
    b.click(".row-tools .button:not(.danger)").await;
    let before: Job = serde_json::from_value(
        b.stored_job_when(|j| j["designs"].as_array().is_some_and(|d| d.len() == 4))
            .await,
    )
    .unwrap();
    let d = before.designs.len() - 1;
    assert!(before.designs[d].drive.is_none(), "a copy of as found");
    b.choose(
        &format!("select[data-path='designs[{d}].drive']"),
        "variable",
    )
    .await;
    b.wait_for(&format!("[data-drive='{d}']")).await;
    b.wait_for("[data-caution='drive']").await;
    b.choose(
        &format!("select[data-path='designs[{d}].drive.idle']"),
        "stopped",
    )
    .await;
    let job: Job = serde_json::from_value(
        b.stored_job_when(|j| j["designs"][d]["drive"]["idle"] == "stopped")
            .await,
    )
    .unwrap();
    assert_eq!(
        b.sideways_overflow().await,
        0,
        "the drive's fields fit a phone"
    );
    b.screenshot("drive-fields").await;

    // Each phase's speed in the results, as the engine chose it.
    let report = solve(&job).unwrap();
    let want: Vec<String> = report.designs[d]
        .phases
        .iter()
        .map(|p| Measure::ShaftSpeed.with_unit(job.units, p.point.shaft_speed.unwrap().value))
        .collect();
    assert!(
        want.iter().any(|w| w == "0 rpm"),
        "the idle stops: {want:?}"
    );
    b.goto(&app.url("#/results")).await;
    app.wait_until_ready().await;
    b.click(&format!(".design-tabs [data-design='{d}']")).await;
    let shown = b
        .eval("return [...document.querySelectorAll(\"li.phase-result [data-value='shaft-speed']\")].map(e => e.textContent);")
        .await;
    assert_eq!(shown, serde_json::to_value(&want).unwrap());
    assert_eq!(b.sideways_overflow().await, 0);
    b.screenshot("drive-results").await;

    // Its saving in the quote, as the engine's comparison words it.
    let columns = quote::columns(&job, &report);
    let saved = quote_text::cell(
        Row::EnergySaved,
        &columns[d],
        job.units,
        &job.site.currency,
        Precision::ForCustomer,
    )
    .unwrap();
    let speeds = quote_text::cell(
        Row::PumpSpeed,
        &columns[d],
        job.units,
        &job.site.currency,
        Precision::ForCustomer,
    )
    .unwrap();
    assert!(speeds.starts_with("variable"), "{speeds}");
    b.goto(&app.url("#/quote")).await;
    app.wait_until_ready().await;
    let cell = |row: &str| {
        format!("[data-quote-table='customer'] tr[data-quote-row='{row}'] td[data-design='{d}']")
    };
    let shown_saving = b
        .wait_for_text(&cell("energy-saved"), |t| !t.is_empty())
        .await;
    assert_eq!(shown_saving, saved);
    assert_eq!(b.text(&cell("pump-speed")).await, speeds);
    let kwh = columns[d].against_baseline.unwrap().energy_kwh_per_year;
    println!("variable-speed proposal on the phone: saves {kwh:.0} kWh a year ({shown_saving})");
    assert!(kwh > 0.0);
    app.finish().await;
}
