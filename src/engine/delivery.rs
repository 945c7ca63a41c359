//! What a power unit delivers against pressure: each pump's flow at a pressure (less its
//! leakage, less what its unloading valve sends to tank), the relief's flow, the balance
//! between them, and which limit governs a phase. The solve, the validation and the job
//! file's upgrade all read a unit through it.

use super::power_unit::{Design, PhaseSetting};
use super::pump::PumpAtSpeed;
use super::valve::{ActiveLimit, IdlePath, ReliefCharacteristic};

/// Below this a flow is none (m^3/s; about 0.00006 L/min).
pub(crate) const NO_FLOW: f64 = 1e-9;

/// A pump on this design's shaft, in SI numbers.
#[derive(Clone, Copy, Debug)]
pub(crate) struct StagePump {
    pub(crate) pump: PumpAtSpeed,
    /// Its theoretical flow at the motor's full-load speed: what a relief is set against.
    pub(crate) rated_swept: f64,
    /// The check valve's cracking pressure (none on the base pump).
    pub(crate) check: f64,
    /// The unloading valve's setting and unloaded drop (none on the base pump).
    pub(crate) unloading: Option<(f64, f64)>,
}

/// The design prepared for solving: numbers computed once, not per phase.
#[derive(Clone)]
pub(crate) struct PreparedUnit<'a> {
    pub(crate) design: &'a Design,
    pub(crate) pumps: Vec<StagePump>,
    /// The shaft's speed as a share of the motor's full-load speed (1 at fixed speed).
    pub(crate) speed_share: f64,
}

impl<'a> PreparedUnit<'a> {
    pub fn new(design: &'a Design) -> Self {
        let rps = design.motor.revolutions_per_second();
        let mut pumps: Vec<StagePump> = design
            .unloading_stages
            .iter()
            .map(|s| StagePump {
                pump: PumpAtSpeed::new(&s.pump, rps),
                rated_swept: s.pump.displacement.value * rps,
                check: s.check.cracking.value,
                unloading: Some((s.unloading.setting.value, s.unloading.unloaded_drop.value)),
            })
            .collect();
        pumps.push(StagePump {
            pump: PumpAtSpeed::new(&design.base_pump, rps),
            rated_swept: design.base_pump.displacement.value * rps,
            check: 0.0,
            unloading: None,
        });
        PreparedUnit {
            design,
            pumps,
            speed_share: 1.0,
        }
    }

    /// The unit with its shaft at `speed_share` of the motor's full-load speed (on a
    /// variable-speed drive): every pump sweeps in proportion, its leakage at a pressure stays
    /// what it is (slip hardly depends on speed), so its volumetric efficiency falls as it
    /// slows. Its drag is taken as a torque (bearing and seal friction), so its power goes
    /// with speed: a simplification, marked as such (churning grows faster with speed).
    pub fn at_speed(&self, speed_share: f64) -> PreparedUnit<'a> {
        let mut unit = self.clone();
        for (s, pump) in unit.pumps.iter_mut().zip(self.design.pumps()) {
            s.pump.swept = s.rated_swept * speed_share;
            s.pump.drag = pump.drag_power.value * speed_share;
        }
        unit.speed_share = speed_share;
        unit
    }

    /// The unloading stages a system pressure `p` unloads (a bit each, as the solve's masks).
    pub(crate) fn unloaded_at(&self, p: f64) -> u32 {
        self.pumps
            .iter()
            .enumerate()
            .filter(|(_, s)| s.unloading.is_some_and(|(setting, _)| p >= setting))
            .fold(0u32, |m, (i, _)| m | (1 << i))
    }

    /// The lowest speed, as a share of full-load speed, at which the pumps not in `unloaded`
    /// deliver `wanted` into the system at pressure `p`: each sweeps in proportion to speed
    /// and loses its leakage at its outlet pressure, so a pump only adds flow above the speed
    /// at which it sweeps its leakage. In closed form, adding pumps in the order they start
    /// to give. A compensated pump above its setting is taken at full stroke (the solve then
    /// finds what it gives).
    pub(crate) fn speed_share_for(&self, wanted: f64, p: f64, unloaded: u32) -> f64 {
        let mut feeding: Vec<(f64, f64, f64)> = self
            .pumps
            .iter()
            .enumerate()
            .filter(|(i, s)| unloaded & (1 << i) == 0 && s.rated_swept > 0.0)
            .map(|(_, s)| {
                let leak = s.pump.leakage * (p + s.check);
                (leak / s.rated_swept, s.rated_swept, leak)
            })
            .collect();
        feeding.sort_by(|a, b| a.0.total_cmp(&b.0));
        let (mut swept, mut leak) = (0.0, 0.0);
        for (i, &(starts, per_share, leaks)) in feeding.iter().enumerate() {
            swept += per_share;
            leak += leaks;
            let share = (wanted.max(0.0) + leak) / swept;
            let next = feeding.get(i + 1).map_or(f64::INFINITY, |f| f.0);
            if share <= next && share >= starts {
                return share;
            }
        }
        f64::INFINITY
    }

    /// The unit with each pump's leakage scaled by `factor(pump)`: slip flow goes as pressure
    /// over viscosity, so a pump stated at a thicker oil than the working one leaks more.
    pub fn with_leakage_scaled(mut self, factor: impl Fn(&super::pump::Pump) -> f64) -> Self {
        for (s, pump) in self.pumps.iter_mut().zip(self.design.pumps()) {
            s.pump.leakage *= factor(pump);
        }
        self
    }

    /// The flow the pumps send over the relief with the system dead-headed at `p` (m^3/s), as
    /// when a relief is set: with the motor at its full-load speed (on a variable-speed drive,
    /// the speed a relief is commonly set at), every pump not unloaded at that pressure, at full stroke (a
    /// compensator is turned up out of the way while the relief is set, common practice),
    /// less its leakage there.
    pub(crate) fn dead_head_flow(&self, p: f64) -> f64 {
        self.pumps
            .iter()
            .filter(|s| s.unloading.is_none_or(|(setting, _)| p < setting))
            .map(|s| (s.rated_swept - s.pump.leakage * (p + s.check)).max(0.0))
            .sum()
    }

    /// The relief's characteristic with `governing` the governing setting: that setting is
    /// read with the dead-head flow at it over the valve (see
    /// [`ReliefValve`](super::valve::ReliefValve)). A unit whose pumps give nothing there is
    /// refused by validation; the floor keeps the line finite for any other caller.
    pub(crate) fn relief(&self, governing: f64) -> ReliefCharacteristic {
        ReliefCharacteristic::new(
            governing,
            self.design.relief.cracking_fraction,
            self.dead_head_flow(governing).max(NO_FLOW),
        )
    }

    pub(crate) fn stages(&self) -> usize {
        self.pumps.len() - 1
    }

    /// Flow into the system at system pressure `p`, with the stages in `unloaded` sent to tank.
    pub(crate) fn supply(&self, p: f64, unloaded: u32) -> f64 {
        self.pumps
            .iter()
            .enumerate()
            .filter(|(i, _)| unloaded & (1 << i) == 0)
            .map(|(_, s)| s.pump.delivered(p + s.check))
            .sum()
    }

    /// The shaft power the pumps take with the system at `p` and the stages in `unloaded` sent
    /// to tank at their unloaded drop (W).
    pub(crate) fn shaft_power_at(&self, p: f64, unloaded: u32) -> f64 {
        self.pumps
            .iter()
            .enumerate()
            .map(|(i, s)| {
                let outlet = match s.unloading {
                    Some((_, drop)) if unloaded & (1 << i) != 0 => drop,
                    _ => p + s.check,
                };
                s.pump.shaft_power(outlet, s.pump.delivered(outlet))
            })
            .sum()
    }

    /// Theoretical flow of the feeding pumps.
    pub(crate) fn swept(&self, unloaded: u32) -> f64 {
        self.pumps
            .iter()
            .enumerate()
            .filter(|(i, _)| unloaded & (1 << i) == 0)
            .map(|(_, s)| s.pump.swept)
            .sum()
    }

    /// The system pressure at or above `low` where supply = relief flow + `demand`. If even
    /// at `low` the supply falls short, `low` itself.
    pub(crate) fn balance(
        &self,
        relief: &ReliefCharacteristic,
        demand: f64,
        low: f64,
        unloaded: u32,
    ) -> f64 {
        let h = |p: f64| self.supply(p, unloaded) - relief.flow(p) - demand;
        let mut a = low;
        let mut ha = h(a);
        if ha <= 0.0 {
            return low;
        }
        // Every pressure where a flow changes slope, above `low`, in order.
        // A fixed array (no allocation in the hot loop); validation allows at most MAX_PUMPS
        // pumps, and `zip` stops at its end for any other caller.
        let mut points = [f64::INFINITY; 3 * super::power_unit::MAX_PUMPS + 1];
        let feeding = self
            .pumps
            .iter()
            .enumerate()
            .filter(|(i, _)| unloaded & (1 << i) == 0)
            .flat_map(|(_, s)| s.pump.breakpoints().map(|b| b - s.check));
        let mut n = 0;
        for (slot, b) in points
            .iter_mut()
            .zip(std::iter::once(relief.cracking).chain(feeding))
        {
            *slot = b;
            n += 1;
        }
        let points = &mut points[..n];
        points.sort_unstable_by(f64::total_cmp);
        for &b in points.iter().filter(|b| b.is_finite() && **b > low) {
            let hb = h(b);
            if hb <= 0.0 {
                // A surplus left only by rounding (a pump clipped to no flow at its dry point
                // gives 1e-20, not 0) is none: the root is `a`, not the far end of a flat span.
                if ha <= NO_FLOW * 1e-6 {
                    return a;
                }
                return a + ha * (b - a) / (ha - hb);
            }
            (a, ha) = (b, hb);
        }
        // Past the last breakpoint every flow is a straight line: one more point gives it.
        let b = a + a.max(1e5);
        let hb = h(b);
        if hb < ha {
            a + ha * (b - a) / (ha - hb)
        } else {
            a
        }
    }
}

/// A format-1 relief (its settings read at the valve's rated flow) in today's meaning (each
/// governing pressure read with that limit's dead-head flow over the valve): the main setting,
/// each remote stage and the vent pressure as the old model's gauge would read them dead-headed
/// on that limit, and the cracking fraction that keeps the main limit's cracking pressure.
/// `None` when the design's figures cannot be converted (left as found, for validation).
///
/// On the main limit the new line is the old one exactly (same cracking pressure, and the old
/// line's pressure at the dead-head flow); so every phase on it solves as before. On a remote
/// stage or the vent the answer dead-headed is the same, and between cracking and full flow it
/// differs by less than the valve's override band.
pub(crate) fn format_1_relief(design: &Design) -> Option<Format1Relief> {
    let relief = &design.relief;
    let (rated, cracking) = (relief.rated_flow.value, relief.cracking_fraction);
    let sane = |x: f64| x.is_finite() && x > 0.0;
    if !(sane(rated) && sane(cracking) && cracking < 1.0) {
        return None;
    }
    let unit = PreparedUnit::new(design);
    // The old line from cracking `c G` to the rated flow `Qr` at `G` meets the dead-head flow
    // `Q(p)` at `p = c G + Q(p) G (1 - c) / Qr`. `Q` falls as `p` rises (leakage, stages
    // unloading), so the difference of the two sides rises: bisect it.
    let reading = |governing: f64| -> Option<f64> {
        if !sane(governing) {
            return None;
        }
        let span = governing * (1.0 - cracking) / rated;
        let excess = |p: f64| p - cracking * governing - unit.dead_head_flow(p) * span;
        let mut low = cracking * governing;
        let mut high = low + unit.dead_head_flow(low) * span;
        if !high.is_finite() || high <= low {
            return None;
        }
        for _ in 0..200 {
            let mid = 0.5 * (low + high);
            if mid <= low || mid >= high {
                break;
            }
            if excess(mid) < 0.0 {
                low = mid;
            } else {
                high = mid;
            }
        }
        Some(high)
    };
    let main = reading(relief.setting.value)?;
    let remote_stages = design
        .remote_stages
        .iter()
        .map(|r| reading(r.value))
        .collect::<Option<Vec<f64>>>()?;
    Some(Format1Relief {
        main,
        cracking_fraction: cracking * relief.setting.value / main,
        remote_stages,
        vent: reading(design.vent_pressure.value)?,
    })
}

/// A format-1 relief's settings in today's meaning (Pa).
pub(crate) struct Format1Relief {
    pub main: f64,
    pub cracking_fraction: f64,
    pub remote_stages: Vec<f64>,
    pub vent: f64,
}

/// The limit that governs a phase with `setting` (an idle's vent path counts), and its
/// pressure: the lower of main and a selected remote stage, or the vent pressure.
pub(crate) fn governing_limit(
    design: &Design,
    setting: &PhaseSetting,
    idle: bool,
) -> (ActiveLimit, f64) {
    let main = design.relief.setting.value;
    let limit = if idle && setting.idle_path == IdlePath::Vented {
        ActiveLimit::Vented
    } else {
        setting.limit
    };
    let governing = match limit {
        ActiveLimit::Main => main,
        // Validation guarantees the stage exists; `main` keeps a bad index harmless anyway.
        ActiveLimit::Remote { stage } => design
            .remote_stages
            .get(stage)
            .map_or(main, |r| r.value.min(main)),
        ActiveLimit::Vented => design.vent_pressure.value,
    };
    (limit, governing)
}
