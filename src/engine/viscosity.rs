//! How thick the oil is at a temperature: the kinematic viscosity of a mineral oil along the
//! line ASTM D341 draws through two measured points.
//!
//! ASTM D341 (viscosity-temperature charts for liquid petroleum products) makes the
//! viscosity-temperature curve of a petroleum oil a straight line in
//! `log10(log10(nu + 0.7)) = A - B log10(T)`, with nu in mm^2/s and T in kelvin (the Walther
//! form; D341's plain `+ 0.7` holds down to about 2 mm^2/s, thinner than any hydraulic oil at
//! work). Two measured points (a data sheet's 40 and 100 degC figures) fix A and B, and the
//! line gives the viscosity at any temperature between and somewhat beyond them.
//!
//! An oil sold by its ISO 3448 viscosity grade (VG 32, 46, 68, ...) has the grade's number as
//! its mid-point kinematic viscosity at 40 degC, within +-10 %.

use uom::si::f64::{KinematicViscosity, ThermodynamicTemperature};
use uom::si::kinematic_viscosity::square_millimeter_per_second;
use uom::si::thermodynamic_temperature::kelvin;

/// The ISO 3448 grades hydraulic oils are commonly sold in (mid-point mm^2/s at 40 degC).
pub const ISO_GRADES: [f64; 7] = [15.0, 22.0, 32.0, 46.0, 68.0, 100.0, 150.0];

/// The viscosity at 40 degC an ISO 3448 grade stands for (its number, in mm^2/s).
pub fn grade_viscosity(grade: f64) -> KinematicViscosity {
    KinematicViscosity::new::<square_millimeter_per_second>(grade)
}

/// An oil's viscosity-temperature line (ASTM D341).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ViscosityLine {
    a: f64,
    b: f64,
}

/// Why two points give no line.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum NoLine {
    /// Both points at one temperature.
    SameTemperature,
    /// The oil is not thinner at the hotter point, as every oil is.
    NotThinnerWhenHotter,
    /// A viscosity or temperature that is not a positive number.
    NotPositive,
}

fn double_log(nu: f64) -> f64 {
    (nu + 0.7).log10().log10()
}

impl ViscosityLine {
    /// The line through two measured points (viscosity at a temperature).
    pub fn through(
        (nu1, t1): (KinematicViscosity, ThermodynamicTemperature),
        (nu2, t2): (KinematicViscosity, ThermodynamicTemperature),
    ) -> Result<ViscosityLine, NoLine> {
        let (nu1, nu2) = (
            nu1.get::<square_millimeter_per_second>(),
            nu2.get::<square_millimeter_per_second>(),
        );
        let (t1, t2) = (t1.get::<kelvin>(), t2.get::<kelvin>());
        if [nu1, nu2, t1, t2]
            .iter()
            .any(|x| !x.is_finite() || *x <= 0.0)
        {
            return Err(NoLine::NotPositive);
        }
        if t1 == t2 {
            return Err(NoLine::SameTemperature);
        }
        let (hot, cold) = if t1 > t2 { (nu1, nu2) } else { (nu2, nu1) };
        if hot >= cold {
            return Err(NoLine::NotThinnerWhenHotter);
        }
        let b = (double_log(nu1) - double_log(nu2)) / (t2.log10() - t1.log10());
        let a = double_log(nu1) + b * t1.log10();
        Ok(ViscosityLine { a, b })
    }

    /// The kinematic viscosity at `temperature`.
    pub fn at(&self, temperature: ThermodynamicTemperature) -> KinematicViscosity {
        let z = 10f64.powf(10f64.powf(self.a - self.b * temperature.get::<kelvin>().log10()));
        KinematicViscosity::new::<square_millimeter_per_second>(z - 0.7)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use uom::si::thermodynamic_temperature::degree_celsius;

    fn mm2s(v: f64) -> KinematicViscosity {
        KinematicViscosity::new::<square_millimeter_per_second>(v)
    }

    fn celsius(v: f64) -> ThermodynamicTemperature {
        ThermodynamicTemperature::new::<degree_celsius>(v)
    }

    /// The line passes through the two points it was drawn through, in either order.
    #[test]
    fn the_line_passes_through_its_points() {
        for (p, q) in [
            ((46.0, 40.0), (6.8, 100.0)),
            ((6.8, 100.0), (46.0, 40.0)),
            ((73.30, 40.0), (8.86, 100.0)),
        ] {
            let line = ViscosityLine::through((mm2s(p.0), celsius(p.1)), (mm2s(q.0), celsius(q.1)))
                .unwrap();
            for (nu, t) in [p, q] {
                let got = line.at(celsius(t)).get::<square_millimeter_per_second>();
                assert!((got - nu).abs() < 1e-9 * nu, "{got} at {t} degC, not {nu}");
            }
        }
    }

    /// Near working temperatures a mineral oil's viscosity roughly halves for each 20 K
    /// (common practice): a VG 46 oil with 6.8 mm^2/s at 100 degC has about 20.6 at 60 degC
    /// (worked by hand from the D341 form: 0.45 of its 46 at 40 degC).
    #[test]
    fn a_vg_46_oil_roughly_halves_for_each_20_k() {
        let line = ViscosityLine::through(
            (grade_viscosity(46.0), celsius(40.0)),
            (mm2s(6.8), celsius(100.0)),
        )
        .unwrap();
        let at_60 = line.at(celsius(60.0)).get::<square_millimeter_per_second>();
        assert!((at_60 - 20.6).abs() < 0.1, "{at_60}");
        let mut last = f64::INFINITY;
        for t in (0..=120).step_by(10) {
            let nu = line
                .at(celsius(f64::from(t)))
                .get::<square_millimeter_per_second>();
            assert!(nu < last, "thinner when hotter: {nu} at {t} degC");
            last = nu;
        }
    }

    /// Points that draw no line are refused with the reason.
    #[test]
    fn points_that_draw_no_line_are_refused() {
        let at = |nu: f64, t: f64| (mm2s(nu), celsius(t));
        assert_eq!(
            ViscosityLine::through(at(46.0, 40.0), at(30.0, 40.0)),
            Err(NoLine::SameTemperature)
        );
        assert_eq!(
            ViscosityLine::through(at(46.0, 40.0), at(50.0, 100.0)),
            Err(NoLine::NotThinnerWhenHotter)
        );
        assert_eq!(
            ViscosityLine::through(at(-1.0, 40.0), at(6.8, 100.0)),
            Err(NoLine::NotPositive)
        );
    }
}
