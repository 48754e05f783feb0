//! Transverse distribution to one truss of a two-truss bridge.
//!
//! The floor beam spans simply between the two trusses, `width` apart. A
//! load at transverse offset y from the truss analysed (y = 0 on it, y =
//! width on the other; negative on a bracket outside it) gives that truss
//! (width − y)/width of the load — the lever rule, the reaction of a simply
//! supported beam (or of one with an overhang).
//!
//! - Lanes: each lane's vehicle at its centre offset; with n lanes loaded
//!   the share is m(n)·Σ of the n largest lane shares, m the standard's
//!   multiple-presence factor, and the greatest over n governs (loading a
//!   lane that relieves the truss is never required).
//! - Wheel lines: a vehicle whose two wheel lines stand at given offsets;
//!   each line carries half the vehicle.
//! - Area loads (pedestrian, crowd) over the whole width between the
//!   trusses: intensity × tributary width, width/2 for a deck between two
//!   trusses, unless a tributary width is given.

use super::library::Presence;

/// The deck's transverse layout as the model gives it (SI), kept with the
/// live loads so that a sweep can place another vehicle the same way.
#[derive(Clone, Debug, PartialEq, Default)]
pub struct DeckLayout {
    /// Truss spacing (the floor beam's span), m.
    pub width: Option<f64>,
    /// Lane centre offsets from the truss analysed, m.
    pub lanes: Vec<f64>,
    /// Wheel-line offsets, m.
    pub wheel_lines: Vec<f64>,
    /// Width of deck whose area load this truss carries, m.
    pub tributary: Option<f64>,
}

impl DeckLayout {
    /// Share of one vehicle per lane (or of the vehicle on its wheel lines)
    /// this truss carries and the number of lanes loaded; (1, 0) when the
    /// deck gives neither lanes nor wheel lines.
    pub fn vehicle_share(&self, presence: Presence) -> (f64, usize) {
        match self.width {
            Some(w) if !self.lanes.is_empty() => lanes_share(w, &self.lanes, presence),
            Some(w) if !self.wheel_lines.is_empty() => (wheel_lines_share(w, &self.wheel_lines), 1),
            _ => (1.0, 0),
        }
    }

    /// Width of deck whose area load this truss carries, m.
    pub fn area_width(&self) -> Option<f64> {
        self.tributary.or(self.width.map(|w| 0.5 * w))
    }
}

/// Lever-rule share of a unit load at `offset` from the truss analysed.
pub fn lever_share(width: f64, offset: f64) -> f64 {
    (width - offset) / width
}

/// Share of one vehicle (or lane load) of each lane loaded: the greatest
/// over n of m(n)·(sum of the n greatest positive lane shares), with the
/// number of lanes n that governs.
pub fn lanes_share(width: f64, lanes: &[f64], presence: Presence) -> (f64, usize) {
    let mut shares: Vec<f64> = lanes
        .iter()
        .map(|&y| lever_share(width, y))
        .filter(|s| *s > 0.0)
        .collect();
    shares.sort_by(|a, b| b.total_cmp(a));
    let mut best = (0.0, 0);
    let mut sum = 0.0;
    for (n, s) in shares.iter().enumerate() {
        sum += s;
        let v = presence.factor(n + 1) * sum;
        if v > best.0 {
            best = (v, n + 1);
        }
    }
    best
}

/// Share of one vehicle whose wheel lines stand at `lines` offsets (each
/// line half the vehicle).
pub fn wheel_lines_share(width: f64, lines: &[f64]) -> f64 {
    if lines.is_empty() {
        return 0.0;
    }
    lines.iter().map(|&y| lever_share(width, y)).sum::<f64>() / lines.len() as f64
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn lever_rule_by_hand() {
        // Trusses 20 ft apart; one lane centred 6 ft from the truss: that
        // truss takes (20 − 6)/20 = 0.70 of the lane (statics by hand).
        assert!((lever_share(20.0, 6.0) - 0.70).abs() < 1e-12);
        // Bracket 3 ft outside: 23/20 = 1.15.
        assert!((lever_share(20.0, -3.0) - 1.15).abs() < 1e-12);
        // Two lanes at 6 and 14 ft: 0.70 + 0.30 = 1.00 × m(2) 1.00 = 1.00;
        // one lane 0.70 × m(1) 1.20 = 0.84 (LRFD Table 3.6.1.1.2-1 from
        // memory) — two lanes govern.
        let (s, n) = lanes_share(20.0, &[6.0, 14.0], Presence::Lrfd);
        assert!((s - 1.00).abs() < 1e-12 && n == 2, "{s} {n}");
        // Lanes at 2 and 18 ft: one lane 0.9 × 1.2 = 1.08 beats both
        // (0.9 + 0.1) × 1.0 = 1.00.
        let (s, n) = lanes_share(20.0, &[2.0, 18.0], Presence::Lrfd);
        assert!((s - 1.08).abs() < 1e-12 && n == 1, "{s} {n}");
        // A lane on the far truss (share 0) is never loaded.
        assert_eq!(lanes_share(20.0, &[20.0], Presence::None), (0.0, 0));
        // Wheel lines 6 ft apart straddling 5 ft: 2 and 8 ft → (0.9 + 0.6)/2.
        assert!((wheel_lines_share(20.0, &[2.0, 8.0]) - 0.75).abs() < 1e-12);
    }
}
