//! The live-load history of a member as one vehicle crosses the deck.
//!
//! The force under an axle train is piecewise linear in the front-axle
//! position with breaks only where an axle passes a deck node (the
//! influence line is linear between deck nodes, see `loads::influence`),
//! so the history at the entry, the exit and every such position holds
//! every peak and valley exactly: those are the positions visited
//! ([`moving::positions`] with one step over the whole travel). The bridge
//! is empty (force zero) at the entry and exit.

use crate::loads::moving::{positions, Deck, Direction};
use crate::loads::{LoadError, Vehicle};

/// The deck-node weights of one vehicle position: (deck index, load N).
pub type Weights = Vec<(usize, f64)>;

/// One crossing: the weights at every visited position in travel order.
#[derive(Clone, Debug, PartialEq)]
pub struct Passage {
    pub direction: Direction,
    /// Front-axle chainages in travel order, m.
    pub positions: Vec<f64>,
    pub weights: Vec<Weights>,
}

/// The crossings of `vehicle` over `deck` forward and in reverse.
pub fn passages(deck: &Deck, vehicle: &Vehicle) -> Result<[Passage; 2], LoadError> {
    let travel = deck.length() + vehicle.length();
    let one = |direction: Direction| -> Result<Passage, LoadError> {
        let mut p = positions(deck, &vehicle.axles, &[], travel, direction, &vehicle.id)?;
        if direction == Direction::Reverse {
            p.reverse();
        }
        let weights = p
            .iter()
            .map(|&front| {
                let mut w = Vec::with_capacity(2 * vehicle.axles.len());
                for a in &vehicle.axles {
                    if let Some((k, wa, wb)) = deck.split(direction.axle_at(front, a.offset)) {
                        w.push((k, a.load * wa));
                        w.push((k + 1, a.load * wb));
                    }
                }
                w
            })
            .collect();
        Ok(Passage {
            direction,
            positions: p,
            weights,
        })
    };
    Ok([one(Direction::Forward)?, one(Direction::Reverse)?])
}

/// The force history (N, tension +, without dynamic allowance) of an
/// effect with influence ordinates `ordinates` at the deck nodes.
pub fn force_history(passage: &Passage, ordinates: &[f64]) -> Vec<f64> {
    passage
        .weights
        .iter()
        .map(|w| w.iter().map(|&(k, p)| p * ordinates[k]).sum())
        .collect()
}
