//! Pratt-type, Howe, and Warren layouts (with and without verticals). The
//! Pratt routine also takes per-node top heights, so the polygonal family
//! reuses it with a curved top chord.

use super::{bottom, top, Builder};

/// Bottom chord `L0`…`Ln` and its members.
fn bottom_chord(b: &mut Builder, n: usize, w: f64) {
    for i in 0..=n {
        b.node(bottom(i), i as f64 * w, 0.0);
    }
}

/// Bottom chord members `L(i)-L(i+1)`.
fn bottom_chord_members(b: &mut Builder, n: usize) {
    for i in 0..n {
        b.chord(&bottom(i), &bottom(i + 1));
    }
}

/// Does interior panel `i` (between panel points `i` and `i + 1`) lie in the
/// left half of an `n`-panel span? The centre panel of an odd count counts as
/// left.
fn in_left_half(i: usize, n: usize) -> bool {
    2 * i < n
}

/// Nodes `L0`…`Ln`, `U1`…`U(n−1)` with `Ui` at height `heights[i − 1]`;
/// chords, inclined end posts `L0-U1` and `U(n−1)-Ln` (chord section),
/// verticals `Li-Ui` and one diagonal per interior panel (web section).
///
/// With `tension_diagonals` (Pratt) each diagonal runs down from the top of a
/// vertical towards mid-span; otherwise (Howe) down towards the nearer
/// support. In the centre panel of an odd count both ends are equally far
/// from mid-span; the Pratt diagonal there is `U(m)-L(m+1)` and the Howe one
/// `L(m)-U(m+1)`, with `m = (n − 1)/2`.
pub(super) fn pratt_like(
    b: &mut Builder,
    n: usize,
    w: f64,
    heights: &[f64],
    tension_diagonals: bool,
) {
    debug_assert_eq!(heights.len(), n - 1);
    bottom_chord(b, n, w);
    for i in 1..n {
        b.node(top(i), i as f64 * w, heights[i - 1]);
    }
    bottom_chord_members(b, n);
    for i in 1..n - 1 {
        b.chord(&top(i), &top(i + 1));
    }
    b.chord(&bottom(0), &top(1));
    b.chord(&top(n - 1), &bottom(n));
    for i in 1..n {
        b.web(&bottom(i), &top(i));
    }
    for i in 1..n - 1 {
        // "Falling" = from the top of vertical i down to the bottom of i + 1.
        let falling = in_left_half(i, n) == tension_diagonals;
        if falling {
            b.web(&top(i), &bottom(i + 1));
        } else {
            b.web(&bottom(i), &top(i + 1));
        }
    }
}

/// Warren truss with verticals: parallel chords at depth `h`, verticals
/// `Li-Ui`, and inclined members alternating in direction panel by panel,
/// counted from both ends (end posts `L0-U1` and `U(n−1)-Ln` in the chord
/// section, interior diagonals web). For an odd panel count the centre panel
/// continues the alternation from the left, so it has the same direction as
/// the panel to its right.
pub(super) fn warren_verticals(b: &mut Builder, n: usize, w: f64, h: f64) {
    bottom_chord(b, n, w);
    for i in 1..n {
        b.node(top(i), i as f64 * w, h);
    }
    bottom_chord_members(b, n);
    for i in 1..n - 1 {
        b.chord(&top(i), &top(i + 1));
    }
    b.chord(&bottom(0), &top(1));
    b.chord(&top(n - 1), &bottom(n));
    for i in 1..n {
        b.web(&bottom(i), &top(i));
    }
    for k in 1..n - 1 {
        // Rising = from the bottom at panel point k up to the top at k + 1.
        let rising = if in_left_half(k, n) {
            k % 2 == 0
        } else {
            (n - 1 - k) % 2 == 1
        };
        if rising {
            b.web(&bottom(k), &top(k + 1));
        } else {
            b.web(&top(k), &bottom(k + 1));
        }
    }
}

/// Warren truss without verticals: `Uk` over the midpoint of bottom panel
/// `k` (between `L(k−1)` and `Lk`, `x = (k − ½)·w`) for `k = 1…n`; in every
/// panel the diagonals `L(k−1)-Uk` and `Uk-Lk`. The two end diagonals
/// `L0-U1` and `Un-Ln` take the chord section, the others the web section.
pub(super) fn warren(b: &mut Builder, n: usize, w: f64, h: f64) {
    bottom_chord(b, n, w);
    for k in 1..=n {
        b.node(top(k), (k as f64 - 0.5) * w, h);
    }
    bottom_chord_members(b, n);
    for k in 1..n {
        b.chord(&top(k), &top(k + 1));
    }
    for k in 1..=n {
        let (l, u, r) = (bottom(k - 1), top(k), bottom(k));
        if k == 1 {
            b.chord(&l, &u);
        } else {
            b.web(&l, &u);
        }
        if k == n {
            b.chord(&u, &r);
        } else {
            b.web(&u, &r);
        }
    }
}

#[cfg(test)]
mod tests {
    use super::super::test_support::*;
    use super::super::*;

    /// Diagonals of a layout with verticals: members joining an `L` and a `U`
    /// node with different numbers, end posts excluded.
    fn diagonals(t: &TrussLayout, n: usize) -> Vec<(String, String, String)> {
        let num = |s: &str| s[1..].parse::<usize>().unwrap();
        t.members
            .iter()
            .filter(|(id, a, b, _)| {
                let kinds = (a.as_bytes()[0], b.as_bytes()[0]);
                let lu = matches!(kinds, (b'L', b'U') | (b'U', b'L'));
                let end_post = *id == "L0-U1" || *id == format!("U{}-L{n}", n - 1);
                lu && num(a) != num(b) && !end_post
            })
            .map(|(id, a, b, _)| (id.clone(), a.clone(), b.clone()))
            .collect()
    }

    /// (upper end, lower end) distances from mid-span.
    fn end_distances(t: &TrussLayout, n: usize, a: &str, b: &str) -> (f64, f64) {
        let mid = n as f64 * 18.0 / 2.0;
        let (upper, lower) = if node_y(t, a) > node_y(t, b) {
            (a, b)
        } else {
            (b, a)
        };
        (
            (node_x(t, upper) - mid).abs(),
            (node_x(t, lower) - mid).abs(),
        )
    }

    #[test]
    fn pratt_diagonals_run_down_towards_mid_span_and_pull() {
        for family in [Family::Pratt, Family::Polygonal] {
            for n in 2..=11 {
                let t = generate(&opts(family, n)).unwrap();
                let forces = determinate_forces(&t).unwrap();
                let diags = diagonals(&t, n);
                assert_eq!(diags.len(), n - 2);
                for (id, a, b) in &diags {
                    let (du, dl) = end_distances(&t, n, a, b);
                    if (du - dl).abs() < 1e-9 {
                        // Centre panel of an odd count: no shear, no force.
                        assert!(n % 2 == 1 && forces[id].abs() < 1e-9, "{id}");
                    } else {
                        assert!(dl < du, "{family:?} n={n}: {id} runs the wrong way");
                        assert!(forces[id] > 0.0, "{family:?} n={n}: {id} not in tension");
                    }
                }
            }
        }
    }

    #[test]
    fn howe_diagonals_run_down_towards_supports_and_push() {
        for n in 3..=10 {
            let t = generate(&opts(Family::Howe, n)).unwrap();
            let forces = determinate_forces(&t).unwrap();
            let diags = diagonals(&t, n);
            assert_eq!(diags.len(), n - 2);
            for (id, a, b) in &diags {
                let (du, dl) = end_distances(&t, n, a, b);
                if (du - dl).abs() > 1e-9 {
                    assert!(dl > du, "n={n}: {id} runs the wrong way");
                    assert!(forces[id] < 0.0, "n={n}: {id} not in compression");
                }
            }
        }
    }

    #[test]
    fn pratt_layout_for_four_panels() {
        let t = generate(&opts(Family::Pratt, 4)).unwrap();
        let ids: Vec<&str> = t.members.iter().map(|m| m.0.as_str()).collect();
        assert_eq!(
            ids,
            [
                "L0-L1", "L1-L2", "L2-L3", "L3-L4", "U1-U2", "U2-U3", "L0-U1", "U3-L4", "L1-U1",
                "L2-U2", "L3-U3", "U1-L2", "L2-U3",
            ]
        );
        assert_eq!(t.nodes[5], ("U1".to_string(), 18.0, 16.0));
        // Hanger L1-U1 carries the panel load; end post is in compression.
        let f = determinate_forces(&t).unwrap();
        assert!((f["L1-U1"] - 20.0).abs() < 1e-9);
        assert!(f["L0-U1"] < 0.0);
    }

    #[test]
    fn warren_verticals_alternate_and_are_symmetric_for_even_counts() {
        for n in 2..=9 {
            let t = generate(&opts(Family::WarrenVerticals, n)).unwrap();
            // Slope sign of every inclined member, panel by panel.
            let mut slopes: Vec<(f64, f64)> = t
                .members
                .iter()
                .filter(|(_, a, b, _)| {
                    node_x(&t, a) != node_x(&t, b) && node_y(&t, a) != node_y(&t, b)
                })
                .map(|(_, a, b, _)| {
                    let x = (node_x(&t, a) + node_x(&t, b)) / 2.0;
                    let rise = (node_y(&t, b) - node_y(&t, a)) * (node_x(&t, b) - node_x(&t, a));
                    (x, rise.signum())
                })
                .collect();
            slopes.sort_by(|p, q| p.0.total_cmp(&q.0));
            assert_eq!(slopes.len(), n);
            for k in 0..n - 1 {
                let centre_pair = n % 2 == 1 && k == (n - 1) / 2;
                if !centre_pair {
                    assert_ne!(slopes[k].1, slopes[k + 1].1, "n={n}, panel {k}");
                }
            }
            if n % 2 == 0 {
                for k in 0..n {
                    assert_eq!(slopes[k].1, -slopes[n - 1 - k].1, "n={n} not symmetric");
                }
            }
        }
    }

    #[test]
    fn warren_top_nodes_sit_at_half_panels() {
        for n in 2..=7 {
            let t = generate(&opts(Family::Warren, n)).unwrap();
            assert_eq!(t.nodes.len(), 2 * n + 1);
            assert_eq!(t.members.len(), 4 * n - 1);
            for k in 1..=n {
                let id = format!("U{k}");
                assert_eq!(node_x(&t, &id), (k as f64 - 0.5) * 18.0);
                assert_eq!(node_y(&t, &id), 16.0);
            }
            assert!(t.members.iter().all(
                |(_, a, b, _)| node_x(&t, a) != node_x(&t, b) || node_y(&t, a) == node_y(&t, b)
            ));
        }
    }
}
