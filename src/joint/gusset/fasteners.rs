//! Shear resistance of the fasteners that join a member to the gusset
//! plates: rivets by the MBE's rivet strengths, bolts by AASHTO LRFD
//! 6.13.2.7. Nominal values (SI); the resistance factor is the method's
//! (see `factors.rs`). The member force is shared equally by the fasteners
//! of a concentric group (MBE 6A.6.12.5, from memory).
//!
//! Rivet:  Rn = Fv·Ab·Ns per rivet            (MBE 6A.6.12.5.1, Fv from Table 6A.6.12.5.1-1)
//! Bolt:   Rn = 0.56·Ab·Fub·Ns threads excluded from the shear planes,
//!         Rn = 0.45·Ab·Fub·Ns threads included    (AASHTO LRFD 6.13.2.7, 8th/9th ed.)
//! Joints longer than 38 in between the extreme fasteners along the force:
//! Rn × 0.83 (AASHTO LRFD 6.13.2.7, applied here to rivets too, the
//! conservative choice). All values from memory and overridable.

/// 1 ksi in Pa.
pub const KSI: f64 = 6.894_757_293_168e6;
/// 1 in in m.
pub const INCH: f64 = 0.0254;

/// Rivet shear strength Fv, MBE Table 6A.6.12.5.1-1 as recalled (from memory):
/// rivets driven before 1936 or of unknown origin, 18 ksi.
pub const RIVET_BEFORE_1936: f64 = 18.0 * KSI;
/// Rivets driven in 1936 or later but of unknown grade, 21 ksi (from memory).
pub const RIVET_AFTER_1936: f64 = 21.0 * KSI;
/// ASTM A502 Grade 1 rivets, 27 ksi (from memory).
pub const RIVET_A502_1: f64 = 27.0 * KSI;
/// ASTM A502 Grade 2 or 3 rivets, 32 ksi (from memory).
pub const RIVET_A502_2: f64 = 32.0 * KSI;

/// Bolt shear coefficients of AASHTO LRFD Eq. 6.13.2.7-1/-2 (8th/9th ed., from memory).
pub const BOLT_THREADS_EXCLUDED: f64 = 0.56;
pub const BOLT_THREADS_INCLUDED: f64 = 0.45;
/// Long-joint reduction of AASHTO LRFD 6.13.2.7 (from memory): 0.83 beyond 38 in.
pub const LONG_JOINT_FACTOR: f64 = 0.83;
pub const LONG_JOINT_LENGTH: f64 = 38.0 * INCH;

/// Minimum tensile strengths Fub of bolts (AASHTO LRFD 6.4.3.1, from memory).
pub const FUB_A307: f64 = 60.0 * KSI;
pub const FUB_A325: f64 = 120.0 * KSI;
pub const FUB_A490: f64 = 150.0 * KSI;

/// A rivet's grade when it is known.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum RivetGrade {
    A502Grade1,
    A502Grade2,
}

/// The MBE rivet strength Fv (Pa) and where it came from, by grade if
/// known, else by the year the rivets were driven; no year and no grade is
/// "unknown origin", the lowest value.
pub fn rivet_strength(grade: Option<RivetGrade>, year: Option<i32>) -> (f64, &'static str) {
    match (grade, year) {
        (Some(RivetGrade::A502Grade1), _) => (RIVET_A502_1, "ASTM A502 Grade 1"),
        (Some(RivetGrade::A502Grade2), _) => (RIVET_A502_2, "ASTM A502 Grade 2"),
        (None, Some(y)) if y >= 1936 => (RIVET_AFTER_1936, "driven 1936 or later, grade unknown"),
        (None, Some(_)) => (RIVET_BEFORE_1936, "driven before 1936"),
        (None, None) => (RIVET_BEFORE_1936, "of unknown origin"),
    }
}

/// Nominal area of a fastener of diameter `d` (m): π·d²/4.
pub fn area(d: f64) -> f64 {
    std::f64::consts::PI * d * d / 4.0
}

/// Nominal shear resistance of one rivet, N: Rn = Fv·Ab·Ns.
pub fn rivet_rn(d: f64, fv: f64, planes: u32) -> f64 {
    fv * area(d) * f64::from(planes)
}

/// Nominal shear resistance of one bolt, N: Rn = c·Ab·Fub·Ns with
/// c = 0.56 (threads excluded) or 0.45 (threads included).
pub fn bolt_rn(d: f64, fub: f64, threads_excluded: bool, planes: u32) -> f64 {
    let c = if threads_excluded {
        BOLT_THREADS_EXCLUDED
    } else {
        BOLT_THREADS_INCLUDED
    };
    c * area(d) * fub * f64::from(planes)
}

/// The long-joint factor for a joint `length` (m) between the extreme
/// fasteners along the force.
pub fn long_joint(length: f64) -> f64 {
    if length > LONG_JOINT_LENGTH {
        LONG_JOINT_FACTOR
    } else {
        1.0
    }
}

/// Nominal shear resistance of a concentric group, N: n·Rn·(long-joint factor).
pub fn group_rn(count: u32, rn_one: f64, length: f64) -> f64 {
    f64::from(count) * rn_one * long_joint(length)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn close(a: f64, b: f64) {
        assert!((a - b).abs() <= 1e-6 * b.abs().max(1e-12), "{a} vs {b}");
    }

    #[test]
    fn rivet_in_double_shear_by_hand() {
        // 7/8 in rivet, driven 1905: Fv = 18 ksi (MBE Table 6A.6.12.5.1-1,
        // from memory). Ab = π·0.875²/4 = 0.601 32 in²; double shear:
        // Rn = 18 × 0.601 32 × 2 = 21.648 kip (hand calculation).
        let (fv, _) = rivet_strength(None, Some(1905));
        let rn = rivet_rn(0.875 * INCH, fv, 2);
        close(
            rn / (1000.0 * 4.448_221_615_260_5),
            18.0 * 0.601_320_7 * 2.0,
        );
    }

    #[test]
    fn rivet_strength_by_year_and_grade() {
        // MBE Table 6A.6.12.5.1-1 as recalled: unknown 18, ≥ 1936 21, A502-1 27 ksi.
        assert_eq!(rivet_strength(None, None).0, 18.0 * KSI);
        assert_eq!(rivet_strength(None, Some(1935)).0, 18.0 * KSI);
        assert_eq!(rivet_strength(None, Some(1936)).0, 21.0 * KSI);
        assert_eq!(
            rivet_strength(Some(RivetGrade::A502Grade1), Some(1900)).0,
            27.0 * KSI
        );
    }

    #[test]
    fn a325_bolt_threads_in_and_out() {
        // 7/8 in A325, single shear (AASHTO LRFD Eq. 6.13.2.7-1/-2, from memory):
        // Ab = 0.601 32 in²; out: 0.56 × 0.601 32 × 120 = 40.409 kip;
        // in: 0.45 × 0.601 32 × 120 = 32.471 kip (hand calculation).
        let kip = 4_448.221_615_260_5;
        close(
            bolt_rn(0.875 * INCH, FUB_A325, true, 1) / kip,
            0.56 * 0.601_320_7 * 120.0,
        );
        close(
            bolt_rn(0.875 * INCH, FUB_A325, false, 1) / kip,
            0.45 * 0.601_320_7 * 120.0,
        );
    }

    #[test]
    fn long_joints_are_reduced() {
        // 13 rows at 3 in pitch: 36 in, no reduction; 14 rows: 39 in > 38 in, × 0.83.
        let rn = 10.0;
        close(group_rn(26, rn, 36.0 * INCH), 260.0);
        close(group_rn(28, rn, 39.0 * INCH), 280.0 * 0.83);
    }
}
