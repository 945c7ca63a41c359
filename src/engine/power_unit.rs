//! A power-unit design: the motor, its pumps and valves, and the pressure limit chosen for
//! each phase. A job holds one or more designs of the same machine ("as found", "proposed").

use super::motor::Motor;
use super::pump::Pump;
use super::valve::{ActiveLimit, CheckValve, IdlePath, ReliefValve, UnloadingValve};
use serde::{Deserialize, Serialize};
use uom::si::f64::{ElectricCurrent, Pressure};

/// The most pumps one motor drives here.
pub const MAX_PUMPS: usize = 4;

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Design {
    pub name: String,
    pub motor: Motor,
    /// The variable-speed drive the motor is on, if any (absent: the motor runs at its
    /// full-load speed in every phase it runs).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub drive: Option<super::drive::VariableSpeed>,
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
    /// The oil cooler, if the unit has one.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub cooler: Option<super::heat::Cooler>,
    /// The pumps' common suction line, when described (for its velocity).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub suction_line: Option<super::lines::Line>,
    /// What the retrofit to this design costs, in the site's currency, when it differs from
    /// the site's one price (absent: the site's `retrofit_price`). Unused on the baseline.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub retrofit_price: Option<f64>,
    /// For a proposal: the [`Design::machine_mark`] of the baseline it was made from (absent in
    /// older files and on the baseline), so the app can tell when "as found" has changed since.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub made_from: Option<String>,
}

impl Design {
    /// What the retrofit to this design costs: its own price, else the site's.
    pub fn retrofit_price_or(&self, site: &super::site::Site) -> f64 {
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
    /// The line current a clamp meter read in this phase, when entered: the model's figure is
    /// shown beside it.
    #[serde(
        default,
        rename = "measured_current_a",
        skip_serializing_if = "Option::is_none"
    )]
    pub measured_current: Option<ElectricCurrent>,
}

impl Default for PhaseSetting {
    fn default() -> Self {
        PhaseSetting {
            limit: ActiveLimit::Main,
            idle_path: IdlePath::OverLimit,
            measured_current: None,
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

impl Design {
    /// A mark of this design's machine: its motor, its pumps with their unloading and check
    /// valves, and its relief valve's type and size (not the settings a proposal exists to
    /// change). Two designs with the same machine have the same mark.
    pub fn machine_mark(&self) -> String {
        let machine = serde_json::json!([
            self.motor,
            self.unloading_stages,
            self.base_pump,
            self.relief.kind,
            self.relief.rated_flow,
        ]);
        // FNV-1a, 64 bits: stable across builds and platforms, unlike std's hasher.
        let hash = machine
            .to_string()
            .bytes()
            .fold(0xcbf2_9ce4_8422_2325_u64, |h, b| {
                (h ^ u64::from(b)).wrapping_mul(0x0100_0000_01b3)
            });
        format!("{hash:016x}")
    }

    /// A proposal made from `baseline` as it is now, under `name`.
    pub fn proposal_from(baseline: &Design, name: String) -> Design {
        Design {
            name,
            retrofit_price: None,
            made_from: Some(baseline.machine_mark()),
            ..baseline.clone()
        }
    }

    /// Where a newly added remote stage starts: 60 % of the main setting, below it so that it
    /// governs, for the user to set (a starting value, not advice).
    pub fn new_remote_stage(&self) -> Pressure {
        self.relief.setting * 0.6
    }

    /// Whether this proposal was made from an "as found" whose machine has changed since.
    pub fn made_from_older(&self, baseline: &Design) -> bool {
        self.made_from
            .as_ref()
            .is_some_and(|mark| *mark != baseline.machine_mark())
    }
}

/// The highest dead-head pressure of the design's compensated pumps (Pa): where the pump has
/// destroked to its leakage (the top of its band).
pub fn compensator_dead_head(design: &Design) -> Option<f64> {
    design
        .pumps()
        .filter_map(|p| match p.control {
            super::pump::PumpControl::Compensated { setting } => {
                Some(setting.value * (1.0 + super::pump::COMPENSATOR_BAND))
            }
            super::pump::PumpControl::Fixed => None,
        })
        .reduce(f64::max)
}

#[cfg(test)]
mod tests {
    use crate::demo::scrap_baler;
    use uom::si::power::kilowatt;
    use uom::si::pressure::bar;

    #[test]
    fn a_proposal_knows_when_as_found_has_changed_under_it_and_can_be_made_again() {
        let mut job = scrap_baler();
        assert!(!job.designs[1].made_from_older(&job.designs[0]));
        // A setting of "as found" is what proposals change: not a new machine.
        job.designs[0].relief.setting = uom::si::f64::Pressure::new::<bar>(200.0);
        assert!(!job.designs[1].made_from_older(&job.designs[0]));
        // The motor found on the machine is another: the proposal holds the old one.
        job.designs[0].motor.rated_power = uom::si::f64::Power::new::<kilowatt>(30.0);
        job.designs[1].retrofit_price = Some(1800.0);
        assert!(job.designs[1].made_from_older(&job.designs[0]));
        job.rebuild_from_baseline(1);
        let rebuilt = &job.designs[1];
        assert!(!rebuilt.made_from_older(&job.designs[0]));
        assert_eq!(rebuilt.motor, job.designs[0].motor);
        assert_eq!(
            (rebuilt.name.as_str(), rebuilt.retrofit_price),
            ("Proposed", Some(1800.0))
        );
        // The baseline has no proposal to rebuild; an index past the end changes nothing.
        let before = job.clone();
        job.rebuild_from_baseline(0);
        job.rebuild_from_baseline(9);
        assert_eq!(job, before);
    }

    #[test]
    fn new_proposals_are_named_apart() {
        let mut job = scrap_baler();
        assert_eq!(job.next_proposal_name(), "Proposed 2");
        job.designs.truncate(1);
        assert_eq!(job.next_proposal_name(), "Proposed");
        // Advice applied to a lone baseline makes a proposal that knows its baseline.
        let (job, at) = crate::settings::apply_to_proposed(
            &job,
            0,
            &crate::settings::Action::SetMain {
                pressure: uom::si::f64::Pressure::new::<bar>(180.0),
            },
        );
        assert_eq!((at, job.designs[1].name.as_str()), (1, "Proposed"));
        assert_eq!(
            job.designs[1].made_from.as_deref(),
            Some(job.designs[0].machine_mark().as_str())
        );
    }
}
