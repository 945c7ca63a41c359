//! A design's power ledger as CSV, for a spreadsheet: one row per phase and one for the whole
//! cycle, in the units the user has chosen. Pure, tested natively.
//!
//! RFC 4180 layout (comma separated, CRLF line ends, quoted where needed), a UTF-8 byte-order
//! mark so common spreadsheets read the units' symbols, and a dot as the decimal mark. A name
//! that a spreadsheet would take for a formula gets a leading apostrophe (common practice
//! against formula injection).

use phasewise_engine::ledger::LedgerItem;
use phasewise_engine::units::{Measure, UnitSystem};
use phasewise_engine::{DesignReport, PowerLedger};

/// The ledger's items, in the order of the columns.
fn ledger_items(l: &PowerLedger) -> [f64; 9] {
    [
        l.electrical_input.value,
        l.motor_loss.value,
        l.pump_internal_loss.value,
        l.unloading_loss.value,
        l.relief_loss.value,
        l.metering_loss.value,
        l.line_valve_loss.value,
        l.useful_power.value,
        l.heat_into_oil().value,
    ]
}

/// The columns' names: the ledger's items as every screen names them.
const ITEM_NAMES: [&str; 9] = [
    "Electrical input",
    LedgerItem::Motor.name(),
    LedgerItem::InsidePumps.name(),
    LedgerItem::Unloading.name(),
    LedgerItem::Relief.name(),
    LedgerItem::FlowControl.name(),
    LedgerItem::LinesAndValves.name(),
    LedgerItem::UsefulWork.name(),
    "Heat into the oil",
];

/// One field, quoted if it holds a comma, a quote or a line break.
fn field(text: &str) -> String {
    let text = if text.starts_with(['=', '+', '-', '@']) {
        format!("'{text}")
    } else {
        text.to_string()
    };
    if text.contains([',', '"', '\n', '\r']) {
        format!("\"{}\"", text.replace('"', "\"\""))
    } else {
        text
    }
}

/// A number in the shown unit, with two more decimals than the screen shows (a spreadsheet
/// sums them).
fn number(measure: Measure, units: UnitSystem, si: f64) -> String {
    let decimals = measure.unit(units).2 + 2;
    format!("{:.decimals$}", measure.shown(units, si))
}

/// The ledger of `design` as CSV.
pub fn ledger_csv(design: &DesignReport, units: UnitSystem) -> String {
    let power = Measure::Power.label(units);
    let mut header = vec![
        "Phase".to_string(),
        format!("Duration ({})", Measure::Duration.label(units)),
        format!("System pressure ({})", Measure::Pressure.label(units)),
        format!("Flow to the actuator ({})", Measure::Flow.label(units)),
        format!("Flow over the relief ({})", Measure::Flow.label(units)),
    ];
    header.extend(ITEM_NAMES.iter().map(|n| format!("{n} ({power})")));
    header.push(format!("Energy ({})", Measure::Energy.label(units)));
    let mut rows = vec![header
        .iter()
        .map(|h| field(h))
        .collect::<Vec<_>>()
        .join(",")];

    let mut weighted = [0.0; 9];
    for phase in &design.phases {
        let t = phase.point.duration.value;
        let items = ledger_items(&phase.ledger);
        let mut row = vec![
            field(&phase.name),
            number(Measure::Duration, units, t),
            number(Measure::Pressure, units, phase.point.system_pressure.value),
            number(Measure::Flow, units, phase.point.actuator_flow.value),
            number(Measure::Flow, units, phase.point.relief_flow.value),
        ];
        for (sum, item) in weighted.iter_mut().zip(items) {
            *sum += item * t;
            row.push(number(Measure::Power, units, item));
        }
        row.push(number(
            Measure::Energy,
            units,
            phase.ledger.electrical_input.value * t,
        ));
        rows.push(row.join(","));
    }
    // The whole cycle: each item's time-weighted average, and the energy per cycle.
    let cycle = design.totals.cycle_time.value;
    let mut row = vec![
        field("Whole cycle (average power)"),
        number(Measure::Duration, units, cycle),
        String::new(),
        String::new(),
        String::new(),
    ];
    for sum in weighted {
        let average = if cycle > 0.0 { sum / cycle } else { 0.0 };
        row.push(number(Measure::Power, units, average));
    }
    row.push(number(
        Measure::Energy,
        units,
        design.totals.energy_per_cycle.value,
    ));
    rows.push(row.join(","));
    format!("\u{feff}{}\r\n", rows.join("\r\n"))
}

#[cfg(test)]
mod tests {
    use super::*;
    use phasewise_engine::uom::si::{energy::kilowatt_hour, power::kilowatt};
    use phasewise_engine::{demo::scrap_baler, solve};

    fn cells(csv: &str) -> Vec<Vec<String>> {
        // Enough of a reader for these rows: the demo's names hold no quotes.
        csv.trim_start_matches('\u{feff}')
            .split("\r\n")
            .filter(|l| !l.is_empty())
            .map(|l| l.split(',').map(str::to_string).collect())
            .collect()
    }

    #[test]
    fn every_phase_has_a_row_and_the_cycle_row_matches_the_engine_totals() {
        let job = scrap_baler();
        let report = solve(&job).unwrap();
        let design = &report.designs[0];
        let csv = ledger_csv(design, UnitSystem::Si);
        assert!(csv.starts_with('\u{feff}') && csv.ends_with("\r\n"));
        let rows = cells(&csv);
        assert_eq!(rows.len(), design.phases.len() + 2);
        assert_eq!(rows[0][5], "Electrical input (kW)");
        for (row, phase) in rows[1..].iter().zip(&design.phases) {
            assert_eq!(row[0], phase.name);
            let input: f64 = row[5].parse().unwrap();
            assert!((input - phase.ledger.electrical_input.value / 1e3).abs() < 1e-4);
            // Each row closes as the ledger does: input = motor loss + heat + useful work.
            let n = |i: usize| row[i].parse::<f64>().unwrap();
            assert!((n(5) - (n(6) + n(13) + n(12))).abs() < 1e-3, "{row:?}");
        }
        let cycle = rows.last().unwrap();
        let average: f64 = cycle[5].parse().unwrap();
        assert!((average - design.totals.average_electrical.get::<kilowatt>()).abs() < 1e-4);
        let heat: f64 = cycle[13].parse().unwrap();
        assert!((heat - design.totals.heat_load.get::<kilowatt>()).abs() < 1e-4);
        let energy: f64 = cycle[14].parse().unwrap();
        assert!((energy - design.totals.energy_per_cycle.get::<kilowatt_hour>()).abs() < 1e-5);
    }

    #[test]
    fn us_units_and_awkward_names_are_written_safely() {
        let mut job = scrap_baler();
        job.cycle[0].name = "Approach, fast \"rapid\"".into();
        job.cycle[1].name = "=HYPERLINK(1)".into();
        let report = solve(&job).unwrap();
        let csv = ledger_csv(&report.designs[0], UnitSystem::UsCustomary);
        assert!(csv.contains("System pressure (psi)") && csv.contains("Electrical input (hp)"));
        assert!(
            csv.contains("\r\n\"Approach, fast \"\"rapid\"\"\","),
            "{csv}"
        );
        assert!(csv.contains("\r\n'=HYPERLINK(1),"), "{csv}");
    }
}
