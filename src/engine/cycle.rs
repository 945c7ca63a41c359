//! The machine cycle: the phases a machine repeats, in order.
//!
//! Adding a phase kind:
//! 1. Add the variant to [`PhaseKind`] here (serde tag `kind`, fields with unit suffixes).
//! 2. Check its fields in `validate::check_phase`.
//! 3. Map it to a `Demand` in `solve::demand` and solve it in `solve::solve_state` (set
//!    pressure, actuator flow, load and line pressures, duration; push findings for any
//!    fallback).
//! 4. Nothing else: the ledger, totals and comparison follow from the point. Add a
//!    hand-worked scenario test and let the properties cover it (add it to `phase()` in
//!    `src/engine/tests/engine/properties.rs`). If old files cannot read it, raise
//!    `SCHEMA_VERSION`.

use serde::{Deserialize, Serialize};
use uom::si::f64::{Force, Length, Pressure, Time, Velocity, VolumeRate};

/// One step of the machine cycle.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Phase {
    pub name: String,
    #[serde(flatten)]
    pub kind: PhaseKind,
}

/// What the machine does in a phase, which decides what the power unit sees.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum PhaseKind {
    /// A cylinder strokes against a load.
    Move(MovePhase),
    /// A cylinder stalled at pressure.
    Hold(HoldPhase),
    /// No demand at all (the operator loads the next part).
    Idle(IdlePhase),
    /// A flow and pressure demand stated directly, for users who know them.
    Direct(DirectPhase),
}

#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct MovePhase {
    pub cylinder: Cylinder,
    pub direction: Direction,
    pub load: Load,
    /// Line, valve and back-pressure losses between pump and cylinder, added to the load pressure.
    #[serde(rename = "line_loss_pa")]
    pub line_loss: Pressure,
    /// The pressure and return lines as described (absent: `line_loss` is the whole of it);
    /// their drop follows the flow and the oil, on top of `line_loss`.
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub lines: Option<super::lines::MoveLines>,
    pub speed: SpeedRule,
    /// The longest this move may take: the staging search keeps every candidate to it.
    /// Absent: as long as it takes with the baseline design ("as found").
    #[serde(
        default,
        rename = "target_time_s",
        skip_serializing_if = "Option::is_none"
    )]
    pub target_time: Option<Time>,
}

impl MovePhase {
    /// The pressure the load needs at the cylinder port, Pa (force over the working area).
    pub fn load_pressure(&self) -> f64 {
        match self.load {
            Load::Force { force } => force.value / self.cylinder.working_area_m2(self.direction),
            Load::Pressure { pressure } => pressure.value,
        }
    }

    /// States the same load as a pressure (`true`) or as a force (`false`).
    pub fn give_load_as_pressure(&mut self, as_pressure: bool) {
        let area = self.cylinder.working_area_m2(self.direction);
        self.load = match (as_pressure, self.load) {
            (true, Load::Force { force }) => Load::Pressure {
                pressure: Pressure::new::<uom::si::pressure::pascal>(force.value / area),
            },
            (false, Load::Pressure { pressure }) => Load::Force {
                force: Force::new::<uom::si::force::newton>(pressure.value * area),
            },
            (_, load) => load,
        };
    }
}

#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Cylinder {
    #[serde(rename = "bore_m")]
    pub bore: Length,
    #[serde(rename = "rod_m")]
    pub rod: Length,
    #[serde(rename = "stroke_m")]
    pub stroke: Length,
}

impl Cylinder {
    /// The other side's area over the working side's: what the return line carries for each
    /// unit of flow in (annulus over bore extending, bore over annulus retracting).
    pub fn return_ratio(&self, direction: Direction) -> f64 {
        let other = match direction {
            Direction::Extend => Direction::Retract,
            Direction::Retract => Direction::Extend,
        };
        self.working_area_m2(other) / self.working_area_m2(direction)
    }

    /// The area the oil pushes on: the full bore extending, the annulus retracting.
    pub fn working_area_m2(&self, direction: Direction) -> f64 {
        let bore = circle_area(self.bore.value);
        match direction {
            Direction::Extend => bore,
            Direction::Retract => bore - circle_area(self.rod.value),
        }
    }
}

fn circle_area(diameter: f64) -> f64 {
    std::f64::consts::PI / 4.0 * diameter * diameter
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Direction {
    Extend,
    Retract,
}

/// What the cylinder pushes against.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "type", rename_all = "snake_case")]
pub enum Load {
    Force {
        #[serde(rename = "force_n")]
        force: Force,
    },
    /// The pressure at the cylinder port, when it was read off a gauge.
    Pressure {
        #[serde(rename = "pressure_pa")]
        pressure: Pressure,
    },
}

/// How fast a move goes.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "rule", rename_all = "snake_case")]
pub enum SpeedRule {
    /// The cylinder takes all the pump flow: speed and duration follow from the pumps.
    AllPumpFlow,
    /// A pressure-compensated flow control holds this speed; the pumps' surplus goes over
    /// the active pressure limit.
    MeteredSpeed {
        #[serde(rename = "speed_m_per_s")]
        speed: Velocity,
    },
    /// As `MeteredSpeed`, set as the flow into the cylinder.
    MeteredFlow {
        #[serde(rename = "flow_m3_per_s")]
        flow: VolumeRate,
    },
}

#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct HoldPhase {
    /// The pressure the work needs held.
    #[serde(rename = "pressure_pa")]
    pub pressure: Pressure,
    #[serde(rename = "duration_s")]
    pub duration: Time,
    pub mode: HoldMode,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum HoldMode {
    /// The pump keeps the pressure up: its flow goes over the active limit.
    HeldByPump,
    /// A check valve locks the oil in the cylinder; the pump side is free to unload or vent.
    LockedByCheck,
}

#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct IdlePhase {
    #[serde(rename = "duration_s")]
    pub duration: Time,
}

#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct DirectPhase {
    /// The flow the circuit takes.
    #[serde(rename = "flow_m3_per_s")]
    pub flow: VolumeRate,
    /// The pressure it takes it at, at the pump outlet.
    #[serde(rename = "pressure_pa")]
    pub pressure: Pressure,
    #[serde(rename = "duration_s")]
    pub duration: Time,
}
