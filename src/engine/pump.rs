//! Pumps on the motor's shaft.

use serde::{Deserialize, Serialize};
use uom::si::f64::{AngularVelocity, Power, Pressure, ThermodynamicTemperature, Volume};

/// A positive-displacement pump, fixed or pressure-compensated.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Pump {
    /// Volume per shaft revolution (the maximum, for a compensated pump).
    #[serde(rename = "displacement_m3_per_rev")]
    pub displacement: Volume,
    /// Actual over theoretical flow, as measured at `efficiency_pressure` and
    /// `efficiency_speed`. Internal leakage (slip) grows in proportion to pressure and hardly
    /// depends on shaft speed, so this one point fixes a leakage flow per unit of pressure: at a
    /// lower speed the same leakage is a larger share of a smaller swept flow.
    pub volumetric_efficiency: f64,
    #[serde(rename = "efficiency_pressure_pa")]
    pub efficiency_pressure: Pressure,
    /// The shaft speed the volumetric efficiency was stated at (absent: the speed of the motor
    /// that drives it in its design).
    #[serde(
        default,
        rename = "efficiency_speed_rad_per_s",
        skip_serializing_if = "Option::is_none"
    )]
    pub efficiency_speed: Option<AngularVelocity>,
    /// The oil temperature the volumetric efficiency was stated at (absent: whatever the
    /// job's working temperature is, so the leakage does not follow the oil's viscosity).
    #[serde(
        default,
        rename = "efficiency_oil_k",
        skip_serializing_if = "Option::is_none"
    )]
    pub efficiency_temperature: Option<ThermodynamicTemperature>,
    /// Theoretical over actual torque.
    pub hydromechanical_efficiency: f64,
    /// Shaft power the pump takes even with no pressure (churning, seals, bearings).
    #[serde(rename = "drag_power_w")]
    pub drag_power: Power,
    /// The maker's maximum continuous pressure.
    #[serde(rename = "rated_pressure_pa")]
    pub rated_pressure: Pressure,
    pub control: PumpControl,
}

#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "type", rename_all = "snake_case")]
pub enum PumpControl {
    /// Full displacement always.
    Fixed,
    /// Full displacement up to the compensator setting, then only what the circuit takes.
    Compensated {
        #[serde(rename = "setting_pa")]
        setting: Pressure,
    },
}

/// Over what share of its setting a compensator goes from full stroke to dead-head. A
/// modelling choice (common practice: a few percent), so the pump's flow falls steeply but
/// continuously and every phase has one operating pressure.
pub const COMPENSATOR_BAND: f64 = 0.03;

/// A pump at the motor's speed, in SI numbers: what the solver works with.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct PumpAtSpeed {
    /// Theoretical flow at full displacement, m^3/s.
    pub swept: f64,
    /// Leakage per pascal of outlet pressure, (m^3/s)/Pa.
    pub leakage: f64,
    pub hydromechanical: f64,
    pub drag: f64,
    pub compensator: Option<f64>,
}

impl Pump {
    /// The compensator setting a pump switched to pressure-compensated starts at: 80 % of its
    /// rated pressure, safely inside the rating, for the user to set (a starting value, not
    /// advice).
    pub fn first_compensator_setting(&self) -> Pressure {
        self.rated_pressure * 0.8
    }
}

impl PumpAtSpeed {
    /// `pump` turning at `revolutions_per_second`. Its leakage per pascal is fixed by the
    /// volumetric efficiency at the speed it was stated at (this speed, if none is given).
    pub fn new(pump: &Pump, revolutions_per_second: f64) -> PumpAtSpeed {
        let swept = pump.displacement.value * revolutions_per_second;
        let stated_at = pump
            .efficiency_speed
            .map_or(revolutions_per_second, |w| w.value / std::f64::consts::TAU);
        let swept_when_stated = pump.displacement.value * stated_at;
        PumpAtSpeed {
            swept,
            leakage: swept_when_stated * (1.0 - pump.volumetric_efficiency)
                / pump.efficiency_pressure.value,
            hydromechanical: pump.hydromechanical_efficiency,
            drag: pump.drag_power.value,
            compensator: match pump.control {
                PumpControl::Fixed => None,
                PumpControl::Compensated { setting } => Some(setting.value),
            },
        }
    }

    /// The flow delivered at an outlet pressure, m^3/s.
    pub fn delivered(&self, outlet: f64) -> f64 {
        match self.compensator {
            // Destroking: from the flow at the setting down to none across the band, in a
            // straight line (so that every flow stays piecewise linear in pressure).
            Some(setting) if outlet > setting => {
                let at_setting = (self.swept - self.leakage * setting).max(0.0);
                at_setting * (1.0 - (outlet - setting) / (setting * COMPENSATOR_BAND)).max(0.0)
            }
            _ => (self.swept - self.leakage * outlet).max(0.0),
        }
    }

    /// Outlet pressures at which `delivered` changes slope.
    pub fn breakpoints(&self) -> [f64; 3] {
        let dry = if self.leakage > 0.0 {
            self.swept / self.leakage
        } else {
            f64::INFINITY
        };
        match self.compensator {
            Some(setting) => [dry, setting, setting * (1.0 + COMPENSATOR_BAND)],
            None => [dry, f64::INFINITY, f64::INFINITY],
        }
    }

    /// Shaft power at an outlet pressure while delivering `delivered`, W. The displacement
    /// swept is what is delivered plus what leaks (a compensated pump destrokes to it).
    pub fn shaft_power(&self, outlet: f64, delivered: f64) -> f64 {
        let swept = match self.compensator {
            None => self.swept,
            Some(_) => (delivered + self.leakage * outlet).min(self.swept),
        };
        swept * outlet / self.hydromechanical + self.drag
    }
}
