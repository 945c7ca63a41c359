//! The engine's integration tests, one binary: each module checks one concept of the trade
//! through the engine's public interface, with builders shared from `common`.
//!
//!     cargo test -p phasewise-engine --test engine [module::]

mod common;
mod efficiency;
mod golden;
mod input;
mod properties;
mod published;
mod quote;
mod scenarios;
mod settings;
mod staging;
mod trade_facts;
