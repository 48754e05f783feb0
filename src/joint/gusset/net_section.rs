//! Net-section fracture of the gusset plates across the Whitmore section
//! (MBE 6A.6.12.6.3, from memory; AASHTO LRFD 6.8.2.1 and 6.13.5.2):
//!
//!   Rn = Fu·An·Rp·U,   An = (Lw − n·dh)·t·plates ≤ 0.85·Ag
//!
//! with n the holes of the last row on the section, U = 1.0 for the plate
//! (the whole width is connected), Rp = 0.90 for holes punched full size,
//! 1.0 drilled or reamed (the conservative 0.90 when not known).

/// Net area of the section, m²: (width − holes·dh)·t·plates, at most 0.85·Ag.
pub fn net_area(width: f64, holes: u32, hole: f64, t: f64, plates: u32) -> f64 {
    let ag = width * t * f64::from(plates);
    let an = (width - f64::from(holes) * hole).max(0.0) * t * f64::from(plates);
    an.min(0.85 * ag)
}

/// Nominal fracture resistance, N.
pub fn rn(fu: f64, an: f64, rp: f64, u: f64) -> f64 {
    fu * an * rp * u
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn net_section_by_hand() {
        // Lw = 13.392 in, 2 holes of 15/16 in, 1/2 in plate, one plate:
        // An = (13.392 − 1.875) × 0.5 = 5.7585 in²; 0.85·Ag = 5.6916 in² governs.
        // Rn = 60 × 5.6916 × 0.90 = 307.35 kip (hand calculation).
        let an = net_area(13.392, 2, 0.9375, 0.5, 1);
        assert!((an - 0.85 * 13.392 * 0.5).abs() < 1e-12, "{an}");
        assert!((rn(60.0, an, 0.9, 1.0) - 307.3464).abs() < 1e-4);
        // A wide section with many holes: the holes govern.
        let an = net_area(10.0, 4, 1.0, 0.5, 2);
        assert!((an - 6.0).abs() < 1e-12, "{an}");
    }
}
