//! The engine's integration tests, one binary: each module checks one concept of the trade
//! through the engine's public interface, with builders shared from `common`.
//!
//!     cargo test -p phasewise-engine --test engine [module::]
//!
//! Beside these, plain `#[test]`s sit beside the code they test (`src/**`).
//!
//! | file | what |
//! |---|---|
//! | `published.rs` | published checks, each naming its source (Esposito 5-9, 8-2, 8-3; Hydraulics & Pneumatics 2023; Engineering ToolBox; the RMS method; NIST SP 811 Btu) |
//! | `src/engine/units.rs` (unit tests) | NIST SP 811 exact definitions; the hp and kW rules; uom within its rounding |
//! | `trade_facts.rs` | facts of the trade, marked common practice (cracking by valve type, venting, remote stages, annulus) |
//! | `scenarios.rs` | invented two- and three-pump machines, every expected value worked by hand in the comments |
//! | `input.rs` | bad input gives the right field and message; job files round-trip; corrupt and newer files are refused |
//! | `properties.rs` | proptest over random plausible jobs (2,000 cases each in CI; the long run of 100,000 cases per property, printing the counts, is in its module doc) |
//! | `golden.rs` | fixtures solved and compared with their recorded output |
//! | `staging.rs` | the search against a brute-force enumeration written out in the test; more sizes never a worse best; kept candidates meet the times and their motor is the smallest step that carries RMS and peak |
//! | `settings.rs` | every advice rule with a case that triggers it and one that does not (common practice), a high-low press worked by hand, actions never touching the baseline, holds advised their own pressure, no relief at a compensator, effects worded by sign, invalid jobs refused |
//! | `efficiency.rs` | the pump check: Esposito 5-9, Hydraulics & Pneumatics examples, IEC 60034-30-1 and NEMA MG 1 tables, the leakage fit, each bad reading's message, the trend by date, slip-corrected speed, part-load motor efficiency, copying without the drag twice, the readings a verdict needs |
//! | `electrical.rs` | the line current and power factor: the nameplate met at full load, a maker's part-load power factors, a third of the current unloaded (common practice), rising with load, sqrt(3) V I PF equal to the ledger's input in every phase, a clamp-meter reading far off is a finding |
//! | `motor_check.rs` | the motor check: the US DOE fact sheet's input-power and slip examples, the voltage correction and current method against petrobras/ccp's test values, Hydraulics & Pneumatics' efficiency from two readings, which method is trusted, the verdict, a right-sized motor's saving |
//! | `oil.rs` | the oil through the solve: the lines' drop in the ledger and a retract's larger return, colder oil losing more in the lines and leaking less, leakage by viscosity, heat in = heat out where it settles, a bigger cooler never hotter, a fast line's finding, an oil by its points, a field warm-up against the model |
//! | `drive.rs` | variable-speed drives: a press cycle's speed per phase worked by hand (flow plus leakage over displacement; all pump flow at the maximum; a hold making up leakage; an idle stopped), a phase beyond the top speed, a hold at the minimum against the relief, the losses at speed and torque, the converter's standing loss, a self-cooled motor slow at full torque, the US DOE part-load curves (as digitised in Modelica Buildings) |
//! | `quote.rs` | the quote: Cengel and Boles' high-efficiency motor example solved through the whole engine (7,929 kWh, $634 a year, 1.01 years), a hand-worked invented retrofit, the year split by ledger item adding up, which assumptions are defaults, the customer rounding |
//!
//! A test that checks the main job against something outside the project names its source
//! beside the check (a standard, a handbook table, a published worked example or a reference
//! library); a rule of thumb with no published source is marked "common practice"; a value
//! from memory is marked so. Demo data is never a reference.

mod common;
mod drive;
mod efficiency;
mod electrical;
mod golden;
mod input;
mod motor_check;
mod oil;
mod properties;
mod published;
mod quote;
mod scenarios;
mod settings;
mod staging;
mod trade_facts;
