//! Checks a job before it is solved. Every problem becomes an [`InputError`] naming the
//! field (by its path in the job file) and saying, in plain words, what is wrong and what
//! would be right. After a job passes, the solver cannot meet a zero, a negative, a NaN or
//! an infinity where the physics has none.

use super::cycle::{Load, PhaseKind, SpeedRule};
use super::fields::{self, *};
use super::job::{Job, SCHEMA_VERSION};
use super::power_unit::{Design, MAX_PUMPS};
use super::pump::{Pump, PumpControl};
use super::units::{cubic_metres_per_second, pascals, watts, Measure, UnitSystem};
use super::valve::{ActiveLimit, IdlePath};
use serde::Serialize;
use std::ops::RangeBounds;

/// One thing wrong with the input.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct InputError {
    /// The field's path in the job file, e.g. `cycle[2].cylinder.rod_m`.
    pub field: String,
    /// The field in a sentence, from its declaration ("relief setting"). Not written out: an
    /// error's file form is its path and message.
    #[serde(skip)]
    pub words: String,
    /// What is wrong, for the person who typed it.
    pub message: String,
}

impl std::fmt::Display for InputError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "{}: {}", self.field, self.message)
    }
}

struct Checker {
    units: UnitSystem,
    errors: Vec<InputError>,
    /// The list indices of the part being checked, outermost first: `[0, 1]` in the second
    /// unloading stage of the first power unit. A path is written only for a problem, so a
    /// valid job costs no allocation per field.
    at: Vec<usize>,
}

impl Checker {
    fn new(units: UnitSystem) -> Checker {
        Checker {
            units,
            errors: Vec::new(),
            at: Vec::new(),
        }
    }

    fn fail(&mut self, field: &FieldSpec, message: impl Into<String>) {
        self.errors.push(InputError {
            field: field.at(&self.at),
            words: field.words(),
            message: message.into(),
        });
    }

    /// Checks item `index` of a list (a phase, a power unit, a stage, a reading, a size).
    fn within(&mut self, index: usize, check: impl FnOnce(&mut Checker)) {
        self.at.push(index);
        check(self);
        self.at.pop();
    }

    /// A number, checked as its field declares; whether it passed.
    fn number(&mut self, field: &FieldSpec, value: f64) -> bool {
        let units = self.units;
        let problem = match field.check {
            Check::Amount { zero_ok, max } => {
                amount_problem(value, zero_ok, max, |v| figure(field.measure, units, v))
            }
            Check::Fraction { zero_ok } => fraction_problem(value, zero_ok),
            Check::Between(&Bounds {
                low,
                high,
                otherwise,
            }) => (!(value.is_finite() && (low, high).contains(&value)))
                .then(|| otherwise.to_string()),
            Check::Required { .. } | Check::Date { .. } | Check::Free => None,
        };
        match problem {
            Some(message) => {
                self.fail(field, message);
                false
            }
            None => true,
        }
    }

    /// A text, checked as its field declares.
    fn text(&mut self, field: &FieldSpec, value: &str) {
        match field.check {
            Check::Required { otherwise } if value.trim().is_empty() => {
                self.fail(field, otherwise);
            }
            Check::Date { otherwise }
                if !value.trim().is_empty() && super::pump_test::day_number(value).is_none() =>
            {
                self.fail(field, otherwise);
            }
            _ => {}
        }
    }
}

/// What is wrong with an amount that must be finite, in (0, max] (or [0, max] when
/// `zero_ok`); the figures in the message as `show` gives them.
fn amount_problem(
    value: f64,
    zero_ok: bool,
    max: f64,
    show: impl Fn(f64) -> String,
) -> Option<String> {
    if !value.is_finite() {
        Some("is not a number: type a value".into())
    } else if value < 0.0 {
        Some("cannot be negative".into())
    } else if value == 0.0 && !zero_ok {
        Some("must be more than zero".into())
    } else if value > max {
        Some(format!(
            "{} is more than any machine has: at most {}",
            show(value),
            show(max)
        ))
    } else {
        None
    }
}

/// What is wrong with an efficiency or share in (0, 1] (or [0, 1] when `zero_ok`).
fn fraction_problem(value: f64, zero_ok: bool) -> Option<String> {
    if !value.is_finite() {
        Some("is not a number: type a value".into())
    } else if value > 1.0 {
        Some(format!("{:.1} % is more than 100 %", value * 100.0))
    } else if value < 0.0 || (value == 0.0 && !zero_ok) {
        Some("must be more than 0 %".into())
    } else {
        None
    }
}

/// A figure in a message, in the field's own unit and the job's unit system, rounded as the
/// field shows it (never "999999999.9990001 m"); pressures, flows, powers and shaft speeds
/// as the engine's other messages say them.
fn figure(measure: Option<Measure>, units: UnitSystem, value: f64) -> String {
    match measure {
        Some(Measure::Pressure) => units.pressure(pascals(value)),
        Some(Measure::Flow) => units.flow(cubic_metres_per_second(value)),
        Some(Measure::Power) => units.power(watts(value)),
        Some(Measure::ShaftSpeed) => rpm(units, value),
        Some(measure) => measure.with_unit(units, value),
        None => value.to_string(),
    }
}

/// Every problem with a job, or none.
pub fn validate(job: &Job) -> Result<(), Vec<InputError>> {
    let mut c = Checker::new(job.units);
    if job.schema_version == 0 || job.schema_version > SCHEMA_VERSION {
        c.fail(
            &fields::SCHEMA_VERSION,
            format!(
                "format {} is not one this version reads (1 to {SCHEMA_VERSION})",
                job.schema_version
            ),
        );
    }
    c.text(&JOB_NAME, &job.name);
    if job.cycle.is_empty() {
        c.fail(&PHASES, "add at least one phase to the cycle");
    }
    for (i, phase) in job.cycle.iter().enumerate() {
        c.within(i, |c| check_phase(c, &phase.kind));
    }
    if job.designs.is_empty() {
        c.fail(&DESIGNS, "add at least one power unit");
    }
    for (i, design) in job.designs.iter().enumerate() {
        c.within(i, |c| check_design(c, design, job));
    }
    c.number(&OPERATING_HOURS, job.site.operating_hours_per_year);
    c.number(&TARIFF, job.site.tariff_per_kwh);
    c.number(&RETROFIT_PRICE, job.site.retrofit_price);
    if let Some(charge) = job.site.demand_charge {
        c.number(&DEMAND_CHARGE, charge);
    }
    if let Some(pf) = job.site.power_factor_threshold {
        c.number(&POWER_FACTOR_THRESHOLD, pf);
    }
    if let Some(f) = job.site.grid_factor {
        c.number(&GRID_FACTOR, f);
    }
    c.number(&OIL_VOLUME, job.oil.volume.value);
    c.number(&OIL_DENSITY, job.oil.density.value);
    c.number(&OIL_SPECIFIC_HEAT, job.oil.specific_heat.value);
    check_oil_and_tank(&mut c, job);
    let a = &job.advice;
    c.number(&MARGIN_SHARE, a.margin_fraction);
    c.number(&MARGIN_MIN, a.margin_min.value);
    c.number(&COMPENSATOR_MARGIN_MIN, a.compensator_margin_min.value);
    c.number(&FLOW_CONTROL_DROP, a.flow_control_drop.value);
    c.number(&LEAST_SAVING, a.least_saving_w);
    let st = &job.staging;
    for (i, v) in st.displacements.iter().enumerate() {
        c.within(i, |c| {
            c.number(&PUMP_SIZES, v.value);
        });
    }
    for (i, v) in st.speeds.iter().enumerate() {
        c.within(i, |c| {
            c.number(&MOTOR_SPEEDS, v.value);
        });
    }
    for (i, v) in st.drive_min_speeds.iter().enumerate() {
        c.within(i, |c| {
            c.number(&DRIVE_MIN_SPEEDS, v.value);
        });
    }
    c.number(&MOST_PUMPS, st.max_pumps as f64);
    c.number(&STAGING_SERVICE_FACTOR, st.service_factor);
    c.number(&STAGING_PEAK_ALLOWANCE, st.peak_allowance);
    if let Some(t) = st.cycle_time_target {
        c.number(&CYCLE_TIME_TARGET, t.value);
    }
    c.number(&GOOD_FROM, job.wear.good_from);
    c.number(&WORN_BELOW, job.wear.worn_below);
    if job.wear.worn_below > job.wear.good_from {
        c.fail(&WORN_BELOW, "the worn line sits at or below the good line");
    }
    if st.service_factor.is_finite() && st.service_factor < 1.0 {
        c.fail(&STAGING_SERVICE_FACTOR, "a service factor is 1 or more");
    }
    if st.peak_allowance.is_finite() && st.peak_allowance < 1.0 {
        c.fail(&STAGING_PEAK_ALLOWANCE, "the peak allowance is 1 or more");
    }
    if c.errors.is_empty() {
        Ok(())
    } else {
        Err(c.errors)
    }
}

fn check_phase(c: &mut Checker, kind: &PhaseKind) {
    match kind {
        PhaseKind::Move(m) => {
            let cyl = &m.cylinder;
            let bore = c.number(&BORE, cyl.bore.value);
            let rod = c.number(&ROD, cyl.rod.value);
            if bore && rod && cyl.rod.value >= cyl.bore.value {
                c.fail(&ROD, "the rod must be thinner than the bore");
            }
            c.number(&STROKE, cyl.stroke.value);
            match m.load {
                Load::Force { force } => c.number(&LOAD_FORCE, force.value),
                Load::Pressure { pressure } => c.number(&LOAD_PRESSURE, pressure.value),
            };
            c.number(&LINE_LOSS, m.line_loss.value);
            match m.speed {
                SpeedRule::AllPumpFlow => {}
                SpeedRule::MeteredSpeed { speed } => {
                    c.number(&METERED_SPEED, speed.value);
                }
                SpeedRule::MeteredFlow { flow } => {
                    c.number(&METERED_FLOW, flow.value);
                }
            }
            if let Some(t) = m.target_time {
                c.number(&TARGET_TIME, t.value);
            }
            if let Some(lines) = &m.lines {
                check_line(
                    c,
                    &lines.pressure_line,
                    [
                        &PRESSURE_LINE_DIAMETER,
                        &PRESSURE_LINE_LENGTH,
                        &PRESSURE_LINE_FITTINGS,
                    ],
                );
                check_line(
                    c,
                    &lines.return_line,
                    [
                        &RETURN_LINE_DIAMETER,
                        &RETURN_LINE_LENGTH,
                        &RETURN_LINE_FITTINGS,
                    ],
                );
            }
        }
        PhaseKind::Hold(h) => {
            c.number(&HOLD_PRESSURE, h.pressure.value);
            c.number(&DURATION, h.duration.value);
        }
        PhaseKind::Idle(i) => {
            c.number(&DURATION, i.duration.value);
        }
        PhaseKind::Direct(d) => {
            c.number(&DIRECT_FLOW, d.flow.value);
            c.number(&DIRECT_PRESSURE, d.pressure.value);
            c.number(&DURATION, d.duration.value);
        }
    }
}

fn check_design(c: &mut Checker, d: &Design, job: &Job) {
    let before = c.errors.len();
    check_design_fields(c, d, job);
    // A relief is read with the pumps' dead-head flow over it: with none (every pump losing
    // its whole flow to leakage at that pressure) the setting means nothing.
    if c.errors.len() == before {
        let unit = super::delivery::PreparedUnit::new(d);
        if unit.dead_head_flow(d.relief.setting.value) <= 0.0 {
            c.fail(
                &RELIEF_SETTING,
                "at this setting the pumps would lose all their flow to leakage: check the setting and the pumps' volumetric efficiency",
            );
        }
    }
}

fn check_design_fields(c: &mut Checker, d: &Design, job: &Job) {
    c.text(&DESIGN_NAME, &d.name);
    if let Some(price) = d.retrofit_price {
        c.number(&OWN_RETROFIT_PRICE, price);
    }
    let m = &d.motor;
    c.number(&MOTOR_RATED_POWER, m.rated_power.value);
    c.number(&MOTOR_SPEED, m.full_load_speed.value);
    c.number(&MOTOR_EFFICIENCY, m.full_load_efficiency);
    c.number(&MOTOR_FIXED_LOSS, m.fixed_loss_share);
    c.number(&MOTOR_SERVICE_FACTOR, m.service_factor);
    c.number(&MOTOR_PEAK_ALLOWANCE, m.peak_allowance);
    if let Some(rating) = &m.electrical {
        check_electrical_rating(c, m, rating);
    }
    if d.pump_count() > MAX_PUMPS {
        c.fail(
            &UNLOADING_STAGES,
            format!("at most {MAX_PUMPS} pumps on one motor"),
        );
    }
    for (i, stage) in d.unloading_stages.iter().enumerate() {
        c.within(i, |c| check_stage(c, stage));
    }
    check_pump(c, &d.base_pump);
    let r = &d.relief;
    c.number(&RELIEF_SETTING, r.setting.value);
    c.number(&RELIEF_RATED_FLOW, r.rated_flow.value);
    c.number(&RELIEF_CRACKING, r.cracking_fraction);
    for (i, remote) in d.remote_stages.iter().enumerate() {
        c.within(i, |c| {
            c.number(&REMOTE_STAGES, remote.value);
        });
    }
    if !d.remote_stages.is_empty() && !r.kind.has_vent_port() {
        c.fail(
            &REMOTE_STAGES,
            "a direct-acting relief has no vent port for remote pilot stages",
        );
    }
    c.number(&VENT_PRESSURE, d.vent_pressure.value);
    if let Some(drive) = &d.drive {
        check_drive(c, drive);
    }
    if let Some(cooler) = &d.cooler {
        c.number(&COOLANT_TEMPERATURE, cooler.coolant_temperature.value);
        c.number(&COOLER_RATED_HEAT, cooler.rated_heat.value);
        c.number(&COOLER_RATED_DIFFERENCE, cooler.rated_difference.value);
    }
    if let Some(line) = &d.suction_line {
        check_line(
            c,
            line,
            [
                &SUCTION_LINE_DIAMETER,
                &SUCTION_LINE_LENGTH,
                &SUCTION_LINE_FITTINGS,
            ],
        );
    }
    if d.phase_settings.len() != job.cycle.len() {
        c.fail(
            &PHASE_SETTINGS,
            format!(
                "has settings for {} phases but the cycle has {}",
                d.phase_settings.len(),
                job.cycle.len()
            ),
        );
    }
    for (i, setting) in d.phase_settings.iter().enumerate() {
        c.within(i, |c| check_setting(c, d, setting));
    }
}

/// A variable-speed drive: each figure, and a speed range that is one.
fn check_drive(c: &mut Checker, drive: &super::drive::VariableSpeed) {
    let min = c.number(&DRIVE_MIN_SPEED, drive.min_speed.value);
    let max = c.number(&DRIVE_MAX_SPEED, drive.max_speed.value);
    if min && max && drive.min_speed.value >= drive.max_speed.value {
        c.fail(&DRIVE_MIN_SPEED, "must be below the fastest pump speed");
    }
    c.number(&CONVERTER_RATING, drive.converter_rating.value);
    match drive.converter_loss {
        super::drive::ConverterLoss::Stated { share } => {
            c.number(&CONVERTER_LOSS, share);
        }
        super::drive::ConverterLoss::Points { shares } => {
            for (i, share) in shares.iter().enumerate() {
                c.within(i, |c| {
                    c.number(&CONVERTER_LOSS_POINTS, *share);
                });
            }
        }
        super::drive::ConverterLoss::Class { .. } => {}
    }
}

/// The motor's electrical nameplate: each figure, and that together they describe a motor (a
/// power factor above 1 means the rating, efficiency, voltage and current disagree).
fn check_electrical_rating(
    c: &mut Checker,
    motor: &super::motor::Motor,
    rating: &super::motor::ElectricalRating,
) {
    let voltage = c.number(&MOTOR_VOLTAGE, rating.voltage.value);
    let current = c.number(&MOTOR_FULL_LOAD_CURRENT, rating.full_load_current.value);
    match rating.power_factor {
        Some(pf) => {
            c.number(&MOTOR_POWER_FACTOR, pf);
        }
        None if voltage && current => {
            let pf = super::electrical::full_load_power_factor(motor, rating);
            if pf > 1.0 {
                c.fail(
                    &MOTOR_FULL_LOAD_CURRENT,
                    format!(
                        "is too low for the motor's rated power and efficiency at this voltage (it would need a power factor of {pf:.2}): check the current, the voltage the motor is connected for, and the rating"
                    ),
                );
            }
        }
        None => {}
    }
}

fn check_setting(c: &mut Checker, d: &Design, setting: &super::power_unit::PhaseSetting) {
    let r = &d.relief;
    match setting.limit {
        ActiveLimit::Main => {}
        ActiveLimit::Remote { stage } => {
            if stage >= d.remote_stages.len() {
                c.fail(
                    &LIMIT,
                    format!(
                        "remote stage {} does not exist (the unit has {})",
                        stage + 1,
                        d.remote_stages.len()
                    ),
                );
            }
        }
        ActiveLimit::Vented => {
            if !r.kind.has_vent_port() {
                c.fail(&LIMIT, "a direct-acting relief has no vent port to vent");
            }
        }
    }
    match setting.idle_path {
        IdlePath::Vented if !r.kind.has_vent_port() => {
            c.fail(
                &IDLE_PATH,
                "a direct-acting relief has no vent port to vent",
            );
        }
        IdlePath::OpenCentre { drop } => {
            c.number(&OPEN_CENTRE_DROP, drop.value);
        }
        _ => {}
    }
    if let Some(current) = setting.measured_current {
        c.number(&MEASURED_CURRENT, current.value);
    }
}

fn check_stage(c: &mut Checker, stage: &super::power_unit::UnloadingStage) {
    check_pump(c, &stage.pump);
    let setting = stage.unloading.setting.value;
    let drop = stage.unloading.unloaded_drop.value;
    let ok_setting = c.number(&UNLOADING_SETTING, setting);
    let ok_drop = c.number(&UNLOADED_DROP, drop);
    if ok_setting && ok_drop && drop >= setting {
        c.fail(&UNLOADED_DROP, "must be below the unloading setting");
    }
    c.number(&CHECK_CRACKING, stage.check.cracking.value);
}

/// The oil's viscosity and temperatures, the tank and the field's warm-up readings.
fn check_oil_and_tank(c: &mut Checker, job: &Job) {
    use super::heat::TankSize;
    use super::site::WorkingTemperature;
    use super::viscosity::{NoLine, OilViscosity};
    let oil = &job.oil;
    let line_field = match oil.viscosity {
        OilViscosity::Grade {
            grade,
            viscosity_index,
        } => {
            let ok = c.number(&OIL_GRADE, grade) & c.number(&VISCOSITY_INDEX, viscosity_index);
            ok.then_some(&VISCOSITY_INDEX)
        }
        OilViscosity::Measured { at_40, at_100 } => {
            let ok =
                c.number(&VISCOSITY_AT_40, at_40.value) & c.number(&VISCOSITY_AT_100, at_100.value);
            ok.then_some(&VISCOSITY_AT_100)
        }
    };
    if let (Some(field), Err(why)) = (line_field, oil.viscosity.line()) {
        c.fail(
            field,
            match why {
                NoLine::IndexOutOfReach => {
                    "no oil of this grade has this index: its viscosity at 100 °C would be outside ASTM D2270's table (2 to 70 mm²/s)"
                }
                NoLine::NotThinnerWhenHotter => "must be less than the viscosity at 40 °C",
                NoLine::SameTemperature | NoLine::NotPositive => "check both viscosities",
            },
        );
    }
    match oil.working_temperature {
        WorkingTemperature::Entered { temperature } => {
            c.number(&WORKING_TEMPERATURE, temperature.value);
        }
        WorkingTemperature::Settled if job.tank.is_none() => c.fail(
            &WORKING_TEMPERATURE_SET_BY,
            "describe the tank (its size and the air around it) to find where the oil settles, or enter the temperature",
        ),
        WorkingTemperature::Settled => {}
    }
    c.number(&TARGET_TEMPERATURE, oil.target_temperature.value);
    if let Some(tank) = &job.tank {
        match tank.size {
            TankSize::Box {
                length,
                width,
                oil_depth,
            } => {
                c.number(&TANK_LENGTH, length.value);
                c.number(&TANK_WIDTH, width.value);
                c.number(&TANK_OIL_DEPTH, oil_depth.value);
            }
            TankSize::WettedArea { area } => {
                c.number(&TANK_AREA, area.value);
            }
        }
        c.number(&AMBIENT, tank.ambient.value);
        if let Some(m) = tank.steel_mass {
            c.number(&STEEL_MASS, m.value);
        }
    }
    if let Some(w) = &job.warm_up {
        c.number(&FIRST_READING_TIME, w.first.time.value);
        c.number(&FIRST_READING_OIL, w.first.oil.value);
        let later = c.number(&SECOND_READING_TIME, w.second.time.value);
        c.number(&SECOND_READING_OIL, w.second.oil.value);
        if later && w.second.time.value <= w.first.time.value {
            c.fail(
                &SECOND_READING_TIME,
                "the second reading comes after the first",
            );
        }
    }
}

/// A line's diameter, length and fittings.
fn check_line(
    c: &mut Checker,
    line: &super::lines::Line,
    [diameter, length, fittings]: [&FieldSpec; 3],
) {
    use super::lines::FittingKind;
    c.number(diameter, line.inner_diameter.value);
    c.number(length, line.length.value);
    for fitting in &line.fittings {
        match fitting.kind {
            FittingKind::Coefficient { k } => {
                c.number(fittings, k);
            }
            FittingKind::EquivalentLength { length }
                if !(length.value.is_finite() && length.value > 0.0 && length.value <= 1000.0) =>
            {
                c.fail(
                    fittings,
                    "an equivalent length is more than 0 and at most 1000 m",
                );
            }
            _ => {}
        }
    }
}

/// A pump: the base pump of the power unit being checked, or the pump of the unloading stage
/// being checked (its field paths say which).
fn check_pump(c: &mut Checker, p: &Pump) {
    c.number(&DISPLACEMENT, p.displacement.value);
    c.number(&VOLUMETRIC_EFFICIENCY, p.volumetric_efficiency);
    c.number(&EFFICIENCY_PRESSURE, p.efficiency_pressure.value);
    if let Some(speed) = p.efficiency_speed {
        c.number(&EFFICIENCY_SPEED, speed.value);
    }
    if let Some(t) = p.efficiency_temperature {
        c.number(&EFFICIENCY_TEMPERATURE, t.value);
    }
    c.number(&HYDROMECHANICAL_EFFICIENCY, p.hydromechanical_efficiency);
    c.number(&DRAG_POWER, p.drag_power.value);
    c.number(&PUMP_RATED_PRESSURE, p.rated_pressure.value);
    if let PumpControl::Compensated { setting } = p.control {
        c.number(&COMPENSATOR_SETTING, setting.value);
    }
}

/// Beyond this share of the synchronous speed, a full-load slip is a typing slip (induction
/// motors slip a few percent).
const MAX_SLIP: f64 = 0.2;

/// A synchronous speed entered for a motor whose full-load speed is `full_load` (rad/s): a
/// number, above the full-load speed, and within an induction motor's slip of it.
fn check_synchronous_speed(
    c: &mut Checker,
    field: &FieldSpec,
    sync: f64,
    full_load: f64,
    full_load_ok: bool,
) {
    let units = c.units;
    if !(c.number(field, sync) && full_load_ok) {
        return;
    }
    if sync <= full_load {
        c.fail(
            field,
            "must be above the full-load speed: a four-pole motor on 50 Hz is 1500 rpm and turns about 1460 rpm at full load",
        );
    } else if full_load < sync * (1.0 - MAX_SLIP) {
        c.fail(
            field,
            format!(
                "{} is too far above the full-load speed of {} for an induction motor (they differ by a few percent): check both",
                rpm(units, sync),
                rpm(units, full_load)
            ),
        );
    }
}

fn rpm(units: UnitSystem, rad_per_s: f64) -> String {
    Measure::ShaftSpeed.with_unit(units, rad_per_s)
}

/// Every problem with field test `index` of a job, named by its path in the job file
/// (`pump_tests[0].readings[1].flow_m3_per_s`). Kept apart from [`validate`]: a test being
/// typed in never stops the job's results.
pub fn validate_pump_test(
    test: &super::pump_test::PumpTest,
    index: usize,
    units: UnitSystem,
) -> Vec<InputError> {
    let mut c = Checker::new(units);
    c.within(index, |c| check_pump_test(c, test));
    c.errors
}

/// As [`validate_pump_test`], the paths within the test (`readings[1].flow_m3_per_s`).
pub(crate) fn pump_test_errors(
    test: &super::pump_test::PumpTest,
    units: UnitSystem,
) -> Vec<InputError> {
    within_item(Part::PumpTest, validate_pump_test(test, 0, units))
}

/// `errors` of item 0 of `part`'s list, their paths made relative to the item.
fn within_item(part: Part, mut errors: Vec<InputError>) -> Vec<InputError> {
    let item_at = format!("{}.", part.at(&[0]));
    for e in &mut errors {
        if let Some(within) = e.field.strip_prefix(&item_at) {
            e.field = within.to_string();
        }
    }
    errors
}

/// Every problem with motor check `index` of a job, named by its path in the job file
/// (`motor_checks[0].readings[1].line.current_a`). Kept apart from [`validate`], as a pump
/// test is: a check being typed in never stops the job's results.
pub fn validate_motor_check(
    check: &super::motor_check::MotorCheck,
    index: usize,
    job: &Job,
    units: UnitSystem,
) -> Vec<InputError> {
    let mut c = Checker::new(units);
    c.within(index, |c| check_motor_check(c, check, job));
    c.errors
}

/// As [`validate_motor_check`], the paths within the check (`readings[1].line.current_a`).
pub(crate) fn motor_check_errors(
    check: &super::motor_check::MotorCheck,
    job: &Job,
    units: UnitSystem,
) -> Vec<InputError> {
    within_item(Part::MotorCheck, validate_motor_check(check, 0, job, units))
}

fn check_motor_check(c: &mut Checker, check: &super::motor_check::MotorCheck, job: &Job) {
    use super::pump_test::MotorEfficiency;
    c.text(&CHECKED_MOTOR, &check.motor);
    c.text(&CHECK_DATE, &check.date);
    if check.design >= job.designs.len() {
        c.fail(
            &CHECK_DESIGN,
            format!(
                "there is no power unit {} (the job has {})",
                check.design + 1,
                job.designs.len()
            ),
        );
    }
    let plate = &check.nameplate;
    c.number(&CHECK_RATED_POWER, plate.rated_power.value);
    c.number(&CHECK_VOLTAGE, plate.voltage.value);
    c.number(&CHECK_FULL_LOAD_CURRENT, plate.full_load_current.value);
    let full_load = plate.full_load_speed.value;
    let full_load_ok = c.number(&CHECK_FULL_LOAD_SPEED, full_load);
    if let MotorEfficiency::Entered { efficiency } = plate.efficiency {
        c.number(&CHECK_EFFICIENCY, efficiency);
    }
    if let Some(pf) = plate.power_factor {
        c.number(&CHECK_POWER_FACTOR, pf);
    }
    if let Some(sync) = plate.synchronous_speed {
        check_synchronous_speed(
            c,
            &CHECK_SYNCHRONOUS_SPEED,
            sync.value,
            full_load,
            full_load_ok,
        );
    }
    if check.readings.is_empty() {
        c.fail(
            &MOTOR_READINGS,
            "add a reading: a power meter's input, the line's volts and amps, or the shaft speed",
        );
    }
    for (k, r) in check.readings.iter().enumerate() {
        c.within(k, |c| {
            if let Some(input) = r.input {
                c.number(&READ_INPUT, input.value);
            }
            if let Some(line) = r.line {
                c.number(&READ_VOLTAGE, line.voltage.value);
                c.number(&READ_CURRENT, line.current.value);
                if let Some(pf) = line.power_factor {
                    c.number(&READ_POWER_FACTOR, pf);
                }
            }
            if let Some(speed) = r.speed {
                c.number(&READ_SPEED, speed.value);
            }
        });
    }
}

fn check_pump_test(c: &mut Checker, test: &super::pump_test::PumpTest) {
    use super::pump_test::{ElectricalInput, MotorEfficiency};
    c.text(&TESTED_PUMP, &test.pump);
    c.text(&TEST_DATE, &test.date);
    c.number(&TEST_DISPLACEMENT, test.displacement.value);
    let full_load = test.speed.value;
    let full_load_ok = c.number(&TEST_SPEED, full_load);
    if let Some(sync) = test.synchronous_speed {
        check_synchronous_speed(
            c,
            &TEST_SYNCHRONOUS_SPEED,
            sync.value,
            full_load,
            full_load_ok,
        );
    }
    c.number(&TEST_RATED_PRESSURE, test.rated_pressure.value);
    c.number(&TEST_MOTOR_POWER, test.motor_rated_power.value);
    if let MotorEfficiency::Entered { efficiency } = test.motor_efficiency {
        c.number(&TEST_MOTOR_EFFICIENCY, efficiency);
    }
    if test.readings.is_empty() {
        c.fail(&READINGS, "add a reading: a flow at a test pressure");
    }
    for (k, r) in test.readings.iter().enumerate() {
        c.within(k, |c| {
            c.number(&TEST_PRESSURE, r.pressure.value);
            c.number(&TEST_FLOW, r.flow.value);
            if let Some(n) = r.speed {
                c.number(&SHAFT_SPEED, n.value);
            }
            match r.electrical {
                None => {}
                Some(ElectricalInput::Power { input }) => {
                    c.number(&INPUT_POWER, input.value);
                }
                Some(ElectricalInput::ThreePhase {
                    voltage,
                    current,
                    power_factor,
                }) => {
                    c.number(&LINE_VOLTAGE, voltage.value);
                    c.number(&LINE_CURRENT, current.value);
                    c.number(&POWER_FACTOR, power_factor);
                }
            }
            if let Some(t) = r.torque {
                c.number(&SHAFT_TORQUE, t.value);
            }
        });
    }
}
