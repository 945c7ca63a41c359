//! How a pump's motor is driven at a speed that follows the demand: an induction motor on a
//! frequency converter, or a servo motor and its drive. The converter's own losses, its
//! efficiency class, and the choices of how the machine holds and idles.
//!
//! IEC 61800-9-2 (and EN 50598-2 before it) states a converter's (CDM's) losses at eight
//! operating points of relative stator frequency and relative torque-producing current,
//! (0,25) (0,50) (0,100) (50,25) (50,50) (50,100) (90,50) (90,100), as a share of its rated
//! apparent output power, and classes it at (90,100) against the reference converter: IE1 is
//! the reference, IE2 more than 25 % below it, IE0 more than 25 % above it (as restated by
//! DigiKey's eMag vol. 15 and Emotron's note on the ecodesign changes). The reference
//! converter's (90,100) losses by rated apparent power are Regulation (EU) 2019/1781's Annex I
//! Table 6 ([`REFERENCE_CONVERTER_LOSSES`]). A converter is described by its class (its
//! (90,100) loss taken at the class's limit from that table) or by its maker's stated (90,100)
//! figure; the loss at other currents follows the constant + linear + square law of converter
//! losses in current (see [`VariableSpeed::converter_loss`]).
//!
//! The speed each phase runs at is the solve's choice (`solve::phase_speed`); this module
//! holds what the drive is and what it costs in losses.

use super::motor::Motor;
use serde::{Deserialize, Serialize};
use uom::si::f64::{AngularVelocity, Power};

/// A converter-fed motor's drive.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct VariableSpeed {
    pub kind: DriveKind,
    /// The slowest the pump may turn (its lubrication, the motor's cooling): the engine never
    /// chooses a lower speed.
    #[serde(rename = "min_speed_rad_per_s")]
    pub min_speed: AngularVelocity,
    /// The fastest the drive turns the pump.
    #[serde(rename = "max_speed_rad_per_s")]
    pub max_speed: AngularVelocity,
    /// The converter's rated apparent output power (VA, carried as watts' dimension).
    #[serde(rename = "converter_rating_va")]
    pub converter_rating: Power,
    /// What it loses at (90 % frequency, 100 % current).
    pub converter_loss: ConverterLoss,
    pub hold: HoldSpeed,
    pub idle: IdleSpeed,
    pub cooling: MotorCooling,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum DriveKind {
    /// An induction motor on a frequency inverter.
    InductionOnInverter,
    /// A servo motor (permanent-magnet) and its servo drive.
    Servo,
}

/// A converter's loss at (90,100), the figure IEC 61800-9-2 classes it by.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "from", rename_all = "snake_case")]
pub enum ConverterLoss {
    /// Its class only: the loss at the class's limit for its rating (the reference
    /// converter's for IE1, 25 % below it for IE2, 25 % above for IE0).
    Class { class: ConverterClass },
    /// The maker's stated loss at (90,100), as a share of the converter's rated apparent
    /// power.
    Stated { share: f64 },
    /// The maker's eight figures, as shares of the converter's rated apparent power, at
    /// [`STANDARD_POINTS`] in that order.
    Points { shares: [f64; 8] },
}

/// IEC 61800-9-2's eight operating points of a converter: (relative stator frequency, relative
/// torque-producing current), in percent.
pub const STANDARD_POINTS: [(f64, f64); 8] = [
    (0.0, 25.0),
    (0.0, 50.0),
    (0.0, 100.0),
    (50.0, 25.0),
    (50.0, 50.0),
    (50.0, 100.0),
    (90.0, 50.0),
    (90.0, 100.0),
];

/// The loss share at (`frequency`, `current`), in percent, from the eight figures at
/// [`STANDARD_POINTS`]: along each frequency's row, in straight lines between its currents
/// (beyond them, the nearest segment's line); the 90 % row, which has no 25 % point, below
/// 50 % follows the 50 % row's shape; between rows, a straight line in frequency (beyond 90 %,
/// the 50 to 90 % line, up to 100 %). Never below zero.
pub fn interpolate_points(shares: &[f64; 8], frequency: f64, current: f64) -> f64 {
    let line =
        |(x0, y0): (f64, f64), (x1, y1): (f64, f64), x: f64| y0 + (y1 - y0) * (x - x0) / (x1 - x0);
    let along = |a: f64, b: f64, c: f64, i: f64| {
        if i <= 50.0 {
            line((25.0, a), (50.0, b), i)
        } else {
            line((50.0, b), (100.0, c), i)
        }
    };
    let i = current.max(0.0);
    let row0 = along(shares[0], shares[1], shares[2], i);
    let row50 = along(shares[3], shares[4], shares[5], i);
    let row90 = if i < 50.0 {
        shares[6] + (row50 - shares[4])
    } else {
        line((50.0, shares[6]), (100.0, shares[7]), i)
    };
    let f = frequency.clamp(0.0, 100.0);
    let loss = if f <= 50.0 {
        line((0.0, row0), (50.0, row50), f)
    } else {
        line((50.0, row50), (90.0, row90), f)
    };
    loss.max(0.0)
}

/// How a hold is kept.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum HoldSpeed {
    /// At the minimum speed, the surplus flow over the relief.
    MinimumAgainstRelief,
    /// At the speed that just makes up the leakage at the hold pressure (not below the
    /// minimum): the drive holds the pressure, nothing crosses the relief.
    MakeUpLeakage,
}

/// What the drive does while the machine idles.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum IdleSpeed {
    Minimum,
    Stopped,
}

/// How the motor is cooled, which decides how slowly it may turn at full torque.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum MotorCooling {
    /// Its own shaft fan (TEFC): cooling falls with speed.
    SelfCooled,
    /// A separate, constant-speed fan.
    SeparateFan,
}

impl MotorCooling {
    /// How much a second at `speed_share` of base speed cools a self-cooled motor, against a
    /// second at base speed or above: its shaft fan's air falls with speed. Taken in a straight line
    /// from [`STOPPED_COOLING_SHARE`](super::motor::STOPPED_COOLING_SHARE) stopped to full cooling
    /// at [`MotorCooling::lowest_full_torque_speed_share`], so that full torque is carried
    /// continuously down to that speed and no lower (a modelling choice, marked as such, that
    /// meets the common-practice rating at its end).
    pub fn cooling_weight(self, speed_share: f64) -> f64 {
        match self {
            MotorCooling::SelfCooled => {
                let stopped = super::motor::STOPPED_COOLING_SHARE;
                let full = self.lowest_full_torque_speed_share();
                stopped + (1.0 - stopped) * (speed_share.max(0.0) / full).min(1.0)
            }
            // Its fan runs whatever the shaft does.
            MotorCooling::SeparateFan => 1.0,
        }
    }

    /// The lowest share of base speed at which the motor may carry full torque continuously.
    /// Common practice: a self-cooled motor only about 1/2 (general-purpose motors are rated
    /// 2:1 at constant torque, from memory of NEMA MG 1's usual reading); an inverter-duty
    /// motor with its own fan 1/10 (datasheets of inverter-duty motors state "MG 1 Part
    /// 31.4.4.2, constant torque range 10:1").
    pub fn lowest_full_torque_speed_share(self) -> f64 {
        match self {
            MotorCooling::SelfCooled => 0.5,
            MotorCooling::SeparateFan => 0.1,
        }
    }
}

/// The share of the converter's (90,100) losses that does not depend on the current (control,
/// fans, the DC link), the share in proportion to current (the semiconductors' threshold
/// voltage and switching) and the share in proportion to current squared (their resistance):
/// the constant + linear + square law converter losses follow in current (the form of
/// MatACDC's converter loss model, J. Beerten, KU Leuven). The shares are a modelling choice
/// from memory of power-electronics loss breakdowns, marked as such; a maker's eight figures
/// would replace them.
pub const CONVERTER_LOSS_SPLIT: [f64; 3] = [0.2, 0.5, 0.3];

/// The reference converter's (RCDM's) losses at (90,100): rated apparent output power (kVA)
/// and losses (kW). Regulation (EU) 2019/1781, Annex I, Table 6 (the same figures as the UK's
/// SI 2021/745, Schedule 16, Table 29), from IEC 61800-9-2's reference model.
pub const REFERENCE_CONVERTER_LOSSES: [(f64, f64); 38] = [
    (0.278, 0.100),
    (0.381, 0.104),
    (0.5, 0.109),
    (0.697, 0.117),
    (0.977, 0.129),
    (1.29, 0.142),
    (1.71, 0.163),
    (2.29, 0.188),
    (3.3, 0.237),
    (4.44, 0.299),
    (5.85, 0.374),
    (7.94, 0.477),
    (9.95, 0.581),
    (14.4, 0.781),
    (19.5, 1.01),
    (23.9, 1.21),
    (28.3, 1.41),
    (38.2, 1.86),
    (47.0, 2.25),
    (56.9, 2.70),
    (68.4, 3.24),
    (92.8, 4.35),
    (111.0, 5.17),
    (135.0, 5.55),
    (162.0, 6.65),
    (196.0, 8.02),
    (245.0, 10.0),
    (302.0, 12.4),
    (381.0, 15.6),
    (429.0, 17.5),
    (483.0, 19.8),
    (604.0, 24.7),
    (677.0, 27.6),
    (761.0, 31.1),
    (858.0, 35.0),
    (967.0, 39.4),
    (1088.0, 44.3),
    (1209.0, 49.3),
];

/// The reference converter's (90,100) losses (W) for a rating of `rating` VA: "if the apparent
/// output power of a VSD is between two values in Table 6, the higher power loss value ...
/// shall be used" (Regulation (EU) 2019/1781, Annex I); beyond the table's ends, its end.
pub fn reference_converter_loss(rating: f64) -> f64 {
    let kva = rating / 1e3;
    let last = REFERENCE_CONVERTER_LOSSES[REFERENCE_CONVERTER_LOSSES.len() - 1];
    let (_, kw) = REFERENCE_CONVERTER_LOSSES
        .iter()
        .find(|(size, _)| *size >= kva * (1.0 - 1e-9))
        .unwrap_or(&last);
    kw * 1e3
}

impl ConverterClass {
    /// The class's limit against the reference converter's losses: IE2 at most 0.75 of them
    /// ("the maximum power losses of the IE2 class are 25 % lower than the reference value",
    /// Regulation (EU) 2019/1781, Annex I), IE0 from 1.25.
    pub fn limit_share(self) -> f64 {
        match self {
            ConverterClass::IE0 => 1.25,
            ConverterClass::IE1 => 1.0,
            ConverterClass::IE2 => 0.75,
        }
    }
}

impl VariableSpeed {
    /// Where a drive newly put on `motor` starts, for the user to set (starting values, not
    /// advice): from a fifth of the motor's full-load speed up to it, a converter of the
    /// motor's own apparent power at IE2, holds kept by making up the leakage, idles at the
    /// slowest speed, the motor self-cooled.
    pub fn first_for(motor: &Motor) -> VariableSpeed {
        VariableSpeed {
            kind: DriveKind::InductionOnInverter,
            min_speed: motor.full_load_speed * 0.2,
            max_speed: motor.full_load_speed,
            converter_rating: Power::new::<uom::si::power::watt>(
                (motor_apparent_power(motor) / 100.0).ceil() * 100.0,
            ),
            converter_loss: ConverterLoss::Class {
                class: ConverterClass::IE2,
            },
            hold: HoldSpeed::MakeUpLeakage,
            idle: IdleSpeed::Minimum,
            cooling: MotorCooling::SelfCooled,
        }
    }

    /// The drive's speed range as shares of the motor's full-load (base) speed.
    pub fn speed_shares(&self, motor: &Motor) -> (f64, f64) {
        let base = motor.full_load_speed.value;
        (self.min_speed.value / base, self.max_speed.value / base)
    }

    /// The converter's losses at (90,100), W: its maker's figure, or its class's limit.
    pub fn stated_converter_loss(&self) -> f64 {
        let rating = self.converter_rating.value;
        match self.converter_loss {
            ConverterLoss::Stated { share } => rating * share,
            ConverterLoss::Points { shares } => rating * shares[7],
            ConverterLoss::Class { class } => {
                reference_converter_loss(rating) * class.limit_share()
            }
        }
    }

    /// The converter's losses (W) at `frequency_share` of the motor's base frequency while the
    /// motor gives `torque_share` of its rated torque. With the maker's eight figures, those
    /// interpolated ([`interpolate_points`]); with one figure or a class, its (90,100) loss
    /// spread over the relative current by [`CONVERTER_LOSS_SPLIT`] (the frequency's small
    /// effect left out, a simplification). The relative current is the torque share times the
    /// motor's rated apparent power over the converter's ([`motor_apparent_power`]).
    pub fn converter_loss(&self, frequency_share: f64, torque_share: f64, motor: &Motor) -> f64 {
        let current_share =
            torque_share.max(0.0) * motor_apparent_power(motor) / self.converter_rating.value;
        match self.converter_loss {
            ConverterLoss::Points { shares } => {
                self.converter_rating.value
                    * interpolate_points(&shares, frequency_share * 100.0, current_share * 100.0)
            }
            _ => self.converter_loss_at_current(current_share),
        }
    }

    /// The converter's losses (W) at a frequency share and a share of its rated torque-producing
    /// current: a standard point, as the drive's losses give it.
    pub fn converter_loss_at_point(&self, frequency_share: f64, current_share: f64) -> f64 {
        match self.converter_loss {
            ConverterLoss::Points { shares } => {
                self.converter_rating.value
                    * interpolate_points(&shares, frequency_share * 100.0, current_share * 100.0)
            }
            _ => self.converter_loss_at_current(current_share),
        }
    }

    /// The converter's losses (W) with `current_share` of its rated torque-producing current.
    pub fn converter_loss_at_current(&self, current_share: f64) -> f64 {
        let i = current_share.max(0.0);
        let [fixed, linear, square] = CONVERTER_LOSS_SPLIT;
        self.stated_converter_loss() * (fixed + linear * i + square * i * i)
    }
}

/// A typical full-load power factor of an induction motor, where its nameplate gives none
/// (common practice, from memory: four-pole motors of 5 to 50 kW are 0.8 to 0.88).
pub const TYPICAL_POWER_FACTOR: f64 = 0.85;

/// The motor's rated apparent input (VA): from its electrical nameplate, else its rated
/// output over its efficiency and [`TYPICAL_POWER_FACTOR`].
pub fn motor_apparent_power(motor: &Motor) -> f64 {
    let power_factor = motor
        .electrical
        .as_ref()
        .map_or(TYPICAL_POWER_FACTOR, |rating| {
            super::electrical::full_load_power_factor(motor, rating).clamp(0.1, 1.0)
        });
    motor.rated_power.value / (motor.full_load_efficiency * power_factor)
}

/// IEC 61800-9-2's efficiency classes of a converter, at (90,100) against the reference.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub enum ConverterClass {
    #[serde(rename = "ie0")]
    IE0,
    #[serde(rename = "ie1")]
    IE1,
    #[serde(rename = "ie2")]
    IE2,
}

/// The class of a converter whose (90,100) losses are `losses` where the reference
/// converter's are `reference`: more than 25 % below it IE2, more than 25 % above it IE0.
pub fn converter_class(losses: f64, reference: f64) -> ConverterClass {
    if losses < 0.75 * reference {
        ConverterClass::IE2
    } else if losses > 1.25 * reference {
        ConverterClass::IE0
    } else {
        ConverterClass::IE1
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use uom::si::angular_velocity::revolution_per_minute;
    use uom::si::power::kilowatt;

    fn drive(loss_share: f64) -> VariableSpeed {
        VariableSpeed {
            kind: DriveKind::InductionOnInverter,
            min_speed: AngularVelocity::new::<revolution_per_minute>(300.0),
            max_speed: AngularVelocity::new::<revolution_per_minute>(1800.0),
            converter_rating: Power::new::<kilowatt>(25.0),
            converter_loss: ConverterLoss::Stated { share: loss_share },
            hold: HoldSpeed::MakeUpLeakage,
            idle: IdleSpeed::Minimum,
            cooling: MotorCooling::SelfCooled,
        }
    }

    /// IEC 61800-9-2's classes (as restated by DigiKey's eMag vol. 15): "A CDM with greater
    /// than 25% lower losses than the RCDM is classified as IE2, and a CDM with greater than
    /// 25% higher losses than the RCDM is classified as IE0."
    #[test]
    fn converter_classes_sit_25_percent_either_side_of_the_reference() {
        assert_eq!(converter_class(0.74, 1.0), ConverterClass::IE2);
        assert_eq!(converter_class(0.75, 1.0), ConverterClass::IE1);
        assert_eq!(converter_class(1.25, 1.0), ConverterClass::IE1);
        assert_eq!(converter_class(1.26, 1.0), ConverterClass::IE0);
    }

    /// Regulation (EU) 2019/1781, Annex I, Table 6: the reference converter of 28.3 kVA loses
    /// 1.41 kW at (90,100), and "the maximum power losses of the IE2 class are 25 % lower than
    /// the reference value": 1.0575 kW. Between two sizes "the higher power loss value" is
    /// used: 25 kVA counts as 28.3.
    #[test]
    fn class_losses_come_from_the_regulation_s_reference_table() {
        let mut d = drive(0.0);
        d.converter_rating = Power::new::<kilowatt>(28.3);
        d.converter_loss = ConverterLoss::Class {
            class: ConverterClass::IE1,
        };
        assert!((d.stated_converter_loss() - 1410.0).abs() < 1e-9);
        d.converter_loss = ConverterLoss::Class {
            class: ConverterClass::IE2,
        };
        assert!((d.stated_converter_loss() - 1057.5).abs() < 1e-9);
        d.converter_rating = Power::new::<kilowatt>(25.0);
        assert!((d.stated_converter_loss() - 1057.5).abs() < 1e-9);
        // The table's ends hold beyond it.
        assert!((reference_converter_loss(100.0) - 100.0).abs() < 1e-9);
        assert!((reference_converter_loss(2e6) - 49_300.0).abs() < 1e-9);
        // Bigger converters lose more (the table as typed keeps its order).
        for pair in REFERENCE_CONVERTER_LOSSES.windows(2) {
            assert!(pair[1].0 > pair[0].0 && pair[1].1 > pair[0].1, "{pair:?}");
        }
    }

    /// The eight figures are met at their own points, and in between the loss follows straight
    /// lines (values invented for the check, not a maker's).
    #[test]
    fn eight_figures_are_met_at_their_points_and_joined_by_straight_lines() {
        let shares = [0.010, 0.012, 0.018, 0.011, 0.014, 0.021, 0.016, 0.024];
        for (k, (f, i)) in STANDARD_POINTS.iter().enumerate() {
            assert!(
                (interpolate_points(&shares, *f, *i) - shares[k]).abs() < 1e-15,
                "{k}"
            );
        }
        // Halfway between (50,50) and (50,100); and between the 0 and 50 % rows at 25 % frequency.
        assert!((interpolate_points(&shares, 50.0, 75.0) - 0.0175).abs() < 1e-15);
        assert!((interpolate_points(&shares, 25.0, 50.0) - 0.013).abs() < 1e-15);
        // The 90 % row below 50 % current follows the 50 % row's shape.
        assert!((interpolate_points(&shares, 90.0, 25.0) - (0.016 + 0.011 - 0.014)).abs() < 1e-15);
        let mut d = drive(0.0);
        d.converter_loss = ConverterLoss::Points { shares };
        assert!((d.stated_converter_loss() - 0.024 * 25e3).abs() < 1e-9);
    }

    /// At full current the converter loses what its maker states at (90,100); with no current
    /// it keeps its fixed share; losses rise with current.
    #[test]
    fn the_stated_loss_is_met_at_full_current() {
        let d = drive(0.025);
        assert!((d.converter_loss_at_current(1.0) - 625.0).abs() < 1e-9);
        assert!((d.converter_loss_at_current(0.0) - 0.2 * 625.0).abs() < 1e-9);
        let mut last = 0.0;
        for i in 0..=10 {
            let loss = d.converter_loss_at_current(f64::from(i) / 10.0);
            assert!(loss > last);
            last = loss;
        }
    }
}
