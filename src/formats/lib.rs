//! What a job becomes outside the app, browser-free: each module turns the engine's job or
//! answer into one outside form and, where it comes back, reads it through the engine's checks.
//!
//! - [`library`]: the job file and the stored-job envelope kept on the device (versioned, with
//!   the upgrade of every older format);
//! - [`share`]: a job as a share link and that link as a QR code;
//! - [`ledger_csv`]: a power unit's ledger, phase by phase, as CSV;
//! - [`quote_text`]: the quote's figures in the words and rounding a customer reads.
//!
//! It sits between the engine (below; it computes nothing itself) and the UI (above; it knows
//! no browser).

pub mod ledger_csv;
pub mod library;
pub mod quote_text;
pub mod share;
