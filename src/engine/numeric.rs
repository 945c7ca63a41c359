//! Where a function of one number crosses zero: the one search behind the oil's settling
//! temperature, a move's flow through its lines and an oil's 100 degC viscosity.

/// The most steps [`false_position`] takes; the searches here close in a handful.
pub const MOST_STEPS: usize = 200;

/// The root of `f` between `a` and `b`, given with `f` there (`fa` and `fb` of opposite
/// signs), by false position with the Illinois step: an end kept twice running has its value
/// halved, so the bracket closes from both sides. Stops when `close_enough(x, f(x))`, when the
/// bracket is no wider than `width`, or after [`MOST_STEPS`] steps.
pub fn false_position(
    f: &mut dyn FnMut(f64) -> f64,
    (mut a, mut fa): (f64, f64),
    (mut b, mut fb): (f64, f64),
    close_enough: &dyn Fn(f64, f64) -> bool,
    width: f64,
) -> f64 {
    // Which end the last step moved: 1 for `a`, -1 for `b`.
    let mut moved = 0;
    for _ in 0..MOST_STEPS {
        let x = (a * fb - b * fa) / (fb - fa);
        let fx = f(x);
        if close_enough(x, fx) || b - a <= width {
            return x;
        }
        if (fx > 0.0) == (fa > 0.0) {
            (a, fa) = (x, fx);
            if moved == 1 {
                fb /= 2.0;
            }
            moved = 1;
        } else {
            (b, fb) = (x, fx);
            if moved == -1 {
                fa /= 2.0;
            }
            moved = -1;
        }
    }
    (a * fb - b * fa) / (fb - fa)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A curved function's root, from either sign at the low end: x^3 = 2.
    #[test]
    fn finds_the_cube_root_of_two_from_either_side() {
        let root = 2f64.cbrt();
        for sign in [1.0, -1.0] {
            let mut f = |x: f64| sign * (x * x * x - 2.0);
            let (fa, fb) = (f(0.0), f(3.0));
            let x = false_position(&mut f, (0.0, fa), (3.0, fb), &|_, fx| fx.abs() < 1e-14, 0.0);
            assert!((x - root).abs() < 1e-12, "{x}");
        }
    }
}
