//! The pressure-settings area, in headless Chromium: the advice for the demo job is the
//! engine's own (run natively on the same job), and applying one changes the proposed design,
//! never the baseline.

use phasewise::engine::demo::scrap_baler;
use phasewise::engine::settings;
use phasewise::engine::Job;
use phasewise_harness::browser::{AppSession, Viewport};

/// Runs the search in the page and checks its counts against the engine's native `native`
/// run on the same job; prints the time it took (measured, never asserted).
async fn run_search(
    b: &phasewise_harness::browser::Browser,
    native: &phasewise::engine::staging::SearchResult,
    label: &str,
) {
    b.click("[data-action='search']").await;
    let summary = b
        .wait_for_text(".search-summary", |t| t.contains("candidates searched"))
        .await;
    let ms = b
        .eval("return document.querySelector('.search-summary').dataset.searchMs;")
        .await;
    println!("{label}: {summary} ({ms} ms)");
    assert!(
        summary.starts_with(&format!(
            "{} candidates searched, {} serve the cycle",
            native.evaluated, native.feasible
        )),
        "{summary}"
    );
}

#[tokio::test]
async fn the_demo_advice_shows_and_one_applies_to_the_proposed_design() {
    let app = AppSession::start_at("settings_advice", Viewport::PHONE, "#/settings").await;
    let b = &app.browser;
    let job = scrap_baler();
    let expected: Vec<String> = settings::advise(&job, 0)
        .unwrap()
        .iter()
        .map(|a| a.describe(&job).title)
        .collect();
    assert!(!expected.is_empty());
    b.wait_for(".advice-list").await;
    let shown = b
        .eval("return [...document.querySelectorAll('.advice-list h3')].map(h => h.textContent);")
        .await;
    assert_eq!(
        shown,
        serde_json::to_value(&expected).unwrap(),
        "the engine's advice, in order"
    );
    assert_eq!(
        b.sideways_overflow().await,
        0,
        "nothing pushes the page sideways"
    );
    let cut = b
        .eval("const w = document.querySelector('.table-wrap'); return w.scrollWidth - w.clientWidth;")
        .await;
    assert_eq!(cut, 0, "the phase table fits a phone without scrolling");
    // The cautions are beside the settings.
    assert!(b.text(".inline-caution").await.contains("locked out"));
    b.screenshot("advice").await;
    b.screenshot_of("table.needs", "phase-table").await;

    // On the baseline, the advice is not applied (the baseline stays as found): it says so.
    assert_eq!(b.count("[data-action='apply-advice']").await, 0);
    assert!(b
        .text(".advice-list")
        .await
        .contains("Show a proposed power unit to apply it there"));

    // The demo's proposed design follows the advice's own rules: nothing to change.
    b.click(".design-tabs button:nth-child(2)").await;
    assert!(settings::advise(&job, 1).unwrap().is_empty());
    b.wait_for_text("[data-advice-count='0']", |t| {
        t.contains("Nothing to change")
    })
    .await;
    // Raise its dwell's remote stage in the power-unit area: the advice then offers the
    // pressure that holds the dwell, and applies it to the proposed design.
    b.eval("location.hash = '#/unit'; return null;").await;
    b.fill("input[data-path='designs[1].remote_stages_pa[0]']", "175")
        .await;
    b.stored_job_when(|j| j["designs"][1]["remote_stages_pa"][0].as_f64() == Some(175e5))
        .await;
    b.eval("location.hash = '#/settings'; return null;").await;
    let mut job = job.clone();
    job.designs[1].remote_stages[0] = uom::si::f64::Pressure::new::<uom::si::pressure::bar>(175.0);
    let proposed_advice = settings::advise(&job, 1).unwrap();
    let titles: Vec<String> = proposed_advice
        .iter()
        .map(|a| a.describe(&job).title)
        .collect();
    b.wait_for_text(".advice-list", |t| {
        titles.iter().all(|x| t.contains(x.as_str()))
    })
    .await;
    let index = titles
        .iter()
        .position(|t| t.contains("Dwell"))
        .expect("dwell advice");
    b.click(&format!(
        ".advice-list > li:nth-child({}) [data-action='apply-advice']",
        index + 1
    ))
    .await;
    b.wait_for_text("[data-applied]", |t| t.contains("Applied to “Proposed”"))
        .await;
    // Applying changed the job, so it is saved: wait for the stored copy to hold it.
    type Design = phasewise::engine::power_unit::Design;
    let (want, _) = settings::apply_to_proposed(&job, 1, &proposed_advice[index].action.unwrap());
    let stored = b
        .stored_job_when(|j| {
            serde_json::from_value::<Design>(j["designs"][1].clone())
                .ok()
                .as_ref()
                == Some(&want.designs[1])
        })
        .await;
    let as_found: Design = serde_json::from_value(stored["designs"][0].clone()).unwrap();
    assert_eq!(as_found, job.designs[0], "the baseline is unchanged");
    let proposed: Design = serde_json::from_value(stored["designs"][1].clone()).unwrap();
    // The change can be undone: the proposed design is back as it was before the advice.
    b.wait_for_text("[data-undo]", |t| t.contains("by the advice"))
        .await;
    b.click("[data-action='undo']").await;
    b.stored_job_when(|j| {
        serde_json::from_value::<Design>(j["designs"][1].clone())
            .ok()
            .as_ref()
            == Some(&job.designs[1])
    })
    .await;
    // ... and applied again, the area shows the changed design's advice, if any.
    b.click(&format!(
        ".advice-list > li:nth-child({}) [data-action='apply-advice']",
        index + 1
    ))
    .await;
    b.stored_job_when(|j| {
        serde_json::from_value::<Design>(j["designs"][1].clone())
            .ok()
            .as_ref()
            == Some(&want.designs[1])
    })
    .await;
    let changed = Job {
        designs: vec![as_found, proposed],
        ..job.clone()
    };
    let now: Vec<String> = settings::advise(&changed, 1)
        .unwrap()
        .iter()
        .map(|a| a.describe(&changed).title)
        .collect();
    b.wait_for_text(".advice-list", |t| {
        now.iter().all(|x| t.contains(x.as_str()))
    })
    .await;
    app.finish().await;
}

#[tokio::test]
async fn the_staging_search_runs_and_its_best_candidate_becomes_the_proposed_design() {
    let app = AppSession::start_at("staging_search", Viewport::PHONE, "#/settings").await;
    let b = &app.browser;
    let mut job = scrap_baler();
    // The compress move's field says what applies while it is empty: its time as found.
    let as_found = phasewise::engine::solve(&job).unwrap().designs[0].phases[1]
        .point
        .duration
        .value;
    let field = "[data-path='cycle[1].target_time_s']";
    b.wait_for(field).await;
    let placeholder = b
        .eval(&format!(
            "return document.querySelector(\"{field}\").placeholder;"
        ))
        .await;
    assert_eq!(placeholder, format!("as found: {as_found:.2}"));
    // Letting it take twice as long is kept in the job and searched with.
    let typed = format!("{:.2}", as_found * 2.0);
    b.fill(field, &typed).await;
    let stored = b
        .stored_job_when(|j| !j["cycle"][1]["target_time_s"].is_null())
        .await;
    assert_eq!(
        stored["cycle"][1]["target_time_s"].as_f64(),
        typed.parse::<f64>().ok()
    );
    if let phasewise::engine::cycle::PhaseKind::Move(m) = &mut job.cycle[1].kind {
        m.target_time = Some(uom::si::f64::Time::new::<uom::si::time::second>(
            typed.parse().unwrap(),
        ));
    }
    // The engine's own search on the same job, natively.
    let native = phasewise::engine::staging::search(&job, &job.staging).unwrap();
    assert!(native.evaluated >= 5000 && !native.best.is_empty());
    run_search(b, &native, "staging search in Chromium").await;
    assert_eq!(b.count("li.candidate").await, native.best.len());
    b.screenshot("search-results").await;
    b.screenshot_of(".trade-off", "trade-off").await;
    assert_eq!(b.sideways_overflow().await, 0);
    b.click("li.candidate[data-rank='1'] [data-action='use-candidate']")
        .await;
    b.wait_for_text("[data-staging-applied]", |t| t.contains("Proposed"))
        .await;
    let (want, _) = phasewise::engine::staging::apply_candidate(&job, 0, &native.best[0]);
    // Wait for the save of the applied design (the typed target time was saved before).
    let motor = want.designs[1].motor.rated_power.value;
    let stored = b
        .stored_job_when(|j| j["designs"][1]["motor"]["rated_power_w"].as_f64() == Some(motor))
        .await;
    let proposed: phasewise::engine::power_unit::Design =
        serde_json::from_value(stored["designs"][1].clone()).unwrap();
    assert_eq!(proposed, want.designs[1]);
    let as_found: phasewise::engine::power_unit::Design =
        serde_json::from_value(stored["designs"][0].clone()).unwrap();
    assert_eq!(as_found, job.designs[0]);
    // The overwritten proposal comes back with one tap.
    b.wait_for_text("[data-undo]", |t| t.contains("candidate's pumps and motor"))
        .await;
    b.click("[data-action='undo']").await;
    b.stored_job_when(|j| {
        serde_json::from_value::<phasewise::engine::power_unit::Design>(j["designs"][1].clone())
            .ok()
            .as_ref()
            == Some(&job.designs[1])
    })
    .await;
    app.finish().await;
}

#[tokio::test]
async fn the_staging_search_time_on_a_ten_phase_cycle_is_printed() {
    // The demo's five phases, each twice: a ten-phase cycle (an invented machine).
    let mut job = scrap_baler();
    for i in (0..job.cycle.len()).rev() {
        job.duplicate_phase(i);
    }
    job.name = "Ten-phase baler".into();
    assert_eq!(job.cycle.len(), 10);
    // More motor speeds and drive minimums than the defaults: over 20,000 candidates, drives
    // among them (14 speeds x (1,347 fixed and compensated + 18 sizes x 8 minimums)).
    let rpm = |r: f64| {
        uom::si::f64::AngularVelocity::new::<uom::si::angular_velocity::revolution_per_minute>(r)
    };
    job.staging.speeds = (0..14).map(|i| rpm(900.0 + 70.0 * f64::from(i))).collect();
    job.staging.drive_min_speeds = (1..=8).map(|i| rpm(75.0 * f64::from(i))).collect();
    let native = phasewise::engine::staging::search(&job, &job.staging).unwrap();
    assert!(native.evaluated >= 20_000, "{}", native.evaluated);
    assert!(!native.best.is_empty());
    let app = AppSession::start_at("staging_ten_phases", Viewport::LAPTOP, "#/settings").await;
    let b = &app.browser;
    let entry = phasewise::formats::library::write_entry(&job, 1.0);
    b.eval(&format!(
        "localStorage.setItem('phasewise.job.zz-ten', {}); localStorage.setItem('phasewise.last-open', 'zz-ten');",
        serde_json::to_string(&entry).unwrap()
    ))
    .await;
    b.client().refresh().await.unwrap();
    b.wait_for(phasewise_harness::browser::APP_READY).await;
    run_search(b, &native, "staging search in Chromium, 10 phases").await;
    app.finish().await;
}

/// A proposal made before "as found" changed says so wherever it is used (its power unit, its
/// advice, the quote), shows the machine it still holds beside today's, and is made again from
/// today's "as found" on request (with an undo).
#[tokio::test]
async fn a_proposal_from_an_earlier_as_found_says_so_and_is_made_again_on_request() {
    use phasewise::engine::units::{Measure, UnitSystem};
    let app = AppSession::start_at("older_baseline", Viewport::PHONE, "#/unit").await;
    let b = &app.browser;
    let kw = |w: f64| Measure::Power.with_unit(UnitSystem::Si, w);
    assert_eq!(b.count("[data-older-baseline]").await, 0);
    b.fill("input[data-path='designs[0].motor.rated_power_w']", "30")
        .await;
    b.click("button[data-design='1']").await;
    let theirs = b
        .text("[data-older-baseline] [data-machine='proposal']")
        .await;
    let now = b
        .text("[data-older-baseline] [data-machine='baseline']")
        .await;
    assert!(
        theirs.starts_with(&format!("Proposed: motor {}", kw(22_000.0))),
        "{theirs}"
    );
    assert!(
        now.starts_with(&format!("As found now: motor {}", kw(30_000.0))),
        "{now}"
    );
    // Beside the advice: the notice, and the machine the advice is for.
    b.click("nav.areas a[href='#/settings']").await;
    b.wait_for("[data-older-baseline]").await;
    let machine = b
        .wait_for_text("[data-advice-machine]", |t| !t.is_empty())
        .await;
    assert!(
        machine.starts_with(&format!("For “Proposed”: motor {}", kw(22_000.0))),
        "{machine}"
    );
    b.click("nav.areas a[href='#/quote']").await;
    // Every proposal of the demo was made from the "as found" that changed.
    let quote = b.text("[data-older-baseline]").await;
    assert!(
        quote.starts_with("“Proposed”, “Variable speed” were made from an earlier “as found”")
            && quote.contains("Make them again"),
        "{quote}"
    );
    // Made again: today's machine, the notice gone; the undo puts the old proposal back.
    b.click("nav.areas a[href='#/unit']").await;
    b.click("button[data-design='1']").await;
    b.click("[data-action='rebuild-proposal']").await;
    b.wait_for("[data-undo]").await;
    assert_eq!(b.count("[data-older-baseline]").await, 0);
    assert_eq!(
        b.value("input[data-path='designs[1].motor.rated_power_w']")
            .await,
        Measure::Power.format(UnitSystem::Si, 30_000.0)
    );
    b.click("[data-undo] button").await;
    b.wait_for("[data-older-baseline]").await;
    app.finish().await;
}
