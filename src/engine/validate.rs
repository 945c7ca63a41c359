//! Checks a job before it is solved. Every problem becomes an [`InputError`] naming the
//! field (by its path in the job file) and saying, in plain words, what is wrong and what
//! would be right. After a job passes, the solver cannot meet a zero, a negative, a NaN or
//! an infinity where the physics has none.

use super::cycle::{Load, PhaseKind, SpeedRule};
use super::job::{Job, SCHEMA_VERSION};
use super::power_unit::{Design, MAX_PUMPS};
use super::pump::{Pump, PumpControl};
use super::units::{
    cubic_metres_per_second, pascals, watts, Measure, UnitSystem, BAR, LITRE_PER_MINUTE,
};
use super::valve::{ActiveLimit, IdlePath};
use serde::Serialize;

/// One thing wrong with the input.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct InputError {
    /// The field's path in the job file, e.g. `cycle[2].cylinder.rod_m`.
    pub field: String,
    /// What is wrong, for the person who typed it.
    pub message: String,
}

impl std::fmt::Display for InputError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "{}: {}", self.field, self.message)
    }
}

// Beyond these a value is a typing slip, not a machine (and would overflow the arithmetic).
const MAX_PRESSURE: f64 = 2000.0 * BAR;
const MAX_LENGTH: f64 = 50.0; // m
const MAX_FLOW: f64 = 100_000.0 * LITRE_PER_MINUTE;
const MAX_DURATION: f64 = 30.0 * 86_400.0; // s
const MAX_POWER: f64 = 20e6; // W
const MAX_SPEED_RAD_S: f64 = 10_000.0 * std::f64::consts::TAU / 60.0;
const MAX_DISPLACEMENT: f64 = 0.02; // m^3/rev
const MAX_FORCE: f64 = 1e9; // N
const MAX_VELOCITY: f64 = 100.0; // m/s
const HOURS_PER_YEAR: f64 = 8784.0; // a leap year

struct Checker {
    units: UnitSystem,
    errors: Vec<InputError>,
    /// The path of the part being checked, e.g. `designs[0].unloading_stages[1]`. One buffer,
    /// extended and cut back, so a valid job costs no allocation per field.
    at: String,
}

impl Checker {
    fn fail(&mut self, field: &str, message: impl Into<String>) {
        let field = match (self.at.is_empty(), field.is_empty()) {
            (true, _) => field.to_string(),
            (false, true) => self.at.clone(),
            (false, false) => format!("{}.{field}", self.at),
        };
        self.errors.push(InputError {
            field,
            message: message.into(),
        });
    }

    /// Checks a part of the job, with `segment` added to the field paths.
    fn within(&mut self, segment: std::fmt::Arguments, check: impl FnOnce(&mut Checker)) {
        use std::fmt::Write;
        let len = self.at.len();
        if len > 0 {
            self.at.push('.');
        }
        let _ = self.at.write_fmt(segment);
        check(self);
        self.at.truncate(len);
    }

    /// A finite number in (0, max] (or [0, max] when `zero_ok`).
    fn amount(
        &mut self,
        field: &str,
        value: f64,
        zero_ok: bool,
        max: f64,
        show: impl Fn(UnitSystem, f64) -> String,
    ) -> bool {
        let units = self.units;
        if !value.is_finite() {
            self.fail(field, "is not a number: type a value");
        } else if value < 0.0 {
            self.fail(field, "cannot be negative");
        } else if value == 0.0 && !zero_ok {
            self.fail(field, "must be more than zero");
        } else if value > max {
            self.fail(
                field,
                format!(
                    "{} is more than any machine has: at most {}",
                    show(units, value),
                    show(units, max)
                ),
            );
        } else {
            return true;
        }
        false
    }

    fn pressure(&mut self, field: &str, value: f64, zero_ok: bool) -> bool {
        self.amount(field, value, zero_ok, MAX_PRESSURE, |u, v| {
            u.pressure(pascals(v))
        })
    }

    fn flow(&mut self, field: &str, value: f64, zero_ok: bool) -> bool {
        self.amount(field, value, zero_ok, MAX_FLOW, |u, v| {
            u.flow(cubic_metres_per_second(v))
        })
    }

    fn power(&mut self, field: &str, value: f64, zero_ok: bool) -> bool {
        self.amount(field, value, zero_ok, MAX_POWER, |u, v| u.power(watts(v)))
    }

    /// As `amount`, with the figures in the field's own unit and the job's unit system, rounded
    /// as the field shows them (never "999999999.9990001 m").
    fn plain(
        &mut self,
        field: &str,
        value: f64,
        zero_ok: bool,
        max: f64,
        measure: Measure,
    ) -> bool {
        self.amount(field, value, zero_ok, max, move |units, v| {
            measure.with_unit(units, v)
        })
    }

    /// An efficiency or share in (0, 1] (or [0, 1] when `zero_ok`).
    fn fraction(&mut self, field: &str, value: f64, zero_ok: bool) {
        if !value.is_finite() {
            self.fail(field, "is not a number: type a value");
        } else if value > 1.0 {
            self.fail(field, format!("{:.1} % is more than 100 %", value * 100.0));
        } else if value < 0.0 || (value == 0.0 && !zero_ok) {
            self.fail(field, "must be more than 0 %");
        }
    }
}

/// Every problem with a job, or none.
pub fn validate(job: &Job) -> Result<(), Vec<InputError>> {
    let mut c = Checker {
        units: job.units,
        errors: Vec::new(),
        at: String::new(),
    };
    if job.schema_version == 0 || job.schema_version > SCHEMA_VERSION {
        c.fail(
            "schema_version",
            format!(
                "format {} is not one this version reads (1 to {SCHEMA_VERSION})",
                job.schema_version
            ),
        );
    }
    if job.name.trim().is_empty() {
        c.fail("name", "give the job a name");
    }
    if job.cycle.is_empty() {
        c.fail("cycle", "add at least one phase to the cycle");
    }
    for (i, phase) in job.cycle.iter().enumerate() {
        c.within(format_args!("cycle[{i}]"), |c| check_phase(c, &phase.kind));
    }
    if job.designs.is_empty() {
        c.fail("designs", "add at least one power unit");
    }
    for (i, design) in job.designs.iter().enumerate() {
        c.within(format_args!("designs[{i}]"), |c| {
            check_design(c, design, job)
        });
    }
    c.plain(
        "site.operating_hours_per_year",
        job.site.operating_hours_per_year,
        true,
        HOURS_PER_YEAR,
        Measure::HoursPerYear,
    );
    c.plain(
        "site.tariff_per_kwh",
        job.site.tariff_per_kwh,
        true,
        1e3,
        Measure::Tariff,
    );
    c.plain(
        "site.retrofit_price",
        job.site.retrofit_price,
        true,
        1e12,
        Measure::Money,
    );
    if let Some(f) = job.site.grid_factor {
        c.plain(
            "site.grid_kg_co2_per_kwh",
            f,
            true,
            5.0,
            Measure::GridFactor,
        );
    }
    c.plain(
        "oil.volume_m3",
        job.oil.volume.value,
        false,
        1000.0,
        Measure::OilVolume,
    );
    c.plain(
        "oil.density_kg_per_m3",
        job.oil.density.value,
        false,
        2000.0,
        Measure::Density,
    );
    c.plain(
        "oil.specific_heat_j_per_kg_k",
        job.oil.specific_heat.value,
        false,
        10_000.0,
        Measure::SpecificHeat,
    );
    let a = &job.advice;
    c.fraction("advice.margin_fraction", a.margin_fraction, true);
    c.pressure("advice.margin_min_pa", a.margin_min.value, true);
    c.pressure(
        "advice.compensator_margin_min_pa",
        a.compensator_margin_min.value,
        true,
    );
    c.pressure(
        "advice.flow_control_drop_pa",
        a.flow_control_drop.value,
        true,
    );
    c.power("advice.least_saving_w", a.least_saving_w, true);
    let st = &job.staging;
    for (i, v) in st.displacements.iter().enumerate() {
        c.plain(
            &format!("staging.displacements_m3_per_rev[{i}]"),
            v.value,
            false,
            1e-2,
            Measure::Displacement,
        );
    }
    for (i, v) in st.speeds.iter().enumerate() {
        c.plain(
            &format!("staging.speeds_rad_per_s[{i}]"),
            v.value,
            false,
            1e3,
            Measure::ShaftSpeed,
        );
    }
    if !(1..=3).contains(&st.max_pumps) {
        c.fail("staging.max_pumps", "choose one to three pumps");
    }
    c.plain(
        "staging.service_factor",
        st.service_factor,
        false,
        2.0,
        Measure::Factor,
    );
    c.plain(
        "staging.peak_allowance",
        st.peak_allowance,
        false,
        5.0,
        Measure::Factor,
    );
    if let Some(t) = st.cycle_time_target {
        c.plain(
            "staging.cycle_time_target_s",
            t.value,
            false,
            MAX_DURATION,
            Measure::Duration,
        );
    }
    c.fraction("wear.good_from", job.wear.good_from, false);
    c.fraction("wear.worn_below", job.wear.worn_below, false);
    if job.wear.worn_below > job.wear.good_from {
        c.fail(
            "wear.worn_below",
            "the worn line sits at or below the good line",
        );
    }
    if st.service_factor.is_finite() && st.service_factor < 1.0 {
        c.fail("staging.service_factor", "a service factor is 1 or more");
    }
    if st.peak_allowance.is_finite() && st.peak_allowance < 1.0 {
        c.fail("staging.peak_allowance", "the peak allowance is 1 or more");
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
            let bore = c.plain(
                "cylinder.bore_m",
                cyl.bore.value,
                false,
                MAX_LENGTH,
                Measure::Length,
            );
            let rod = c.plain(
                "cylinder.rod_m",
                cyl.rod.value,
                true,
                MAX_LENGTH,
                Measure::Length,
            );
            if bore && rod && cyl.rod.value >= cyl.bore.value {
                c.fail("cylinder.rod_m", "the rod must be thinner than the bore");
            }
            c.plain(
                "cylinder.stroke_m",
                cyl.stroke.value,
                false,
                MAX_LENGTH,
                Measure::Length,
            );
            match m.load {
                Load::Force { force } => {
                    c.plain("load.force_n", force.value, true, MAX_FORCE, Measure::Force);
                }
                Load::Pressure { pressure } => {
                    c.pressure("load.pressure_pa", pressure.value, true);
                }
            }
            c.pressure("line_loss_pa", m.line_loss.value, true);
            match m.speed {
                SpeedRule::AllPumpFlow => {}
                SpeedRule::MeteredSpeed { speed } => {
                    c.plain(
                        "speed.speed_m_per_s",
                        speed.value,
                        false,
                        MAX_VELOCITY,
                        Measure::Speed,
                    );
                }
                SpeedRule::MeteredFlow { flow } => {
                    c.flow("speed.flow_m3_per_s", flow.value, false);
                }
            }
            if let Some(t) = m.target_time {
                c.plain(
                    "target_time_s",
                    t.value,
                    false,
                    MAX_DURATION,
                    Measure::Duration,
                );
            }
        }
        PhaseKind::Hold(h) => {
            c.pressure("pressure_pa", h.pressure.value, false);
            c.plain(
                "duration_s",
                h.duration.value,
                false,
                MAX_DURATION,
                Measure::Duration,
            );
        }
        PhaseKind::Idle(i) => {
            c.plain(
                "duration_s",
                i.duration.value,
                false,
                MAX_DURATION,
                Measure::Duration,
            );
        }
        PhaseKind::Direct(d) => {
            c.flow("flow_m3_per_s", d.flow.value, true);
            c.pressure("pressure_pa", d.pressure.value, true);
            c.plain(
                "duration_s",
                d.duration.value,
                false,
                MAX_DURATION,
                Measure::Duration,
            );
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
                "relief.setting_pa",
                "at this setting the pumps would lose all their flow to leakage: check the setting and the pumps' volumetric efficiency",
            );
        }
    }
}

fn check_design_fields(c: &mut Checker, d: &Design, job: &Job) {
    if d.name.trim().is_empty() {
        c.fail("name", "give the power unit a name");
    }
    if let Some(price) = d.retrofit_price {
        c.plain("retrofit_price", price, true, 1e12, Measure::Money);
    }
    let m = &d.motor;
    c.power("motor.rated_power_w", m.rated_power.value, false);
    c.amount(
        "motor.full_load_speed_rad_per_s",
        m.full_load_speed.value,
        false,
        MAX_SPEED_RAD_S,
        |_, v| format!("{:.0} rpm", v * 60.0 / std::f64::consts::TAU),
    );
    c.fraction("motor.full_load_efficiency", m.full_load_efficiency, false);
    c.fraction("motor.fixed_loss_share", m.fixed_loss_share, true);
    if !(m.service_factor.is_finite() && (1.0..=2.0).contains(&m.service_factor)) {
        c.fail(
            "motor.service_factor",
            "must be between 1.0 and 2.0 (1.0 if the nameplate shows none)",
        );
    }
    if !(m.peak_allowance.is_finite() && (1.0..=3.0).contains(&m.peak_allowance)) {
        c.fail(
            "motor.peak_allowance",
            "must be between 1.0 and 3.0 (1.25 is usual; the motor's breakdown torque decides)",
        );
    }
    if d.pump_count() > MAX_PUMPS {
        c.fail(
            "unloading_stages",
            format!("at most {MAX_PUMPS} pumps on one motor"),
        );
    }
    for (i, stage) in d.unloading_stages.iter().enumerate() {
        c.within(format_args!("unloading_stages[{i}]"), |c| {
            check_stage(c, stage)
        });
    }
    c.within(format_args!("base_pump"), |c| check_pump(c, &d.base_pump));
    let r = &d.relief;
    c.pressure("relief.setting_pa", r.setting.value, false);
    c.flow("relief.rated_flow_m3_per_s", r.rated_flow.value, false);
    let cf = r.cracking_fraction;
    if !(cf.is_finite() && cf > 0.0 && cf < 1.0) {
        c.fail(
            "relief.cracking_fraction",
            "must be above 0 % and below 100 % of the setting",
        );
    }
    for (i, remote) in d.remote_stages.iter().enumerate() {
        c.pressure(&format!("remote_stages_pa[{i}]"), remote.value, false);
    }
    if !d.remote_stages.is_empty() && !r.kind.has_vent_port() {
        c.fail(
            "remote_stages_pa",
            "a direct-acting relief has no vent port for remote pilot stages",
        );
    }
    c.pressure("vent_pressure_pa", d.vent_pressure.value, false);
    if d.phase_settings.len() != job.cycle.len() {
        c.fail(
            "phase_settings",
            format!(
                "has settings for {} phases but the cycle has {}",
                d.phase_settings.len(),
                job.cycle.len()
            ),
        );
    }
    for (i, setting) in d.phase_settings.iter().enumerate() {
        c.within(format_args!("phase_settings[{i}]"), |c| {
            check_setting(c, d, setting)
        });
    }
}

fn check_setting(c: &mut Checker, d: &Design, setting: &super::power_unit::PhaseSetting) {
    let r = &d.relief;
    match setting.limit {
        ActiveLimit::Main => {}
        ActiveLimit::Remote { stage } => {
            if stage >= d.remote_stages.len() {
                c.fail(
                    "limit",
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
                c.fail("limit", "a direct-acting relief has no vent port to vent");
            }
        }
    }
    match setting.idle_path {
        IdlePath::Vented if !r.kind.has_vent_port() => {
            c.fail(
                "idle_path",
                "a direct-acting relief has no vent port to vent",
            );
        }
        IdlePath::OpenCentre { drop } => {
            c.pressure("idle_path.drop_pa", drop.value, true);
        }
        _ => {}
    }
}

fn check_stage(c: &mut Checker, stage: &super::power_unit::UnloadingStage) {
    c.within(format_args!("pump"), |c| check_pump(c, &stage.pump));
    let setting = stage.unloading.setting.value;
    let drop = stage.unloading.unloaded_drop.value;
    let ok_setting = c.pressure("unloading.setting_pa", setting, false);
    let ok_drop = c.pressure("unloading.unloaded_drop_pa", drop, true);
    if ok_setting && ok_drop && drop >= setting {
        c.fail(
            "unloading.unloaded_drop_pa",
            "must be below the unloading setting",
        );
    }
    c.pressure("check.cracking_pa", stage.check.cracking.value, true);
}

fn check_pump(c: &mut Checker, p: &Pump) {
    c.plain(
        "displacement_m3_per_rev",
        p.displacement.value,
        false,
        MAX_DISPLACEMENT,
        Measure::Displacement,
    );
    c.fraction("volumetric_efficiency", p.volumetric_efficiency, false);
    c.pressure("efficiency_pressure_pa", p.efficiency_pressure.value, false);
    if let Some(speed) = p.efficiency_speed {
        c.amount(
            "efficiency_speed_rad_per_s",
            speed.value,
            false,
            MAX_SPEED_RAD_S,
            |_, v| format!("{:.0} rpm", v * 60.0 / std::f64::consts::TAU),
        );
    }
    c.fraction(
        "hydromechanical_efficiency",
        p.hydromechanical_efficiency,
        false,
    );
    c.power("drag_power_w", p.drag_power.value, true);
    c.pressure("rated_pressure_pa", p.rated_pressure.value, false);
    if let PumpControl::Compensated { setting } = p.control {
        c.pressure("control.setting_pa", setting.value, false);
    }
}

/// Beyond this share of the synchronous speed, a full-load slip is a typing slip (induction
/// motors slip a few percent).
const MAX_SLIP: f64 = 0.2;

fn rpm(_: UnitSystem, rad_per_s: f64) -> String {
    format!("{:.0} rpm", rad_per_s * 60.0 / std::f64::consts::TAU)
}

/// Every problem with field test `index` of a job, named by its path in the job file
/// (`pump_tests[0].readings[1].flow_m3_per_s`). Kept apart from [`validate`]: a test being
/// typed in never stops the job's results.
pub fn validate_pump_test(
    test: &super::pump_test::PumpTest,
    index: usize,
    units: UnitSystem,
) -> Vec<InputError> {
    check_pump_test(test, Some(index), units)
}

/// As [`validate_pump_test`], the paths within the test (`readings[1].flow_m3_per_s`).
pub(crate) fn pump_test_errors(
    test: &super::pump_test::PumpTest,
    units: UnitSystem,
) -> Vec<InputError> {
    check_pump_test(test, None, units)
}

fn check_pump_test(
    test: &super::pump_test::PumpTest,
    index: Option<usize>,
    units: UnitSystem,
) -> Vec<InputError> {
    use super::pump_test::{ElectricalInput, MotorEfficiency};
    let mut c = Checker {
        units,
        errors: Vec::new(),
        at: String::new(),
    };
    let checks = |c: &mut Checker| {
        if test.pump.trim().is_empty() {
            c.fail(
                "pump",
                "say which pump was tested (tests of one pump are compared by it)",
            );
        }
        if !test.date.trim().is_empty() && super::pump_test::day_number(&test.date).is_none() {
            c.fail("date", "write the date as year-month-day, e.g. 2026-11-30");
        }
        c.plain(
            "displacement_m3_per_rev",
            test.displacement.value,
            false,
            MAX_DISPLACEMENT,
            Measure::Displacement,
        );
        let full_load = test.speed.value;
        let full_load_ok = c.amount("speed_rad_per_s", full_load, false, MAX_SPEED_RAD_S, rpm);
        if let Some(sync) = test.synchronous_speed.map(|s| s.value) {
            let field = "synchronous_speed_rad_per_s";
            if c.amount(field, sync, false, MAX_SPEED_RAD_S, rpm) && full_load_ok {
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
        }
        c.pressure("rated_pressure_pa", test.rated_pressure.value, false);
        c.power("motor_rated_power_w", test.motor_rated_power.value, false);
        if let MotorEfficiency::Entered { efficiency } = test.motor_efficiency {
            c.fraction("motor_efficiency.efficiency", efficiency, false);
        }
        if test.readings.is_empty() {
            c.fail("readings", "add a reading: a flow at a test pressure");
        }
        for (k, r) in test.readings.iter().enumerate() {
            c.within(format_args!("readings[{k}]"), |c| {
                c.pressure("pressure_pa", r.pressure.value, true);
                c.flow("flow_m3_per_s", r.flow.value, true);
                if let Some(n) = r.speed {
                    c.amount("speed_rad_per_s", n.value, false, MAX_SPEED_RAD_S, rpm);
                }
                match r.electrical {
                    None => {}
                    Some(ElectricalInput::Power { input }) => {
                        c.power("electrical.input_w", input.value, false);
                    }
                    Some(ElectricalInput::ThreePhase {
                        voltage,
                        current,
                        power_factor,
                    }) => {
                        c.plain("electrical.line_voltage_v", voltage.value, false, 50e3, Measure::Voltage);
                        c.plain("electrical.line_current_a", current.value, false, 50e3, Measure::Current);
                        if !(power_factor.is_finite() && power_factor > 0.0 && power_factor <= 1.0) {
                            c.fail(
                                "electrical.power_factor",
                                "a power factor is more than 0 and at most 1 (0.8 is typical at full load): check the meter",
                            );
                        }
                    }
                }
                if let Some(t) = r.torque {
                    c.plain("torque_n_m", t.value, false, 1e6, Measure::Torque);
                }
            });
        }
    };
    match index {
        Some(i) => c.within(format_args!("pump_tests[{i}]"), checks),
        None => checks(&mut c),
    }
    c.errors
}
