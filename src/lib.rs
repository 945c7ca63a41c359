//! Phasewise: a hydraulic power unit, described phase by phase, and where its power goes.
//!
//! The crate holds two layers (see DEVELOPERS.md):
//! - [`engine`], pure Rust with no browser dependency, which turns a job into results
//!   (nothing in the UI computes physics);
//! - [`ui`], the Leptos front end, which only edits a job and shows what the engine returns.

pub mod engine;
pub mod ledger_csv;
pub mod library;
pub mod quote_text;
pub mod share;
pub mod ui;

pub use ui::App;
