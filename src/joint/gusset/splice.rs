//! A chord splice inside the joint (MBE 6A.6.12.6.9, from memory): the
//! splice plates, with the depth of gusset plate the model counts as part
//! of the spliced section, carry the chord force across the joint.
//!
//!   tension, gross yielding:   Rn = Fy·Ag                (AASHTO LRFD 6.8.2.1-1)
//!   tension, net fracture:     Rn = Fu·An·Rp, An ≤ 0.85·Ag (6.8.2.1-2, 6.13.5.2)
//!   compression (short):       Rn = Fy·Ag                (MBE: the splice as a
//!                              short column between fastener lines, from memory)
//!
//! The eccentricity of splice plates off the chord's centroid is not
//! taken into account (a note says so).

/// One group of identical splice plates (SI).
#[derive(Clone, Debug, PartialEq)]
pub struct SplicePlates {
    pub count: u32,
    pub width: f64,
    pub thickness: f64,
    /// Holes across one plate on the critical section.
    pub holes: u32,
    pub fy: f64,
    pub fu: f64,
}

/// (Fy·Ag, Fu·An) summed over the plates, N, with hole diameter `hole`.
pub fn strengths(plates: &[SplicePlates], hole: f64) -> (f64, f64) {
    plates.iter().fold((0.0, 0.0), |(y, f), p| {
        let n = f64::from(p.count);
        let ag = p.width * p.thickness * n;
        let an = ((p.width - f64::from(p.holes) * hole).max(0.0) * p.thickness * n).min(0.85 * ag);
        (y + p.fy * ag, f + p.fu * an)
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn splice_by_hand() {
        // Two 10 × 1/2 in plates, 2 holes of 15/16 in each, Fy 33, Fu 60 ksi,
        // plus one gusset strip 12 × 1/2 in with 2 holes (hand calculation):
        //   Ag = 10 + 6 = 16 in² → Fy·Ag = 528 kip
        //   An: plates (10 − 1.875) × 0.5 × 2 = 8.125 ≤ 8.5; strip (12 − 1.875) × 0.5
        //   = 5.0625 ≤ 5.1 → Fu·An = 60 × 13.1875 = 791.25 kip
        let p = [
            SplicePlates {
                count: 2,
                width: 10.0,
                thickness: 0.5,
                holes: 2,
                fy: 33.0,
                fu: 60.0,
            },
            SplicePlates {
                count: 1,
                width: 12.0,
                thickness: 0.5,
                holes: 2,
                fy: 33.0,
                fu: 60.0,
            },
        ];
        let (y, f) = strengths(&p, 0.9375);
        assert!((y - 528.0).abs() < 1e-9);
        assert!((f - 791.25).abs() < 1e-9, "{f}");
    }
}
