//! Rainflow cycle counting of a stress (or force) history, ASTM E1049-85
//! (reapproved 2017), §5.4.4 "Rainflow Counting", the three-point method,
//! and its variant for a repeating history (§5.4.5, "Simplified Rainflow
//! Counting for Repeating Histories"; clause numbers from memory).
//!
//! Reversals first: the history is reduced to its peaks and valleys
//! (repeated values and points on a monotone run dropped). Then, with X the
//! range of the two most recent reversals and Y the range before it:
//!
//! - §5.4.4 (a single history): if X < Y read on; otherwise, if Y holds the
//!   starting point S count Y as ½ cycle and drop its first point (S moves
//!   to its second point), else count Y as 1 cycle and drop both its points;
//!   at the end count every range not yet counted as ½ cycle.
//! - Repeating history (a passage followed by the same passage again and
//!   again): the history is rotated so that it starts and closes at its
//!   absolute maximum (the largest value), then every Y with X ≥ Y is one
//!   whole cycle; no half cycles remain. This is the count of one passage
//!   within an endless sequence of identical passages.

/// Counted cycles: (range, count) with counts ½ or 1, in the order found.
pub type Cycles = Vec<(f64, f64)>;

/// Peaks and valleys of `history`: the first and last points and every
/// point where the direction changes; repeated values and intermediate
/// points of a monotone run are dropped. Non-finite values are the
/// caller's fault and are not filtered.
pub fn reversals(history: &[f64]) -> Vec<f64> {
    let mut out: Vec<f64> = Vec::with_capacity(history.len());
    for &v in history {
        if out.last() == Some(&v) {
            continue;
        }
        if out.len() >= 2 {
            let (a, b) = (out[out.len() - 2], out[out.len() - 1]);
            // b lies on the run from a to v: it is not a reversal.
            if (b - a) * (v - b) > 0.0 {
                out.pop();
            }
        }
        out.push(v);
    }
    out
}

/// ASTM E1049 §5.4.4, three-point rainflow counting of a single history.
pub fn count(history: &[f64]) -> Cycles {
    let mut cycles = Vec::new();
    let mut stack: Vec<f64> = Vec::new();
    // Index in `stack` of the starting point S: always 0 here, since S is
    // only ever the first point kept (dropping it moves S to the next).
    for v in reversals(history) {
        stack.push(v);
        while stack.len() >= 3 {
            let n = stack.len();
            let x = (stack[n - 1] - stack[n - 2]).abs();
            let y = (stack[n - 2] - stack[n - 3]).abs();
            if x < y {
                break;
            }
            if n == 3 {
                // Y holds the starting point: ½ cycle, S moves on.
                cycles.push((y, 0.5));
                stack.remove(0);
            } else {
                cycles.push((y, 1.0));
                stack.drain(n - 3..n - 1);
            }
        }
    }
    for w in stack.windows(2) {
        cycles.push(((w[1] - w[0]).abs(), 0.5));
    }
    cycles
}

/// Rainflow count of a repeating history: `history` rotated to start and
/// close at its largest value (the first occurrence), then counted with
/// every closed range a whole cycle (ASTM E1049 §5.4.5, from memory).
pub fn count_repeating(history: &[f64]) -> Cycles {
    let Some(k) = (0..history.len()).max_by(|&a, &b| {
        history[a].total_cmp(&history[b]).then(b.cmp(&a)) // the first occurrence wins a tie
    }) else {
        return Vec::new();
    };
    let mut rotated = Vec::with_capacity(history.len() + 1);
    rotated.extend_from_slice(&history[k..]);
    rotated.extend_from_slice(&history[..=k]);
    let mut cycles = Vec::new();
    let mut stack: Vec<f64> = Vec::new();
    for v in reversals(&rotated) {
        stack.push(v);
        while stack.len() >= 3 {
            let n = stack.len();
            let x = (stack[n - 1] - stack[n - 2]).abs();
            let y = (stack[n - 2] - stack[n - 3]).abs();
            if x < y {
                break;
            }
            cycles.push((y, 1.0));
            stack.drain(n - 3..n - 1);
        }
    }
    cycles
}

/// Number of cycles Σnᵢ and effective range (Σ nᵢ·Δfᵢ³ / Σ nᵢ)^(1/3) (the
/// cube-mean range of AASHTO MBE §7.2.2 and LRFD C6.6.1.2.5, Miner's rule
/// with an S-N slope of 3). Cycles of zero range are not counted; (0, 0)
/// when nothing is left.
pub fn effective(cycles: &[(f64, f64)]) -> (f64, f64) {
    let (mut n, mut s3) = (0.0, 0.0);
    for &(r, c) in cycles {
        if r > 0.0 {
            n += c;
            s3 += c * r.powi(3);
        }
    }
    if n == 0.0 {
        (0.0, 0.0)
    } else {
        (n, (s3 / n).cbrt())
    }
}

/// Cycles summed by range (ranges equal to 1e-9 of the largest merged),
/// largest range first: the histogram shown in a report and a test.
pub fn histogram(cycles: &[(f64, f64)]) -> Vec<(f64, f64)> {
    let mut sorted: Vec<(f64, f64)> = cycles.to_vec();
    sorted.sort_by(|a, b| b.0.total_cmp(&a.0));
    let tol = 1e-9 * sorted.first().map_or(0.0, |c| c.0.abs());
    let mut out: Vec<(f64, f64)> = Vec::new();
    for (r, c) in sorted {
        match out.last_mut() {
            Some(last) if (last.0 - r).abs() <= tol => last.1 += c,
            _ => out.push((r, c)),
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The example history of ASTM E1049 (Fig. 2 / Fig. 6 there, from memory).
    const ASTM: [f64; 9] = [-2.0, 1.0, -3.0, 5.0, -1.0, 3.0, -4.0, 4.0, -2.0];

    #[test]
    fn astm_e1049_example() {
        // ASTM E1049 §5.4.4, its worked example (from memory): ranges
        // 3 (½), 4 (1½), 6 (½), 8 (1), 9 (½).
        let h = histogram(&count(&ASTM));
        assert_eq!(
            h,
            vec![(9.0, 0.5), (8.0, 1.0), (6.0, 0.5), (4.0, 1.5), (3.0, 0.5)]
        );
        let (n, eff) = effective(&count(&ASTM));
        assert_eq!(n, 4.0);
        // By hand: Σn·Δf³ = 0.5·729 + 512 + 0.5·216 + 1.5·64 + 0.5·27 = 1094;
        // (1094 / 4)^(1/3) = 6.4914.
        assert!((eff - (1094.0f64 / 4.0).cbrt()).abs() < 1e-12, "{eff}");
    }

    #[test]
    fn repeating_history_by_hand() {
        // Rotated to start and close at the maximum 5:
        // 5, −1, 3, −4, 4, −2, 1, −3, 5 (the −2, −2 at the join merged).
        // By hand (the simplified count): (−1, 3) = 4 when −4 arrives;
        // (−2, 1) = 3 when −3 arrives; (4, −3) = 7 and (5, −4) = 9 when
        // the closing 5 arrives; one whole cycle each, nothing left.
        let h = histogram(&count_repeating(&ASTM));
        assert_eq!(h, vec![(9.0, 1.0), (7.0, 1.0), (4.0, 1.0), (3.0, 1.0)]);
    }

    #[test]
    fn reversals_drop_runs_and_repeats() {
        assert_eq!(
            reversals(&[0.0, 1.0, 2.0, 2.0, 1.0, 1.0, 3.0]),
            vec![0.0, 2.0, 1.0, 3.0]
        );
        assert!(reversals(&[]).is_empty());
    }

    #[test]
    fn one_passage_of_a_single_load() {
        // 0 → 10 → 0: a single history is two half cycles of 10 (§5.4.4,
        // step 6); repeated passages make it one whole cycle of 10.
        assert_eq!(count(&[0.0, 10.0, 0.0]), vec![(10.0, 0.5), (10.0, 0.5)]);
        assert_eq!(count_repeating(&[0.0, 10.0, 0.0]), vec![(10.0, 1.0)]);
        assert_eq!(effective(&count_repeating(&[0.0, 10.0, 0.0])), (1.0, 10.0));
        assert_eq!(effective(&[]), (0.0, 0.0));
        assert!(count_repeating(&[]).is_empty());
    }
}
