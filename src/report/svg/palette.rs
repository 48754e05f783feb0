//! The colours and line styles of panelpoint's drawings, in one place.
//!
//! Chosen for this project: tension and compression differ in hue (deep
//! blue against amber, a pair that stays apart for the common red–green
//! colour-vision deficiencies), in lightness (about 29 against 67 in CIE
//! L*, so they separate in grey print), and in line style (compression a
//! solid bar, tension a double line: a dark outer stroke with a pale core).
//! Utilization uses a ramp of steadily falling lightness, cream to navy, so
//! its order reads without hue; a failing member (> 1) leaves the ramp for
//! vermilion and is also drawn with a broken white core and a "!" label.

/// Text, arrows, outlines.
pub const INK: &str = "#1d2430";
/// Members in the model view.
pub const STRUCTURE: &str = "#3d4653";
/// Secondary lines: the undeformed shape, zero-force members, grid.
pub const FAINT: &str = "#9aa3ad";
/// Paper.
pub const PAPER: &str = "#ffffff";
/// Tension: deep blue outer stroke and its pale core (double line).
pub const TENSION: &str = "#1b4482";
pub const TENSION_CORE: &str = "#d4e3f5";
/// Compression: amber, solid.
pub const COMPRESSION: &str = "#e3912f";
/// The deflected shape.
pub const DEFLECTED: &str = "#6b3fa0";
/// Applied loads.
pub const LOAD: &str = "#1d2430";
/// Reactions (drawn open-headed).
pub const REACTION: &str = "#56606b";
/// A member whose utilization exceeds 1.
pub const FAIL: &str = "#d0451b";
/// Influence-line fill above and below the axis.
pub const INFLUENCE_POS: &str = "#1b4482";
pub const INFLUENCE_NEG: &str = "#e3912f";

/// The utilization ramp from 0 to 1: (utilization, colour), lightness
/// falling monotonically.
pub const RAMP: [(f64, [u8; 3]); 4] = [
    (0.0, [0xf3, 0xef, 0xd4]),
    (0.35, [0xbc, 0xd3, 0xa3]),
    (0.7, [0x4d, 0x9a, 0x8f]),
    (1.0, [0x1b, 0x3f, 0x66]),
];

/// RGB of a `#rrggbb` constant (for tests that check rendered pixels).
pub fn rgb(hex: &str) -> [u8; 3] {
    let h = hex.trim_start_matches('#');
    let p = |i: usize| u8::from_str_radix(h.get(i..i + 2).unwrap_or("00"), 16).unwrap_or(0);
    [p(0), p(2), p(4)]
}

fn hex(c: [u8; 3]) -> String {
    format!("#{:02x}{:02x}{:02x}", c[0], c[1], c[2])
}

/// The ramp colour of a utilization in [0, 1] (clamped), linear in sRGB
/// between the stops; above 1 the failure colour.
pub fn utilization(u: f64) -> String {
    if u > 1.0 {
        return FAIL.to_string();
    }
    let u = if u.is_finite() { u.max(0.0) } else { 0.0 };
    for pair in RAMP.windows(2) {
        let ((u0, c0), (u1, c1)) = (pair[0], pair[1]);
        if u <= u1 {
            let t = (u - u0) / (u1 - u0);
            let mix = |a: u8, b: u8| (a as f64 + (b as f64 - a as f64) * t).round() as u8;
            return hex([mix(c0[0], c1[0]), mix(c0[1], c1[1]), mix(c0[2], c1[2])]);
        }
    }
    hex(RAMP[RAMP.len() - 1].1)
}

/// Relative luminance (WCAG 2 definition) of an sRGB colour.
pub fn luminance(c: [u8; 3]) -> f64 {
    let lin = |v: u8| {
        let v = v as f64 / 255.0;
        if v <= 0.04045 {
            v / 12.92
        } else {
            ((v + 0.055) / 1.055).powf(2.4)
        }
    };
    0.2126 * lin(c[0]) + 0.7152 * lin(c[1]) + 0.0722 * lin(c[2])
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ramp_ends_and_failure() {
        assert_eq!(utilization(0.0), "#f3efd4");
        assert_eq!(utilization(1.0), "#1b3f66");
        assert_eq!(utilization(1.01), FAIL);
        assert_eq!(utilization(f64::NAN), "#f3efd4");
    }

    #[test]
    fn ramp_lightness_falls_and_pair_separates_in_grey() {
        // Monotone luminance makes the ramp readable without hue.
        let mut last = f64::INFINITY;
        for i in 0..=20 {
            let l = luminance(rgb(&utilization(i as f64 / 20.0)));
            assert!(l < last, "ramp luminance must fall at {i}");
            last = l;
        }
        // Tension and compression differ in grey by a clear step (WCAG
        // contrast ratio (L1 + 0.05)/(L2 + 0.05) above 3, WCAG 2 §1.4.11).
        let (t, c) = (luminance(rgb(TENSION)), luminance(rgb(COMPRESSION)));
        assert!((c + 0.05) / (t + 0.05) > 3.0, "{t} {c}");
    }
}
