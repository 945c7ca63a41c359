//! A pump's efficiency and wear from field readings: flow at one or more test pressures,
//! shaft speed, the motor's electrical input (or a measured shaft torque). The definitions are
//! ISO 4391's: volumetric efficiency = actual flow / (displacement x speed); hydromechanical =
//! displacement x pressure / (2 pi x torque); overall = hydraulic power out / shaft power in.
//!
//! A reading that cannot be right (more flow than the pump sweeps, an efficiency above 100 %, a
//! load the motor could not carry) gets a plain message and no figure, never a wrong number.
//!
//! An induction motor slows as it is loaded (slip), so the shaft speed of each reading is the
//! one measured with it, else estimated from the motor's load; and the motor's efficiency
//! falls at part load, so the shaft power drawn from an electrical reading comes from the
//! part-load model of [`Motor::loss`], not from the full-load figure.
//!
//! # How a test is read
//!
//! `assess(test, wear, units)` (the test's input errors if a figure is missing or out of
//! range; the test and its readings are `pump_test::PumpTest`) works per reading:
//! theoretical flow = displacement x the reading's speed; volumetric = flow / theoretical,
//! hydraulic power = pressure x flow, shaft power = 2 pi n T from a measured torque or from
//! the electrical input (kW, or sqrt(3) V I PF) through the motor's part-load model
//! ([`shaft_for_input`]: input = shaft + `Motor::loss(shaft)`, the typical fixed-loss share,
//! solved in closed form; an input below the no-load loss is a problem); overall = hydraulic /
//! shaft, hydromechanical = overall / volumetric.
//!
//! - Speed: the reading's speed is measured (`readings[].speed_rad_per_s`), or the synchronous
//!   speed less the full-load slip in proportion to load (from the torque, else the input,
//!   else the hydraulic power). The synchronous speed is entered, or the lowest 120 f / poles
//!   at 50 or 60 Hz above the test's full-load speed within 8 % slip (common practice;
//!   otherwise the speed is used as entered). Figures, the leakage line, the verdict and
//!   copies refer to the full-load speed.
//! - Motor: its full-load efficiency is entered, or the class's nominal figure (IEC
//!   60034-30-1 4-pole 50 Hz for 5.5 to 37 kW, IE3 between sizes by the published formula,
//!   the others straight in log10 of power between table sizes; NEMA Premium 10 to 50 hp).
//! - Leakage line and verdict: the least-squares line of flow on pressure through the
//!   believable readings (with one reading: from the theoretical flow through it); its value
//!   at the rated pressure gives the verdict against the job's `wear` lines, only when at least
//!   two believable readings at different pressures carry it ([`READINGS_FOR_VERDICT`]); the
//!   report says on how many it rests (`readings_used`, `readings_rejected`) and gives "not
//!   judged" otherwise.
//! - Problems: a flow above theoretical, an efficiency above 100 %, an input the motor could
//!   not carry (over 1.5 x its rating, common practice), a torque giving more shaft power than
//!   the motor drew, flow rising with pressure: each is a [`Problem`] with the field to look
//!   at, and that figure is left out, never shown wrong.
//!
//! Input checks for a test (`validate::validate_pump_test`, paths `pump_tests[i]...`) are kept
//! out of `validate`: a half-typed reading never stops the job's results. The UI's
//! `JobState::error_for` answers a `pump_tests[...]` path from those checks, then from the
//! readings' problems, so both show at the field.
//!
//! # Trend and copying
//!
//! [`trend`] compares a test with the latest earlier-dated test of the same pump label, by day
//! number (2026-9-5 before 2026-10-01; an undated test is compared with none). "Copy the
//! measured efficiencies" ([`measured_pump`], [`apply_to_design`]) puts into the chosen pump
//! the volumetric efficiency the line gives at the highest test pressure (no extrapolation),
//! that pressure and the test's full-load speed, and the hydromechanical efficiency of the
//! highest-pressure reading that has one, with the pump's drag set to zero (the measured
//! figure already holds it); an efficiency no pump has (at or below 0, above 1) is refused
//! with its reason ([`NotCopied`]). It is a deliberate user action, so it may change "as
//! found" (a measured pump is usually the as-found one).

use super::fields::{self, FieldSpec};
use super::motor::{Motor, TYPICAL_FIXED_LOSS_SHARE, TYPICAL_PEAK_ALLOWANCE};
use super::power_unit::Design;
use super::units::{
    cubic_metres_per_second, pascals, radians_per_second, watts, Measure, UnitSystem,
};
use super::validate::InputError;
use serde::Serialize;

pub use super::policy::WearPolicy;
pub use super::pump_test::{day_number, ElectricalInput, MotorEfficiency, PumpTest, Reading};
use std::f64::consts::TAU;
use uom::si::f64::{AngularVelocity, Power, Pressure, VolumeRate};

/// How far a motor is let carry a reading before the current is taken for a misreading
/// (common practice: induction motors do not run long above about 1.5 x rated).
pub const MOST_LOAD_BELIEVED: f64 = 1.5;

pub use super::motor::MOST_NAMEPLATE_SLIP;

/// A verdict rests on at least this many believable readings, at different test pressures:
/// one point cannot tell leakage from a misread meter.
pub const READINGS_FOR_VERDICT: usize = 2;

/// Something in the readings that cannot be right, with the field to look at (its path within
/// the test, e.g. `readings[1].flow_m3_per_s`).
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Problem {
    pub field: String,
    pub message: String,
}

/// Where a reading's shaft speed comes from.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Default)]
#[serde(rename_all = "snake_case")]
pub enum SpeedFrom {
    /// Measured with the reading.
    Measured,
    /// Estimated from the synchronous speed and the slip at the load drawn.
    Slip,
    /// The nameplate full-load speed, taken as it is (no synchronous speed known).
    #[default]
    Nameplate,
}

/// What one reading says.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Default)]
pub struct ReadingReport {
    /// The shaft speed the reading is worked at (rad/s).
    #[serde(rename = "speed_rad_per_s")]
    pub speed: AngularVelocity,
    pub speed_from: SpeedFrom,
    /// The motor's load (shaft power over rating) the slip was estimated from: from the
    /// torque, else from the electrical input, else the hydraulic power (the least the shaft
    /// can be giving). None when the speed was not estimated.
    pub load_share: Option<f64>,
    /// The flow the pump would give at the same pressure at the motor's full-load speed (m^3/s):
    /// the flow read, plus what the pump sweeps in the difference of speed (leakage hardly
    /// depends on speed). The leakage line is fitted through these.
    pub flow_at_full_load_speed: VolumeRate,
    /// Actual over theoretical flow at the reading's speed; none when the flow is above it.
    pub volumetric: Option<f64>,
    /// Pressure x flow (W).
    #[serde(rename = "hydraulic_w")]
    pub hydraulic: Power,
    /// The electrical input (W), when read and believable.
    #[serde(rename = "input_w")]
    pub input: Option<Power>,
    /// Shaft power (W): 2 pi n T from the torque, else what the motor gives for the input at
    /// that load (the part-load model).
    #[serde(rename = "shaft_w")]
    pub shaft: Option<Power>,
    /// Whether the shaft power came from a measured torque.
    pub shaft_from_torque: bool,
    pub overall: Option<f64>,
    pub hydromechanical: Option<f64>,
    /// Shaft over electrical input, when both torque and input were read.
    pub motor_efficiency_measured: Option<f64>,
}

/// The least-squares line of flow against pressure through the believable readings, at the
/// motor's full-load speed: flow = `zero_pressure_flow` - `leakage_per_pa` x pressure. With one
/// reading (or one test pressure), the line from the theoretical flow at no pressure through it
/// (leakage in proportion to pressure).
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct LeakageLine {
    pub zero_pressure_flow: VolumeRate,
    /// (m^3/s)/Pa.
    /// (m^3/s)/Pa: a slope uom has no named quantity for.
    pub leakage_per_pa: f64,
    /// How many readings it was fitted through.
    pub readings: usize,
    /// Whether it is a least-squares fit through readings at two or more pressures (false: the
    /// line from the theoretical flow, which alone gives no verdict).
    pub fitted: bool,
    /// The volumetric efficiency it predicts at the rated pressure.
    pub volumetric_at_rated: f64,
}

impl LeakageLine {
    /// The flow the line gives at `pressure`.
    pub fn flow_at(&self, pressure: Pressure) -> VolumeRate {
        cubic_metres_per_second(
            self.zero_pressure_flow.value - self.leakage_per_pa * pressure.value,
        )
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
    /// Too few believable readings ([`READINGS_FOR_VERDICT`], at different pressures), or
    /// readings that give no leakage line.
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
    /// Displacement x the motor's full-load speed (m^3/s): the leakage line, the verdict and
    /// the figures copied into a design are at this speed.
    pub theoretical_flow: VolumeRate,
    /// The motor's full-load efficiency (a fraction), entered or the class's; the part-load
    /// model lowers it at each reading's load. None when the class's table does not cover the
    /// rating.
    pub motor_efficiency: Option<f64>,
    pub readings: Vec<ReadingReport>,
    pub leakage: Option<LeakageLine>,
    pub verdict: Verdict,
    /// How many readings were believed (their flow within what the pump sweeps): the leakage
    /// line and the verdict rest on these.
    pub readings_used: usize,
    /// How many were left out (each has a problem saying why).
    pub readings_rejected: usize,
    pub problems: Vec<Problem>,
}

/// The synchronous speed the test's motor is taken to have (rad/s): the entered one, else
/// (common practice) the lowest of 120 f / poles for a 50 or 60 Hz supply that is above the
/// full-load speed, if the full-load speed is within [`MOST_NAMEPLATE_SLIP`] of it. None: no
/// slip is estimated, and readings without a measured speed are worked at the full-load speed.
pub fn synchronous_speed(test: &PumpTest) -> Option<f64> {
    super::motor::synchronous_speed(test.speed, test.synchronous_speed)
}

/// The test's motor as the part-load model sees it: its rating and full-load efficiency, with
/// the typical fixed share of the loss.
fn part_load_motor(test: &PumpTest, full_load_efficiency: f64) -> Motor {
    Motor {
        rated_power: test.motor_rated_power,
        full_load_speed: test.speed,
        full_load_efficiency,
        fixed_loss_share: TYPICAL_FIXED_LOSS_SHARE,
        service_factor: 1.0,
        peak_allowance: TYPICAL_PEAK_ALLOWANCE,
        electrical: None,
    }
}

/// The shaft power (W) a motor gives for an electrical input (W): the root of
/// input = shaft + loss(shaft). The loss is a fixed part plus a part growing with the square of
/// the load, so this is a quadratic, solved in the form that does not cancel at light load.
/// Negative when the input is below the motor's no-load loss.
pub fn shaft_for_input(motor: &Motor, input: f64) -> f64 {
    let rated = motor.rated_power.value;
    let fixed = motor.loss(0.0);
    let per_w2 = (motor.loss(rated) - fixed) / (rated * rated);
    let net = input - fixed;
    let root = 1.0 + 4.0 * per_w2 * net;
    if net <= 0.0 || per_w2 <= 0.0 || !root.is_finite() {
        return net;
    }
    2.0 * net / (1.0 + root.sqrt())
}

/// The test read against `policy`, its messages in `units`; the test's input errors (paths
/// within the test, as a [`Problem`]'s) when a figure is missing or out of range.
pub fn assess(
    test: &PumpTest,
    policy: &WearPolicy,
    units: UnitSystem,
) -> Result<TestReport, Vec<InputError>> {
    let errors = super::validate::pump_test_errors(test, units);
    if !errors.is_empty() {
        return Err(errors);
    }
    let mut problems = Vec::new();
    let full_load_speed = test.speed.value;
    let per_radian = test.displacement.value / TAU;
    let theoretical = per_radian * full_load_speed;
    let synchronous = synchronous_speed(test);
    let rated_motor = test.motor_rated_power.value;
    let motor_efficiency = match test.motor_efficiency {
        MotorEfficiency::Entered { efficiency } => Some(efficiency),
        MotorEfficiency::Class { class } => {
            match class.nominal_efficiency(test.motor_rated_power) {
                Ok(e) => Some(e),
                Err(range) => {
                    problems.push(Problem {
                    field: fields::MOTOR_EFFICIENCY_FROM.within_item(&[]),
                    message: format!(
                        "The class's table here covers {} to {}: enter the nameplate efficiency for a {} motor.",
                        units.power(range.lowest),
                        units.power(range.highest),
                        units.power(watts(rated_motor))
                    ),
                });
                    None
                }
            }
        }
    };
    let motor = motor_efficiency.map(|e| part_load_motor(test, e));
    let mut reports = Vec::new();
    let mut fit_points = Vec::new();
    for (k, r) in test.readings.iter().enumerate() {
        let at = |field: &FieldSpec| field.within_item(&[k]);
        let p = r.pressure.value;
        let q = r.flow.value;
        let mut report = ReadingReport {
            hydraulic: watts(p * q),
            ..ReadingReport::default()
        };
        // What the motor drew, and the shaft power it gives for that at this load.
        let mut input = None;
        let mut shaft_from_input = None;
        if let Some(e) = r.electrical {
            let w = e.watts();
            // Without the motor's efficiency, the input itself bounds the shaft power.
            let shaft = motor.map_or(w, |m| shaft_for_input(&m, w));
            if shaft > rated_motor * MOST_LOAD_BELIEVED {
                problems.push(Problem {
                    field: at(&fields::MOTOR_INPUT),
                    message: format!(
                        "This input would load the {} motor to {:.0} % of its rating: check the clamp meter's range, that it is on one line conductor, and the voltage.",
                        units.power(watts(rated_motor)),
                        shaft / rated_motor * 100.0
                    ),
                });
            } else {
                input = Some(w);
                match motor {
                    Some(_) if shaft > 0.0 => shaft_from_input = Some(shaft),
                    Some(m) => problems.push(Problem {
                        field: at(&fields::MOTOR_INPUT),
                        message: format!(
                            "This input is no more than the {} motor draws running with no load (about {}): check the meter, the motor's rating and its efficiency.",
                            units.power(watts(rated_motor)),
                            units.power(watts(m.loss(0.0)))
                        ),
                    }),
                    None => {}
                }
            }
        }
        // The shaft speed: measured, else the synchronous speed less the slip, which grows in
        // proportion to the load (common practice; the slip method of the US DOE's motor
        // load fact sheet read backwards).
        let (speed, from, load) = match (r.speed, synchronous) {
            (Some(n), _) => (n.value, SpeedFrom::Measured, None),
            (None, None) => (full_load_speed, SpeedFrom::Nameplate, None),
            (None, Some(sync)) => {
                let full_slip = sync - full_load_speed;
                match r.torque {
                    // Shaft power T n, so n = sync - full_slip x T n / rated, in closed form.
                    Some(t) => {
                        let n = sync / (1.0 + full_slip * t.value / rated_motor);
                        (n, SpeedFrom::Slip, Some(t.value * n / rated_motor))
                    }
                    None => {
                        // The hydraulic power is the least the shaft can be giving.
                        let shaft = shaft_from_input.unwrap_or(report.hydraulic.value);
                        let load = (shaft / rated_motor).clamp(0.0, MOST_LOAD_BELIEVED);
                        (sync - full_slip * load, SpeedFrom::Slip, Some(load))
                    }
                }
            }
        };
        report.speed = radians_per_second(speed);
        report.speed_from = from;
        report.load_share = load;
        let swept = per_radian * speed;
        report.flow_at_full_load_speed =
            cubic_metres_per_second(q + per_radian * (full_load_speed - speed));
        if q > swept * (1.0 + 1e-9) {
            problems.push(Problem {
                field: at(&fields::TEST_FLOW),
                message: format!(
                    "{} is more than the pump sweeps at {} ({}): check the meter range or the displacement and speed.",
                    units.flow(cubic_metres_per_second(q)),
                    Measure::ShaftSpeed.with_unit(units, speed),
                    units.flow(cubic_metres_per_second(swept))
                ),
            });
        } else if swept > 0.0 {
            report.volumetric = Some(q / swept);
            fit_points.push((p, report.flow_at_full_load_speed.value));
        }
        report.input = input.map(watts);
        let from_torque = r.torque.map(|t| t.value * speed);
        report.shaft_from_torque = from_torque.is_some();
        report.shaft = from_torque.or(shaft_from_input).map(watts);
        if let (Some(shaft), Some(input)) = (from_torque, input) {
            if shaft > input * (1.0 + 1e-9) {
                problems.push(Problem {
                    field: at(&fields::SHAFT_TORQUE),
                    message: "The shaft power from this torque is more than the motor drew: check the torque reading or the electrical one.".into(),
                });
                report.shaft = None;
            } else if input > 0.0 {
                report.motor_efficiency_measured = Some(shaft / input);
            }
        }
        if let (Some(shaft), Some(vol)) = (report.shaft.map(|s| s.value), report.volumetric) {
            let overall = report.hydraulic.value / shaft;
            if overall > 1.0 + 1e-9 {
                problems.push(Problem {
                    field: at(if report.shaft_from_torque { &fields::SHAFT_TORQUE } else { &fields::MOTOR_INPUT }),
                    message: format!(
                        "These figures put the pump's overall efficiency at {:.0} %, above 100 %: check the meters, the motor efficiency, or the displacement.",
                        overall * 100.0
                    ),
                });
                report.shaft = None;
            } else {
                let mechanical = if vol > 0.0 { overall / vol } else { f64::NAN };
                if mechanical.is_finite() && mechanical <= 1.0 + 1e-9 {
                    report.overall = Some(overall);
                    report.hydromechanical = Some(mechanical);
                } else {
                    problems.push(Problem {
                        field: at(&fields::TEST_FLOW),
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
                field: fields::READINGS.within_item(&[]),
                message: "The flow rises with pressure across these readings, which leakage cannot do: check that the speed held and the meter read steadily.".into(),
            });
        }
    }
    let leakage = leakage.filter(|l| l.leakage_per_pa >= 0.0);
    let verdict = match leakage {
        Some(l) if l.fitted => {
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
        _ => Verdict::NotJudged,
    };
    let readings_used = fit_points.len();
    Ok(TestReport {
        theoretical_flow: cubic_metres_per_second(theoretical),
        motor_efficiency,
        readings: reports,
        leakage,
        verdict,
        readings_used,
        readings_rejected: test.readings.len().saturating_sub(readings_used),
        problems,
    })
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
    let fitted = points.len() >= READINGS_FOR_VERDICT && spread > (mean_p * 1e-6).powi(2) * n;
    let (intercept, slope) = if fitted {
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
        zero_pressure_flow: cubic_metres_per_second(intercept),
        leakage_per_pa: -slope,
        readings: points.len(),
        fitted,
        volumetric_at_rated: ((intercept + slope * rated) / theoretical).max(0.0),
    })
}

/// The same pump's test before test `index` (same label, the latest earlier date), if any, and
/// what changed since: (earlier test's index, days between, change in the predicted volumetric
/// efficiency at rated pressure when both tests are judged). Dates compare as days, so
/// 2026-9-5 comes before 2026-10-01; a test whose date does not read is compared with none.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Trend {
    pub earlier: usize,
    pub days: Option<i64>,
    pub volumetric_change: Option<f64>,
}

pub fn trend(tests: &[PumpTest], index: usize, policy: &WearPolicy) -> Option<Trend> {
    let this = tests.get(index)?;
    let this_day = day_number(&this.date)?;
    let label = this.pump.trim().to_lowercase();
    let (earlier, before, before_day) = tests
        .iter()
        .enumerate()
        .filter(|(i, t)| *i != index && t.pump.trim().to_lowercase() == label)
        .filter_map(|(i, t)| Some((i, t, day_number(&t.date)?)))
        .filter(|(_, _, day)| *day < this_day)
        .max_by_key(|(_, _, day)| *day)?;
    let at_rated = |t: &PumpTest| {
        assess(t, policy, UnitSystem::Si)
            .ok()?
            .verdict
            .volumetric_at_rated()
    };
    Some(Trend {
        earlier,
        days: Some(this_day - before_day),
        volumetric_change: at_rated(this).zip(at_rated(before)).map(|(a, b)| a - b),
    })
}

/// The motor efficiency a test starts from when the user switches it to a nameplate figure:
/// the baseline motor's full-load efficiency, else 0.9 (a typical full-load figure of a
/// mid-size induction motor; common practice), for the user to correct from the nameplate.
pub fn nameplate_efficiency_offered(job: &super::job::Job) -> f64 {
    job.designs
        .first()
        .map(|d| d.motor.full_load_efficiency)
        .filter(|e| e.is_finite() && *e > 0.0 && *e <= 1.0)
        .unwrap_or(0.9)
}

/// What the test puts into a design's pump: the volumetric efficiency the leakage line gives
/// at the highest test pressure (within the readings, so no extrapolation), at that pressure,
/// and the hydromechanical efficiency of the believable reading at the highest pressure.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct MeasuredPump {
    pub volumetric: f64,
    #[serde(rename = "at_pressure_pa")]
    pub at_pressure: Pressure,
    /// The speed the volumetric efficiency refers to (the test's full-load speed): the
    /// leakage it fixes holds at any other speed the design turns the pump at.
    #[serde(rename = "at_speed_rad_per_s")]
    pub at_speed: AngularVelocity,
    pub hydromechanical: Option<f64>,
}

/// Why the measured efficiencies are not copied.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
#[serde(tag = "why", rename_all = "snake_case")]
pub enum NotCopied {
    /// No leakage line: no believable flow reading at a test pressure.
    NoBelievableReading,
    /// The line gives a volumetric efficiency no working pump has (at or below 0, above 1).
    Volumetric {
        volumetric: f64,
        #[serde(rename = "at_pressure_pa")]
        at_pressure: Pressure,
    },
    /// A hydromechanical efficiency at or below 0 or above 1.
    Hydromechanical { hydromechanical: f64 },
    /// The design has no pump `pump` (from 0); it has `pumps`.
    NoSuchPump { pump: usize, pumps: usize },
}

impl NotCopied {
    /// What the technician reads.
    pub fn message(&self, units: UnitSystem) -> String {
        match *self {
            NotCopied::NoBelievableReading => {
                "Nothing to copy: the test has no believable flow reading at a test pressure yet."
                    .into()
            }
            NotCopied::Volumetric {
                volumetric,
                at_pressure,
            } => format!(
                "Not copied: the readings put the volumetric efficiency at {:.1} % at {}, which no working pump has. Check the flow readings at the highest pressures.",
                volumetric * 100.0,
                units.pressure(at_pressure)
            ),
            NotCopied::Hydromechanical { hydromechanical } => format!(
                "Not copied: the readings put the hydromechanical efficiency at {:.1} %, which no working pump has. Check the power or torque readings.",
                hydromechanical * 100.0
            ),
            NotCopied::NoSuchPump { pump, pumps } => format!(
                "Not copied: this power unit has no pump {} (it has {pumps}).",
                pump + 1
            ),
        }
    }
}

/// A share a hair above 1 from rounding is 1.
fn rounded_to_one(v: f64) -> f64 {
    if v > 1.0 && v <= 1.0 + 1e-9 {
        1.0
    } else {
        v
    }
}

/// Whether `m` can go into a design: every efficiency above 0 and at most 1, at a pressure.
fn copyable(m: &MeasuredPump) -> Result<(), NotCopied> {
    if !(m.at_pressure.value.is_finite() && m.at_pressure.value > 0.0) {
        return Err(NotCopied::NoBelievableReading);
    }
    if !(m.volumetric > 0.0 && m.volumetric <= 1.0) {
        return Err(NotCopied::Volumetric {
            volumetric: m.volumetric,
            at_pressure: m.at_pressure,
        });
    }
    match m.hydromechanical {
        Some(h) if !(h > 0.0 && h <= 1.0) => Err(NotCopied::Hydromechanical { hydromechanical: h }),
        _ => Ok(()),
    }
}

pub fn measured_pump(test: &PumpTest, report: &TestReport) -> Result<MeasuredPump, NotCopied> {
    let line = report.leakage.ok_or(NotCopied::NoBelievableReading)?;
    if report.readings.len() != test.readings.len()
        || !(report.theoretical_flow.value.is_finite() && report.theoretical_flow.value > 0.0)
    {
        return Err(NotCopied::NoBelievableReading);
    }
    let p = test
        .readings
        .iter()
        .zip(&report.readings)
        .filter(|(_, r)| r.volumetric.is_some())
        .map(|(t, _)| t.pressure.value)
        .reduce(f64::max)
        .ok_or(NotCopied::NoBelievableReading)?;
    let hydromechanical = test
        .readings
        .iter()
        .zip(&report.readings)
        .filter(|(_, r)| r.hydromechanical.is_some())
        .max_by(|a, b| a.0.pressure.value.total_cmp(&b.0.pressure.value))
        .and_then(|(_, r)| r.hydromechanical);
    let measured = MeasuredPump {
        volumetric: rounded_to_one((line.flow_at(pascals(p)) / report.theoretical_flow).value),
        at_pressure: pascals(p),
        at_speed: radians_per_second(test.speed.value),
        hydromechanical: hydromechanical.map(rounded_to_one),
    };
    copyable(&measured)?;
    Ok(measured)
}

/// `design` with pump `pump` (in shaft order, from 0; the base pump last) given the measured
/// efficiencies, or why not.
pub fn apply_to_design(
    design: &Design,
    pump: usize,
    measured: &MeasuredPump,
) -> Result<Design, NotCopied> {
    copyable(measured)?;
    let mut d = design.clone();
    let pumps = d.pump_count();
    let target = match d.unloading_stages.get_mut(pump) {
        Some(stage) => &mut stage.pump,
        None if pump == pumps - 1 => &mut d.base_pump,
        None => return Err(NotCopied::NoSuchPump { pump, pumps }),
    };
    target.volumetric_efficiency = measured.volumetric;
    target.efficiency_pressure =
        Pressure::new::<uom::si::pressure::pascal>(measured.at_pressure.value);
    target.efficiency_speed = Some(AngularVelocity::new::<
        uom::si::angular_velocity::radian_per_second,
    >(measured.at_speed.value));
    if let Some(h) = measured.hydromechanical {
        target.hydromechanical_efficiency = h;
        // The measured hydromechanical efficiency is the whole shaft power at the test
        // pressure over the ideal: it already holds the pump's drag (churning, seals,
        // bearings). The design adds its drag on top (shaft = swept x p / efficiency + drag),
        // so the drag goes to zero and the design draws exactly the measured shaft power at
        // the test pressure. Keeping the drag and raising the efficiency instead would need
        // the drag to be less than all the loss measured, and a design's drag is an estimate
        // that a small pump tested at a moderate pressure often exceeds; one test pressure
        // cannot tell the two apart. The cost: an unloaded pump now takes only what its
        // pressure drop asks of it.
        target.drag_power = Power::new::<uom::si::power::watt>(0.0);
    }
    Ok(d)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::pump::PumpAtSpeed;
    use uom::si::angular_velocity::revolution_per_minute;
    use uom::si::f64::{Torque, Volume, VolumeRate};
    use uom::si::pressure::bar;
    use uom::si::volume::cubic_centimeter;
    use uom::si::volume_rate::cubic_meter_per_second;

    fn reading(bar_: f64, m3_per_s: f64, torque_n_m: Option<f64>) -> Reading {
        Reading {
            pressure: Pressure::new::<bar>(bar_),
            flow: VolumeRate::new::<cubic_meter_per_second>(m3_per_s),
            speed: None,
            electrical: None,
            torque: torque_n_m.map(Torque::new::<uom::si::torque::newton_meter>),
        }
    }

    #[test]
    fn a_copied_pump_draws_the_measured_shaft_power_at_the_test_pressure() {
        // Esposito, Fluid Power with Applications, Example 5-9: 100 cm^3/rev at 1000 rpm,
        // 0.0015 m^3/s at 70 bar with 120 N.m; and a reading at 20 bar (invented).
        let test = PumpTest {
            pump: "pump".into(),
            date: "2026-11-30".into(),
            notes: String::new(),
            displacement: Volume::new::<cubic_centimeter>(100.0),
            speed: AngularVelocity::new::<revolution_per_minute>(1000.0),
            synchronous_speed: None,
            rated_pressure: Pressure::new::<bar>(210.0),
            motor_rated_power: Power::new::<uom::si::power::kilowatt>(22.0),
            motor_efficiency: MotorEfficiency::Entered { efficiency: 0.92 },
            readings: vec![
                reading(20.0, 0.00162, None),
                reading(70.0, 0.0015, Some(120.0)),
            ],
        };
        let report = assess(&test, &WearPolicy::default(), UnitSystem::Si).unwrap();
        let measured = measured_pump(&test, &report).unwrap();
        // 120 N.m at 1000 rpm.
        let shaft = report.readings[1].shaft.map(|q| q.value).unwrap();
        assert!((shaft - 120.0 * 1000.0 * TAU / 60.0).abs() < 1e-9 * shaft);
        // A design whose last pump is the tested one, on a motor at the test's speed; its
        // pump has a drag to start with (the demo's: a fixture, not a reference).
        let mut design = crate::demo::scrap_baler().designs[0].clone();
        design.base_pump.displacement = test.displacement;
        design.motor.full_load_speed = test.speed;
        assert!(design.base_pump.drag_power.value > 0.0);
        let d = apply_to_design(&design, 1, &measured).unwrap();
        let pump = PumpAtSpeed::new(&d.base_pump, d.motor.revolutions_per_second());
        let at = 70e5;
        let drawn = pump.shaft_power(at, pump.delivered(at));
        assert!(
            (drawn - shaft).abs() <= 1e-9 * shaft,
            "the power unit draws {drawn} W, the test measured {shaft} W"
        );
    }
}
