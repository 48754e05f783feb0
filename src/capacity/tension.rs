//! Axial tension capacity (gross-section yield and net-section fracture) in
//! the factor family of the chosen column curve, plus the customary
//! slenderness limits for truss members.

use super::curve::{positive, CapacityError, Curve, DesignMethod};

/// Tension resistance, forces in stress × area units.
#[derive(Clone, Debug, PartialEq)]
pub struct TensionCheck {
    /// Design (factored or allowable) capacity on the gross area.
    pub yield_capacity: f64,
    /// Design (factored or allowable) capacity on the net area.
    pub fracture_capacity: f64,
    /// The smaller of the two.
    pub design_capacity: f64,
    /// "yield" or "fracture" (yield on a tie).
    pub governs: &'static str,
    /// The clauses and equations used.
    pub clause: &'static str,
}

/// AISC 360-16 §D2: φt = 0.90 (Eq. D2-1, yield on Ag).
pub const AISC_PHI_T_YIELD: f64 = 0.90;
/// AISC 360-16 §D2: φt = 0.75 (Eq. D2-2, rupture on Ae).
pub const AISC_PHI_T_RUPTURE: f64 = 0.75;
/// AISC 360-16 §D2: Ωt = 1.67 (Eq. D2-1).
pub const AISC_OMEGA_T_YIELD: f64 = 1.67;
/// AISC 360-16 §D2: Ωt = 2.00 (Eq. D2-2).
pub const AISC_OMEGA_T_RUPTURE: f64 = 2.00;
/// EN 1993-1-1 §6.1(1) Note 2B recommended γM0 = 1.00.
pub const EN_GAMMA_M0: f64 = 1.00;
/// EN 1993-1-1 §6.1(1) Note 2B recommended γM2 = 1.25.
pub const EN_GAMMA_M2: f64 = 1.25;
/// CSA S16 clause 13.1: φ = 0.90 (yield) and φu = 0.75 (fracture).
pub const CSA_PHI: f64 = 0.90;
/// CSA S16 clause 13.1: φu = 0.75.
pub const CSA_PHI_U: f64 = 0.75;
/// Older bridge allowable-stress tension: 0.55·Fy on gross area (AASHTO
/// Standard Specifications Table 10.32.1A, from memory).
pub const BRIDGE_ASD_YIELD_RATIO: f64 = 0.55;
/// Older bridge allowable-stress tension: 0.50·Fu on net area (AASHTO
/// Standard Specifications Table 10.32.1A, from memory).
pub const BRIDGE_ASD_FRACTURE_RATIO: f64 = 0.50;

/// Design tension capacity of a member: the smaller of gross-section yield
/// and net-section fracture, with the factors of the curve's family:
///
/// * AISC 360-16 §D2, Eq. D2-1: φt·Fy·Ag (φt = 0.90) or Fy·Ag/Ωt (Ωt = 1.67);
///   Eq. D2-2: φt·Fu·Ae (φt = 0.75) or Fu·Ae/Ωt (Ωt = 2.00). `net_area` is
///   the effective net area Ae = U·An (§D3), which the caller supplies.
/// * EN 1993-1-1 §6.2.3, Eq. 6.6: Npl,Rd = A·fy/γM0; Eq. 6.7:
///   Nu,Rd = 0.9·Anet·fu/γM2, with the recommended γM0 = 1.0, γM2 = 1.25
///   (the curve's γM1 does not enter).
/// * CSA S16 clause 13.2(a): Tr = φ·Ag·Fy (φ = 0.90) and Tr = φu·Ane·Fu
///   (φu = 0.75).
/// * Euler, Johnson: unfactored Fy·Ag and Fu·An.
/// * Bridge ASD: allowable 0.55·Fy on Ag and 0.50·Fu on An (AASHTO Standard
///   Specifications Table 10.32.1A, from memory); the curve's column safety
///   factor does not enter.
///
/// Errors when any input is not positive and finite, or `net_area > gross_area`.
pub fn tension(
    curve: &Curve,
    fy: f64,
    fu: f64,
    gross_area: f64,
    net_area: f64,
) -> Result<TensionCheck, CapacityError> {
    positive("fy", fy)?;
    positive("fu", fu)?;
    positive("gross_area", gross_area)?;
    positive("net_area", net_area)?;
    if net_area > gross_area {
        return Err(CapacityError::NetExceedsGross {
            net: net_area,
            gross: gross_area,
        });
    }
    curve.validate()?;
    let (yield_capacity, fracture_capacity, clause) = match *curve {
        Curve::Aisc360 {
            method: DesignMethod::Lrfd,
        } => (
            AISC_PHI_T_YIELD * fy * gross_area,
            AISC_PHI_T_RUPTURE * fu * net_area,
            "AISC 360-16 §D2, Eqs. D2-1 (φt = 0.90) and D2-2 (φt = 0.75)",
        ),
        Curve::Aisc360 {
            method: DesignMethod::Asd,
        } => (
            fy * gross_area / AISC_OMEGA_T_YIELD,
            fu * net_area / AISC_OMEGA_T_RUPTURE,
            "AISC 360-16 §D2, Eqs. D2-1 (Ωt = 1.67) and D2-2 (Ωt = 2.00)",
        ),
        Curve::En1993 { .. } => (
            gross_area * fy / EN_GAMMA_M0,
            0.9 * net_area * fu / EN_GAMMA_M2,
            "EN 1993-1-1 §6.2.3, Eqs. 6.6 (γM0 = 1.0) and 6.7 (γM2 = 1.25)",
        ),
        Curve::CsaS16 { .. } => (
            CSA_PHI * gross_area * fy,
            CSA_PHI_U * net_area * fu,
            "CSA S16 cl. 13.2(a) (φ = 0.90 on Ag·Fy, φu = 0.75 on An·Fu)",
        ),
        Curve::Euler | Curve::Johnson => (
            fy * gross_area,
            fu * net_area,
            "unfactored Fy·Ag (gross yield) and Fu·An (net fracture)",
        ),
        Curve::BridgeAsd { .. } => (
            BRIDGE_ASD_YIELD_RATIO * fy * gross_area,
            BRIDGE_ASD_FRACTURE_RATIO * fu * net_area,
            "AASHTO Standard Specifications (allowable stress) Table 10.32.1A: 0.55·Fy on Ag, 0.50·Fu on An (from memory)",
        ),
    };
    if !(yield_capacity.is_finite() && fracture_capacity.is_finite()) {
        return Err(CapacityError::NonFinite {
            what: "tension capacity",
        });
    }
    let (design_capacity, governs) = if fracture_capacity < yield_capacity {
        (fracture_capacity, "fracture")
    } else {
        (yield_capacity, "yield")
    };
    Ok(TensionCheck {
        yield_capacity,
        fracture_capacity,
        design_capacity,
        governs,
        clause,
    })
}

/// Customary slenderness limit for compression members, KL/r ≤ 200
/// (common practice; AISC 360-16 §E2 User Note).
pub const COMPRESSION_SLENDERNESS_LIMIT: f64 = 200.0;
/// Customary slenderness limit for tension members, L/r ≤ 300
/// (common practice; AISC 360-16 §D1 User Note).
pub const TENSION_SLENDERNESS_LIMIT: f64 = 300.0;

/// A warning when a member exceeds the customary slenderness limit
/// (KL/r 200 in compression, L/r 300 in tension; common practice), or when
/// the slenderness is not a finite non-negative number. `None` otherwise.
pub fn slenderness_warning(slenderness: f64, compression: bool) -> Option<String> {
    let (limit, what) = if compression {
        (COMPRESSION_SLENDERNESS_LIMIT, "KL/r")
    } else {
        (TENSION_SLENDERNESS_LIMIT, "L/r")
    };
    if !(slenderness.is_finite() && slenderness >= 0.0) {
        return Some(format!("{what} = {slenderness} is not a valid slenderness"));
    }
    if slenderness > limit {
        let kind = if compression {
            "compression"
        } else {
            "tension"
        };
        Some(format!(
            "{what} = {slenderness:.1} exceeds the customary {kind} limit of {limit:.0}"
        ))
    } else {
        None
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    // Common practice: older medium steel Fy = 33 ksi, Fu = 60 ksi.
    const FY: f64 = 33.0;
    const FU: f64 = 60.0;

    fn curve(name: &str) -> Curve {
        Curve::from_name(name).unwrap()
    }

    #[test]
    fn aisc_lrfd_and_asd() {
        // AISC 360-16 Eqs. D2-1/D2-2 by hand, Ag = 10 in², Ae = 8 in²:
        // LRFD 0.90·33·10 = 297.0, 0.75·60·8 = 360.0 → yield 297.0 kip.
        let t = tension(&curve("aisc360"), FY, FU, 10.0, 8.0).unwrap();
        assert_relative_eq!(t.yield_capacity, 297.0, max_relative = 1e-12);
        assert_relative_eq!(t.fracture_capacity, 360.0, max_relative = 1e-12);
        assert_eq!(t.design_capacity, t.yield_capacity);
        assert_eq!(t.governs, "yield");
        // ASD 33·10/1.67 = 197.60, 60·8/2.00 = 240.0.
        let t = tension(&curve("aisc360-asd"), FY, FU, 10.0, 8.0).unwrap();
        assert!((t.yield_capacity - 197.60).abs() < 0.005);
        assert_relative_eq!(t.fracture_capacity, 240.0, max_relative = 1e-12);
        // A deeply holed net section governs: Ae = 5 → 0.75·60·5 = 225.0 < 297.0.
        let t = tension(&curve("aisc360"), FY, FU, 10.0, 5.0).unwrap();
        assert_eq!(t.governs, "fracture");
        assert_relative_eq!(t.design_capacity, 225.0, max_relative = 1e-12);
        assert!(t.clause.contains("D2-2"));
    }

    #[test]
    fn en_csa_unfactored_and_bridge() {
        // EN 1993-1-1 Eqs. 6.6/6.7 by hand, S355 (fy 355, fu 490 MPa),
        // A = 1000, Anet = 850 mm²: 355,000 N and 0.9·850·490/1.25 = 299,880 N.
        let t = tension(&curve("en1993-b"), 355.0, 490.0, 1000.0, 850.0).unwrap();
        assert_relative_eq!(t.yield_capacity, 355_000.0, max_relative = 1e-12);
        assert_relative_eq!(t.fracture_capacity, 299_880.0, max_relative = 1e-12);
        assert_eq!(t.governs, "fracture");
        // γM1 plays no part in tension (EN 1993-1-1 §6.2.3).
        let t11 = tension(
            &Curve::En1993 {
                class: crate::capacity::curve::BucklingClass::B,
                gamma_m1: 1.1,
            },
            355.0,
            490.0,
            1000.0,
            850.0,
        )
        .unwrap();
        assert_eq!(t11, t);
        // CSA S16 cl. 13.2 by hand, 350W (Fy 350, Fu 450 MPa), Ag 1000, An 900:
        // 0.90·1000·350 = 315,000; 0.75·900·450 = 303,750 N.
        let t = tension(&curve("csa-s16"), 350.0, 450.0, 1000.0, 900.0).unwrap();
        assert_relative_eq!(t.yield_capacity, 315_000.0, max_relative = 1e-12);
        assert_relative_eq!(t.fracture_capacity, 303_750.0, max_relative = 1e-12);
        assert_eq!(t.governs, "fracture");
        // Unfactored: 33·10 = 330, 60·8 = 480.
        for name in ["euler", "johnson"] {
            let t = tension(&curve(name), FY, FU, 10.0, 8.0).unwrap();
            assert_relative_eq!(t.yield_capacity, 330.0, max_relative = 1e-12);
            assert_relative_eq!(t.fracture_capacity, 480.0, max_relative = 1e-12);
        }
        // Bridge ASD (from memory): 0.55·33·10 = 181.5, 0.50·60·8 = 240.0.
        let t = tension(&curve("bridge-asd"), FY, FU, 10.0, 8.0).unwrap();
        assert_relative_eq!(t.yield_capacity, 181.5, max_relative = 1e-12);
        assert_relative_eq!(t.fracture_capacity, 240.0, max_relative = 1e-12);
        assert_eq!(t.governs, "yield");
    }

    #[test]
    fn bad_tension_inputs() {
        let c = Curve::default_curve();
        assert!(matches!(
            tension(&c, FY, FU, 10.0, 11.0),
            Err(CapacityError::NetExceedsGross { .. })
        ));
        assert!(tension(&c, FY, 0.0, 10.0, 8.0).is_err());
        assert!(tension(&c, FY, FU, f64::NAN, 8.0).is_err());
        assert!(tension(&c, FY, FU, 10.0, -1.0).is_err());
        assert!(tension(&Curve::CsaS16 { n: -1.0 }, FY, FU, 10.0, 8.0).is_err());
        assert!(matches!(
            tension(&c, 1e308, FU, 1e308, 8.0),
            Err(CapacityError::NonFinite { .. })
        ));
    }

    #[test]
    fn slenderness_limits() {
        // Common practice: KL/r 200 in compression, L/r 300 in tension.
        assert_eq!(slenderness_warning(200.0, true), None);
        assert!(slenderness_warning(200.5, true).unwrap().contains("200"));
        assert_eq!(slenderness_warning(250.0, false), None);
        assert_eq!(slenderness_warning(300.0, false), None);
        let w = slenderness_warning(301.0, false).unwrap();
        assert_eq!(w, "L/r = 301.0 exceeds the customary tension limit of 300");
        assert!(slenderness_warning(f64::NAN, true).is_some());
        assert!(slenderness_warning(-1.0, false).is_some());
    }
}
