//! The oil and heat in headless Chromium at phone size: the demo's oil settles where the
//! engine says and its warm-up chart shows; a tank described on a phone makes the oil settle;
//! a move's lines described in the cycle editor, and a bad diameter said at its field.

use phasewise::engine::demo::scrap_baler;
use phasewise::engine::heat::Settling;
use phasewise::engine::units::Measure;
use phasewise::engine::{solve, Job};
use phasewise_harness::browser::{area_shown, field, AppSession, Viewport};

fn steady_words(job: &Job) -> String {
    let report = solve(job).unwrap();
    match report.designs[0].oil.balance.as_ref().unwrap().steady {
        Settling::At(k) => Measure::Temperature.with_unit(job.units, k),
        Settling::Above(k) => format!(
            "above {}: it does not settle",
            Measure::Temperature.with_unit(job.units, k)
        ),
    }
}

#[tokio::test]
async fn the_oil_settles_on_a_phone_and_a_tank_and_lines_are_described() {
    let app = AppSession::start_at("heat", Viewport::PHONE, "#/results").await;
    let b = &app.browser;
    // Reached from the results' totals.
    b.click(".totals [data-link='heat']").await;
    b.wait_for(&area_shown("heat")).await;
    let job = scrap_baler();
    let shown = b
        .wait_for_text("[data-figure='steady']", |t| !t.is_empty())
        .await;
    assert_eq!(shown, steady_words(&job));
    assert!(b
        .text("[data-figure='without-cooler']")
        .await
        .contains("does not settle"));
    b.wait_for("svg[data-chart='warm-up'] polyline").await;
    assert!(!b.text("[data-figure='time-to-steady']").await.is_empty());
    assert_eq!(b.sideways_overflow().await, 0);
    b.screenshot("heat-demo").await;
    b.screenshot_of("[data-card='settling']", "heat-settling")
        .await;

    // Without the tank nothing settles; described again on the phone, with a bigger box in
    // still air, the oil settles where the engine says for that tank.
    b.click("[data-action='remove-tank']").await;
    b.wait_for("[data-action='describe-tank']").await;
    b.click("[data-action='describe-tank']").await;
    b.fill(&field("tank.size.length_m"), "1500").await;
    b.choose("select[data-path='tank.air']", "still").await;
    b.choose(
        "select[data-path='oil.working_temperature.set_by']",
        "settled",
    )
    .await;
    let stored: Job = serde_json::from_value(
        b.stored_job_when(|j| {
            j["tank"]["size"]["length_m"]
                .as_f64()
                .is_some_and(|l| (l - 1.5).abs() < 1e-9)
                && j["tank"]["air"] == "still"
                && j["oil"]["working_temperature"]["set_by"] == "settled"
        })
        .await,
    )
    .unwrap();
    let expected = steady_words(&stored);
    b.wait_for_text("[data-figure='steady']", |t| t == expected)
        .await;

    // A move's lines in the cycle editor: the demo's are there; left out and described
    // again on the phone, a diameter typed wrong is said at its field, and the lines typed in
    // are the job's.
    b.goto(&app.url("#/cycle")).await;
    app.wait_until_ready().await;
    b.open_phase(0).await;
    let diameter = field("cycle[0].lines.pressure_line.inner_diameter_m");
    assert_eq!(b.value(&diameter).await, "25.0");
    b.click("li[data-phase='0'] [data-action='remove-lines']")
        .await;
    b.click("li[data-phase='0'] [data-action='describe-lines']")
        .await;
    b.fill(&diameter, "-5").await;
    b.wait_for_text(
        "#f-cycle-0-lines-pressure_line-inner_diameter_m-error",
        |t| t.contains("cannot be negative"),
    )
    .await;
    for (key, text) in [
        ("pressure_line.inner_diameter_m", "20"),
        ("pressure_line.length_m", "4000"),
        ("pressure_line.fittings", "3"),
        ("return_line.inner_diameter_m", "32"),
        ("return_line.length_m", "4000"),
    ] {
        b.fill(&field(&format!("cycle[0].lines.{key}")), text).await;
    }
    let stored: Job = serde_json::from_value(
        b.stored_job_when(|j| {
            j["cycle"][0]["lines"]["return_line"]["length_m"]
                .as_f64()
                .is_some_and(|l| (l - 4.0).abs() < 1e-9)
        })
        .await,
    )
    .unwrap();
    let report = solve(&stored).unwrap();
    let lines = report.designs[0].phases[0]
        .lines
        .expect("the lines are solved");
    assert!(lines.pressure_line.drop > 0.0);
    assert_eq!(b.sideways_overflow().await, 0);
    b.screenshot("heat-lines").await;
    app.finish().await;
}
