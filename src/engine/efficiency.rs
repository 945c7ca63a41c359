//! A pump's efficiency and wear from field readings: flow at one or more test pressures,
//! shaft speed, the motor's electrical input (or a measured shaft torque). The definitions are
//! ISO 4391's: volumetric efficiency = actual flow / (displacement x speed); hydromechanical =
//! displacement x pressure / (2 pi x torque); overall = hydraulic power out / shaft power in.
//!
//! A reading that cannot be right (more flow than the pump sweeps, an efficiency above 100 %, a
//! load the motor could not carry) gets a plain message and no figure, never a wrong number.

use super::motor::EfficiencyClass;
use super::power_unit::Design;
use super::units::UnitSystem;
use serde::{Deserialize, Serialize};
use uom::si::f64::{
    AngularVelocity, ElectricCurrent, ElectricPotential, Power, Pressure, Torque, Volume,
    VolumeRate,
};

/// One field test of one pump, kept with the job.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct PumpTest {
    /// Which pump, in the user's words ("pump 1, vane, 40 cc"): tests of the same pump are
    /// compared by this label.
    pub pump: String,
    /// The day of the test, `yyyy-mm-dd`.
    #[serde(default)]
    pub date: String,
    #[serde(default)]
    pub notes: String,
    /// The nameplate displacement.
    #[serde(rename = "displacement_m3_per_rev")]
    pub displacement: Volume,
    /// Shaft speed: measured, or the motor's full-load speed.
    #[serde(rename = "speed_rad_per_s")]
    pub speed: AngularVelocity,
    /// The maker's rated pressure: the leakage line predicts the efficiency there.
    #[serde(rename = "rated_pressure_pa")]
    pub rated_pressure: Pressure,
    /// The driving motor's nameplate rating.
    #[serde(rename = "motor_rated_power_w")]
    pub motor_rated_power: Power,
    pub motor_efficiency: MotorEfficiency,
    pub readings: Vec<Reading>,
}

/// Where the motor's efficiency comes from.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "from", rename_all = "snake_case")]
pub enum MotorEfficiency {
    /// From the nameplate (a fraction).
    Entered { efficiency: f64 },
    /// The published class's nominal figure for the motor's rating.
    Class { class: EfficiencyClass },
}

/// One reading: the flow at a test pressure, and optionally what the motor drew and the shaft
/// torque at the same time.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Reading {
    #[serde(rename = "pressure_pa")]
    pub pressure: Pressure,
    #[serde(rename = "flow_m3_per_s")]
    pub flow: VolumeRate,
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub electrical: Option<ElectricalInput>,
    #[serde(
        default,
        rename = "torque_n_m",
        skip_serializing_if = "Option::is_none"
    )]
    pub torque: Option<Torque>,
}

/// The motor's electrical input, as read.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "as", rename_all = "snake_case")]
pub enum ElectricalInput {
    /// From a power meter.
    Power {
        #[serde(rename = "input_w")]
        input: Power,
    },
    /// Three-phase line voltage, line current and power factor: P = sqrt(3) V I PF.
    ThreePhase {
        #[serde(rename = "line_voltage_v")]
        voltage: ElectricPotential,
        #[serde(rename = "line_current_a")]
        current: ElectricCurrent,
        power_factor: f64,
    },
}

impl ElectricalInput {
    /// The input power (W).
    pub fn watts(&self) -> f64 {
        match *self {
            ElectricalInput::Power { input } => input.value,
            ElectricalInput::ThreePhase {
                voltage,
                current,
                power_factor,
            } => 3f64.sqrt() * voltage.value * current.value * power_factor,
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

/// How far a motor is let carry a reading before the current is taken for a misreading
/// (common practice: induction motors do not run long above about 1.5 x rated).
pub const MOST_LOAD_BELIEVED: f64 = 1.5;

/// Something in the readings that cannot be right, with the field to look at (its path within
/// the test, e.g. `readings[1].flow_m3_per_s`).
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Problem {
    pub field: String,
    pub message: String,
}

/// What one reading says.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Default)]
pub struct ReadingReport {
    /// Actual over theoretical flow; none when the flow is above theoretical.
    pub volumetric: Option<f64>,
    /// Pressure x flow (W).
    pub hydraulic_w: f64,
    /// The electrical input (W), when read and believable.
    pub input_w: Option<f64>,
    /// Shaft power (W): 2 pi n T from the torque, else input x motor efficiency.
    pub shaft_w: Option<f64>,
    /// Whether the shaft power came from a measured torque.
    pub shaft_from_torque: bool,
    pub overall: Option<f64>,
    pub hydromechanical: Option<f64>,
    /// Shaft over electrical input, when both torque and input were read.
    pub motor_efficiency_measured: Option<f64>,
}

/// The least-squares line of flow against pressure through the believable readings:
/// flow = `zero_pressure_flow` - `leakage_per_pa` x pressure. With one reading, the line from
/// the theoretical flow at no pressure through it (leakage in proportion to pressure).
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct LeakageLine {
    /// m^3/s.
    pub zero_pressure_flow: f64,
    /// (m^3/s)/Pa.
    pub leakage_per_pa: f64,
    /// How many readings it was fitted through.
    pub readings: usize,
    /// The volumetric efficiency it predicts at the rated pressure.
    pub volumetric_at_rated: f64,
}

impl LeakageLine {
    /// The flow the line gives at `pressure` (m^3/s).
    pub fn flow_at(&self, pressure: f64) -> f64 {
        self.zero_pressure_flow - self.leakage_per_pa * pressure
    }
}

#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
#[serde(tag = "verdict", rename_all = "snake_case")]
pub enum Verdict {
    Good {
        volumetric_at_rated: f64,
    },
    /// Between the lines: wearing, test again sooner.
    Watch {
        volumetric_at_rated: f64,
    },
    Worn {
        volumetric_at_rated: f64,
    },
    /// No leakage line: no believable reading.
    NotJudged,
}

impl Verdict {
    /// The predicted volumetric efficiency at rated pressure the verdict was drawn on.
    pub fn volumetric_at_rated(&self) -> Option<f64> {
        match *self {
            Verdict::Good {
                volumetric_at_rated,
            }
            | Verdict::Watch {
                volumetric_at_rated,
            }
            | Verdict::Worn {
                volumetric_at_rated,
            } => Some(volumetric_at_rated),
            Verdict::NotJudged => None,
        }
    }
}

/// Everything a test says.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct TestReport {
    /// Displacement x speed (m^3/s).
    pub theoretical_flow: f64,
    /// The motor efficiency used for shaft power (a fraction); none when the class's table
    /// does not cover the rating.
    pub motor_efficiency: Option<f64>,
    pub readings: Vec<ReadingReport>,
    pub leakage: Option<LeakageLine>,
    pub verdict: Verdict,
    pub problems: Vec<Problem>,
}

/// The test read against `policy`, its messages in `units`. Call it on a test that passed
/// validation (finite, positive figures); it never panics either way.
pub fn assess(test: &PumpTest, policy: &WearPolicy, units: UnitSystem) -> TestReport {
    let mut problems = Vec::new();
    let theoretical = test.displacement.value * test.speed.value / std::f64::consts::TAU;
    let rated_motor = test.motor_rated_power.value;
    let motor_efficiency = match test.motor_efficiency {
        MotorEfficiency::Entered { efficiency } => Some(efficiency),
        MotorEfficiency::Class { class } => {
            match class.nominal_efficiency(test.motor_rated_power) {
                Ok(e) => Some(e),
                Err(range) => {
                    problems.push(Problem {
                    field: "motor_efficiency".into(),
                    message: format!(
                        "The class's table here covers {} to {}: enter the nameplate efficiency for a {} motor.",
                        units.power(range.lowest_w),
                        units.power(range.highest_w),
                        units.power(rated_motor)
                    ),
                });
                    None
                }
            }
        }
    };
    let mut reports = Vec::new();
    let mut fit_points = Vec::new();
    for (k, r) in test.readings.iter().enumerate() {
        let at = |field: &str| format!("readings[{k}].{field}");
        let p = r.pressure.value;
        let q = r.flow.value;
        let mut report = ReadingReport {
            hydraulic_w: p * q,
            ..ReadingReport::default()
        };
        if q > theoretical * (1.0 + 1e-9) {
            problems.push(Problem {
                field: at("flow_m3_per_s"),
                message: format!(
                    "{} is more than the pump sweeps at this speed ({}): check the meter range or the displacement and speed.",
                    units.flow(q),
                    units.flow(theoretical)
                ),
            });
        } else if theoretical > 0.0 {
            report.volumetric = Some(q / theoretical);
            fit_points.push((p, q));
        }
        let input = r.electrical.and_then(|e| {
            let w = e.watts();
            let shaft_guess = motor_efficiency.map_or(w, |m| w * m);
            if shaft_guess > rated_motor * MOST_LOAD_BELIEVED {
                problems.push(Problem {
                    field: at("electrical"),
                    message: format!(
                        "This input would load the {} motor to {:.0} % of its rating: check the clamp meter's range, that it is on one line conductor, and the voltage.",
                        units.power(rated_motor),
                        shaft_guess / rated_motor * 100.0
                    ),
                });
                None
            } else {
                Some(w)
            }
        });
        report.input_w = input;
        let from_torque = r.torque.map(|t| t.value * test.speed.value);
        report.shaft_from_torque = from_torque.is_some();
        report.shaft_w = from_torque.or_else(|| Some(input? * motor_efficiency?));
        if let (Some(shaft), Some(input)) = (from_torque, input) {
            if shaft > input * (1.0 + 1e-9) {
                problems.push(Problem {
                    field: at("torque_n_m"),
                    message: "The shaft power from this torque is more than the motor drew: check the torque reading or the electrical one.".into(),
                });
                report.shaft_w = None;
            } else if input > 0.0 {
                report.motor_efficiency_measured = Some(shaft / input);
            }
        }
        if let (Some(shaft), Some(vol)) = (report.shaft_w, report.volumetric) {
            let overall = report.hydraulic_w / shaft;
            if overall > 1.0 + 1e-9 {
                problems.push(Problem {
                    field: at(if report.shaft_from_torque { "torque_n_m" } else { "electrical" }),
                    message: format!(
                        "These figures put the pump's overall efficiency at {:.0} %, above 100 %: check the meters, the motor efficiency, or the displacement.",
                        overall * 100.0
                    ),
                });
                report.shaft_w = None;
            } else {
                let mechanical = if vol > 0.0 { overall / vol } else { f64::NAN };
                if mechanical.is_finite() && mechanical <= 1.0 + 1e-9 {
                    report.overall = Some(overall);
                    report.hydromechanical = Some(mechanical);
                } else {
                    problems.push(Problem {
                        field: at("flow_m3_per_s"),
                        message: "These figures put the hydromechanical efficiency above 100 %: the flow reading is likely low for the power drawn. Check the flow meter.".into(),
                    });
                }
            }
        }
        reports.push(report);
    }
    let rated = test.rated_pressure.value;
    let leakage = leakage_line(&fit_points, theoretical, rated);
    if let Some(line) = &leakage {
        if line.leakage_per_pa < 0.0 {
            problems.push(Problem {
                field: "readings".into(),
                message: "The flow rises with pressure across these readings, which leakage cannot do: check that the speed held and the meter read steadily.".into(),
            });
        }
    }
    let leakage = leakage.filter(|l| l.leakage_per_pa >= 0.0);
    let verdict = match leakage {
        None => Verdict::NotJudged,
        Some(l) => {
            let v = l.volumetric_at_rated;
            if v >= policy.good_from {
                Verdict::Good {
                    volumetric_at_rated: v,
                }
            } else if v >= policy.worn_below {
                Verdict::Watch {
                    volumetric_at_rated: v,
                }
            } else {
                Verdict::Worn {
                    volumetric_at_rated: v,
                }
            }
        }
    };
    TestReport {
        theoretical_flow: theoretical,
        motor_efficiency,
        readings: reports,
        leakage,
        verdict,
        problems,
    }
}

/// Least squares of flow on pressure (two or more distinct pressures), else the line from the
/// theoretical flow through the single reading.
fn leakage_line(points: &[(f64, f64)], theoretical: f64, rated: f64) -> Option<LeakageLine> {
    if points.is_empty() || theoretical <= 0.0 {
        return None;
    }
    let n = points.len() as f64;
    let mean_p = points.iter().map(|p| p.0).sum::<f64>() / n;
    let mean_q = points.iter().map(|p| p.1).sum::<f64>() / n;
    let spread: f64 = points.iter().map(|p| (p.0 - mean_p).powi(2)).sum();
    let (intercept, slope) = if points.len() >= 2 && spread > (mean_p * 1e-6).powi(2) * n {
        let slope = points
            .iter()
            .map(|p| (p.0 - mean_p) * (p.1 - mean_q))
            .sum::<f64>()
            / spread;
        (mean_q - slope * mean_p, slope)
    } else if mean_p > 0.0 {
        (theoretical, (mean_q - theoretical) / mean_p)
    } else {
        return None;
    };
    Some(LeakageLine {
        zero_pressure_flow: intercept,
        leakage_per_pa: -slope,
        readings: points.len(),
        volumetric_at_rated: ((intercept + slope * rated) / theoretical).max(0.0),
    })
}

/// The same pump's test before test `index` (same label, earlier date), if any, and what
/// changed since: (earlier test's index, days between if both dates read, change in the
/// predicted volumetric efficiency at rated pressure).
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Trend {
    pub earlier: usize,
    pub days: Option<i64>,
    pub volumetric_change: Option<f64>,
}

pub fn trend(tests: &[PumpTest], index: usize, policy: &WearPolicy) -> Option<Trend> {
    let this = tests.get(index)?;
    let label = this.pump.trim().to_lowercase();
    let earlier = tests
        .iter()
        .enumerate()
        .filter(|(i, t)| {
            *i != index && t.pump.trim().to_lowercase() == label && t.date.trim() < this.date.trim()
        })
        .max_by(|a, b| a.1.date.trim().cmp(b.1.date.trim()))?
        .0;
    let at_rated = |t: &PumpTest| {
        assess(t, policy, UnitSystem::Si)
            .verdict
            .volumetric_at_rated()
    };
    let days = match (day_number(&this.date), day_number(&tests[earlier].date)) {
        (Some(a), Some(b)) => Some(a - b),
        _ => None,
    };
    Some(Trend {
        earlier,
        days,
        volumetric_change: Some(at_rated(this)? - at_rated(&tests[earlier])?),
    })
}

/// Days since 1970-01-01 of a `yyyy-mm-dd` date (the civil calendar), if it reads.
pub fn day_number(date: &str) -> Option<i64> {
    let mut parts = date.trim().splitn(3, '-');
    let y: i64 = parts.next()?.parse().ok()?;
    let m: i64 = parts.next()?.parse().ok()?;
    let d: i64 = parts.next()?.parse().ok()?;
    if !(1..=12).contains(&m) || !(1..=31).contains(&d) {
        return None;
    }
    // Days from civil (the proleptic Gregorian calendar), after H. Hinnant's algorithm.
    let y = if m <= 2 { y - 1 } else { y };
    let era = y.div_euclid(400);
    let yoe = y - era * 400;
    let mp = (m + 9) % 12;
    let doy = (153 * mp + 2) / 5 + d - 1;
    let doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
    Some(era * 146_097 + doe - 719_468)
}

/// What the test puts into a design's pump: the volumetric efficiency the leakage line gives
/// at the highest test pressure (within the readings, so no extrapolation), at that pressure,
/// and the hydromechanical efficiency of the believable reading at the highest pressure.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct MeasuredPump {
    pub volumetric: f64,
    pub at_pressure_pa: f64,
    pub hydromechanical: Option<f64>,
}

pub fn measured_pump(test: &PumpTest, report: &TestReport) -> Option<MeasuredPump> {
    let line = report.leakage?;
    if report.readings.len() != test.readings.len() || report.theoretical_flow <= 0.0 {
        return None;
    }
    let p = test
        .readings
        .iter()
        .zip(&report.readings)
        .filter(|(_, r)| r.volumetric.is_some())
        .map(|(t, _)| t.pressure.value)
        .reduce(f64::max)?;
    let hydromechanical = test
        .readings
        .iter()
        .zip(&report.readings)
        .filter(|(_, r)| r.hydromechanical.is_some())
        .max_by(|a, b| a.0.pressure.value.total_cmp(&b.0.pressure.value))
        .and_then(|(_, r)| r.hydromechanical);
    Some(MeasuredPump {
        // A design's pump needs some flow: a line that gives none there is not copied.
        volumetric: (line.flow_at(p) / report.theoretical_flow).min(1.0),
        at_pressure_pa: p,
        hydromechanical,
    })
}

/// `design` with pump `pump` (in shaft order, from 0; the base pump last) given the measured
/// efficiencies. `None` when there is no such pump.
pub fn apply_to_design(design: &Design, pump: usize, measured: &MeasuredPump) -> Option<Design> {
    let mut d = design.clone();
    let stages = d.unloading_stages.len();
    let target = if pump < stages {
        &mut d.unloading_stages[pump].pump
    } else if pump == stages {
        &mut d.base_pump
    } else {
        return None;
    };
    target.volumetric_efficiency = measured.volumetric;
    target.efficiency_pressure =
        Pressure::new::<uom::si::pressure::pascal>(measured.at_pressure_pa);
    if let Some(h) = measured.hydromechanical {
        target.hydromechanical_efficiency = h;
    }
    Some(d)
}
