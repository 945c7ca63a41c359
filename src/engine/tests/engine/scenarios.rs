//! Invented machines, worked by hand. Every expected number is derived in the comments from
//! the inputs with the trade's physics, independently of the engine's code; 1e-9 relative
//! allows for rounding only.

use crate::common::*;
use phasewise_engine::cycle::{
    Cylinder, Direction, HoldMode, Load, MovePhase, Phase, PhaseKind, SpeedRule,
};
use phasewise_engine::valve::{ActiveLimit, IdlePath, ReliefKind};
use phasewise_engine::{solve, Finding, PumpState};

const REL: f64 = 1e-9;

/// A two-pump trim press (invented). Motor 11 kW at 1500 rpm (25 rev/s), 90 % at full load,
/// 35 % of its loss fixed. Full-load loss = 11000 x (1/0.9 - 1) = 1222.22 W.
///
/// Pump 1 (unloading stage): 40 cm^3/rev, so 60 L/min theoretical; 95 % volumetric at 200 bar,
/// so leakage 60 x 0.05 / 200 = 0.015 L/min per bar; 90 % hydromechanical; 0.2 kW drag;
/// unloads at 50 bar with a 3 bar drop; check valve 0.5 bar.
/// Pump 2 (base): 8 cm^3/rev, 12 L/min, leakage 0.003 L/min per bar, 90 %, 0.1 kW drag.
/// Relief: pilot-operated, set at 160 bar (the gauge dead-headed: pump 1 is then unloaded, so
/// pump 2's 12 - 0.003 x 160 = 11.52 L/min crosses it there), cracking at 0.97 x 160 = 155.2
/// bar, so above cracking it passes 11.52 / 4.8 = 2.4 L/min per bar (rated 60 L/min).
/// Cylinder: bore 100 mm (area 7.853982e-3 m^2), rod 56 mm (annulus 5.390973e-3 m^2).
fn trim_press(vented_idle: bool) -> (Vec<Phase>, phasewise_engine::power_unit::Design) {
    let cycle = vec![
        move_phase(
            "approach",
            100.0,
            56.0,
            300.0,
            Direction::Extend,
            5.0,
            4.0,
            SpeedRule::AllPumpFlow,
        ),
        move_phase(
            "press",
            100.0,
            56.0,
            50.0,
            Direction::Extend,
            100.0,
            4.0,
            SpeedRule::AllPumpFlow,
        ),
        hold("dwell", 120.0, 5.0, HoldMode::HeldByPump),
        move_phase(
            "return",
            100.0,
            56.0,
            350.0,
            Direction::Retract,
            2.0,
            6.0,
            SpeedRule::AllPumpFlow,
        ),
        idle("unload part", 10.0),
    ];
    let mut d = design(
        if vented_idle { "proposed" } else { "as found" },
        motor(11.0, 1500.0, 0.9),
        vec![stage(
            fixed_pump(40.0, 0.95, 200.0, 0.9, 0.2),
            50.0,
            3.0,
            0.5,
        )],
        fixed_pump(8.0, 0.95, 200.0, 0.9, 0.1),
        relief(ReliefKind::PilotOperated, 160.0, 60.0, 0.97),
        cycle.len(),
    );
    if vented_idle {
        d.phase_settings[4].idle_path = IdlePath::Vented;
    }
    (cycle, d)
}

#[test]
fn two_pump_press_approach_takes_both_pumps_at_low_pressure() {
    let (cycle, d) = trim_press(false);
    let report = solve(&job(cycle, vec![d])).unwrap();
    let phase = &report.designs[0].phases[0];
    // Load pressure 5000 N / 7.853982e-3 m^2 = 6.366198 bar; plus 4 bar line loss = 10.366198 bar,
    // below the 50 bar unloading setting: both pumps feed.
    assert_close(
        in_bar(phase.point.system_pressure),
        10.366_197_723_675_812,
        REL,
        "pressure, bar",
    );
    assert_eq!(phase.point.pumps[0].state, PumpState::Feeding);
    // Pump 1 at 10.866198 bar (after its check): 60 - 0.015 x 10.866198 = 59.837007 L/min.
    // Pump 2 at 10.366198 bar: 12 - 0.003 x 10.366198 = 11.968901 L/min. Together 71.805908 L/min.
    assert_close(
        in_lpm(phase.point.pumps[0].flow),
        59.837_007_034_144_86,
        REL,
        "pump 1, L/min",
    );
    assert_close(
        in_lpm(phase.point.pumps[1].flow),
        11.968_901_406_828_973,
        REL,
        "pump 2, L/min",
    );
    assert_close(
        in_lpm(phase.point.actuator_flow),
        71.805_908_440_973_84,
        REL,
        "cylinder, L/min",
    );
    // Speed = 71.805908 L/min / 7.853982e-3 m^2 = 0.152377 m/s; 300 mm take 1.968803 s.
    assert_close(
        phase.point.actuator_speed.unwrap().value,
        0.152_376_870_287_800_53,
        REL,
        "speed, m/s",
    );
    assert_close(
        phase.point.duration.value,
        1.968_802_741_737_493,
        REL,
        "duration, s",
    );
    // Shaft: pump 1 60 L/min x 10.866198 bar / 0.9 + 200 W = 1407.355 W; pump 2 12 x 10.366198
    // / 0.9 / 600 kW + 100 W = 330.360 W; total 1737.715 W. Motor loss 1222.22 x (0.35 + 0.65 x
    // (1737.715/11000)^2) = 447.604 W. Input 2185.319 W.
    assert_close(
        phase.ledger.electrical_input.value,
        2_185.319_042_885_814_7,
        REL,
        "input, W",
    );
    assert_close(
        phase.ledger.motor_loss.value,
        447.603_790_840_150_5,
        REL,
        "motor loss, W",
    );
    // Useful 6.366198 bar x 71.805908 L/min = 761.884 W; line and check: 4 bar x 71.805908 +
    // 0.5 bar x 59.837007 = 528.570 W; pump internal = shaft - hydraulic out = 447.261 W.
    assert_close(
        phase.ledger.useful_power.value,
        761.884_351_439_002_4,
        REL,
        "useful, W",
    );
    assert_close(
        phase.ledger.line_valve_loss.value,
        528.570_228_801_613,
        REL,
        "line and valves, W",
    );
    assert_close(
        phase.ledger.pump_internal_loss.value,
        447.260_671_805_048_6,
        REL,
        "pump internal, W",
    );
    assert_eq!(phase.ledger.relief_loss.value, 0.0);
    assert!(phase.findings.is_empty(), "{:?}", phase.findings);
}

#[test]
fn two_pump_press_work_unloads_the_big_pump() {
    let (cycle, d) = trim_press(false);
    let report = solve(&job(cycle, vec![d])).unwrap();
    let phase = &report.designs[0].phases[1];
    // 100 kN / 7.853982e-3 m^2 = 127.323954 bar, + 4 = 131.323954 bar: above 50 bar, so pump 1
    // unloads (feeding it would not change the pressure the load sets).
    assert_close(
        in_bar(phase.point.system_pressure),
        131.323_954_473_516_27,
        REL,
        "pressure, bar",
    );
    assert_eq!(phase.point.pumps[0].state, PumpState::Unloaded);
    // Pump 1 at its 3 bar drop: 60 - 0.015 x 3 = 59.955 L/min to tank: 3 bar x 59.955 L/min = 299.775 W.
    assert_close(
        in_lpm(phase.point.pumps[0].flow),
        59.955,
        REL,
        "pump 1 unloaded, L/min",
    );
    assert_close(
        phase.ledger.unloading_loss.value,
        299.775,
        REL,
        "unloading loss, W",
    );
    // Pump 2 alone: 12 - 0.003 x 131.323954 = 11.606028 L/min; 50 mm at 0.024629 m/s = 2.030147 s.
    assert_close(
        in_lpm(phase.point.actuator_flow),
        11.606_028_136_579_452,
        REL,
        "cylinder, L/min",
    );
    assert_close(
        phase.point.duration.value,
        2.030_147_146_349_041,
        REL,
        "duration, s",
    );
    // Shaft 60 x 3 / 0.9 / 600 kW + 200 = 533.333 W, plus 12 x 131.323954 / 0.9 / 600 kW + 100 =
    // 3018.310 W: 3551.643 W; motor loss 510.598 W; input 4062.242 W. Useful 127.323954 bar x
    // 11.606028 L/min = 2462.876 W.
    assert_close(
        phase.ledger.electrical_input.value,
        4_062.241_525_650_700_6,
        REL,
        "input, W",
    );
    assert_close(
        phase.ledger.useful_power.value,
        2_462.875_663_466_985_3,
        REL,
        "useful, W",
    );
    assert_close(
        phase.ledger.line_valve_loss.value,
        77.373_520_910_529_69,
        REL,
        "line loss, W",
    );
}

#[test]
fn two_pump_press_dwell_and_idle_dump_the_small_pump_over_the_relief() {
    let (cycle, d) = trim_press(false);
    let report = solve(&job(cycle, vec![d])).unwrap();
    for index in [2, 4] {
        let phase = &report.designs[0].phases[index];
        // Pump 2 alone over the relief (pump 1 unloaded, the pressure being far above 50 bar):
        // dead-headed, as the relief was set: 160 bar, 11.52 L/min over it, 160 bar x 11.52
        // L/min = 3072 W of heat.
        assert_close(
            in_bar(phase.point.system_pressure),
            160.0,
            REL,
            "pressure, bar",
        );
        assert_eq!(phase.point.pumps[0].state, PumpState::Unloaded);
        assert_close(
            in_lpm(phase.point.relief_flow),
            11.52,
            REL,
            "relief flow, L/min",
        );
        assert_close(
            phase.ledger.relief_loss.value,
            3_072.0,
            REL,
            "relief loss, W",
        );
        // Shaft: pump 1 unloaded 60 x 3 / 0.9 / 600 kW + 200 = 533.333 W; pump 2 12 x 160 /
        // 0.9 / 600 kW + 100 = 3655.556 W; 4188.889 W. Load 0.380808 of 11 kW: motor loss
        // 1222.222 x (0.35 + 0.65 x 0.380808^2) = 542.984 W; input 4731.873 W.
        assert_close(
            phase.ledger.electrical_input.value,
            4_731.872_864_446_938,
            REL,
            "input, W",
        );
    }
    // The dwell needs 120 bar and gets 160 bar: no finding.
    assert!(report.designs[0].phases[2].findings.is_empty());
}

#[test]
fn two_pump_press_return_uses_the_annulus() {
    let (cycle, d) = trim_press(false);
    let report = solve(&job(cycle, vec![d])).unwrap();
    let phase = &report.designs[0].phases[3];
    // 2000 N / 5.390973e-3 m^2 = 3.709905 bar, + 6 = 9.709905 bar; both pumps feed:
    // (60 - 0.015 x 10.209905) + (12 - 0.003 x 9.709905) = 71.817722 L/min; 0.222031 m/s; 1.576358 s.
    assert_close(
        in_lpm(phase.point.actuator_flow),
        71.817_721_702_199_21,
        REL,
        "cylinder, L/min",
    );
    assert_close(
        phase.point.actuator_speed.unwrap().value,
        0.222_030_796_629_819_17,
        REL,
        "speed, m/s",
    );
    assert_close(
        phase.point.duration.value,
        1.576_357_898_600_604_6,
        REL,
        "duration, s",
    );
}

#[test]
fn venting_the_idle_saves_its_relief_heat() {
    let (cycle, found) = trim_press(false);
    let (_, proposed) = trim_press(true);
    let report = solve(&job(cycle, vec![found, proposed])).unwrap();
    let idle = &report.designs[1].phases[4];
    // Vented at 1.5 bar, read (like every limit) with the whole dead-head flow over the valve:
    // both pumps feed below 50 bar, so the vent passes all their flow at 1.5 bar.
    assert_close(in_bar(idle.point.system_pressure), 1.5, REL, "vented, bar");
    assert_eq!(idle.point.pumps[0].state, PumpState::Feeding);
    // Shaft (60 x 2.0 + 12 x 1.5) / 0.9 / 600 kW + 300 W = 555.556 W; motor loss 1222.222 x
    // (0.35 + 0.65 x 0.050505^2) = 429.804 W; input 985.360 W.
    assert_close(
        idle.ledger.electrical_input.value,
        985.359_770_544_955_8,
        REL,
        "input, W",
    );
    // Only the idle differs: the energy per cycle falls by (4731.873 - 985.360) W x 10 s.
    let saved = report.designs[0].totals.energy_per_cycle.value
        - report.designs[1].totals.energy_per_cycle.value;
    assert_close(
        saved,
        (4_731.872_864_446_938 - 985.359_770_544_955_8) * 10.0,
        1e-9,
        "energy saved per cycle, J",
    );
    let comparison = &report.comparisons[0];
    assert!(comparison.annual_cost_saved > 0.0);
    let payback = comparison.payback_years.unwrap();
    assert_close(
        payback,
        3000.0 / comparison.annual_cost_saved,
        1e-12,
        "payback, years",
    );
}

/// A three-pump test rig (invented): pumps of 30, 20 and 10 cm^3/rev at 1000 rpm (30, 20 and
/// 10 L/min), leak-free, 90 % hydromechanical, no drag; pump 1 unloads at 40 bar and pump 2 at
/// 80 bar, each with a 2 bar drop and no check-valve drop. Relief pilot-operated, set at 150
/// bar (dead-headed there only pump 3's 10 L/min crosses it), rated 60 L/min. Moves are on a 100 mm bore, 100 mm stroke (0.785398 L) at a pressure read off a gauge.
fn test_rig(loads_bar: &[f64]) -> (Vec<Phase>, phasewise_engine::power_unit::Design) {
    let ideal = |cc| fixed_pump(cc, 1.0, 100.0, 0.9, 0.0);
    let cycle: Vec<Phase> = loads_bar
        .iter()
        .map(|&bar| Phase {
            name: format!("{bar} bar"),
            kind: PhaseKind::Move(MovePhase {
                cylinder: Cylinder {
                    bore: mm(100.0),
                    rod: mm(50.0),
                    stroke: mm(100.0),
                },
                direction: Direction::Extend,
                load: Load::Pressure {
                    pressure: bar_(bar),
                },
                line_loss: bar_(0.0),
                lines: None,
                speed: SpeedRule::AllPumpFlow,
                target_time: None,
            }),
        })
        .collect();
    let d = design(
        "rig",
        motor(15.0, 1000.0, 0.9),
        vec![
            stage(ideal(30.0), 40.0, 2.0, 0.0),
            stage(ideal(20.0), 80.0, 2.0, 0.0),
        ],
        ideal(10.0),
        relief(ReliefKind::PilotOperated, 150.0, 60.0, 0.97),
        cycle.len(),
    );
    (cycle, d)
}

#[test]
fn three_pumps_unload_one_after_another_as_pressure_rises() {
    let (cycle, d) = test_rig(&[20.0, 60.0, 100.0]);
    let report = solve(&job(cycle, vec![d])).unwrap();
    let phases = &report.designs[0].phases;
    let states = |i: usize| {
        phases[i]
            .point
            .pumps
            .iter()
            .map(|p| p.state)
            .collect::<Vec<_>>()
    };
    use PumpState::{Feeding as F, Unloaded as U};
    // 20 bar: under both settings, all feed: 60 L/min. Useful 20 bar x 60 L/min = 2000 W; shaft
    // 2000 / 0.9 = 2222.222 W; 0.785398 L at 1 L/s = 0.785398 s.
    assert_eq!(states(0), [F, F, F]);
    assert_close(
        in_lpm(phases[0].point.actuator_flow),
        60.0,
        REL,
        "20 bar, L/min",
    );
    assert_close(
        phases[0].ledger.useful_power.value,
        2000.0,
        REL,
        "20 bar useful, W",
    );
    assert_close(
        phases[0].ledger.shaft_power().value,
        2000.0 / 0.9,
        REL,
        "20 bar shaft, W",
    );
    assert_close(
        phases[0].point.duration.value,
        std::f64::consts::PI / 4.0,
        REL,
        "20 bar, s",
    );
    // 60 bar: pump 1 unloads (60 >= 40), pumps 2 and 3 give 30 L/min: useful 3000 W; pump 1's
    // 30 L/min at 2 bar is 100 W of unloading loss; shaft (3000 + 100) / 0.9 = 3444.444 W.
    assert_eq!(states(1), [U, F, F]);
    assert_close(
        in_lpm(phases[1].point.actuator_flow),
        30.0,
        REL,
        "60 bar, L/min",
    );
    assert_close(
        phases[1].ledger.unloading_loss.value,
        100.0,
        REL,
        "60 bar unloading, W",
    );
    assert_close(
        phases[1].ledger.shaft_power().value,
        3100.0 / 0.9,
        REL,
        "60 bar shaft, W",
    );
    // 100 bar: pumps 1 and 2 unloaded, pump 3 alone at 10 L/min: useful 1666.667 W; unloading
    // 2 bar x 50 L/min = 166.667 W; 0.785398 L at 1/6 L/s = 4.712389 s.
    assert_eq!(states(2), [U, U, F]);
    assert_close(
        phases[2].ledger.useful_power.value,
        10_000.0 / 6.0,
        REL,
        "100 bar useful, W",
    );
    assert_close(
        phases[2].ledger.unloading_loss.value,
        1000.0 / 6.0,
        REL,
        "100 bar unloading, W",
    );
    assert_close(
        phases[2].point.duration.value,
        6.0 * std::f64::consts::PI / 4.0,
        REL,
        "100 bar, s",
    );
    for phase in phases {
        assert!(
            phase.findings.is_empty(),
            "{}: {:?}",
            phase.name,
            phase.findings
        );
    }
}

#[test]
fn an_unloading_setting_inside_the_relief_override_hunts() {
    // A direct demand of 5 L/min at 20 bar on a 60 bar remote stage, pump 2 set to unload at
    // 59.5 bar. Dead-headed at 60 bar pumps 1 and 2 are unloaded, so the stage is read with pump
    // 3's 10 L/min over it: cracking 0.97 x 60 = 58.2 bar, then 1.8 bar per 10 L/min.
    // - pumps 2 and 3 feeding (30 L/min), 25 L/min over it: p = 58.2 + 2.5 x 1.8 = 62.7 bar
    //   >= 59.5: pump 2 should unload;
    // - pump 2 unloaded too (10 L/min), 5 L/min over it: p = 58.2 + 0.5 x 1.8 = 59.1 bar < 59.5:
    //   it should feed again.
    // No state agrees. The nearest is pump 2 unloaded (0.4 bar off, against 3.2 bar).
    let (_, mut d) = test_rig(&[]);
    d.unloading_stages[1].unloading.setting = bar_(59.5);
    d.remote_stages = vec![bar_(60.0)];
    d.phase_settings = vec![phasewise_engine::power_unit::PhaseSetting {
        limit: ActiveLimit::Remote { stage: 0 },
        idle_path: IdlePath::OverLimit,
        measured_current: None,
    }];
    let report = solve(&job(vec![direct("test stand", 5.0, 20.0, 30.0)], vec![d])).unwrap();
    let phase = &report.designs[0].phases[0];
    assert_close(
        in_bar(phase.point.system_pressure),
        59.1,
        REL,
        "pressure, bar",
    );
    assert_eq!(phase.point.pumps[1].state, PumpState::Unloaded);
    assert!(
        phase.findings.iter().any(|f| matches!(
            f,
            Finding::Hunting {
                pump: 2,
                solved_unloaded: true,
                ..
            }
        )),
        "{:?}",
        phase.findings
    );
    // Relief 59.1 bar x 5 L/min = 492.5 W; pumps 1 and 2 unloaded, 2 bar x 50 L/min = 166.667 W.
    assert_close(phase.ledger.relief_loss.value, 492.5, REL, "relief loss, W");
    assert_close(
        phase.ledger.unloading_loss.value,
        500.0 / 3.0,
        REL,
        "unloading loss, W",
    );
}

/// An idle can never hunt on its limit: the limit is read dead-headed, with the pumps that feed
/// at that pressure, so that state always agrees with the unloading valves.
#[test]
fn an_idle_over_a_limit_settles_where_the_limit_was_read() {
    let (_, mut d) = test_rig(&[]);
    d.unloading_stages[1].unloading.setting = bar_(58.9);
    d.remote_stages = vec![bar_(60.0)];
    d.phase_settings = vec![phasewise_engine::power_unit::PhaseSetting {
        limit: ActiveLimit::Remote { stage: 0 },
        idle_path: IdlePath::OverLimit,
        measured_current: None,
    }];
    let report = solve(&job(vec![idle("wait", 30.0)], vec![d])).unwrap();
    let phase = &report.designs[0].phases[0];
    assert_close(in_bar(phase.point.system_pressure), 60.0, REL, "bar");
    assert_eq!(phase.point.pumps[1].state, PumpState::Unloaded);
    assert!(phase.findings.is_empty(), "{:?}", phase.findings);
}

/// The setting is what the gauge reads on the machine: a direct-acting relief set at 150 bar,
/// rated 100 L/min, on a 20 L/min pump holds 150 bar dead-headed, not the 120 + 0.2 x 30 = 126
/// bar a setting read at the valve's rated flow would give (it is read with the whole pump flow
/// crossing the valve). A 140 bar press on it keeps moving, with flow leaking over the valve
/// from its 120 bar cracking: 20 / 30 L/min per bar x 20 bar = 13.333 L/min.
#[test]
fn a_relief_holds_the_pressure_it_was_set_to_with_the_pumps_flow_over_it() {
    let d = design(
        "small unit",
        motor(7.5, 1500.0, 0.9),
        vec![],
        fixed_pump(40.0 / 3.0, 1.0, 100.0, 0.9, 0.0),
        relief(ReliefKind::DirectActing, 150.0, 100.0, 0.8),
        2,
    );
    let cycle = vec![
        hold("clamp", 145.0, 5.0, HoldMode::HeldByPump),
        move_phase(
            "press",
            100.0,
            50.0,
            50.0,
            Direction::Extend,
            0.0,
            0.0,
            SpeedRule::AllPumpFlow,
        ),
    ];
    let mut cycle = cycle;
    if let PhaseKind::Move(m) = &mut cycle[1].kind {
        m.load = Load::Pressure {
            pressure: bar_(140.0),
        };
    }
    let report = solve(&job(cycle, vec![d])).unwrap();
    let clamp = &report.designs[0].phases[0];
    assert_close(in_bar(clamp.point.system_pressure), 150.0, REL, "held, bar");
    assert_close(in_lpm(clamp.point.relief_flow), 20.0, REL, "over it, L/min");
    assert!(clamp.findings.is_empty(), "{:?}", clamp.findings);
    let press = &report.designs[0].phases[1];
    assert_close(
        in_bar(press.point.system_pressure),
        140.0,
        REL,
        "press, bar",
    );
    assert_close(
        in_lpm(press.point.relief_flow),
        40.0 / 3.0,
        REL,
        "leak, L/min",
    );
    assert!(press
        .findings
        .iter()
        .any(|f| matches!(f, Finding::ReliefLeaks { .. })));
}

#[test]
fn a_load_beyond_the_limit_stalls_and_says_so() {
    // 180 bar against a 150 bar relief: the cylinder cannot move. Solved as a dead-head: pump 3
    // alone over the relief, 10 L/min at 150 bar (as it was set), for the time the stroke would
    // take at pump 3's 10 L/min: 0.785398 L / (1/6 L/s) = 4.712389 s.
    let (cycle, d) = test_rig(&[180.0]);
    let report = solve(&job(cycle, vec![d])).unwrap();
    let phase = &report.designs[0].phases[0];
    assert_close(
        in_bar(phase.point.system_pressure),
        150.0,
        REL,
        "pressure, bar",
    );
    assert_eq!(phase.point.actuator_flow.value, 0.0);
    assert_close(
        phase.point.duration.value,
        6.0 * std::f64::consts::PI / 4.0,
        REL,
        "stall time, s",
    );
    assert!(phase
        .findings
        .iter()
        .any(|f| matches!(f, Finding::Stall { .. })));
    assert_close(
        phase.ledger.relief_loss.value,
        150e5 * 1e-3 / 6.0,
        REL,
        "relief loss, W",
    );
}

#[test]
fn a_meter_in_surplus_over_the_relief_makes_a_high_low_unit_hunt() {
    // The rig's 20 bar move metered to 0.05 m/s: 0.05 x 7.853982e-3 m^2 = 23.561945 L/min into
    // the cylinder, the surplus over the relief. With all three pumps (60 L/min) p = 145.5 +
    // 36.438055/60 x 4.5 = 148.23 bar >= 40: pump 1 must unload. With pumps 2 and 3 (30 L/min)
    // p = 145.5 + 6.438055/60 x 4.5 = 145.98 bar >= 80: pump 2 must unload too. Pump 3 alone
    // gives 10 L/min, short of 23.56, so the move takes what it can at 20 bar, where both
    // should feed again. No state agrees: the valves hunt.
    let (mut cycle, d) = test_rig(&[20.0]);
    if let PhaseKind::Move(m) = &mut cycle[0].kind {
        m.speed = metered_speed(0.05);
    }
    let report = solve(&job(cycle, vec![d])).unwrap();
    let phase = &report.designs[0].phases[0];
    assert!(
        phase
            .findings
            .iter()
            .any(|f| matches!(f, Finding::Hunting { .. })),
        "{:?}",
        phase.findings
    );
    assert!(phase.ledger.imbalance().abs() < 1e-9);
}

#[test]
fn a_metered_move_burns_the_difference_in_its_flow_control() {
    // One leak-free 30 L/min pump (30 cm^3/rev at 1000 rpm, 90 % hydromechanical), the relief
    // set at 150 bar (its 30 L/min over it; cracking 145.5 bar, so 6.6667 L/min per bar above
    // it). A 20 bar move metered to 0.05 m/s takes 23.561945 L/min; the other 6.438055 L/min
    // goes over the relief at 145.5 + 6.438055 / 6.6667 = 146.465708 bar.
    let d = design(
        "one pump",
        motor(15.0, 1000.0, 0.9),
        vec![],
        fixed_pump(30.0, 1.0, 100.0, 0.9, 0.0),
        relief(ReliefKind::PilotOperated, 150.0, 60.0, 0.97),
        1,
    );
    let (mut cycle, _) = test_rig(&[20.0]);
    if let PhaseKind::Move(m) = &mut cycle[0].kind {
        m.speed = metered_speed(0.05);
    }
    let report = solve(&job(cycle.clone(), vec![d.clone()])).unwrap();
    let phase = &report.designs[0].phases[0];
    assert_close(
        in_bar(phase.point.system_pressure),
        146.465_708_264_711_48,
        REL,
        "pressure, bar",
    );
    assert_close(
        in_lpm(phase.point.actuator_flow),
        23.561_944_901_923_454,
        REL,
        "cylinder, L/min",
    );
    assert_close(
        phase.point.duration.value,
        2.0,
        REL,
        "100 mm at 0.05 m/s, s",
    );
    // Useful 20 bar x 23.561945 L/min = 785.398 W; the flow control burns (146.465708 - 20) bar
    // x 23.561945 L/min = 4966.297 W; the relief 146.465708 bar x 6.438055 L/min = 1571.590 W.
    assert_close(
        phase.ledger.useful_power.value,
        785.398_163_397_448_5,
        REL,
        "useful, W",
    );
    assert_close(
        phase.ledger.metering_loss.value,
        4_966.296_750_193_095,
        REL,
        "metering loss, W",
    );
    assert_close(
        phase.ledger.relief_loss.value,
        1_571.590_499_645_03,
        REL,
        "relief loss, W",
    );
    // A 40 bar remote stage for the phase (cracking 38.8 bar, 30 L/min over 1.2 bar: 25 L/min
    // per bar): p = 38.8 + 6.438055 / 25 = 39.057522 bar; metering falls to 748.387 W, the
    // relief to 419.091 W.
    let mut lower = d;
    lower.remote_stages = vec![bar_(40.0)];
    lower.phase_settings[0].limit = ActiveLimit::Remote { stage: 0 };
    let report = solve(&job(cycle, vec![lower])).unwrap();
    let phase = &report.designs[0].phases[0];
    assert_close(
        in_bar(phase.point.system_pressure),
        39.057_522_203_923_06,
        REL,
        "pressure, bar",
    );
    assert_close(
        phase.ledger.metering_loss.value,
        748.387_146_893_363_1,
        REL,
        "metering loss, W",
    );
    assert_close(
        phase.ledger.relief_loss.value,
        419.090_799_905_341_27,
        REL,
        "relief loss, W",
    );
}

#[test]
fn a_compensated_pump_dead_heads_on_its_leakage() {
    // A pressure-compensated pump (invented): 20 cm^3/rev at 1500 rpm = 30 L/min, 90 %
    // volumetric at 200 bar, so it leaks 0.015 L/min per bar; 90 % hydromechanical; no drag;
    // compensator at 150 bar, destroking to nothing by 150 x 1.03 = 154.5 bar. Relief at 200 bar
    // (cracking 194 bar) stays shut. In a hold the pump sits at 154.5 bar delivering nothing;
    // its displacement only covers the 0.015 x 154.5 = 2.3175 L/min it leaks, which takes
    // 2.3175 x 154.5 / 600 / 0.9 = 0.663056 kW from the shaft, all of it heat.
    let mut pump = fixed_pump(20.0, 0.9, 200.0, 0.9, 0.0);
    pump.control = phasewise_engine::pump::PumpControl::Compensated {
        setting: bar_(150.0),
    };
    let d = design(
        "compensated",
        motor(15.0, 1500.0, 0.9),
        vec![],
        pump,
        relief(ReliefKind::PilotOperated, 200.0, 60.0, 0.97),
        1,
    );
    let report = solve(&job(
        vec![hold("hold", 140.0, 10.0, HoldMode::HeldByPump)],
        vec![d],
    ))
    .unwrap();
    let phase = &report.designs[0].phases[0];
    assert_close(
        in_bar(phase.point.system_pressure),
        154.5,
        REL,
        "dead-head pressure, bar",
    );
    assert_eq!(phase.point.pumps[0].flow.value, 0.0);
    assert_close(
        in_kw(phase.ledger.shaft_power()),
        2.3175 * 154.5 / 600.0 / 0.9,
        REL,
        "shaft, kW",
    );
    assert_close(
        in_kw(phase.ledger.pump_internal_loss),
        2.3175 * 154.5 / 600.0 / 0.9,
        REL,
        "internal loss, kW",
    );
    assert_eq!(phase.ledger.relief_loss.value, 0.0);
}

/// An invented test stand for the motor checks: an ideal pump giving exactly 1.0e-3 m^3/s
/// (60 L/min: 40 cm^3/rev at 1500 rpm) holds 10 s against a pilot-operated relief set at
/// 100 bar at 60 L/min, so all its flow crosses at 100 bar and takes 1.0e-3 x 100e5 = 10 kW
/// from the shaft. `rest` is the phases after it, each an idle taking its path.
fn test_stand(motor_kw: f64, rpm: f64, rest: &[(f64, IdlePath)]) -> phasewise_engine::Job {
    let mut cycle = vec![hold("load", 90.0, 10.0, HoldMode::HeldByPump)];
    cycle.extend(
        rest.iter()
            .enumerate()
            .map(|(i, (seconds, _))| idle(&format!("idle {}", i + 1), *seconds)),
    );
    let mut d = design(
        "stand",
        motor(motor_kw, rpm, 0.9),
        vec![],
        ideal_pump(40.0 * 1500.0 / rpm),
        relief(ReliefKind::PilotOperated, 100.0, 60.0, 0.97),
        cycle.len(),
    );
    for (setting, (_, path)) in d.phase_settings[1..].iter_mut().zip(rest) {
        setting.idle_path = *path;
    }
    job(cycle, vec![d])
}

#[test]
fn stopped_time_counts_a_third_in_the_motors_rms() {
    // 10 kW for 10 s, then the motor stopped for 50 s. A stopped TEFC motor has no fan, so its
    // stopped time counts a third (common practice, from memory): RMS = sqrt(10^2 x 10 / (10 +
    // 50 / 3)) = 10 x sqrt(0.375) = 6.123724 kW, above the plain time average's sqrt(10^2 x 10
    // / 60) = 4.082483 kW. The supply's RMS stays over plain time.
    let report = solve(&test_stand(11.0, 1500.0, &[(50.0, IdlePath::MotorStopped)])).unwrap();
    let t = &report.designs[0].totals;
    assert_close(in_kw(t.peak_shaft), 10.0, REL, "peak, kW");
    assert_close(in_kw(t.rms_shaft), 10.0 * 0.375f64.sqrt(), REL, "RMS, kW");
    assert!(in_kw(t.rms_shaft) > 10.0 * (10.0f64 / 60.0).sqrt() * 1.4);
    let electrical = t.peak_electrical.value / 1e3;
    assert_close(
        in_kw(t.rms_electrical),
        electrical * (10.0f64 / 60.0).sqrt(),
        REL,
        "supply RMS, kW",
    );
    // The same 50 s with the motor running (vented at 1.5 bar: 1.0e-3 x 1.5e5 = 150 W) counts
    // in full: sqrt((10000^2 x 10 + 150^2 x 50) / 60) = 4.083860 kW.
    let report = solve(&test_stand(11.0, 1500.0, &[(50.0, IdlePath::Vented)])).unwrap();
    assert_close(
        report.designs[0].totals.rms_shaft.value,
        ((1e8 * 10.0 + 150.0f64.powi(2) * 50.0) / 60.0).sqrt(),
        REL,
        "RMS running, W",
    );
}

#[test]
fn a_cycle_longer_than_five_minutes_is_too_long_for_the_rms() {
    // "The rms horsepower loading method works only for duty cycles less than five minutes"
    // (Machine Design, "MSD 101: Motors and actuators", material from E. Cowern, Baldor). A 9 kW
    // motor carries the 10 kW peak only briefly (9 x 1.25 = 11.25 kW), so its sizing rests on
    // the RMS: a 10 s load and 400 s idling vented is a 410 s cycle, too long for it.
    let vented = |seconds| [(seconds, IdlePath::Vented)];
    let too_long = |motor_kw: f64, idle_s: f64| {
        solve(&test_stand(motor_kw, 1500.0, &vented(idle_s)))
            .unwrap()
            .designs[0]
            .findings
            .iter()
            .find_map(|f| match f {
                Finding::RmsCycleTooLong { cycle, longest } => Some((cycle.value, longest.value)),
                _ => None,
            })
    };
    assert_eq!(too_long(9.0, 400.0), Some((410.0, 300.0)));
    // Within five minutes, or on a motor that carries the peak all the time, nothing is said.
    assert_eq!(too_long(9.0, 280.0), None);
    assert_eq!(too_long(11.0, 400.0), None);
    let report = solve(&test_stand(9.0, 1500.0, &vented(400.0))).unwrap();
    let text = report.designs[0].findings[0].describe(phasewise_engine::units::UnitSystem::Si);
    assert!(
        text.contains("410.0 s") && text.contains("300.0 s"),
        "{text}"
    );
}

#[test]
fn idles_that_stop_the_motor_are_counted_as_starts_an_hour() {
    // Allowed starts an hour, NEMA MG 10-2001 Table 2-3 column A (NEMA Design A and B motors,
    // as reproduced in EASA's Electrical Engineering Handbook, "Allowable starts and starting
    // intervals"): 15 hp 4-pole 10.7, 6-pole 12.1; an 11 kW motor is 14.75 hp, the 15 hp row.
    let starts = |motor_kw: f64, rpm: f64, rest: &[(f64, IdlePath)]| {
        solve(&test_stand(motor_kw, rpm, rest)).unwrap().designs[0]
            .findings
            .iter()
            .find_map(|f| match f {
                Finding::MotorStartsTooOften {
                    starts_per_hour,
                    allowed_per_hour,
                } => Some((*starts_per_hour, *allowed_per_hour)),
                _ => None,
            })
    };
    let stopped = IdlePath::MotorStopped;
    // One stop in a 60 s cycle: 60 starts an hour.
    let (n, allowed) = starts(11.0, 1500.0, &[(50.0, stopped)]).unwrap();
    assert_close(n, 60.0, REL, "starts an hour");
    assert_eq!(allowed, 10.7);
    let (_, allowed) = starts(11.0, 960.0, &[(50.0, stopped)]).unwrap();
    assert_eq!(allowed, 12.1, "6-pole");
    // Two stops with the load between them: the load, stopped 20 s, running (vented) 10 s,
    // stopped 20 s: two separate stops in 60 s, 120 starts an hour.
    let two = [(20.0, stopped), (10.0, IdlePath::Vented), (20.0, stopped)];
    assert_close(
        starts(11.0, 1500.0, &two).unwrap().0,
        120.0,
        REL,
        "two stops",
    );
    // Two stopped idles one after the other are one stop.
    let one = [(20.0, stopped), (30.0, stopped)];
    assert_close(starts(11.0, 1500.0, &one).unwrap().0, 60.0, REL, "one stop");
    // A cycle of 10 s + 390 s stopped: 9 starts an hour, within 10.7.
    assert_eq!(starts(11.0, 1500.0, &[(390.0, stopped)]), None);
    // Never stopped: no starts to count.
    assert_eq!(starts(11.0, 1500.0, &[(50.0, IdlePath::Vented)]), None);
}

/// A pressure-compensated flow control holds its flow only with a working drop across it
/// (common practice: 5 to 10 bar; the advice's default 7 bar). A metered 20 bar move on a 22
/// bar remote stage leaves it about 1.5 bar: a finding says so.
#[test]
fn a_metered_move_whose_limit_starves_its_flow_control_says_so() {
    let mut d = design(
        "one pump",
        motor(15.0, 1000.0, 0.9),
        vec![],
        fixed_pump(30.0, 1.0, 100.0, 0.9, 0.0),
        relief(ReliefKind::PilotOperated, 150.0, 60.0, 0.97),
        1,
    );
    let (mut cycle, _) = test_rig(&[20.0]);
    if let PhaseKind::Move(m) = &mut cycle[0].kind {
        m.speed = metered_speed(0.05);
    }
    let starved = |report: &phasewise_engine::JobReport| {
        report.designs[0].phases[0]
            .findings
            .iter()
            .any(|f| matches!(f, Finding::FlowControlStarved { .. }))
    };
    assert!(!starved(
        &solve(&job(cycle.clone(), vec![d.clone()])).unwrap()
    ));
    d.remote_stages = vec![bar_(22.0)];
    d.phase_settings[0].limit = ActiveLimit::Remote { stage: 0 };
    let report = solve(&job(cycle, vec![d])).unwrap();
    assert!(
        starved(&report),
        "{:?}",
        report.designs[0].phases[0].findings
    );
}

/// "Which phase wastes most" is answered per cycle: the trim press's 10 s idle over the relief
/// (4731.873 W, worked above) costs 47.32 kJ a cycle and outranks its 5 s dwell at the same
/// power (23.66 kJ); each phase's energy is its input times its duration, the shares add up to
/// the whole cycle, and the dwell says both the 120 bar it needs and the 160 bar the pump holds.
#[test]
fn phases_rank_by_their_energy_over_the_cycle() {
    let (cycle, d) = trim_press(false);
    let job = job(cycle, vec![d]);
    let report = solve(&job).unwrap();
    let ranked = phasewise_engine::phases_by_energy(&job, &report, 0);
    assert_eq!(ranked.len(), 5);
    let place = |name: &str| ranked.iter().position(|e| e.name == name).unwrap();
    assert!(place("unload part") < place("dwell"));
    let idle = &ranked[place("unload part")];
    assert_close(
        idle.energy.value,
        4_731.872_864_446_938 * 10.0,
        REL,
        "idle, J",
    );
    let dwell = &ranked[place("dwell")];
    assert_close(
        dwell.energy.value,
        4_731.872_864_446_938 * 5.0,
        REL,
        "dwell, J",
    );
    assert_eq!(dwell.needed.map(|q| q.value), Some(120e5));
    assert_close(dwell.pump.value, 160e5, REL, "dwell pump, Pa");
    assert_eq!(idle.needed.map(|q| q.value), None);
    let shares: f64 = ranked.iter().map(|e| e.share).sum();
    assert_close(shares, 1.0, 1e-12, "shares");
    assert_close(
        ranked.iter().map(|e| e.energy.value).sum::<f64>(),
        report.designs[0].totals.energy_per_cycle.value,
        1e-12,
        "the cycle's energy",
    );
    assert!(ranked
        .windows(2)
        .all(|w| w[0].energy.value >= w[1].energy.value));
    assert!(phasewise_engine::phases_by_energy(&job, &report, 3).is_empty());
}
