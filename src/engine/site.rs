//! Where the machine runs and what it runs on: the site's economics and the oil. Kept in the
//! job; below every algorithm that reads them.

use super::viscosity::OilViscosity;
use serde::{Deserialize, Serialize};
use uom::si::f64::{MassDensity, SpecificHeatCapacity, ThermodynamicTemperature, Volume};
use uom::si::mass_density::kilogram_per_cubic_meter;
use uom::si::specific_heat_capacity::joule_per_kilogram_kelvin;

/// Where the machine is and what running it costs.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Site {
    /// The customer or plant and the machine's place in it, as the user writes it.
    #[serde(default)]
    pub location: String,
    /// Hours a year the machine cycles.
    pub operating_hours_per_year: f64,
    /// Price of a kilowatt-hour, in `currency`.
    pub tariff_per_kwh: f64,
    /// A label only: "EUR", "USD", "£".
    pub currency: String,
    /// What the retrofit from the baseline design to the others costs, in `currency`.
    pub retrofit_price: f64,
    /// The grid's emission factor, kg CO2 per kWh, for the yearly CO2 of each design (absent:
    /// not shown). The user enters the figure their utility or national inventory publishes.
    #[serde(
        default,
        rename = "grid_kg_co2_per_kwh",
        skip_serializing_if = "Option::is_none"
    )]
    pub grid_factor: Option<f64>,
    /// What the utility charges a month per kW of billed demand, in `currency` (absent: the
    /// tariff has no demand charge). Demand is billed as the highest average power over the
    /// tariff's demand interval ([`DEMAND_INTERVAL_S`]).
    #[serde(
        default,
        rename = "demand_charge_per_kw_month",
        skip_serializing_if = "Option::is_none"
    )]
    pub demand_charge: Option<f64>,
    /// The power factor below which the tariff charges for reactive power (absent: it does
    /// not, or it is not known). Tariffs commonly set 0.85 or 0.90 (UConn ITAC, "Power Factor
    /// Correction").
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub power_factor_threshold: Option<f64>,
}

/// The interval a utility's demand meter averages power over (common practice: 15 minutes in
/// most tariffs, 30 in some; the site's tariff says). A machine whose cycle is shorter is billed
/// about its average power, not its peak.
pub const DEMAND_INTERVAL_S: f64 = 15.0 * 60.0;

/// The oil: how much, how it stores heat, how thick it is and how hot it works.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Oil {
    /// Oil in circulation (the reservoir's working volume).
    #[serde(rename = "volume_m3")]
    pub volume: Volume,
    #[serde(rename = "density_kg_per_m3")]
    pub density: MassDensity,
    #[serde(rename = "specific_heat_j_per_kg_k")]
    pub specific_heat: SpecificHeatCapacity,
    /// Its grade and index, or two measured viscosities (absent in older files: a common
    /// mineral oil, [`COMMON_MINERAL_OIL`](super::viscosity::COMMON_MINERAL_OIL)).
    #[serde(default, skip_serializing_if = "is_common_oil")]
    pub viscosity: OilViscosity,
    /// The temperature the cycle is worked out at (absent in older files: entered,
    /// [`USUAL_WORKING_TEMPERATURE_C`]).
    #[serde(default, skip_serializing_if = "is_usual_temperature")]
    pub working_temperature: WorkingTemperature,
    /// The temperature a cooler should hold the oil at, for the cooler size needed (absent:
    /// [`USUAL_TARGET_C`]).
    #[serde(
        default = "usual_target",
        rename = "target_k",
        skip_serializing_if = "is_usual_target"
    )]
    pub target_temperature: ThermodynamicTemperature,
}

// Defaults are left out of a file, so a job that says nothing of its oil's grade or
// temperatures keeps its links and QR codes as short as before.
fn is_common_oil(v: &OilViscosity) -> bool {
    *v == OilViscosity::default()
}

fn is_usual_temperature(t: &WorkingTemperature) -> bool {
    *t == WorkingTemperature::default()
}

fn is_usual_target(t: &ThermodynamicTemperature) -> bool {
    *t == usual_target()
}

/// How hot the oil is while the cycle runs.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "set_by", rename_all = "snake_case")]
pub enum WorkingTemperature {
    /// As the user read it off the tank's thermometer.
    Entered {
        #[serde(rename = "temperature_k")]
        temperature: ThermodynamicTemperature,
    },
    /// Where the heat balance settles it (the job needs its tank).
    Settled,
}

/// Mineral-oil systems commonly run at 40 to 60 degC (common practice): the middle, for jobs
/// that say nothing of theirs.
pub const USUAL_WORKING_TEMPERATURE_C: f64 = 50.0;

/// A cooler is commonly sized to hold the tank at about 50 to 55 degC, inside the 60 degC that
/// keeps mineral oil long-lived (common practice).
pub const USUAL_TARGET_C: f64 = 55.0;

fn celsius(c: f64) -> ThermodynamicTemperature {
    ThermodynamicTemperature::new::<uom::si::thermodynamic_temperature::degree_celsius>(c)
}

fn usual_target() -> ThermodynamicTemperature {
    celsius(USUAL_TARGET_C)
}

impl WorkingTemperature {
    /// [`USUAL_WORKING_TEMPERATURE_C`] in kelvin.
    pub fn default_kelvin() -> f64 {
        USUAL_WORKING_TEMPERATURE_C + 273.15
    }
}

impl Default for WorkingTemperature {
    fn default() -> Self {
        WorkingTemperature::Entered {
            temperature: celsius(USUAL_WORKING_TEMPERATURE_C),
        }
    }
}

impl Oil {
    /// Mineral oil with the working values of Esposito, *Fluid Power with Applications*
    /// (density 895 kg/m^3, specific heat 1.8 kJ/(kg.K)), of a common grade, worked out at a
    /// usual temperature.
    pub fn mineral(volume: Volume) -> Oil {
        Oil {
            volume,
            density: MassDensity::new::<kilogram_per_cubic_meter>(895.0),
            specific_heat: SpecificHeatCapacity::new::<joule_per_kilogram_kelvin>(1800.0),
            viscosity: OilViscosity::default(),
            working_temperature: WorkingTemperature::default(),
            target_temperature: usual_target(),
        }
    }

    /// What the oil stores per kelvin, J/K.
    pub fn heat_capacity(&self) -> f64 {
        self.volume.value * self.density.value * self.specific_heat.value
    }
}
