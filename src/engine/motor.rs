//! The electric motor that drives the pumps.

use super::units::watts;
use serde::{Deserialize, Serialize};
use uom::si::f64::{AngularVelocity, ElectricCurrent, ElectricPotential, Power};

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
    /// The electrical side of the nameplate, when entered: the line current and power factor
    /// of each phase are then predicted ([`super::electrical`]).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub electrical: Option<ElectricalRating>,
}

/// A three-phase motor's electrical nameplate.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct ElectricalRating {
    /// Rated line-to-line voltage (the one the motor is connected for).
    #[serde(rename = "voltage_v")]
    pub voltage: ElectricPotential,
    /// Full-load line current at that voltage.
    #[serde(rename = "full_load_current_a")]
    pub full_load_current: ElectricCurrent,
    /// Full-load power factor, when the nameplate gives one; otherwise it follows from the
    /// rest of the nameplate ([`super::electrical::full_load_power_factor`]).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub power_factor: Option<f64>,
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

/// How much a second with the motor stopped counts, against a second running, in the time
/// the RMS load is averaged over: a stopped self-ventilated (TEFC) motor has lost its fan and
/// sheds its heat about a third as fast (common practice, from memory; no published source at
/// hand). A motor with a separate fan cools as well stopped, so this is the cautious figure.
pub const STOPPED_COOLING_SHARE: f64 = 1.0 / 3.0;

/// The longest cycle the RMS load sizes a motor for (s): the method assumes the cycle is short
/// against the motor's heating time, so that its temperature follows the average of the
/// losses. "The rms horsepower loading method works only for duty cycles less than five
/// minutes" (Machine Design, "MSD 101: Motors and actuators", material from E. Cowern, Baldor
/// Electric).
pub const RMS_LONGEST_CYCLE_S: f64 = 300.0;

impl Motor {
    /// The motor's own loss while it delivers `shaft` watts.
    pub fn loss(&self, shaft: f64) -> f64 {
        self.loss_at_speed(shaft, 1.0)
    }

    /// The motor's own loss while it delivers `shaft` watts at `speed_share` of its full-load
    /// speed (on a variable-speed drive). The fixed share of the full-load loss (iron,
    /// friction and windage) is taken in proportion to speed, the rest (copper) to torque
    /// squared: a simplification of the loss split behind IEC 60034-2-3's interpolation,
    /// marked as such. At full speed it is [`Motor::loss`].
    pub fn loss_at_speed(&self, shaft: f64, speed_share: f64) -> f64 {
        let rated = self.rated_power.value;
        let full_load_loss = rated * (1.0 / self.full_load_efficiency - 1.0);
        let speed = speed_share.max(f64::MIN_POSITIVE);
        let torque = shaft / rated / speed;
        full_load_loss
            * (self.fixed_loss_share * speed_share.max(0.0)
                + (1.0 - self.fixed_loss_share) * torque * torque)
    }

    /// Shaft speed in revolutions per second.
    pub fn revolutions_per_second(&self) -> f64 {
        self.full_load_speed.value / std::f64::consts::TAU
    }
}

/// The most full-load slip inferred for a motor whose synchronous speed is not entered, as a
/// share of the synchronous speed (common practice, from memory: nameplate slip is about 1 to
/// 5 %, up to about 8 % on small motors). A full-load speed further below every synchronous
/// speed (a round 1500 or 1000 rpm, say) is taken as having no slip known.
pub const MOST_NAMEPLATE_SLIP: f64 = 0.08;

/// The synchronous speed (rad/s) of a motor with this full-load speed: the entered one (when
/// above the full-load speed), else (common practice) the lowest of 120 f / poles for a 50 or
/// 60 Hz supply above the full-load speed, if the full-load speed is within
/// [`MOST_NAMEPLATE_SLIP`] of it. None: no slip can be worked out.
pub fn synchronous_speed(
    full_load: AngularVelocity,
    entered: Option<AngularVelocity>,
) -> Option<f64> {
    let full_load = full_load.value;
    if let Some(entered) = entered {
        return (entered.value > full_load).then_some(entered.value);
    }
    // 120 f / poles in rpm is f / pole pairs in revolutions per second.
    [50.0, 60.0]
        .into_iter()
        .flat_map(|hz: f64| (1..=6).map(move |pairs| hz * std::f64::consts::TAU / f64::from(pairs)))
        .filter(|s| *s > full_load * (1.0 + 1e-9))
        .min_by(f64::total_cmp)
        .filter(|s| (s - full_load) / s <= MOST_NAMEPLATE_SLIP)
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
    pub lowest: Power,
    pub highest: Power,
}

impl EfficiencyClass {
    /// The class as its standard names it.
    pub fn name(self) -> &'static str {
        match self {
            EfficiencyClass::Ie2 => "IE2",
            EfficiencyClass::Ie3 => "IE3",
            EfficiencyClass::Ie4 => "IE4",
            EfficiencyClass::NemaPremium => "NEMA Premium",
        }
    }

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
            lowest: watts(sizes_w[0]),
            highest: watts(sizes_w[sizes_w.len() - 1]),
        };
        if !w.is_finite()
            || w < outside.lowest.value * (1.0 - 1e-9)
            || w > outside.highest.value * (1.0 + 1e-9)
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

    /// The class's nominal full-load efficiency for `rated`, as [`Self::nominal_efficiency`],
    /// but a rating outside the table takes the figure of the table's nearest end (the staging
    /// search's motors, which run from 0.37 to 200 kW and 0.5 to 250 hp). Our choice: below
    /// the table it overstates a small motor's efficiency (a smaller motor of a class is less
    /// efficient), above it it understates a large one's; the tables at hand stop there.
    pub fn nominal_efficiency_or_nearest(self, rated: Power) -> f64 {
        match self.nominal_efficiency(rated) {
            Ok(efficiency) => efficiency,
            Err(range) => {
                let (first, last) = match self {
                    EfficiencyClass::Ie2 => (IE2[0], IE2[6]),
                    EfficiencyClass::Ie3 => (IE3[0], IE3[6]),
                    EfficiencyClass::Ie4 => (IE4[0], IE4[6]),
                    EfficiencyClass::NemaPremium => (NEMA_PREMIUM[0], NEMA_PREMIUM[6]),
                };
                if rated.value > range.highest.value {
                    last / 100.0
                } else {
                    first / 100.0
                }
            }
        }
    }
}

/// Motor starts an hour a motor may take, by rated hp, for 2-, 4- and 6-pole NEMA Design A
/// and B motors (NEMA MG 10-2001, Table 2-3, column A, as reproduced in EASA's Electrical
/// Engineering Handbook, "Allowable starts and starting intervals"). The table holds for a
/// load whose torque while starting is at most rated torque varying with the square of speed
/// and whose inertia is within its column B: a pump started unloaded, whose inertia is small
/// (our judgement; a flywheel or a large pump needs the maker's figure).
const STARTS_HP: [f64; 20] = [
    1.0, 1.5, 2.0, 3.0, 5.0, 7.5, 10.0, 15.0, 20.0, 25.0, 30.0, 40.0, 50.0, 60.0, 75.0, 100.0,
    125.0, 150.0, 200.0, 250.0,
];
const STARTS_2_POLE: [f64; 20] = [
    15.0, 12.9, 11.5, 9.9, 8.1, 7.0, 6.2, 5.4, 4.8, 4.4, 4.1, 3.7, 3.4, 3.2, 2.9, 2.6, 2.4, 2.2,
    2.0, 1.8,
];
const STARTS_4_POLE: [f64; 20] = [
    30.0, 25.7, 23.0, 19.8, 16.3, 13.9, 12.5, 10.7, 9.6, 8.8, 8.2, 7.4, 6.8, 6.3, 5.8, 5.2, 4.8,
    4.5, 4.0, 3.7,
];
const STARTS_6_POLE: [f64; 20] = [
    34.0, 29.1, 26.1, 22.4, 18.4, 15.8, 14.2, 12.1, 10.9, 10.0, 9.3, 8.4, 7.7, 7.2, 6.6, 5.9, 5.4,
    5.1, 4.5, 4.2,
];

impl Motor {
    /// How many times an hour the motor may be started (NEMA MG 10's table above). The poles
    /// follow from the full-load speed: above 2400 rpm 2 poles (synchronous 3000 or 3600
    /// rpm), above 1300 rpm 4 (1500 or 1800), else 6 (1000 or 1200; slower motors, with more
    /// poles, are taken as 6-pole). A rating counts as the smallest table size it does not
    /// exceed by more than 1 % (so 7.5 kW, 10.06 hp, is the 10 hp row); below 1 hp the 1 hp
    /// row (cautious: smaller motors may start more often); above 250 hp the 250 hp row (not
    /// cautious: the motor's maker must say).
    pub fn allowed_starts_per_hour(&self) -> f64 {
        let rpm = self.revolutions_per_second() * 60.0;
        let row = if rpm > 2400.0 {
            &STARTS_2_POLE
        } else if rpm > 1300.0 {
            &STARTS_4_POLE
        } else {
            &STARTS_6_POLE
        };
        let hp = self.rated_power.value / super::units::HORSEPOWER;
        let i = STARTS_HP
            .iter()
            .position(|size| *size * 1.01 >= hp)
            .unwrap_or(STARTS_HP.len() - 1);
        row[i]
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
            electrical: None,
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
    fn outside_its_table_a_class_takes_the_nearest_ends_figure() {
        // IEC 60034-30-1 IE3 4-pole: 89.6 % at 5.5 kW, 93.9 % at 37 kW; NEMA MG 1 Table 12-12
        // NEMA Premium: 91.7 % at 10 hp, 94.5 % at 50 hp (60 Hz, 4-pole, enclosed).
        let kw = |v: f64| Power::new::<kilowatt>(v);
        let hp = |v: f64| Power::new::<uom::si::power::watt>(v * super::super::units::HORSEPOWER);
        let close = |a: f64, b: f64| assert!((a - b).abs() < 1e-12, "{a} against {b}");
        let ie3 = EfficiencyClass::Ie3;
        close(ie3.nominal_efficiency_or_nearest(kw(3.0)), 0.896);
        close(ie3.nominal_efficiency_or_nearest(kw(90.0)), 0.939);
        close(ie3.nominal_efficiency_or_nearest(kw(f64::NAN)), 0.896);
        let nema = EfficiencyClass::NemaPremium;
        close(nema.nominal_efficiency_or_nearest(hp(5.0)), 0.917);
        close(nema.nominal_efficiency_or_nearest(hp(100.0)), 0.945);
        // Inside the table, the table (or its formula) as before.
        for w in [kw(5.5), kw(9.0), kw(37.0)] {
            assert_eq!(
                Ok(ie3.nominal_efficiency_or_nearest(w)),
                ie3.nominal_efficiency(w)
            );
        }
    }

    #[test]
    fn allowed_starts_follow_the_size_and_the_poles() {
        // NEMA MG 10-2001, Table 2-3, column A (as reproduced in EASA's Electrical Engineering
        // Handbook): 4-pole 10 hp 12.5, 7.5 hp 13.9, 1 hp 30, 250 hp 3.7; 2-pole 10 hp 6.2;
        // 6-pole 10 hp 14.2 starts an hour.
        let at = |kw: f64, rpm: f64| Motor {
            rated_power: Power::new::<kilowatt>(kw),
            full_load_speed: AngularVelocity::new::<revolution_per_minute>(rpm),
            ..motor(0.35)
        };
        // 7.5 kW is 10.06 hp: the 10 hp row; 4 kW (5.36 hp) the 7.5 hp row.
        assert_eq!(at(7.5, 1450.0).allowed_starts_per_hour(), 12.5);
        assert_eq!(at(7.5, 1750.0).allowed_starts_per_hour(), 12.5);
        assert_eq!(at(4.0, 1450.0).allowed_starts_per_hour(), 13.9);
        assert_eq!(at(7.5, 2900.0).allowed_starts_per_hour(), 6.2);
        assert_eq!(at(7.5, 960.0).allowed_starts_per_hour(), 14.2);
        assert_eq!(at(7.5, 1160.0).allowed_starts_per_hour(), 14.2);
        // Below 1 hp the 1 hp row; above 250 hp the 250 hp row.
        assert_eq!(at(0.37, 1450.0).allowed_starts_per_hour(), 30.0);
        assert_eq!(at(200.0, 1450.0).allowed_starts_per_hour(), 3.7);
    }

    #[test]
    fn speed_in_revolutions_per_second() {
        assert!((motor(0.3).revolutions_per_second() - 1460.0 / 60.0).abs() < 1e-12);
    }

    /// At full speed the loss at speed and torque is the fixed-speed model's; at half speed
    /// and the same torque the copper loss stays and the fixed part halves (worked by hand:
    /// 15 kW at 92 %, fixed share 0.35: full-load loss 1304.3 W; at 7.5 kW and half speed,
    /// 0.35 x 0.5 + 0.65 x 1 = 0.825 of it, 1076.1 W).
    #[test]
    fn the_loss_at_speed_falls_to_the_fixed_speed_model_at_full_speed() {
        let m = Motor {
            full_load_efficiency: 0.92,
            ..motor(0.35)
        };
        for shaft in [0.0, 3_000.0, 15_000.0] {
            assert!((m.loss_at_speed(shaft, 1.0) - m.loss(shaft)).abs() < 1e-9);
        }
        let full = 15_000.0 * (1.0 / 0.92 - 1.0);
        let half = m.loss_at_speed(7_500.0, 0.5);
        assert!((half - 0.825 * full).abs() < 1e-9, "{half}");
        assert!(m.loss_at_speed(0.0, 0.0) == 0.0);
    }
}
