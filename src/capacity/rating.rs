//! Rating factors: how many times the rating live load (with impact) a member
//! can carry on top of its dead load, in load-and-resistance-factor form and
//! in allowable-stress form, and a sign-aware version for truss members whose
//! force may be tension or compression.

/// Load and resistance factor rating, bridge-evaluation-manual form
/// (AASHTO Manual for Bridge Evaluation Eq. 6A.4.2.1-1 with one dead-load
/// term and no permanent-load term, from memory):
/// RF = (φC − γD·D) / (γL·(L + IM)).
///
/// `capacity` is the factored capacity φC (e.g. a design capacity from
/// `column` or `tension`); `dead` and `live_with_impact` are magnitudes in the
/// same sense as the capacity. Returns `None` when an input is not finite,
/// `gamma_l` or `live_with_impact` is not positive, or the live effect is
/// negligible (|L| < 1e-12·|C|). For signed member forces use [`member_rating`].
pub fn rating_factor_lrfr(
    capacity: f64,
    dead: f64,
    live_with_impact: f64,
    gamma_d: f64,
    gamma_l: f64,
) -> Option<f64> {
    if ![capacity, dead, live_with_impact, gamma_d, gamma_l]
        .iter()
        .all(|v| v.is_finite())
    {
        return None;
    }
    if gamma_l <= 0.0 || negligible(live_with_impact, capacity) || live_with_impact < 0.0 {
        return None;
    }
    finite((capacity - gamma_d * dead) / (gamma_l * live_with_impact))
}

/// Allowable stress rating (AASHTO Manual for Bridge Evaluation Eq. 6B.4.1-1
/// with A1 = A2 = 1.0, from memory): RF = (C − D) / (L·(1 + I)).
///
/// `capacity` is the allowable capacity (e.g. a `bridge-asd` design capacity),
/// `impact` the impact fraction I (e.g. 0.25). Returns `None` when an input is
/// not finite, `live` or `1 + impact` is not positive, or the live effect is
/// negligible (|L·(1+I)| < 1e-12·|C|).
pub fn rating_factor_asr(capacity: f64, dead: f64, live: f64, impact: f64) -> Option<f64> {
    if ![capacity, dead, live, impact].iter().all(|v| v.is_finite()) {
        return None;
    }
    let live_total = live * (1.0 + impact);
    if live <= 0.0 || 1.0 + impact <= 0.0 || negligible(live_total, capacity) {
        return None;
    }
    finite((capacity - dead) / live_total)
}

/// Sign-aware member rating in the load-and-resistance-factor form
/// (AASHTO Manual for Bridge Evaluation Eq. 6A.4.2.1-1, from memory).
///
/// Forces are tension-positive. The sign of the live effect picks the
/// capacity: `tension_capacity` for L > 0, `compression_capacity` for L < 0
/// (both positive magnitudes, already factored). With s = sign(L):
/// RF = (C − γD·D·s) / (γL·|L|), so dead load acting in the same direction as
/// the live load uses up capacity and dead load acting opposite adds to it.
/// (Where dead load counteracts, the caller may prefer to pass a minimum
/// dead-load factor as `gamma_d`.)
///
/// Returns `None` when the live force is zero or negligible (|L| < 1e-12·C),
/// or when an input is not finite, a capacity is negative, `gamma_d` is
/// negative or `gamma_l` is not positive.
pub fn member_rating(
    tension_capacity: f64,
    compression_capacity: f64,
    dead: f64,
    live_with_impact: f64,
    gamma_d: f64,
    gamma_l: f64,
) -> Option<f64> {
    let inputs = [
        tension_capacity,
        compression_capacity,
        dead,
        live_with_impact,
        gamma_d,
        gamma_l,
    ];
    if !inputs.iter().all(|v| v.is_finite()) {
        return None;
    }
    if tension_capacity < 0.0 || compression_capacity < 0.0 || gamma_d < 0.0 || gamma_l <= 0.0 {
        return None;
    }
    let (capacity, sign) = if live_with_impact > 0.0 {
        (tension_capacity, 1.0)
    } else if live_with_impact < 0.0 {
        (compression_capacity, -1.0)
    } else {
        return None;
    };
    if negligible(live_with_impact, capacity) {
        return None;
    }
    finite((capacity - gamma_d * dead * sign) / (gamma_l * live_with_impact.abs()))
}

fn negligible(live: f64, capacity: f64) -> bool {
    live == 0.0 || live.abs() < 1e-12 * capacity.abs()
}

fn finite(v: f64) -> Option<f64> {
    v.is_finite().then_some(v)
}

/// A rating level: its name and load factors.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct RatingLevel {
    pub name: &'static str,
    /// Load factor on dead load of components and attachments, γDC.
    pub gamma_dc: f64,
    /// Load factor on live load (with impact), γLL.
    pub gamma_ll: f64,
}

/// Design-load inventory level: γDC = 1.25, γLL = 1.75 (AASHTO Manual for
/// Bridge Evaluation Table 6A.4.2.2-1, from memory).
pub const INVENTORY: RatingLevel = RatingLevel {
    name: "inventory",
    gamma_dc: 1.25,
    gamma_ll: 1.75,
};

/// Design-load operating level: γDC = 1.25, γLL = 1.35 (AASHTO Manual for
/// Bridge Evaluation Table 6A.4.2.2-1, from memory).
pub const OPERATING: RatingLevel = RatingLevel {
    name: "operating",
    gamma_dc: 1.25,
    gamma_ll: 1.35,
};

impl RatingLevel {
    /// [`member_rating`] with this level's load factors.
    pub fn member_rating(
        &self,
        tension_capacity: f64,
        compression_capacity: f64,
        dead: f64,
        live_with_impact: f64,
    ) -> Option<f64> {
        member_rating(
            tension_capacity,
            compression_capacity,
            dead,
            live_with_impact,
            self.gamma_dc,
            self.gamma_ll,
        )
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn lrfr_hand_example() {
        // Hand calculation: (400 − 1.25·120)/(1.75·80) = 250/140 = 1.785714.
        let rf = rating_factor_lrfr(400.0, 120.0, 80.0, 1.25, 1.75).unwrap();
        assert_relative_eq!(rf, 1.785_714_285_7, max_relative = 1e-10);
        // Over-stressed member: (100 − 150)/140 = −0.357143 (hand calculation).
        let rf = rating_factor_lrfr(100.0, 120.0, 80.0, 1.25, 1.75).unwrap();
        assert_relative_eq!(rf, -0.357_142_857, max_relative = 1e-8);
        assert_eq!(rating_factor_lrfr(400.0, 120.0, 0.0, 1.25, 1.75), None);
        assert_eq!(rating_factor_lrfr(400.0, 120.0, -80.0, 1.25, 1.75), None);
        assert_eq!(rating_factor_lrfr(400.0, 120.0, 80.0, 1.25, 0.0), None);
        assert_eq!(rating_factor_lrfr(f64::NAN, 120.0, 80.0, 1.25, 1.75), None);
    }

    #[test]
    fn asr_hand_example() {
        // Hand calculation: (250 − 100)/(60·1.25) = 150/75 = 2.0.
        let rf = rating_factor_asr(250.0, 100.0, 60.0, 0.25).unwrap();
        assert_relative_eq!(rf, 2.0, max_relative = 1e-12);
        assert_eq!(rating_factor_asr(250.0, 100.0, 0.0, 0.25), None);
        assert_eq!(rating_factor_asr(250.0, 100.0, 60.0, -1.0), None);
        assert_eq!(rating_factor_asr(250.0, 100.0, 60.0, f64::INFINITY), None);
    }

    #[test]
    fn member_rating_tension_matches_lrfr() {
        // Live and dead both tension: same as the hand example, 1.785714.
        let rf = member_rating(400.0, 300.0, 120.0, 80.0, 1.25, 1.75).unwrap();
        assert_relative_eq!(rf, 1.785_714_285_7, max_relative = 1e-10);
    }

    #[test]
    fn live_compression_picks_compression_capacity() {
        // Hand calculation: (300 − 1.25·120)/(1.75·80) = 150/140 = 1.071429.
        let rf = member_rating(400.0, 300.0, -120.0, -80.0, 1.25, 1.75).unwrap();
        assert_relative_eq!(rf, 1.071_428_571, max_relative = 1e-8);
    }

    #[test]
    fn opposite_dead_load_adds_to_capacity() {
        // Hand calculation: dead tension +120 against live compression −80:
        // (300 + 150)/140 = 3.214286.
        let rf = member_rating(400.0, 300.0, 120.0, -80.0, 1.25, 1.75).unwrap();
        assert_relative_eq!(rf, 3.214_285_714, max_relative = 1e-8);
        // And dead compression against live tension: (400 + 150)/140 = 3.928571.
        let rf = member_rating(400.0, 300.0, -120.0, 80.0, 1.25, 1.75).unwrap();
        assert_relative_eq!(rf, 3.928_571_429, max_relative = 1e-8);
    }

    #[test]
    fn zero_or_negligible_live_gives_none() {
        assert_eq!(member_rating(400.0, 300.0, 120.0, 0.0, 1.25, 1.75), None);
        assert_eq!(member_rating(400.0, 300.0, 120.0, -0.0, 1.25, 1.75), None);
        // |L| = 3.9e-10 < 1e-12·400 = 4e-10 → negligible.
        assert_eq!(
            member_rating(400.0, 300.0, 120.0, 3.9e-10, 1.25, 1.75),
            None
        );
        // |L| = 4.1e-10 > 4e-10 → rated; in compression the limit is 1e-12·300.
        assert!(member_rating(400.0, 300.0, 120.0, 4.1e-10, 1.25, 1.75).is_some());
        assert_eq!(
            member_rating(400.0, 300.0, 120.0, -2.9e-10, 1.25, 1.75),
            None
        );
        assert!(member_rating(400.0, 300.0, 120.0, -3.1e-10, 1.25, 1.75).is_some());
        // Invalid inputs.
        assert_eq!(member_rating(-1.0, 300.0, 120.0, 80.0, 1.25, 1.75), None);
        assert_eq!(
            member_rating(400.0, 300.0, f64::NAN, 80.0, 1.25, 1.75),
            None
        );
        assert_eq!(member_rating(400.0, 300.0, 120.0, 80.0, 1.25, 0.0), None);
    }

    #[test]
    fn levels() {
        // AASHTO MBE Table 6A.4.2.2-1 (from memory).
        assert_eq!(INVENTORY.gamma_ll, 1.75);
        assert_eq!(OPERATING.gamma_ll, 1.35);
        assert_eq!(INVENTORY.gamma_dc, 1.25);
        assert_eq!(OPERATING.gamma_dc, 1.25);
        // Closed form: with no dead load RF_operating / RF_inventory = 1.75/1.35.
        let inv = INVENTORY.member_rating(400.0, 300.0, 0.0, -80.0).unwrap();
        let op = OPERATING.member_rating(400.0, 300.0, 0.0, -80.0).unwrap();
        assert_relative_eq!(op / inv, 1.75 / 1.35, max_relative = 1e-12);
        // Inventory hand example: same as rating_factor_lrfr above.
        let rf = INVENTORY.member_rating(400.0, 300.0, 120.0, 80.0).unwrap();
        assert_relative_eq!(rf, 1.785_714_285_7, max_relative = 1e-10);
    }

    #[test]
    fn end_to_end_with_aisc_capacity() {
        // Worked value (hand calculation with AISC E3-2): Fy = 33 ksi, E = 29,000 ksi
        // (common practice), KL/r = 62.93, A = 14.7 in² → φcPn = 360.6 kip.
        // Live −100 kip, dead −80 kip, inventory: (360.6 − 100)/175 = 1.489.
        use crate::capacity::curve::{column, Curve};
        let k = column(&Curve::default_curve(), 33.0, 29_000.0, 62.93).unwrap();
        let cc = k.design_stress * 14.7;
        let rf = INVENTORY.member_rating(500.0, cc, -80.0, -100.0).unwrap();
        assert!((rf - 1.489).abs() < 5e-4);
    }
}
