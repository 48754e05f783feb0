//! Temperature change and lack of fit as initial member elongations: the
//! stress-free length of the member differs from the distance between its
//! nodes, and the analysis takes N = EA/L·(e − e₀).

/// Free thermal elongation of a member, m: e₀ = α·ΔT·L (linear thermal
/// expansion, the definition of the coefficient α).
pub fn thermal_elongation(alpha: f64, change: f64, length: f64) -> f64 {
    alpha * change * length
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn steel_bar_heated() {
        // α = 12e-6 /°C (steel, common practice), ΔT = 30 °C, L = 10 m:
        // e₀ = 12e-6 × 30 × 10 = 3.6 mm by hand.
        let e = thermal_elongation(12e-6, 30.0, 10.0);
        assert!((e - 3.6e-3).abs() < 1e-15);
        assert!(thermal_elongation(12e-6, -30.0, 10.0) < 0.0);
    }
}
