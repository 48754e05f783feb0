//! Single angles connected through one leg: the equivalent slenderness of
//! AISC 360-16 §E5 (the same equations as AASHTO LRFD 6.9.4.4 — from
//! memory), a member whose section is one angle loaded at its ends through
//! one leg.
//!
//! §E5 lets the eccentricity of such a member be neglected and the member be
//! checked as axially loaded by §E3 (or §E7) with an equivalent slenderness
//! `Lc/r` that allows both for the eccentricity and for the end restraint of
//! the connection. Case (a), an individual member or a web member of a
//! **planar** truss with adjacent web members attached to the same side of
//! the gusset plate or chord (the case of every panelpoint model, a plane
//! truss), with `L` the length between work points and `ra` the radius of
//! gyration about the geometric axis parallel to the connected leg:
//!
//! * equal legs, or unequal legs connected through the longer leg:
//!   `Lc/r = 72 + 0.75·L/ra` when `L/ra ≤ 80` (Eq. E5-1),
//!   `Lc/r = 32 + 1.25·L/ra` when `L/ra > 80` (Eq. E5-2);
//! * unequal legs connected through the shorter leg: the same plus
//!   `4·[(bl/bs)² − 1]`, and not less than `0.95·L/rz`.
//!
//! Case (b), web members of box or space trusses (Eqs. E5-3, E5-4, adding
//! `6·[(bl/bs)² − 1]` for the shorter leg, not less than `0.82·L/rz`), is
//! [`e5_slenderness`] with [`E5Case::BoxOrSpaceTruss`]; a plane truss never
//! uses it.
//!
//! Conditions of §E5, checked where the model knows them and otherwise
//! assumed and said in the notes: (1) loaded at both ends through the same
//! leg; (2) welded or at least two bolts (rivets) per connection; (3) no
//! transverse load between the ends (a truss member: loads at panel points);
//! (4) `Lc/r ≤ 200`; (5) long leg over short leg less than 1.7. Where a
//! condition that the model knows fails, §E5 is not used and the code asks
//! for Chapter H (axial force with the bending of the eccentricity), which is
//! not checked here: the note says so and that the reported capacity may be
//! above the code's.
//!
//! **Interpretation (conservative).** The §E5 slenderness is an added
//! buckling mode ("single angle, §E5") taking the place of flexural buckling
//! about the geometric axis; the principal-axis flexural modes (§E3 with
//! `rz` and the major axis) and flexural-torsional buckling (§E4, checked
//! even when `b/t ≤ 0.71·√(E/Fy)` would let it be skipped) stay, and the
//! lowest governs. The code lets the §E5 slenderness stand for the
//! principal-axis check too (the user note and commentary of §E5, from
//! memory), so for long equal-leg angles (`L/ra` above about 103, where
//! `1.56·L/ra > 32 + 1.25·L/ra`) the capacity reported may be below the
//! code's — never above it.
//!
//! Where the model does not say which leg is connected, both are tried and
//! the larger `Lc/r` taken (conservative; not always the shorter leg: its
//! `ra`, about the axis parallel to the short leg, is the larger radius, so
//! a short member can come out more slender through the longer leg); for
//! equal legs the two are one. A section marked `Both` (connected through
//! both legs) has no §E5 mode.

use super::modes::{BucklingMode, ModeKind};
use crate::model::{BuiltUp, ConnectedLeg, Model};
use crate::section::{Loss, Shape};
use std::f64::consts::PI;

/// §E5 condition (5): long leg over short leg below this (AISC 360-16).
pub const LEG_RATIO_LIMIT: f64 = 1.7;
/// §E5 condition (4): `Lc/r` not above this.
pub const SLENDERNESS_LIMIT: f64 = 200.0;

/// Which of §E5's two cases.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum E5Case {
    /// §E5(a): individual members or web members of planar trusses with
    /// adjacent web members attached to the same side.
    PlanarTruss,
    /// §E5(b): web members of box or space trusses.
    BoxOrSpaceTruss,
}

/// The equation of §E5 used.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct E5Equation {
    pub case: E5Case,
    /// Below the break (`L/ra ≤ 80` in (a), `≤ 75` in (b)): Eq. E5-1 / E5-3.
    pub short: bool,
    /// Connected through the shorter leg of an unequal-leg angle.
    pub shorter_leg: bool,
}

impl E5Equation {
    /// The clause and equation, both codes named.
    pub fn clause(self) -> &'static str {
        use E5Case::*;
        match (self.case, self.short, self.shorter_leg) {
            (PlanarTruss, true, false) => "AISC 360-16 §E5(a)(1), Eq. E5-1; AASHTO LRFD 6.9.4.4",
            (PlanarTruss, false, false) => "AISC 360-16 §E5(a)(1), Eq. E5-2; AASHTO LRFD 6.9.4.4",
            (PlanarTruss, true, true) => {
                "AISC 360-16 §E5(a)(2), Eq. E5-1 + 4[(bl/bs)² − 1]; AASHTO LRFD 6.9.4.4"
            }
            (PlanarTruss, false, true) => {
                "AISC 360-16 §E5(a)(2), Eq. E5-2 + 4[(bl/bs)² − 1]; AASHTO LRFD 6.9.4.4"
            }
            (BoxOrSpaceTruss, true, false) => "AISC 360-16 §E5(b)(1), Eq. E5-3",
            (BoxOrSpaceTruss, false, false) => "AISC 360-16 §E5(b)(1), Eq. E5-4",
            (BoxOrSpaceTruss, true, true) => "AISC 360-16 §E5(b)(2), Eq. E5-3 + 6[(bl/bs)² − 1]",
            (BoxOrSpaceTruss, false, true) => "AISC 360-16 §E5(b)(2), Eq. E5-4 + 6[(bl/bs)² − 1]",
        }
    }
}

/// The §E5 equivalent slenderness.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct E5Slenderness {
    /// `Lc/r`.
    pub value: f64,
    /// `L/ra`.
    pub l_over_ra: f64,
    pub equation: E5Equation,
    /// True when the `0.95·L/rz` (or `0.82·L/rz`) floor governed.
    pub floor: bool,
}

/// §E5 `Lc/r` for length `l`, `ra` (geometric axis parallel to the
/// connected leg), `rz` (minor principal axis), legs `bl ≥ bs`, connected
/// through the shorter leg or not. Equal legs never take the shorter-leg
/// terms (they add nothing: `(bl/bs)² − 1 = 0`, and the floor belongs to the
/// unequal-leg clause only).
pub fn e5_slenderness(
    case: E5Case,
    l: f64,
    ra: f64,
    rz: f64,
    bl: f64,
    bs: f64,
    through_shorter: bool,
) -> E5Slenderness {
    let x = l / ra;
    let unequal = through_shorter && bl > bs * (1.0 + 1e-9);
    let (short, base, add, floor) = match case {
        E5Case::PlanarTruss => {
            let short = x <= 80.0;
            let base = if short {
                72.0 + 0.75 * x
            } else {
                32.0 + 1.25 * x
            };
            (short, base, 4.0, 0.95)
        }
        E5Case::BoxOrSpaceTruss => {
            let short = x <= 75.0;
            let base = if short { 60.0 + 0.8 * x } else { 45.0 + x };
            (short, base, 6.0, 0.82)
        }
    };
    let (value, floored) = if unequal {
        let v = base + add * ((bl / bs).powi(2) - 1.0);
        let f = floor * l / rz;
        if f > v {
            (f, true)
        } else {
            (v, false)
        }
    } else {
        (base, false)
    };
    E5Slenderness {
        value,
        l_over_ra: x,
        equation: E5Equation {
            case,
            short,
            shorter_leg: unequal,
        },
        floor: floored,
    }
}

/// The §E5 mode of member `m` whose built-up section `b` may be one angle,
/// with the notes that say what was assumed or why §E5 was not used. No
/// mode and no notes when the section is not a single angle.
pub(super) fn single_angle_mode(
    model: &Model,
    m: usize,
    b: &BuiltUp,
    e: f64,
) -> (Option<BucklingMode>, Vec<String>) {
    let present: Vec<_> = b
        .parts
        .iter()
        .filter(|q| !matches!(q.loss, Some(Loss::Missing)))
        .collect();
    let mut notes = Vec::new();
    let [part] = present.as_slice() else {
        return (None, notes);
    };
    let Shape::Angle { leg_x, leg_y, .. } = part.shape else {
        if matches!(part.drawn_as, Some(crate::section::GivenKind::Angle)) {
            notes.push("single angle given by table properties: its legs are not known, so AISC 360-16 §E5 (connection through one leg) is not checked; the principal-axis checks reported do not allow for that eccentricity (Chapter H) and may overstate the strength".into());
        }
        return (None, notes);
    };
    let (bl, bs) = (leg_x.max(leg_y), leg_x.min(leg_y));
    let ratio = bl / bs;
    if b.connected_leg == Some(ConnectedLeg::Both) {
        notes.push("single angle connected through both legs: AISC 360-16 §E5 not used; principal-axis and §E4 checks".into());
        return (None, notes);
    }
    if ratio >= LEG_RATIO_LIMIT {
        notes.push(format!(
            "single angle with legs in the ratio {ratio:.2} ≥ {LEG_RATIO_LIMIT}: AISC 360-16 §E5 does not apply (condition 5); the code asks for Chapter H (axial force and the bending of the connection's eccentricity), not checked here — the principal-axis capacity reported may overstate the strength"
        ));
        return (None, notes);
    }
    let Ok(mx) = part.orientation.matrix_of(&part.shape) else {
        return (None, notes);
    };
    let p = &b.reduced;
    let rz = (p.i_minor / p.area).sqrt();
    let l = model.length(m);
    let x_is_long = leg_x >= leg_y;
    // §E5 through `leg`: ra about the centroidal axis along the connected
    // leg, whose direction the part's orientation maps from the reference
    // (+x for leg_x, +y for leg_y).
    let through = |leg: ConnectedLeg| {
        let connected_is_x = matches!(leg, ConnectedLeg::Long) == x_is_long;
        let (dx, dy) = if connected_is_x {
            (mx[0][0], mx[1][0])
        } else {
            (mx[0][1], mx[1][1])
        };
        let i_a = p.ix * dx * dx + p.iy * dy * dy - 2.0 * p.ixy * dx * dy;
        let ra = (i_a / p.area).sqrt();
        let shorter = matches!(leg, ConnectedLeg::Short);
        (
            e5_slenderness(E5Case::PlanarTruss, l, ra, rz, bl, bs, shorter),
            ra,
            leg,
        )
    };
    let (s, ra, leg) = match b.connected_leg {
        Some(c) => through(c),
        None => {
            let (a, z) = (through(ConnectedLeg::Long), through(ConnectedLeg::Short));
            let w = if z.0.value >= a.0.value { z } else { a };
            notes.push(if bl > bs * (1.0 + 1e-9) {
                format!(
                    "single angle: the connected leg is not given; taken as connected through one leg, the {} (the larger AISC 360-16 §E5 slenderness: the conservative choice)",
                    leg_name(w.2)
                )
            } else {
                "single angle: the connected leg is not given; taken as connected through one leg (AISC 360-16 §E5; equal legs, either gives the same: the conservative choice)".into()
            });
            w
        }
    };
    if !(s.value.is_finite() && s.value > 0.0) {
        return (None, notes);
    }
    if s.value > SLENDERNESS_LIMIT {
        notes.push(format!(
            "single angle: §E5 slenderness Lc/r = {:.1} > {SLENDERNESS_LIMIT:.0} (AISC 360-16 §E5 condition 4): §E5 not used; the code asks for Chapter H, not checked here — the principal-axis capacity reported may overstate the strength",
            s.value
        ));
        return (None, notes);
    }
    notes.push(format!(
        "single angle connected through {}: equivalent slenderness Lc/r = {:.1} from L/ra = {:.1} ({}{}), as flexural buckling about the geometric axis; the principal-axis and §E4 modes kept, the lowest governs (conservative). Assumed (AISC 360-16 §E5 conditions 1–3 and case (a)): loaded at both ends through that leg by at least two rivets or bolts or by welds, no load between the ends, adjacent web members on the same side of the gusset",
        if bl > bs * (1.0 + 1e-9) {
            format!("the {} leg", leg_name(leg))
        } else {
            "one leg (equal legs)".to_string()
        },
        s.value,
        s.l_over_ra,
        s.equation.clause(),
        if s.floor { "; not less than 0.95·L/rz, which governs" } else { "" }
    ));
    let mode = BucklingMode {
        kind: ModeKind::SingleAngle(s.equation),
        fe: PI * PI * e / (s.value * s.value),
        slenderness: s.value,
        effective_length: l,
        radius: ra,
    };
    (Some(mode), notes)
}

fn leg_name(c: ConnectedLeg) -> &'static str {
    match c {
        ConnectedLeg::Long => "longer",
        ConnectedLeg::Short => "shorter",
        ConnectedLeg::Both => "both",
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn planar_truss_equations_by_hand() {
        // AISC 360-16 Eqs. E5-1/E5-2 by hand. L4×4×½ (AISC Manual, from
        // memory: rx = 1.21 in, rz = 0.776 in), L = 120 in: L/ra = 99.17 > 80,
        // Lc/r = 32 + 1.25·99.17 = 155.96 (Eq. E5-2).
        let s = e5_slenderness(E5Case::PlanarTruss, 120.0, 1.21, 0.776, 4.0, 4.0, true);
        assert!((s.l_over_ra - 99.1736).abs() < 1e-3);
        assert!((s.value - 155.967).abs() < 1e-3, "{}", s.value);
        assert!(!s.equation.short && !s.equation.shorter_leg && !s.floor);
        assert!(s.equation.clause().contains("E5-2"));
        // 5 ft: L/ra = 49.59 ≤ 80, Lc/r = 72 + 0.75·49.59 = 109.19 (Eq. E5-1).
        let s = e5_slenderness(E5Case::PlanarTruss, 60.0, 1.21, 0.776, 4.0, 4.0, false);
        assert!((s.value - 109.190).abs() < 1e-3, "{}", s.value);
        assert!(s.equation.clause().contains("E5-1"));
    }

    #[test]
    fn shorter_leg_adds_and_floors() {
        // An unequal-leg angle with legs 5 and 3 in, radii ra = 0.829 in and
        // rz = 0.642 in (round values for the hand calculation, near an
        // L5×3×½), L = 60 in, through the shorter leg: L/ra = 72.38 ≤ 80,
        // 72 + 0.75·72.38 = 126.28, + 4·((5/3)² − 1) = 7.111 → 133.40;
        // 0.95·60/0.642 = 88.79 does not govern.
        let s = e5_slenderness(E5Case::PlanarTruss, 60.0, 0.829, 0.642, 5.0, 3.0, true);
        let hand = 72.0 + 0.75 * 60.0 / 0.829 + 4.0 * (25.0 / 9.0 - 1.0);
        assert!((s.value - hand).abs() < 1e-9 && (s.value - 133.40).abs() < 0.01);
        assert!(s.equation.shorter_leg && !s.floor);
        // A long member, L = 200 in, with rz small against ra (ra 1.6, rz
        // 0.642, made up to reach the floor): L/ra = 125, 32 + 156.25 + 7.11
        // = 195.36 < 0.95·200/0.642 = 295.95 → the floor governs.
        let s = e5_slenderness(E5Case::PlanarTruss, 200.0, 1.6, 0.642, 5.0, 3.0, true);
        assert!(s.floor && (s.value - 0.95 * 200.0 / 0.642).abs() < 1e-9);
        // Through the longer leg: no addition, no floor.
        let s = e5_slenderness(E5Case::PlanarTruss, 200.0, 1.6, 0.642, 5.0, 3.0, false);
        assert!((s.value - (32.0 + 1.25 * 125.0)).abs() < 1e-9 && !s.floor);
    }

    #[test]
    fn box_truss_equations_by_hand() {
        // AISC 360-16 Eqs. E5-3/E5-4 by hand: L/ra = 50 → 60 + 0.8·50 = 100;
        // L/ra = 100 → 45 + 100 = 145; through the shorter leg of a 5×3:
        // + 6·((5/3)² − 1) = 10.667, floor 0.82·L/rz.
        let s = e5_slenderness(E5Case::BoxOrSpaceTruss, 50.0, 1.0, 0.6, 4.0, 4.0, true);
        assert!((s.value - 100.0).abs() < 1e-9 && s.equation.clause().contains("E5-3"));
        let s = e5_slenderness(E5Case::BoxOrSpaceTruss, 100.0, 1.0, 0.6, 4.0, 4.0, true);
        assert!((s.value - 145.0).abs() < 1e-9 && s.equation.clause().contains("E5-4"));
        let s = e5_slenderness(E5Case::BoxOrSpaceTruss, 100.0, 1.0, 0.9, 5.0, 3.0, true);
        assert!((s.value - (145.0 + 6.0 * (25.0 / 9.0 - 1.0))).abs() < 1e-9);
        assert!(!s.floor, "0.82·100/0.9 = 91.1 < 155.7");
    }
}
