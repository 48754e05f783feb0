//! The deck line and the rolling of a vehicle along it.
//!
//! The deck is the ordered chain of panel points where floor beams deliver
//! load. Positions along it are chainages: distance along the straight
//! segments from the first deck node. Between two deck nodes the load is
//! carried by simple-span stringers, so an axle at chainage s between nodes
//! i and i+1 gives P·(1 − t) to node i and P·t to node i+1, t = (s − cᵢ)/(cᵢ₊₁ − cᵢ)
//! (the lever rule: the reactions of a simply supported beam). An axle off
//! the deck carries nothing to the truss.

use super::{Axle, LoadError};
use crate::model::{Model, Node};

/// Which way a vehicle travels along the deck.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Direction {
    /// From the first deck node towards the last; the axles trail behind
    /// the front axle at smaller chainage.
    Forward,
    /// From the last deck node towards the first; the axles trail behind at
    /// larger chainage.
    Reverse,
}

impl Direction {
    pub fn name(self) -> &'static str {
        match self {
            Direction::Forward => "forward",
            Direction::Reverse => "reverse",
        }
    }

    /// Chainage of an axle `offset` behind a front axle at `front`.
    pub fn axle_at(self, front: f64, offset: f64) -> f64 {
        match self {
            Direction::Forward => front - offset,
            Direction::Reverse => front + offset,
        }
    }
}

/// Where a vehicle stood: front-axle chainage (m, from the first deck node)
/// and direction of travel.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Placement {
    pub position: f64,
    pub direction: Direction,
}

/// A validated deck line with chainages.
#[derive(Clone, Debug, PartialEq)]
pub struct Deck {
    /// Deck nodes in order (indices into the model's nodes).
    pub nodes: Vec<usize>,
    /// Chainage of each deck node, m; `chainage[0] = 0`, strictly increasing.
    pub chainage: Vec<f64>,
}

impl Deck {
    /// Chainages of `deck` over `nodes`, checking there are at least two
    /// deck nodes, none repeated and no two consecutive at the same place.
    pub fn from_nodes(nodes: &[Node], deck: &[usize]) -> Result<Deck, LoadError> {
        if deck.len() < 2 {
            return Err(LoadError::ShortDeck);
        }
        let mut seen = vec![false; nodes.len()];
        for &d in deck {
            if std::mem::replace(&mut seen[d], true) {
                return Err(LoadError::RepeatedDeckNode(nodes[d].id.clone()));
            }
        }
        let tol = crate::geometry::tolerance(nodes);
        let mut chainage = Vec::with_capacity(deck.len());
        let mut c = 0.0;
        chainage.push(c);
        for w in deck.windows(2) {
            let (a, b) = (&nodes[w[0]], &nodes[w[1]]);
            let h = (b.x - a.x).hypot(b.y - a.y);
            if h <= tol {
                return Err(LoadError::ZeroDeckSegment(a.id.clone(), b.id.clone()));
            }
            c += h;
            chainage.push(c);
        }
        Ok(Deck {
            nodes: deck.to_vec(),
            chainage,
        })
    }

    /// The model's own deck line, or `NoDeck`.
    pub fn of_model(model: &Model) -> Result<Deck, LoadError> {
        if model.live.deck.is_empty() {
            return Err(LoadError::NoDeck);
        }
        Deck::from_nodes(&model.nodes, &model.live.deck)
    }

    /// A deck line named by node ids (e.g. from the command line), checked
    /// against the model: every node defined and carrying load somewhere.
    pub fn from_ids(model: &Model, ids: &[String]) -> Result<Deck, LoadError> {
        let mut deck = Vec::with_capacity(ids.len());
        for id in ids {
            let i = model
                .nodes
                .iter()
                .position(|n| &n.id == id)
                .ok_or_else(|| LoadError::UnknownDeckNode(id.clone()))?;
            let connected = model.members.iter().any(|m| m.start == i || m.end == i)
                || model.supports.iter().any(|s| s.node == i);
            if !connected {
                return Err(LoadError::LooseDeckNode(id.clone()));
            }
            deck.push(i);
        }
        Deck::from_nodes(&model.nodes, &deck)
    }

    /// Total deck length, m.
    pub fn length(&self) -> f64 {
        *self.chainage.last().unwrap_or(&0.0)
    }

    /// The lever-rule split of a unit load at chainage `s`: (deck index k,
    /// weight on deck node k, weight on deck node k + 1), or None off the deck.
    pub fn split(&self, s: f64) -> Option<(usize, f64, f64)> {
        let c = &self.chainage;
        let last = c.len() - 1;
        if !(s >= 0.0 && s <= c[last]) {
            return None;
        }
        // The segment holding s: the last k with c[k] <= s, at most last − 1.
        let k = c
            .partition_point(|&x| x <= s)
            .saturating_sub(1)
            .min(last - 1);
        let t = ((s - c[k]) / (c[k + 1] - c[k])).clamp(0.0, 1.0);
        Some((k, 1.0 - t, t))
    }

    /// Lengths of deck over which the piecewise-linear f through `values`
    /// is positive and negative, m: the loaded lengths of an influence line
    /// (a segment that changes sign is split at its zero).
    pub fn signed_lengths(&self, values: &[f64]) -> (f64, f64) {
        let (mut pos, mut neg) = (0.0, 0.0);
        for k in 0..values.len() - 1 {
            let h = self.chainage[k + 1] - self.chainage[k];
            let (a, b) = (values[k], values[k + 1]);
            if a >= 0.0 && b >= 0.0 {
                if a > 0.0 || b > 0.0 {
                    pos += h;
                }
            } else if a <= 0.0 && b <= 0.0 {
                neg += h;
            } else {
                let t = a.abs() / (a.abs() + b.abs());
                let (first, second) = (h * t, h * (1.0 - t));
                if a > 0.0 {
                    pos += first;
                    neg += second;
                } else {
                    neg += first;
                    pos += second;
                }
            }
        }
        (pos, neg)
    }

    /// Linear interpolation of per-deck-node `values` at chainage `s`
    /// (zero off the deck).
    pub fn interpolate(&self, values: &[f64], s: f64) -> f64 {
        match self.split(s) {
            Some((k, a, b)) => a * values[k] + b * values[k + 1],
            None => 0.0,
        }
    }

    /// ∫ max(f, 0) ds and ∫ min(f, 0) ds over the deck for the piecewise
    /// linear f through `values` (trapezoids; a segment that changes sign is
    /// split at its zero, where each part is a triangle).
    pub fn signed_areas(&self, values: &[f64]) -> (f64, f64) {
        let (mut pos, mut neg) = (0.0, 0.0);
        for k in 0..values.len() - 1 {
            let h = self.chainage[k + 1] - self.chainage[k];
            let (a, b) = (values[k], values[k + 1]);
            if a >= 0.0 && b >= 0.0 {
                pos += 0.5 * h * (a + b);
            } else if a <= 0.0 && b <= 0.0 {
                neg += 0.5 * h * (a + b);
            } else {
                // Zero at t = |a|/(|a|+|b|): triangles of height a and b.
                let span = a.abs() + b.abs();
                let (p, n) = if a > 0.0 { (a, b) } else { (b, a) };
                pos += 0.5 * h * p * p / span;
                neg -= 0.5 * h * n * n / span;
            }
        }
        (pos, neg)
    }
}

/// Most positions of one vehicle in one direction the scan will visit.
pub const MAX_POSITIONS: f64 = 2e6;

/// Most positions × axles of one vehicle in one direction (each placement
/// adds one influence-line row per axle): 2e7, a few seconds of work. A
/// 20,000-axle vehicle otherwise runs for minutes (issue 22, item 10).
pub const MAX_AXLE_PLACEMENTS: f64 = 2e7;

/// Front-axle chainages visited for the axle train `axles` travelling in
/// `direction`: every `step` from the front axle at the entry end until the
/// rear axle has left, plus every position that puts an axle, or a point
/// `extra` behind the front axle (the head of a trailing uniform load),
/// exactly on a deck node. For a piecewise-linear influence line the force
/// under concentrated loads is piecewise linear in the position with breaks
/// only where an axle crosses a deck node, so the extreme is found exactly
/// at any step.
pub fn positions(
    deck: &Deck,
    axles: &[Axle],
    extra: &[f64],
    step: f64,
    direction: Direction,
    id: &str,
) -> Result<Vec<f64>, LoadError> {
    let length = axles
        .iter()
        .map(|a| a.offset)
        .chain(extra.iter().copied())
        .fold(0.0, f64::max);
    let travel = deck.length() + length;
    let count = (travel / step).ceil();
    let n_axles = axles.len() + extra.len();
    let critical = (n_axles * deck.chainage.len()) as f64;
    let positions = count + critical;
    let per_axle = n_axles.max(1) as f64;
    let work = positions * per_axle;
    if positions > MAX_POSITIONS || work > MAX_AXLE_PLACEMENTS {
        // Positions the step may add: what both limits leave after the
        // axle-on-node positions, which no step changes.
        let room = (MAX_POSITIONS - critical).min(MAX_AXLE_PLACEMENTS / per_axle - critical);
        let advice = if room >= 1.0 {
            format!("use a step of at least {:.3e} m", travel / room)
        } else {
            format!(
                "{n_axles} axles over {} deck nodes are too many whatever the step: group close axles into fewer, heavier ones or use a lane load",
                deck.chainage.len()
            )
        };
        return Err(LoadError::TooManyPositions {
            id: id.to_string(),
            positions,
            axles: n_axles,
            work,
            max_positions: MAX_POSITIONS,
            max_work: MAX_AXLE_PLACEMENTS,
            advice,
        });
    }
    let n = count as usize;
    let mut out = Vec::with_capacity(n + 1 + critical as usize);
    let l = deck.length();
    for k in 0..=n {
        let d = (k as f64 * step).min(travel);
        out.push(match direction {
            Direction::Forward => d,
            Direction::Reverse => l - d,
        });
    }
    for offset in axles.iter().map(|a| a.offset).chain(extra.iter().copied()) {
        for &c in &deck.chainage {
            // Axle at c: front = c + offset forward, c − offset reverse.
            out.push(match direction {
                Direction::Forward => c + offset,
                Direction::Reverse => c - offset,
            });
        }
    }
    out.sort_by(f64::total_cmp);
    out.dedup();
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::loads::Axle;

    fn node(id: &str, x: f64) -> Node {
        Node {
            id: id.into(),
            x,
            y: 0.0,
        }
    }

    fn deck() -> Deck {
        let nodes = vec![node("A", 0.0), node("B", 4.0), node("C", 10.0)];
        Deck::from_nodes(&nodes, &[0, 1, 2]).unwrap()
    }

    #[test]
    fn lever_rule_and_interpolation() {
        let d = deck();
        assert_eq!(d.chainage, vec![0.0, 4.0, 10.0]);
        // Lever rule, by hand: at s = 1, 3/4 to A and 1/4 to B.
        assert_eq!(d.split(1.0), Some((0, 0.75, 0.25)));
        assert_eq!(d.split(10.0), Some((1, 0.0, 1.0)));
        assert_eq!(d.split(4.0), Some((1, 1.0, 0.0)));
        assert_eq!(d.split(-0.1), None);
        assert_eq!(d.split(10.1), None);
        assert_eq!(d.split(f64::NAN), None);
        assert!((d.interpolate(&[0.0, 2.0, -1.0], 7.0) - 0.5).abs() < 1e-15);
    }

    #[test]
    fn signed_areas_by_hand() {
        let d = deck();
        // Segment 1: 0 → 2 over 4 m: area 4. Segment 2: 2 → −1 over 6 m,
        // zero at 4 m in: +½·4·2 = 4 and −½·2·1 = −1 (triangles, by hand).
        let (p, n) = d.signed_areas(&[0.0, 2.0, -1.0]);
        assert!((p - 8.0).abs() < 1e-12, "{p}");
        assert!((n + 1.0).abs() < 1e-12, "{n}");
    }

    #[test]
    fn positions_include_panel_points() {
        let d = deck();
        let v = vec![
            Axle {
                load: 1.0,
                offset: 0.0,
            },
            Axle {
                load: 1.0,
                offset: 3.0,
            },
        ];
        let p = positions(&d, &v, &[], 5.0, Direction::Forward, "x").unwrap();
        // Steps 0, 5, 10, 13 (travel 13); axle 2 on nodes: 3, 7, 13.
        assert_eq!(p, vec![0.0, 3.0, 4.0, 5.0, 7.0, 10.0, 13.0]);
        let r = positions(&d, &v, &[], 5.0, Direction::Reverse, "x").unwrap();
        assert_eq!(r, vec![-3.0, 0.0, 1.0, 4.0, 5.0, 7.0, 10.0]);
        assert!(positions(&d, &v, &[], 1e-9, Direction::Forward, "x").is_err());
        let nodes = vec![node("A", 0.0), node("B", 0.0)];
        assert!(matches!(
            Deck::from_nodes(&nodes, &[0, 1]),
            Err(LoadError::ZeroDeckSegment(..))
        ));
        assert!(matches!(
            Deck::from_nodes(&nodes, &[0, 0]),
            Err(LoadError::RepeatedDeckNode(..))
        ));
    }
}
