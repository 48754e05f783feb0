//! The placement rules of a published load model turned into the concrete
//! axle trains the scan rolls across the deck: the vehicle's own train and
//! each alternative ("either of": the design truck or the design tandem),
//! each with its variable spacing at every value that can give an extreme.
//!
//! Why a finite set of spacings is exact: with the influence line linear
//! between deck nodes, the effect of a train is piecewise linear in (front
//! position p, spacing g) on cells bounded by the lines "axle k on deck node
//! i" (p = cᵢ + aₖ for an axle ahead of the gap, p − g = cⱼ + bₗ behind it)
//! and by g = min, g = max. A linear function on a polygon takes its extreme
//! at a vertex, and every vertex has g = min, g = max or g = cᵢ − cⱼ + aₖ − bₗ
//! (an axle ahead and an axle behind the gap both on deck nodes). The scan
//! over p then finds the extreme exactly for each of these g.

use super::moving::Deck;
use super::{Axle, Train, VariableGap, Vehicle};

/// Most spacings tried for one variable gap; beyond, an even grid of this
/// many (the extreme then found to within the grid's pitch).
pub const MAX_GAPS: usize = 256;

/// One concrete axle train to roll.
#[derive(Clone, Debug, PartialEq)]
pub struct Concrete {
    /// 0 for the vehicle's own train, 1… for its alternatives in order.
    pub train: usize,
    pub label: String,
    /// The variable spacing used, m, when the train has one.
    pub gap: Option<f64>,
    pub axles: Vec<Axle>,
}

/// Every concrete train of `vehicle` on `deck`.
pub fn concrete_trains(vehicle: &Vehicle, deck: &Deck) -> Vec<Concrete> {
    let own = Train {
        label: vehicle.id.clone(),
        axles: vehicle.axles.clone(),
        variable_gap: vehicle.rules.variable_gap.clone(),
    };
    let mut out = Vec::new();
    for (t, train) in std::iter::once(&own)
        .chain(&vehicle.rules.alternatives)
        .enumerate()
    {
        if train.axles.is_empty() {
            continue;
        }
        match &train.variable_gap {
            None => out.push(Concrete {
                train: t,
                label: train.label.clone(),
                gap: None,
                axles: train.axles.clone(),
            }),
            Some(v) => {
                for g in gap_candidates(deck, &train.axles, v) {
                    out.push(Concrete {
                        train: t,
                        label: train.label.clone(),
                        gap: Some(g),
                        axles: with_gap(&train.axles, v, g),
                    });
                }
            }
        }
    }
    out
}

/// `axles` (written with the gap at its least) with the gap at `g`.
pub fn with_gap(axles: &[Axle], v: &VariableGap, g: f64) -> Vec<Axle> {
    axles
        .iter()
        .enumerate()
        .map(|(i, a)| Axle {
            load: a.load,
            offset: if i >= v.axle {
                a.offset + g - v.min
            } else {
                a.offset
            },
        })
        .collect()
}

/// The spacings at which the extreme can occur (module doc): the bounds
/// and every cᵢ − cⱼ + aₖ − bₗ strictly between them, aₖ the offsets ahead
/// of the gap measured back to the last axle before it, bₗ those behind
/// measured from the first axle after it.
pub fn gap_candidates(deck: &Deck, axles: &[Axle], v: &VariableGap) -> Vec<f64> {
    let mut out = vec![v.min, v.max];
    if v.axle == 0 || v.axle >= axles.len() || v.max <= v.min {
        out.truncate(1);
        return out;
    }
    let last_ahead = axles[v.axle - 1].offset;
    let first_behind = axles[v.axle].offset;
    let ahead: Vec<f64> = axles[..v.axle]
        .iter()
        .map(|a| a.offset - last_ahead)
        .collect();
    let behind: Vec<f64> = axles[v.axle..]
        .iter()
        .map(|a| a.offset - first_behind)
        .collect();
    let c = &deck.chainage;
    'all: for &ci in c {
        for &cj in c {
            let d = ci - cj;
            for &a in &ahead {
                for &b in &behind {
                    let g = d + a - b;
                    if g > v.min && g < v.max {
                        out.push(g);
                        if out.len() > 64 * MAX_GAPS {
                            break 'all;
                        }
                    }
                }
            }
        }
    }
    out.sort_by(f64::total_cmp);
    let tol = 1e-9 * (v.max - v.min).max(1.0);
    out.dedup_by(|a, b| (*a - *b).abs() <= tol);
    if out.len() > MAX_GAPS {
        let n = MAX_GAPS - 1;
        out = (0..=n)
            .map(|k| v.min + (v.max - v.min) * k as f64 / n as f64)
            .collect();
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::Node;

    #[test]
    fn candidates_on_a_uniform_deck() {
        // Deck of panels 5 m; gap 4..9 m behind axle 1 of a two-axle train
        // with the front axle 4 m ahead: a = {−4, 0}, b = {0}; differences
        // multiples of 5: g ∈ {5} ∪ {−4 + 10 = 6} plus the bounds, by hand.
        let nodes: Vec<Node> = (0..5)
            .map(|i| Node {
                id: format!("N{i}"),
                x: 5.0 * i as f64,
                y: 0.0,
            })
            .collect();
        let deck = Deck::from_nodes(&nodes, &[0, 1, 2, 3, 4]).unwrap();
        let axles = vec![
            Axle {
                load: 1.0,
                offset: 0.0,
            },
            Axle {
                load: 1.0,
                offset: 4.0,
            },
            Axle {
                load: 1.0,
                offset: 8.0,
            },
        ];
        let v = VariableGap {
            axle: 2,
            min: 4.0,
            max: 9.0,
        };
        assert_eq!(gap_candidates(&deck, &axles, &v), vec![4.0, 5.0, 6.0, 9.0]);
        let moved = with_gap(&axles, &v, 6.0);
        assert_eq!(moved[2].offset, 10.0);
        assert_eq!(moved[1].offset, 4.0);
    }
}
