//! Fatigue by EN 1993-1-9:2005 (Eurocode 3, part 1-9), the direct-stress
//! S-N curves of Figure 7.1 / §7.1 (from memory):
//!
//! - Δσ_R^m·N_R = Δσ_C^m·2·10⁶ with m = 3 for N ≤ 5·10⁶ (Eq. 7.1);
//! - constant-amplitude fatigue limit Δσ_D = (2/5)^(1/3)·Δσ_C = 0.737·Δσ_C
//!   at N = 5·10⁶;
//! - Δσ_R^m·N_R = Δσ_D^m·5·10⁶ with m = 5 for 5·10⁶ < N ≤ 10⁸ (Eq. 7.2);
//! - cut-off limit Δσ_L = (5/100)^(1/5)·Δσ_D = 0.549·Δσ_D at N = 10⁸;
//!   ranges below it do no damage.
//!
//! Verification (§8, Eq. 8.2): γFf·Δσ against Δσ_C/γMf, i.e. each range is
//! entered into the curve as γFf·γMf·Δσ. Partial factors: γFf = 1.0
//! (§6.1 recommended, from memory); γMf from Table 3.1 (recommended,
//! from memory): 1.00 / 1.15 damage-tolerant low / high consequence,
//! 1.15 / 1.35 safe-life; the default here is the most conservative, 1.35.
//! Damage by the Palmgren-Miner rule (Annex A, Eq. A.1): D = Σ nᵢ/Nᵢ.

/// Overridable EN 1993-1-9 parameters.
#[derive(Clone, Debug, PartialEq)]
pub struct EnParameters {
    /// Partial factor for fatigue strength γMf (1.35, Table 3.1 safe life,
    /// high consequence; from memory).
    pub gamma_mf: f64,
    /// Partial factor for fatigue loads γFf (1.0).
    pub gamma_ff: f64,
}

impl Default for EnParameters {
    fn default() -> Self {
        EnParameters {
            gamma_mf: 1.35,
            gamma_ff: 1.0,
        }
    }
}

/// The bilinear S-N curve of a detail category Δσ_C (Pa at 2·10⁶ cycles).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Curve {
    /// Δσ_C, Pa.
    pub c: f64,
}

/// The knee of the curve, cycles (N_D = 5·10⁶).
pub const N_D: f64 = 5.0e6;
/// The cut-off, cycles (N_L = 10⁸).
pub const N_L: f64 = 1.0e8;
/// The reference, cycles (N_C = 2·10⁶).
pub const N_C: f64 = 2.0e6;

impl Curve {
    /// Δσ_D = (2/5)^(1/3)·Δσ_C.
    pub fn knee(&self) -> f64 {
        self.c * (N_C / N_D).cbrt()
    }

    /// Δσ_L = (5/100)^(1/5)·Δσ_D.
    pub fn cut_off(&self) -> f64 {
        self.knee() * (N_D / N_L).powf(0.2)
    }

    /// Cycles to failure N_R at range `r` (same unit as Δσ_C); None
    /// (infinite) at or below the cut-off Δσ_L.
    pub fn cycles(&self, r: f64) -> Option<f64> {
        let d = self.knee();
        if r >= d {
            Some(N_C * (self.c / r).powi(3))
        } else if r > self.cut_off() {
            Some(N_D * (d / r).powi(5))
        } else {
            None
        }
    }
}

/// One detail's EN 1993-1-9 result.
#[derive(Clone, Debug, PartialEq)]
pub struct EnLife {
    /// Miner damage sum of one passage, Σ nᵢ/Nᵢ(γFf·γMf·Δσᵢ).
    pub damage_per_passage: f64,
    /// 1/D: passages to failure; None when no cycle does damage.
    pub passages: Option<f64>,
    /// Life in years at the traffic (from opening), None when infinite.
    pub life: Option<f64>,
    /// Life − present age, None when infinite.
    pub remaining: Option<f64>,
}

/// Damage per passage of `cycles` (range Pa, count) on category `c` (Pa),
/// and the life at `traffic` passages a day (growth as in
/// [`super::mbe::total_life`]).
pub fn evaluate(
    c: f64,
    p: &EnParameters,
    cycles: &[(f64, f64)],
    traffic: &super::mbe::Traffic,
) -> EnLife {
    let curve = Curve { c };
    let damage: f64 = cycles
        .iter()
        .filter_map(|&(r, n)| curve.cycles(p.gamma_ff * p.gamma_mf * r).map(|nr| n / nr))
        .sum();
    if damage <= 0.0 {
        return EnLife {
            damage_per_passage: 0.0,
            passages: None,
            life: None,
            remaining: None,
        };
    }
    let passages = 1.0 / damage;
    let y = passages / (365.0 * traffic.adtt);
    let life = super::mbe::total_life(y, traffic);
    EnLife {
        damage_per_passage: damage,
        passages: Some(passages),
        life,
        remaining: life.map(|t| t - traffic.age),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::fatigue::mbe::Traffic;

    #[test]
    fn category_71_curve_by_hand() {
        let c = Curve { c: 71.0 };
        // EN 1993-1-9 Table 8.1 / Fig. 7.1 (from memory): for category 71,
        // Δσ_D = 52.3 MPa and Δσ_L = 28.7 MPa (rounded as printed).
        assert!((c.knee() - 52.3).abs() < 0.05, "{}", c.knee());
        assert!((c.cut_off() - 28.7).abs() < 0.05, "{}", c.cut_off());
        // By hand, m = 3: N(100) = 2·10⁶·(71/100)³ = 715 822.
        assert!((c.cycles(100.0).unwrap() - 715_822.0).abs() < 1.0);
        // N(71) = 2·10⁶ exactly; N(Δσ_D) = 5·10⁶ from either branch.
        assert!((c.cycles(71.0).unwrap() - 2.0e6).abs() < 1e-6);
        assert!((c.cycles(c.knee()).unwrap() - 5.0e6).abs() < 1e-3);
        // m = 5: N(40) = 5·10⁶·(52.313/40)⁵; 52.313/40 = 1.307825,
        // ^5 = 3.8261 → 1.9131·10⁷ (hand, to 4 figures).
        let n40 = c.cycles(40.0).unwrap();
        assert!((n40 / 1.9131e7 - 1.0).abs() < 1e-3, "{n40}");
        // Just above the cut-off about 10⁸; at and below it none.
        assert!((c.cycles(c.cut_off() * (1.0 + 1e-12)).unwrap() / 1e8 - 1.0).abs() < 1e-9);
        assert_eq!(c.cycles(28.0), None);
    }

    #[test]
    fn miner_damage_and_life_by_hand() {
        let t = Traffic {
            adtt: 500.0,
            age: 80.0,
            growth: 0.0,
        };
        let p = EnParameters {
            gamma_mf: 1.0,
            gamma_ff: 1.0,
        };
        // One cycle of 100 MPa and one of 20 MPa (below Δσ_L: no damage):
        // D = 1/715 822 per passage; life = 715 822/(365·500) = 3.9223 years.
        let r = evaluate(71.0, &p, &[(100.0, 1.0), (20.0, 1.0)], &t);
        assert!((r.damage_per_passage * 715_822.0 - 1.0).abs() < 1e-5);
        assert!((r.life.unwrap() - 3.9223).abs() < 1e-3);
        assert!((r.remaining.unwrap() + 76.078).abs() < 1e-2);
        // γMf = 1.35 enters the curve as 135 MPa: N = 2·10⁶·(71/135)³ = 290 940.
        let r = evaluate(71.0, &EnParameters::default(), &[(100.0, 1.0)], &t);
        assert!((r.passages.unwrap() - 290_940.0).abs() < 5.0);
        // All cycles below the cut-off: infinite.
        let r = evaluate(71.0, &p, &[(20.0, 3.0)], &t);
        assert_eq!((r.passages, r.life), (None, None));
    }
}
