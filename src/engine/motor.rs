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

/// A published efficiency class, for a motor whose nameplate efficiency is not known.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum EfficiencyClass {
    /// IEC 60034-30-1 IE2, 4-pole, 50 Hz.
    Ie2,
    /// IEC 60034-30-1 IE3, 4-pole, 50 Hz.
    Ie3,
    /// IEC 60034-30-1 IE4, 4-pole, 50 Hz.
    Ie4,
    /// NEMA Premium (NEMA MG 1 Table 12-12), 4-pole, 60 Hz, enclosed.
    NemaPremium,
}

/// IEC 60034-30-1 nominal full-load efficiencies, 4-pole, 50 Hz (%), by rated kW.
const IEC_KW: [f64; 7] = [5.5, 7.5, 11.0, 15.0, 22.0, 30.0, 37.0];
const IE2: [f64; 7] = [87.7, 88.7, 89.8, 90.6, 91.6, 92.3, 92.7];
const IE3: [f64; 7] = [89.6, 90.4, 91.4, 92.1, 93.0, 93.6, 93.9];
const IE4: [f64; 7] = [91.9, 92.6, 93.3, 93.9, 94.5, 94.9, 95.2];
/// NEMA MG 1 Table 12-12, NEMA Premium, 4-pole, 60 Hz, enclosed (%), by rated hp.
const NEMA_HP: [f64; 7] = [10.0, 15.0, 20.0, 25.0, 30.0, 40.0, 50.0];
const NEMA_PREMIUM: [f64; 7] = [91.7, 92.4, 93.0, 93.6, 93.6, 94.1, 94.5];
/// IE3 4-pole between the table's sizes: eta = A x^3 + B x^2 + C x + D, x = log10(P / 1 kW)
/// (UK SI 2021/745 Schedule 16, Table 28).
const IE3_4_POLE: [f64; 4] = [0.0773, -1.8951, 9.2984, 83.7025];

/// A rating outside the sizes the class's table covers here: the nameplate figure is needed.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct OutsideTable {
    pub lowest_w: f64,
    pub highest_w: f64,
}

impl EfficiencyClass {
    /// The class's nominal full-load efficiency for a motor of `rated` (a fraction). At a
    /// table size, the table's figure; between sizes, the published formula for IE3, and for
    /// the others a straight line in log10 of power between the two neighbours (our choice:
    /// their formula coefficients are not among our references).
    pub fn nominal_efficiency(self, rated: Power) -> Result<f64, OutsideTable> {
        let w = rated.value;
        let (sizes_w, table): (Vec<f64>, &[f64]) = match self {
            EfficiencyClass::Ie2 => (IEC_KW.iter().map(|k| k * 1e3).collect(), &IE2),
            EfficiencyClass::Ie3 => (IEC_KW.iter().map(|k| k * 1e3).collect(), &IE3),
            EfficiencyClass::Ie4 => (IEC_KW.iter().map(|k| k * 1e3).collect(), &IE4),
            EfficiencyClass::NemaPremium => (
                NEMA_HP
                    .iter()
                    .map(|h| h * super::units::HORSEPOWER)
                    .collect(),
                &NEMA_PREMIUM,
            ),
        };
        let outside = OutsideTable {
            lowest_w: sizes_w[0],
            highest_w: sizes_w[sizes_w.len() - 1],
        };
        if !w.is_finite()
            || w < outside.lowest_w * (1.0 - 1e-9)
            || w > outside.highest_w * (1.0 + 1e-9)
        {
            return Err(outside);
        }
        if let Some(i) = sizes_w.iter().position(|s| (s - w).abs() <= s * 1e-6) {
            return Ok(table[i] / 100.0);
        }
        if self == EfficiencyClass::Ie3 {
            let x = (w / 1e3).log10();
            let [a, b, c, d] = IE3_4_POLE;
            return Ok((((a * x + b) * x + c) * x + d) / 100.0);
        }
        let i = sizes_w
            .iter()
            .position(|s| *s > w)
            .unwrap_or(sizes_w.len() - 1);
        let (x0, x1) = (sizes_w[i - 1].log10(), sizes_w[i].log10());
        let t = (w.log10() - x0) / (x1 - x0);
        Ok((table[i - 1] + t * (table[i] - table[i - 1])) / 100.0)
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
