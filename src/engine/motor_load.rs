//! A motor's load and efficiency from readings taken at the machine, by the US DOE's methods
//! (Motor Challenge fact sheet "Determining Electric Motor Load and Efficiency",
//! DOE/GO-10097-517), and a verdict a technician can act on.
//!
//! # The methods, per reading
//!
//! - Input power: P_i = sqrt(3) V I PF, or a power meter's reading; the input at full rated
//!   load is P_ir = P_rated / eta_fl; load = P_i / P_ir. The one to trust when a power reading
//!   is at hand. It takes the full-load efficiency at part load, which holds from about half
//!   load up, where a motor's efficiency is flat.
//! - Slip: slip = N_s - N (synchronous less measured speed); load = slip / (N_s - N_r), N_r the
//!   nameplate full-load speed, corrected for the voltage when the line voltage is read
//!   (slip varies with the inverse square of voltage): load = slip / ((N_s - N_r)(V_r / V)^2).
//!   Rough: NEMA lets the nameplate full-load speed be off by 20 % of the full-load slip, and
//!   makers round it to 5 rpm, so with 40 rpm of slip 5 rpm is about 12 % of load.
//! - Current: load = I / I_r x V / V_r. The current falls in proportion to the load only down
//!   to about half load; below that the magnetising current keeps it up, and it says little.
//! - Efficiency: eta = P_rated x load / P_i, the load from the slip (or the current, at half
//!   load or more) and the input from a power reading: two independent readings. With a power
//!   reading alone, the engine's part-load model gives the efficiency at that input, named so.
//!
//! Which to trust: the input-power method where there is a power reading, else the slip
//! method, else the current method when it says half load or more.
//!
//! # The verdict
//!
//! On the highest trusted load of the readings (a hydraulic unit's load changes through its
//! cycle; the readings are taken across it): below half load the motor is oversized ("Most
//! electric motors are designed to run at 50% to 100% of rated load ... A motor's efficiency
//! tends to decrease dramatically below about 50% load", the fact sheet); above its service
//! factor it is overloaded; else well loaded. What a right-sized motor would save a year comes
//! from the engine's solve of the power unit the motor drives, with the smallest standard motor
//! of the staging options that carries its RMS and peak shaft power, at the options' efficiency
//! class (as the staging search sizes one): the same yearly figures the quote uses.

use super::efficiency::{shaft_for_input, Problem, MOST_LOAD_BELIEVED};
use super::fields;
use super::job::Job;
use super::motor::{EfficiencyClass, Motor, TYPICAL_FIXED_LOSS_SHARE, TYPICAL_PEAK_ALLOWANCE};
use super::motor_check::{MotorCheck, MotorReading};
use super::pump_test::MotorEfficiency;
use super::units::{watts, UnitSystem};
use super::validate::InputError;
use serde::Serialize;
use uom::si::f64::{Energy, Power};

/// Below this load a motor is oversized, and the current method says little (the fact sheet).
pub const HALF_LOAD: f64 = 0.5;

/// How a load was found.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum LoadMethod {
    InputPower,
    Slip,
    /// The slip method with the voltage correction (the line voltage was read).
    SlipAtVoltage,
    Current,
}

impl LoadMethod {
    /// Its name, as shown beside the figure.
    pub fn name(self) -> &'static str {
        match self {
            LoadMethod::InputPower => "input power",
            LoadMethod::Slip => "slip",
            LoadMethod::SlipAtVoltage => "slip, voltage-corrected",
            LoadMethod::Current => "current",
        }
    }

    /// How far it can be trusted, in a sentence.
    pub fn accuracy(self) -> &'static str {
        match self {
            LoadMethod::InputPower => "It is the most reliable: it rests on a power reading, and takes the full-load efficiency at part load, which holds from about half load up.",
            LoadMethod::Slip | LoadMethod::SlipAtVoltage => "It is rough: the nameplate full-load speed may be off by a fifth of the slip and is rounded to 5 rpm, so a few rpm change the load by a tenth.",
            LoadMethod::Current => "It holds only from about half load up: below that the magnetising current keeps the current up.",
        }
    }
}

/// One method's answer for one reading.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct LoadEstimate {
    pub method: LoadMethod,
    /// Shaft power over rated power.
    pub load: f64,
    #[serde(rename = "shaft_w")]
    pub shaft: Power,
    /// False for the current method below half load.
    pub meaningful: bool,
}

/// Where a reading's efficiency figure comes from.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
#[serde(tag = "from", rename_all = "snake_case")]
pub enum EfficiencyFrom {
    /// The power reading and a load from another method (the fact sheet's way).
    Readings { load_by: LoadMethod },
    /// The engine's part-load model at the power read (no second reading to check it by).
    Model,
}

/// What one reading says.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct MotorReadingReport {
    /// The input power, from the meter or from sqrt(3) V I PF.
    #[serde(rename = "input_w")]
    pub input: Option<Power>,
    /// Each method the reading allows, the trusted one first.
    pub estimates: Vec<LoadEstimate>,
    pub efficiency: Option<(f64, EfficiencyFrom)>,
}

impl MotorReadingReport {
    /// The estimate to trust, if any is meaningful.
    pub fn trusted(&self) -> Option<&LoadEstimate> {
        self.estimates.first().filter(|e| e.meaningful)
    }
}

#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
#[serde(tag = "verdict", rename_all = "snake_case")]
pub enum MotorVerdict {
    Oversized {
        load: f64,
    },
    WellLoaded {
        load: f64,
    },
    Overloaded {
        load: f64,
    },
    /// No reading gives a load to trust.
    NotJudged,
}

/// A right-sized motor for the power unit the motor drives, and what it saves a year.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct RightSize {
    #[serde(rename = "rated_power_w")]
    pub rated_power: Power,
    pub class: EfficiencyClass,
    pub full_load_efficiency: f64,
    /// Energy saved a year against the motor now fitted, at the site's hours.
    pub energy_saved: Energy,
    /// In the job's currency, at the site's tariff.
    pub cost_saved: f64,
}

/// Everything a check says.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct MotorCheckReport {
    /// The full-load efficiency worked with (entered, or the class's).
    pub full_load_efficiency: f64,
    /// The synchronous speed (rad/s) the slip method works from, if known.
    pub synchronous_speed: Option<f64>,
    pub readings: Vec<MotorReadingReport>,
    pub verdict: MotorVerdict,
    pub right_size: Option<RightSize>,
    /// Readings that cannot be right, each with the field to look at (its path within the
    /// check), as a pump test's are.
    pub problems: Vec<Problem>,
}

/// The check read against the job (its power unit's cycle, the site, the staging options);
/// the check's input errors (paths within the check) when a figure is missing or out of range.
pub fn assess_motor(
    job: &Job,
    check: &MotorCheck,
    units: UnitSystem,
) -> Result<MotorCheckReport, Vec<InputError>> {
    let errors = super::validate::motor_check_errors(check, job, units);
    if !errors.is_empty() {
        return Err(errors);
    }
    let plate = &check.nameplate;
    let rated = plate.rated_power.value;
    let mut problems = Vec::new();
    let full_load_efficiency = match plate.efficiency {
        MotorEfficiency::Entered { efficiency } => efficiency,
        MotorEfficiency::Class { class } => class.nominal_efficiency_or_nearest(plate.rated_power),
    };
    let model = Motor {
        rated_power: plate.rated_power,
        full_load_speed: plate.full_load_speed,
        full_load_efficiency,
        fixed_loss_share: TYPICAL_FIXED_LOSS_SHARE,
        service_factor: 1.0,
        peak_allowance: TYPICAL_PEAK_ALLOWANCE,
        electrical: None,
    };
    let synchronous =
        super::motor::synchronous_speed(plate.full_load_speed, plate.synchronous_speed);
    let rated_input = rated / full_load_efficiency;
    let mut readings = Vec::with_capacity(check.readings.len());
    for (k, r) in check.readings.iter().enumerate() {
        let at = |field: &fields::FieldSpec| field.within_item(&[k]);
        let report = read(r, check, synchronous, rated_input, &model);
        if let Some(input) = report.input {
            if input.value > rated_input * MOST_LOAD_BELIEVED {
                problems.push(Problem {
                    field: at(if r.input.is_some() { &fields::READ_INPUT } else { &fields::READ_CURRENT }),
                    message: format!(
                        "This input would load the motor to {:.0} % of its rating: check the meter's range, that the clamp is on one line conductor, and the voltage.",
                        input.value / rated_input * 100.0
                    ),
                });
            }
        }
        if let (Some(speed), Some(sync)) = (r.speed, synchronous) {
            if speed.value >= sync {
                problems.push(Problem {
                    field: at(&fields::READ_SPEED),
                    message: "An induction motor driving a load turns below its synchronous speed: check the tachometer and the synchronous speed.".into(),
                });
            }
        }
        if let Some((efficiency, EfficiencyFrom::Readings { load_by })) = report.efficiency {
            if efficiency >= 1.0 {
                problems.push(Problem {
                    field: at(&fields::READ_SPEED),
                    message: format!(
                        "The input and the load by {} give an efficiency of {:.0} %, which no motor has: check the shaft speed, the synchronous speed and the power reading.",
                        load_by.name(),
                        efficiency * 100.0
                    ),
                });
            }
        }
        if report.estimates.is_empty() {
            problems.push(Problem {
                field: at(&fields::READ_SPEED),
                message: "This reading gives no load: add a power reading, the line's volts and amps, or the shaft speed (with the synchronous speed known).".into(),
            });
        }
        let mut report = report;
        report.efficiency = report.efficiency.filter(|(e, _)| *e < 1.0);
        readings.push(report);
    }
    let highest = readings
        .iter()
        .filter_map(|r| r.trusted().map(|e| e.load))
        .fold(None, |most: Option<f64>, l| {
            Some(most.map_or(l, |m| m.max(l)))
        });
    let service_factor = job
        .designs
        .get(check.design)
        .map_or(1.0, |d| d.motor.service_factor);
    let verdict = match highest {
        None => MotorVerdict::NotJudged,
        Some(load) if load < HALF_LOAD => MotorVerdict::Oversized { load },
        Some(load) if load > service_factor => MotorVerdict::Overloaded { load },
        Some(load) => MotorVerdict::WellLoaded { load },
    };
    Ok(MotorCheckReport {
        full_load_efficiency,
        synchronous_speed: synchronous,
        readings,
        verdict,
        right_size: right_size(job, check),
        problems,
    })
}

/// Each method one reading allows, the one to trust first, and its efficiency.
fn read(
    r: &MotorReading,
    check: &MotorCheck,
    synchronous: Option<f64>,
    rated_input: f64,
    model: &Motor,
) -> MotorReadingReport {
    let plate = &check.nameplate;
    let rated = plate.rated_power.value;
    let input = r.input.map(|p| p.value).or_else(|| {
        let line = r.line?;
        let pf = line.power_factor?;
        Some(3f64.sqrt() * line.voltage.value * line.current.value * pf)
    });
    let estimate = |method, load: f64| LoadEstimate {
        method,
        load,
        shaft: watts(load * rated),
        meaningful: method != LoadMethod::Current || load >= HALF_LOAD,
    };
    let mut estimates = Vec::new();
    if let Some(input) = input {
        estimates.push(estimate(LoadMethod::InputPower, input / rated_input));
    }
    if let (Some(speed), Some(sync)) = (r.speed, synchronous) {
        let full_load_slip = sync - plate.full_load_speed.value;
        let slip = sync - speed.value;
        if slip > 0.0 {
            match r.line {
                Some(line) => {
                    let ratio = plate.voltage.value / line.voltage.value;
                    estimates.push(estimate(
                        LoadMethod::SlipAtVoltage,
                        slip / (full_load_slip * ratio * ratio),
                    ));
                }
                None => estimates.push(estimate(LoadMethod::Slip, slip / full_load_slip)),
            }
        }
    }
    if let Some(line) = r.line {
        let load = line.current.value / plate.full_load_current.value * line.voltage.value
            / plate.voltage.value;
        estimates.push(estimate(LoadMethod::Current, load));
    }
    // A meaningful estimate first; among those, the order above (input, slip, current).
    estimates.sort_by_key(|e| !e.meaningful);
    let efficiency = input.and_then(|input| {
        let second = estimates
            .iter()
            .find(|e| e.meaningful && e.method != LoadMethod::InputPower);
        match second {
            Some(e) => Some((
                e.shaft.value / input,
                EfficiencyFrom::Readings { load_by: e.method },
            )),
            None => {
                let shaft = shaft_for_input(model, input);
                (shaft > 0.0).then(|| (shaft / input, EfficiencyFrom::Model))
            }
        }
    });
    MotorReadingReport {
        input: input.map(watts),
        estimates,
        efficiency,
    }
}

/// The smallest standard motor that carries the power unit's cycle, and what it saves a year
/// against the one fitted; none when the job has errors, the unit has no such motor or the
/// right size is the one fitted or larger.
fn right_size(job: &Job, check: &MotorCheck) -> Option<RightSize> {
    super::validate::validate(job).ok()?;
    let design = job.designs.get(check.design)?;
    let now = super::solve::solve_design_working(job, design);
    let options = &job.staging;
    let motor = super::staging::right_sized_motor(&design.motor, &now.totals, options)?;
    if motor.rated_power >= design.motor.rated_power {
        return None;
    }
    let mut sized = design.clone();
    sized.motor = motor;
    let then = super::solve::solve_design_working(job, &sized);
    Some(RightSize {
        rated_power: motor.rated_power,
        class: options.efficiency_class(),
        full_load_efficiency: motor.full_load_efficiency,
        energy_saved: now.totals.annual_energy - then.totals.annual_energy,
        cost_saved: now.totals.annual_cost - then.totals.annual_cost,
    })
}

/// A check in words, in the job's units and currency.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct MotorCheckWords {
    /// The verdict and, for an oversized motor, what a right-sized one would save.
    pub verdict: String,
    /// Per reading: each method's load, which to trust and why, and the efficiency.
    pub readings: Vec<String>,
}

impl MotorCheckReport {
    pub fn describe(&self, units: UnitSystem, currency: &str) -> MotorCheckWords {
        let percent = |x: f64| format!("{:.0} %", x * 100.0);
        let trusted_method = |load: f64| {
            self.readings
                .iter()
                .filter_map(|r| r.trusted())
                .find(|e| e.load == load)
                .map_or("", |e| e.method.name())
        };
        let mut verdict = match self.verdict {
            MotorVerdict::Oversized { load } => format!(
                "Loaded to at most {} of its rating (by {}): oversized. Below about half load a motor's efficiency and power factor fall away.",
                percent(load),
                trusted_method(load)
            ),
            MotorVerdict::WellLoaded { load } => format!(
                "Loaded to at most {} of its rating (by {}): well loaded.",
                percent(load),
                trusted_method(load)
            ),
            MotorVerdict::Overloaded { load } => format!(
                "Loaded to {} of its rating (by {}): overloaded. Check the motor's temperature and protection; the cycle needs a larger motor or less load.",
                percent(load),
                trusted_method(load)
            ),
            MotorVerdict::NotJudged => "Not judged: no reading gives a load to trust (add a power reading, or the shaft speed with the synchronous speed).".into(),
        };
        if let (MotorVerdict::Oversized { .. }, Some(right)) = (self.verdict, &self.right_size) {
            verdict.push_str(&format!(
                " The smallest standard motor that carries this power unit's cycle, {} ({}), would save {:.0} kWh ({:.0} {currency}) a year at the site's hours and tariff.",
                units.power(right.rated_power),
                right.class.name(),
                right.energy_saved.get::<uom::si::energy::kilowatt_hour>(),
                right.cost_saved
            ));
        }
        let readings = self
            .readings
            .iter()
            .enumerate()
            .map(|(k, r)| {
                let loads: Vec<String> = r
                    .estimates
                    .iter()
                    .map(|e| format!("{} by {}", percent(e.load), e.method.name()))
                    .collect();
                let mut words = format!("Reading {}: ", k + 1);
                if loads.is_empty() {
                    words.push_str("no load can be worked out.");
                    return words;
                }
                words.push_str(&loads.join("; "));
                words.push_str(". ");
                match r.trusted() {
                    Some(e) => words.push_str(&format!(
                        "Trust the {} method. {}",
                        e.method.name(),
                        e.method.accuracy()
                    )),
                    None => words.push_str(&format!(
                        "The current method says little here. {}",
                        LoadMethod::Current.accuracy()
                    )),
                }
                if let Some((efficiency, from)) = r.efficiency {
                    words.push_str(&format!(
                        " Efficiency {} ({}).",
                        percent(efficiency),
                        match from {
                            EfficiencyFrom::Readings { load_by } =>
                                format!("from the input and the load by {}", load_by.name()),
                            EfficiencyFrom::Model => "the part-load model's at this input; add the shaft speed to measure it".into(),
                        }
                    ));
                }
                words
            })
            .collect();
        MotorCheckWords { verdict, readings }
    }
}
