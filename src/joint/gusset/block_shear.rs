//! Block shear rupture of a gusset plate, AASHTO LRFD 6.13.4 (MBE
//! 6A.6.12.6.4, from memory), for the block a tension member pulls out:
//! shear along the two outer gauge lines from the innermost row to the
//! plate edge, tension across the innermost row between them:
//!
//!   Rn = Rp·(0.58·Fu·Avn + Ubs·Fu·Atn) ≤ Rp·(0.58·Fy·Avg + Ubs·Fu·Atn)   (Eq. 6.13.4-1)
//!
//! Ubs = 1.0 (uniform tension), Rp = 0.90 punched / 1.0 drilled.

/// Areas of the block, m²: (Avg, Avn, Atn), all `plates` summed.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Block {
    pub avg: f64,
    pub avn: f64,
    pub atn: f64,
}

/// The pulled-out block of a rectangular pattern: `lines` gauge lines
/// `gauge` apart, `rows` rows `pitch` apart, `edge` from the outer row to
/// the edge, hole diameter `hole`, plate thickness `t`.
#[allow(clippy::too_many_arguments)]
pub fn block(
    lines: u32,
    gauge: f64,
    rows: u32,
    pitch: f64,
    edge: f64,
    hole: f64,
    t: f64,
    plates: u32,
) -> Block {
    let n = f64::from(plates);
    let lv = f64::from(rows.saturating_sub(1)) * pitch + edge;
    let lvn = lv - (f64::from(rows) - 0.5) * hole;
    let lt = f64::from(lines.saturating_sub(1)) * gauge;
    let ltn = lt - f64::from(lines.saturating_sub(1)) * hole;
    // Two shear planes (the outer gauge lines); one line only: the pattern
    // tears along its single line on both sides (taken as two planes, no tension).
    Block {
        avg: 2.0 * lv * t * n,
        avn: 2.0 * lvn.max(0.0) * t * n,
        atn: ltn.max(0.0) * t * n,
    }
}

/// Nominal block shear resistance, N (Ubs = 1.0).
pub fn rn(b: &Block, fy: f64, fu: f64, rp: f64) -> f64 {
    let rupture = 0.58 * fu * b.avn + fu * b.atn;
    let yielding = 0.58 * fy * b.avg + fu * b.atn;
    rp * rupture.min(yielding)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn block_shear_by_hand() {
        // 2 lines at 3 in gauge, 4 rows at 3 in pitch, edge 1.5 in,
        // 15/16 in holes, one 1/2 in plate, Fy = 33, Fu = 60 ksi, punched:
        //   Lv = 3 × 3 + 1.5 = 10.5 in; Avg = 2 × 10.5 × 0.5 = 10.5 in²
        //   Lvn = 10.5 − 3.5 × 0.9375 = 7.21875; Avn = 7.21875 in²
        //   Atn = (3 − 0.9375) × 0.5 = 1.03125 in²
        //   rupture: 0.58 × 60 × 7.21875 + 60 × 1.03125 = 251.21 + 61.875 = 313.0875
        //   yield:   0.58 × 33 × 10.5 + 61.875 = 200.97 + 61.875 = 262.845  ← governs
        //   Rn = 0.90 × 262.845 = 236.5605 kip (hand calculation, AASHTO LRFD Eq. 6.13.4-1)
        let b = block(2, 3.0, 4, 3.0, 1.5, 0.9375, 0.5, 1);
        assert!((b.avg - 10.5).abs() < 1e-12);
        assert!((b.avn - 7.21875).abs() < 1e-12);
        assert!((b.atn - 1.03125).abs() < 1e-12);
        let r = rn(&b, 33.0, 60.0, 0.9);
        assert!((r - 236.5605).abs() < 1e-9, "{r}");
    }
}
