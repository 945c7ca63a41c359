//! A job: one machine's cycle, the power-unit designs compared on it, the site's economics
//! and the oil. This is what is saved, exported and shared.

use super::cycle::Phase;
use super::power_unit::{Design, PhaseSetting};
use super::units::UnitSystem;
use serde::{Deserialize, Serialize};

pub use super::site::{Oil, Site};

/// The job file format's version. Raise it on any change a previous version could not read,
/// and add the migration (see DEVELOPERS.md, "Job file format").
///
/// - 2: a relief's `setting_pa` is the pressure with the pumps' whole dead-head flow over the
///   valve (as set on the machine), no longer the pressure at its rated flow.
pub const SCHEMA_VERSION: u32 = 2;

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Job {
    pub schema_version: u32,
    pub name: String,
    #[serde(default)]
    pub notes: String,
    /// An invented example (the demo job), shown as such.
    #[serde(default)]
    pub example: bool,
    /// How the job is shown; the engine always works in SI.
    #[serde(default)]
    pub units: UnitSystem,
    pub cycle: Vec<Phase>,
    /// The first design is the baseline ("as found") the others are compared with.
    pub designs: Vec<Design>,
    pub site: Site,
    pub oil: Oil,
    /// The margins the settings advice uses (absent in older files: the defaults).
    #[serde(default)]
    pub advice: super::policy::AdvicePolicy,
    /// What the pump-staging search may choose from (absent in older files: the defaults).
    #[serde(default)]
    pub staging: super::policy::StagingOptions,
    /// Field tests of the machine's pumps (absent in older files: none).
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub pump_tests: Vec<super::pump_test::PumpTest>,
    /// Field checks of the machine's motors (absent in older files: none).
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub motor_checks: Vec<super::motor_check::MotorCheck>,
    /// Where the pump-wear verdict draws its lines (absent: the defaults).
    #[serde(default)]
    pub wear: super::policy::WearPolicy,
    /// The tank, for the heat balance (absent: not described; no steady temperature).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub tank: Option<super::heat::Tank>,
    /// Two oil temperatures read during a warm-up of the machine as found (absent: none).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub warm_up: Option<super::heat::FieldWarmUp>,
}

impl Job {
    /// A new job with nothing of another machine in it: no phases, and one power unit (the
    /// baseline, "As found") with one pump and a pilot-operated relief whose figures are
    /// empty, for the user to read off the machine and its nameplates. Only what a component
    /// type states for itself is filled in (the relief type's cracking share, the motor's
    /// typical fixed-loss share and peak allowance, a service factor of 1). The display units
    /// and the currency are the user's preferences, carried over.
    pub fn blank(name: String, units: UnitSystem, currency: String) -> Job {
        use super::motor::{Motor, TYPICAL_FIXED_LOSS_SHARE, TYPICAL_PEAK_ALLOWANCE};
        use super::pump::{Pump, PumpControl};
        use super::valve::{ReliefKind, ReliefValve};
        use uom::si::f64::{AngularVelocity, Power, Pressure, Volume, VolumeRate};
        let empty = f64::NAN;
        let design = Design {
            name: "As found".into(),
            drive: None,
            motor: Motor {
                rated_power: Power {
                    value: empty,
                    ..Default::default()
                },
                full_load_speed: AngularVelocity {
                    value: empty,
                    ..Default::default()
                },
                full_load_efficiency: empty,
                fixed_loss_share: TYPICAL_FIXED_LOSS_SHARE,
                service_factor: 1.0,
                peak_allowance: TYPICAL_PEAK_ALLOWANCE,
                electrical: None,
            },
            unloading_stages: Vec::new(),
            base_pump: Pump {
                displacement: Volume {
                    value: empty,
                    ..Default::default()
                },
                volumetric_efficiency: empty,
                efficiency_pressure: Pressure {
                    value: empty,
                    ..Default::default()
                },
                efficiency_temperature: None,
                efficiency_speed: None,
                hydromechanical_efficiency: empty,
                drag_power: Power {
                    value: empty,
                    ..Default::default()
                },
                rated_pressure: Pressure {
                    value: empty,
                    ..Default::default()
                },
                control: PumpControl::Fixed,
            },
            relief: ReliefValve {
                kind: ReliefKind::PilotOperated,
                setting: Pressure {
                    value: empty,
                    ..Default::default()
                },
                rated_flow: VolumeRate {
                    value: empty,
                    ..Default::default()
                },
                cracking_fraction: ReliefKind::PilotOperated.typical_cracking_fraction(),
            },
            remote_stages: Vec::new(),
            vent_pressure: Pressure {
                value: empty,
                ..Default::default()
            },
            phase_settings: Vec::new(),
            cooler: None,
            suction_line: None,
            retrofit_price: None,
            made_from: None,
        };
        Job {
            schema_version: SCHEMA_VERSION,
            name,
            notes: String::new(),
            example: false,
            units,
            cycle: Vec::new(),
            designs: vec![design],
            site: Site {
                location: String::new(),
                operating_hours_per_year: empty,
                tariff_per_kwh: empty,
                currency,
                retrofit_price: empty,
                grid_factor: None,
                demand_charge: None,
                power_factor_threshold: None,
            },
            oil: Oil::mineral(Volume {
                value: empty,
                ..Default::default()
            }),
            advice: Default::default(),
            staging: Default::default(),
            pump_tests: Vec::new(),
            motor_checks: Vec::new(),
            wear: Default::default(),
            tank: None,
            warm_up: None,
        }
    }
}

impl Job {
    /// Proposal `index` made again from the baseline as it is now: the baseline's machine and
    /// settings under the proposal's name and price. Does nothing to the baseline or to an
    /// index that is no proposal.
    pub fn rebuild_from_baseline(&mut self, index: usize) {
        let Some(baseline) = self.designs.first() else {
            return;
        };
        let fresh = Design::proposal_from(baseline, String::new());
        if let Some(old) = self.designs.get_mut(index).filter(|_| index > 0) {
            *old = Design {
                name: std::mem::take(&mut old.name),
                retrofit_price: old.retrofit_price,
                ..fresh
            };
        }
    }

    /// The name for a new proposal: "Proposed", else "Proposed 2", "Proposed 3", ..., the
    /// first no design of the job has.
    pub fn next_proposal_name(&self) -> String {
        (1..)
            .map(|n| {
                if n == 1 {
                    "Proposed".to_string()
                } else {
                    format!("Proposed {n}")
                }
            })
            .find(|name| self.designs.iter().all(|d| d.name != *name))
            .unwrap_or_default()
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

/// A phase taken out of a job, with each design's setting for it, so it can be put back.
#[derive(Clone, Debug, PartialEq)]
pub struct RemovedPhase {
    pub index: usize,
    pub phase: Phase,
    pub settings: Vec<PhaseSetting>,
}

/// Editing the cycle: each operation keeps every design's per-phase settings in step with the
/// phases (one setting per phase, in the same order). Out-of-range indices do nothing.
impl Job {
    /// Inserts `phase` at `index` (clamped to the end); every design gets the default setting.
    pub fn insert_phase(&mut self, index: usize, phase: Phase) {
        let index = index.min(self.cycle.len());
        self.cycle.insert(index, phase);
        for design in &mut self.designs {
            let at = index.min(design.phase_settings.len());
            design.phase_settings.insert(at, PhaseSetting::default());
        }
    }

    /// Copies the phase at `index` (and each design's setting for it) just after it.
    pub fn duplicate_phase(&mut self, index: usize) {
        let Some(phase) = self.cycle.get(index).cloned() else {
            return;
        };
        self.cycle.insert(index + 1, phase);
        for design in &mut self.designs {
            if let Some(setting) = design.phase_settings.get(index).copied() {
                design.phase_settings.insert(index + 1, setting);
            }
        }
    }

    /// Takes out the phase at `index`, with what is needed to put it back.
    pub fn remove_phase(&mut self, index: usize) -> Option<RemovedPhase> {
        if index >= self.cycle.len() {
            return None;
        }
        let phase = self.cycle.remove(index);
        let settings = self
            .designs
            .iter_mut()
            .map(|d| {
                if index < d.phase_settings.len() {
                    d.phase_settings.remove(index)
                } else {
                    PhaseSetting::default()
                }
            })
            .collect();
        Some(RemovedPhase {
            index,
            phase,
            settings,
        })
    }

    /// Puts back a removed phase where it was (or at the end, if the cycle is now shorter).
    pub fn restore_phase(&mut self, removed: RemovedPhase) {
        let index = removed.index.min(self.cycle.len());
        self.cycle.insert(index, removed.phase);
        for (design, setting) in self.designs.iter_mut().zip(removed.settings) {
            let at = index.min(design.phase_settings.len());
            design.phase_settings.insert(at, setting);
        }
    }

    /// Swaps the phase at `index` with the one after it.
    pub fn move_phase_down(&mut self, index: usize) {
        if index + 1 >= self.cycle.len() {
            return;
        }
        self.cycle.swap(index, index + 1);
        for design in &mut self.designs {
            if index + 1 < design.phase_settings.len() {
                design.phase_settings.swap(index, index + 1);
            }
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
        let mut job: Job =
            serde_json::from_str(text).map_err(|e| JobFileError::Unreadable(e.to_string()))?;
        // Format 0 never existed: left as found for validation to refuse.
        if job.schema_version == 1 {
            for design in &mut job.designs {
                upgrade_relief_from_format_1(design);
            }
            job.schema_version = SCHEMA_VERSION;
        }
        Ok(job)
    }

    /// The job as a job file (pretty JSON).
    pub fn to_json(&self) -> String {
        // A job has no map with non-string keys and no failing `Serialize`, so this cannot
        // fail; were it ever to, the text would not read back, and the store and export
        // (which keep only a file that reads back equal) would refuse it.
        serde_json::to_string_pretty(self).unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}"))
    }
}

/// Format 1 stored a relief's setting at its rated flow; read it into today's meaning with the
/// same solved behaviour on the main limit and dead-headed on every limit (see
/// `solve::format_1_relief`). Figures that cannot be converted
/// stay as found, for validation to point at.
fn upgrade_relief_from_format_1(design: &mut Design) {
    let Some(new) = super::delivery::format_1_relief(design) else {
        return;
    };
    design.relief.setting.value = new.main;
    design.relief.cracking_fraction = new.cracking_fraction;
    for (remote, value) in design.remote_stages.iter_mut().zip(new.remote_stages) {
        remote.value = value;
    }
    design.vent_pressure.value = new.vent;
}

#[cfg(test)]
mod tests {
    use super::super::demo::scrap_baler;
    use super::super::valve::ActiveLimit;

    fn names(job: &super::Job) -> Vec<String> {
        job.cycle.iter().map(|p| p.name.clone()).collect()
    }

    #[test]
    fn cycle_edits_keep_every_designs_settings_in_step() {
        let mut job = scrap_baler();
        let before = job.clone();
        // The proposal's dwell (phase 2) is on a remote stage: follow that setting around.
        let dwell_setting = job.designs[1].phase_settings[2];
        assert_eq!(dwell_setting.limit, ActiveLimit::Remote { stage: 0 });

        job.move_phase_down(2);
        assert_eq!(job.cycle[3].name, "Dwell");
        assert_eq!(job.designs[1].phase_settings[3], dwell_setting);

        job.duplicate_phase(3);
        assert_eq!(names(&job)[3..5], ["Dwell", "Dwell"]);
        assert_eq!(job.designs[1].phase_settings[4], dwell_setting);

        let removed = job.remove_phase(4).unwrap();
        assert_eq!(removed.settings[1], dwell_setting);
        job.insert_phase(0, removed.phase.clone());
        assert_eq!(job.designs[1].phase_settings[0], Default::default());
        job.remove_phase(0);

        let removed = job.remove_phase(3).unwrap();
        job.restore_phase(removed);
        job.move_phase_down(2);
        assert_eq!(job, before);
        for design in &job.designs {
            assert_eq!(design.phase_settings.len(), job.cycle.len());
        }
    }

    #[test]
    fn out_of_range_edits_do_nothing() {
        let mut job = scrap_baler();
        let before = job.clone();
        assert!(job.remove_phase(99).is_none());
        job.duplicate_phase(99);
        job.move_phase_down(4);
        assert_eq!(job, before);
    }
}

#[cfg(test)]
mod blank_tests {
    use super::*;

    /// An empty job asks for every figure of the machine and holds nothing of another one.
    #[test]
    fn a_blank_job_asks_for_the_machines_figures_and_holds_none() {
        let job = Job::blank("New job".into(), UnitSystem::Si, "GBP".into());
        let errors = crate::solve(&job).expect_err("an empty job has no answer yet");
        let fields: Vec<&str> = errors.iter().map(|e| e.field.as_str()).collect();
        for field in [
            "cycle",
            "designs[0].motor.rated_power_w",
            "designs[0].base_pump.displacement_m3_per_rev",
            "designs[0].relief.setting_pa",
            "site.tariff_per_kwh",
            "oil.volume_m3",
        ] {
            assert!(fields.contains(&field), "{field} not asked for: {fields:?}");
        }
        assert!(job.cycle.is_empty() && job.pump_tests.is_empty() && !job.example);
        assert_eq!(
            (job.site.currency.as_str(), job.notes.as_str()),
            ("GBP", "")
        );
    }
}
