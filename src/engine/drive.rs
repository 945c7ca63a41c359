//! How a pump's motor is driven at a speed that follows the demand: an induction motor on a
//! frequency converter, or a servo motor and its drive. The converter's own losses, its
//! efficiency class, and the choices of how the machine holds and idles.
//!
//! IEC 61800-9-2 (and EN 50598-2 before it) states a converter's (CDM's) losses at eight
//! operating points of relative stator frequency and relative torque-producing current,
//! (0,25) (0,50) (0,100) (50,25) (50,50) (50,100) (90,50) (90,100), as a share of its rated
//! apparent output power, and classes it at (90,100) against the reference converter: IE1 is
//! the reference, IE2 more than 25 % below it, IE0 more than 25 % above it (as restated by
//! DigiKey's eMag vol. 15 and Emotron's note on the ecodesign changes). Makers publish the
//! eight figures; the model here takes the (90,100) one and spreads it over current (see
//! [`VariableSpeed::converter_loss`]). Not yet used by the solve.

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
    /// Its losses at (90 % frequency, 100 % current), as a share of that rating: the figure
    /// IEC 61800-9-2 has makers state.
    pub converter_loss_share: f64,
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
/// fans, the DC link), the share in proportion to current (switching and the semiconductors'
/// threshold voltage) and the share in proportion to current squared (their resistance). A
/// modelling choice from memory of power-electronics loss breakdowns, marked as such; a
/// maker's eight figures would replace it.
pub const CONVERTER_LOSS_SPLIT: [f64; 3] = [0.2, 0.5, 0.3];

impl VariableSpeed {
    /// The converter's losses (W) with `current_share` of its rated torque-producing current:
    /// its stated (90,100) loss spread by [`CONVERTER_LOSS_SPLIT`] (the frequency's small
    /// effect is left out, a simplification).
    pub fn converter_loss(&self, current_share: f64) -> f64 {
        let stated = self.converter_rating.value * self.converter_loss_share;
        let i = current_share.max(0.0);
        let [fixed, linear, square] = CONVERTER_LOSS_SPLIT;
        stated * (fixed + linear * i + square * i * i)
    }
}

/// IEC 61800-9-2's efficiency classes of a converter, at (90,100) against the reference.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
pub enum ConverterClass {
    IE0,
    IE1,
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
            converter_loss_share: loss_share,
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

    /// At full current the converter loses what its maker states at (90,100); with no current
    /// it keeps its fixed share; losses rise with current.
    #[test]
    fn the_stated_loss_is_met_at_full_current() {
        let d = drive(0.025);
        assert!((d.converter_loss(1.0) - 625.0).abs() < 1e-9);
        assert!((d.converter_loss(0.0) - 0.2 * 625.0).abs() < 1e-9);
        let mut last = 0.0;
        for i in 0..=10 {
            let loss = d.converter_loss(f64::from(i) / 10.0);
            assert!(loss > last);
            last = loss;
        }
    }
}
