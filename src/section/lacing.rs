//! Built-up compression members connected by lacing or intermittent
//! connectors: the modified slenderness of AISC 360-16 §E6.1, the component
//! limit and lacing shear of §E6.2, and a simple lacing-bar force.

/// The connection between the components of a built-up member (§E6.1).
///
/// Only welded and pretensioned-bolted intermediate connectors earn the
/// favourable Eq. E6-2b. Hot-driven rivets in old work clamp the plies by
/// shrinkage, but that clamping is neither specified nor verifiable, so this
/// module treats riveted members like snug-tight bolts (Eq. E6-2a), which is
/// conservative; choose `Pretensioned` only on engineering judgement.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Connector {
    /// Snug-tight bolts: Eq. E6-2a.
    #[default]
    SnugTight,
    /// Hot-driven rivets: Eq. E6-2a (conservative, see above).
    HotDrivenRivet,
    /// Pretensioned bolts: Eq. E6-2b.
    Pretensioned,
    /// Welds: Eq. E6-2b.
    Welded,
}

/// `Ki` for angles back-to-back (AISC 360-16 §E6.1).
pub const K_I_BACK_TO_BACK_ANGLES: f64 = 0.50;
/// `Ki` for channels back-to-back (AISC 360-16 §E6.1).
pub const K_I_BACK_TO_BACK_CHANNELS: f64 = 0.75;
/// `Ki` for all other cases (AISC 360-16 §E6.1).
pub const K_I_OTHER: f64 = 0.86;

/// Modified slenderness `(KL/r)m` of a built-up member buckling so that the
/// connectors shear (AISC 360-16 §E6.1):
/// * Eq. E6-2a (snug-tight bolts, rivets): `√((KL/r)o² + (a/ri)²)`;
/// * Eq. E6-2b (welded, pretensioned): `(KL/r)o` when `a/ri ≤ 40`, else
///   `√((KL/r)o² + (Ki·a/ri)²)` (the 2016 edition may number this second
///   branch E6-2c — from memory; the formula is the same).
///
/// `kl_r_overall` is `(KL/r)o` of the member as a unit, `a` the distance
/// between connectors, `r_i` the least radius of gyration of one component,
/// `k_i` one of the `K_I_*` constants (used by E6-2b only). Negative or
/// non-finite inputs give `f64::INFINITY` (no capacity) rather than NaN.
pub fn modified_slenderness(
    kl_r_overall: f64,
    a: f64,
    r_i: f64,
    connector: Connector,
    k_i: f64,
) -> f64 {
    let ok = |v: f64| v.is_finite() && v >= 0.0;
    if !(ok(kl_r_overall) && ok(a) && ok(k_i) && r_i.is_finite() && r_i > 0.0) {
        return f64::INFINITY;
    }
    let a_r = a / r_i;
    match connector {
        Connector::SnugTight | Connector::HotDrivenRivet => kl_r_overall.hypot(a_r),
        Connector::Pretensioned | Connector::Welded => {
            if a_r <= 40.0 {
                kl_r_overall
            } else {
                kl_r_overall.hypot(k_i * a_r)
            }
        }
    }
}

/// §E6.2 with K = 1 for the component between connectors (pinned between
/// them, the usual assumption): see [`component_slenderness_ok_k`].
pub fn component_slenderness_ok(a: f64, r_i: f64, governing_kl_r: f64) -> bool {
    component_slenderness_ok_k(1.0, a, r_i, governing_kl_r)
}

/// AISC 360-16 §E6.2: the slenderness `K·a/ri` of each component between
/// connectors shall not exceed 3/4 of the governing slenderness of the
/// built-up member. Invalid inputs fail the check.
pub fn component_slenderness_ok_k(k: f64, a: f64, r_i: f64, governing_kl_r: f64) -> bool {
    let vals = [k, a, r_i, governing_kl_r];
    if vals.iter().any(|v| !v.is_finite() || *v < 0.0) || r_i <= 0.0 {
        return false;
    }
    k * a / r_i <= 0.75 * governing_kl_r
}

/// Shear the lacing must carry, normal to the member axis: 2 % of the
/// member's compressive strength, `V = 0.02·|P|` (AISC 360-16 §E6.2; §E6.2
/// takes P as the available compressive strength of the member, so pass that
/// rather than the demand). Non-finite input gives `f64::INFINITY`.
pub fn lacing_shear(axial_force: f64) -> f64 {
    if axial_force.is_finite() {
        0.02 * axial_force.abs()
    } else {
        f64::INFINITY
    }
}

/// Single or double (crossed) lacing in one lacing plane.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum LacingSystem {
    /// One bar crosses each section of the plane.
    Single,
    /// Two crossed bars, joined at their intersection.
    Double,
}

impl LacingSystem {
    /// Bars sharing the shear at a section of one lacing plane.
    pub fn bars(self) -> f64 {
        match self {
            LacingSystem::Single => 1.0,
            LacingSystem::Double => 2.0,
        }
    }
}

/// Axial force in one lacing bar (statics of the bar): `F = V/(n·sinθ)`,
/// where `v_per_plane` is the shear taken by one lacing plane (the member
/// shear from [`lacing_shear`] divided by the number of laced faces), `n` the
/// bars of [`LacingSystem::bars`], and `theta` the bar's angle to the member
/// axis in radians (§E6.2 prefers θ ≥ 60° for single and ≥ 45° for double
/// lacing — from memory). Invalid input gives `f64::INFINITY`.
pub fn lacing_bar_force(v_per_plane: f64, system: LacingSystem, theta: f64) -> f64 {
    let s = theta.sin();
    if !(v_per_plane.is_finite() && theta.is_finite() && s > 1e-9) {
        return f64::INFINITY;
    }
    v_per_plane.abs() / (system.bars() * s)
}

/// Slenderness `l/r` of a lacing bar: `l` is the unsupported length between
/// its end connections for single lacing, and 70 % of it for double lacing
/// joined at the crossing (AISC 360-16 §E6.2, from memory).
pub fn lacing_bar_kl_r(length: f64, r: f64, system: LacingSystem) -> f64 {
    if !(length.is_finite() && length >= 0.0 && r.is_finite() && r > 0.0) {
        return f64::INFINITY;
    }
    let factor = match system {
        LacingSystem::Single => 1.0,
        LacingSystem::Double => 0.7,
    };
    factor * length / r
}

/// §E6.2 limit on lacing bar slenderness: `l/r ≤ 140` single, `≤ 200`
/// double (from memory).
pub fn lacing_bar_slenderness_ok(l_r: f64, system: LacingSystem) -> bool {
    let limit = match system {
        LacingSystem::Single => 140.0,
        LacingSystem::Double => 200.0,
    };
    l_r.is_finite() && l_r <= limit
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn e6_2a_by_hand() {
        // (KL/r)o = 60, a = 24, ri = 0.8: a/ri = 30,
        // (KL/r)m = √(60² + 30²) = √4500 = 67.0820 (Eq. E6-2a, by hand).
        let m = modified_slenderness(60.0, 24.0, 0.8, Connector::SnugTight, K_I_OTHER);
        assert_relative_eq!(m, 4500f64.sqrt(), max_relative = 1e-12);
        // Riveted members take E6-2a too (conservative choice documented above).
        assert_eq!(
            modified_slenderness(60.0, 24.0, 0.8, Connector::HotDrivenRivet, K_I_OTHER),
            m
        );
    }

    #[test]
    fn e6_2b_by_hand() {
        // a/ri = 30 ≤ 40: (KL/r)m = (KL/r)o = 60 (Eq. E6-2b).
        assert_relative_eq!(
            modified_slenderness(60.0, 24.0, 0.8, Connector::Welded, K_I_OTHER),
            60.0,
            max_relative = 1e-12
        );
        // a = 48, ri = 0.8: a/ri = 60 > 40, channels back-to-back Ki = 0.75:
        // √(60² + (0.75·60)²) = √(3600 + 2025) = 75 (Eq. E6-2b, by hand).
        let m = modified_slenderness(
            60.0,
            48.0,
            0.8,
            Connector::Pretensioned,
            K_I_BACK_TO_BACK_CHANNELS,
        );
        assert_relative_eq!(m, 75.0, max_relative = 1e-12);
        // Back-to-back angles, Ki = 0.5: √(3600 + 900) = 67.082.
        let m = modified_slenderness(60.0, 48.0, 0.8, Connector::Welded, K_I_BACK_TO_BACK_ANGLES);
        assert_relative_eq!(m, 4500f64.sqrt(), max_relative = 1e-12);
        // The same spacing with snug-tight bolts (E6-2a): √(3600 + 3600) = 84.853.
        let m = modified_slenderness(60.0, 48.0, 0.8, Connector::SnugTight, K_I_OTHER);
        assert_relative_eq!(m, 7200f64.sqrt(), max_relative = 1e-12);
    }

    #[test]
    fn invalid_slenderness_input_is_infinite_not_nan() {
        assert_eq!(
            modified_slenderness(f64::NAN, 1.0, 1.0, Connector::SnugTight, 0.86),
            f64::INFINITY
        );
        assert_eq!(
            modified_slenderness(60.0, 1.0, 0.0, Connector::Welded, 0.86),
            f64::INFINITY
        );
    }

    #[test]
    fn component_limit_e6_2() {
        // a/ri = 30 ≤ 0.75 · 67.08 = 50.3 → ok; a/ri = 60 > 0.75 · 75 = 56.25 → not ok (by hand).
        assert!(component_slenderness_ok(24.0, 0.8, 4500f64.sqrt()));
        assert!(!component_slenderness_ok(48.0, 0.8, 75.0));
        // Exactly at the limit: 0.75 · 80 = 60.
        assert!(component_slenderness_ok(48.0, 0.8, 80.0));
        assert!(!component_slenderness_ok(48.0, 0.0, 80.0));
    }

    #[test]
    fn lacing_shear_and_bar_force() {
        // V = 0.02 · 500 = 10 (§E6.2); two laced faces → 5 per plane.
        let v = lacing_shear(-500.0);
        assert_relative_eq!(v, 10.0, max_relative = 1e-12);
        // Single bar at 60°: F = 5 / sin 60° = 5.7735 (statics, by hand).
        assert_relative_eq!(
            lacing_bar_force(v / 2.0, LacingSystem::Single, 60f64.to_radians()),
            5.0 / 0.75f64.sqrt(),
            max_relative = 1e-12
        );
        // Double at 45°: F = 5 / (2 · 0.70711) = 3.5355.
        assert_relative_eq!(
            lacing_bar_force(5.0, LacingSystem::Double, 45f64.to_radians()),
            2.5 * 2f64.sqrt(),
            max_relative = 1e-12
        );
        assert_eq!(
            lacing_bar_force(5.0, LacingSystem::Single, 0.0),
            f64::INFINITY
        );
    }

    #[test]
    fn lacing_bar_slenderness_limits() {
        // Flat bar 2 × 3/8: r = t/√12 = 0.10825; l = 14 → l/r = 129.3 ≤ 140.
        let r = 0.375 / 12f64.sqrt();
        let single = lacing_bar_kl_r(14.0, r, LacingSystem::Single);
        assert_relative_eq!(single, 14.0 / r, max_relative = 1e-12);
        assert!(lacing_bar_slenderness_ok(single, LacingSystem::Single));
        // l = 16 → 147.8 > 140 single, but double: 0.7 · 147.8 = 103.5 ≤ 200.
        assert!(!lacing_bar_slenderness_ok(
            lacing_bar_kl_r(16.0, r, LacingSystem::Single),
            LacingSystem::Single
        ));
        assert!(lacing_bar_slenderness_ok(
            lacing_bar_kl_r(16.0, r, LacingSystem::Double),
            LacingSystem::Double
        ));
    }
}
