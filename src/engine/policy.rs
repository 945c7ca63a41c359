//! The user's margins and choices that steer the algorithms, kept in the job: the settings
//! advice's margins, what the staging search may choose from, and where the pump-wear verdict
//! draws its lines. Below every algorithm that reads them.

use super::motor::EfficiencyClass;
use serde::{Deserialize, Serialize};
use uom::si::f64::{AngularVelocity, Pressure, Time, Volume};

/// The margins and thresholds the advice uses. Every default is common practice.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct AdvicePolicy {
    /// A setting stays at least this share above the pressure it must reach (common
    /// practice: about 10 %).
    pub margin_fraction: f64,
    /// ... and at least this much above it (common practice: 7 to 15 bar, 100 to 200 psi).
    #[serde(rename = "margin_min_pa")]
    pub margin_min: Pressure,
    /// The drop a pressure-compensated flow control needs across it to hold its flow (common
    /// practice: 5 to 10 bar; the maker's curve decides).
    #[serde(rename = "flow_control_drop_pa")]
    pub flow_control_drop: Pressure,
    /// A change that saves less than this in its phase is not worth advising (W).
    pub least_saving_w: f64,
    /// A relief stays at least this far above a compensated pump's dead-head pressure (and
    /// `margin_fraction` of it, whichever is more), so the pump destrokes before the relief
    /// opens (common practice: about 10 %, or 15 to 20 bar). Absent in older files: 15 bar.
    #[serde(
        rename = "compensator_margin_min_pa",
        default = "typical_compensator_margin"
    )]
    pub compensator_margin_min: Pressure,
}

fn typical_compensator_margin() -> Pressure {
    bar(15.0)
}

impl Default for AdvicePolicy {
    fn default() -> Self {
        AdvicePolicy {
            margin_fraction: 0.10,
            margin_min: bar(7.0),
            flow_control_drop: bar(7.0),
            least_saving_w: 100.0,
            compensator_margin_min: typical_compensator_margin(),
        }
    }
}

fn bar(b: f64) -> Pressure {
    Pressure::new::<uom::si::pressure::bar>(b)
}

/// Standard motor ratings to size on.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize, Default)]
#[serde(rename_all = "snake_case")]
pub enum MotorSteps {
    /// IEC 60072-1 rated outputs in kW (the series from memory).
    #[default]
    IecKw,
    /// NEMA MG 1 horsepower ratings (the series from memory).
    NemaHp,
}

/// IEC rated outputs, kW (IEC 60072-1 series, from memory).
pub const IEC_KW: [f64; 24] = [
    0.37, 0.55, 0.75, 1.1, 1.5, 2.2, 3.0, 4.0, 5.5, 7.5, 11.0, 15.0, 18.5, 22.0, 30.0, 37.0, 45.0,
    55.0, 75.0, 90.0, 110.0, 132.0, 160.0, 200.0,
];
/// NEMA ratings, hp (NEMA MG 1 series, from memory).
pub const NEMA_HP: [f64; 22] = [
    0.5, 0.75, 1.0, 1.5, 2.0, 3.0, 5.0, 7.5, 10.0, 15.0, 20.0, 25.0, 30.0, 40.0, 50.0, 60.0, 75.0,
    100.0, 125.0, 150.0, 200.0, 250.0,
];

impl MotorSteps {
    /// The ratings in W, smallest first.
    pub fn ratings_w(self) -> Vec<f64> {
        match self {
            MotorSteps::IecKw => IEC_KW.iter().map(|kw| kw * 1e3).collect(),
            MotorSteps::NemaHp => NEMA_HP
                .iter()
                .map(|hp| hp * super::units::HORSEPOWER)
                .collect(),
        }
    }

    /// The class a new motor of these steps usually has: IE3 for IEC motors, NEMA Premium for
    /// NEMA ones (the minimum for most new motors sold in the EU and the US; from memory).
    pub fn usual_class(self) -> EfficiencyClass {
        match self {
            MotorSteps::IecKw => EfficiencyClass::Ie3,
            MotorSteps::NemaHp => EfficiencyClass::NemaPremium,
        }
    }
}

impl StagingOptions {
    /// The new motor's efficiency class: the chosen one, else the steps' usual one.
    pub fn efficiency_class(&self) -> EfficiencyClass {
        self.efficiency_class
            .unwrap_or_else(|| self.motor_steps.usual_class())
    }
}

/// What the search may choose from, and what it must meet. Stored with the job.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct StagingOptions {
    /// Pump displacements to choose from. Default: the R10 preferred numbers (ISO 3) from 2.5
    /// to 160 cm^3/rev, as gear and vane pumps are commonly sized (sizes from memory).
    #[serde(rename = "displacements_m3_per_rev")]
    pub displacements: Vec<Volume>,
    /// Motor full-load speeds to choose from. Default: 4- and 6-pole motors at 50 and 60 Hz,
    /// 1450, 1750, 960 and 1160 rpm (common full-load speeds, from memory).
    #[serde(rename = "speeds_rad_per_s")]
    pub speeds: Vec<AngularVelocity>,
    /// At most this many fixed pumps on the shaft (1 to 3).
    pub max_pumps: usize,
    /// Also try a single pressure-compensated pump of each size.
    pub compensated: bool,
    /// Also try a single fixed pump of each size on a variable-speed drive (absent in older
    /// files: yes).
    #[serde(default = "yes")]
    pub drives: bool,
    /// The drive candidates turn at most at each of `speeds` and at least at each of these.
    /// Default: 300 and 600 rpm (common practice, from memory: gear and vane pumps' makers
    /// state minimum speeds of a few hundred rpm for lubrication).
    #[serde(
        default = "usual_drive_min_speeds",
        rename = "drive_min_speeds_rad_per_s"
    )]
    pub drive_min_speeds: Vec<AngularVelocity>,
    pub motor_steps: MotorSteps,
    /// The efficiency class of the new motor: each candidate's motor takes the class's nominal
    /// full-load efficiency at its own rating. Absent: [`MotorSteps::usual_class`].
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub efficiency_class: Option<EfficiencyClass>,
    /// The motor's permissible continuous load over its rating: it must cover the RMS power.
    pub service_factor: f64,
    /// How far over its rating the motor may be loaded at the cycle's peak (common practice:
    /// about 1.25 for short peaks; the motor's breakdown torque decides).
    pub peak_allowance: f64,
    /// The longest the whole cycle may take. Absent: no limit beyond the moves' own (each
    /// move's target time, as found unless set on the move; the other phases' times are set).
    #[serde(
        default,
        rename = "cycle_time_target_s",
        skip_serializing_if = "Option::is_none"
    )]
    pub cycle_time_target: Option<Time>,
}

fn yes() -> bool {
    true
}

fn usual_drive_min_speeds() -> Vec<AngularVelocity> {
    [300.0, 600.0]
        .iter()
        .map(|rpm| AngularVelocity::new::<uom::si::angular_velocity::revolution_per_minute>(*rpm))
        .collect()
}

impl Default for StagingOptions {
    fn default() -> Self {
        const R10: [f64; 18] = [
            2.5, 4.0, 5.0, 6.3, 8.0, 10.0, 12.5, 16.0, 20.0, 25.0, 32.0, 40.0, 50.0, 63.0, 80.0,
            100.0, 125.0, 160.0,
        ];
        StagingOptions {
            displacements: R10
                .iter()
                .map(|cc| Volume::new::<uom::si::volume::cubic_centimeter>(*cc))
                .collect(),
            speeds: [1450.0, 1750.0, 960.0, 1160.0]
                .iter()
                .map(|rpm| {
                    AngularVelocity::new::<uom::si::angular_velocity::revolution_per_minute>(*rpm)
                })
                .collect(),
            max_pumps: 3,
            compensated: true,
            drives: true,
            drive_min_speeds: usual_drive_min_speeds(),
            motor_steps: MotorSteps::IecKw,
            efficiency_class: None,
            service_factor: 1.0,
            peak_allowance: 1.25,
            cycle_time_target: None,
        }
    }
}

/// Where the wear verdict draws its lines: the volumetric efficiency the leakage line predicts
/// at the pump's rated pressure. Kept with the job.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct WearPolicy {
    /// At or above this the pump is in good order (common practice: about 90 % for gear and
    /// vane pumps; a new one gives 92 to 97 %; from memory).
    pub good_from: f64,
    /// Below this the pump is worn: plan a repair or a replacement (common practice: about
    /// 80 %; from memory).
    pub worn_below: f64,
}

impl Default for WearPolicy {
    fn default() -> Self {
        WearPolicy {
            good_from: 0.90,
            worn_below: 0.80,
        }
    }
}
