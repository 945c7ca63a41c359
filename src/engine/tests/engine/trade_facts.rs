//! Facts of the trade the engine must honour. None has a published source: each is marked
//! common practice.

use crate::common::*;
use phasewise_engine::cycle::{Direction, HoldMode, SpeedRule};
use phasewise_engine::valve::{ActiveLimit, IdlePath, ReliefKind};
use phasewise_engine::{solve, Finding};
use uom::si::area::square_meter;
use uom::si::f64::Area;
use uom::si::force::kilonewton;

/// One ideal 20 cm^3/rev pump at 1500 rpm (30 L/min) and a relief set at 200 bar for 30 L/min.
fn unit(kind: ReliefKind) -> phasewise_engine::power_unit::Design {
    let cracking = kind.typical_cracking_fraction();
    design(
        "test",
        motor(15.0, 1500.0, 0.9),
        vec![],
        ideal_pump(20.0),
        relief(kind, 200.0, 30.0, cracking),
        1,
    )
}

/// A move that needs `bar` at the pump (bore 100 mm, no line loss), taking all pump flow.
fn move_at(bar: f64) -> phasewise_engine::cycle::Phase {
    let area = std::f64::consts::PI / 4.0 * 0.1 * 0.1;
    move_phase(
        "work",
        100.0,
        50.0,
        100.0,
        Direction::Extend,
        (bar_(bar) * Area::new::<square_meter>(area)).get::<kilonewton>(),
        0.0,
        SpeedRule::AllPumpFlow,
    )
}

fn relief_flow_lpm(kind: ReliefKind, bar: f64) -> (f64, bool) {
    let report = solve(&job(vec![move_at(bar)], vec![unit(kind)])).unwrap();
    let phase = &report.designs[0].phases[0];
    let leaks = phase
        .findings
        .iter()
        .any(|f| matches!(f, Finding::ReliefLeaks { .. }));
    (in_lpm(phase.point.relief_flow), leaks)
}

/// Where a relief starts to pass flow, by its kind (common practice: a direct-acting relief
/// passes flow from roughly 80 % of its setting; a pilot-operated one stays shut until within a
/// few percent, cracking at roughly 97 to 99 %). Flow over the relief while working is always
/// also a finding.
#[test]
fn a_relief_passes_flow_from_where_its_kind_cracks() {
    use ReliefKind::{DirectActing as Direct, PilotOperated as Pilot};
    const SHUT: (f64, f64) = (0.0, 0.0);
    const SOME: (f64, f64) = (1e-9, f64::INFINITY);
    // (kind, working pressure as a share of the 200 bar setting, least and most flow in L/min)
    let cases = [
        (Direct, 0.78, SHUT),
        (Direct, 0.85, (1.0, f64::INFINITY)),
        // Where the direct-acting valve already leaks a third of the flow ...
        (Direct, 0.90, (10.0, f64::INFINITY)),
        // ... the pilot-operated one is shut.
        (Pilot, 0.90, SHUT),
        (Pilot, 0.95, SHUT),
        (Pilot, 0.985, SOME),
    ];
    for (kind, share, (least, most)) in cases {
        let (flow, leaks) = relief_flow_lpm(kind, share * 200.0);
        assert!(
            (least..=most).contains(&flow),
            "{kind:?} at {share}: {flow} L/min"
        );
        assert_eq!(leaks, flow > 0.0, "{kind:?} at {share}: the finding");
    }
}

#[test]
fn a_vented_relief_runs_the_pump_at_about_the_bias_spring_pressure() {
    // Common practice: vented, the pump sees about the main spool's bias spring, of the order
    // of 25 psi (under 2 bar).
    let mut d = unit(ReliefKind::PilotOperated);
    d.vent_pressure = bar_(1.7);
    d.phase_settings[0].idle_path = IdlePath::Vented;
    let report = solve(&job(vec![idle("idle", 20.0)], vec![d])).unwrap();
    let p = in_bar(report.designs[0].phases[0].point.system_pressure);
    assert!((0.97 * 1.7..=1.7).contains(&p), "vented at {p} bar");
    // Over the main setting instead, the same idle runs at the relief's 200 bar.
    let report = solve(&job(
        vec![idle("idle", 20.0)],
        vec![unit(ReliefKind::PilotOperated)],
    ))
    .unwrap();
    assert_close(
        in_bar(report.designs[0].phases[0].point.system_pressure),
        200.0,
        1e-9,
        "idle over the relief",
    );
}

#[test]
fn a_remote_stage_above_the_main_setting_has_no_effect() {
    // Common practice: a remote pilot stage only governs when its setting is below the main pilot's.
    let hold_phase = || vec![hold("hold", 100.0, 5.0, HoldMode::HeldByPump)];
    let main = solve(&job(hold_phase(), vec![unit(ReliefKind::PilotOperated)])).unwrap();
    let mut d = unit(ReliefKind::PilotOperated);
    d.remote_stages = vec![bar_(250.0), bar_(120.0)];
    d.phase_settings[0].limit = ActiveLimit::Remote { stage: 0 };
    let above = solve(&job(hold_phase(), vec![d.clone()])).unwrap();
    assert_eq!(
        above.designs[0].phases[0].point.system_pressure,
        main.designs[0].phases[0].point.system_pressure
    );
    assert!(above.designs[0]
        .findings
        .iter()
        .any(|f| matches!(f, Finding::RemoteAboveMain { stage: 0, .. })));
    // The stage below the main setting governs.
    d.phase_settings[0].limit = ActiveLimit::Remote { stage: 1 };
    let below = solve(&job(hold_phase(), vec![d])).unwrap();
    assert_close(
        in_bar(below.designs[0].phases[0].point.system_pressure),
        120.0,
        1e-9,
        "remote stage at 120 bar",
    );
    assert!(!below.designs[0]
        .findings
        .iter()
        .any(|f| matches!(f, Finding::RemoteAboveMain { stage: 1, .. })));
}

#[test]
fn extending_uses_the_bore_and_retracting_the_annulus() {
    // From the geometry (common practice): the same flow retracts faster, by bore^2 / (bore^2 - rod^2).
    let speed = |direction| {
        let phase = move_phase(
            "stroke",
            100.0,
            70.0,
            200.0,
            direction,
            1.0,
            0.0,
            SpeedRule::AllPumpFlow,
        );
        let report = solve(&job(vec![phase], vec![unit(ReliefKind::PilotOperated)])).unwrap();
        report.designs[0].phases[0]
            .point
            .actuator_speed
            .unwrap()
            .value
    };
    let ratio = speed(Direction::Retract) / speed(Direction::Extend);
    assert_close(
        ratio,
        100.0 * 100.0 / (100.0 * 100.0 - 70.0 * 70.0),
        1e-6,
        "retract / extend speed",
    );
}

/// Slip is driven by pressure and hardly depends on speed: a pump stated at 92 % volumetric at
/// 1500 rpm and 200 bar loses the same 8 % of its 1500 rpm swept flow at 750 rpm, so there it
/// delivers 50 - 8 = 42 % of its 1500 rpm flow: 84 % volumetric.
#[test]
fn a_pump_slower_than_its_efficiency_was_stated_at_leaks_the_same_flow() {
    let mut pump = fixed_pump(40.0, 0.92, 200.0, 0.9, 0.0);
    pump.efficiency_speed = Some(uom::si::f64::AngularVelocity::new::<
        uom::si::angular_velocity::revolution_per_minute,
    >(1500.0));
    let mut d = design(
        "half speed",
        motor(11.0, 750.0, 0.9),
        vec![],
        pump,
        relief(ReliefKind::PilotOperated, 250.0, 100.0, 0.97),
        1,
    );
    d.phase_settings[0] = Default::default();
    let mut cycle = vec![move_phase(
        "press",
        100.0,
        50.0,
        100.0,
        Direction::Extend,
        0.0,
        0.0,
        SpeedRule::AllPumpFlow,
    )];
    if let phasewise_engine::cycle::PhaseKind::Move(m) = &mut cycle[0].kind {
        m.load = phasewise_engine::cycle::Load::Pressure {
            pressure: bar_(200.0),
        };
    }
    let report = solve(&job(cycle, vec![d])).unwrap();
    let delivered = report.designs[0].phases[0].point.pumps[0].flow;
    // 40 cm^3/rev at 750 rpm = 30 L/min swept; leakage 0.08 x 60 L/min = 4.8 L/min.
    assert_close(in_lpm(delivered), 30.0 - 4.8, 1e-12, "delivered, L/min");
    assert_close(
        in_lpm(delivered) / 30.0,
        0.84,
        1e-12,
        "volumetric at 750 rpm",
    );
}
