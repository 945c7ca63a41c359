//! Phasewise: a hydraulic power unit, described phase by phase, and where its power goes.
//!
//! Three layers, each depending only on those below it (see DEVELOPERS.md):
//! - [`engine`] (the `phasewise-engine` crate), pure Rust with no browser dependency, which
//!   turns a job into results (nothing in the UI computes physics);
//! - [`formats`] (the `phasewise-formats` crate), the job file, share link, ledger CSV and the
//!   quote's words, also browser-free;
//! - [`ui`], the Leptos front end, which only edits a job and shows what the engine returns.

pub use phasewise_engine as engine;
pub use phasewise_formats as formats;
pub mod ui;

pub use ui::App;
