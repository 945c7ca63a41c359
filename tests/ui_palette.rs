//! The ledger's chart colours stay apart for people with a colour-vision deficiency.
//!
//! Each colour of `style/main.css` (`.seg-…`) is passed through the simulation of Machado,
//! Oliveira and Fernandes (2009), "A Physiologically-based Model for Simulation of Color Vision
//! Deficiency", IEEE TVCG 15(6), at severity 1.0 (protanopia, deuteranopia, tritanopia), applied
//! in linear sRGB (IEC 61966-2-1). Every pair must then differ by at least ΔE₀₀ = 10 (CIEDE2000,
//! CIE 142-2001, in CIELAB under D65): a floor for telling categories apart at a glance that is
//! common practice in chart design, not a standard's figure.

use std::path::Path;

/// Machado et al. (2009), severity 1.0, rows applied to linear RGB.
const SIMULATIONS: [(&str, [[f64; 3]; 3]); 4] = [
    (
        "normal vision",
        [[1.0, 0.0, 0.0], [0.0, 1.0, 0.0], [0.0, 0.0, 1.0]],
    ),
    (
        "protanopia",
        [
            [0.152286, 1.052583, -0.204868],
            [0.114503, 0.786281, 0.099216],
            [-0.003882, -0.048116, 1.051998],
        ],
    ),
    (
        "deuteranopia",
        [
            [0.367322, 0.860646, -0.227968],
            [0.280085, 0.672501, 0.047413],
            [-0.011820, 0.042940, 0.968881],
        ],
    ),
    (
        "tritanopia",
        [
            [1.255528, -0.076749, -0.178779],
            [-0.078411, 0.930809, 0.147602],
            [0.004733, 0.691367, 0.303900],
        ],
    ),
];

/// The smallest CIEDE2000 difference between two of the chart's colours, common practice.
const FLOOR: f64 = 10.0;

/// The segment classes the charts draw (`src/ui/charts.rs`), each with its fill in the style.
fn segment_colours() -> Vec<(String, [u8; 3])> {
    let css = std::fs::read_to_string(Path::new(env!("CARGO_MANIFEST_DIR")).join("style/main.css"))
        .expect("style/main.css");
    css.lines()
        .filter_map(|line| {
            let rest = line.trim().strip_prefix(".seg-")?;
            let (name, body) = rest.split_once('{')?;
            let fill = body.split("fill:").nth(1)?.trim().strip_prefix('#')?;
            let hex = fill.get(..6)?;
            let byte = |i: usize| u8::from_str_radix(&hex[i..i + 2], 16).ok();
            Some((name.trim().to_string(), [byte(0)?, byte(2)?, byte(4)?]))
        })
        .collect()
}

fn linear(c: u8) -> f64 {
    let c = f64::from(c) / 255.0;
    if c <= 0.04045 {
        c / 12.92
    } else {
        ((c + 0.055) / 1.055).powf(2.4)
    }
}

/// CIELAB (D65) of a linear-sRGB colour, clipped to the display's gamut first.
fn lab(rgb: [f64; 3]) -> [f64; 3] {
    let [r, g, b] = rgb.map(|v| v.clamp(0.0, 1.0));
    let x = 0.4124 * r + 0.3576 * g + 0.1805 * b;
    let y = 0.2126 * r + 0.7152 * g + 0.0722 * b;
    let z = 0.0193 * r + 0.1192 * g + 0.9505 * b;
    let f = |t: f64| {
        if t > 216.0 / 24389.0 {
            t.cbrt()
        } else {
            (24389.0 / 27.0 * t + 16.0) / 116.0
        }
    };
    let (fx, fy, fz) = (f(x / 0.95047), f(y), f(z / 1.08883));
    [116.0 * fy - 16.0, 500.0 * (fx - fy), 200.0 * (fy - fz)]
}

fn simulate(colour: [u8; 3], m: &[[f64; 3]; 3]) -> [f64; 3] {
    let c = colour.map(linear);
    lab(m.map(|row| row[0] * c[0] + row[1] * c[1] + row[2] * c[2]))
}

/// CIEDE2000 colour difference (CIE 142-2001; the formulas as Sharma, Wu and Dalal set them
/// out with their test data, Color Res. Appl. 30(1), 2005).
fn ciede2000(a: [f64; 3], b: [f64; 3]) -> f64 {
    let ([l1, a1, b1], [l2, a2, b2]) = (a, b);
    let c_bar = (a1.hypot(b1) + a2.hypot(b2)) / 2.0;
    let g = 0.5 * (1.0 - (c_bar.powi(7) / (c_bar.powi(7) + 25f64.powi(7))).sqrt());
    let (a1p, a2p) = ((1.0 + g) * a1, (1.0 + g) * a2);
    let (c1p, c2p) = (a1p.hypot(b1), a2p.hypot(b2));
    let hue = |b: f64, a: f64| b.atan2(a).to_degrees().rem_euclid(360.0);
    let (h1p, h2p) = (hue(b1, a1p), hue(b2, a2p));
    let dl = l2 - l1;
    let dc = c2p - c1p;
    let dh = if c1p * c2p == 0.0 {
        0.0
    } else {
        let d = h2p - h1p;
        if d > 180.0 {
            d - 360.0
        } else if d < -180.0 {
            d + 360.0
        } else {
            d
        }
    };
    let d_big_h = 2.0 * (c1p * c2p).sqrt() * (dh / 2.0).to_radians().sin();
    let l_bar = (l1 + l2) / 2.0;
    let c_bar_p = (c1p + c2p) / 2.0;
    let h_bar = if c1p * c2p == 0.0 {
        h1p + h2p
    } else if (h1p - h2p).abs() <= 180.0 {
        (h1p + h2p) / 2.0
    } else if h1p + h2p < 360.0 {
        (h1p + h2p + 360.0) / 2.0
    } else {
        (h1p + h2p - 360.0) / 2.0
    };
    let cos = |deg: f64| deg.to_radians().cos();
    let t =
        1.0 - 0.17 * cos(h_bar - 30.0) + 0.24 * cos(2.0 * h_bar) + 0.32 * cos(3.0 * h_bar + 6.0)
            - 0.20 * cos(4.0 * h_bar - 63.0);
    let d_theta = 30.0 * (-((h_bar - 275.0) / 25.0).powi(2)).exp();
    let r_c = 2.0 * (c_bar_p.powi(7) / (c_bar_p.powi(7) + 25f64.powi(7))).sqrt();
    let s_l = 1.0 + 0.015 * (l_bar - 50.0).powi(2) / (20.0 + (l_bar - 50.0).powi(2)).sqrt();
    let s_c = 1.0 + 0.045 * c_bar_p;
    let s_h = 1.0 + 0.015 * c_bar_p * t;
    let r_t = -(2.0 * d_theta).to_radians().sin() * r_c;
    ((dl / s_l).powi(2)
        + (dc / s_c).powi(2)
        + (d_big_h / s_h).powi(2)
        + r_t * (dc / s_c) * (d_big_h / s_h))
        .sqrt()
}

#[test]
fn ciede2000_gives_the_published_test_differences() {
    // Sharma, Wu and Dalal (2005), Table 1: pairs 1, 7 and 17 with their ΔE₀₀.
    for (a, b, expected) in [
        ([50.0, 2.6772, -79.7751], [50.0, 0.0, -82.7485], 2.0425),
        ([50.0, 0.0, 0.0], [50.0, -1.0, 2.0], 2.3669),
        ([50.0, 2.5, 0.0], [73.0, 25.0, -18.0], 27.1492),
    ] {
        let got = ciede2000(a, b);
        assert!(
            (got - expected).abs() < 5e-4,
            "{a:?} {b:?}: {got} for {expected}"
        );
    }
}

#[test]
fn the_simulation_turns_pure_red_and_green_alike_for_a_deuteranope() {
    // The check can fail: under deuteranopia, sRGB red and green come out far closer than they
    // are to normal vision.
    let deutan = &SIMULATIONS[2].1;
    let normal = &SIMULATIONS[0].1;
    let (red, green) = ([255, 0, 0], [0, 160, 0]);
    let seen = ciede2000(simulate(red, deutan), simulate(green, deutan));
    let normally = ciede2000(simulate(red, normal), simulate(green, normal));
    assert!(seen < normally / 2.0, "{seen} against {normally}");
}

#[test]
fn every_ledger_colour_stays_apart_under_each_colour_vision_deficiency() {
    let colours = segment_colours();
    // One colour per ledger item (src/ui/charts.rs LEDGER_ITEMS).
    for class in [
        "useful",
        "relief",
        "metering",
        "unloading",
        "line",
        "pump",
        "motor",
        "drive",
    ] {
        assert!(
            colours.iter().any(|(name, _)| name == class),
            "no .seg-{class} fill in style/main.css"
        );
    }
    let mut too_close = Vec::new();
    for (vision, matrix) in &SIMULATIONS {
        for (i, (a, ca)) in colours.iter().enumerate() {
            for (b, cb) in &colours[i + 1..] {
                let d = ciede2000(simulate(*ca, matrix), simulate(*cb, matrix));
                if d < FLOOR {
                    too_close.push(format!("{vision}: {a} and {b} differ by ΔE00 {d:.1}"));
                }
            }
        }
    }
    assert!(too_close.is_empty(), "{too_close:#?}");
}
