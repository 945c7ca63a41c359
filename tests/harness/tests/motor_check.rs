//! The motor check and the line current per phase, in headless Chromium at phone size: the
//! demo's check gives the engine's verdict in its words, a reading typed in changes it, and a
//! clamp-meter reading entered for a phase shows beside the model's current in the results.

use phasewise::engine::demo::scrap_baler;
use phasewise::engine::motor_load::assess_motor;
use phasewise::engine::units::Measure;
use phasewise::engine::{solve, Job};
use phasewise_harness::browser::{area_shown, field, AppSession, Viewport};

#[tokio::test]
async fn a_motor_check_on_a_phone_reads_the_verdict_and_follows_a_reading() {
    let app = AppSession::start_at("motor_check", Viewport::PHONE, "#/unit").await;
    let b = &app.browser;
    // Opened from the power unit's motor.
    b.click("[data-link='motor-check']").await;
    b.wait_for(&area_shown("motor-check")).await;
    let job = scrap_baler();
    let report = assess_motor(&job, &job.motor_checks[0], job.units).unwrap();
    let words = report.describe(job.units, &job.site.currency);
    let shown = b
        .wait_for_text("[data-motor-verdict='oversized'] p", |t| !t.is_empty())
        .await;
    assert_eq!(shown, words.verdict);
    assert!(shown.contains("by input power"), "{shown}");
    assert_eq!(
        b.text(".motor-readings li:nth-child(1)").await,
        words.readings[0]
    );
    assert_eq!(b.sideways_overflow().await, 0);
    b.screenshot("motor-verdict").await;
    // A power meter's reading near full load in the first reading: well loaded now.
    let input = field("motor_checks[0].readings[0].input_w");
    b.fill(&input, "23").await;
    b.wait_for("[data-motor-verdict='well-loaded']").await;
    let stored: Job = serde_json::from_value(
        b.stored_job_when(|j| {
            j["motor_checks"][0]["readings"][0]["input_w"].as_f64() == Some(23_000.0)
        })
        .await,
    )
    .unwrap();
    let report = assess_motor(&stored, &stored.motor_checks[0], stored.units).unwrap();
    let words = report.describe(stored.units, &stored.site.currency);
    assert_eq!(b.text("[data-motor-verdict] p").await, words.verdict);
    // A figure that is no number is said at its field.
    b.fill(&field("motor_checks[0].readings[1].line.current_a"), "-3")
        .await;
    b.wait_for_text("#f-motor_checks-0-readings-1-line-current_a-error", |t| {
        t.contains("cannot be negative")
    })
    .await;
    // A new check of the shown motor, its nameplate taken from the power unit: one clamp-meter
    // reading with volts, amps and power factor, and one tachometer reading.
    b.click("[data-action='new-motor-check']").await;
    b.wait_for(&field("motor_checks[1].readings[0].line.voltage_v"))
        .await;
    b.fill(&field("motor_checks[1].motor"), "Main motor again")
        .await;
    b.fill(&field("motor_checks[1].readings[0].line.voltage_v"), "400")
        .await;
    b.fill(&field("motor_checks[1].readings[0].line.current_a"), "36")
        .await;
    b.fill(
        &field("motor_checks[1].readings[0].line.power_factor"),
        "0.84",
    )
    .await;
    b.click("[data-action='add-motor-reading']").await;
    b.fill(
        &field("motor_checks[1].readings[1].speed_rad_per_s"),
        "1478",
    )
    .await;
    let verdict = b
        .wait_for_text("[data-motor-verdict] p", |t| t.contains("by input power"))
        .await;
    let stored: Job = serde_json::from_value(
        b.stored_job_when(|j| {
            j["motor_checks"][1]["readings"][1]["speed_rad_per_s"]
                .as_f64()
                .is_some()
        })
        .await,
    )
    .unwrap();
    let report = assess_motor(&stored, &stored.motor_checks[1], stored.units).unwrap();
    assert_eq!(
        verdict,
        report.describe(stored.units, &stored.site.currency).verdict
    );
    assert_eq!(b.sideways_overflow().await, 0);
    b.screenshot("motor-check-new").await;
    app.finish().await;
}

#[tokio::test]
async fn a_clamp_meter_reading_shows_beside_the_models_current() {
    let app = AppSession::start_at("clamp_meter", Viewport::PHONE, "#/unit").await;
    let b = &app.browser;
    let job = scrap_baler();
    let model = solve(&job).unwrap().designs[0].phases[2]
        .line
        .unwrap()
        .current;
    let path = "designs[0].phase_settings[2].measured_current_a";
    // The field's placeholder is the model's figure.
    let placeholder = b
        .eval(&format!(
            "return document.querySelector(\"{}\").placeholder;",
            field(path)
        ))
        .await;
    let model_words = Measure::Current.with_unit(job.units, model.value);
    assert_eq!(placeholder, format!("model: {model_words}"));
    b.fill(&field(path), "31").await;
    b.click("nav.areas a[href='#/results']").await;
    let read = b
        .wait_for_text("[data-phase='2'] [data-value='current-read']", |t| {
            t.contains("31.0 A")
        })
        .await;
    assert!(read.contains("against the model"), "{read}");
    let line = b.text("[data-phase='2'] [data-value='current']").await;
    assert!(line.starts_with(&model_words), "{line} / {model_words}");
    let card = b.text("li.phase-result[data-phase='2']").await;
    assert!(
        card.contains(&format!("the model expects {model_words}")),
        "{card}"
    );
    assert_eq!(b.sideways_overflow().await, 0);
    b.screenshot("clamp-meter").await;
    app.finish().await;
}
