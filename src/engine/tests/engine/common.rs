//! Builders for the engine's tests: jobs written in the trade's units, so a test reads like
//! the machine it describes. Every value here is an invented scenario, not a reference.

use phasewise_engine::cycle::*;
use phasewise_engine::job::{Job, Oil, Site, SCHEMA_VERSION};
use phasewise_engine::motor::Motor;
use phasewise_engine::power_unit::{Design, PhaseSetting, UnloadingStage};
use phasewise_engine::pump::{Pump, PumpControl};
use phasewise_engine::units::UnitSystem;
use phasewise_engine::valve::*;
// The trade's US units at their exact definitions, for the tests that read US figures.
pub use phasewise_engine::units::us::{pressure::psi, volume_rate::gallon_per_minute};
use uom::si::angular_velocity::revolution_per_minute;
use uom::si::f64::*;
use uom::si::force::kilonewton;
use uom::si::length::millimeter;
use uom::si::power::kilowatt;
use uom::si::pressure::bar;
use uom::si::time::second;
use uom::si::velocity::meter_per_second;
use uom::si::volume::{cubic_centimeter, liter};
use uom::si::volume_rate::liter_per_minute;

pub fn bar_(v: f64) -> Pressure {
    Pressure::new::<bar>(v)
}
pub fn lpm(v: f64) -> VolumeRate {
    VolumeRate::new::<liter_per_minute>(v)
}
pub fn kw(v: f64) -> Power {
    Power::new::<kilowatt>(v)
}
pub fn mm(v: f64) -> Length {
    Length::new::<millimeter>(v)
}
pub fn s(v: f64) -> Time {
    Time::new::<second>(v)
}

/// In the trade's units, for assertions: the value of a quantity in bar, L/min, kW.
pub fn in_bar(p: Pressure) -> f64 {
    p.get::<bar>()
}
pub fn in_lpm(q: VolumeRate) -> f64 {
    q.get::<liter_per_minute>()
}
pub fn in_kw(p: Power) -> f64 {
    p.get::<kilowatt>()
}

/// `|actual - expected| <= rel * |expected|`, with a message that shows both.
#[track_caller]
pub fn assert_close(actual: f64, expected: f64, rel: f64, what: &str) {
    let ok = (actual - expected).abs() <= rel * expected.abs().max(1e-300);
    assert!(
        ok,
        "{what}: got {actual}, expected {expected} (to {rel:e} relative)"
    );
}

/// A fixed pump in cm^3/rev, with its volumetric efficiency at a pressure in bar.
pub fn fixed_pump(
    cc_per_rev: f64,
    volumetric: f64,
    at_bar: f64,
    hydromechanical: f64,
    drag_kw: f64,
) -> Pump {
    Pump {
        displacement: Volume::new::<cubic_centimeter>(cc_per_rev),
        volumetric_efficiency: volumetric,
        efficiency_pressure: bar_(at_bar),
        efficiency_temperature: None,
        efficiency_speed: None,
        hydromechanical_efficiency: hydromechanical,
        drag_power: kw(drag_kw),
        rated_pressure: bar_(250.0),
        control: PumpControl::Fixed,
    }
}

/// A frictionless, leak-free pump: for published checks that assume ideal pumps.
pub fn ideal_pump(cc_per_rev: f64) -> Pump {
    fixed_pump(cc_per_rev, 1.0, 100.0, 1.0, 0.0)
}

pub fn motor(kw_rated: f64, rpm: f64, efficiency: f64) -> Motor {
    Motor {
        rated_power: kw(kw_rated),
        full_load_speed: AngularVelocity::new::<revolution_per_minute>(rpm),
        full_load_efficiency: efficiency,
        fixed_loss_share: 0.35,
        service_factor: 1.0,
        peak_allowance: phasewise_engine::motor::TYPICAL_PEAK_ALLOWANCE,
        electrical: None,
    }
}

pub fn relief(kind: ReliefKind, setting_bar: f64, rated_lpm: f64, cracking: f64) -> ReliefValve {
    ReliefValve {
        kind,
        setting: bar_(setting_bar),
        rated_flow: lpm(rated_lpm),
        cracking_fraction: cracking,
    }
}

pub fn stage(pump: Pump, unload_bar: f64, drop_bar: f64, check_bar: f64) -> UnloadingStage {
    UnloadingStage {
        pump,
        unloading: UnloadingValve {
            setting: bar_(unload_bar),
            unloaded_drop: bar_(drop_bar),
        },
        check: CheckValve {
            cracking: bar_(check_bar),
        },
    }
}

/// A design with every phase on the main limit (idle over it), for `phases` phases.
pub fn design(
    name: &str,
    motor: Motor,
    stages: Vec<UnloadingStage>,
    base: Pump,
    relief: ReliefValve,
    phases: usize,
) -> Design {
    Design {
        name: name.into(),
        motor,
        drive: None,
        unloading_stages: stages,
        base_pump: base,
        relief,
        cooler: None,
        suction_line: None,
        remote_stages: vec![],
        vent_pressure: bar_(1.5),
        phase_settings: vec![PhaseSetting::default(); phases],
        retrofit_price: None,
        made_from: None,
    }
}

#[allow(clippy::too_many_arguments)] // a move phase reads best as one line of its figures
pub fn move_phase(
    name: &str,
    bore_mm: f64,
    rod_mm: f64,
    stroke_mm: f64,
    direction: Direction,
    force_kn: f64,
    line_bar: f64,
    speed: SpeedRule,
) -> Phase {
    Phase {
        name: name.into(),
        kind: PhaseKind::Move(MovePhase {
            cylinder: Cylinder {
                bore: mm(bore_mm),
                rod: mm(rod_mm),
                stroke: mm(stroke_mm),
            },
            direction,
            load: Load::Force {
                force: Force::new::<kilonewton>(force_kn),
            },
            line_loss: bar_(line_bar),
            lines: None,
            speed,
            target_time: None,
        }),
    }
}

pub fn metered_speed(m_per_s: f64) -> SpeedRule {
    SpeedRule::MeteredSpeed {
        speed: Velocity::new::<meter_per_second>(m_per_s),
    }
}

pub fn hold(name: &str, bar_held: f64, seconds: f64, mode: HoldMode) -> Phase {
    Phase {
        name: name.into(),
        kind: PhaseKind::Hold(HoldPhase {
            pressure: bar_(bar_held),
            duration: s(seconds),
            mode,
        }),
    }
}

pub fn idle(name: &str, seconds: f64) -> Phase {
    Phase {
        name: name.into(),
        kind: PhaseKind::Idle(IdlePhase {
            duration: s(seconds),
        }),
    }
}

pub fn direct(name: &str, flow_lpm: f64, pressure_bar: f64, seconds: f64) -> Phase {
    Phase {
        name: name.into(),
        kind: PhaseKind::Direct(DirectPhase {
            flow: lpm(flow_lpm),
            pressure: bar_(pressure_bar),
            duration: s(seconds),
        }),
    }
}

pub fn job(cycle: Vec<Phase>, designs: Vec<Design>) -> Job {
    Job {
        schema_version: SCHEMA_VERSION,
        name: "test job".into(),
        notes: String::new(),
        example: false,
        units: UnitSystem::Si,
        cycle,
        designs,
        site: Site {
            location: String::new(),
            operating_hours_per_year: 4000.0,
            tariff_per_kwh: 0.20,
            currency: "EUR".into(),
            retrofit_price: 3000.0,
            grid_factor: None,
            demand_charge: None,
            power_factor_threshold: None,
        },
        oil: Oil::mineral(Volume::new::<liter>(200.0)),
        advice: Default::default(),
        staging: Default::default(),
        pump_tests: Vec::new(),
        motor_checks: Vec::new(),
        wear: Default::default(),
        tank: None,
        warm_up: None,
    }
}

/// An invented high-low press's cycle (shared by the settings and staging tests): bore 100 mm,
/// rod 56 mm; approach 300 mm against 5 kN with 4 bar line loss, press 40 mm against 100 kN
/// with 4 bar, return 340 mm against 3 kN with 6 bar, all at all pump flow; a 20 s idle.
pub fn high_low_cycle() -> Vec<Phase> {
    vec![
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
            40.0,
            Direction::Extend,
            100.0,
            4.0,
            SpeedRule::AllPumpFlow,
        ),
        move_phase(
            "return",
            100.0,
            56.0,
            340.0,
            Direction::Retract,
            3.0,
            6.0,
            SpeedRule::AllPumpFlow,
        ),
        idle("unload parts", 20.0),
    ]
}
