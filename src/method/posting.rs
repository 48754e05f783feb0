//! Load posting from legal-load rating factors.
//!
//! LRFR, MBE 6A.8.3 (Eq. 6A.8.3-1, from memory): where 0.3 ≤ RF < 1.0 the
//! safe posting load is W/0.7·(RF − 0.3), W the legal vehicle's gross weight;
//! no posting for RF ≥ 1.0; below 0.3 the vehicle is not to be allowed
//! (restrict or close). LFR and ASR (MBE Part B, 6B.7, from memory): the
//! safe load capacity RF·W at the operating level, posted when below W.

use super::Family;

/// What a legal-load rating factor means for the vehicle.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Posting {
    /// RF ≥ 1.0: the vehicle may cross; no posting.
    None,
    /// Post at this weight (same unit as W).
    Post(f64),
    /// RF below 0.3 (LRFR) or not positive: restrict or close.
    RestrictOrClose,
}

/// MBE Eq. 6A.8.3-1 lower limit of RF for a posting (from memory).
pub const LRFR_POSTING_FLOOR: f64 = 0.3;

/// The posting for a vehicle of gross weight `w` rated at `rf` by a method
/// of `family`.
pub fn posting(family: Family, rf: f64, w: f64) -> Posting {
    if rf >= 1.0 {
        return Posting::None;
    }
    match family {
        Family::Lrfr => {
            if rf < LRFR_POSTING_FLOOR {
                Posting::RestrictOrClose
            } else {
                Posting::Post(w / 0.7 * (rf - LRFR_POSTING_FLOOR))
            }
        }
        _ => {
            if rf <= 0.0 {
                Posting::RestrictOrClose
            } else {
                Posting::Post(rf * w)
            }
        }
    }
}

/// The equation behind a posting, for reports.
pub fn clause(family: Family) -> &'static str {
    match family {
        Family::Lrfr => "MBE Eq. 6A.8.3-1: W/0.7·(RF − 0.3) for 0.3 ≤ RF < 1.0",
        _ => "MBE 6B.7: safe load capacity RF·W at the operating level",
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn lrfr_posting_at_the_issue_points() {
        // MBE Eq. 6A.8.3-1 (from memory), 25-ton vehicle:
        // RF 0.3 → 25/0.7·0 = 0; RF 0.65 → 25/0.7·0.35 = 12.5; RF 1.0 → none.
        assert_eq!(posting(Family::Lrfr, 0.3, 25.0), Posting::Post(0.0));
        match posting(Family::Lrfr, 0.65, 25.0) {
            Posting::Post(p) => assert!((p - 12.5).abs() < 1e-12),
            other => panic!("{other:?}"),
        }
        assert_eq!(posting(Family::Lrfr, 1.0, 25.0), Posting::None);
        assert_eq!(posting(Family::Lrfr, 0.29, 25.0), Posting::RestrictOrClose);
        // Just below 1.0 the formula gives 25/0.7·0.7 = 25 tons (continuous).
        match posting(Family::Lrfr, 0.999_999, 25.0) {
            Posting::Post(p) => assert!((p - 25.0).abs() < 1e-4),
            other => panic!("{other:?}"),
        }
    }

    #[test]
    fn part_b_safe_load_capacity() {
        // MBE Part B (from memory): RF·W, 0.8 × 25 = 20 tons.
        assert_eq!(posting(Family::Asr, 0.8, 25.0), Posting::Post(20.0));
        assert_eq!(posting(Family::Lfr, 1.2, 25.0), Posting::None);
        assert_eq!(posting(Family::Asr, -0.1, 25.0), Posting::RestrictOrClose);
    }
}
