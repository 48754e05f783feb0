//! Eyebars and pin plates: the proportions of AASHTO LRFD 6.8.6 and 6.8.7
//! (recalled from the 7th–9th editions, from memory), reported as met or not
//! with their values; the sharing of a multiple-eyebar member's force among
//! its bars; the MBE system factor of multiple-eyebar members.
//!
//! Eyebars, LRFD 6.8.6 (from memory):
//! - 6.8.6.1: uniform thickness, 0.5 in ≤ t ≤ 2.0 in;
//! - 6.8.6.2: net section of the head across the pin hole, transverse to the
//!   bar's axis, 1.35·Ab ≤ (h − d)·t ≤ 1.60·Ab (Ab = b·t the body);
//!   head beyond the pin hole along the axis a ≥ 0.75·b;
//!   pin diameter D ≥ 0.875·b; body width b ≤ 8·t;
//!   hole d ≤ D + 1/32 in; for Fy > 70 ksi, d ≤ 5·t.
//!
//! Pin plates, LRFD 6.8.7.2 (from memory): the combined net area of the main
//! plate and pin plates across the pin hole, transverse to the member's axis,
//! ≥ 1.40 × the member's net area away from the hole; the combined net area
//! beyond the hole, along the axis, ≥ 1.0 × it.
//!
//! Sharing: the bars of a member with `bars: N` (N ≥ 2) share its force; the
//! statics of the pin takes the shares in proportion to the bars'
//! thicknesses (equal bars, F/N), and the checks of one bar (its bearing, its
//! body) take the most loaded bar at `SHARING`·F/N. `SHARING` = 1.10 is this
//! program's choice, overridable per pin (`factors: (sharing: ..)`): bars of
//! one member made to slightly different lengths or worn unequally at the
//! pin do not share equally (a fact of the trade), and no published factor
//! is held here with confidence.
//!
//! System factor: MBE Table 6A.4.2.4-1 gives φs = 0.90 for multiple-eyebar
//! members in truss bridges (from memory); taken where `lrfr` rates such a
//! member (`bars` ≥ 2), unless the model's `system_factor` is lower.

/// Unequal sharing of a multiple-eyebar member (this program's choice).
pub const SHARING: f64 = 1.10;
/// MBE Table 6A.4.2.4-1: multiple-eyebar members in truss bridges (from memory).
pub const PHI_S_MULTIPLE_EYEBAR: f64 = 0.90;
/// 1/32 in, m: the largest hole clearance of LRFD 6.8.6.2.
pub const HOLE_CLEARANCE: f64 = 0.0254 / 32.0;
/// Thickness limits of LRFD 6.8.6.1, m (0.5 in and 2.0 in).
pub const MIN_THICKNESS: f64 = 0.5 * 0.0254;
pub const MAX_THICKNESS: f64 = 2.0 * 0.0254;
/// 70 ksi in Pa: above it the hole is limited to 5·t.
pub const HIGH_STRENGTH: f64 = 70.0 * 6.894_757_293_168_361e6;

/// One proportion of an article, as given and as required.
#[derive(Clone, Debug, PartialEq)]
pub struct Proportion {
    /// What is compared, e.g. "net section across the hole".
    pub what: &'static str,
    pub clause: &'static str,
    /// The value and the limit (m or m²; `area` says which).
    pub value: f64,
    pub limit: f64,
    /// True when the value must be at least the limit, false at most.
    pub at_least: bool,
    pub area: bool,
    /// The limit's rule in words, e.g. "≥ 1.35·Ab".
    pub rule: &'static str,
}

impl Proportion {
    pub fn met(&self) -> bool {
        if self.at_least {
            self.value >= self.limit * (1.0 - 1e-9)
        } else {
            self.value <= self.limit * (1.0 + 1e-9)
        }
    }
}

/// An eyebar's head as described: body width b, head width h across the
/// pin hole's centre, a the head beyond the hole along the axis, d the hole.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct EyebarHead {
    pub body: f64,
    pub head: f64,
    pub beyond: f64,
    pub hole: f64,
}

/// The proportions of LRFD 6.8.6 of one eyebar of thickness `t` on a pin of
/// diameter `pin`, its steel's yield stress `fy`.
pub fn eyebar_proportions(e: &EyebarHead, t: f64, pin: f64, fy: f64) -> Vec<Proportion> {
    let ab = e.body * t;
    let net = (e.head - e.hole) * t;
    let p = |what, clause, value, limit, at_least, area, rule| Proportion {
        what,
        clause,
        value,
        limit,
        at_least,
        area,
        rule,
    };
    let mut out = vec![
        p(
            "thickness",
            "LRFD 6.8.6.1",
            t,
            MIN_THICKNESS,
            true,
            false,
            "≥ 0.5 in",
        ),
        p(
            "thickness",
            "LRFD 6.8.6.1",
            t,
            MAX_THICKNESS,
            false,
            false,
            "≤ 2.0 in",
        ),
        p(
            "net section across the hole",
            "LRFD 6.8.6.2",
            net,
            1.35 * ab,
            true,
            true,
            "≥ 1.35·Ab",
        ),
        p(
            "net section across the hole",
            "LRFD 6.8.6.2",
            net,
            1.60 * ab,
            false,
            true,
            "≤ 1.60·Ab",
        ),
        p(
            "head beyond the hole",
            "LRFD 6.8.6.2",
            e.beyond,
            0.75 * e.body,
            true,
            false,
            "≥ 0.75·b",
        ),
        p(
            "pin diameter",
            "LRFD 6.8.6.2",
            pin,
            0.875 * e.body,
            true,
            false,
            "≥ 0.875·b",
        ),
        p(
            "body width",
            "LRFD 6.8.6.2",
            e.body,
            8.0 * t,
            false,
            false,
            "≤ 8·t",
        ),
        p(
            "pin hole",
            "LRFD 6.8.6.2",
            e.hole,
            pin + HOLE_CLEARANCE,
            false,
            false,
            "≤ D + 1/32 in",
        ),
    ];
    if fy > HIGH_STRENGTH {
        out.push(p(
            "pin hole",
            "LRFD 6.8.6.2",
            e.hole,
            5.0 * t,
            false,
            false,
            "≤ 5·t (Fy > 70 ksi)",
        ));
    }
    out
}

/// The proportions of LRFD 6.8.7.2 of a member's plates at a pin: `net_across`
/// = Σ(w − d)·t and `net_beyond` = Σ a·t over its plates there, against the
/// member's net area `an` away from the hole.
pub fn plate_proportions(net_across: f64, net_beyond: f64, an: f64) -> Vec<Proportion> {
    vec![
        Proportion {
            what: "combined net section across the hole",
            clause: "LRFD 6.8.7.2",
            value: net_across,
            limit: 1.40 * an,
            at_least: true,
            area: true,
            rule: "≥ 1.40·An",
        },
        Proportion {
            what: "combined net section beyond the hole",
            clause: "LRFD 6.8.7.2",
            value: net_beyond,
            limit: an,
            at_least: true,
            area: true,
            rule: "≥ 1.0·An",
        },
    ]
}

/// The force of the most loaded of `n` bars sharing `force` equally in the
/// statics, with the unequal-sharing factor `k` where n ≥ 2.
pub fn bar_force(force: f64, share: f64, n: u32, k: f64) -> f64 {
    if n >= 2 {
        force * share * k
    } else {
        force * share
    }
}

/// The system factor φs of a member with `bars` eyebars under a method whose
/// model-wide φs is `phi_s`: MBE Table 6A.4.2.4-1's 0.90 for multiple-eyebar
/// members (from memory), or the model's value where lower.
pub fn member_phi_s(phi_s: f64, bars: u32, lrfr: bool) -> f64 {
    if lrfr && bars >= 2 {
        phi_s.min(PHI_S_MULTIPLE_EYEBAR)
    } else {
        phi_s
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const IN: f64 = 0.0254;

    #[test]
    fn eyebar_head_against_the_article_ratios() {
        // A 6 in × 1.5 in bar, head 15 in across a 6 1/32 in hole on a 6 in
        // pin, 5 in beyond the hole, Fy = 36 ksi:
        //   Ab = 9 in², net = (15 − 6.03125)·1.5 = 13.453 in² = 1.495·Ab,
        //   inside 1.35 … 1.60 (LRFD 6.8.6.2, from memory);
        //   a = 5 ≥ 0.75·6 = 4.5; D = 6 ≥ 0.875·6 = 5.25; b = 6 ≤ 8·1.5 = 12;
        //   d − D = 1/32 in, the limit itself; t = 1.5 within 0.5 … 2.0 in.
        let e = EyebarHead {
            body: 6.0 * IN,
            head: 15.0 * IN,
            beyond: 5.0 * IN,
            hole: 6.03125 * IN,
        };
        let p = eyebar_proportions(&e, 1.5 * IN, 6.0 * IN, 36.0 * 6.894_757e6);
        assert_eq!(p.len(), 8);
        assert!(p.iter().all(Proportion::met), "{p:#?}");
        let net = &p[2];
        assert!((net.value / (IN * IN) - 13.453125).abs() < 1e-9);
        assert!((net.limit / (IN * IN) - 12.15).abs() < 1e-9);
        // A head 13 in wide: net = 6.97·1.5 = 10.45 in² = 1.16·Ab < 1.35·Ab.
        let narrow = EyebarHead {
            head: 13.0 * IN,
            ..e
        };
        let p = eyebar_proportions(&narrow, 1.5 * IN, 6.0 * IN, 36.0 * 6.894_757e6);
        assert!(!p[2].met());
        // A 5 in pin for a 6 in bar: 5 < 5.25 fails, and the hole's
        // clearance is then 1 1/32 in > 1/32 in.
        let p = eyebar_proportions(&e, 1.5 * IN, 5.0 * IN, 36.0 * 6.894_757e6);
        assert!(!p[5].met() && !p[7].met());
        // 100 ksi steel adds the 5·t hole limit: 6.03 ≤ 7.5 in, met.
        let p = eyebar_proportions(&e, 1.5 * IN, 6.0 * IN, 100.0 * 6.894_757e6);
        assert_eq!(p.len(), 9);
        assert!(p[8].met());
    }

    #[test]
    fn pin_plate_net_sections() {
        // LRFD 6.8.7.2 (from memory): An = 10 in²; across 14 ≥ 14 met,
        // beyond 9.9 < 10 not met.
        let a2 = IN * IN;
        let p = plate_proportions(14.0 * a2, 9.9 * a2, 10.0 * a2);
        assert!(p[0].met());
        assert!(!p[1].met());
    }

    #[test]
    fn sharing_and_system_factor() {
        // Two equal bars: statics share 1/2; the most loaded bar 1.10·F/2.
        assert!((bar_force(200.0, 0.5, 2, SHARING) - 110.0).abs() < 1e-12);
        // A single bar takes the whole force, no factor.
        assert_eq!(bar_force(200.0, 1.0, 1, SHARING), 200.0);
        // MBE Table 6A.4.2.4-1 (from memory): 0.90 for multiple eyebars.
        assert_eq!(member_phi_s(1.0, 2, true), 0.90);
        assert_eq!(member_phi_s(0.85, 4, true), 0.85);
        assert_eq!(member_phi_s(1.0, 1, true), 1.0);
        assert_eq!(member_phi_s(1.0, 2, false), 1.0);
    }
}
