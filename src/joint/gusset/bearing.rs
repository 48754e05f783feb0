//! Bearing of the fasteners on the gusset plates at their holes, AASHTO
//! LRFD 6.13.2.9 (standard holes), per hole and plate:
//!
//!   Rn = 2.4·d·t·Fu          where the clear distance Lc ≥ 2.0·d   (Eq. 6.13.2.9-1)
//!   Rn = 1.2·Lc·t·Fu         otherwise                            (Eq. 6.13.2.9-2)
//!
//! taken here as the lesser of the two for every hole (the same thing).
//! Lc is the clear distance to the next hole (pitch − hole) or, for the
//! row nearest the plate edge, to the edge (edge distance − hole/2). The
//! force is taken as pulling toward that edge in tension and compression
//! alike (in compression the end row bears toward the joint's interior
//! and would be stronger: the tension form is the conservative one).

/// Nominal bearing resistance of one hole in one plate, N.
pub fn hole_rn(d: f64, t: f64, fu: f64, lc: f64) -> f64 {
    (2.4 * d * t * fu).min(1.2 * lc.max(0.0) * t * fu)
}

/// A rectangular fastener pattern for bearing: `lines` gauge lines along
/// the force, `rows` fasteners on each, `pitch` between rows, `edge` from
/// the outermost row to the plate edge, all in m.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Pattern {
    pub lines: u32,
    pub rows: u32,
    pub pitch: f64,
    pub edge: f64,
    pub diameter: f64,
    pub hole: f64,
}

/// Nominal bearing resistance of the group on `plates` plates of thickness
/// `t` and strength `fu`, N: per gauge line, the edge hole with
/// Lc = edge − hole/2 and the others with Lc = pitch − hole.
pub fn group_rn(p: &Pattern, t: f64, fu: f64, plates: u32) -> f64 {
    let edge = hole_rn(p.diameter, t, fu, p.edge - p.hole / 2.0);
    let inner = hole_rn(p.diameter, t, fu, p.pitch - p.hole);
    let per_line = edge + f64::from(p.rows.saturating_sub(1)) * inner;
    per_line * f64::from(p.lines) * f64::from(plates)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::joint::gusset::fasteners::{INCH, KSI};

    #[test]
    fn bearing_of_a_two_line_group_by_hand() {
        // 7/8 in rivets in 15/16 in holes, 2 lines × 3 rows, pitch 3 in,
        // edge 1.5 in; one 1/2 in plate, Fu = 60 ksi (hand calculation,
        // AASHTO LRFD Eqs. 6.13.2.9-1/-2):
        //   2.4·d·t·Fu = 2.4 × 0.875 × 0.5 × 60 = 63.0 kip
        //   edge hole: Lc = 1.5 − 0.46875 = 1.03125 in → 1.2 × 1.03125 × 0.5 × 60 = 37.125 kip
        //   inner:     Lc = 3 − 0.9375 = 2.0625 in → 1.2 × 2.0625 × 0.5 × 60 = 74.25 → 63.0 kip
        //   per line 37.125 + 2 × 63.0 = 163.125; two lines 326.25 kip.
        let p = Pattern {
            lines: 2,
            rows: 3,
            pitch: 3.0 * INCH,
            edge: 1.5 * INCH,
            diameter: 0.875 * INCH,
            hole: 0.9375 * INCH,
        };
        let rn = group_rn(&p, 0.5 * INCH, 60.0 * KSI, 1);
        let kip = rn / 4_448.221_615_260_5;
        assert!((kip - 326.25).abs() < 1e-6, "{kip}");
        // Two plates double it.
        assert!((group_rn(&p, 0.5 * INCH, 60.0 * KSI, 2) / rn - 2.0).abs() < 1e-12);
    }
}
