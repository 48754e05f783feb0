//! K-braced layout: parallel chords, verticals split at mid-height, and a
//! pair of half-diagonals per interior panel meeting at the split point.

use super::{bottom, mid, top, Builder};

/// `n` even and at least 4 (checked by the caller); `c = n/2` is the centre
/// vertical.
///
/// * nodes `L0`…`Ln`, `U1`…`U(n−1)`, and `Mi` at `(i·w, h/2)` for every
///   `i = 1…n−1` except `c`;
/// * chords, end posts `L0-U1` and `U(n−1)-Ln` (chord section);
/// * verticals `Li-Mi` and `Mi-Ui`, the centre one unsplit as `Lc-Uc`;
/// * in interior panel `i` (between panel points `i` and `i + 1`) of the
///   left half, the arms `Mi-U(i+1)` and `Mi-L(i+1)`; in the right half,
///   mirrored, `Ui-M(i+1)` and `Li-M(i+1)`. Each K thus opens towards
///   mid-span, its point on the vertical nearer the support.
///
/// Joints `3n − 2`, members `6n − 7`; with three reactions the truss is
/// statically determinate.
pub(super) fn k_braced(b: &mut Builder, n: usize, w: f64, h: f64) {
    debug_assert!(n >= 4 && n.is_multiple_of(2));
    let c = n / 2;
    for i in 0..=n {
        b.node(bottom(i), i as f64 * w, 0.0);
    }
    for i in 1..n {
        b.node(top(i), i as f64 * w, h);
    }
    for i in (1..n).filter(|&i| i != c) {
        b.node(mid(i), i as f64 * w, h / 2.0);
    }
    for i in 0..n {
        b.chord(&bottom(i), &bottom(i + 1));
    }
    for i in 1..n - 1 {
        b.chord(&top(i), &top(i + 1));
    }
    b.chord(&bottom(0), &top(1));
    b.chord(&top(n - 1), &bottom(n));
    for i in 1..n {
        if i == c {
            b.web(&bottom(i), &top(i));
        } else {
            b.web(&bottom(i), &mid(i));
            b.web(&mid(i), &top(i));
        }
    }
    for i in 1..n - 1 {
        if i < c {
            b.web(&mid(i), &top(i + 1));
            b.web(&mid(i), &bottom(i + 1));
        } else {
            b.web(&top(i), &mid(i + 1));
            b.web(&bottom(i), &mid(i + 1));
        }
    }
}

#[cfg(test)]
mod tests {
    use super::super::test_support::*;
    use super::super::*;

    #[test]
    fn counts_and_mid_nodes() {
        for n in [4, 6, 8, 14] {
            let t = generate(&opts(Family::KBraced, n)).unwrap();
            assert_eq!(t.nodes.len(), 3 * n - 2);
            assert_eq!(t.members.len(), 6 * n - 7);
            let c = n / 2;
            assert!(t.members.iter().any(|m| m.0 == format!("L{c}-U{c}")));
            for i in (1..n).filter(|&i| i != c) {
                let id = format!("M{i}");
                assert_eq!(node_x(&t, &id), i as f64 * 18.0);
                assert_eq!(node_y(&t, &id), 8.0);
                let at: Vec<_> = t
                    .members
                    .iter()
                    .filter(|(_, a, b, _)| *a == id || *b == id)
                    .collect();
                assert_eq!(at.len(), 4, "{id}");
                // Both arms reach the neighbouring vertical nearer mid-span.
                let toward = if i < c { i + 1 } else { i - 1 };
                let arms = at
                    .iter()
                    .filter(|(_, a, b, _)| {
                        let other = if *a == id { b } else { a };
                        node_x(&t, other) == toward as f64 * 18.0
                    })
                    .count();
                assert_eq!(arms, 2, "{id}");
            }
        }
    }

    #[test]
    fn arms_of_each_k_carry_opposite_forces() {
        let t = generate(&opts(Family::KBraced, 8)).unwrap();
        let f = determinate_forces(&t).unwrap();
        for (upper, lower) in [("M1-U2", "M1-L2"), ("U6-M7", "L6-M7")] {
            assert!((f[upper] + f[lower]).abs() < 1e-9);
            assert!(f[upper].abs() > 1.0);
        }
    }
}
