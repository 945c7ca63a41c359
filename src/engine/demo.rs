//! The demo job: an invented scrap baler, loaded on first start and shown as example data.
//! Its two-pump unit dumps the small pump over the main relief while the operator loads
//! scrap; the proposal vents that idle and holds the dwell on a lower remote stage. Its oil
//! settles where its tank and air-blast cooler shed the heat.

use super::cycle::*;
use super::job::{Job, Oil, Site, SCHEMA_VERSION};
use super::motor::{ElectricalRating, Motor};
use super::motor_check::{LineReading, MotorCheck, MotorNameplate, MotorReading};
use super::power_unit::{Design, PhaseSetting, UnloadingStage};
use super::pump::{Pump, PumpControl};
use super::pump_test::MotorEfficiency;
use super::units::UnitSystem;
use super::valve::*;
use uom::si::angular_velocity::revolution_per_minute;
use uom::si::electric_current::ampere;
use uom::si::electric_potential::volt;
use uom::si::f64::*;
use uom::si::force::kilonewton;
use uom::si::length::millimeter;
use uom::si::power::kilowatt;
use uom::si::pressure::bar;
use uom::si::time::second;
use uom::si::volume::{cubic_centimeter, liter};
use uom::si::volume_rate::liter_per_minute;

/// The ram's lines: 6 m of hose to the valve with four elbows, 25 mm bore on the pressure
/// side and 32 mm on the return, which carries the cap end's larger flow on the return stroke.
fn ram_lines() -> super::lines::MoveLines {
    use super::lines::{Fitting, FittingKind, Line};
    let hose = |bore_mm| Line {
        inner_diameter: Length::new::<millimeter>(bore_mm),
        length: Length::new::<millimeter>(6000.0),
        fittings: vec![Fitting {
            kind: FittingKind::Elbow90,
            count: 4,
        }],
    };
    super::lines::MoveLines {
        pressure_line: hose(25.0),
        return_line: hose(32.0),
    }
}

fn celsius(c: f64) -> ThermodynamicTemperature {
    ThermodynamicTemperature::new::<uom::si::thermodynamic_temperature::degree_celsius>(c)
}

fn ram(name: &str, stroke_mm: f64, direction: Direction, force_kn: f64, line_bar: f64) -> Phase {
    Phase {
        name: name.into(),
        kind: PhaseKind::Move(MovePhase {
            cylinder: Cylinder {
                bore: Length::new::<millimeter>(160.0),
                rod: Length::new::<millimeter>(100.0),
                stroke: Length::new::<millimeter>(stroke_mm),
            },
            direction,
            load: Load::Force {
                force: Force::new::<kilonewton>(force_kn),
            },
            line_loss: Pressure::new::<bar>(line_bar),
            lines: Some(ram_lines()),
            speed: SpeedRule::AllPumpFlow,
            target_time: None,
        }),
    }
}

fn pump(cc: f64) -> Pump {
    Pump {
        displacement: Volume::new::<cubic_centimeter>(cc),
        volumetric_efficiency: 0.92,
        efficiency_pressure: Pressure::new::<bar>(210.0),
        efficiency_temperature: Some(celsius(50.0)),
        efficiency_speed: None,
        hydromechanical_efficiency: 0.90,
        drag_power: Power::new::<kilowatt>(0.15 + cc * 0.004),
        rated_pressure: Pressure::new::<bar>(250.0),
        control: PumpControl::Fixed,
    }
}

/// The example job.
pub fn scrap_baler() -> Job {
    let cycle = vec![
        ram("Fast approach", 900.0, Direction::Extend, 15.0, 3.0),
        ram("Compress", 300.0, Direction::Extend, 300.0, 3.0),
        Phase {
            name: "Dwell".into(),
            kind: PhaseKind::Hold(HoldPhase {
                pressure: Pressure::new::<bar>(160.0),
                duration: Time::new::<second>(4.0),
                mode: HoldMode::HeldByPump,
            }),
        },
        ram("Return", 1200.0, Direction::Retract, 10.0, 3.0),
        Phase {
            name: "Load scrap".into(),
            kind: PhaseKind::Idle(IdlePhase {
                duration: Time::new::<second>(25.0),
            }),
        },
    ];
    let as_found = Design {
        name: "As found".into(),
        drive: None,
        motor: Motor {
            rated_power: Power::new::<kilowatt>(22.0),
            full_load_speed: AngularVelocity::new::<revolution_per_minute>(1470.0),
            full_load_efficiency: 0.91,
            fixed_loss_share: super::motor::TYPICAL_FIXED_LOSS_SHARE,
            service_factor: 1.0,
            peak_allowance: super::motor::TYPICAL_PEAK_ALLOWANCE,
            electrical: Some(ElectricalRating {
                voltage: ElectricPotential::new::<volt>(400.0),
                full_load_current: ElectricCurrent::new::<ampere>(41.0),
                power_factor: Some(0.85),
            }),
        },
        unloading_stages: vec![UnloadingStage {
            pump: pump(63.0),
            unloading: UnloadingValve {
                setting: Pressure::new::<bar>(70.0),
                unloaded_drop: Pressure::new::<bar>(4.0),
            },
            check: CheckValve {
                cracking: Pressure::new::<bar>(0.5),
            },
        }],
        base_pump: pump(16.0),
        relief: ReliefValve {
            kind: ReliefKind::PilotOperated,
            setting: Pressure::new::<bar>(210.0),
            rated_flow: VolumeRate::new::<liter_per_minute>(160.0),
            cracking_fraction: ReliefKind::PilotOperated.typical_cracking_fraction(),
        },
        remote_stages: vec![],
        vent_pressure: Pressure::new::<bar>(1.7),
        phase_settings: vec![PhaseSetting::default(); cycle.len()],
        cooler: Some(super::heat::Cooler {
            coolant: super::heat::Coolant::Air,
            coolant_temperature: celsius(30.0),
            rated_heat: Power::new::<kilowatt>(6.0),
            rated_difference: TemperatureInterval::new::<uom::si::temperature_interval::kelvin>(
                25.0,
            ),
        }),
        suction_line: Some(super::lines::Line {
            inner_diameter: Length::new::<millimeter>(50.0),
            length: Length::new::<millimeter>(800.0),
            fittings: vec![],
        }),
        retrofit_price: None,
        made_from: None,
    };
    let mut proposed = Design::proposal_from(&as_found, "Proposed".into());
    // What the advice asks of it: main at the compress's lowest serving limit, the dwell held
    // at its own pressure by a remote stage, the idle vented.
    proposed.relief.setting = Pressure::new::<bar>(167.5);
    proposed.remote_stages = vec![Pressure::new::<bar>(160.0)];
    proposed.phase_settings[2].limit = ActiveLimit::Remote { stage: 0 };
    proposed.phase_settings[4].idle_path = IdlePath::Vented;
    // The retrofit most quotes are about: the same pumps on a variable-speed drive that stops
    // them while scrap is loaded, the relief a safety valve where the advice puts it (the
    // dwell's 160 bar with its margin).
    let mut driven = Design::proposal_from(&as_found, "Variable speed".into());
    driven.drive = Some(super::drive::VariableSpeed {
        idle: super::drive::IdleSpeed::Stopped,
        ..super::drive::VariableSpeed::first_for(&as_found.motor)
    });
    driven.relief.setting = Pressure::new::<bar>(176.0);
    driven.retrofit_price = Some(7800.0);
    Job {
        schema_version: SCHEMA_VERSION,
        name: "Scrap baler (example)".into(),
        notes: "An invented example: a two-pump baler whose small pump dumps over the relief while scrap is loaded.".into(),
        example: true,
        units: UnitSystem::Si,
        cycle,
        designs: vec![as_found, proposed, driven],
        site: Site { location: "Recycling yard, press bay 2 (invented)".into(), operating_hours_per_year: 3500.0, tariff_per_kwh: 0.18, currency: "EUR".into(), retrofit_price: 2400.0, grid_factor: None , demand_charge: None, power_factor_threshold: None},
        oil: Oil {
            working_temperature: super::site::WorkingTemperature::Settled,
            ..Oil::mineral(Volume::new::<liter>(400.0))
        },
        advice: Default::default(),
        staging: Default::default(),
        pump_tests: Vec::new(),
        motor_checks: vec![MotorCheck {
            motor: "Main motor, 22 kW".into(),
            date: "2026-11-24".into(),
            notes: "Read in the dwell, then on the fast approach.".into(),
            design: 0,
            nameplate: MotorNameplate {
                rated_power: Power::new::<kilowatt>(22.0),
                voltage: ElectricPotential::new::<volt>(400.0),
                full_load_current: ElectricCurrent::new::<ampere>(41.0),
                full_load_speed: AngularVelocity::new::<revolution_per_minute>(1470.0),
                efficiency: MotorEfficiency::Entered { efficiency: 0.91 },
                power_factor: Some(0.85),
                synchronous_speed: None,
            },
            readings: vec![
                MotorReading {
                    input: None,
                    line: Some(LineReading {
                        voltage: ElectricPotential::new::<volt>(398.0),
                        current: ElectricCurrent::new::<ampere>(23.4),
                        power_factor: Some(0.72),
                    }),
                    speed: Some(AngularVelocity::new::<revolution_per_minute>(1486.0)),
                },
                MotorReading {
                    input: None,
                    line: Some(LineReading {
                        voltage: ElectricPotential::new::<volt>(401.0),
                        current: ElectricCurrent::new::<ampere>(15.6),
                        power_factor: Some(0.40),
                    }),
                    speed: Some(AngularVelocity::new::<revolution_per_minute>(1495.0)),
                },
            ],
        }],
        wear: Default::default(),
        tank: Some(super::heat::Tank {
            size: super::heat::TankSize::Box {
                length: Length::new::<millimeter>(1200.0),
                width: Length::new::<millimeter>(800.0),
                oil_depth: Length::new::<millimeter>(450.0),
            },
            air: super::heat::AirAround::Normal,
            ambient: celsius(30.0),
            steel_mass: Some(Mass::new::<uom::si::mass::kilogram>(180.0)),
        }),
        warm_up: None,
    }
}

/// Makes an edited example the user's own job: it is no longer marked as an example (no banner,
/// no "example" in a quote, a report or an export), and the invented words that describe the
/// example go (its notes, its site, the "(example)" in its name) where they are still the
/// example's. Every figure stays as the user left it. Nothing changes on a job that is not an
/// example.
pub fn claim(job: &mut Job) {
    if !job.example {
        return;
    }
    let example = scrap_baler();
    job.example = false;
    if job.notes == example.notes {
        job.notes.clear();
    }
    if job.site.location == example.site.location {
        job.site.location.clear();
    }
    if job.name == example.name {
        job.name = EXAMPLE_MACHINE.to_string();
    }
}

/// The example's machine, without the "(example)" its job's name carries.
const EXAMPLE_MACHINE: &str = "Scrap baler";

#[cfg(test)]
mod tests {
    #[test]
    fn an_edited_example_becomes_the_users_job_with_its_figures() {
        let mut job = super::scrap_baler();
        job.cycle[1].name = "Press".into();
        let edited = job.clone();
        super::claim(&mut job);
        assert!(!job.example);
        assert_eq!(job.notes, "");
        assert_eq!(job.site.location, "");
        assert_eq!(job.name, "Scrap baler");
        assert_eq!(
            (job.cycle.clone(), job.designs.clone()),
            (edited.cycle, edited.designs)
        );
        assert!(!job.to_json().contains("\"example\": true"));
        // The user's own words stay; a job that is not an example is never touched.
        let mut own = super::scrap_baler();
        own.notes = "measured on site".into();
        own.name = "Baler 3".into();
        super::claim(&mut own);
        assert_eq!(
            (own.notes.as_str(), own.name.as_str()),
            ("measured on site", "Baler 3")
        );
        let before = own.clone();
        super::claim(&mut own);
        assert_eq!(own, before);
    }

    /// The demo's proposal is the example users learn from: it must follow the advice's own
    /// rules, so the advice has nothing to say about it.
    #[test]
    fn the_demo_proposal_follows_the_advices_own_rules() {
        let job = super::scrap_baler();
        for proposal in 1..job.designs.len() {
            let advice =
                super::super::settings::advise(&job, proposal).expect("the demo job is valid");
            assert!(advice.is_empty(), "{proposal}: {advice:#?}");
        }
    }

    #[test]
    fn the_demo_job_solves_and_its_proposal_saves_energy() {
        let report = super::super::solve(&super::scrap_baler()).expect("the demo job is valid");
        assert_eq!(report.designs.len(), 3);
        for comparison in &report.comparisons {
            let saved = comparison
                .annual_energy_saved
                .get::<uom::si::energy::kilowatt_hour>();
            assert!(saved > 0.0, "{}: {saved}", comparison.proposed);
        }
        for design in &report.designs {
            assert!(
                design.findings.is_empty(),
                "{}: {:?}",
                design.name,
                design.findings
            );
            for phase in &design.phases {
                assert!(
                    phase.findings.is_empty(),
                    "{}: {:?}",
                    phase.name,
                    phase.findings
                );
            }
        }
    }
}
