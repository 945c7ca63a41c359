//! The electric motor that drives the pumps.

use serde::{Deserialize, Serialize};
use uom::si::f64::{AngularVelocity, Power};

#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Motor {
    /// Rated shaft output.
    #[serde(rename = "rated_power_w")]
    pub rated_power: Power,
    /// Shaft speed at full load; the pumps turn at it in every phase (slip is neglected).
    #[serde(rename = "full_load_speed_rad_per_s")]
    pub full_load_speed: AngularVelocity,
    /// Shaft output over electrical input at rated load.
    pub full_load_efficiency: f64,
    /// The share of the full-load loss that is fixed (iron, friction, windage): it is drawn
    /// even unloaded. The rest grows with the square of the load (copper losses).
    pub fixed_loss_share: f64,
    /// Multiplier on rated power giving the permissible continuous load (NEMA MG 1, 1.42):
    /// the RMS load over the cycle may reach rating x service factor.
    pub service_factor: f64,
    /// Multiplier on rated power the motor may carry for the short peak of a cycle (absent in
    /// older files: [`TYPICAL_PEAK_ALLOWANCE`]). The motor's breakdown torque and the maker
    /// decide; a peak above it stalls or trips the motor.
    #[serde(default = "typical_peak_allowance")]
    pub peak_allowance: f64,
}

/// How far over its rating a motor is commonly let run for a short peak (common practice:
/// about 1.25; induction motors' breakdown torque is usually two to three times rated, so
/// this leaves margin for low supply voltage and heating).
pub const TYPICAL_PEAK_ALLOWANCE: f64 = 1.25;

fn typical_peak_allowance() -> f64 {
    TYPICAL_PEAK_ALLOWANCE
}

/// A typical fixed share of a motor's full-load loss (common practice, roughly a third).
pub const TYPICAL_FIXED_LOSS_SHARE: f64 = 0.35;

impl Motor {
    /// The motor's own loss while it delivers `shaft` watts.
    pub fn loss(&self, shaft: f64) -> f64 {
        let rated = self.rated_power.value;
        let full_load_loss = rated * (1.0 / self.full_load_efficiency - 1.0);
        let load = shaft / rated;
        full_load_loss * (self.fixed_loss_share + (1.0 - self.fixed_loss_share) * load * load)
    }

    /// Shaft speed in revolutions per second.
    pub fn revolutions_per_second(&self) -> f64 {
        self.full_load_speed.value / std::f64::consts::TAU
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use uom::si::angular_velocity::revolution_per_minute;
    use uom::si::power::kilowatt;

    fn motor(share: f64) -> Motor {
        Motor {
            rated_power: Power::new::<kilowatt>(15.0),
            full_load_speed: AngularVelocity::new::<revolution_per_minute>(1460.0),
            full_load_efficiency: 0.921,
            fixed_loss_share: share,
            service_factor: 1.0,
            peak_allowance: TYPICAL_PEAK_ALLOWANCE,
        }
    }

    #[test]
    fn at_rated_load_the_efficiency_is_the_full_load_one() {
        for share in [0.0, 0.35, 1.0] {
            let m = motor(share);
            let shaft = 15_000.0;
            let efficiency = shaft / (shaft + m.loss(shaft));
            assert!((efficiency - 0.921).abs() < 1e-12, "{share}: {efficiency}");
        }
    }

    #[test]
    fn part_load_efficiency_falls_and_no_load_draws_the_fixed_loss() {
        let m = motor(0.35);
        let full_load_loss = 15_000.0 * (1.0 / 0.921 - 1.0);
        assert!((m.loss(0.0) - 0.35 * full_load_loss).abs() < 1e-9);
        let eff = |p: f64| p / (p + m.loss(p));
        assert!(eff(3_000.0) < eff(7_500.0) && eff(7_500.0) < 0.95);
    }

    #[test]
    fn speed_in_revolutions_per_second() {
        assert!((motor(0.3).revolutions_per_second() - 1460.0 / 60.0).abs() < 1e-12);
    }
}
