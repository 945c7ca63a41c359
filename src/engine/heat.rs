//! Where the oil's temperature settles: the heat the losses put in against what the tank's
//! walls and a cooler take out, and how the oil warms from cold on the way there.
//!
//! The tank sheds `h A (T - T_air)` through its wetted walls, with `h` set by the air around
//! it (Casey, hydraulicsupermarket.com, on reservoir heat dissipation: about 6 W/m2K with poor
//! circulation, 12 normal, 24 forced). A cooler rejects heat in proportion to the difference
//! between the oil entering it and the coolant entering it, from its rating at one point (the
//! way makers rate coolers: kW at an entering temperature difference). The oil and the steel
//! it wets store heat; between the two the temperature follows `C dT/dt = in(T) - out(T)`.

use serde::{Deserialize, Serialize};
use uom::si::f64::{Area, Length, Mass, Power, TemperatureInterval, ThermodynamicTemperature};

/// The tank, for the heat its walls shed.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Tank {
    pub size: TankSize,
    pub air: AirAround,
    /// The air's temperature around the tank.
    #[serde(rename = "ambient_k")]
    pub ambient: ThermodynamicTemperature,
    /// The tank's steel and what else warms with the oil (absent: the oil alone), for how fast
    /// it warms.
    #[serde(
        default,
        rename = "steel_mass_kg",
        skip_serializing_if = "Option::is_none"
    )]
    pub steel_mass: Option<Mass>,
}

/// How the tank's wetted wall area is known.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
#[serde(tag = "given_as", rename_all = "snake_case")]
pub enum TankSize {
    /// A box: its floor and the four walls up to the oil level shed heat.
    Box {
        #[serde(rename = "length_m")]
        length: Length,
        #[serde(rename = "width_m")]
        width: Length,
        #[serde(rename = "oil_depth_m")]
        oil_depth: Length,
    },
    /// The wetted area, measured or from the maker.
    WettedArea {
        #[serde(rename = "area_m2")]
        area: Area,
    },
}

/// The air around the tank.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum AirAround {
    /// Poor circulation: a corner, a pit, an enclosure.
    Still,
    /// A normal workshop.
    Normal,
    /// A fan blows on the tank.
    Forced,
}

impl AirAround {
    /// The wall's heat transfer coefficient, W/(m2.K) (Casey, as above).
    pub fn coefficient(self) -> f64 {
        match self {
            AirAround::Still => 6.0,
            AirAround::Normal => 12.0,
            AirAround::Forced => 24.0,
        }
    }
}

/// Specific heat of the tank's carbon steel, J/(kg.K) (handbook value, from memory: about
/// 0.46 to 0.49 kJ/(kg.K)).
pub const STEEL_SPECIFIC_HEAT: f64 = 470.0;

impl Tank {
    /// A tank to start from: a 1 x 0.6 m box with 0.5 m of oil in a normal workshop at 25 degC,
    /// for the user to measure and correct (a starting value, not a figure of any machine).
    pub fn first() -> Tank {
        let m = |v| Length::new::<uom::si::length::meter>(v);
        Tank {
            size: TankSize::Box {
                length: m(1.0),
                width: m(0.6),
                oil_depth: m(0.5),
            },
            air: AirAround::Normal,
            ambient: ThermodynamicTemperature::new::<uom::si::thermodynamic_temperature::kelvin>(
                298.15,
            ),
            steel_mass: None,
        }
    }

    /// The wetted wall area, m2.
    pub fn wetted_area(&self) -> f64 {
        match self.size {
            TankSize::Box {
                length,
                width,
                oil_depth,
            } => {
                let (l, w, d) = (length.value, width.value, oil_depth.value);
                l * w + 2.0 * (l + w) * d
            }
            TankSize::WettedArea { area } => area.value,
        }
    }

    /// What the walls shed with the oil at `oil` kelvin, W (negative when the air is warmer).
    pub fn sheds(&self, oil: f64) -> f64 {
        self.air.coefficient() * self.wetted_area() * (oil - self.ambient.value)
    }
}

/// An oil cooler.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct Cooler {
    pub coolant: Coolant,
    /// The coolant's temperature entering the cooler.
    #[serde(rename = "coolant_k")]
    pub coolant_temperature: ThermodynamicTemperature,
    /// The heat it rejects at its rating point.
    #[serde(rename = "rated_heat_w")]
    pub rated_heat: Power,
    /// The oil's entering temperature above the coolant's at that point.
    #[serde(rename = "rated_difference_k")]
    pub rated_difference: TemperatureInterval,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Coolant {
    Air,
    Water,
}

impl Cooler {
    /// Heat rejected per kelvin of entering difference, W/K.
    pub fn per_kelvin(&self) -> f64 {
        self.rated_heat.value / self.rated_difference.value
    }

    /// What it rejects with the oil at `oil` kelvin, W. Oil colder than the coolant is not
    /// warmed by it: a cooler's thermostat or bypass keeps it out then (common practice).
    pub fn removes(&self, oil: f64) -> f64 {
        self.per_kelvin() * (oil - self.coolant_temperature.value).max(0.0)
    }
}

/// Where the heat out of the oil goes at a temperature.
#[derive(Clone, Copy, Debug)]
pub struct HeatPaths<'a> {
    pub tank: &'a Tank,
    pub cooler: Option<&'a Cooler>,
}

impl HeatPaths<'_> {
    /// Everything shed at `oil` kelvin, W.
    pub fn out(&self, oil: f64) -> f64 {
        self.tank.sheds(oil) + self.cooler.map_or(0.0, |c| c.removes(oil))
    }

    /// The coldest the oil can settle: at the air's or the coolant's temperature, whichever
    /// is lower, nothing is shed and any heat in warms it.
    pub fn floor(&self) -> f64 {
        let air = self.tank.ambient.value;
        self.cooler
            .map_or(air, |c| air.min(c.coolant_temperature.value))
    }
}

/// The hottest the search looks (kelvin): 150 degC, far past any mineral oil's working life.
pub const SEARCH_CEILING: f64 = 423.15;

/// Where the temperature settles.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Settling {
    /// Heat in equals heat out at this temperature, kelvin.
    #[serde(rename = "at_k")]
    At(f64),
    /// More heat goes in than the tank and cooler shed even at [`SEARCH_CEILING`] (kelvin).
    #[serde(rename = "above_k")]
    Above(f64),
}

impl Settling {
    /// The temperature settled at, or the ceiling it passes (kelvin).
    pub fn kelvin(self) -> f64 {
        match self {
            Settling::At(t) | Settling::Above(t) => t,
        }
    }
}

/// The oil as a design's phases are worked out, and its heat balance.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct OilReport {
    /// The temperature the phases are worked out at (entered, or where it settles).
    #[serde(rename = "working_k")]
    pub working_temperature: f64,
    /// The oil's kinematic viscosity there, m^2/s.
    #[serde(rename = "viscosity_m2_per_s")]
    pub viscosity: f64,
    /// With the tank described: where the temperature settles and how it gets there.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub balance: Option<HeatBalance>,
}

/// Heat in against heat out for one design.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct HeatBalance {
    pub steady: Settling,
    /// At the steady temperature (or the ceiling): the losses' heat, and what each path sheds.
    #[serde(rename = "heat_in_w")]
    pub heat_in: f64,
    #[serde(rename = "tank_sheds_w")]
    pub tank_sheds: f64,
    #[serde(rename = "cooler_removes_w")]
    pub cooler_removes: f64,
    /// With a cooler: where the oil would settle without it.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub without_cooler: Option<Settling>,
    /// The warm-up from the air's temperature, when the oil settles.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub warm_up: Option<WarmUp>,
    /// The job's target temperature, and what a cooler must take away to hold the oil there
    /// (zero when the tank alone holds it), W.
    #[serde(rename = "target_k")]
    pub target: f64,
    #[serde(rename = "cooler_duty_w")]
    pub cooler_duty: f64,
    /// That duty per kelvin the target is above the coolant (the design's cooler's, else the
    /// air's): the rating a cooler needs, W/K. `None` when the coolant is not colder.
    #[serde(rename = "cooler_needed_w_per_k")]
    pub cooler_needed: Option<f64>,
}

/// The temperature at which `heat_in(T)` (W, the losses at that temperature) equals what
/// `paths` shed. False position with the Illinois step, bracketed between the floor and the
/// ceiling: the losses change slowly with temperature (through the oil's viscosity), so it
/// takes a handful of `heat_in` evaluations.
pub fn settle(heat_in: &mut dyn FnMut(f64) -> f64, paths: &HeatPaths) -> Settling {
    let gap = |t: f64, heat: f64| heat - paths.out(t);
    let (a, b) = (paths.floor(), SEARCH_CEILING);
    let (ga, gb) = (gap(a, heat_in(a)), gap(b, heat_in(b)));
    if ga <= 0.0 {
        return Settling::At(a);
    }
    if gb > 0.0 {
        return Settling::Above(b);
    }
    let close_enough = |t: f64, g: f64| {
        let out = paths.out(t);
        g.abs() <= 1e-12 * (g + out).abs().max(out.abs()).max(1e-9)
    };
    Settling::At(super::numeric::false_position(
        &mut |t| gap(t, heat_in(t)),
        (a, ga),
        (b, gb),
        &close_enough,
        1e-12,
    ))
}

/// The oil warming (or cooling) towards where it settles.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct WarmUp {
    /// (seconds from the start, kelvin), from the start temperature on.
    #[serde(rename = "curve_s_k")]
    pub curve: Vec<(f64, f64)>,
    /// When it comes within [`WITHIN`] of the steady temperature, s (`None` if it starts
    /// there).
    #[serde(rename = "time_to_steady_s")]
    pub time_to_steady: Option<f64>,
}

/// How far the field's heat may differ from the model's and still agree, as a share of the
/// model's. Our judgement: a tank thermometer read to a degree over a rise of some ten degrees
/// is a tenth out already; the oil's and the steel's heat capacity add a few percent more.
pub const WARM_UP_AGREEMENT: f64 = 0.15;

/// What the field's warm-up says of the model.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Agreement {
    /// Within [`WARM_UP_AGREEMENT`].
    Agrees,
    /// The machine makes this share more heat than the model (a loss the model lacks).
    MoreHeat(f64),
    /// The machine makes this share less heat than the model.
    LessHeat(f64),
}

impl WarmUpCheck {
    pub fn agreement(&self) -> Agreement {
        let share = self.measured / self.model - 1.0;
        if !share.is_finite() || share.abs() <= WARM_UP_AGREEMENT {
            Agreement::Agrees
        } else if share > 0.0 {
            Agreement::MoreHeat(share)
        } else {
            Agreement::LessHeat(-share)
        }
    }

    /// The agreement in words.
    pub fn describe(&self) -> String {
        match self.agreement() {
            Agreement::Agrees => format!(
                "The model explains the machine: the two agree within {:.0} %.",
                WARM_UP_AGREEMENT * 100.0
            ),
            Agreement::MoreHeat(share) => format!(
                "The machine puts {:.0} % more heat into the oil than the model: look for flow crossing a valve the model does not know of (a relief cracked open, a worn pump, a leaking valve), or a cooler that was working during the readings.",
                share * 100.0
            ),
            Agreement::LessHeat(share) => format!(
                "The machine puts {:.0} % less heat into the oil than the model: check the phases and settings entered against the machine, and that the readings were taken while it cycled.",
                share * 100.0
            ),
        }
    }
}

/// The heat the field's warm-up shows against the model's, for the machine as found.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct WarmUpCheck {
    /// The readings' mean temperature, kelvin.
    #[serde(rename = "mean_k")]
    pub mean: f64,
    /// From the readings ([`heat_from_warm_up`]), W.
    #[serde(rename = "measured_heat_w")]
    pub measured: f64,
    /// The model's heat into the oil at the mean temperature, W.
    #[serde(rename = "model_heat_w")]
    pub model: f64,
}

/// "Steady" is within this many kelvin of the settled temperature.
pub const WITHIN: f64 = 1.0;

/// Integrates `capacity dT/dt = heat_in(T) - out(T)` from `start` (kelvin) until within half
/// of [`WITHIN`] of `steady`. `heat_in` is sampled at a few temperatures between the two and
/// interpolated (it changes gently), so the curve costs a few solves, not one per step.
pub fn warm_up(
    heat_in: &mut dyn FnMut(f64) -> f64,
    paths: &HeatPaths,
    capacity: f64,
    start: f64,
    steady: f64,
) -> WarmUp {
    const SAMPLES: usize = 9;
    let samples: Vec<(f64, f64)> = (0..SAMPLES)
        .map(|i| {
            let t = start + (steady - start) * i as f64 / (SAMPLES - 1) as f64;
            (t, heat_in(t))
        })
        .collect();
    let heat_at = |t: f64| interpolate(&samples, t);
    let rate = |t: f64| (heat_at(t) - paths.out(t)) / capacity;
    if (start - steady).abs() <= WITHIN {
        return WarmUp {
            curve: vec![(0.0, start)],
            time_to_steady: None,
        };
    }
    // The time constant near steady sets the step: C over the net conductance there.
    let conductance = {
        let dt = 0.01 * (steady - start);
        ((paths.out(steady) - heat_at(steady)) - (paths.out(steady - dt) - heat_at(steady - dt)))
            / dt
    };
    let tau = if conductance > 0.0 {
        capacity / conductance
    } else {
        capacity * (start - steady).abs() / paths.out(steady).abs().max(1.0)
    };
    let step = tau / 200.0;
    let (mut time, mut t) = (0.0, start);
    let mut curve = vec![(0.0, start)];
    let mut time_to_steady = None;
    for i in 1..=20_000 {
        let k1 = rate(t);
        let k2 = rate(t + step * k1 / 2.0);
        let k3 = rate(t + step * k2 / 2.0);
        let k4 = rate(t + step * k3);
        t += step * (k1 + 2.0 * k2 + 2.0 * k3 + k4) / 6.0;
        time += step;
        if i % 10 == 0 {
            curve.push((time, t));
        }
        if time_to_steady.is_none() && (t - steady).abs() <= WITHIN {
            time_to_steady = Some(time);
        }
        if (t - steady).abs() <= WITHIN / 2.0 {
            curve.push((time, t));
            break;
        }
    }
    WarmUp {
        curve,
        time_to_steady,
    }
}

fn interpolate(samples: &[(f64, f64)], t: f64) -> f64 {
    let (first, last) = (samples[0], samples[samples.len() - 1]);
    let rising = last.0 >= first.0;
    let pos = samples
        .windows(2)
        .position(|w| if rising { t <= w[1].0 } else { t >= w[1].0 })
        .unwrap_or(samples.len() - 2);
    let (a, b) = (samples[pos], samples[pos + 1]);
    if (b.0 - a.0).abs() < f64::MIN_POSITIVE {
        return a.1;
    }
    a.1 + (t - a.0) * (b.1 - a.1) / (b.0 - a.0)
}

/// A temperature read during a warm-up.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct TemperatureReading {
    /// Minutes or seconds into the warm-up: only the difference between two readings counts.
    #[serde(rename = "time_s")]
    pub time: uom::si::f64::Time,
    #[serde(rename = "oil_k")]
    pub oil: ThermodynamicTemperature,
}

/// Two temperatures read during a warm-up of the machine as found.
#[derive(Clone, Copy, Debug, PartialEq, Serialize, Deserialize)]
pub struct FieldWarmUp {
    pub first: TemperatureReading,
    pub second: TemperatureReading,
}

/// The heat going into the oil between two readings, W: what warmed the oil and steel
/// (capacity x rise / time) plus what the tank and cooler shed meanwhile, at the mean
/// temperature. `None` when the readings are not in time order.
pub fn heat_from_warm_up(
    first: &TemperatureReading,
    second: &TemperatureReading,
    capacity: f64,
    paths: &HeatPaths,
) -> Option<f64> {
    let dt = second.time.value - first.time.value;
    if dt <= 0.0 {
        return None;
    }
    let rise = second.oil.value - first.oil.value;
    let mean = 0.5 * (first.oil.value + second.oil.value);
    Some(capacity * rise / dt + paths.out(mean))
}

#[cfg(test)]
mod tests {
    use super::*;
    use uom::si::area::square_meter;
    use uom::si::power::kilowatt;
    use uom::si::temperature_interval::kelvin as k;
    use uom::si::thermodynamic_temperature::degree_celsius;

    const C0: f64 = 273.15;

    fn tank(area: f64, air: AirAround) -> Tank {
        Tank {
            size: TankSize::WettedArea {
                area: Area::new::<square_meter>(area),
            },
            air,
            ambient: ThermodynamicTemperature::new::<degree_celsius>(25.0),
            steel_mass: None,
        }
    }

    fn cooler(kw: f64) -> Cooler {
        Cooler {
            coolant: Coolant::Water,
            coolant_temperature: ThermodynamicTemperature::new::<degree_celsius>(20.0),
            rated_heat: Power::new::<kilowatt>(kw),
            rated_difference: TemperatureInterval::new::<k>(25.0),
        }
    }

    /// Casey's coefficients: a tank with 2 m2 of wetted wall in a normal workshop, its oil
    /// 30 K above the air, sheds 12 x 2 x 30 = 720 W; in still air half that.
    #[test]
    fn tank_walls_shed_by_the_published_coefficients() {
        assert_eq!(tank(2.0, AirAround::Normal).sheds(C0 + 55.0), 720.0);
        assert_eq!(tank(2.0, AirAround::Still).sheds(C0 + 55.0), 360.0);
        let boxed = Tank {
            size: TankSize::Box {
                length: Length::new::<uom::si::length::meter>(1.0),
                width: Length::new::<uom::si::length::meter>(0.5),
                oil_depth: Length::new::<uom::si::length::meter>(0.4),
            },
            ..tank(0.0, AirAround::Normal)
        };
        // Floor 0.5 m2 and walls 2 x 1.5 x 0.4 = 1.2 m2.
        assert!((boxed.wetted_area() - 1.7).abs() < 1e-12);
    }

    /// Heat in equals heat out at the steady temperature, to 1e-9 relative, with losses that
    /// fall as the oil thins.
    #[test]
    fn heat_in_equals_heat_out_where_it_settles() {
        let t = tank(2.0, AirAround::Normal);
        let c = cooler(5.0);
        let paths = HeatPaths {
            tank: &t,
            cooler: Some(&c),
        };
        let mut heat_in = |temp: f64| 4000.0 - 10.0 * (temp - C0);
        let Settling::At(steady) = settle(&mut heat_in, &paths) else {
            panic!("does not settle");
        };
        let (into, out) = (heat_in(steady), paths.out(steady));
        assert!((into - out).abs() <= 1e-9 * into, "{into} in, {out} out");
    }

    /// A bigger cooler never gives a hotter oil; no cooler at all, hotter still; too much heat
    /// for the tank is said, not hidden.
    #[test]
    fn a_bigger_cooler_never_gives_a_hotter_oil() {
        let t = tank(1.5, AirAround::Still);
        let mut heat_in = |temp: f64| 3000.0 + 5.0 * (temp - C0);
        let settled = |cooler: Option<&Cooler>, heat_in: &mut dyn FnMut(f64) -> f64| match settle(
            heat_in,
            &HeatPaths { tank: &t, cooler },
        ) {
            Settling::At(x) => x,
            Settling::Above(x) => x,
        };
        let none = settled(None, &mut heat_in);
        let mut last = none;
        for kw in [0.5, 1.0, 2.0, 4.0, 8.0, 16.0] {
            let c = cooler(kw);
            let steady = settled(Some(&c), &mut heat_in);
            assert!(steady <= last, "{kw} kW: {steady} after {last}");
            last = steady;
        }
        let mut too_much = |_: f64| 50_000.0;
        assert!(matches!(
            settle(
                &mut too_much,
                &HeatPaths {
                    tank: &t,
                    cooler: None
                }
            ),
            Settling::Above(_)
        ));
    }

    /// The warm-up starts at the start temperature and tends to the steady one; with heat in
    /// that does not change, it is the textbook exponential, within 1 K after tau ln(dT0 / 1 K).
    #[test]
    fn the_warm_up_starts_cold_and_tends_to_steady() {
        let t = tank(2.0, AirAround::Normal);
        let paths = HeatPaths {
            tank: &t,
            cooler: None,
        };
        let mut heat_in = |_: f64| 1200.0;
        let Settling::At(steady) = settle(&mut heat_in, &paths) else {
            panic!()
        };
        assert!((steady - (C0 + 75.0)).abs() < 1e-9);
        let capacity = 0.3 * 870.0 * 1900.0;
        let start = C0 + 25.0;
        let w = warm_up(&mut heat_in, &paths, capacity, start, steady);
        assert_eq!(w.curve[0], (0.0, start));
        let (_, end) = *w.curve.last().unwrap();
        assert!((end - steady).abs() <= WITHIN / 2.0);
        assert!(w
            .curve
            .windows(2)
            .all(|p| p[1].1 >= p[0].1 && p[1].0 > p[0].0));
        let tau = capacity / (12.0 * 2.0);
        let expected = tau * (50.0f64 / 1.0).ln();
        let got = w.time_to_steady.unwrap();
        assert!(
            (got - expected).abs() < 0.01 * expected,
            "{got} s, not {expected}"
        );
    }

    /// The field's warm-up: readings that rise 6 K in 10 minutes in 300 kg of oil at
    /// 1.9 kJ/(kg.K), with the tank shedding at the mean temperature, give the heat going in.
    #[test]
    fn heat_from_two_readings() {
        let t = tank(2.0, AirAround::Normal);
        let paths = HeatPaths {
            tank: &t,
            cooler: None,
        };
        let at = |min: f64, c: f64| TemperatureReading {
            time: uom::si::f64::Time::new::<uom::si::time::minute>(min),
            oil: ThermodynamicTemperature::new::<degree_celsius>(c),
        };
        let capacity = 300.0 * 1900.0;
        let heat = heat_from_warm_up(&at(5.0, 30.0), &at(15.0, 36.0), capacity, &paths).unwrap();
        let expected = capacity * 6.0 / 600.0 + 12.0 * 2.0 * (33.0 - 25.0);
        assert!((heat - expected).abs() < 1e-9 * expected);
        assert_eq!(
            heat_from_warm_up(&at(15.0, 36.0), &at(5.0, 30.0), capacity, &paths),
            None
        );
    }
}
