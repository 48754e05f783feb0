//! Compression buckling of the Whitmore section as an unbraced plate
//! column (MBE 6A.6.12.6.8, from memory): K = 0.5, length Lmid from the
//! middle of the Whitmore section to the nearest fastener line of an
//! adjacent member, radius of gyration r = t/√12, the column curve of
//! AASHTO LRFD 6.9.4.1.1:
//!
//!   Po = Fy·Ag,  Pe = π²·E·Ag/(K·L/r)²
//!   Pn = 0.658^(Po/Pe)·Po   for Pe/Po ≥ 0.44    (Eq. 6.9.4.1.1-1)
//!   Pn = 0.877·Pe           otherwise           (Eq. 6.9.4.1.1-2)

/// Effective-length factor of the gusset's free length (MBE, from memory).
pub const K: f64 = 0.5;

/// K·L/r of a plate of thickness `t` over `length`.
pub fn slenderness(length: f64, t: f64) -> f64 {
    K * length / (t / 12f64.sqrt())
}

/// Nominal compressive resistance Pn, N, of area `ag` (m²) at slenderness
/// `klr`, yield `fy` and modulus `e` (Pa).
pub fn pn(ag: f64, fy: f64, e: f64, klr: f64) -> f64 {
    let po = fy * ag;
    if klr <= 0.0 {
        return po;
    }
    let pe = std::f64::consts::PI.powi(2) * e * ag / (klr * klr);
    if pe / po >= 0.44 {
        0.658f64.powf(po / pe) * po
    } else {
        0.877 * pe
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn whitmore_column_by_hand() {
        // 1/2 in plate, Lmid = 12 in, Fy = 33 ksi, E = 29 000 ksi, Ag = 10 in²
        // (hand calculation, AASHTO LRFD 6.9.4.1.1):
        //   r = 0.5/√12 = 0.144 34 in; KL/r = 0.5 × 12 / 0.144 34 = 41.569
        //   Pe = π² × 29 000 × 10 / 41.569² = 1656.4 kip; Po = 330 kip
        //   Po/Pe = 0.199 23; Pn = 0.658^0.199 23 × 330 = 0.919 99 × 330 = 303.60 kip
        let klr = slenderness(12.0, 0.5);
        assert!((klr - 41.569_219).abs() < 1e-5, "{klr}");
        let p = pn(10.0, 33.0, 29000.0, klr);
        let pe = std::f64::consts::PI.powi(2) * 29000.0 * 10.0 / (klr * klr);
        assert!((pe - 1656.36).abs() < 0.01, "{pe}");
        assert!(
            (p - 0.658f64.powf(330.0 / 1656.36) * 330.0).abs() < 0.01,
            "{p}"
        );
        assert!((p - 303.6).abs() < 0.05, "{p}");
    }

    #[test]
    fn slender_plate_takes_the_elastic_branch() {
        // 1/4 in plate over 60 in: KL/r = 0.5 × 60 × √12 / 0.25 = 415.7;
        // Pe = π² × 29 000 × 10 / 415.7² = 16.56 kip; Pe/Po = 0.0502 < 0.44
        // → Pn = 0.877 × 16.56 = 14.53 kip (hand calculation).
        let klr = slenderness(60.0, 0.25);
        let p = pn(10.0, 33.0, 29000.0, klr);
        assert!((p - 14.53).abs() < 0.01, "{p}");
        // No length: the squash load.
        assert_eq!(pn(10.0, 33.0, 29000.0, 0.0), 330.0);
    }
}
