//! Default top-chord profile for the polygonal (curved top chord) Pratt
//! family. The web layout itself is the Pratt one from `parallel.rs`.

/// Depth at the bearings, as a fraction of the mid-span depth, of the
/// default parabolic top chord. The parabola passes through
/// `DEFAULT_END_HEIGHT_RATIO · height` at `x = 0` and `x = n·w` and through
/// `height` at mid-span; the top panel points `U1`…`U(n−1)` are placed on it,
/// so the end verticals are somewhat taller than this fraction and, for an
/// odd panel count, no panel point reaches the full `height`.
pub const DEFAULT_END_HEIGHT_RATIO: f64 = 0.55;

/// Heights of `U1`…`U(n−1)` on the default parabola.
pub(super) fn parabolic_heights(n: usize, height: f64) -> Vec<f64> {
    let end = DEFAULT_END_HEIGHT_RATIO * height;
    (1..n)
        .map(|i| {
            // s runs from -1 at L0 to +1 at Ln.
            let s = 2.0 * i as f64 / n as f64 - 1.0;
            end + (height - end) * (1.0 - s * s)
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::super::test_support::*;
    use super::super::*;
    use super::*;

    #[test]
    fn default_profile_is_a_symmetric_parabola() {
        let h = parabolic_heights(4, 16.0);
        // s = -0.5, 0, 0.5: 8.8 + 7.2 * 0.75 = 14.2.
        assert_eq!(h.len(), 3);
        assert!((h[0] - 14.2).abs() < 1e-12 && (h[2] - 14.2).abs() < 1e-12);
        assert!((h[1] - 16.0).abs() < 1e-12);
        for n in 2..12 {
            let h = parabolic_heights(n, 10.0);
            for i in 0..h.len() {
                assert!((h[i] - h[h.len() - 1 - i]).abs() < 1e-12);
                assert!(h[i] > 5.5 && h[i] <= 10.0 + 1e-12);
            }
        }
    }

    #[test]
    fn polygonal_layout_uses_the_profile_or_given_heights() {
        let t = generate(&opts(Family::Polygonal, 6)).unwrap();
        assert_eq!(node_y(&t, "U3"), 16.0);
        assert!(node_y(&t, "U1") < node_y(&t, "U2"));
        assert!(t.comment.contains("at mid-span"));

        let mut o = opts(Family::Polygonal, 4);
        o.top_heights = Some(vec![9.0, 13.0, 10.0]);
        let t = generate(&o).unwrap();
        assert_eq!(node_y(&t, "U1"), 9.0);
        assert_eq!(node_y(&t, "U2"), 13.0);
        assert_eq!(node_y(&t, "U3"), 10.0);
        assert!(determinate_forces(&t).is_some());
    }

    #[test]
    fn bad_top_heights_are_rejected() {
        let mut o = opts(Family::Polygonal, 4);
        o.top_heights = Some(vec![9.0, 13.0]);
        let e = generate(&o).unwrap_err();
        assert_eq!(
            e,
            GenerateError::TopHeightsLength {
                panels: 4,
                expected: 3,
                got: 2
            }
        );
        assert_eq!(
            e.to_string(),
            "4 panels need 3 top heights (U1 to U3), got 2"
        );
        for bad in [0.0, -1.0, f64::NAN] {
            o.top_heights = Some(vec![9.0, bad, 10.0]);
            match generate(&o).unwrap_err() {
                GenerateError::InvalidTopHeight { node: 2, .. } => {}
                other => panic!("unexpected {other:?}"),
            }
        }
    }
}
