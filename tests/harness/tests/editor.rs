//! The job editor and the live results, in headless Chromium at phone size unless stated.
//! Expected figures come from the engine itself, run natively on the same job, formatted the
//! way the app formats them: what the phone shows must be what the engine says.

use phasewise::engine::cycle::{Load, PhaseKind};
use phasewise::engine::demo::scrap_baler;
use phasewise::engine::units::{Measure, UnitSystem};
use phasewise::engine::{solve, Job};
use phasewise_harness::browser::{area_shown, field, AppSession, Browser, Viewport};
use uom::si::energy::kilowatt_hour;
use uom::si::f64::Force;

/// Fails if the page shows NaN or an infinity anywhere.
async fn assert_no_nonsense(b: &Browser) {
    let text = b.eval("return document.body.innerText;").await;
    let text = text.as_str().unwrap_or("");
    for bad in ["NaN", "inf", "Infinity"] {
        assert!(!text.contains(bad), "the page shows {bad}:\n{text}");
    }
}

#[tokio::test]
async fn the_demo_results_are_the_engines() {
    let app = AppSession::start_at("demo_results", Viewport::PHONE, "#/results").await;
    let b = &app.browser;
    let report = solve(&scrap_baler()).unwrap();
    let si = UnitSystem::Si;
    b.wait_for(".example-banner").await;
    for (i, phase) in report.designs[0].phases.iter().enumerate() {
        let at = |key: &str| format!("li.phase-result[data-phase='{i}'] [data-value='{key}']");
        assert_eq!(
            b.text(&at("pressure")).await,
            Measure::Pressure.with_unit(si, phase.point.system_pressure.value),
            "{}",
            phase.name
        );
        assert_eq!(
            b.text(&at("flow")).await,
            Measure::Flow.with_unit(si, phase.point.actuator_flow.value)
        );
        assert_eq!(
            b.text(&at("duration")).await,
            Measure::Duration.with_unit(si, phase.point.duration.value)
        );
        assert_eq!(
            b.text(&at("input")).await,
            Measure::Power.with_unit(si, phase.ledger.electrical_input.value)
        );
    }
    let totals = &report.designs[0].totals;
    assert_eq!(
        b.text("[data-total='average']").await,
        Measure::Power.with_unit(si, totals.average_electrical.value)
    );
    assert_eq!(
        b.text("[data-total='rms-shaft']").await,
        Measure::Power.with_unit(si, totals.rms_shaft.value)
    );
    assert_eq!(
        b.text("[data-total='annual-energy']").await,
        format!("{:.0} kWh", totals.annual_energy.get::<kilowatt_hour>())
    );
    // The charts are drawn: a bar segment per ledger item with power, a line per timeline panel.
    assert!(b.count(".chart rect").await >= report.designs[0].phases.len());
    assert_eq!(b.count(".chart polyline").await, 3);
    assert_no_nonsense(b).await;
    b.screenshot("results-top").await;
    b.screenshot_of(".chart", "ledger-chart").await;
    // The proposal, with its comparison against the baseline.
    b.click("button[data-design='1']").await;
    let saved = report.comparisons[0]
        .annual_energy_saved
        .get::<kilowatt_hour>();
    b.wait_for_text("[data-total='saved-energy']", |t| {
        t == format!("{saved:.0} kWh")
    })
    .await;
    b.screenshot("proposal").await;
    app.finish().await;
}

#[tokio::test]
async fn editing_a_load_changes_the_ledger_and_the_totals() {
    let app = AppSession::start("edit_load", Viewport::PHONE).await;
    let b = &app.browser;
    b.open_phase(1).await;
    // The compress stroke's 300 kN becomes 250 kN, typed with a decimal comma.
    b.fill(&field("cycle[1].load.force_n"), "250,0").await;
    let mut job: Job = scrap_baler();
    if let PhaseKind::Move(m) = &mut job.cycle[1].kind {
        m.load = Load::Force {
            force: Force::new::<uom::si::force::kilonewton>(250.0),
        };
    }
    let edited = solve(&job).unwrap();
    let before = solve(&scrap_baler()).unwrap();
    assert_ne!(
        edited.designs[0].totals.average_electrical,
        before.designs[0].totals.average_electrical
    );
    b.click("nav.areas a[href='#/results']").await;
    let si = UnitSystem::Si;
    let expected = Measure::Power.with_unit(si, edited.designs[0].totals.average_electrical.value);
    b.wait_for_text("[data-total='average']", |t| t == expected)
        .await;
    let compress = "li.phase-result[data-phase='1'] [data-value='input']";
    assert_eq!(
        b.text(compress).await,
        Measure::Power.with_unit(
            si,
            edited.designs[0].phases[1].ledger.electrical_input.value
        )
    );
    assert_eq!(b.count(".stale-notice").await, 0);
    app.finish().await;
}

#[tokio::test]
async fn phases_are_added_deleted_and_brought_back() {
    let app = AppSession::start("phase_list", Viewport::PHONE).await;
    let b = &app.browser;
    let cards = "li.phase-card";
    assert_eq!(b.count(cards).await, 5);
    b.click("button.wide").await;
    b.wait_for("li.phase-card[data-phase='5'].open").await;
    assert_eq!(b.count(cards).await, 6);
    // Delete the dwell, then bring it back where it was.
    b.open_phase(2).await;
    b.click("li[data-phase='2'] .button.danger").await;
    b.wait_for(".undo-bar").await;
    assert_eq!(b.count(cards).await, 5);
    assert_ne!(b.text("li[data-phase='2'] .phase-name").await, "Dwell");
    b.screenshot("after-delete").await;
    b.click(".undo-bar .button").await;
    b.wait_for_text("li[data-phase='2'] .phase-name", |t| t == "Dwell")
        .await;
    assert_eq!(b.count(cards).await, 6);
    assert_eq!(b.count(".undo-bar").await, 0);
    // Duplicate it: the copy follows the original.
    b.click("li[data-phase='2'] .phase-tools .button:nth-child(3)")
        .await;
    b.wait_for_text("li[data-phase='3'] .phase-name", |t| t == "Dwell")
        .await;
    assert_eq!(b.count(cards).await, 7);
    app.finish().await;
}

#[tokio::test]
async fn switching_units_changes_what_is_shown_and_not_the_physics() {
    let app = AppSession::start("units", Viewport::PHONE).await;
    let b = &app.browser;
    b.open_phase(0).await;
    let bore = field("cycle[0].cylinder.bore_m");
    assert_eq!(b.value(&bore).await, "160.0");
    b.click(".segmented button:nth-child(2)").await;
    // 160 mm is 6.299 in (NIST SP 811: 1 in = 25.4 mm exactly).
    b.wait_for_text(&format!("{bore} + .unit"), |t| t == "in")
        .await;
    assert_eq!(b.value(&bore).await, "6.299");
    b.click("nav.areas a[href='#/results']").await;
    let report = solve(&scrap_baler()).unwrap();
    let us = Measure::Power.with_unit(
        UnitSystem::UsCustomary,
        report.designs[0].totals.average_electrical.value,
    );
    b.wait_for_text("[data-total='average']", |t| t == us).await;
    // And back: the same figures as before, to the digit.
    b.click(".segmented button:nth-child(1)").await;
    let si = Measure::Power.with_unit(
        UnitSystem::Si,
        report.designs[0].totals.average_electrical.value,
    );
    b.wait_for_text("[data-total='average']", |t| t == si).await;
    b.click("nav.areas a[href='#/cycle']").await;
    b.open_phase(0).await;
    assert_eq!(b.value(&bore).await, "160.0");
    app.finish().await;
}

#[tokio::test]
async fn bad_input_is_kept_and_explained_at_the_field() {
    let app = AppSession::start("bad_input", Viewport::PHONE).await;
    let b = &app.browser;
    b.open_phase(0).await;
    let bore = field("cycle[0].cylinder.bore_m");
    let message = "#f-cycle-0-cylinder-bore_m-error";
    for (typed, says) in [
        ("abc", "is not a number: type a value"),
        ("-5", "cannot be negative"),
        ("", "needs a value"),
        ("0", "must be more than zero"),
        ("80", "the rod must be thinner than the bore"),
    ] {
        b.fill(&bore, typed).await;
        assert_eq!(b.value(&bore).await, typed, "what was typed stays");
        let at = if says.starts_with("the rod") {
            "#f-cycle-0-cylinder-rod_m-error"
        } else {
            message
        };
        b.wait_for_text(at, |t| t == says).await;
        assert_no_nonsense(b).await;
    }
    b.screenshot("field-error").await;
    // Results keep the last good figures, marked as stale.
    b.click("nav.areas a[href='#/results']").await;
    b.wait_for(".stale-notice").await;
    assert!(b
        .text(".stale-notice")
        .await
        .contains("Phase 1 (Fast approach)"));
    assert!(b.count("li.phase-result").await > 0);
    assert_no_nonsense(b).await;
    b.screenshot("stale-results").await;
    // A good value clears it all.
    b.click("nav.areas a[href='#/cycle']").await;
    b.fill(&bore, "160").await;
    b.wait_for_text(message, |t| t.is_empty()).await;
    b.click("nav.areas a[href='#/results']").await;
    b.wait_for("li.phase-result").await;
    assert_eq!(b.count(".stale-notice").await, 0);
    // Console errors are not expected from bad input: it is handled, not thrown.
    app.finish().await;
}

#[tokio::test]
async fn nothing_overflows_sideways_and_the_presenter_view_reads_large() {
    for (name, viewport) in [
        ("small-phone", Viewport::SMALL_PHONE),
        ("phone", Viewport::PHONE),
        ("laptop", Viewport::LAPTOP),
    ] {
        let app = AppSession::start("editor_layouts", viewport).await;
        let b = &app.browser;
        b.open_phase(1).await;
        assert_eq!(b.sideways_overflow().await, 0, "{name} cycle");
        b.screenshot(&format!("{name}-cycle")).await;
        for fragment in ["#/unit", "#/results"] {
            b.click(&format!("nav.areas a[href='{fragment}']")).await;
            b.wait_for(&area_shown(&fragment[2..]))
                .await;
            assert_eq!(b.sideways_overflow().await, 0, "{name} {fragment}");
            b.screenshot(&format!("{name}-{}", &fragment[2..])).await;
        }
        app.finish().await;
    }
    let app = AppSession::start_at("projector", Viewport::PROJECTOR, "#/results").await;
    let b = &app.browser;
    let normal = b
        .eval("return parseFloat(getComputedStyle(document.querySelector('.figure dd')).fontSize);")
        .await;
    b.click(".segmented[aria-label='Display'] button:nth-child(1)")
        .await;
    b.wait_for(".shell.presenter").await;
    let large = b
        .eval("return parseFloat(getComputedStyle(document.querySelector('.figure dd')).fontSize);")
        .await;
    assert!(large.as_f64() > normal.as_f64(), "{large} > {normal}");
    // Charts come first in the presenter view.
    let chart_first = b.eval("const c = document.querySelector('.results .chart').getBoundingClientRect().top, t = document.querySelector('.results .totals').getBoundingClientRect().top; return c < t;").await;
    assert_eq!(chart_first, true);
    assert_eq!(b.sideways_overflow().await, 0);
    b.screenshot("projector").await;
    b.click(".segmented[aria-label='Display'] button:nth-child(2)")
        .await;
    b.wait_for(".shell.contrast").await;
    b.screenshot("projector-contrast").await;
    app.finish().await;
}

/// Once the user edits the example it is theirs: the banner and the mark go, the invented
/// notes, site and "(example)" go, the figures stay, and the printed report never calls it an
/// example; the job's notes are a field of its own.
#[tokio::test]
async fn an_edited_example_becomes_the_users_own_job() {
    let app = AppSession::start("claim_example", Viewport::PHONE).await;
    let b = &app.browser;
    b.wait_for(".example-banner").await;
    b.open_phase(1).await;
    b.fill(&field("cycle[1].load.force_n"), "250").await;
    let stored = b
        .stored_job_when(|j| j["cycle"][1]["load"]["force_n"].as_f64() == Some(250e3))
        .await;
    assert!(
        stored.get("example").is_none_or(|e| e == false),
        "the stored job is no longer an example: {}",
        stored["example"]
    );
    assert_eq!(stored["notes"].as_str().unwrap_or_default(), "");
    assert_eq!(stored["name"], "Scrap baler");
    assert_eq!(b.count(".example-banner").await, 0, "the banner is gone");
    // The printed report says nothing of an example.
    b.eval("location.hash = '#/report'; return null;").await;
    b.wait_for(".report").await;
    let report = b.text("main").await;
    assert!(!report.contains("Example data"), "{report}");
    assert!(!report.contains("invented"), "{report}");
    // The job's notes are the user's to write.
    b.eval("location.hash = '#/jobs'; return null;").await;
    b.fill("[data-path='notes']", "Baler 3, measured 2 Dec")
        .await;
    b.stored_job_when(|j| j["notes"] == "Baler 3, measured 2 Dec")
        .await;
    app.finish().await;
}

/// The results rank the phases by their energy over one cycle, as the engine does, and say
/// both the pressure a phase needs and the pressure the pump works at where they differ: the
/// demo's 25 s of loading scrap over the relief outranks its 4 s dwell at the same power.
#[tokio::test]
async fn the_results_rank_phases_by_their_energy_per_cycle() {
    let app = AppSession::start_at("energy_rank", Viewport::PHONE, "#/results").await;
    let b = &app.browser;
    let job = scrap_baler();
    let report = solve(&job).unwrap();
    let ranked = phasewise::engine::phases_by_energy(&job, &report, 0);
    b.wait_for("[data-energy-rank] li").await;
    let shown = b
        .eval("return [...document.querySelectorAll('[data-energy-rank] li')].map(l => Number(l.dataset.phase));")
        .await;
    let expected: Vec<usize> = ranked.iter().map(|e| e.phase).collect();
    assert_eq!(shown, serde_json::json!(expected), "the engine's order");
    let first = job.cycle[ranked[0].phase].name.clone();
    assert_eq!(first, "Load scrap");
    let dwell = b
        .text("[data-energy-rank] li[data-phase='2'] [data-value='pressures']")
        .await;
    assert_eq!(dwell, "needs 160.0 bar, pump at 210.0 bar");
    let share = b
        .text("[data-energy-rank] li[data-phase='4'] [data-value='energy']")
        .await;
    assert!(
        share.ends_with(&format!("{:.0} % of it", ranked[0].share * 100.0)),
        "{share}"
    );
    b.screenshot("ranked").await;
    app.finish().await;
}

/// Removing a design throws its figures away: one tap brings it back, as it was.
#[tokio::test]
async fn a_removed_design_comes_back_with_undo() {
    let app = AppSession::start_at("undo_design", Viewport::PHONE, "#/unit").await;
    let b = &app.browser;
    let job = scrap_baler();
    b.click(".design-tabs button:nth-child(2)").await;
    b.click("[data-action='remove-design']").await;
    let bar = b
        .wait_for_text("[data-undo]", |t| t.contains("Removed “Proposed”"))
        .await;
    assert!(bar.contains("Undo"), "{bar}");
    let all = job.designs.len();
    b.stored_job_when(|j| j["designs"].as_array().map(Vec::len) == Some(all - 1))
        .await;
    b.click("[data-action='undo']").await;
    let stored = b
        .stored_job_when(|j| j["designs"].as_array().map(Vec::len) == Some(all))
        .await;
    let proposed: phasewise::engine::power_unit::Design =
        serde_json::from_value(stored["designs"][1].clone()).unwrap();
    assert_eq!(proposed, job.designs[1], "the design is back as it was");
    assert_eq!(b.count("[data-undo]").await, 0, "the bar goes once used");
    app.finish().await;
}

/// The out-of-date notice names the field to fix, in words, and takes the user to it.
#[tokio::test]
async fn the_out_of_date_notice_names_the_field_and_goes_to_it() {
    let app = AppSession::start("stale_goes_to_field", Viewport::PHONE).await;
    let b = &app.browser;
    b.open_phase(1).await;
    b.fill(&field("cycle[1].load.force_n"), "-5").await;
    b.click("nav.areas a[href='#/results']").await;
    let notice = b
        .wait_for_text("[data-stale]", |t| t.contains("Go to it"))
        .await;
    assert!(
        notice.contains("Phase 2 (Compress), load force: "),
        "{notice}"
    );
    b.click("[data-go-to='cycle[1].load.force_n']").await;
    b.wait_for("main[data-area='cycle']").await;
    let mut focused = serde_json::Value::Null;
    for _ in 0..40 {
        focused = b
            .eval("return document.activeElement && document.activeElement.dataset.path;")
            .await;
        if focused == "cycle[1].load.force_n" {
            break;
        }
        tokio::time::sleep(std::time::Duration::from_millis(50)).await;
    }
    assert_eq!(
        focused, "cycle[1].load.force_n",
        "the cursor is in the field"
    );
    app.finish().await;
}

/// A field left empty says it needs a value; one holding text says what the engine says of it.
#[tokio::test]
async fn an_empty_field_says_it_needs_a_value() {
    let app = AppSession::start("empty_field", Viewport::PHONE).await;
    let b = &app.browser;
    b.open_phase(1).await;
    let force = field("cycle[1].load.force_n");
    let message = "#f-cycle-1-load-force_n-error";
    b.fill(&force, "").await;
    b.wait_for_text(message, |t| t == "needs a value").await;
    b.fill(&force, "abc").await;
    let said = b
        .wait_for_text(message, |t| !t.is_empty() && t != "needs a value")
        .await;
    assert!(said.contains("type a value"), "{said}");
    b.fill(&force, "300").await;
    b.wait_for_text(message, |t| t.is_empty()).await;
    app.finish().await;
}

/// The charts at a phone and at a projector: every phase named whole above its bar, the time
/// axis's figures below the power panel (not over it), and every segment's figure reachable by
/// a tap and in a table, not by hovering only.
#[tokio::test]
async fn charts_name_phases_whole_keep_the_time_axis_clear_and_give_figures_by_touch() {
    let job = scrap_baler();
    let report = solve(&job).unwrap();
    for (name, viewport) in [
        ("phone", Viewport::PHONE),
        ("projector", Viewport::PROJECTOR),
    ] {
        let app = AppSession::start_at(&format!("charts_{name}"), viewport, "#/results").await;
        let b = &app.browser;
        b.wait_for(".chart rect").await;
        // Names: the phases' own, none cut short, each inside the drawing.
        let labels = b
            .eval(
                "const c = document.querySelector('.results .chart svg'); const box = c.getBoundingClientRect(); \
                 return [...c.querySelectorAll('.chart-label')].map(t => { const r = t.getBoundingClientRect(); \
                 return [t.textContent, r.left >= box.left - 0.5 && r.right <= box.right + 0.5]; });",
            )
            .await;
        let expected: Vec<serde_json::Value> = report.designs[0]
            .phases
            .iter()
            .map(|p| serde_json::json!([p.name, true]))
            .collect();
        assert_eq!(labels, serde_json::Value::Array(expected), "{name}");
        // The time axis's figures sit below the last panel's baseline.
        let clear = b
            .eval(
                "const panels = [...document.querySelectorAll('.timeline-panel line, .timeline-panel polyline')].map(p => p.getBoundingClientRect().bottom); \
                 const ticks = [...document.querySelectorAll('.time-tick')].map(t => t.getBoundingClientRect().top); \
                 return ticks.length > 0 && panels.length >= 3 && ticks.every(t => t >= Math.max(...panels));",
            )
            .await;
        assert_eq!(clear, true, "{name}: time-axis figures drawn over a panel");
        // A tap on a segment reads its figure out in words.
        let first = report.designs[0].phases[0].name.clone();
        let said = b
            .eval("const r = document.querySelector('.results .chart rect[tabindex]'); r.dispatchEvent(new MouseEvent('click', {bubbles: true})); return r.getAttribute('aria-label');")
            .await;
        let said = said.as_str().unwrap_or_default().to_string();
        assert!(said.starts_with(&format!("{first}: ")), "{said}");
        b.wait_for_text(".results .chart-readout", |t| t == said)
            .await;
        // The table holds a row for every drawn segment and one per bar.
        let segments = b
            .count(".results .chart:first-of-type rect[tabindex]")
            .await;
        let table_rows = b
            .count(".results .chart:first-of-type .chart-figures tr")
            .await;
        assert_eq!(
            table_rows,
            segments + report.designs[0].phases.len(),
            "{name}"
        );
        b.screenshot(&format!("charts-{name}")).await;
        app.finish().await;
    }
}

/// Text that is not a number stays in its field while the user looks elsewhere: the job holds no
/// number there, but the field shows what was typed (to correct it) when the user comes back.
#[tokio::test]
async fn text_left_invalid_survives_a_move_to_another_area() {
    let app = AppSession::start("invalid_text_kept", Viewport::PHONE).await;
    let b = &app.browser;
    b.open_phase(1).await;
    let bore = field("cycle[1].cylinder.bore_m");
    b.fill(&bore, "12o").await;
    b.wait_for(".field.invalid").await;
    b.click("nav.areas a[href='#/results']").await;
    b.wait_for(".stale-notice").await;
    b.click("nav.areas a[href='#/cycle']").await;
    b.open_phase(1).await;
    assert_eq!(b.value(&bore).await, "12o");
    assert_eq!(b.count(".field.invalid").await, 1);
    // Corrected, the number is the job's again and nothing is kept aside.
    b.fill(&bore, "125").await;
    b.click("nav.areas a[href='#/results']").await;
    b.click("nav.areas a[href='#/cycle']").await;
    b.open_phase(1).await;
    assert_eq!(
        b.value(&bore).await,
        Measure::Length.format(UnitSystem::Si, 0.125)
    );
    app.finish().await;
}

/// The presenter view at 1920x1080, for a class: the field being changed and the figures and
/// chart it moves on one screen, the headline figures above the fold, each figure's value before
/// the change kept beside the new one, every text legible from the back of the room (the size
/// rule is in style/main.css: no text under 27 px), and the view remembered after a reload.
#[tokio::test]
async fn the_presenter_view_shows_a_change_beside_what_it_moves_legibly_and_is_remembered() {
    let app = AppSession::start_at("presenter", Viewport::PROJECTOR, "#/results").await;
    let b = &app.browser;
    b.click(".segmented[aria-label='Display'] button:nth-child(1)")
        .await;
    b.wait_for(".shell.presenter").await;
    b.client().refresh().await.unwrap();
    b.wait_for(phasewise_harness::browser::APP_READY).await;
    b.wait_for(".shell.presenter").await;

    b.click("nav.areas a[href='#/cycle']").await;
    b.wait_for("[data-presenter-panel] [data-presenter='average']")
        .await;
    b.open_phase(1).await;
    let before = b.text("[data-presenter='average']").await;
    let force = field("cycle[1].load.force_n");
    b.fill(&force, "250").await;
    let after = b
        .wait_for_text("[data-presenter='average']", |t| t != before)
        .await;
    assert_eq!(
        b.text("[data-ghost='average']").await,
        format!("before: {before}"),
        "now {after}"
    );

    let layout = b
        .eval(&format!(
            "const r = s => document.querySelector(s).getBoundingClientRect(), h = innerHeight; \
             const field = r(\"{force}\"), figures = r('.presenter-figures'), chart = r('[data-presenter-panel] .chart svg'); \
             return {{ field: field.top >= 0 && field.bottom <= h, figures: figures.top >= 0 && figures.bottom <= h, \
                       chart: chart.top < h - 100, beside: chart.left >= field.right }};",
        ))
        .await;
    assert_eq!(
        layout,
        serde_json::json!({"field": true, "figures": true, "chart": true, "beside": true}),
        "the change and what it moves on one screen"
    );
    let small = b
        .eval(
            "const out = [], walk = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT); \
             while (walk.nextNode()) { const t = walk.currentNode, el = t.parentElement; \
               if (!el || !t.textContent.trim()) continue; const rect = el.getBoundingClientRect(); \
               if (rect.width === 0 || rect.height === 0 || getComputedStyle(el).visibility === 'hidden') continue; \
               if (rect.bottom < 0 || rect.top > innerHeight) continue; \
               const svg = el.closest('svg'); let size = parseFloat(getComputedStyle(el).fontSize); \
               if (svg) size *= svg.getBoundingClientRect().width / svg.viewBox.baseVal.width; \
               if (size < 27 - 0.01) out.push(size.toFixed(1) + ' px: ' + t.textContent.trim().slice(0, 30) + ' (' + el.tagName.toLowerCase() + '.' + String(el.className.baseVal ?? el.className) + ')'); } \
             return out;",
        )
        .await;
    assert_eq!(small, serde_json::json!([]), "text under the size rule");
    assert_eq!(b.sideways_overflow().await, 0);
    b.screenshot("presenter-view").await;
    app.finish().await;
}
