//! The retrofit comparison as a customer reads it: every design of a job side by side, with
//! the figures a quote needs (motor size, cycle time and parts per hour, energy and cost per
//! year, heat, savings and simple payback against the baseline, CO2 from the site's grid
//! factor), and the rounding that keeps false precision out of a quote while the exact values
//! stay in the report.
//!
//! # The columns
//!
//! `columns(job, report)` gives a [`QuoteColumn`] per design from the solved report: the
//! motor's rating, peak and RMS shaft load, cycle time and parts an hour (one part per cycle),
//! energy per cycle and per year, running cost, heat load (kW and Btu/h) and how fast the oil
//! would warm per hour with no cooler, CO2 from the site's grid factor when one is given, the
//! year's energy split by ledger item ([`annual_energy_by_item`]: each item's energy over a
//! cycle, times the cycles in the running hours; the items add up to the year), and against
//! the baseline: energy, cost, heat and CO2 saved and the simple payback (retrofit price over
//! the cost saved, the design's own `retrofit_price` when it has one, else the site's; none
//! when nothing is saved). A difference below 1e-9 of the baseline's figure is rounding noise
//! between two solves and counts as zero (`ledger::denoised`, `simple_payback`, shared with
//! the results' comparison). The wording and rounding for the screen and the report are
//! `formats::quote_text`'s ([`for_customer`] and [`payback_for_customer`] are the rounding).
//!
//! # Assumptions and formulas
//!
//! `assumptions(job)` lists every value the results rest on, each [`Basis::Entered`], a
//! `Default` with its source (the helpers' common-practice figures, Esposito's oil values, the
//! typical unloading drop and check cracking of `valve`) when it still equals that default,
//! `FromExample` for a site figure still equal to the example job's (an edited example, or a
//! copy of it, keeps them), or a `Model` simplification; a design's figure shared by every
//! design is one line ("Every power unit: ..."), one that differs is a line per design.
//! [`FORMULAS`] gives each formula's published source.

use super::job::{Job, Oil};
use super::ledger::{denoised, simple_payback, LedgerItem};
use super::motor::{TYPICAL_FIXED_LOSS_SHARE, TYPICAL_PEAK_ALLOWANCE};
use super::solve::{DesignReport, JobReport};
use super::units::{watts, Measure, KILOWATT_HOUR};
use super::valve::{TYPICAL_CHECK_CRACKING_PA, TYPICAL_UNLOADED_DROP_PA};
use serde::Serialize;
use uom::si::energy::kilowatt_hour;
use uom::si::f64::{Energy, Power, Time, Volume};

/// One design's column of the comparison. Exact values; round with [`for_customer`] to show.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct QuoteColumn {
    pub name: String,
    #[serde(rename = "motor_rated_w")]
    pub motor_rated: Power,
    /// The speed the pumps turn at: the motor's full-load speed, or a variable-speed drive's
    /// slowest and fastest (rad/s).
    pub pump_speed: (f64, f64),
    /// Whether the design's pumps are on a variable-speed drive.
    pub driven: bool,
    #[serde(rename = "peak_shaft_w")]
    pub peak_shaft: Power,
    #[serde(rename = "rms_shaft_w")]
    pub rms_shaft: Power,
    #[serde(rename = "cycle_time_s")]
    pub cycle_time: Time,
    /// 3600 / cycle time: one part per cycle.
    pub parts_per_hour: f64,
    #[serde(rename = "energy_per_cycle_j")]
    pub energy_per_cycle: Energy,
    #[serde(
        rename = "annual_energy_kwh",
        serialize_with = "super::units::as_kilowatt_hours"
    )]
    pub annual_energy: Energy,
    /// Average heat into the oil (W): what a cooler must take away at steady temperature.
    #[serde(rename = "heat_load_w")]
    pub heat_load: Power,
    pub heat_load_btu_per_hour: f64,
    /// How fast the oil would warm with no cooler, per hour of running (what the tank and
    /// pipes shed is left out, so the real rise is slower).
    pub oil_rise_k_per_hour: f64,
    pub annual_cost: f64,
    /// The year's energy by where it ends up, in [`LedgerItem::ALL`]'s order (kWh). The items
    /// add up to `annual_energy_kwh`.
    pub annual_energy_by_item_kwh: [f64; LedgerItem::COUNT],
    /// Annual kWh x the site's grid factor; none when the site gives none.
    pub co2_kg_per_year: Option<f64>,
    /// Against the baseline (none for the baseline itself): energy and cost saved per year
    /// (negative when the design costs more), and the retrofit price over the cost saved
    /// (none when nothing is saved).
    pub against_baseline: Option<Saving>,
}

#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct Saving {
    pub energy_kwh_per_year: f64,
    /// Less heat for the cooler to take away (W).
    #[serde(rename = "heat_load_w")]
    pub heat_load: Power,
    pub cost_per_year: f64,
    pub co2_kg_per_year: Option<f64>,
    pub payback_years: Option<f64>,
}

/// The comparison of every design of `job`, from its solved `report`.
pub fn columns(job: &Job, report: &JobReport) -> Vec<QuoteColumn> {
    let grid = job.site.grid_factor;
    let baseline = report.designs.first().map(|d| &d.totals);
    job.designs
        .iter()
        .zip(&report.designs)
        .enumerate()
        .map(|(i, (design, r))| {
            let t = &r.totals;
            let against_baseline = baseline.filter(|_| i > 0).map(|b| {
                // Two solves of nearly the same unit differ in the last digits: that is no saving.
                let energy = denoised(
                    b.annual_energy.get::<kilowatt_hour>() - t.annual_energy.get::<kilowatt_hour>(),
                    b.annual_energy.get::<kilowatt_hour>(),
                );
                let cost = denoised(b.annual_cost - t.annual_cost, b.annual_cost);
                Saving {
                    energy_kwh_per_year: energy,
                    heat_load: watts(denoised(
                        b.heat_load.value - t.heat_load.value,
                        b.heat_load.value,
                    )),
                    cost_per_year: cost,
                    co2_kg_per_year: grid.map(|g| energy * g),
                    payback_years: simple_payback(
                        design.retrofit_price_or(&job.site),
                        cost,
                        b.annual_cost,
                    ),
                }
            });
            let cycle = t.cycle_time.value;
            QuoteColumn {
                name: design.name.clone(),
                motor_rated: design.motor.rated_power,
                pump_speed: design.drive.map_or(
                    (
                        design.motor.full_load_speed.value,
                        design.motor.full_load_speed.value,
                    ),
                    |d| (d.min_speed.value, d.max_speed.value),
                ),
                driven: design.drive.is_some(),
                peak_shaft: t.peak_shaft,
                rms_shaft: t.rms_shaft,
                cycle_time: t.cycle_time,
                parts_per_hour: if cycle > 0.0 { 3600.0 / cycle } else { 0.0 },
                energy_per_cycle: t.energy_per_cycle,
                annual_energy: t.annual_energy,
                heat_load: t.heat_load,
                heat_load_btu_per_hour: t.heat_load_btu_per_hour,
                oil_rise_k_per_hour: t.oil_rise_k_per_minute * 60.0,
                annual_cost: t.annual_cost,
                annual_energy_by_item_kwh: annual_energy_by_item(
                    r,
                    job.site.operating_hours_per_year,
                ),
                co2_kg_per_year: grid.map(|g| t.annual_energy.get::<kilowatt_hour>() * g),
                against_baseline,
            }
        })
        .collect()
}

/// A design's yearly energy split by ledger item: each item's energy over one cycle, as a
/// share of the cycle, times the hours the machine runs.
pub fn annual_energy_by_item(
    design: &DesignReport,
    hours_per_year: f64,
) -> [f64; LedgerItem::COUNT] {
    let cycle = design.totals.cycle_time.value;
    LedgerItem::ALL.map(|item| {
        let per_cycle: f64 = design
            .phases
            .iter()
            .map(|p| p.ledger.part(item).value * p.point.duration.value)
            .sum();
        if cycle > 0.0 {
            per_cycle / cycle * hours_per_year * 3600.0 / KILOWATT_HOUR
        } else {
            0.0
        }
    })
}

/// `value` to `significant` figures (at least 1): what a customer's quote shows. 12,345 kWh
/// at three figures is 12,300; 0.0123 is 0.0123. Zero and non-finite values come back as
/// they are.
pub fn for_customer(value: f64, significant: u32) -> f64 {
    if value == 0.0 || !value.is_finite() {
        return value;
    }
    let digits = significant.max(1) as i32;
    let magnitude = value.abs().log10().floor() as i32;
    let exponent = digits - 1 - magnitude;
    // Near f64's smallest values the scale would overflow; nothing there is worth rounding.
    if exponent > 300 {
        return value;
    }
    let scale = 10f64.powi(exponent);
    let rounded = (value * scale).round() / scale;
    // Dividing again by the scale can leave a tail (0.1 + 0.2): print-clean it.
    let decimals = (digits - 1 - magnitude).max(0) as usize;
    format!("{rounded:.decimals$}").parse().unwrap_or(rounded)
}

/// A payback period as a quote gives it: to a tenth of a year under ten years, whole years
/// above.
pub fn payback_for_customer(years: f64) -> f64 {
    if years < 10.0 {
        (years * 10.0).round() / 10.0
    } else {
        years.round()
    }
}

/// What a figure of the report rests on.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub enum Basis {
    /// The user's own figure for this job.
    Entered,
    /// A site figure still equal to the example job's (a new job starts from the example):
    /// to be checked against this site.
    FromExample,
    /// A value Phasewise fills in, and where it comes from.
    Default { source: &'static str },
    /// A simplification every result rests on, and where it comes from.
    Model { source: &'static str },
}

/// A value an assumption holds, shown in the job's units by the front end.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub enum Assumed {
    Quantity(Measure, f64),
    /// A quantity stated at another ("91 % at 150 bar").
    QuantityAt(Measure, f64, Measure, f64),
    /// A plain number with its unit in words ("h a year").
    Plain(f64, String),
    Text(String),
}

/// One line of the report's assumptions.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Assumption {
    pub what: String,
    pub value: Assumed,
    pub basis: Basis,
}

const ESPOSITO_OIL: &str =
    "Esposito, Fluid Power with Applications: working values for mineral oil";
const COMMON: &str = "common practice";

/// Every value the job's results rest on that the user may not have chosen: the site's
/// figures, the oil, each design's motor allowances, the advice margins, and the
/// simplifications of the model, each with its source.
pub fn assumptions(job: &Job) -> Vec<Assumption> {
    let mut out = Vec::new();
    let mut push =
        |what: String, value: Assumed, basis: Basis| out.push(Assumption { what, value, basis });
    let site = &job.site;
    let example = super::demo::scrap_baler().site;
    let site_basis = |same: bool| {
        if same {
            Basis::FromExample
        } else {
            Basis::Entered
        }
    };
    let currency = site.currency.trim();
    push(
        "Running hours a year".into(),
        Assumed::Plain(site.operating_hours_per_year, "h".into()),
        site_basis(site.operating_hours_per_year == example.operating_hours_per_year),
    );
    push(
        "Electricity price".into(),
        Assumed::Plain(site.tariff_per_kwh, format!("{currency} per kWh")),
        site_basis(site.tariff_per_kwh == example.tariff_per_kwh),
    );
    push(
        "Retrofit price".into(),
        Assumed::Plain(site.retrofit_price, currency.to_string()),
        site_basis(site.retrofit_price == example.retrofit_price),
    );
    for design in job.designs.iter().skip(1) {
        if let Some(price) = design.retrofit_price {
            push(
                format!("“{}”: its own retrofit price", design.name),
                Assumed::Plain(price, currency.to_string()),
                Basis::Entered,
            );
        }
    }
    push(
        "Grid CO₂ factor".into(),
        match site.grid_factor {
            Some(f) => Assumed::Plain(f, "kg CO₂ per kWh".into()),
            None => Assumed::Text("not given: no CO₂ figures".into()),
        },
        Basis::Entered,
    );
    let mineral = Oil::mineral(Volume::default());
    push(
        "Oil in circulation".into(),
        Assumed::Quantity(Measure::OilVolume, job.oil.volume.value),
        Basis::Entered,
    );
    let oil_basis = |same: bool| {
        if same {
            Basis::Default {
                source: ESPOSITO_OIL,
            }
        } else {
            Basis::Entered
        }
    };
    push(
        "Oil density".into(),
        Assumed::Quantity(Measure::Density, job.oil.density.value),
        oil_basis(job.oil.density == mineral.density),
    );
    push(
        "Oil specific heat".into(),
        Assumed::Quantity(Measure::SpecificHeat, job.oil.specific_heat.value),
        oil_basis(job.oil.specific_heat == mineral.specific_heat),
    );
    let default_or_entered = |same: bool| {
        if same {
            Basis::Default { source: COMMON }
        } else {
            Basis::Entered
        }
    };
    // Each design's own figures: one line for all designs where they agree.
    let mut per_design: Vec<(usize, String, Assumed, Basis)> = Vec::new();
    for (i, design) in job.designs.iter().enumerate() {
        let m = &design.motor;
        let mut push =
            |what: String, value: Assumed, basis: Basis| per_design.push((i, what, value, basis));
        push(
            "Motor efficiency at full load".to_string(),
            Assumed::Quantity(Measure::Percent, m.full_load_efficiency),
            Basis::Entered,
        );
        push(
            "Share of the motor's loss that is fixed".to_string(),
            Assumed::Quantity(Measure::Percent, m.fixed_loss_share),
            default_or_entered(m.fixed_loss_share == TYPICAL_FIXED_LOSS_SHARE),
        );
        push(
            "Service factor (continuous load over rating)".to_string(),
            Assumed::Quantity(Measure::Factor, m.service_factor),
            Basis::Entered,
        );
        push(
            "Peak allowance (short peaks, times the rating)".to_string(),
            Assumed::Quantity(Measure::Factor, m.peak_allowance),
            default_or_entered(m.peak_allowance == TYPICAL_PEAK_ALLOWANCE),
        );
        let typical = design.relief.kind.typical_cracking_fraction();
        push(
            "Relief valve cracks at (share of setting)".to_string(),
            Assumed::Quantity(Measure::Percent, design.relief.cracking_fraction),
            default_or_entered(design.relief.cracking_fraction == typical),
        );
        push(
            "Relief valve's rated flow (the maker's; its setting is read with the pumps' flow over it)".to_string(),
            Assumed::Quantity(Measure::Flow, design.relief.rated_flow.value),
            Basis::Entered,
        );
        push(
            "Pressure with the relief vented".to_string(),
            Assumed::Quantity(Measure::Pressure, design.vent_pressure.value),
            Basis::Entered,
        );
        for (n, pump) in design.pumps().enumerate() {
            push(
                format!("Pump {} volumetric efficiency", n + 1),
                Assumed::QuantityAt(
                    Measure::Percent,
                    pump.volumetric_efficiency,
                    Measure::Pressure,
                    pump.efficiency_pressure.value,
                ),
                Basis::Entered,
            );
            push(
                format!("Pump {} hydromechanical efficiency", n + 1),
                Assumed::Quantity(Measure::Percent, pump.hydromechanical_efficiency),
                Basis::Entered,
            );
            push(
                format!("Pump {} drag with no pressure", n + 1),
                Assumed::Quantity(Measure::Power, pump.drag_power.value),
                Basis::Entered,
            );
        }
        for (n, stage) in design.unloading_stages.iter().enumerate() {
            push(
                format!("Pump {} pressure when unloaded", n + 1),
                Assumed::Quantity(Measure::Pressure, stage.unloading.unloaded_drop.value),
                default_or_entered(stage.unloading.unloaded_drop.value == TYPICAL_UNLOADED_DROP_PA),
            );
            push(
                format!("Pump {} check valve cracking", n + 1),
                Assumed::Quantity(Measure::Pressure, stage.check.cracking.value),
                default_or_entered(stage.check.cracking.value == TYPICAL_CHECK_CRACKING_PA),
            );
        }
    }
    let mut keys: Vec<&String> = Vec::new();
    for (_, key, _, _) in &per_design {
        if !keys.contains(&key) {
            keys.push(key);
        }
    }
    for key in keys {
        let lines: Vec<_> = per_design.iter().filter(|(_, k, _, _)| k == key).collect();
        let same = lines.len() == job.designs.len()
            && lines
                .iter()
                .all(|(_, _, v, b)| (v, b) == (&lines[0].2, &lines[0].3));
        if same && job.designs.len() > 1 {
            push(
                format!("Every power unit: {}", lowercase_first(key)),
                lines[0].2.clone(),
                lines[0].3.clone(),
            );
        } else {
            for (i, _, value, basis) in lines {
                push(
                    format!("“{}”: {}", job.designs[*i].name, lowercase_first(key)),
                    value.clone(),
                    basis.clone(),
                );
            }
        }
    }
    let a = &job.advice;
    let policy = super::policy::AdvicePolicy::default();
    push(
        "Settings advice: margin above the pressure a phase needs".into(),
        Assumed::Quantity(Measure::Percent, a.margin_fraction),
        default_or_entered(a.margin_fraction == policy.margin_fraction),
    );
    push(
        "Settings advice: least margin".into(),
        Assumed::Quantity(Measure::Pressure, a.margin_min.value),
        default_or_entered(a.margin_min == policy.margin_min),
    );
    push(
        "Settings advice: least margin of a relief above a compensated pump".into(),
        Assumed::Quantity(Measure::Pressure, a.compensator_margin_min.value),
        default_or_entered(a.compensator_margin_min == policy.compensator_margin_min),
    );
    push(
        "Settings advice: drop a flow control needs".into(),
        Assumed::Quantity(Measure::Pressure, a.flow_control_drop.value),
        default_or_entered(a.flow_control_drop == policy.flow_control_drop),
    );
    push(
        "Settings advice: least saving worth advising, in its phase".into(),
        Assumed::Quantity(Measure::Power, a.least_saving_w),
        default_or_entered(a.least_saving_w == policy.least_saving_w),
    );
    let compensated = job.designs.iter().any(|d| {
        d.pumps()
            .any(|p| matches!(p.control, super::pump::PumpControl::Compensated { .. }))
    });
    if compensated {
        push(
            "A compensated pump goes from full flow to dead-head over this share of its setting"
                .into(),
            Assumed::Quantity(Measure::Percent, super::pump::COMPENSATOR_BAND),
            Basis::Model { source: COMMON },
        );
    }
    let models = MODEL.iter().chain(
        job.designs
            .iter()
            .any(|d| d.drive.is_some())
            .then_some(DRIVE_MODEL.iter())
            .into_iter()
            .flatten(),
    );
    for (what, source) in models {
        push(
            what.to_string(),
            Assumed::Text(String::new()),
            Basis::Model { source },
        );
    }
    out
}

/// The simplifications a variable-speed drive's results rest on, listed when a design has one.
const DRIVE_MODEL: [(&str, &str); 3] = [
    (
        "On a variable-speed drive, each phase runs at the lowest speed that gives its flow and the pumps' leakage, within the drive's range; a pump's leakage at a pressure does not change with speed, its drag is taken as a torque",
        "our model of the drive",
    ),
    (
        "A motor on a drive loses its fixed loss in proportion to speed and its copper loss with torque squared; a self-cooled motor cools less below half its full-load speed",
        "a simplification of IEC 60034-2-3's loss split; cooling from memory of the usual 2:1 constant-torque rating (common practice)",
    ),
    (
        "A converter's loss at 90 % speed and full current is its class's limit against Regulation (EU) 2019/1781's reference table, or its maker's figure, spread over current as 20 % fixed, 50 % with current, 30 % with current squared (unless the maker's eight figures are given)",
        "IEC 61800-9-2 and Regulation (EU) 2019/1781; the split from memory",
    ),
];

fn lowercase_first(text: &str) -> String {
    let mut chars = text.chars();
    match chars.next() {
        Some(first) => first.to_lowercase().chain(chars).collect(),
        None => String::new(),
    }
}

/// The simplifications every result rests on.
const MODEL: [(&str, &str); 8] = [
    (
        "One part per cycle; the machine cycles through all its running hours",
        "our model of the job",
    ),
    (
        "The motor turns at its full-load speed in every phase (slip neglected)",
        COMMON,
    ),
    (
        "The motor's loss is a fixed part plus a part growing with the square of the load",
        COMMON,
    ),
    (
        "A pump's leakage grows in proportion to pressure, from its stated volumetric efficiency, and not with its speed",
        COMMON,
    ),
    (
        "A relief setting is the pressure with the pumps dead-headed, their whole flow over the valve; it opens from its cracking pressure and rises in a straight line above it",
        COMMON,
    ),
    (
        "Every hydraulic loss ends up as heat in the oil; the tank and pipes shed none of it",
        "common practice: a cautious upper bound for the cooler",
    ),
    (
        "The motor is sized on the RMS load over the cycle, the peak checked against its allowance",
        "Machine Design and Power & Motion articles on motor sizing (RMS over a duty cycle)",
    ),
    (
        "Simple payback: no interest, no change in the electricity price, no maintenance costs",
        "Çengel and Boles, Thermodynamics: An Engineering Approach, chapter 2: simple payback period",
    ),
];

/// The formulas behind the report's figures, with their published sources.
pub const FORMULAS: [(&str, &str, &str); 9] = [
    (
        "Hydraulic power",
        "pressure × flow; kW = L/min × bar / 600, hp = gpm × psi / 1714",
        "Esposito, Fluid Power with Applications; unit definitions of NIST SP 811, Appendix B",
    ),
    (
        "Heat over a relief or unloading valve",
        "pressure drop × flow through the valve",
        "Esposito, Fluid Power with Applications, Examples 8-2 and 8-3",
    ),
    (
        "Pump efficiencies",
        "volumetric = measured flow / (displacement × speed); overall = hydraulic power out / shaft power in = volumetric × hydromechanical",
        "ISO 4391 (symbols), ISO 4409 (test method); Esposito, Example 5-9",
    ),
    (
        "Three-phase electrical input",
        "√3 × line voltage × current × power factor",
        "Hydraulics & Pneumatics, “Rightsize your electric motors”",
    ),
    (
        "RMS motor load",
        "√(Σ P² × t / (running time + stopped time / 3)) over the phases of one cycle",
        "Machine Design and Power & Motion articles on motor sizing; a stopped motor's time counted at a third: common practice",
    ),
    (
        "Service factor",
        "permissible continuous load = rated power × service factor",
        "NEMA MG 1, 1.42",
    ),
    (
        "Oil warming with no cooler",
        "heat load / (oil volume × density × specific heat)",
        "Esposito, Fluid Power with Applications (oil's working values)",
    ),
    (
        "Energy and cost a year",
        "average electrical input × running hours; × electricity price",
        "Çengel and Boles, Thermodynamics: An Engineering Approach, chapter 2: cost savings of high-efficiency motors",
    ),
    (
        "Simple payback",
        "retrofit price / cost saved a year",
        "Çengel and Boles, Thermodynamics: An Engineering Approach, chapter 2: simple payback period",
    ),
];
