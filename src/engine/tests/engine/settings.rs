//! The settings advice (engine `settings`): each rule with a case that triggers it and one that
//! does not, and a high-low press whose unloading and relief settings follow from its loads,
//! bore and line losses, worked by hand below. The rules are common practice, with the default
//! margins: 10 % or 7 bar, whichever is more; a flow control's drop 7 bar; cracking 0.97
//! (pilot-operated) or 0.80 (direct-acting) of the setting.

use crate::common::*;
use phasewise_engine::cycle::{Direction, HoldMode};
use phasewise_engine::settings::{self, Action, Advice, Rule, Severity};
use phasewise_engine::units::UnitSystem;
use phasewise_engine::valve::{ActiveLimit, ReliefKind};
use phasewise_engine::{solve, Finding, Job};

use phasewise_engine::units::BAR;

fn rules(advice: &[Advice]) -> Vec<&Rule> {
    advice.iter().map(|a| &a.rule).collect()
}

fn find(advice: &[Advice], pick: impl Fn(&Rule) -> bool) -> Option<&Advice> {
    advice.iter().find(|a| pick(&a.rule))
}

/// An invented high-low press. Ideal pumps (no leakage, no friction) so the powers are
/// pressure x flow: pump 1 40 cm^3/rev (60 L/min at 1500 rpm), the base pump 8 cm^3/rev
/// (12 L/min). Motor 7.5 kW. Cylinder bore 100 mm (7.853982e-3 m^2), rod 56 mm (annulus
/// 5.390973e-3 m^2). Pilot-operated relief, 60 L/min rated.
///
/// - approach: 5 kN / 7.853982e-3 = 6.366 bar, + 4 bar line = 10.366 bar needed. Both pumps:
///   10.366e5 x 1.2e-3 = 1.24 kW, within 7.5 kW: it needs pump 1's flow.
/// - press: 100 kN / 7.853982e-3 = 127.324 bar, + 4 = 131.324 bar. Both pumps: 15.8 kW, over
///   the motor: it should run without pump 1.
/// - return: 3 kN / 5.390973e-3 = 5.564858 bar, + 6 = 11.564858 bar: needs pump 1.
/// - idle 20 s: needs no pressure.
///
/// Unloading window for pump 1: above 11.564858 + max(1.156, 7) = 18.564858 bar, below
/// 131.324 - max(13.132, 7) = 118.19 bar. Main relief: the press's lowest serving limit is
/// max(131.324 x 1.1, 131.324 + 7, 131.324 / 0.97) = max(144.46, 138.32, 135.39) = 144.46 bar,
/// rounded up to 145 bar.
fn high_low(unload_bar: f64, main_bar: f64) -> Job {
    let cycle = high_low_cycle();
    let d = design(
        "As found",
        motor(7.5, 1500.0, 0.9),
        vec![stage(ideal_pump(40.0), unload_bar, 3.0, 0.5)],
        ideal_pump(8.0),
        relief(ReliefKind::PilotOperated, main_bar, 60.0, 0.97),
        4,
    );
    job(cycle, vec![d])
}

#[test]
fn the_high_low_unloading_window_and_main_setting_follow_from_the_loads() {
    // As found: pump 1 unloads at 140 bar, above the press, so it feeds the press, which
    // would overload the motor (a caution); main at 210 bar.
    let job = high_low(140.0, 210.0);
    let needs = settings::phase_needs(&job, &job.designs[0]);
    assert_close(
        needs[0].need.map(|q| q.value).unwrap() / BAR,
        10.366198,
        1e-6,
        "approach need",
    );
    assert_close(
        needs[1].need.map(|q| q.value).unwrap() / BAR,
        131.323954,
        1e-6,
        "press need",
    );
    assert_close(
        needs[2].need.map(|q| q.value).unwrap() / BAR,
        11.564858,
        1e-6,
        "return need",
    );
    assert_eq!(needs[3].need.map(|q| q.value), None);
    assert_close(
        needs[1].lowest.map(|q| q.value).unwrap() / BAR,
        144.456349,
        1e-6,
        "press lowest limit",
    );

    let advice = settings::advise(&job, 0).unwrap();
    let unloading =
        find(&advice, |r| matches!(r, Rule::UnloadingOutside { .. })).expect("unloading advice");
    let Rule::UnloadingOutside {
        pump,
        setting,
        window,
    } = unloading.rule
    else {
        unreachable!()
    };
    assert_eq!(pump, 1);
    assert_close(in_bar(setting), 140.0, 1e-12, "setting now");
    assert_close(window.0 / BAR, 18.564858, 1e-6, "window low");
    assert_close(window.1 / BAR, 118.191559, 1e-6, "window high");
    assert_eq!(unloading.severity, Severity::Caution);
    assert_eq!(
        unloading.action,
        Some(Action::SetUnloading {
            pump: 1,
            pressure: bar_(19.0)
        })
    );
    // Unloading pump 1 in the press: it then runs at 131.3 bar on 12 L/min instead of 72.
    assert!(unloading.annual_saving_kwh > 0.0);

    let main = find(&advice, |r| matches!(r, Rule::MainAboveNeed { .. })).expect("main advice");
    assert_eq!(
        main.action,
        Some(Action::SetMain {
            pressure: bar_(145.0)
        })
    );
    let idle = find(&advice, |r| {
        matches!(r, Rule::NeedsNoPressure { phase: 3, .. })
    })
    .expect("vent the idle");
    assert_eq!(idle.action, Some(Action::VentPhase { phase: 3 }));

    // Settings inside the window and at the rounded main: no unloading or main advice.
    let good = high_low(50.0, 145.0);
    let advice = settings::advise(&good, 0).unwrap();
    assert!(
        !rules(&advice).iter().any(|r| matches!(
            r,
            Rule::UnloadingOutside { .. } | Rule::MainAboveNeed { .. } | Rule::MainBelowNeed { .. }
        )),
        "{advice:#?}"
    );
}

#[test]
fn an_unloading_setting_below_the_window_is_a_caution() {
    // At 15 bar pump 1's unloading sits inside the return's margin (11.6 bar + 7): a pressure
    // peak in the return unloads it and slows it.
    let advice = settings::advise(&high_low(15.0, 145.0), 0).unwrap();
    let a = find(&advice, |r| matches!(r, Rule::UnloadingOutside { .. })).expect("advice");
    assert_eq!(a.severity, Severity::Caution);
}

#[test]
fn no_unloading_setting_can_serve_a_fast_move_and_a_hold_just_above_it() {
    // A direct demand of 72 L/min at 100 bar needs pump 1's flow (the base pump alone gives
    // 12 L/min), and takes all the pumps give, so it runs at 100 bar; a hold at 105 bar should
    // run without it. Window: above 100 + 10 = 110 bar, below 105 - 10.5 = 94.5 bar: empty.
    let cycle = vec![
        direct("fast feed", 72.0, 100.0, 5.0),
        hold("hold", 105.0, 5.0, HoldMode::HeldByPump),
    ];
    let d = design(
        "As found",
        motor(15.0, 1500.0, 0.9),
        vec![stage(ideal_pump(40.0), 102.0, 3.0, 0.5)],
        ideal_pump(8.0),
        relief(ReliefKind::PilotOperated, 160.0, 80.0, 0.97),
        2,
    );
    let advice = settings::advise(&job(cycle, vec![d]), 0).unwrap();
    let a = find(&advice, |r| matches!(r, Rule::UnloadingImpossible { .. })).expect("impossible");
    assert_eq!(a.severity, Severity::Caution);
    assert_eq!(a.action, None);
    let Rule::UnloadingImpossible {
        with_phase,
        with,
        without_phase,
        without,
        ..
    } = a.rule
    else {
        unreachable!()
    };
    assert_eq!((with_phase, without_phase), (0, 1));
    assert_close(in_bar(with), 100.0, 1e-12, "with");
    assert_close(in_bar(without), 105.0, 1e-12, "without");
}

/// One ideal 8 cm^3/rev pump (12 L/min) on a 5.5 kW motor, a metered move at 0.01 m/s on a
/// 100 mm bore (4.712 L/min) against 20 kN: 25.465 bar + 2 bar line + 7 bar for the flow
/// control = 34.465 bar needed; lowest limit max(37.91, 41.465, 35.53) = 41.465 bar -> 42 bar.
fn metered(main_bar: f64, kind: ReliefKind) -> Job {
    let cycle = vec![move_phase(
        "feed",
        100.0,
        56.0,
        200.0,
        Direction::Extend,
        20.0,
        2.0,
        metered_speed(0.01),
    )];
    let cracking = kind.typical_cracking_fraction();
    let d = design(
        "As found",
        motor(5.5, 1500.0, 0.9),
        vec![],
        ideal_pump(8.0),
        relief(kind, main_bar, 60.0, cracking),
        1,
    );
    job(cycle, vec![d])
}

#[test]
fn a_metered_phase_on_a_high_limit_is_offered_the_lowest_that_serves_it() {
    let job = metered(160.0, ReliefKind::PilotOperated);
    let needs = settings::phase_needs(&job, &job.designs[0]);
    assert_close(
        needs[0].need.map(|q| q.value).unwrap() / BAR,
        34.464790,
        1e-6,
        "need",
    );
    assert_close(
        needs[0].lowest.map(|q| q.value).unwrap() / BAR,
        41.464790,
        1e-6,
        "lowest",
    );
    let advice = settings::advise(&job, 0).unwrap();
    let a = find(&advice, |r| {
        matches!(r, Rule::LimitAboveNeed { phase: 0, .. })
    })
    .expect("advice");
    assert_eq!(
        a.action,
        Some(Action::LimitPhase {
            phase: 0,
            pressure: bar_(42.0)
        })
    );

    // Applied to a proposed design (made, since the job has only the baseline): the surplus
    // 12 - 4.712 = 7.288 L/min crosses the relief (each limit read with the pump's 12 L/min over
    // it) at 40.74 + 1.26 x 7.288 / 12 = 41.505 bar instead of 155.2 + 4.8 x 7.288 / 12 =
    // 158.115 bar, so the pump's shaft power falls from 158.115e5 x 2e-4 = 3162.3 W to
    // 41.505e5 x 2e-4 = 830.1 W.
    let (proposed, target) = settings::apply_to_proposed(&job, 0, &a.action.unwrap());
    assert_eq!(target, 1);
    assert_eq!(
        proposed.designs[0], job.designs[0],
        "the baseline is never changed"
    );
    assert_eq!(proposed.designs[1].name, "Proposed");
    assert_eq!(proposed.designs[1].remote_stages, vec![bar_(42.0)]);
    assert_eq!(
        proposed.designs[1].phase_settings[0].limit,
        ActiveLimit::Remote { stage: 0 }
    );
    let report = solve(&proposed).unwrap();
    let shaft = |d: usize| report.designs[d].phases[0].ledger.shaft_power().value;
    // The surplus as a share of the pump's 12 L/min.
    let surplus = (12.0 - 0.01 * 7.853982e-3 * 60000.0) / 12.0;
    assert_close(
        shaft(0),
        (155.2 + 4.8 * surplus) * BAR * 2e-4,
        1e-6,
        "shaft before",
    );
    assert_close(
        shaft(1),
        (42.0 * 0.97 + 42.0 * 0.03 * surplus) * BAR * 2e-4,
        1e-6,
        "shaft after",
    );
    assert_close(
        a.saving.value,
        report.designs[0].phases[0].ledger.electrical_input.value
            - report.designs[1].phases[0].ledger.electrical_input.value,
        1e-9,
        "saving as solved",
    );

    // At 42 bar already: nothing to lower.
    let advice = settings::advise(&metered(42.0, ReliefKind::PilotOperated), 0).unwrap();
    assert!(
        find(&advice, |r| matches!(
            r,
            Rule::LimitAboveNeed { .. } | Rule::MainAboveNeed { .. }
        ))
        .is_none(),
        "{advice:#?}"
    );
}

#[test]
fn a_direct_acting_valve_set_too_close_cracks_into_the_work() {
    // Direct-acting, cracking at 0.80: at 40 bar it passes flow from 32 bar, below the 34.5
    // bar needed. Lowest serving: max(37.91, 41.46, 34.465 / 0.8 = 43.08) = 43.08 -> 44 bar.
    let advice = settings::advise(&metered(40.0, ReliefKind::DirectActing), 0).unwrap();
    let below = find(&advice, |r| matches!(r, Rule::LimitBelowNeed { .. })).expect("below need");
    assert_eq!(below.severity, Severity::Caution);
    assert_eq!(below.action, None, "no vent port for a remote stage");
    let main = find(&advice, |r| matches!(r, Rule::MainBelowNeed { .. })).expect("raise main");
    assert_eq!(
        main.action,
        Some(Action::SetMain {
            pressure: bar_(44.0)
        })
    );
    assert!(find(
        &settings::advise(&metered(44.0, ReliefKind::DirectActing), 0).unwrap(),
        |r| matches!(r, Rule::LimitBelowNeed { .. } | Rule::MainBelowNeed { .. })
    )
    .is_none());
}

#[test]
fn a_need_above_the_pumps_rating_is_a_caution_with_no_setting() {
    // The common pump is rated 250 bar; a hold the pump keeps needs a limit at its own
    // pressure (it sits at its limit), so 255 bar is beyond the rating and 240 bar is not.
    let cycle = vec![hold("hold", 255.0, 5.0, HoldMode::HeldByPump)];
    let d = design(
        "As found",
        motor(5.5, 1500.0, 0.9),
        vec![],
        ideal_pump(8.0),
        relief(ReliefKind::PilotOperated, 245.0, 60.0, 0.97),
        1,
    );
    let advice = settings::advise(&job(cycle, vec![d.clone()]), 0).unwrap();
    let a = find(&advice, |r| matches!(r, Rule::BeyondRating { .. })).expect("beyond rating");
    assert_eq!((a.severity, a.action), (Severity::Caution, None));
    let cycle = vec![hold("hold", 240.0, 5.0, HoldMode::HeldByPump)];
    assert!(find(
        &settings::advise(&job(cycle, vec![d]), 0).unwrap(),
        |r| matches!(r, Rule::BeyondRating { .. })
    )
    .is_none());
}

#[test]
fn settings_above_a_pumps_rating_are_cautions_with_a_setting_inside_it() {
    // Main at 210 bar on a base pump rated 160 bar: a caution, and the cycle's 145 bar
    // (worked in `high_low`) as the action; the "higher than needed" advice is not repeated.
    let mut job = high_low(50.0, 210.0);
    job.designs[0].base_pump.rated_pressure = bar_(160.0);
    let advice = settings::advise(&job, 0).unwrap();
    let a = find(&advice, |r| matches!(r, Rule::MainAboveRating { .. })).expect("main");
    assert_eq!(a.severity, Severity::Caution);
    assert_eq!(
        a.action,
        Some(Action::SetMain {
            pressure: bar_(145.0)
        })
    );
    assert!(find(&advice, |r| matches!(r, Rule::MainAboveNeed { .. })).is_none());

    // Pump 1 rated 100 bar, unloading at 140 bar behind a 0.5 bar check valve: it sees
    // 140.5 bar before it unloads. The action is the window's 19 bar (19.5 bar seen).
    let mut job = high_low(140.0, 145.0);
    job.designs[0].unloading_stages[0].pump.rated_pressure = bar_(100.0);
    let advice = settings::advise(&job, 0).unwrap();
    let a = find(&advice, |r| matches!(r, Rule::UnloadingAboveRating { .. })).expect("pump 1");
    assert_eq!(a.severity, Severity::Caution);
    assert_eq!(
        a.action,
        Some(Action::SetUnloading {
            pump: 1,
            pressure: bar_(19.0)
        })
    );
    let text = a.describe(&job);
    assert!(
        text.explanation.contains("140.5 bar"),
        "{}",
        text.explanation
    );

    // Within the ratings: neither.
    let advice = settings::advise(&high_low(50.0, 145.0), 0).unwrap();
    assert!(!rules(&advice).iter().any(|r| matches!(
        r,
        Rule::MainAboveRating { .. } | Rule::UnloadingAboveRating { .. }
    )));
}

#[test]
fn idles_and_check_held_holds_are_vented_where_the_valve_allows() {
    let locked = vec![
        hold("clamp held by check", 150.0, 30.0, HoldMode::LockedByCheck),
        idle("idle", 20.0),
    ];
    let mk = |kind| {
        design(
            "As found",
            motor(5.5, 1500.0, 0.9),
            vec![],
            ideal_pump(8.0),
            relief(kind, 160.0, 60.0, kind.typical_cracking_fraction()),
            2,
        )
    };
    let advice =
        settings::advise(&job(locked.clone(), vec![mk(ReliefKind::PilotOperated)]), 0).unwrap();
    for phase in [0, 1] {
        let a = find(
            &advice,
            |r| matches!(r, Rule::NeedsNoPressure { phase: p, .. } if *p == phase),
        )
        .expect("vent");
        assert_eq!(a.action, Some(Action::VentPhase { phase }));
        // 12 L/min over 155.2+ bar: about 3.1 kW, against about 30 W vented.
        assert!(a.saving.value > 2500.0, "{}", a.saving.value);
    }
    // Vented already: nothing to say.
    let mut vented = mk(ReliefKind::PilotOperated);
    vented = settings::apply(&vented, &Action::VentPhase { phase: 0 });
    vented = settings::apply(&vented, &Action::VentPhase { phase: 1 });
    assert!(find(
        &settings::advise(&job(locked.clone(), vec![vented]), 0).unwrap(),
        |r| matches!(r, Rule::NeedsNoPressure { .. })
    )
    .is_none());
    // No vent port: a note, no action.
    let advice = settings::advise(&job(locked, vec![mk(ReliefKind::DirectActing)]), 0).unwrap();
    let a = find(&advice, |r| matches!(r, Rule::NoVentPort { .. })).expect("note");
    assert_eq!((a.severity, a.action), (Severity::Note, None));
}

#[test]
fn remote_stages_above_main_or_never_selected_are_flagged_and_removable() {
    let mut job = metered(42.0, ReliefKind::PilotOperated);
    job.designs[0].remote_stages = vec![bar_(30.0), bar_(50.0), bar_(45.0)];
    // The feed selects stage 2 (45 bar): the lower of it and main (42 bar) governs.
    job.designs[0].phase_settings[0].limit = ActiveLimit::Remote { stage: 2 };
    let advice = settings::advise(&job, 0).unwrap();
    let redundant = find(&advice, |r| {
        matches!(r, Rule::RemoteRedundant { stage: 1, .. })
    })
    .expect("above main");
    assert_eq!(redundant.action, Some(Action::RemoveRemote { stage: 1 }));
    assert!(
        find(&advice, |r| matches!(
            r,
            Rule::RemoteRedundant { stage: 2, .. }
        ))
        .is_some(),
        "45 >= 42 too"
    );
    assert!(find(&advice, |r| matches!(
        r,
        Rule::RemoteUnused { stage: 0, .. }
    ))
    .is_some());
    // Removing stage 1 keeps the feed on the stage it chose (now numbered 1).
    let d = settings::apply(&job.designs[0], &Action::RemoveRemote { stage: 1 });
    assert_eq!(d.remote_stages, vec![bar_(30.0), bar_(45.0)]);
    assert_eq!(d.phase_settings[0].limit, ActiveLimit::Remote { stage: 1 });
    // A stage below main that a phase selects is neither.
    job.designs[0].remote_stages = vec![bar_(41.5)];
    job.designs[0].phase_settings[0].limit = ActiveLimit::Remote { stage: 0 };
    let advice = settings::advise(&job, 0).unwrap();
    assert!(
        find(&advice, |r| matches!(
            r,
            Rule::RemoteRedundant { .. } | Rule::RemoteUnused { .. }
        ))
        .is_none(),
        "{advice:#?}"
    );
}

#[test]
fn actions_go_to_the_proposed_design_never_the_baseline() {
    let demo = phasewise_engine::demo::scrap_baler();
    let action = Action::SetMain {
        pressure: bar_(180.0),
    };
    // Shown: the baseline; the job has a proposed design: that one changes.
    let (after, target) = settings::apply_to_proposed(&demo, 0, &action);
    assert_eq!(target, 1);
    assert_eq!(after.designs[0], demo.designs[0]);
    assert_eq!(after.designs[1].relief.setting, bar_(180.0));
    assert_eq!(after.designs.len(), demo.designs.len());
    // Bad indices change nothing and never panic.
    let d = &demo.designs[0];
    for bad in [
        Action::VentPhase { phase: 99 },
        Action::SetUnloading {
            pump: 0,
            pressure: bar_(1.0),
        },
        Action::SetUnloading {
            pump: 9,
            pressure: bar_(1.0),
        },
        Action::RemoveRemote { stage: 9 },
    ] {
        assert_eq!(&settings::apply(d, &bad), d, "{bad:?}");
    }
    let no_such = settings::advise(&demo, 7).unwrap_err();
    assert!(
        no_such[0].message.contains("no power unit 8"),
        "{no_such:?}"
    );
}

/// The public entry points refuse an invalid job with its input errors instead of relying on a
/// precondition: nothing panics, whatever the job holds.
#[test]
fn advice_and_the_staging_search_refuse_an_invalid_job_with_its_errors() {
    let mut job = high_low(20.0, 145.0);
    job.designs[0].relief.cracking_fraction = f64::NAN;
    job.cycle.push(idle("extra", 5.0)); // one phase more than the design has settings for
    let errors = settings::advise(&job, 0).unwrap_err();
    assert!(errors
        .iter()
        .any(|e| e.field == "designs[0].relief.cracking_fraction"));
    assert!(errors
        .iter()
        .any(|e| e.field == "designs[0].phase_settings"));
    let errors = phasewise_engine::staging::search(&job, &job.staging).unwrap_err();
    assert!(!errors.is_empty());
    let mut five = high_low(20.0, 145.0);
    let stage = five.designs[0].unloading_stages[0];
    five.designs[0].unloading_stages = vec![stage; 4];
    assert!(settings::advise(&five, 0).is_err());
    assert!(phasewise_engine::solve(&five).is_err());
    let mut no_designs = high_low(20.0, 145.0);
    no_designs.designs.clear();
    assert!(settings::advise(&no_designs, 0).is_err());
    let (same, _) = settings::apply_to_proposed(&no_designs, 0, &Action::VentPhase { phase: 3 });
    assert_eq!(same, no_designs);
}

/// A hold the pump keeps sits at its limit with the pump's whole flow over the relief (the way
/// the limit is read on the machine), so the lowest limit that holds it is its own pressure,
/// not the margin a moving phase keeps below its relief's cracking (common practice).
#[test]
fn a_hold_the_pump_keeps_is_advised_the_limit_that_holds_it() {
    let mut cycle = high_low_cycle();
    cycle.insert(2, hold("dwell", 120.0, 5.0, HoldMode::HeldByPump));
    let d = design(
        "As found",
        motor(7.5, 1500.0, 0.9),
        vec![stage(
            fixed_pump(40.0, 0.93, 200.0, 0.9, 0.1),
            20.0,
            3.0,
            0.5,
        )],
        fixed_pump(8.0, 0.93, 200.0, 0.9, 0.1),
        relief(ReliefKind::PilotOperated, 160.0, 60.0, 0.97),
        cycle.len(),
    );
    let job = job(cycle, vec![d]);
    let needs = settings::phase_needs(&job, &job.designs[0]);
    assert_eq!(needs[2].need.map(|q| q.value), Some(120.0 * BAR));
    assert_eq!(needs[2].lowest.map(|q| q.value), Some(120.0 * BAR));
    let advice = settings::advise(&job, 0).unwrap();
    let a = find(&advice, |r| {
        matches!(r, Rule::LimitAboveNeed { phase: 2, .. })
    })
    .expect("dwell");
    assert_eq!(
        a.action,
        Some(Action::LimitPhase {
            phase: 2,
            pressure: bar_(120.0)
        })
    );
    let (proposed, target) = settings::apply_to_proposed(&job, 0, &a.action.unwrap());
    let report = solve(&proposed).unwrap();
    let dwell = &report.designs[target].phases[2];
    assert_close(
        in_bar(dwell.point.system_pressure),
        120.0,
        1e-9,
        "held, bar",
    );
    assert!(dwell.findings.is_empty(), "{:?}", dwell.findings);
}

/// A relief at or below a compensated pump's dead-head pressure takes its whole flow (the margin
/// above it is common practice: about 10 %, or 15 to 20 bar). The advice never proposes one, a
/// finding names the power it burns, and a relief set too low is advised up.
#[test]
fn a_relief_is_never_advised_at_or_below_a_compensator() {
    use phasewise_engine::pump::PumpControl;
    let compensated = |main_bar: f64| {
        let mut pump = fixed_pump(30.0, 0.95, 200.0, 0.9, 0.1);
        pump.control = PumpControl::Compensated {
            setting: bar_(200.0),
        };
        let cycle = vec![
            move_phase(
                "press",
                100.0,
                56.0,
                50.0,
                Direction::Extend,
                100.0,
                4.0,
                metered_speed(0.02),
            ),
            hold("dwell", 190.0, 5.0, HoldMode::HeldByPump),
        ];
        let d = design(
            "As found",
            motor(15.0, 1500.0, 0.9),
            vec![],
            pump,
            relief(ReliefKind::PilotOperated, main_bar, 60.0, 0.97),
            cycle.len(),
        );
        job(cycle, vec![d])
    };
    // Dead-head at 200 x 1.03 = 206 bar; the floor is 206 + max(20.6, 15) = 226.6 bar.
    let floor = 226.6 * BAR;
    for main in [180.0, 205.0, 215.0, 250.0, 300.0] {
        let job = compensated(main);
        let advice = settings::advise(&job, 0).unwrap();
        for a in &advice {
            match a.action {
                Some(Action::LimitPhase { pressure, .. }) | Some(Action::SetMain { pressure }) => {
                    assert!(pressure.value >= floor, "{main}: {a:?}")
                }
                _ => {}
            }
            if let Some(action) = a.action {
                let (after, target) = settings::apply_to_proposed(&job, 0, &action);
                let report = solve(&after).unwrap();
                assert!(
                    !report.designs[target]
                        .findings
                        .iter()
                        .any(|f| matches!(f, Finding::ReliefAtCompensator { .. })),
                    "{main}: {action:?}"
                );
            }
        }
        let report = solve(&job).unwrap();
        let at = report.designs[0]
            .findings
            .iter()
            .find(|f| matches!(f, Finding::ReliefAtCompensator { .. }));
        // A relief cracking at or below 206 bar (main <= 206 / 0.97 = 212.4 bar) is found.
        assert_eq!(at.is_some(), main * 0.97 <= 206.0, "{main}: {at:?}");
        if let Some(Finding::ReliefAtCompensator { burns, .. }) = at {
            let burns_w = burns.value;
            // Dead-headed, the pump (45 L/min swept, leaking 2.25 L/min per 200 bar) sends its
            // flow over the relief (set at `main` with that flow over it). Below the
            // compensator's 200 bar the whole flow crosses at `main`. Above it the pump
            // destrokes in a straight line from 42.75 L/min at 200 bar to none at 206 bar, and
            // meets the relief's line from cracking c = 0.97 main: 42.75 (1 - (p - 200) / 6) =
            // k (p - c), with k = q(main) / (main - c).
            let q = |p: f64| 45.0 - 2.25 * p / 200.0;
            let (p, flow) = if main <= 200.0 {
                (main, q(main))
            } else {
                let c = 0.97 * main;
                let k = q(main) / (main - c);
                let p = (42.75 + 42.75 * 200.0 / 6.0 + k * c) / (42.75 / 6.0 + k);
                (p, k * (p - c))
            };
            assert_close(burns_w, p * flow / 600.0 * 1e3, 1e-9, "burns, W");
        }
        if main * 0.97 <= 206.0 {
            let a = find(&advice, |r| {
                matches!(r, Rule::BelowCompensator { phase: None, .. })
            })
            .expect("main below the compensator");
            assert_eq!(a.severity, Severity::Caution);
            assert_eq!(
                a.action,
                Some(Action::SetMain {
                    pressure: bar_(227.0)
                })
            );
        }
    }
}

/// What an action does is worded from the solved figures: a rise is never called a saving,
/// and a change to the whole cycle says nothing of one phase.
#[test]
fn an_actions_effect_never_calls_a_rise_a_saving() {
    let job = metered(160.0, ReliefKind::PilotOperated);
    let advice = settings::advise(&job, 0).unwrap();
    let mut a = advice[0].clone();
    a.action = Some(Action::LimitPhase {
        phase: 0,
        pressure: bar_(50.0),
    });
    a.saving.value = -45.0;
    a.annual_saving_kwh = -10.0;
    let text = a.effect(UnitSystem::Si).unwrap();
    assert!(!text.contains("Saves") && !text.contains("saves"), "{text}");
    assert!(
        text.contains("more in the phase") && text.contains("costs 10 kWh a year more"),
        "{text}"
    );
    a.saving.value = 0.0;
    a.annual_saving_kwh = 2476.0;
    a.action = Some(Action::SetMain {
        pressure: bar_(150.0),
    });
    let text = a.effect(UnitSystem::Si).unwrap();
    assert_eq!(text, "Saves 2476 kWh a year.");
    a.saving.value = 300.0;
    let text = a.effect(UnitSystem::Si).unwrap();
    assert!(!text.contains("in the phase"), "{text}");
    a.annual_saving_kwh = 0.1;
    a.saving.value = 0.0;
    assert_eq!(a.effect(UnitSystem::Si), None);
}

#[test]
fn the_margins_are_the_users() {
    let mut job = metered(160.0, ReliefKind::PilotOperated);
    job.advice.margin_fraction = 0.25;
    let needs = settings::phase_needs(&job, &job.designs[0]);
    // 34.465 x 1.25 = 43.08 bar, more than 34.465 + 7.
    assert_close(
        needs[0].lowest.map(|q| q.value).unwrap() / BAR,
        34.464790 * 1.25,
        1e-6,
        "lowest with 25 %",
    );
    job.advice.margin_fraction = 1.5;
    assert!(
        solve(&job).is_err(),
        "a margin over 100 % is refused by validation"
    );
}

#[test]
fn a_limit_inside_the_margin_but_above_cracking_is_a_note_and_below_cracking_a_caution() {
    // Pilot-operated, need 34.465 bar, lowest 41.465. At 40 bar it cracks at 38.8: shut while
    // working, thin margin. At 35 bar it cracks at 33.95, below the need: it leaks.
    let at = |limit: f64| settings::advise(&metered(limit, ReliefKind::PilotOperated), 0).unwrap();
    let thin = at(40.0);
    let a = find(&thin, |r| matches!(r, Rule::MarginThin { phase: 0, .. })).expect("thin");
    assert_eq!(a.severity, Severity::Note);
    assert!(find(&thin, |r| matches!(r, Rule::LimitBelowNeed { .. })).is_none());
    let leaking = at(35.0);
    let a = find(&leaking, |r| {
        matches!(r, Rule::LimitBelowNeed { phase: 0, .. })
    })
    .expect("leaks");
    assert_eq!(a.severity, Severity::Caution);
    assert!(find(&at(42.0), |r| matches!(
        r,
        Rule::MarginThin { .. } | Rule::LimitBelowNeed { .. }
    ))
    .is_none());
}
