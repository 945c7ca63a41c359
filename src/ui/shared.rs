//! What several areas show alike: the example banner, the live figures strip, the power-unit
//! tabs, the not-up-to-date notice with its way to each field, the settings caution, the
//! older-baseline notice and the pump-test verdicts. Each area imports these; they import no
//! area.

use super::icons::CautionIcon;
use super::state::use_job;
use crate::engine::efficiency::{PumpTest, TestReport, Verdict, READINGS_FOR_VERDICT};
use crate::engine::motor::EfficiencyClass;
use crate::engine::power_unit::Design;
use crate::engine::pump_test::MotorEfficiency;
use crate::engine::units::{Measure, UnitSystem};
use crate::engine::{Job, JobReport};
use leptos::prelude::*;

/// The power unit `d` of a report, or its last one when `d` is past the end (a power unit just
/// removed): what every view of "the power unit shown" reads.
pub(super) fn shown_design(report: &JobReport, d: usize) -> Option<&crate::engine::DesignReport> {
    report
        .designs
        .get(d.min(report.designs.len().saturating_sub(1)))
}

/// Says the job is invented example data, while it is.
#[component]
pub fn ExampleBanner() -> impl IntoView {
    let state = use_job();
    let example = Memo::new(move |_| state.job.with(|j| j.example));
    view! {
        <Show when=move || example.get()>
            <p class="example-banner" role="note">
                <strong>"Example data. "</strong>
                "An invented machine to show how Phasewise works: change any figure, or describe your own."
            </p>
        </Show>
    }
}

/// The index a field path gives right after `prefix`: 1 for `cycle[1].load.force_n` after
/// `cycle[`.
pub(super) fn index_after(field: &str, prefix: &str) -> Option<usize> {
    field
        .strip_prefix(prefix)
        .and_then(|rest| rest.split(']').next())
        .and_then(|n| n.parse::<usize>().ok())
}

/// Where a field path points, in words: "Phase 3 (Dwell)" or "Power unit “Proposed”".
pub fn place_of(field: &str, job: &Job) -> String {
    let index = |prefix: &str| index_after(field, prefix);
    if let Some(i) = index("cycle[") {
        let name = job.cycle.get(i).map(|p| p.name.as_str()).unwrap_or("");
        return format!("Phase {} ({name})", i + 1);
    }
    if let Some(i) = index("designs[") {
        let name = job.designs.get(i).map(|d| d.name.as_str()).unwrap_or("");
        return format!("Power unit “{name}”");
    }
    match field.split('.').next() {
        Some("site") => "Site".into(),
        Some("oil") => "Oil".into(),
        Some("tank") => "Tank".into(),
        Some("warm_up") => "Warm-up readings".into(),
        _ => "Job".into(),
    }
}

/// The area that holds a field, by its path.
pub fn area_of(field: &str) -> super::area::Area {
    use super::area::Area;
    match field.split(['.', '[']).next().unwrap_or_default() {
        "cycle" => Area::Cycle,
        "designs" => Area::PowerUnit,
        "site" => Area::Quote,
        "oil" | "tank" | "warm_up" => Area::Heat,
        "advice" | "staging" => Area::Settings,
        "pump_tests" | "wear" => Area::PumpTest,
        "motor_checks" => Area::MotorCheck,
        _ => Area::Jobs,
    }
}

/// Opens the area holding `field` (the phase or design it belongs to first) and puts the
/// cursor in it.
pub(super) fn go_to_field(state: super::state::JobState, field: String) {
    let index = |prefix: &str| index_after(&field, prefix);
    if let Some(i) = index("cycle[") {
        state.open_phase.set(Some(i));
    }
    if let Some(i) = index("designs[") {
        state.design.set(i);
    }
    let _ = window().location().set_hash(&area_of(&field).href());
    // Once the area has drawn, the field takes the cursor and comes into view.
    let _ = set_timeout_with_handle(
        move || {
            let selector = format!("[data-path='{field}']");
            if let Ok(Some(el)) = document().query_selector(&selector) {
                el.scroll_into_view();
                if let Ok(input) = wasm_bindgen::JsCast::dyn_into::<web_sys::HtmlInputElement>(el) {
                    let _ = input.focus();
                }
            }
        },
        std::time::Duration::from_millis(150),
    );
}

/// The shown power unit's name and the headline figures every view of it leads with, in
/// words: average input, heat into the oil, cycle time.
pub fn headline_figures(
    report: &JobReport,
    design: usize,
    units: UnitSystem,
) -> Option<(String, [String; 3])> {
    let design = shown_design(report, design)?;
    let t = &design.totals;
    Some((
        design.name.clone(),
        [
            Measure::Power.with_unit(units, t.average_electrical.value),
            Measure::Heat.with_unit(units, t.heat_load.value),
            Measure::Duration.with_unit(units, t.cycle_time.value),
        ],
    ))
}

/// A strip of the key figures, shown while editing so every change shows its effect at once.
/// Its markup stays; only its texts change, so an edit costs a solve and three text updates.
#[component]
pub fn LiveSummary() -> impl IntoView {
    let state = use_job();
    let figures = Memo::new(move |_| {
        let units = state.units();
        let d = state.design.get();
        let pick = |report: &JobReport| headline_figures(report, d, units);
        match state.result.with(|r| r.as_ref().ok().and_then(|r| pick(r))) {
            Some((name, values)) => Some((false, name, values)),
            None => state
                .last_good
                .with(|g| g.as_ref().and_then(|r| pick(r)))
                .map(|(name, values)| (true, name, values)),
        }
    });
    let stale = move || figures.with(|f| f.as_ref().is_some_and(|f| f.0));
    let name = move || {
        figures.with(|f| {
            f.as_ref().map(|(stale, name, _)| {
                if *stale {
                    format!("{name} (not up to date)")
                } else {
                    name.clone()
                }
            })
        })
    };
    let value = move |i: usize| move || figures.with(|f| f.as_ref().map(|f| f.2[i].clone()));
    view! {
        <Show when=move || figures.with(|f| f.is_some())>
            <a class="live-summary" class:stale=stale href="#/results" aria-live="polite">
                <span class="live-name">{name}</span>
                <span class="live-figure"><span class="live-label">"Average"</span><strong data-live="average">{value(0)}</strong></span>
                <span class="live-figure"><span class="live-label">"Heat"</span><strong data-live="heat">{value(1)}</strong></span>
                <span class="live-figure"><span class="live-label">"Cycle"</span><strong data-live="cycle-time">{value(2)}</strong></span>
            </a>
        </Show>
    }
}

/// Says the results are not for the job as it now stands, and why.
#[component]
pub fn StaleNotice() -> impl IntoView {
    let state = use_job();
    move || {
        state.result.with(|r| r.as_ref().err().cloned()).map(|errors| {
            let job = state.job.get();
            let count = errors.len();
            view! {
                <div class="stale-notice" role="alert" data-stale="true">
                    <strong>{if state.last_good.with(|g| g.is_some()) { "Not up to date. " } else { "No results yet. " }}</strong>
                    {format!(
                        "{count} {} to fix; the figures below are from the last valid entries.",
                        if count == 1 { "figure" } else { "figures" }
                    )}
                    <ul>
                        {errors.iter().take(5).map(|e| {
                            let field = e.field.clone();
                            view! {
                                <li>
                                    {format!("{}, {}: {} ", place_of(&e.field, &job), e.words, e.message)}
                                    <a href=area_of(&e.field).href() data-go-to=e.field.clone()
                                        on:click=move |ev| { ev.prevent_default(); go_to_field(state, field.clone()); }>
                                        "Go to it"
                                    </a>
                                </li>
                            }
                        }).collect_view()}
                    </ul>
                </div>
            }
        })
    }
}

/// Tabs choosing the design shown, shared by the unit and results areas.
#[component]
pub fn DesignTabs() -> impl IntoView {
    let state = use_job();
    let names = move || {
        state
            .job
            .with(|j| j.designs.iter().map(|d| d.name.clone()).collect::<Vec<_>>())
    };
    view! {
        <div class="segmented design-tabs" role="group" aria-label="Power unit shown">
            {move || {
                names()
                    .into_iter()
                    .enumerate()
                    .map(|(i, name)| {
                        view! {
                            <button
                                type="button"
                                class="toggle"
                                data-design=i
                                aria-pressed=move || if state.design_index() == i { "true" } else { "false" }
                                on:click=move |_| state.design.set(i)
                            >
                                {if name.trim().is_empty() { format!("Power unit {}", i + 1) } else { name }}
                                {(i == 0).then(|| view! { <span class="role-tag">" (baseline)"</span> })}
                            </button>
                        }
                    })
                    .collect_view()
            }}
        </div>
    }
}

/// The caution shown beside every group of pressure settings.
#[component]
pub(super) fn SettingsCaution() -> impl IntoView {
    view! {
        <p class="inline-caution">
            <CautionIcon />
            <span>
                "Pressure settings are changed only by a qualified person, with the machine locked out and pressure released, and never above any component's rating. "
                <a href="#/safety">"Safety"</a>
            </span>
        </p>
    }
}

/// A variable-speed drive in one line, as the user entered it.
pub fn drive_words(
    drive: &crate::engine::drive::VariableSpeed,
    units: crate::engine::units::UnitSystem,
) -> String {
    use crate::engine::drive::{ConverterClass, ConverterLoss, DriveKind};
    let kind = match drive.kind {
        DriveKind::InductionOnInverter => "induction motor on an inverter",
        DriveKind::Servo => "servo motor and drive",
    };
    let loss = match drive.converter_loss {
        ConverterLoss::Class { class } => match class {
            ConverterClass::IE0 => "IE0".to_string(),
            ConverterClass::IE1 => "IE1".to_string(),
            ConverterClass::IE2 => "IE2".to_string(),
        },
        ConverterLoss::Stated { share } => format!(
            "losing {} at 90 % speed and full current",
            Measure::Percent.with_unit(units, share)
        ),
        ConverterLoss::Points { shares } => format!(
            "losing {} at 90 % speed and full current (the maker's eight figures)",
            Measure::Percent.with_unit(units, shares[7])
        ),
    };
    format!(
        "Variable-speed drive: {kind}, pumps turned {} to {}; converter {}, {loss}",
        Measure::ShaftSpeed.with_unit(units, drive.min_speed.value),
        Measure::ShaftSpeed.with_unit(units, drive.max_speed.value),
        Measure::ApparentPower.with_unit(units, drive.converter_rating.value),
    )
}

/// A design's machine in one line: its motor and pumps, as the user entered them.
pub fn machine_words(design: &Design, units: crate::engine::units::UnitSystem) -> String {
    let pumps: Vec<String> = design
        .pumps()
        .map(|p| Measure::Displacement.with_unit(units, p.displacement.value))
        .collect();
    format!(
        "motor {} at {}; pumps {}",
        Measure::Power.with_unit(units, design.motor.rated_power.value),
        Measure::ShaftSpeed.with_unit(units, design.motor.full_load_speed.value),
        pumps.join(" + ")
    )
}

/// Shown on a proposal made from an earlier "as found" whose machine has changed since: what
/// the proposal still holds, what "as found" holds now, and a button that makes the proposal
/// again from today's baseline (undoable where `place` shows its bar).
#[component]
pub fn OlderBaselineNotice(place: &'static str) -> impl IntoView {
    let state = use_job();
    let older = Memo::new(move |_| {
        let d = state.design_index();
        state.job.with(|j| {
            let baseline = j.designs.first()?;
            let design = j
                .designs
                .get(d)
                .filter(|x| d > 0 && x.made_from_older(baseline))?;
            Some((
                d,
                design.name.clone(),
                baseline.name.clone(),
                machine_words(design, j.units),
                machine_words(baseline, j.units),
            ))
        })
    });
    move || {
        older.get().map(|(d, name, baseline, theirs, now)| {
            let what = format!("Made “{name}” again from today's “{baseline}”");
            let rebuild = move |_: leptos::ev::MouseEvent| {
                let what = what.clone();
                state.change_with_undo(place, what, |j| j.rebuild_from_baseline(d));
            };
            view! {
                <div class="older-baseline" role="status" data-older-baseline="true">
                    <p><strong>{format!("“{name}” was made from an earlier “{baseline}”.")}</strong>
                        " The machine found has changed since, and this power unit still holds the one it was made from."</p>
                    <ul>
                        <li data-machine="proposal">{format!("{name}: {theirs}")}</li>
                        <li data-machine="baseline">{format!("{baseline} now: {now}")}</li>
                    </ul>
                    <button type="button" class="button" data-action="rebuild-proposal" on:click=rebuild>
                        {format!("Make “{name}” again from today's “{baseline}”")}
                    </button>
                </div>
            }
        })
    }
}

/// A test's verdict in words, with its style class and its short name (`good`, `watch`,
/// `worn`, `none`): the pump-check area, the quote and the report say it the same way.
pub(super) fn verdict_words(
    test: &PumpTest,
    report: &TestReport,
) -> (&'static str, String, &'static str) {
    let (used, total) = (report.readings_used, test.readings.len());
    let basis = match report.readings_rejected {
        0 => format!("Judged on {used} readings."),
        1 => format!("Judged on {used} readings; 1 left out (its note says why)."),
        n => format!("Judged on {used} readings; {n} left out (their notes say why)."),
    };
    match report.verdict {
        Verdict::Good {
            volumetric_at_rated,
        } => (
            "verdict good",
            format!(
                "In good order: {} volumetric efficiency predicted at its rated pressure. {basis}",
                percent(Some(volumetric_at_rated))
            ),
            "good",
        ),
        Verdict::Watch {
            volumetric_at_rated,
        } => (
            "verdict watch",
            format!(
                "Wearing: {} predicted at its rated pressure. Test it again sooner. {basis}",
                percent(Some(volumetric_at_rated))
            ),
            "watch",
        ),
        Verdict::Worn {
            volumetric_at_rated,
        } => (
            "verdict worn",
            format!(
                "Worn: {} predicted at its rated pressure. Plan a repair or a replacement. {basis}",
                percent(Some(volumetric_at_rated))
            ),
            "worn",
        ),
        Verdict::NotJudged => (
            "verdict none",
            if used == 0 {
                "Not judged: no reading can be believed as it stands.".to_string()
            } else if report.problems.iter().any(|p| p.field == "readings") {
                "Not judged: these readings give no leakage line (the readings' notes say why)."
                    .to_string()
            } else {
                format!(
                    "Not judged: a verdict needs at least {READINGS_FOR_VERDICT} believable readings at different test pressures, and {used} of the {total} readings can be believed."
                )
            },
            "none",
        ),
    }
}

/// Each pump test of the job with its verdict, for the quote and the report; nothing when the
/// job has none.
#[component]
pub(super) fn PumpVerdicts() -> impl IntoView {
    let state = use_job();
    move || {
        let lines: Vec<(String, &'static str, String)> = state.job.with(|j| {
            state.pump_tests.with(|outcomes| {
                j.pump_tests
                    .iter()
                    .zip(outcomes.iter())
                    .map(|(test, outcome)| {
                        let (_, words, data) = match outcome {
                            Ok(report) => verdict_words(test, report),
                            Err(_) => (
                                "",
                                "Not judged: the test has figures to fix.".to_string(),
                                "none",
                            ),
                        };
                        let when = if test.date.trim().is_empty() {
                            String::new()
                        } else {
                            format!(", {}", test.date)
                        };
                        (format!("{}{when}", test.pump), data, words)
                    })
                    .collect()
            })
        });
        (!lines.is_empty()).then(|| {
            view! {
                <ul class="pump-verdicts" data-pump-verdicts="true">
                    {lines.into_iter().map(|(which, data, words)| view! {
                        <li data-verdict=data><strong>{format!("{which}: ")}</strong>{words}</li>
                    }).collect_view()}
                </ul>
            }
        })
    }
}

pub(super) fn percent(v: Option<f64>) -> String {
    v.map_or("–".into(), |v| format!("{:.1} %", v * 100.0))
}

/// The choices of where a motor's full-load efficiency comes from (its nameplate or a class's
/// table), as a choice field's options; a pump test and a motor check offer the same.
pub fn efficiency_source_options() -> Vec<(&'static str, String)> {
    vec![
        ("entered", "Its nameplate".to_string()),
        ("ie2", "IE2 table (IEC, 4-pole, 50 Hz)".to_string()),
        ("ie3", "IE3 table (IEC, 4-pole, 50 Hz)".to_string()),
        ("ie4", "IE4 table (IEC, 4-pole, 50 Hz)".to_string()),
        ("nema", "NEMA Premium table (4-pole, 60 Hz)".to_string()),
    ]
}

/// The option key of where an efficiency comes from.
pub fn efficiency_source_key(efficiency: MotorEfficiency) -> &'static str {
    match efficiency {
        MotorEfficiency::Class { class } => match class {
            EfficiencyClass::Ie2 => "ie2",
            EfficiencyClass::Ie3 => "ie3",
            EfficiencyClass::Ie4 => "ie4",
            EfficiencyClass::NemaPremium => "nema",
        },
        MotorEfficiency::Entered { .. } => "entered",
    }
}

/// The efficiency an option key chooses: a class's table, or the nameplate figure `entered`.
pub fn efficiency_from_key(key: &str, entered: f64) -> MotorEfficiency {
    let class = match key {
        "ie2" => EfficiencyClass::Ie2,
        "ie3" => EfficiencyClass::Ie3,
        "ie4" => EfficiencyClass::Ie4,
        "nema" => EfficiencyClass::NemaPremium,
        _ => {
            return MotorEfficiency::Entered {
                efficiency: entered,
            }
        }
    };
    MotorEfficiency::Class { class }
}

#[cfg(test)]
mod tests {
    use super::area_of;
    use crate::ui::area::Area;

    #[test]
    fn a_field_is_found_in_its_area() {
        assert_eq!(area_of("cycle[3].duration_s"), Area::Cycle);
        assert_eq!(
            area_of("designs[0].base_pump.drag_power_w"),
            Area::PowerUnit
        );
        assert_eq!(area_of("site.retrofit_price"), Area::Quote);
        assert_eq!(area_of("advice.margin_min_pa"), Area::Settings);
        assert_eq!(area_of("name"), Area::Jobs);
    }
}
