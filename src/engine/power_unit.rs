//! A power-unit design: the motor, its pumps and valves, and the pressure limit chosen for
//! each phase. A job holds one or more designs of the same machine ("as found", "proposed").

use super::motor::Motor;
use super::pump::Pump;
use super::valve::{ActiveLimit, CheckValve, IdlePath, ReliefValve, UnloadingValve};
use serde::{Deserialize, Serialize};
use uom::si::f64::Pressure;

/// The most pumps one motor drives here.
pub const MAX_PUMPS: usize = 4;

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Design {
    pub name: String,
    pub motor: Motor,
    /// The pumps that unload as pressure rises, each with its unloading and check valve, in
    /// the order they sit on the shaft. Empty for a single-pump unit.
    pub unloading_stages: Vec<UnloadingStage>,
    /// The last pump: it has no unloading valve and feeds the system up to the relief.
    pub base_pump: Pump,
    pub relief: ReliefValve,
    /// Remote pilot stages on the relief's vent port, each selected by its own solenoid.
    #[serde(rename = "remote_stages_pa")]
    pub remote_stages: Vec<Pressure>,
    /// The pressure the pump sees with the relief vented (its main spool's bias spring).
    #[serde(rename = "vent_pressure_pa")]
    pub vent_pressure: Pressure,
    /// One per phase of the cycle, in the same order.
    pub phase_settings: Vec<PhaseSetting>,
    /// What the retrofit to this design costs, in the site's currency, when it differs from
    /// the site's one price (absent: the site's `retrofit_price`). Unused on the baseline.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub retrofit_price: Option<f64>,
}

impl Design {
    /// What the retrofit to this design costs: its own price, else the site's.
    pub fn retrofit_price_or(&self, site: &super::job::Site) -> f64 {
        self.retrofit_price.unwrap_or(site.retrofit_price)
    }
}

#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct UnloadingStage {
    pub pump: Pump,
    pub unloading: UnloadingValve,
    pub check: CheckValve,
}

/// How the power unit is set for one phase.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct PhaseSetting {
    pub limit: ActiveLimit,
    /// Where the flow goes if the phase is an idle; ignored for other phases.
    pub idle_path: IdlePath,
}

impl Default for PhaseSetting {
    fn default() -> Self {
        PhaseSetting {
            limit: ActiveLimit::Main,
            idle_path: IdlePath::OverLimit,
        }
    }
}

impl Design {
    /// Every pump in shaft order: the unloading stages, then the base pump.
    pub fn pumps(&self) -> impl Iterator<Item = &Pump> {
        self.unloading_stages
            .iter()
            .map(|s| &s.pump)
            .chain(std::iter::once(&self.base_pump))
    }

    pub fn pump_count(&self) -> usize {
        self.unloading_stages.len() + 1
    }
}
