//! The pipes and hoses between the pumps, the cylinder and the tank: the pressure it takes to
//! push oil through them, and how fast the oil goes.
//!
//! Darcy-Weisbach: `dp = (f L / D + sum K) rho v^2 / 2`. Laminar flow has `f = 64 / Re`
//! (Hagen-Poiseuille); from a Reynolds number of 4000 up the flow is turbulent and `f` follows
//! the Colebrook-White equation (1939) for the pipe's relative roughness. Below 4000 the flow
//! may be either (laminar up to about 2000 for certain, beyond that as disturbances decide):
//! Phasewise takes the larger of the laminar figure and the turbulent one at 4000, the
//! conservative choice. So the drop is continuous in the flow, and it never falls as the oil
//! thickens (which a sudden return to laminar flow could do on a real line). Laminar flow
//! stays 64/Re up to Re = 64 / f(4000), about 1500 to 1600 in hydraulic tube. A fitting's
//! loss coefficient K is a turbulent figure used at every flow (a simplification that
//! understates fittings in slow, thick oil).

use serde::{Deserialize, Serialize};
use uom::si::f64::{Length, Velocity};

/// A line: one run of pipe or hose with its fittings.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Line {
    #[serde(rename = "inner_diameter_m")]
    pub inner_diameter: Length,
    #[serde(rename = "length_m")]
    pub length: Length,
    /// The fittings and valves along it.
    #[serde(default, skip_serializing_if = "Vec::is_empty")]
    pub fittings: Vec<Fitting>,
}

/// Some fittings of one kind along a line.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Fitting {
    pub kind: FittingKind,
    pub count: u32,
}

/// What a fitting is, and so its loss coefficient.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "type", rename_all = "snake_case")]
pub enum FittingKind {
    Elbow90,
    Elbow45,
    /// A tee, the flow going through the run.
    TeeRun,
    /// A tee, the flow turning into the branch.
    TeeBranch,
    /// A ball or gate valve, fully open.
    OpenValve,
    /// An in-line check valve.
    CheckValve,
    /// A loss coefficient the user knows (a maker's figure).
    Coefficient {
        k: f64,
    },
    /// A fitting given as the length of straight line that loses as much.
    EquivalentLength {
        #[serde(rename = "length_m")]
        length: Length,
    },
}

impl FittingKind {
    /// Typical loss coefficients of the common fittings (common practice, from memory of the
    /// fluid-power handbooks' K-factor tables; a maker's figure is better). `None` for a
    /// fitting given as an equivalent length.
    pub fn coefficient(self) -> Option<f64> {
        Some(match self {
            FittingKind::Elbow90 => 0.75,
            FittingKind::Elbow45 => 0.42,
            FittingKind::TeeRun => 0.4,
            FittingKind::TeeBranch => 1.8,
            FittingKind::OpenValve => 0.2,
            FittingKind::CheckValve => 4.0,
            FittingKind::Coefficient { k } => k,
            FittingKind::EquivalentLength { .. } => return None,
        })
    }

    /// The common kinds offered in the form, in its order.
    pub const COMMON: [FittingKind; 6] = [
        FittingKind::Elbow90,
        FittingKind::Elbow45,
        FittingKind::TeeRun,
        FittingKind::TeeBranch,
        FittingKind::OpenValve,
        FittingKind::CheckValve,
    ];
}

/// Where flow in a pipe is turbulent whatever disturbs it (common practice for pipe flow).
pub const TURBULENT_FROM: f64 = 4000.0;

/// Absolute roughness of drawn steel tube and hydraulic hose, m (common practice: about
/// 0.0015 mm for drawn tubing; hose is taken as smooth as tube).
pub const ROUGHNESS: f64 = 1.5e-6;

/// Which line, for the common-practice velocity limits.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum LineRole {
    Suction,
    Pressure,
    Return,
}

impl LineRole {
    /// The highest mean velocity common practice allows in such a line, m/s (the top of the
    /// usual ranges: suction 0.6 to 1.2, return 2 to 4, pressure 3 to 6).
    pub fn velocity_limit(self) -> f64 {
        match self {
            LineRole::Suction => 1.2,
            LineRole::Pressure => 6.0,
            LineRole::Return => 4.0,
        }
    }
}

/// A line carrying a flow: what the solve and the report need.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct LineFlow {
    pub role: LineRole,
    #[serde(rename = "velocity_m_per_s")]
    pub velocity: Velocity,
    pub reynolds: f64,
    pub friction_factor: f64,
    /// The pressure drop along it, Pa.
    #[serde(rename = "drop_pa")]
    pub drop: f64,
}

/// The Darcy friction factor at a Reynolds number, for a relative roughness `e / D`.
pub fn friction_factor(reynolds: f64, relative_roughness: f64) -> f64 {
    if reynolds <= 0.0 {
        return 0.0;
    }
    if reynolds >= TURBULENT_FROM {
        return colebrook(reynolds, relative_roughness);
    }
    let laminar = 64.0 / reynolds;
    // Through the transition the drop follows the larger of the two. Haaland's fit is within
    // a few percent of Colebrook-White, so well above it the laminar figure stands without
    // solving Colebrook-White (most lines of a power unit run laminar: this is the usual case).
    let haaland_x = haaland(TURBULENT_FROM, relative_roughness / 3.7);
    if laminar * haaland_x * haaland_x > 1.1 {
        return laminar;
    }
    laminar.max(colebrook(TURBULENT_FROM, relative_roughness))
}

/// Haaland (1983), the explicit approximation of Colebrook-White, as `x = 1/sqrt(f)`;
/// `rough` is `e / (3.7 D)`.
fn haaland(reynolds: f64, rough: f64) -> f64 {
    -1.8 * (rough.powf(1.11) + 6.9 / reynolds).log10()
}

/// Colebrook-White: `1/sqrt(f) = -2 log10(e/(3.7 D) + 2.51/(Re sqrt(f)))`, solved for
/// `x = 1/sqrt(f)` by Newton's method from Haaland's explicit fit. The equation is smooth
/// and monotone in `x` for every Re above 4000, so two or three steps reach double precision
/// (a dozen at most).
fn colebrook(reynolds: f64, relative_roughness: f64) -> f64 {
    let rough = relative_roughness / 3.7;
    let slope = 2.51 / reynolds;
    let mut x = haaland(reynolds, rough);
    for _ in 0..12 {
        let inner = rough + slope * x;
        // g(x) = x + 2 log10(inner) = 0; g'(x) = 1 + 2 slope / (inner ln 10).
        let g = x + 2.0 * inner.log10();
        let dg = 1.0 + 2.0 * slope / (inner * std::f64::consts::LN_10);
        let next = x - g / dg;
        let done = (next - x).abs() <= 1e-13 * next;
        x = next;
        if done {
            break;
        }
    }
    1.0 / (x * x)
}

impl Line {
    /// The loss coefficients of its fittings added up (those given as an equivalent length
    /// left out).
    pub fn fittings_coefficient(&self) -> f64 {
        self.fittings
            .iter()
            .filter_map(|f| f.kind.coefficient().map(|k| k * f64::from(f.count)))
            .sum()
    }

    /// Its fittings stated as one loss coefficient `k` (those given as an equivalent length
    /// kept): how a form that asks for the total writes it.
    pub fn set_fittings_coefficient(&mut self, k: f64) {
        self.fittings
            .retain(|f| matches!(f.kind, FittingKind::EquivalentLength { .. }));
        if k != 0.0 {
            self.fittings.push(Fitting {
                kind: FittingKind::Coefficient { k },
                count: 1,
            });
        }
    }

    /// The common fittings' typical coefficients in words, for a form's hint.
    pub fn typical_coefficients() -> String {
        FittingKind::COMMON
            .iter()
            .map(|kind| {
                let name = match kind {
                    FittingKind::Elbow90 => "90° elbow",
                    FittingKind::Elbow45 => "45° elbow",
                    FittingKind::TeeRun => "tee, through the run",
                    FittingKind::TeeBranch => "tee, into the branch",
                    FittingKind::OpenValve => "open ball or gate valve",
                    FittingKind::CheckValve => "check valve",
                    _ => "",
                };
                format!("{name} {}", kind.coefficient().unwrap_or(0.0))
            })
            .collect::<Vec<_>>()
            .join(", ")
    }

    fn area(&self) -> f64 {
        std::f64::consts::PI / 4.0 * self.inner_diameter.value.powi(2)
    }

    /// The line carrying `flow` (m^3/s) of an oil of kinematic viscosity `viscosity` (m^2/s)
    /// and density `density` (kg/m^3).
    pub fn carrying(&self, role: LineRole, flow: f64, viscosity: f64, density: f64) -> LineFlow {
        let d = self.inner_diameter.value;
        let v = flow.abs() / self.area();
        let reynolds = v * d / viscosity;
        let f = friction_factor(reynolds, ROUGHNESS / d);
        let (mut k, mut extra_length) = (0.0, 0.0);
        for fitting in &self.fittings {
            let n = f64::from(fitting.count);
            match fitting.kind {
                FittingKind::EquivalentLength { length } => extra_length += n * length.value,
                kind => k += n * kind.coefficient().unwrap_or(0.0),
            }
        }
        let drop = (f * (self.length.value + extra_length) / d + k) * density * v * v / 2.0;
        LineFlow {
            role,
            velocity: Velocity::new::<uom::si::velocity::meter_per_second>(v),
            reynolds,
            friction_factor: f,
            drop,
        }
    }
}

impl LineFlow {
    /// The smallest inner diameter (m) that keeps this flow within the role's velocity limit,
    /// for a line of `diameter` (velocity goes as one over the diameter squared).
    pub fn diameter_within_limit(&self, diameter: f64) -> f64 {
        diameter * (self.velocity.value / self.role.velocity_limit()).sqrt()
    }
}

/// A move's two lines: from the directional valve to the cylinder's working side and from its
/// other side back to tank.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct MoveLines {
    pub pressure_line: Line,
    pub return_line: Line,
}

/// A move's lines at a flow: each line's state and the drop they add at the pump, Pa.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct MoveLinesFlow {
    pub pressure_line: LineFlow,
    pub return_line: LineFlow,
    /// What the two cost at the working side: the pressure line's drop plus the return line's
    /// back-pressure times the return side's area over the working side's.
    #[serde(rename = "drop_at_pump_pa")]
    pub drop_at_pump: f64,
}

impl MoveLines {
    /// The lines with `flow` (m^3/s) into the working side; `area_ratio` is the return side's
    /// area over the working side's, so the return line carries `flow x area_ratio` (on a
    /// retract the cap end returns more than the pump sends).
    pub fn carrying(
        &self,
        flow: f64,
        area_ratio: f64,
        viscosity: f64,
        density: f64,
    ) -> MoveLinesFlow {
        let pressure_line =
            self.pressure_line
                .carrying(LineRole::Pressure, flow, viscosity, density);
        let return_line =
            self.return_line
                .carrying(LineRole::Return, flow * area_ratio, viscosity, density);
        MoveLinesFlow {
            pressure_line,
            return_line,
            drop_at_pump: pressure_line.drop + return_line.drop * area_ratio,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use uom::si::length::{foot, inch};

    // US customary as Esposito works it: v in ft/s, D in in, nu in cSt.
    const FT: f64 = 0.3048;
    const CST: f64 = 1e-6;

    fn pipe(d_in: f64, length_ft: f64) -> Line {
        Line {
            inner_diameter: Length::new::<inch>(d_in),
            length: Length::new::<foot>(length_ft),
            fittings: vec![],
        }
    }

    fn flow_at(line: &Line, v_ft_s: f64) -> f64 {
        line.area() * v_ft_s * FT
    }

    /// Esposito, *Fluid Power with Applications*, Example 4-1: 100 cSt at 10 ft/s in a 1 in
    /// pipe has N_R = 7740 x 10 x 1 / 100 = 774, laminar.
    #[test]
    fn esposito_example_4_1_reynolds_number() {
        let line = pipe(1.0, 100.0);
        let state = line.carrying(LineRole::Pressure, flow_at(&line, 10.0), 100.0 * CST, 900.0);
        assert!((state.reynolds - 774.0).abs() < 1.0, "{}", state.reynolds);
        assert!((state.friction_factor - 64.0 / state.reynolds).abs() < 1e-12);
    }

    /// Esposito, Example 4-3: the same flow through 100 ft of it, oil of specific gravity 0.9:
    /// f = 64/774 and a head loss of about 154 ft of oil, about 60 psi.
    #[test]
    fn esposito_example_4_3_laminar_line_loss() {
        let line = pipe(1.0, 100.0);
        let state = line.carrying(LineRole::Pressure, flow_at(&line, 10.0), 100.0 * CST, 900.0);
        let head_ft = state.drop / (900.0 * 9.80665) / FT;
        assert!((head_ft - 154.0).abs() < 1.5, "head {head_ft} ft");
        let psi = state.drop / 6894.757;
        assert!((psi - 60.0).abs() < 1.0, "{psi} psi");
    }

    /// Esposito, Example 4-5: 50 cSt in a 1 in pipe. At 10 ft/s N_R = 1548 and f = 64/1548 =
    /// 0.041; at 40 ft/s N_R = 6192 and, at relative roughness 0.0018, the Moody chart reads
    /// f = 0.036 (the chart read to a few percent; Colebrook gives about 0.037). At 1548 the
    /// conservative choice may already take the turbulent figure at 4000: within 2 %.
    #[test]
    fn esposito_example_4_5_friction_factor() {
        let laminar = friction_factor(1548.0, 0.0018);
        assert!((laminar - 0.0413).abs() / 0.0413 < 0.02, "{laminar}");
        let turbulent = friction_factor(6192.0, 0.0018);
        assert!((turbulent - 0.036).abs() / 0.036 < 0.05, "{turbulent}");
        assert!((turbulent - 0.037).abs() < 0.001, "{turbulent}");
    }

    /// Colebrook-White for a smooth pipe at Re = 1e5 gives f = 0.0180 (the Moody chart's
    /// smooth-pipe line; Haaland's fit gives 0.0178), from memory of the chart.
    #[test]
    fn colebrook_smooth_pipe() {
        let f = friction_factor(1e5, 0.0);
        assert!((f - 0.0180).abs() < 0.0002, "{f}");
    }

    /// The friction factor found satisfies Colebrook-White itself (the equation, not a chart)
    /// to double precision across the turbulent range and the roughness of real pipe and hose.
    #[test]
    fn colebrook_white_holds_where_it_is_solved() {
        for roughness in [0.0, 1e-6, 1e-4, 1e-3, 0.0018, 0.01, 0.05] {
            for reynolds in [4000.0, 6192.0, 1e4, 1e5, 1e6, 1e7, 1e8] {
                let f = friction_factor(reynolds, roughness);
                let x = 1.0 / f.sqrt();
                let residual = x + 2.0 * (roughness / 3.7 + 2.51 * x / reynolds).log10();
                assert!(residual.abs() <= 1e-12 * x, "Re {reynolds}, e/D {roughness}: {residual}");
            }
        }
    }

    /// The drop never jumps as the flow rises through the transition, and a thicker oil
    /// never loses less at the same flow.
    #[test]
    fn the_drop_is_continuous_and_rises_with_viscosity() {
        let line = Line {
            fittings: vec![Fitting {
                kind: FittingKind::Elbow90,
                count: 4,
            }],
            ..pipe(0.5, 20.0)
        };
        for roughness in [0.0, 1e-4, 0.0018] {
            let laminar_to = 64.0 / friction_factor(TURBULENT_FROM, roughness);
            assert!((1400.0..1700.0).contains(&laminar_to), "{laminar_to}");
            for edge in [laminar_to, TURBULENT_FROM] {
                let below = friction_factor(edge * (1.0 - 1e-9), roughness);
                let above = friction_factor(edge * (1.0 + 1e-9), roughness);
                assert!((above - below).abs() < 1e-6 * below, "jumps at Re {edge}");
            }
        }
        let mut last = 0.0;
        for i in 1..4000 {
            let q = f64::from(i) * 2e-6;
            let drop = line.carrying(LineRole::Pressure, q, 30.0 * CST, 870.0).drop;
            assert!(drop > last, "falls at {q}");
            last = drop;
        }
        for q in [1e-5, 1e-4, 1e-3, 5e-3] {
            let mut last = 0.0;
            for nu in [5.0, 10.0, 22.0, 46.0, 100.0, 320.0] {
                let drop = line.carrying(LineRole::Pressure, q, nu * CST, 870.0).drop;
                assert!(
                    drop >= last * (1.0 - 1e-12),
                    "thicker loses less at {q}, {nu}"
                );
                last = drop;
            }
        }
    }

    /// On a retract the cap end returns the rod side's flow times the area ratio, and its
    /// back-pressure counts times that ratio at the pump.
    #[test]
    fn a_retract_returns_more_than_it_takes() {
        let lines = MoveLines {
            pressure_line: pipe(0.75, 10.0),
            return_line: pipe(0.75, 10.0),
        };
        let state = lines.carrying(1e-3, 2.0, 32.0 * CST, 870.0);
        let v_p = state.pressure_line.velocity.value;
        let v_r = state.return_line.velocity.value;
        assert!((v_r / v_p - 2.0).abs() < 1e-12);
        let expected = state.pressure_line.drop + 2.0 * state.return_line.drop;
        assert!((state.drop_at_pump - expected).abs() < 1e-9 * expected);
        assert!(state.return_line.drop > 2.0 * state.pressure_line.drop);
    }

    /// The diameter offered meets the limit exactly.
    #[test]
    fn the_diameter_offered_meets_the_limit() {
        let q = 100.0 / 60_000.0;
        for role in [LineRole::Suction, LineRole::Pressure, LineRole::Return] {
            let first = pipe(0.5, 1.0);
            let offered = first
                .carrying(role, q, 30.0 * CST, 870.0)
                .diameter_within_limit(first.inner_diameter.value);
            let line = Line {
                inner_diameter: Length::new::<uom::si::length::meter>(offered),
                ..pipe(1.0, 1.0)
            };
            let v = line.carrying(role, q, 30.0 * CST, 870.0).velocity.value;
            assert!((v - role.velocity_limit()).abs() < 1e-9, "{v}");
        }
    }
}
