//! A job: one machine's cycle, the power-unit designs compared on it, the site's economics
//! and the oil. This is what is saved, exported and shared.

use super::cycle::Phase;
use super::power_unit::Design;
use super::units::UnitSystem;
use serde::{Deserialize, Serialize};
use uom::si::f64::{MassDensity, SpecificHeatCapacity, Volume};
use uom::si::mass_density::kilogram_per_cubic_meter;
use uom::si::specific_heat_capacity::joule_per_kilogram_kelvin;

/// The job file format's version. Raise it on any change a previous version could not read,
/// and add the migration (see DEVELOPERS.md, "Job file format").
pub const SCHEMA_VERSION: u32 = 1;

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Job {
    pub schema_version: u32,
    pub name: String,
    #[serde(default)]
    pub notes: String,
    /// How the job is shown; the engine always works in SI.
    #[serde(default)]
    pub units: UnitSystem,
    pub cycle: Vec<Phase>,
    /// The first design is the baseline ("as found") the others are compared with.
    pub designs: Vec<Design>,
    pub site: Site,
    pub oil: Oil,
}

/// What running the machine costs.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Site {
    /// Hours a year the machine cycles.
    pub operating_hours_per_year: f64,
    /// Price of a kilowatt-hour, in `currency`.
    pub tariff_per_kwh: f64,
    /// A label only: "EUR", "USD", "£".
    pub currency: String,
    /// What the retrofit from the baseline design to the others costs, in `currency`.
    pub retrofit_price: f64,
}

/// The oil, for the temperature rise with no cooler.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Oil {
    /// Oil in circulation (the reservoir's working volume).
    #[serde(rename = "volume_m3")]
    pub volume: Volume,
    #[serde(rename = "density_kg_per_m3")]
    pub density: MassDensity,
    #[serde(rename = "specific_heat_j_per_kg_k")]
    pub specific_heat: SpecificHeatCapacity,
}

impl Oil {
    /// Mineral oil with the working values of Esposito, *Fluid Power with Applications*
    /// (density 895 kg/m^3, specific heat 1.8 kJ/(kg.K)).
    pub fn mineral(volume: Volume) -> Oil {
        Oil {
            volume,
            density: MassDensity::new::<kilogram_per_cubic_meter>(895.0),
            specific_heat: SpecificHeatCapacity::new::<joule_per_kilogram_kelvin>(1800.0),
        }
    }
}

/// Why a job file could not be read.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum JobFileError {
    /// Not JSON, or not a job.
    Unreadable(String),
    /// Written by a newer Phasewise than this one.
    TooNew { version: u32 },
}

impl std::fmt::Display for JobFileError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            JobFileError::Unreadable(why) => write!(f, "this is not a Phasewise job file: {why}"),
            JobFileError::TooNew { version } => write!(
                f,
                "this job was saved by a newer Phasewise (format {version}; this one reads up to {SCHEMA_VERSION}): update the app to open it"
            ),
        }
    }
}

impl Job {
    /// Reads a job file, checking its format version first.
    pub fn from_json(text: &str) -> Result<Job, JobFileError> {
        #[derive(Deserialize)]
        struct Version {
            schema_version: u32,
        }
        let version: Version = serde_json::from_str(text)
            .map_err(|e| JobFileError::Unreadable(format!("no format version ({e})")))?;
        if version.schema_version > SCHEMA_VERSION {
            return Err(JobFileError::TooNew {
                version: version.schema_version,
            });
        }
        serde_json::from_str(text).map_err(|e| JobFileError::Unreadable(e.to_string()))
    }

    /// The job as a job file (pretty JSON).
    pub fn to_json(&self) -> String {
        serde_json::to_string_pretty(self).expect("a job always serialises")
    }
}
