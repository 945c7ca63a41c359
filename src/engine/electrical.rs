//! What a three-phase induction motor draws from the supply in each phase of the cycle: its
//! line current and power factor, from its nameplate and the input power the ledger gives it.
//!
//! Input power is sqrt(3) V I PF. The line current splits into an active part, in phase with
//! the voltage and carrying the input power, I_a = P_in / (sqrt(3) V), and a reactive part
//! that magnetises the motor and feeds its leakage reactance. The magnetising part hardly
//! changes with load ("the magnetizing current ... is nearly constant regardless of load",
//! UConn ITAC training notes on electric motors, a US DOE Industrial Assessment Center); the
//! leakage part grows with the square of the current, taken here as the square of the load.
//! Running unloaded a motor draws "approximately one-third of rated current" (EASA, C. Yung,
//! "No-load current basics", 2005: a rule of thumb, so common practice), nearly all of it
//! reactive; at full load it draws the nameplate current at the nameplate power factor. So,
//! with x the shaft load over the rating:
//!
//! ```text
//! I_r(x) = I_0 + (I_fl sin(phi_fl) - I_0) x^2,   I_0 = min(I_fl / 3, I_fl sin(phi_fl))
//! I = sqrt(I_a^2 + I_r^2),                       PF = I_a / I
//! ```
//!
//! The power factor falls with the load, sooner than the efficiency does, as the US DOE's fact
//! sheet "Determining Electric Motor Load and Efficiency" shows (its Figure 2). The ledger and
//! the current agree in every phase by construction: sqrt(3) V I PF is the ledger's input.
//! Where the nameplate gives no power factor, it follows from the rest of the nameplate:
//! PF_fl = P_rated / (eta_fl sqrt(3) V I_fl), the relation the US DOE's MEASUR tool uses.

use super::motor::{ElectricalRating, Motor};
use serde::Serialize;
use uom::si::electric_current::ampere;
use uom::si::f64::{ElectricCurrent, Power};

/// The share of its full-load current a motor draws running unloaded at rated voltage (EASA's
/// rule of thumb, above; common practice).
pub const NO_LOAD_CURRENT_SHARE: f64 = 1.0 / 3.0;

/// What the motor draws from the line in one phase.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct LineDraw {
    #[serde(rename = "line_current_a")]
    pub current: ElectricCurrent,
    pub power_factor: f64,
}

/// The motor's full-load power factor: the nameplate's, else the one its rated output,
/// efficiency, voltage and current give (above 1 when those disagree: validation refuses it).
pub fn full_load_power_factor(motor: &Motor, rating: &ElectricalRating) -> f64 {
    rating.power_factor.unwrap_or_else(|| {
        motor.rated_power.value
            / (motor.full_load_efficiency
                * 3f64.sqrt()
                * rating.voltage.value
                * rating.full_load_current.value)
    })
}

/// What the motor draws from the line while it takes `input` and delivers `shaft`.
pub fn line_draw(motor: &Motor, rating: &ElectricalRating, input: Power, shaft: Power) -> LineDraw {
    let full = rating.full_load_current.value;
    let power_factor = full_load_power_factor(motor, rating).clamp(0.0, 1.0);
    let reactive_at_full_load = full * (1.0 - power_factor * power_factor).sqrt();
    let no_load = (full * NO_LOAD_CURRENT_SHARE).min(reactive_at_full_load);
    let load = shaft.value / motor.rated_power.value;
    let reactive = no_load + (reactive_at_full_load - no_load) * load * load;
    let active = input.value / (3f64.sqrt() * rating.voltage.value);
    let current = active.hypot(reactive);
    LineDraw {
        current: ElectricCurrent::new::<ampere>(current),
        power_factor: if current > 0.0 { active / current } else { 0.0 },
    }
}
