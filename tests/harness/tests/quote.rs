//! The retrofit quote in headless Chromium. On a phone, the demo job's comparison is the
//! engine's own (`quote::columns`, run natively on the same job), rounded and exact, and a
//! site figure typed in changes it as the engine says. The report prints (DevTools
//! `Page.printToPDF`, A4 and US Letter) to a PDF whose text (poppler's `pdftotext`) holds the
//! job's name, each design's energy a year and the payback as the screen shows them, on light
//! pages even in high-contrast mode; the pages are rendered to PNG (`pdftoppm`) under
//! target/screenshots/quote_report for a look, and the page counts are printed.

use base64::Engine as _;
use phasewise::engine::{demo, quote, Job};
use phasewise::formats::quote_text::{self, Precision, Row};
use phasewise_harness::browser::{AppSession, Browser, Viewport};
use serde_json::{json, Value};
use std::path::Path;
use std::process::Command;

/// Every shown row of a comparison table: (row key, each design's cell text).
async fn table(b: &Browser, precision: &str) -> Vec<(String, Vec<String>)> {
    let script = format!(
        "return [...document.querySelectorAll(\"[data-quote-table='{precision}'] tr[data-quote-row]\")]
           .map(r => [r.dataset.quoteRow, [...r.querySelectorAll('td')].map(td => td.textContent)]);"
    );
    let rows: Vec<(String, Vec<String>)> = serde_json::from_value(b.eval(&script).await).unwrap();
    rows
}

/// The table the engine's comparison of `job` gives, worded as the app words it.
fn expected(job: &Job, precision: Precision) -> Vec<(String, Vec<String>)> {
    let report = phasewise::engine::solve(job).unwrap();
    let columns = quote::columns(job, &report);
    Row::DESIGN
        .iter()
        .chain(Row::SAVING.iter())
        .filter(|row| row.shown_for(&columns))
        .map(|&row| {
            let cells = columns
                .iter()
                .map(|c| {
                    quote_text::cell(row, c, job.units, &job.site.currency, precision)
                        .unwrap_or_else(|| "–".into())
                })
                .collect();
            (row.key().to_string(), cells)
        })
        .collect()
}

/// Waits (up to 5 s) until the table shown is `want`; fails with both.
async fn wait_for_table(b: &Browser, precision: &str, want: &[(String, Vec<String>)]) {
    let mut shown = Vec::new();
    for _ in 0..100 {
        shown = table(b, precision).await;
        if shown == want {
            return;
        }
        tokio::time::sleep(std::time::Duration::from_millis(50)).await;
    }
    panic!("the {precision} table shows\n{shown:#?}\nthe engine says\n{want:#?}");
}

#[tokio::test]
async fn the_demo_comparison_on_a_phone_is_the_engines() {
    let app = AppSession::start_at("quote_comparison", Viewport::PHONE, "#/quote").await;
    let b = &app.browser;
    // The first start opens the demo job: the engine works the same job natively.
    let mut job = demo::scrap_baler();
    assert!(job.designs.len() >= 2, "the demo compares two designs");
    let report = phasewise::engine::solve(&job).unwrap();
    let columns = quote::columns(&job, &report);
    // The expected differences: the proposed unit saves energy and money, so it pays back.
    let saving = columns[1].against_baseline.unwrap();
    assert!(saving.energy_kwh_per_year > 0.0 && saving.payback_years.is_some());

    wait_for_table(b, "customer", &expected(&job, Precision::ForCustomer)).await;
    let payback = b
        .text("[data-quote-table='customer'] tr[data-quote-row='payback'] td[data-design='1']")
        .await;
    assert!(payback.ends_with("years"), "{payback}");
    // The baseline is marked as such where power units stand side by side.
    let baseline = format!("{} (baseline)", job.designs[0].name);
    assert_eq!(
        b.text("[data-quote-table='customer'] thead th[data-design='0']")
            .await,
        baseline
    );
    assert_eq!(
        b.text("[data-quote-table='customer'] thead th[data-design='1']")
            .await,
        job.designs[1].name
    );
    assert_eq!(
        b.sideways_overflow().await,
        0,
        "the page stays within the phone"
    );
    b.screenshot("comparison-phone").await;
    b.screenshot_of(".quote .card", "comparison-table").await;
    b.screenshot_of(".quote .chart", "energy-chart").await;

    b.click("[data-precision='exact']").await;
    wait_for_table(b, "exact", &expected(&job, Precision::Exact)).await;

    // A new electricity price, typed with a decimal comma, is the engine's new answer.
    b.fill("input[data-path='site.tariff_per_kwh']", "0,31")
        .await;
    job.site.tariff_per_kwh = 0.31;
    wait_for_table(b, "exact", &expected(&job, Precision::Exact)).await;
    // A grid factor adds the CO2 rows.
    b.fill("input[data-path='site.grid_kg_co2_per_kwh']", "0.4")
        .await;
    job.site.grid_factor = Some(0.4);
    wait_for_table(b, "exact", &expected(&job, Precision::Exact)).await;
    assert!(table(b, "exact")
        .await
        .iter()
        .any(|(key, _)| key == "co2-saved"));
    // Text where the price goes: a message at the field, and no quote from a bad figure.
    b.fill("input[data-path='site.tariff_per_kwh']", "cheap")
        .await;
    let message = b
        .wait_for_text("#f-site-tariff_per_kwh-error", |t| !t.is_empty())
        .await;
    assert!(!message.is_empty());
    // The last good comparison stays, marked as not up to date, so the page does not jump.
    b.wait_for("[data-quote-stale='true']").await;
    b.fill("input[data-path='site.tariff_per_kwh']", "0.31")
        .await;
    b.wait_for("[data-quote-stale='false']").await;
    // The proposed design's own retrofit price: its payback uses it.
    b.fill("input[data-path='designs[1].retrofit_price']", "5000")
        .await;
    job.designs[1].retrofit_price = Some(5000.0);
    wait_for_table(b, "exact", &expected(&job, Precision::Exact)).await;
    // The tabs that pick the power unit shown mark the baseline the same way.
    b.click("nav.areas a[href='#/results']").await;
    assert_eq!(
        b.text(".design-tabs [data-design='0']").await,
        format!("{} (baseline)", job.designs[0].name)
    );
    app.finish().await;
}

/// Runs a poppler tool; its standard output.
fn poppler(program: &str, args: &[&str]) -> String {
    let out = Command::new(program)
        .args(args)
        .output()
        .unwrap_or_else(|e| panic!("{program} did not run (poppler-utils): {e}"));
    assert!(
        out.status.success(),
        "{program} {args:?}: {}",
        String::from_utf8_lossy(&out.stderr)
    );
    String::from_utf8_lossy(&out.stdout).into_owned()
}

/// Text with every white space removed: pdftotext breaks lines and spaces as the layout falls.
fn squeezed(text: &str) -> String {
    text.chars().filter(|c| !c.is_whitespace()).collect()
}

fn page_count(pdf: &Path) -> usize {
    let info = poppler("pdfinfo", &[pdf.to_str().unwrap()]);
    info.lines()
        .find_map(|l| l.strip_prefix("Pages:"))
        .and_then(|n| n.trim().parse().ok())
        .unwrap_or_else(|| panic!("no page count in\n{info}"))
}

#[tokio::test]
async fn the_report_prints_to_a_clean_pdf_on_a4_and_letter() {
    let app = AppSession::start_at("quote_report", Viewport::LAPTOP, "#/results").await;
    let b = &app.browser;
    // The printed page is light whatever the screen shows: high contrast on.
    b.click(".segmented[aria-label='Display'] button:nth-child(2)")
        .await;
    b.click("nav.areas a[href='#/quote']").await;
    b.click("[data-action='open-report']").await;
    b.wait_for("[data-report='true']").await;
    let job = demo::scrap_baler();
    let shown_job = b.text("[data-report-job]").await;
    assert_eq!(shown_job, job.name);
    let energy: Vec<String> = serde_json::from_value(
        b.eval("return [...document.querySelectorAll(\"[data-quote-table='customer'] tr[data-quote-row='annual-energy'] td\")].map(td => td.textContent);")
            .await,
    )
    .unwrap();
    assert_eq!(energy.len(), job.designs.len());
    let payback = b
        .text("[data-quote-table='customer'] tr[data-quote-row='payback'] td[data-design='1']")
        .await;

    // The print rules, as the print media applies them.
    b.devtools("Emulation.setEmulatedMedia", json!({ "media": "print" }))
        .await;
    let print: Value = b
        .eval(
            "const css = s => getComputedStyle(document.querySelector(s));
             return {
               nav: css('nav.areas').display,
               tools: css('.report-tools').display,
               shell: css('.shell').backgroundColor,
               text: css('.report-job').color,
               table: css('.report-block:not(.report-opening) table').breakInside,
               opening: css('.report-opening table').breakInside,
               figure: css('.report .chart').breakInside,
             };",
        )
        .await;
    assert_eq!(
        print,
        json!({
            "nav": "none", "tools": "none",
            "shell": "rgb(255, 255, 255)", "text": "rgb(0, 0, 0)",
            "table": "avoid", "figure": "avoid",
            // The summary's table may run on to page two so the summary starts on page one.
            "opening": "auto",
        }),
        "print styles"
    );
    b.devtools("Emulation.setEmulatedMedia", json!({ "media": "" }))
        .await;

    let shots = b.shots_dir().to_path_buf();
    for (paper, width_in, height_in) in [("a4", 8.27, 11.69), ("letter", 8.5, 11.0)] {
        let printed = b
            .devtools(
                "Page.printToPDF",
                json!({
                    "paperWidth": width_in, "paperHeight": height_in,
                    "printBackground": true,
                    "marginTop": 0, "marginBottom": 0, "marginLeft": 0, "marginRight": 0,
                }),
            )
            .await;
        let bytes = base64::engine::general_purpose::STANDARD
            .decode(printed["data"].as_str().expect("PDF data"))
            .unwrap();
        let pdf = shots.join(format!("report-{paper}.pdf"));
        std::fs::write(&pdf, &bytes).unwrap();
        let pages = page_count(&pdf);
        println!("demo report, {paper}: {pages} pages, {} bytes", bytes.len());

        let text = squeezed(&poppler("pdftotext", &[pdf.to_str().unwrap(), "-"]));
        for wanted in [job.name.as_str(), payback.as_str(), "Assumptions", "Safety"]
            .into_iter()
            .chain(energy.iter().map(String::as_str))
        {
            assert!(
                text.contains(&squeezed(wanted)),
                "{paper}: the PDF lacks “{wanted}”"
            );
        }
        // The summary starts on page one: the job, what it saves and the payback are there,
        // not pushed over by a block that would not fit beside them.
        let first_page = squeezed(&poppler(
            "pdftotext",
            &["-f", "1", "-l", "1", pdf.to_str().unwrap(), "-"],
        ));
        for wanted in [job.name.as_str(), payback.as_str(), "Powerunitscompared"]
            .into_iter()
            .chain(energy.iter().map(String::as_str))
        {
            assert!(
                first_page.contains(&squeezed(wanted)),
                "{paper}: page 1 lacks “{wanted}”: {first_page}"
            );
        }
        for unwanted in ["Printorsaveas", "Backtothequote"] {
            assert!(
                !text.contains(unwanted),
                "{paper}: the PDF shows “{unwanted}”"
            );
        }

        let rendered_here = |p: &Path| {
            let name = p.file_name().unwrap().to_string_lossy().into_owned();
            name.starts_with(&format!("report-{paper}-")) && name.ends_with(".png")
        };
        let pngs = || {
            let mut found: Vec<_> = std::fs::read_dir(&shots)
                .unwrap()
                .filter_map(|e| e.ok().map(|e| e.path()))
                .filter(|p| rendered_here(p))
                .collect();
            found.sort();
            found
        };
        // A longer report's pages from an earlier run would stay beside this one's.
        for old in pngs() {
            std::fs::remove_file(old).unwrap();
        }
        let prefix = shots.join(format!("report-{paper}"));
        poppler(
            "pdftoppm",
            &[
                "-png",
                "-r",
                "50",
                pdf.to_str().unwrap(),
                prefix.to_str().unwrap(),
            ],
        );
        let rendered = pngs();
        assert_eq!(rendered.len(), pages, "{paper}: one PNG per page");
        // Light pages: the first page is mostly white.
        let first = image::open(&rendered[0]).unwrap().to_luma8();
        let mean = first.pixels().map(|p| p.0[0] as f64).sum::<f64>() / first.pixels().len() as f64;
        assert!(
            mean > 200.0,
            "{paper}: page 1 is dark (mean {mean:.0} of 255)"
        );
    }
    app.finish().await;
}
