//! Every input field of a job, declared once: where it sits in the job file, what the form
//! calls it, what it measures and how it is checked. Validation checks each field through its
//! declaration, the UI's fields take their label, path and unit from it, and an error's path
//! finds its way back to the field's words through it, so a field's path is written here only.
//!
//! A field's path is its part's place in the job (`designs[]`, with a hole for each list
//! index) and its key within the part (`motor.rated_power_w`); [`FieldSpec::at`] fills the
//! holes. A key ending in a hole is a list of figures: left without its last index, the path
//! names the whole list (`designs[0].remote_stages_pa`).

use super::cycle::PhaseKind;
use super::units::{Measure, BAR, LITRE_PER_MINUTE, REVOLUTION_PER_MINUTE};
use std::fmt::Write;
use std::ops::Bound::{self, Excluded, Included};
use Measure::*;
use Part::*;

// Beyond these a value is a typing slip, not a machine (and would overflow the arithmetic).
const MAX_PRESSURE: f64 = 2000.0 * BAR;
const MAX_LENGTH: f64 = 50.0; // m
const MAX_FLOW: f64 = 100_000.0 * LITRE_PER_MINUTE;
const MAX_DURATION: f64 = 30.0 * 86_400.0; // s
const MAX_POWER: f64 = 20e6; // W
const MAX_SPEED_RAD_S: f64 = 10_000.0 * REVOLUTION_PER_MINUTE;
const MAX_DISPLACEMENT: f64 = 0.02; // m^3/rev
const MAX_FORCE: f64 = 1e9; // N
const MAX_VELOCITY: f64 = 100.0; // m/s
const HOURS_PER_YEAR: f64 = 8784.0; // a leap year
const MAX_PRICE: f64 = 1e12;

/// The part of a job a field belongs to.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Part {
    /// The job itself: its name, site, oil, advice margins, staging options and wear lines.
    Job,
    /// A phase of any kind (`cycle[2]`); its duration is that of the kinds that last a set
    /// time (a hold, an idle, a direct phase).
    Phase,
    /// A move phase: the same place, read when the phase moves a cylinder.
    Move,
    /// A hold phase.
    Hold,
    /// A direct phase (a flow at a pressure for a time).
    Direct,
    /// A power unit (`designs[0]`).
    Design,
    /// A pump of a power unit: its base pump (`designs[0].base_pump`, one index) or the pump
    /// of an unloading stage (`designs[0].unloading_stages[1].pump`, two).
    Pump,
    /// An unloading stage: its valve and check valve.
    Stage,
    /// A power unit's limit and idle path in one phase (`designs[0].phase_settings[2]`).
    PhaseSetting,
    /// A pump field test (`pump_tests[0]`).
    PumpTest,
    /// A reading of a pump test (`pump_tests[0].readings[3]`).
    Reading,
    /// A motor check (`motor_checks[0]`).
    MotorCheck,
    /// A reading of a motor check (`motor_checks[0].readings[1]`).
    MotorReading,
}

impl Part {
    /// Where the part sits in the job file, a hole `[]` for each list index.
    pub fn places(self) -> &'static [&'static str] {
        match self {
            Job => &[""],
            Phase | Move | Hold | Direct => &["cycle[]"],
            Design => &["designs[]"],
            Pump => &["designs[].base_pump", "designs[].unloading_stages[].pump"],
            Stage => &["designs[].unloading_stages[]"],
            PhaseSetting => &["designs[].phase_settings[]"],
            PumpTest => &["pump_tests[]"],
            Reading => &["pump_tests[].readings[]"],
            MotorCheck => &["motor_checks[]"],
            MotorReading => &["motor_checks[].readings[]"],
        }
    }

    /// The place with `holes` holes (a pump has two places), or the first.
    fn place_with(self, holes: usize) -> &'static str {
        let places = self.places();
        places
            .iter()
            .find(|p| holes_in(p) == holes)
            .unwrap_or(&places[0])
    }

    /// The part's path with `indices` in its holes: `Part::Phase.at(&[2])` is `cycle[2]`.
    pub fn at(self, indices: &[usize]) -> String {
        let mut path = String::new();
        fill(
            &mut path,
            self.place_with(indices.len()),
            &mut indices.iter(),
        );
        path
    }

    /// Whether phase `kind` has this part's fields (any kind for a part that is no phase).
    fn holds(self, kind: &PhaseKind) -> bool {
        match self {
            Move => matches!(kind, PhaseKind::Move(_)),
            Hold => matches!(kind, PhaseKind::Hold(_)),
            Direct => matches!(kind, PhaseKind::Direct(_)),
            _ => true,
        }
    }
}

/// How a field's value is checked before a job is solved. A check between fields (a rod
/// thinner than its bore) is code in `validate`, naming the field by its declaration.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Check {
    /// A finite amount in (0, max], or [0, max] when zero is allowed; `max` in SI, beyond
    /// which the value is a typing slip rather than a machine.
    Amount { zero_ok: bool, max: f64 },
    /// An efficiency or share, kept as a fraction: (0, 1], or [0, 1] when zero is allowed.
    Fraction { zero_ok: bool },
    /// A number between two bounds, and what to say when it is not. Held by reference: the
    /// few fields that have one should not widen every declaration (the table ships in the
    /// app).
    Between(&'static Bounds),
    /// Text that must not be blank, and what to say when it is.
    Required { otherwise: &'static str },
    /// A day written year-month-day, or nothing; what to say when it is neither.
    Date { otherwise: &'static str },
    /// Free text, a choice among the form's options or a list of parts: what it must agree
    /// with, if anything, is checked in code against the rest of the job.
    Free,
}

/// The bounds of a [`Check::Between`] and what to say outside them.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Bounds {
    pub low: Bound<f64>,
    pub high: Bound<f64>,
    pub otherwise: &'static str,
}

/// One input field of a job.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct FieldSpec {
    /// The part it belongs to.
    pub part: Part,
    /// Its key within the part, as the job file spells it, a hole `[]` for a list index.
    pub key: &'static str,
    /// What the form calls it.
    pub label: &'static str,
    /// What a number measures, and so the unit it is shown in; none for a text or a choice.
    pub measure: Option<Measure>,
    pub check: Check,
    /// How a sentence names it, where the label alone would not say which it is ("relief
    /// setting" for the relief's "Setting").
    pub in_words: Option<&'static str>,
}

impl Part {
    /// A field of this part, at `key`, labelled `label`: free until a check is given.
    const fn field(self, key: &'static str, label: &'static str) -> FieldSpec {
        FieldSpec {
            part: self,
            key,
            label,
            measure: None,
            check: Check::Free,
            in_words: None,
        }
    }
}

/// The declarations below read as one sentence each: a part's field, its key and label, then
/// its check and, where the label does not say which it is, its words.
impl FieldSpec {
    /// An amount of `measure` that must be more than zero and at most `max` (SI).
    const fn amount(self, measure: Measure, max: f64) -> FieldSpec {
        FieldSpec {
            measure: Some(measure),
            check: Check::Amount {
                zero_ok: false,
                max,
            },
            ..self
        }
    }

    /// An efficiency or share that must be more than zero.
    const fn fraction(self) -> FieldSpec {
        FieldSpec {
            measure: Some(Percent),
            check: Check::Fraction { zero_ok: false },
            ..self
        }
    }

    /// A number within `bounds`, which say what is wrong when it is not.
    const fn between(self, measure: Option<Measure>, bounds: &'static Bounds) -> FieldSpec {
        FieldSpec {
            measure,
            check: Check::Between(bounds),
            ..self
        }
    }

    /// A text that must not be blank; `otherwise` says what to do.
    const fn required(self, otherwise: &'static str) -> FieldSpec {
        FieldSpec {
            check: Check::Required { otherwise },
            ..self
        }
    }

    /// A day written year-month-day, or nothing; `otherwise` says how to write it.
    const fn date(self, otherwise: &'static str) -> FieldSpec {
        FieldSpec {
            check: Check::Date { otherwise },
            ..self
        }
    }

    /// The same field with zero allowed (a loss, a margin, a price).
    const fn or_zero(self) -> FieldSpec {
        let check = match self.check {
            Check::Amount { max, .. } => Check::Amount { zero_ok: true, max },
            Check::Fraction { .. } => Check::Fraction { zero_ok: true },
            other => other,
        };
        FieldSpec { check, ..self }
    }

    /// The same field, named in a sentence as `words`.
    const fn said(self, words: &'static str) -> FieldSpec {
        FieldSpec {
            in_words: Some(words),
            ..self
        }
    }

    /// Its path in the job file with `indices` in its holes, outermost first:
    /// `MOTOR_RATED_POWER.at(&[1])` is `designs[1].motor.rated_power_w`. A list's last index
    /// left out names the whole list.
    pub fn at(&self, indices: &[usize]) -> String {
        let key_holes = holes_in(self.key);
        let place = self
            .part
            .place_with(indices.len().saturating_sub(key_holes));
        let mut path = String::new();
        let mut indices = indices.iter();
        fill(&mut path, place, &mut indices);
        if !path.is_empty() {
            path.push('.');
        }
        fill(&mut path, self.key, &mut indices);
        path
    }

    /// Its path within the outermost list item it sits in, with `indices` for the lists
    /// inside that item: `TEST_FLOW.within_item(&[1])` is `readings[1].flow_m3_per_s`, as a
    /// pump test's report names what to look at.
    pub fn within_item(&self, indices: &[usize]) -> String {
        let mut all = Vec::with_capacity(indices.len() + 1);
        all.push(0);
        all.extend_from_slice(indices);
        let path = self.at(&all);
        match path.split_once("].") {
            Some((_, within)) => within.to_string(),
            None => path,
        }
    }

    /// Whether `pattern` (a path with its indices taken out, `designs[].motor.rated_power_w`)
    /// names this field, or the whole list it is.
    fn names(&self, pattern: &str) -> bool {
        self.part.places().iter().any(|place| {
            let key = if place.is_empty() {
                Some(pattern)
            } else {
                pattern
                    .strip_prefix(place)
                    .and_then(|r| r.strip_prefix('.'))
            };
            key.is_some_and(|k| k == self.key || self.key.strip_suffix("[]") == Some(k))
        })
    }

    /// Its name in a sentence: the words declared, or its label in lower case without what
    /// the label adds in brackets ("grid CO₂ factor").
    pub fn words(&self) -> String {
        if let Some(words) = self.in_words {
            return words.to_string();
        }
        let label = self.label.split(" (").next().unwrap_or(self.label);
        let mut chars = label.chars();
        match chars.next() {
            Some(first) => first.to_lowercase().chain(chars).collect(),
            None => String::new(),
        }
    }
}

fn holes_in(pattern: &str) -> usize {
    pattern.matches("[]").count()
}

/// Writes `pattern` with the next indices in its holes; stops at a hole with none left (the
/// path then names the whole list).
fn fill<'a>(path: &mut String, pattern: &str, indices: &mut impl Iterator<Item = &'a usize>) {
    let mut pieces = pattern.split("[]").peekable();
    while let Some(piece) = pieces.next() {
        path.push_str(piece);
        if pieces.peek().is_some() {
            match indices.next() {
                Some(i) => {
                    let _ = write!(path, "[{i}]");
                }
                None => return,
            }
        }
    }
}

/// A path with its list indices taken out (`designs[0].x[2]` gives `designs[].x[]`), and the
/// indices; `None` when a bracket holds anything but digits.
fn pattern_of(path: &str) -> Option<(String, Vec<usize>)> {
    let mut pattern = String::with_capacity(path.len());
    let mut indices = Vec::new();
    let mut rest = path;
    while let Some(open) = rest.find('[') {
        let (before, after) = rest.split_at(open + 1);
        let close = after.find(']')?;
        indices.push(after[..close].parse().ok()?);
        pattern.push_str(before);
        pattern.push(']');
        rest = &after[close + 1..];
    }
    pattern.push_str(rest);
    Some((pattern, indices))
}

/// The field a concrete path names (`designs[0].motor.rated_power_w`), if one is declared.
/// A phase's key can mean a field of more than one kind (`pressure_pa` is a hold's pressure or
/// a direct phase's): the kind of that phase in `job` decides.
pub fn spec_of(path: &str, job: &super::job::Job) -> Option<&'static FieldSpec> {
    let (pattern, indices) = pattern_of(path)?;
    let phase = path
        .starts_with("cycle[")
        .then(|| indices.first().and_then(|&i| job.cycle.get(i)))
        .flatten();
    let mut named = ALL.iter().copied().filter(|s| s.names(&pattern));
    let first = named.next()?;
    match phase {
        Some(phase) if !first.part.holds(&phase.kind) => {
            Some(named.find(|s| s.part.holds(&phase.kind)).unwrap_or(first))
        }
        _ => Some(first),
    }
}

// The job itself.
/// Not typed in, but checked: a format this version does not read is refused.
pub const SCHEMA_VERSION: FieldSpec = Job.field("schema_version", "File format");
pub const JOB_NAME: FieldSpec = Job
    .field("name", "Job name")
    .required("give the job a name");
pub const NOTES: FieldSpec = Job.field("notes", "Notes");
pub const PHASES: FieldSpec = Job.field("cycle", "Cycle");
pub const DESIGNS: FieldSpec = Job.field("designs", "Power units");
pub const SITE: FieldSpec = Job.field("site.location", "Site");
pub const OPERATING_HOURS: FieldSpec = Job
    .field("site.operating_hours_per_year", "Running hours")
    .amount(HoursPerYear, HOURS_PER_YEAR)
    .or_zero();
pub const TARIFF: FieldSpec = Job
    .field("site.tariff_per_kwh", "Electricity price")
    .amount(Tariff, 1e3)
    .or_zero();
pub const CURRENCY: FieldSpec = Job.field("site.currency", "Currency");
pub const RETROFIT_PRICE: FieldSpec = Job
    .field("site.retrofit_price", "Retrofit price, installed")
    .amount(Money, MAX_PRICE)
    .or_zero()
    .said("retrofit price");
pub const GRID_FACTOR: FieldSpec = Job
    .field(
        "site.grid_kg_co2_per_kwh",
        "Grid CO₂ factor (your utility's)",
    )
    .amount(GridFactor, 5.0)
    .or_zero();
pub const DEMAND_CHARGE: FieldSpec = Job
    .field(
        "site.demand_charge_per_kw_month",
        "Demand charge, if billed",
    )
    .amount(DemandCharge, 1e4)
    .or_zero();
pub const POWER_FACTOR_THRESHOLD: FieldSpec = Job
    .field(
        "site.power_factor_threshold",
        "Reactive power billed below power factor",
    )
    .between(
        Some(Factor),
        &Bounds {
            low: Excluded(0.0),
            high: Included(1.0),
            otherwise:
                "a power factor is more than 0 and at most 1 (tariffs commonly use 0.85 or 0.90)",
        },
    )
    .said("power factor the tariff asks for");
pub const OIL_VOLUME: FieldSpec = Job
    .field("oil.volume_m3", "Oil in circulation")
    .amount(OilVolume, 1000.0);
pub const OIL_DENSITY: FieldSpec = Job
    .field("oil.density_kg_per_m3", "Density")
    .amount(Density, 2000.0);
pub const OIL_SPECIFIC_HEAT: FieldSpec = Job
    .field("oil.specific_heat_j_per_kg_k", "Specific heat")
    .amount(SpecificHeat, 10_000.0);
pub const MARGIN_SHARE: FieldSpec = Job
    .field("advice.margin_fraction", "Margin above the need, share")
    .fraction()
    .or_zero()
    .said("margin above the need (share)");
pub const MARGIN_MIN: FieldSpec = Job
    .field("advice.margin_min_pa", "Margin above the need, at least")
    .amount(Pressure, MAX_PRESSURE)
    .or_zero()
    .said("least margin above the need");
pub const FLOW_CONTROL_DROP: FieldSpec = Job
    .field("advice.flow_control_drop_pa", "Drop a flow control needs")
    .amount(Pressure, MAX_PRESSURE)
    .or_zero();
pub const COMPENSATOR_MARGIN_MIN: FieldSpec = Job
    .field(
        "advice.compensator_margin_min_pa",
        "Relief above a compensator, at least",
    )
    .amount(Pressure, MAX_PRESSURE)
    .or_zero()
    .said("least relief margin above a compensator");
pub const LEAST_SAVING: FieldSpec = Job
    .field("advice.least_saving_w", "Smallest saving worth advising")
    .amount(Power, MAX_POWER)
    .or_zero();
pub const PUMP_SIZES: FieldSpec = Job
    .field("staging.displacements_m3_per_rev[]", "Pump sizes")
    .amount(Displacement, 1e-2);
pub const MOTOR_SPEEDS: FieldSpec = Job
    .field("staging.speeds_rad_per_s[]", "Motor speeds")
    .amount(ShaftSpeed, 1e3);
pub const MOST_PUMPS: FieldSpec = Job
    .field("staging.max_pumps", "Most pumps on the shaft")
    .between(
        None,
        &Bounds {
            low: Included(1.0),
            high: Included(3.0),
            otherwise: "choose one to three pumps",
        },
    );
pub const TRY_COMPENSATED: FieldSpec = Job.field(
    "staging.compensated",
    "Also try a pressure-compensated pump",
);
pub const TRY_DRIVES: FieldSpec = Job.field(
    "staging.drives",
    "Also try a fixed pump on a variable-speed drive",
);
pub const DRIVE_MIN_SPEEDS: FieldSpec = Job
    .field(
        "staging.drive_min_speeds_rad_per_s[]",
        "Slowest pump speeds on a drive",
    )
    .amount(ShaftSpeed, 1e3);
pub const MOTOR_STEPS: FieldSpec = Job.field("staging.motor_steps", "Standard motor ratings");
pub const EFFICIENCY_CLASS: FieldSpec =
    Job.field("staging.efficiency_class", "New motor's efficiency class");
pub const STAGING_SERVICE_FACTOR: FieldSpec = Job
    .field("staging.service_factor", "Service factor")
    .amount(Factor, 2.0);
pub const STAGING_PEAK_ALLOWANCE: FieldSpec = Job
    .field(
        "staging.peak_allowance",
        "Peak allowance (short peaks, times the rating)",
    )
    .amount(Factor, 5.0);
pub const CYCLE_TIME_TARGET: FieldSpec = Job
    .field("staging.cycle_time_target_s", "Whole cycle")
    .amount(Duration, MAX_DURATION)
    .said("longest cycle time");
pub const GOOD_FROM: FieldSpec = Job.field("wear.good_from", "Good from").fraction();
pub const WORN_BELOW: FieldSpec = Job.field("wear.worn_below", "Worn below").fraction();

// A phase.
pub const PHASE_NAME: FieldSpec = Phase.field("name", "Name");
pub const PHASE_KIND: FieldSpec = Phase.field("kind", "What happens");
/// A hold's, an idle's or a direct phase's time (a move lasts as long as its stroke takes).
pub const DURATION: FieldSpec = Phase
    .field("duration_s", "Duration")
    .amount(Duration, MAX_DURATION);
pub const DIRECTION: FieldSpec = Move.field("direction", "Direction");
pub const BORE: FieldSpec = Move
    .field("cylinder.bore_m", "Bore")
    .amount(Length, MAX_LENGTH);
pub const ROD: FieldSpec = Move
    .field("cylinder.rod_m", "Rod")
    .amount(Length, MAX_LENGTH)
    .or_zero();
pub const STROKE: FieldSpec = Move
    .field("cylinder.stroke_m", "Stroke in this phase")
    .amount(Length, MAX_LENGTH);
pub const LOAD_GIVEN_AS: FieldSpec = Move.field("load.type", "Load given as");
pub const LOAD_FORCE: FieldSpec = Move
    .field("load.force_n", "Load force")
    .amount(Force, MAX_FORCE)
    .or_zero();
pub const LOAD_PRESSURE: FieldSpec = Move
    .field("load.pressure_pa", "Load pressure")
    .amount(Pressure, MAX_PRESSURE)
    .or_zero();
pub const LINE_LOSS: FieldSpec = Move
    .field("line_loss_pa", "Line and valve losses")
    .amount(Pressure, MAX_PRESSURE)
    .or_zero();
pub const SPEED_RULE: FieldSpec = Move.field("speed.rule", "Speed");
pub const METERED_SPEED: FieldSpec = Move
    .field("speed.speed_m_per_s", "Metered speed")
    .amount(Speed, MAX_VELOCITY);
pub const METERED_FLOW: FieldSpec = Move
    .field("speed.flow_m3_per_s", "Metered flow")
    .amount(Flow, MAX_FLOW);
/// The longest a move may take, for the staging search (the form labels it by the phase).
pub const TARGET_TIME: FieldSpec = Move
    .field("target_time_s", "Longest time for this move")
    .amount(Duration, MAX_DURATION);
/// A hold's `pressure_pa`; a direct phase's is [`DIRECT_PRESSURE`], which may be zero.
pub const HOLD_PRESSURE: FieldSpec = Hold
    .field("pressure_pa", "Pressure to hold")
    .amount(Pressure, MAX_PRESSURE);
pub const HELD_BY: FieldSpec = Hold.field("mode", "Held by");
pub const DIRECT_FLOW: FieldSpec = Direct
    .field("flow_m3_per_s", "Flow taken")
    .amount(Flow, MAX_FLOW)
    .or_zero();
pub const DIRECT_PRESSURE: FieldSpec = Direct
    .field("pressure_pa", "At a pressure of")
    .amount(Pressure, MAX_PRESSURE)
    .or_zero()
    .said("pressure");

// A power unit.
pub const DESIGN_NAME: FieldSpec = Design
    .field("name", "Name of this power unit")
    .required("give the power unit a name")
    .said("name");
/// A proposal's own price, in place of the site's (the form names the proposal).
pub const OWN_RETROFIT_PRICE: FieldSpec = Design
    .field("retrofit_price", "Retrofit price, if its own")
    .amount(Money, MAX_PRICE)
    .or_zero()
    .said("retrofit price");
pub const MOTOR_RATED_POWER: FieldSpec = Design
    .field("motor.rated_power_w", "Rated power")
    .amount(Power, MAX_POWER)
    .said("motor rated power");
pub const MOTOR_SPEED: FieldSpec = Design
    .field("motor.full_load_speed_rad_per_s", "Full-load speed")
    .amount(ShaftSpeed, MAX_SPEED_RAD_S)
    .said("motor full-load speed");
pub const MOTOR_EFFICIENCY: FieldSpec = Design
    .field("motor.full_load_efficiency", "Full-load efficiency")
    .fraction()
    .said("motor full-load efficiency");
pub const MOTOR_FIXED_LOSS: FieldSpec = Design
    .field("motor.fixed_loss_share", "Share of its loss that is fixed")
    .fraction()
    .or_zero()
    .said("motor's fixed share of its loss");
pub const MOTOR_SERVICE_FACTOR: FieldSpec = Design
    .field("motor.service_factor", "Service factor")
    .between(
        Some(Factor),
        &Bounds {
            low: Included(1.0),
            high: Included(2.0),
            otherwise: "must be between 1.0 and 2.0 (1.0 if the nameplate shows none)",
        },
    )
    .said("motor service factor");
pub const MOTOR_PEAK_ALLOWANCE: FieldSpec = Design
    .field(
        "motor.peak_allowance",
        "Peak allowance (short peaks, times the rating)",
    )
    .between(
        Some(Factor),
        &Bounds {
            low: Included(1.0),
            high: Included(3.0),
            otherwise:
                "must be between 1.0 and 3.0 (1.25 is usual; the motor's breakdown torque decides)",
        },
    )
    .said("motor peak allowance");
pub const MOTOR_VOLTAGE: FieldSpec = Design
    .field("motor.electrical.voltage_v", "Rated voltage (line to line)")
    .amount(Voltage, 50e3)
    .said("motor rated voltage");
pub const MOTOR_FULL_LOAD_CURRENT: FieldSpec = Design
    .field("motor.electrical.full_load_current_a", "Full-load current")
    .amount(Current, 50e3)
    .said("motor full-load current");
pub const MOTOR_POWER_FACTOR: FieldSpec = Design
    .field(
        "motor.electrical.power_factor",
        "Full-load power factor, if given",
    )
    .between(
        Some(Factor),
        &Bounds {
            low: Excluded(0.0),
            high: Included(1.0),
            otherwise:
                "a power factor is more than 0 and at most 1 (0.8 to 0.9 is usual at full load)",
        },
    )
    .said("motor power factor");
/// The pumps after the first, each with its unloading valve: a list, its length checked.
pub const UNLOADING_STAGES: FieldSpec = Design
    .field("unloading_stages", "Unloading stages")
    .said("pumps");
pub const RELIEF_KIND: FieldSpec = Design.field("relief.kind", "Type").said("relief type");
pub const RELIEF_SETTING: FieldSpec = Design
    .field("relief.setting_pa", "Setting (gauge, pump dead-headed)")
    .amount(Pressure, MAX_PRESSURE)
    .said("relief setting");
pub const RELIEF_RATED_FLOW: FieldSpec = Design
    .field("relief.rated_flow_m3_per_s", "Rated flow")
    .amount(Flow, MAX_FLOW)
    .said("relief rated flow");
pub const RELIEF_CRACKING: FieldSpec = Design
    .field("relief.cracking_fraction", "Cracks at (share of setting)")
    .between(
        Some(Percent),
        &Bounds {
            low: Excluded(0.0),
            high: Excluded(1.0),
            otherwise: "must be above 0 % and below 100 % of the setting",
        },
    )
    .said("relief cracking share");
/// Each remote pilot stage's setting (the form numbers them), or the whole list.
pub const REMOTE_STAGES: FieldSpec = Design
    .field("remote_stages_pa[]", "Remote stage")
    .amount(Pressure, MAX_PRESSURE);
pub const VENT_PRESSURE: FieldSpec = Design
    .field("vent_pressure_pa", "Pressure when vented")
    .amount(Pressure, MAX_PRESSURE);
/// A variable-speed drive, when the design has one (the form's choice of fixed speed or a
/// drive).
pub const DRIVE: FieldSpec = Design.field("drive", "How the motor is driven");
pub const DRIVE_KIND: FieldSpec = Design
    .field("drive.kind", "Motor and drive")
    .said("kind of drive");
pub const DRIVE_MIN_SPEED: FieldSpec = Design
    .field("drive.min_speed_rad_per_s", "Slowest pump speed")
    .amount(ShaftSpeed, MAX_SPEED_RAD_S)
    .said("drive's slowest speed");
pub const DRIVE_MAX_SPEED: FieldSpec = Design
    .field("drive.max_speed_rad_per_s", "Fastest pump speed")
    .amount(ShaftSpeed, MAX_SPEED_RAD_S)
    .said("drive's fastest speed");
pub const CONVERTER_RATING: FieldSpec = Design
    .field("drive.converter_rating_va", "Converter rating")
    .amount(ApparentPower, MAX_POWER)
    .said("converter's rating");
/// A converter's loss at an operating point, as a share of its rating.
const CONVERTER_SHARE: Bounds = Bounds {
    low: Excluded(0.0),
    high: Included(0.2),
    otherwise:
        "must be above 0 % and at most 20 % of the converter's rating (makers state 1 to 5 %)",
};
pub const CONVERTER_LOSS_FROM: FieldSpec = Design
    .field("drive.converter_loss.from", "Converter losses from")
    .said("where the converter's losses come from");
pub const CONVERTER_CLASS: FieldSpec = Design
    .field("drive.converter_loss.class", "Converter efficiency class")
    .said("converter's class");
pub const CONVERTER_LOSS: FieldSpec = Design
    .field(
        "drive.converter_loss.share",
        "Converter loss at 90 % speed, full current",
    )
    .between(Some(Percent), &CONVERTER_SHARE)
    .said("converter's loss");
/// The maker's eight figures, at IEC 61800-9-2's points in order (the form numbers them).
pub const CONVERTER_LOSS_POINTS: FieldSpec = Design
    .field("drive.converter_loss.shares[]", "Converter loss")
    .between(Some(Percent), &CONVERTER_SHARE)
    .said("converter's loss at a standard point");
pub const DRIVE_HOLD: FieldSpec = Design
    .field("drive.hold", "Holds kept")
    .said("how holds are kept");
pub const DRIVE_IDLE: FieldSpec = Design
    .field("drive.idle", "Idles")
    .said("what the drive does in idles");
pub const MOTOR_COOLING: FieldSpec = Design.field("drive.cooling", "Motor cooling");
/// One setting per phase of the cycle: a list, its length checked.
pub const PHASE_SETTINGS: FieldSpec = Design.field("phase_settings", "Limit in each phase");

// A pump of a power unit.
pub const DISPLACEMENT: FieldSpec = Pump
    .field("displacement_m3_per_rev", "Displacement")
    .amount(Displacement, MAX_DISPLACEMENT);
pub const VOLUMETRIC_EFFICIENCY: FieldSpec = Pump
    .field("volumetric_efficiency", "Volumetric efficiency")
    .fraction();
pub const EFFICIENCY_PRESSURE: FieldSpec = Pump
    .field("efficiency_pressure_pa", "Measured at")
    .amount(Pressure, MAX_PRESSURE)
    .said("pressure its efficiency was measured at");
pub const EFFICIENCY_SPEED: FieldSpec = Pump
    .field("efficiency_speed_rad_per_s", "... and at shaft speed")
    .amount(ShaftSpeed, MAX_SPEED_RAD_S)
    .said("shaft speed its efficiency was measured at");
pub const HYDROMECHANICAL_EFFICIENCY: FieldSpec = Pump
    .field("hydromechanical_efficiency", "Hydromechanical efficiency")
    .fraction();
pub const DRAG_POWER: FieldSpec = Pump
    .field("drag_power_w", "Drag with no pressure")
    .amount(Power, MAX_POWER)
    .or_zero();
pub const PUMP_RATED_PRESSURE: FieldSpec = Pump
    .field("rated_pressure_pa", "Rated pressure")
    .amount(Pressure, MAX_PRESSURE)
    .said("pump rated pressure");
pub const PUMP_CONTROL: FieldSpec = Pump.field("control.type", "Control").said("pump control");
pub const COMPENSATOR_SETTING: FieldSpec = Pump
    .field("control.setting_pa", "Compensator setting")
    .amount(Pressure, MAX_PRESSURE);

// An unloading stage.
pub const UNLOADING_SETTING: FieldSpec = Stage
    .field("unloading.setting_pa", "Unloads at")
    .amount(Pressure, MAX_PRESSURE)
    .said("unloading setting");
pub const UNLOADED_DROP: FieldSpec = Stage
    .field("unloading.unloaded_drop_pa", "Pressure when unloaded")
    .amount(Pressure, MAX_PRESSURE)
    .or_zero();
pub const CHECK_CRACKING: FieldSpec = Stage
    .field("check.cracking_pa", "Check valve cracking")
    .amount(Pressure, MAX_PRESSURE)
    .or_zero();

// A power unit's setting in one phase.
pub const LIMIT: FieldSpec = PhaseSetting.field("limit", "Limit");
pub const IDLE_PATH: FieldSpec = PhaseSetting.field("idle_path", "Flow while idle");
pub const OPEN_CENTRE_DROP: FieldSpec = PhaseSetting
    .field("idle_path.drop_pa", "Open-centre pressure drop")
    .amount(Pressure, MAX_PRESSURE)
    .or_zero();
pub const MEASURED_CURRENT: FieldSpec = PhaseSetting
    .field("measured_current_a", "Line current read")
    .amount(Current, 50e3)
    .said("line current read");

// A pump test.
pub const TESTED_PUMP: FieldSpec = PumpTest
    .field("pump", "Which pump")
    .required("say which pump was tested (tests of one pump are compared by it)")
    .said("pump tested");
pub const TEST_DATE: FieldSpec = PumpTest
    .field("date", "Date (year-month-day)")
    .date("write the date as year-month-day, e.g. 2026-11-30");
pub const TEST_NOTES: FieldSpec = PumpTest.field("notes", "Notes");
pub const TEST_DISPLACEMENT: FieldSpec = PumpTest
    .field("displacement_m3_per_rev", "Displacement (nameplate)")
    .amount(Displacement, MAX_DISPLACEMENT);
pub const TEST_SPEED: FieldSpec = PumpTest
    .field("speed_rad_per_s", "Motor full-load speed (nameplate)")
    .amount(ShaftSpeed, MAX_SPEED_RAD_S);
pub const TEST_SYNCHRONOUS_SPEED: FieldSpec = PumpTest
    .field("synchronous_speed_rad_per_s", "Motor synchronous speed")
    .amount(ShaftSpeed, MAX_SPEED_RAD_S);
pub const TEST_RATED_PRESSURE: FieldSpec = PumpTest
    .field("rated_pressure_pa", "Rated pressure")
    .amount(Pressure, MAX_PRESSURE);
pub const TEST_MOTOR_POWER: FieldSpec = PumpTest
    .field("motor_rated_power_w", "Motor rated power")
    .amount(Power, MAX_POWER);
pub const MOTOR_EFFICIENCY_FROM: FieldSpec =
    PumpTest.field("motor_efficiency", "Motor efficiency from");
pub const TEST_MOTOR_EFFICIENCY: FieldSpec = PumpTest
    .field("motor_efficiency.efficiency", "Motor efficiency")
    .fraction();
pub const READINGS: FieldSpec = PumpTest.field("readings", "Readings");

// A reading of a pump test.
pub const TEST_PRESSURE: FieldSpec = Reading
    .field("pressure_pa", "Test pressure")
    .amount(Pressure, MAX_PRESSURE)
    .or_zero();
pub const TEST_FLOW: FieldSpec = Reading
    .field("flow_m3_per_s", "Flow")
    .amount(Flow, MAX_FLOW)
    .or_zero();
pub const SHAFT_SPEED: FieldSpec = Reading
    .field("speed_rad_per_s", "Shaft speed, if measured")
    .amount(ShaftSpeed, MAX_SPEED_RAD_S)
    .said("shaft speed");
pub const MOTOR_INPUT: FieldSpec = Reading.field("electrical", "Motor input");
pub const INPUT_POWER: FieldSpec = Reading
    .field("electrical.input_w", "Input power")
    .amount(Power, MAX_POWER);
pub const LINE_VOLTAGE: FieldSpec = Reading
    .field("electrical.line_voltage_v", "Line voltage")
    .amount(Voltage, 50e3);
pub const LINE_CURRENT: FieldSpec = Reading
    .field("electrical.line_current_a", "Line current")
    .amount(Current, 50e3);
pub const POWER_FACTOR: FieldSpec = Reading
    .field("electrical.power_factor", "Power factor")
    .between(
        Some(Factor),
        &Bounds {
            low: Excluded(0.0),
            high: Included(1.0),
            otherwise: "a power factor is more than 0 and at most 1 (0.8 is typical at full load): check the meter",
        },
    );
pub const SHAFT_TORQUE: FieldSpec = Reading
    .field("torque_n_m", "Shaft torque, if measured")
    .amount(Torque, 1e6)
    .said("shaft torque");

// A motor check.
pub const CHECKED_MOTOR: FieldSpec = MotorCheck
    .field("motor", "Which motor")
    .required("say which motor was checked (checks of one motor are compared by it)")
    .said("motor checked");
pub const CHECK_DATE: FieldSpec = MotorCheck
    .field("date", "Date (year-month-day)")
    .date("write the date as year-month-day, e.g. 2026-11-30");
pub const CHECK_NOTES: FieldSpec = MotorCheck.field("notes", "Notes");
pub const CHECK_DESIGN: FieldSpec = MotorCheck
    .field("design", "Power unit it drives")
    .said("power unit the motor drives");
pub const CHECK_RATED_POWER: FieldSpec = MotorCheck
    .field("nameplate.rated_power_w", "Rated power")
    .amount(Power, MAX_POWER);
pub const CHECK_VOLTAGE: FieldSpec = MotorCheck
    .field("nameplate.voltage_v", "Rated voltage (line to line)")
    .amount(Voltage, 50e3)
    .said("rated voltage");
pub const CHECK_FULL_LOAD_CURRENT: FieldSpec = MotorCheck
    .field("nameplate.full_load_current_a", "Full-load current")
    .amount(Current, 50e3);
pub const CHECK_FULL_LOAD_SPEED: FieldSpec = MotorCheck
    .field("nameplate.full_load_speed_rad_per_s", "Full-load speed")
    .amount(ShaftSpeed, MAX_SPEED_RAD_S);
pub const CHECK_EFFICIENCY_FROM: FieldSpec =
    MotorCheck.field("nameplate.efficiency", "Full-load efficiency from");
pub const CHECK_EFFICIENCY: FieldSpec = MotorCheck
    .field("nameplate.efficiency.efficiency", "Full-load efficiency")
    .fraction();
pub const CHECK_POWER_FACTOR: FieldSpec = MotorCheck
    .field("nameplate.power_factor", "Full-load power factor, if given")
    .between(
        Some(Factor),
        &Bounds {
            low: Excluded(0.0),
            high: Included(1.0),
            otherwise:
                "a power factor is more than 0 and at most 1 (0.8 to 0.9 is usual at full load)",
        },
    )
    .said("nameplate power factor");
pub const CHECK_SYNCHRONOUS_SPEED: FieldSpec = MotorCheck
    .field(
        "nameplate.synchronous_speed_rad_per_s",
        "Synchronous speed (120 × supply Hz / poles)",
    )
    .amount(ShaftSpeed, MAX_SPEED_RAD_S);
pub const MOTOR_READINGS: FieldSpec = MotorCheck.field("readings", "Readings");

// A reading of a motor check.
pub const READ_INPUT: FieldSpec = MotorReading
    .field("input_w", "Input power (meter)")
    .amount(Power, MAX_POWER);
pub const READ_VOLTAGE: FieldSpec = MotorReading
    .field("line.voltage_v", "Line voltage")
    .amount(Voltage, 50e3);
pub const READ_CURRENT: FieldSpec = MotorReading
    .field("line.current_a", "Line current")
    .amount(Current, 50e3);
pub const READ_POWER_FACTOR: FieldSpec = MotorReading
    .field("line.power_factor", "Power factor, if the meter gives it")
    .between(
        Some(Factor),
        &Bounds {
            low: Excluded(0.0),
            high: Included(1.0),
            otherwise: "a power factor is more than 0 and at most 1: check the meter",
        },
    )
    .said("power factor");
pub const READ_SPEED: FieldSpec = MotorReading
    .field("speed_rad_per_s", "Shaft speed (tachometer)")
    .amount(ShaftSpeed, MAX_SPEED_RAD_S)
    .said("shaft speed");

/// Every field declared, for finding one by its path.
// The oil, the lines and the heat balance.
const C0: f64 = 273.15;
/// A thermometer's reading on a machine: from a cold start outdoors to far past any oil's life.
const OIL_TEMPERATURE: Bounds = Bounds {
    low: Included(C0 - 40.0),
    high: Included(C0 + 150.0),
    otherwise: "an oil temperature is between -40 and 150 °C (-40 and 302 °F)",
};
const AIR_TEMPERATURE: Bounds = Bounds {
    low: Included(C0 - 40.0),
    high: Included(C0 + 60.0),
    otherwise: "the air or coolant is between -40 and 60 °C (-40 and 140 °F)",
};
/// A line's fittings: their loss coefficients, each checked in code (the list holds kinds).
const FITTINGS: Bounds = Bounds {
    low: Included(0.0),
    high: Included(1000.0),
    otherwise: "a loss coefficient is a number from 0 to 1000",
};
pub const OIL_GIVEN_AS: FieldSpec = Job.field("oil.viscosity.given_as", "Oil known by");
pub const OIL_GRADE: FieldSpec = Job
    .field("oil.viscosity.grade", "ISO viscosity grade")
    .between(
        Some(Number),
        &Bounds {
            low: Included(2.0),
            high: Included(3200.0),
            otherwise: "an ISO 3448 grade is its viscosity at 40 °C in mm²/s, from 2 to 3200 (hydraulic oils: 15 to 150)",
        },
    );
pub const VISCOSITY_INDEX: FieldSpec = Job
    .field("oil.viscosity.viscosity_index", "Viscosity index")
    .between(
        Some(Number),
        &Bounds {
            low: Included(0.0),
            high: Included(400.0),
            otherwise: "a viscosity index is from 0 to 400 (mineral hydraulic oils: about 95 to 105; multigrade oils 140 to 200)",
        },
    );
pub const VISCOSITY_AT_40: FieldSpec = Job
    .field("oil.viscosity.at_40_degc_m2_per_s", "Viscosity at 40 °C")
    .amount(Viscosity, 1e-2)
    .said("viscosity at 40 °C");
pub const VISCOSITY_AT_100: FieldSpec = Job
    .field("oil.viscosity.at_100_degc_m2_per_s", "Viscosity at 100 °C")
    .amount(Viscosity, 1e-2)
    .said("viscosity at 100 °C");
pub const WORKING_TEMPERATURE_SET_BY: FieldSpec =
    Job.field("oil.working_temperature.set_by", "Working temperature");
pub const WORKING_TEMPERATURE: FieldSpec = Job
    .field(
        "oil.working_temperature.temperature_k",
        "Oil temperature at work",
    )
    .between(Some(Temperature), &OIL_TEMPERATURE)
    .said("oil temperature at work");
pub const TARGET_TEMPERATURE: FieldSpec = Job
    .field("oil.target_k", "Hold the oil at")
    .between(Some(Temperature), &OIL_TEMPERATURE)
    .said("temperature to hold the oil at");
pub const TANK_GIVEN_AS: FieldSpec = Job.field("tank.size.given_as", "Tank known by");
pub const TANK_LENGTH: FieldSpec = Job
    .field("tank.size.length_m", "Tank length")
    .amount(LineSize, MAX_LENGTH);
pub const TANK_WIDTH: FieldSpec = Job
    .field("tank.size.width_m", "Tank width")
    .amount(LineSize, MAX_LENGTH);
pub const TANK_OIL_DEPTH: FieldSpec = Job
    .field("tank.size.oil_depth_m", "Oil depth in the tank")
    .amount(LineSize, MAX_LENGTH);
pub const TANK_AREA: FieldSpec = Job
    .field("tank.size.area_m2", "Wetted wall area")
    .amount(Area, 1000.0);
pub const TANK_AIR: FieldSpec = Job.field("tank.air", "Air around the tank");
pub const AMBIENT: FieldSpec = Job
    .field("tank.ambient_k", "Air temperature")
    .between(Some(Temperature), &AIR_TEMPERATURE)
    .said("air temperature around the tank");
pub const STEEL_MASS: FieldSpec = Job
    .field("tank.steel_mass_kg", "Steel that warms with the oil")
    .amount(Mass, 1e6)
    .or_zero();
pub const FIRST_READING_TIME: FieldSpec = Job
    .field("warm_up.first.time_s", "First reading, time")
    .amount(Duration, MAX_DURATION)
    .or_zero();
pub const FIRST_READING_OIL: FieldSpec = Job
    .field("warm_up.first.oil_k", "First reading, oil")
    .between(Some(Temperature), &OIL_TEMPERATURE);
pub const SECOND_READING_TIME: FieldSpec = Job
    .field("warm_up.second.time_s", "Second reading, time")
    .amount(Duration, MAX_DURATION);
pub const SECOND_READING_OIL: FieldSpec = Job
    .field("warm_up.second.oil_k", "Second reading, oil")
    .between(Some(Temperature), &OIL_TEMPERATURE);
pub const PRESSURE_LINE_DIAMETER: FieldSpec = Move
    .field(
        "lines.pressure_line.inner_diameter_m",
        "Pressure line, inner diameter",
    )
    .amount(LineSize, 1.0);
pub const PRESSURE_LINE_LENGTH: FieldSpec = Move
    .field("lines.pressure_line.length_m", "Pressure line, length")
    .amount(LineSize, 1000.0);
pub const PRESSURE_LINE_FITTINGS: FieldSpec = Move
    .field(
        "lines.pressure_line.fittings",
        "Pressure line, fittings' loss coefficients added up",
    )
    .between(Some(Number), &FITTINGS)
    .said("pressure line's fittings");
pub const RETURN_LINE_DIAMETER: FieldSpec = Move
    .field(
        "lines.return_line.inner_diameter_m",
        "Return line, inner diameter",
    )
    .amount(LineSize, 1.0);
pub const RETURN_LINE_LENGTH: FieldSpec = Move
    .field("lines.return_line.length_m", "Return line, length")
    .amount(LineSize, 1000.0);
pub const RETURN_LINE_FITTINGS: FieldSpec = Move
    .field(
        "lines.return_line.fittings",
        "Return line, fittings' loss coefficients added up",
    )
    .between(Some(Number), &FITTINGS)
    .said("return line's fittings");
pub const SUCTION_LINE_DIAMETER: FieldSpec = Design
    .field(
        "suction_line.inner_diameter_m",
        "Suction line, inner diameter",
    )
    .amount(LineSize, 1.0);
pub const SUCTION_LINE_LENGTH: FieldSpec = Design
    .field("suction_line.length_m", "Suction line, length")
    .amount(LineSize, 1000.0);
pub const SUCTION_LINE_FITTINGS: FieldSpec = Design
    .field(
        "suction_line.fittings",
        "Suction line, fittings' loss coefficients added up",
    )
    .between(Some(Number), &FITTINGS)
    .said("suction line's fittings");
pub const COOLANT: FieldSpec = Design.field("cooler.coolant", "Cooler's coolant");
pub const COOLANT_TEMPERATURE: FieldSpec = Design
    .field("cooler.coolant_k", "Coolant temperature in")
    .between(Some(Temperature), &AIR_TEMPERATURE)
    .said("coolant temperature");
pub const COOLER_RATED_HEAT: FieldSpec = Design
    .field("cooler.rated_heat_w", "Cooler rating: heat")
    .amount(Heat, MAX_POWER)
    .said("cooler's rated heat");
pub const COOLER_RATED_DIFFERENCE: FieldSpec = Design
    .field("cooler.rated_difference_k", "... at oil above coolant")
    .amount(TemperatureDifference, 200.0)
    .said("temperature difference of the cooler's rating");
pub const EFFICIENCY_TEMPERATURE: FieldSpec = Pump
    .field("efficiency_oil_k", "... and at oil temperature")
    .between(Some(Temperature), &OIL_TEMPERATURE)
    .said("oil temperature its efficiency was measured at");

pub const ALL: &[&FieldSpec] = &[
    &SCHEMA_VERSION,
    &JOB_NAME,
    &NOTES,
    &PHASES,
    &DESIGNS,
    &SITE,
    &OPERATING_HOURS,
    &TARIFF,
    &CURRENCY,
    &RETROFIT_PRICE,
    &GRID_FACTOR,
    &DEMAND_CHARGE,
    &POWER_FACTOR_THRESHOLD,
    &OIL_VOLUME,
    &OIL_DENSITY,
    &OIL_SPECIFIC_HEAT,
    &MARGIN_SHARE,
    &MARGIN_MIN,
    &FLOW_CONTROL_DROP,
    &COMPENSATOR_MARGIN_MIN,
    &LEAST_SAVING,
    &PUMP_SIZES,
    &MOTOR_SPEEDS,
    &MOST_PUMPS,
    &TRY_DRIVES,
    &DRIVE_MIN_SPEEDS,
    &TRY_COMPENSATED,
    &MOTOR_STEPS,
    &EFFICIENCY_CLASS,
    &STAGING_SERVICE_FACTOR,
    &STAGING_PEAK_ALLOWANCE,
    &CYCLE_TIME_TARGET,
    &GOOD_FROM,
    &WORN_BELOW,
    &PHASE_NAME,
    &PHASE_KIND,
    &DURATION,
    &DIRECTION,
    &BORE,
    &ROD,
    &STROKE,
    &LOAD_GIVEN_AS,
    &LOAD_FORCE,
    &LOAD_PRESSURE,
    &LINE_LOSS,
    &SPEED_RULE,
    &METERED_SPEED,
    &METERED_FLOW,
    &TARGET_TIME,
    &HOLD_PRESSURE,
    &HELD_BY,
    &DIRECT_FLOW,
    &DIRECT_PRESSURE,
    &DESIGN_NAME,
    &OWN_RETROFIT_PRICE,
    &MOTOR_RATED_POWER,
    &MOTOR_SPEED,
    &MOTOR_EFFICIENCY,
    &MOTOR_FIXED_LOSS,
    &MOTOR_SERVICE_FACTOR,
    &MOTOR_PEAK_ALLOWANCE,
    &MOTOR_VOLTAGE,
    &MOTOR_FULL_LOAD_CURRENT,
    &MOTOR_POWER_FACTOR,
    &UNLOADING_STAGES,
    &RELIEF_KIND,
    &RELIEF_SETTING,
    &RELIEF_RATED_FLOW,
    &RELIEF_CRACKING,
    &DRIVE,
    &DRIVE_KIND,
    &DRIVE_MIN_SPEED,
    &DRIVE_MAX_SPEED,
    &CONVERTER_RATING,
    &CONVERTER_LOSS_FROM,
    &CONVERTER_CLASS,
    &CONVERTER_LOSS,
    &CONVERTER_LOSS_POINTS,
    &DRIVE_HOLD,
    &DRIVE_IDLE,
    &MOTOR_COOLING,
    &REMOTE_STAGES,
    &VENT_PRESSURE,
    &PHASE_SETTINGS,
    &DISPLACEMENT,
    &VOLUMETRIC_EFFICIENCY,
    &EFFICIENCY_PRESSURE,
    &EFFICIENCY_SPEED,
    &HYDROMECHANICAL_EFFICIENCY,
    &DRAG_POWER,
    &PUMP_RATED_PRESSURE,
    &PUMP_CONTROL,
    &COMPENSATOR_SETTING,
    &UNLOADING_SETTING,
    &UNLOADED_DROP,
    &CHECK_CRACKING,
    &LIMIT,
    &IDLE_PATH,
    &OPEN_CENTRE_DROP,
    &MEASURED_CURRENT,
    &TESTED_PUMP,
    &TEST_DATE,
    &TEST_NOTES,
    &TEST_DISPLACEMENT,
    &TEST_SPEED,
    &TEST_SYNCHRONOUS_SPEED,
    &TEST_RATED_PRESSURE,
    &TEST_MOTOR_POWER,
    &MOTOR_EFFICIENCY_FROM,
    &TEST_MOTOR_EFFICIENCY,
    &READINGS,
    &TEST_PRESSURE,
    &TEST_FLOW,
    &SHAFT_SPEED,
    &MOTOR_INPUT,
    &INPUT_POWER,
    &LINE_VOLTAGE,
    &LINE_CURRENT,
    &POWER_FACTOR,
    &SHAFT_TORQUE,
    &CHECKED_MOTOR,
    &CHECK_DATE,
    &CHECK_NOTES,
    &CHECK_DESIGN,
    &CHECK_RATED_POWER,
    &CHECK_VOLTAGE,
    &CHECK_FULL_LOAD_CURRENT,
    &CHECK_FULL_LOAD_SPEED,
    &CHECK_EFFICIENCY_FROM,
    &CHECK_EFFICIENCY,
    &CHECK_POWER_FACTOR,
    &CHECK_SYNCHRONOUS_SPEED,
    &MOTOR_READINGS,
    &READ_INPUT,
    &READ_VOLTAGE,
    &READ_CURRENT,
    &READ_POWER_FACTOR,
    &READ_SPEED,
    &OIL_GIVEN_AS,
    &OIL_GRADE,
    &VISCOSITY_INDEX,
    &VISCOSITY_AT_40,
    &VISCOSITY_AT_100,
    &WORKING_TEMPERATURE_SET_BY,
    &WORKING_TEMPERATURE,
    &TARGET_TEMPERATURE,
    &TANK_GIVEN_AS,
    &TANK_LENGTH,
    &TANK_WIDTH,
    &TANK_OIL_DEPTH,
    &TANK_AREA,
    &TANK_AIR,
    &AMBIENT,
    &STEEL_MASS,
    &FIRST_READING_TIME,
    &FIRST_READING_OIL,
    &SECOND_READING_TIME,
    &SECOND_READING_OIL,
    &PRESSURE_LINE_DIAMETER,
    &PRESSURE_LINE_LENGTH,
    &PRESSURE_LINE_FITTINGS,
    &RETURN_LINE_DIAMETER,
    &RETURN_LINE_LENGTH,
    &RETURN_LINE_FITTINGS,
    &SUCTION_LINE_DIAMETER,
    &SUCTION_LINE_LENGTH,
    &SUCTION_LINE_FITTINGS,
    &COOLANT,
    &COOLANT_TEMPERATURE,
    &COOLER_RATED_HEAT,
    &COOLER_RATED_DIFFERENCE,
    &EFFICIENCY_TEMPERATURE,
];

#[cfg(test)]
mod tests {
    use super::*;

    /// A job with a phase of every kind: move, move, hold, move, idle from the example, and a
    /// direct phase after them.
    fn job_of_every_phase() -> super::super::job::Job {
        let mut job = super::super::demo::scrap_baler();
        let direct = r#"{"name": "tool", "kind": "direct", "flow_m3_per_s": 1e-4,
            "pressure_pa": 5e6, "duration_s": 2.0}"#;
        job.cycle.push(serde_json::from_str(direct).unwrap());
        job
    }

    #[test]
    fn each_declared_path_names_one_field() {
        let mut seen: Vec<(String, Part)> = Vec::new();
        for spec in ALL {
            for place in spec.part.places() {
                for key in [Some(spec.key), spec.key.strip_suffix("[]")]
                    .into_iter()
                    .flatten()
                {
                    let path = [*place, key].join(".");
                    let path = path.trim_start_matches('.').to_string();
                    // One path may be two kinds of phase's fields, never two of one part.
                    let phase_kinds = [Move, Hold, Direct];
                    for (other, part) in seen.iter().filter(|(p, _)| *p == path) {
                        assert!(
                            phase_kinds.contains(part)
                                && phase_kinds.contains(&spec.part)
                                && *part != spec.part,
                            "{other} is declared twice"
                        );
                    }
                    seen.push((path, spec.part));
                }
            }
        }
        assert!(ALL.len() > 90, "{} fields", ALL.len());
    }

    #[test]
    fn a_path_is_built_from_its_field_and_found_again() {
        let job = job_of_every_phase();
        let phase_of = |part: Part| match part {
            Move => 0,
            Hold => 2,
            Direct => job.cycle.len() - 1,
            _ => 4,
        };
        for spec in ALL {
            for place in spec.part.places() {
                let holes = holes_in(place) + holes_in(spec.key);
                let indices: Vec<usize> = (0..holes)
                    .map(|n| if n == 0 { phase_of(spec.part) } else { n })
                    .collect();
                let path = spec.at(&indices);
                assert!(!path.contains("[]") && !path.starts_with('.'), "{path}");
                assert_eq!(spec_of(&path, &job), Some(*spec), "{path}");
            }
        }
    }

    #[test]
    fn paths_fill_their_holes_in_order() {
        assert_eq!(MOTOR_RATED_POWER.at(&[1]), "designs[1].motor.rated_power_w");
        assert_eq!(
            DISPLACEMENT.at(&[0]),
            "designs[0].base_pump.displacement_m3_per_rev"
        );
        assert_eq!(
            DISPLACEMENT.at(&[0, 2]),
            "designs[0].unloading_stages[2].pump.displacement_m3_per_rev"
        );
        assert_eq!(REMOTE_STAGES.at(&[1, 0]), "designs[1].remote_stages_pa[0]");
        assert_eq!(REMOTE_STAGES.at(&[1]), "designs[1].remote_stages_pa");
        assert_eq!(PUMP_SIZES.at(&[]), "staging.displacements_m3_per_rev");
        assert_eq!(JOB_NAME.at(&[]), "name");
        assert_eq!(Part::PumpTest.at(&[3]), "pump_tests[3]");
        assert_eq!(
            TEST_FLOW.at(&[0, 2]),
            "pump_tests[0].readings[2].flow_m3_per_s"
        );
        assert_eq!(pattern_of("cycle[x].name"), None);
    }

    #[test]
    fn a_phase_key_is_read_by_the_kind_of_its_phase() {
        let job = job_of_every_phase();
        let direct = job.cycle.len() - 1;
        assert_eq!(spec_of("cycle[2].pressure_pa", &job), Some(&HOLD_PRESSURE));
        let path = format!("cycle[{direct}].pressure_pa");
        assert_eq!(spec_of(&path, &job), Some(&DIRECT_PRESSURE));
        assert_eq!(spec_of("cycle[4].duration_s", &job), Some(&DURATION));
        assert_eq!(spec_of("designs[0].nothing_m", &job), None);
    }

    #[test]
    fn a_field_is_named_in_a_sentence_by_its_label_or_its_words() {
        assert_eq!(BORE.words(), "bore");
        assert_eq!(LOAD_FORCE.words(), "load force");
        assert_eq!(RELIEF_SETTING.words(), "relief setting");
        assert_eq!(GRID_FACTOR.words(), "grid CO₂ factor");
        assert_eq!(STAGING_PEAK_ALLOWANCE.words(), "peak allowance");
        assert_eq!(DIRECT_PRESSURE.words(), "pressure");
        assert_eq!(TEST_FLOW.within_item(&[1]), "readings[1].flow_m3_per_s");
        assert_eq!(READINGS.within_item(&[]), "readings");
        assert_eq!(MOTOR_EFFICIENCY_FROM.within_item(&[]), "motor_efficiency");
    }
}
