//! The pump check, in headless Chromium at phone size: readings typed in, the verdict, the
//! figures and the chart are the engine's own (run natively on the stored test), and the
//! measured efficiencies go into a design.

use phasewise::engine::efficiency::{self, Verdict};
use phasewise::engine::units::UnitSystem;
use phasewise::engine::Job;
use phasewise_harness::browser::{field, AppSession, Browser, Viewport};
use serde_json::Value;

/// The stored job once the autosave has written a copy that satisfies `ok`.
async fn stored_when(b: &Browser, ok: impl Fn(&Value) -> bool) -> Job {
    serde_json::from_value(b.stored_job_when(ok).await).unwrap()
}

#[tokio::test]
async fn readings_typed_on_a_phone_give_the_engines_verdict_and_go_into_a_design() {
    let app = AppSession::start_at("pump_check", Viewport::PHONE, "#/pump-test").await;
    let b = &app.browser;
    b.click("[data-action='new-test']").await;
    let t = "pump_tests[0]";
    // The test of Esposito's Example 5-9 (100 cm^3/rev at 1000 rpm, 90 L/min at 70 bar,
    // 120 N.m), and a second reading at 20 bar.
    b.fill(&field(&format!("{t}.pump")), "Pump 2, vane").await;
    b.fill(&field(&format!("{t}.displacement_m3_per_rev")), "100")
        .await;
    b.fill(&field(&format!("{t}.speed_rad_per_s")), "1000")
        .await;
    b.click("[data-action='add-reading']").await;
    // A reading still empty: its fields say so, and nothing is judged yet.
    b.wait_for_text("[data-test-result]", |t| t.contains("once every figure"))
        .await;
    b.fill(&field(&format!("{t}.readings[0].pressure_pa")), "70")
        .await;
    b.fill(&field(&format!("{t}.readings[0].flow_m3_per_s")), "90")
        .await;
    b.fill(&field(&format!("{t}.readings[0].torque_n_m")), "120")
        .await;
    b.click("[data-action='add-reading']").await;
    b.fill(&field(&format!("{t}.readings[1].pressure_pa")), "20")
        .await;
    b.fill(&field(&format!("{t}.readings[1].flow_m3_per_s")), "97,2")
        .await;
    b.wait_for("[data-verdict]").await;

    let job = stored_when(b, |j| {
        j["pump_tests"][0]["readings"][1]["flow_m3_per_s"]
            .as_f64()
            .is_some()
    })
    .await;
    let test = &job.pump_tests[0];
    assert_eq!(test.pump, "Pump 2, vane");
    let report = efficiency::assess(test, &job.wear, UnitSystem::Si).unwrap();
    let kind = match report.verdict {
        Verdict::Good { .. } => "good",
        Verdict::Watch { .. } => "watch",
        Verdict::Worn { .. } => "worn",
        Verdict::NotJudged => "none",
    };
    let shown = b
        .eval("return document.querySelector('[data-verdict]').dataset.verdict;")
        .await;
    assert_eq!(shown, kind);
    let at_rated = report.verdict.volumetric_at_rated().expect("judged");
    assert!(b
        .text("[data-verdict]")
        .await
        .contains(&format!("{:.1} %", at_rated * 100.0)));
    // The first reading's row: Esposito's 90.0 % volumetric, 83.6 % overall, 92.8 %
    // hydromechanical, as the engine gives them.
    let row = b.text(".readings-table tbody tr:nth-child(1)").await;
    for v in [
        report.readings[0].volumetric,
        report.readings[0].overall,
        report.readings[0].hydromechanical,
    ] {
        let text = format!("{:.1} %", v.unwrap() * 100.0);
        assert!(row.contains(&text), "{row} lacks {text}");
    }
    assert!(row.contains("83.6 %"));
    assert_eq!(b.count(".flow-chart circle.reading-dot").await, 2);
    assert_eq!(b.count(".flow-chart line.fit").await, 1);
    assert_eq!(b.sideways_overflow().await, 0);
    b.screenshot("verdict").await;
    b.screenshot_of(".flow-chart", "chart").await;
    // The verdict is also where the retrofit is decided: on the quote and in its report.
    let said = b.text("[data-verdict]").await;
    for (area, list) in [
        ("#/quote", "[data-quote-pumps]"),
        ("#/report", "[data-report-pumps]"),
    ] {
        b.eval(&format!("location.hash = '{area}'; return null;"))
            .await;
        let text = b
            .wait_for_text(&format!("{list} [data-verdict='{kind}']"), |t| {
                !t.is_empty()
            })
            .await;
        assert!(text.contains(&said), "{area}: {text} / {said}");
    }
    b.eval("location.hash = '#/pump-test'; return null;").await;
    b.wait_for("[data-verdict]").await;

    // A reading that cannot be right gets its message at the field, and no figure.
    b.fill(&field(&format!("{t}.readings[1].flow_m3_per_s")), "120")
        .await;
    b.wait_for_text("#f-pump_tests-0-readings-1-flow_m3_per_s-error", |t| {
        t.contains("check the meter range or the displacement")
    })
    .await;
    b.fill(&field(&format!("{t}.readings[1].flow_m3_per_s")), "97.2")
        .await;
    b.wait_for_text(".readings-table tbody tr:nth-child(2)", |t| t.contains('%'))
        .await;

    // Into the as-found design's last pump.
    b.click("[data-action='copy-efficiencies']").await;
    b.wait_for_text("[data-copied]", |t| t.contains("Copied into “As found”"))
        .await;
    let before = phasewise::engine::demo::scrap_baler();
    let job = stored_when(b, |j| {
        j["designs"][0]["base_pump"]["efficiency_pressure_pa"].as_f64() == Some(70e5)
    })
    .await;
    let report = efficiency::assess(&job.pump_tests[0], &job.wear, UnitSystem::Si).unwrap();
    let measured = efficiency::measured_pump(&job.pump_tests[0], &report).unwrap();
    let want = efficiency::apply_to_design(&before.designs[0], 1, &measured).unwrap();
    assert_eq!(job.designs[0], want);
    assert_eq!(
        job.designs[1], before.designs[1],
        "only the chosen design changes"
    );
    app.finish().await;
}
