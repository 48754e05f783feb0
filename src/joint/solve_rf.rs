//! The rating factor of a joint check: the live multiplier λ at which
//! u(γDC·DC + γDW·DW + λ·γL·L) reaches 1.
//!
//! For a demand |d₀ + λ·d₁| against a fixed resistance R this is
//! λ = (R − s·d₀)/(s·d₁), s = sign(d₁): MBE Eq. 6A.4.2.1-1 with the factored
//! dead effect on one side. Every joint check's utilization is convex in λ
//! (norms and sums of non-negative convex terms of forces linear in λ), so
//! from u(0) < 1 the set where u ≤ 1 is one interval [0, λ*]: the first
//! point of the doubling grid 1, 2, 4, … with u ≥ 1 brackets λ*, found by
//! regula falsi with the Illinois modification (exact at once for a linear
//! check). Where the factored dead load alone reaches the limit
//! (u(0) ≥ 1) the factor is the linear extrapolation (1 − u₀)/(u₁ − u₀) ≤ 0,
//! which is the rating equation's negative value for a linear check, or 0
//! where the live load lowers the demand.

use super::states::{Corner, Dead};
use super::{Eval, JointCheck};
use crate::method::{Level, Method};

/// Largest λ searched; beyond it the live load is taken not to drive the
/// check (RF none).
pub const LAMBDA_MAX: f64 = 1_048_576.0;

/// The governing result of one check at one level.
pub struct RfRow {
    pub rf: Option<f64>,
    pub at: Option<String>,
    /// Demand and resistance at λ = 1 for the governing state.
    pub factored: Eval,
    pub gamma_dc: f64,
    pub gamma_dw: f64,
}

/// λ* for a utilization function `u` of the live multiplier.
pub fn live_multiplier(mut u: impl FnMut(f64) -> f64) -> Option<f64> {
    let u0 = u(0.0);
    if !u0.is_finite() {
        return None;
    }
    if u0 >= 1.0 {
        let u1 = u(1.0);
        return Some(if u1 > u0 { (1.0 - u0) / (u1 - u0) } else { 0.0 });
    }
    let (mut lo, mut hi) = (0.0, 1.0);
    let (mut flo, mut fhi) = (u0 - 1.0, u(hi) - 1.0);
    while fhi < 0.0 {
        if hi >= LAMBDA_MAX {
            return None;
        }
        (lo, flo) = (hi, fhi);
        hi *= 2.0;
        fhi = u(hi) - 1.0;
    }
    Some(illinois(&mut u, (lo, flo), (hi, fhi)))
}

/// The root of u − 1 in [a, b] (f(a) < 0 ≤ f(b)) by regula falsi with the
/// Illinois modification: exact in one step for a linear u, a few steps for
/// a smooth convex one, never leaving the bracket.
fn illinois(
    u: &mut impl FnMut(f64) -> f64,
    (mut a, mut fa): (f64, f64),
    (mut b, mut fb): (f64, f64),
) -> f64 {
    let mut side = 0i8;
    for _ in 0..200 {
        let c = b - fb * (b - a) / (fb - fa);
        let c = if c > a && c < b { c } else { 0.5 * (a + b) };
        let fc = u(c) - 1.0;
        if fc == 0.0 || (b - a) <= 1e-13 * b.abs().max(1.0) {
            return c;
        }
        if fc > 0.0 {
            (b, fb) = (c, fc);
            if side == 1 {
                fa *= 0.5;
            }
            side = 1;
        } else {
            (a, fa) = (c, fc);
            if side == -1 {
                fb *= 0.5;
            }
            side = -1;
        }
        if fc.abs() <= 1e-14 {
            return c;
        }
    }
    0.5 * (a + b)
}

/// The lowest λ* over the states and over the maximum and minimum dead-load
/// factors (AASHTO LRFD 3.4.1: the minimum where the dead load relieves;
/// for a check of several members "relieves" has no one sense, so both are
/// tried and the lower factor kept).
pub fn rate_check(
    check: &dyn JointCheck,
    method: &Method,
    level: &Level,
    dead: &Dead,
    corners: &[Corner],
) -> RfRow {
    // A dead part that is zero takes no factor choice.
    let no_dc = dead.dc.iter().all(|&f| f == 0.0);
    let no_dw = dead.dw.iter().all(|&f| f == 0.0);
    let mut gammas = vec![(level.dc.max, level.dw.max)];
    for g in [
        (level.dc.min, level.dw.max),
        (level.dc.max, level.dw.min),
        (level.dc.min, level.dw.min),
    ] {
        let pointless = (no_dc && g.0 != level.dc.max) || (no_dw && g.1 != level.dw.max);
        if !pointless && !gammas.contains(&g) {
            gammas.push(g);
        }
    }
    let n = dead.dc.len();
    let mut best: Option<(f64, usize, (f64, f64))> = None;
    let mut worst_u1: Option<(f64, usize, (f64, f64))> = None;
    let mut forces = vec![0.0; n];
    for (ci, corner) in corners.iter().enumerate() {
        for &(gdc, gdw) in &gammas {
            let mut eval_at = |lam: f64| {
                for (m, f) in forces.iter_mut().enumerate() {
                    *f = gdc * dead.dc[m]
                        + gdw * dead.dw[m]
                        + lam * level.gamma_live * corner.live[m];
                }
                check.evaluate(&forces, method, level)
            };
            let u1 = eval_at(1.0).utilization();
            if worst_u1.is_none_or(|(u, _, _)| u1 > u) {
                worst_u1 = Some((u1, ci, (gdc, gdw)));
            }
            let lam = live_multiplier(|l| eval_at(l).utilization());
            if let Some(l) = lam {
                if best.is_none_or(|(b, _, _)| l < b) {
                    best = Some((l, ci, (gdc, gdw)));
                }
            }
        }
    }
    let (rf, ci, (gdc, gdw)) = match (best, worst_u1) {
        (Some((l, ci, g)), _) => (Some(l), ci, g),
        (None, Some((_, ci, g))) => (None, ci, g),
        (None, None) => (None, 0, (level.dc.max, level.dw.max)),
    };
    let factored = match corners.get(ci) {
        Some(c) => {
            let f: Vec<f64> = (0..n)
                .map(|m| gdc * dead.dc[m] + gdw * dead.dw[m] + level.gamma_live * c.live[m])
                .collect();
            check.evaluate(&f, method, level)
        }
        None => Eval {
            demand: 0.0,
            resistance: 0.0,
        },
    };
    RfRow {
        rf,
        at: corners.get(ci).and_then(|c| c.at.clone()),
        factored,
        gamma_dc: gdc,
        gamma_dw: gdw,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A linear demand |d0 + λ·d1| against R: λ* = (R − s·d0)/(s·d1), the
    /// rating equation (MBE Eq. 6A.4.2.1-1) solved by hand.
    #[test]
    fn linear_demand_gives_the_rating_equation() {
        for (d0, d1, r) in [
            (30.0, 50.0, 200.0),
            (-30.0, -50.0, 200.0),
            (30.0, -50.0, 200.0),
            (0.0, 7.0, 1.0),
            (190.0, 1e-3, 200.0),
        ] {
            let u = |l: f64| (d0 + l * d1).abs() / r;
            let s = f64::signum(d1);
            let expect = (r - s * d0) / (s * d1);
            let got = live_multiplier(u).unwrap();
            assert!(
                (got - expect).abs() <= 1e-9 * expect.abs().max(1.0),
                "{d0} {d1} {r}: {got} vs {expect}"
            );
        }
    }

    /// Dead load alone over the limit: the negative factor of the rating
    /// equation (linear extrapolation is exact for a linear demand).
    #[test]
    fn dead_load_over_the_limit_gives_a_negative_factor() {
        let u = |l: f64| (250.0 + l * 50.0) / 200.0;
        assert!((live_multiplier(u).unwrap() - (200.0 - 250.0) / 50.0).abs() < 1e-12);
        // Live load lowering the demand: 0, not a positive factor.
        let u = |l: f64| (250.0 - l * 50.0f64).abs() / 200.0;
        assert_eq!(live_multiplier(u), Some(0.0));
    }

    /// A cubic interaction (convex): 0.2 + (0.1·λ)³ = 1 at λ = 10·0.8^(1/3),
    /// by hand.
    #[test]
    fn convex_interaction_by_bisection() {
        let u = |l: f64| 0.2 + (0.1 * l).powi(3);
        let expect = 10.0 * 0.8f64.cbrt();
        assert!((live_multiplier(u).unwrap() - expect).abs() < 1e-9);
        // A live load that never drives the check.
        assert_eq!(live_multiplier(|_| 0.5), None);
    }
}
