//! Valves: the relief valve and its pilot stages, unloading valves and check valves, and
//! which pressure limit governs each phase.
//!
//! Adding a valve type. A new relief kind: a [`ReliefKind`] variant with its
//! `typical_cracking_fraction` and `has_vent_port`. A new valve in the circuit: its data here,
//! its place in `Design` (`power_unit`), its checks in `validate`, its effect on supply or
//! relief flow in `delivery::PreparedUnit` (keep flows piecewise linear in pressure and add its
//! breakpoints to `balance`), its loss in one ledger item in `solve::report` (so the ledger
//! still closes), and a `Finding` for any misuse.

use serde::{Deserialize, Serialize};
use uom::si::f64::{Pressure, VolumeRate};

/// The main relief valve.
///
/// Its setting is what a technician sets and reads on the machine: the gauge's pressure with
/// the pump dead-headed, the whole flow the pumps then give crossing the valve. The valve starts
/// to pass flow below it (cracking, by valve type) and the pressure rises above it with more
/// flow (override): a straight line through cracking and the setting at that flow. Remote pilot
/// stages and the vent are read the same way, at the same flow.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct ReliefValve {
    pub kind: ReliefKind,
    /// The pressure with the design's full pump flow over the valve (job file format 2 on;
    /// format 1 stored the pressure at `rated_flow`, converted on reading).
    #[serde(rename = "setting_pa")]
    pub setting: Pressure,
    /// The maker's rated flow: the valve should pass the pumps' whole flow.
    #[serde(rename = "rated_flow_m3_per_s")]
    pub rated_flow: VolumeRate,
    /// The pressure at which it starts to pass flow, as a share of the setting.
    pub cracking_fraction: f64,
}

impl ReliefValve {
    /// Where the valve starts to pass flow on its main setting.
    pub fn cracking_pressure(&self) -> Pressure {
        self.setting * self.cracking_fraction
    }
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum ReliefKind {
    /// A spring on the poppet: opens early, with a large override. Has no vent port.
    DirectActing,
    /// A stiff pilot stage holds a lightly sprung main spool: opens close to the setting.
    /// Its vent port takes remote pilot stages or a vent valve.
    PilotOperated,
}

impl ReliefKind {
    /// The usual cracking pressure as a share of the setting (common practice: a
    /// direct-acting valve about 80 %, a pilot-operated one 97 to 99 %).
    pub fn typical_cracking_fraction(self) -> f64 {
        match self {
            ReliefKind::DirectActing => 0.80,
            ReliefKind::PilotOperated => 0.97,
        }
    }

    pub fn has_vent_port(self) -> bool {
        self == ReliefKind::PilotOperated
    }
}

/// A typical unloading valve's drop at a pump's full flow, when unloaded (common practice:
/// 2 to 5 bar, 30 to 70 psi; the maker's curve decides).
pub const TYPICAL_UNLOADED_DROP_PA: f64 = 3e5;

/// A typical cracking pressure of the check valve after an unloaded pump (common practice:
/// about 0.5 bar, 5 to 10 psi).
pub const TYPICAL_CHECK_CRACKING_PA: f64 = 0.5e5;

/// The valve that sends a pump's flow to tank once system pressure reaches its setting.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct UnloadingValve {
    #[serde(rename = "setting_pa")]
    pub setting: Pressure,
    /// The pressure the pump still sees when unloaded (the valve's drop at that flow).
    #[serde(rename = "unloaded_drop_pa")]
    pub unloaded_drop: Pressure,
}

/// The check valve that keeps system pressure out of an unloaded pump.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct CheckValve {
    #[serde(rename = "cracking_pa")]
    pub cracking: Pressure,
}

/// Which pressure limit governs a phase.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(tag = "limit", rename_all = "snake_case")]
pub enum ActiveLimit {
    /// The main pilot (or spring) setting.
    Main,
    /// A remote pilot stage on the vent port, by its place in the design's list (from 0).
    Remote { stage: usize },
    /// The vent port opened: the main spool opens at its bias spring.
    Vented,
}

/// Where the pump flow goes in an idle phase.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "path", rename_all = "snake_case")]
pub enum IdlePath {
    /// Over whatever limit is active: the relief at its setting unless one is chosen lower.
    OverLimit,
    /// The relief vented for the idle.
    Vented,
    /// Back to tank through an open-centre directional valve, at its pressure drop.
    OpenCentre {
        #[serde(rename = "drop_pa")]
        drop: Pressure,
    },
    /// The motor is switched off for the idle.
    MotorStopped,
}

/// How much flow a relief passes at a pressure: nothing below cracking, then rising in a
/// straight line to the setting flow (the pumps' dead-head flow) at the governing setting, and
/// on above it (override).
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct ReliefCharacteristic {
    pub cracking: f64,
    pub full: f64,
    pub setting_flow: f64,
}

impl ReliefCharacteristic {
    pub fn new(governing: f64, cracking_fraction: f64, setting_flow: f64) -> Self {
        ReliefCharacteristic {
            cracking: governing * cracking_fraction,
            full: governing,
            setting_flow,
        }
    }

    pub fn flow(&self, pressure: f64) -> f64 {
        if pressure <= self.cracking {
            0.0
        } else {
            self.setting_flow * (pressure - self.cracking) / (self.full - self.cracking)
        }
    }
}
