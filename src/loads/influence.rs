//! Influence lines from the one factorization: a unit downward load at
//! each deck node in turn, all deck nodes solved as one block of
//! right-hand sides on the factor already made for the load cases. The
//! ordinate at a deck node is the member force (tension +) or support
//! reaction per unit downward load there (dimensionless); between deck
//! nodes the line is linear, because the stringers deliver load to the
//! panel points by the lever rule (Müller-Breslau's principle gives the
//! same lines as the deflected shape of the released structure).

use super::moving::Deck;
use super::LoadError;
use crate::analysis::results::Prepared;
use crate::model::{LoadCase, Model, NodalLoad};

/// Right-hand sides solved together; bounds the block to n × 64 numbers.
const BLOCK: usize = 64;

/// Influence ordinates at every deck node.
#[derive(Clone, Debug, PartialEq)]
pub struct InfluenceLines {
    pub deck: Deck,
    /// `members[m * nd + k]`: force in member m (N per N, tension +) under a
    /// unit downward load at deck node k; nd = deck length in nodes.
    pub members: Vec<f64>,
    /// `reactions[s * nd + k]`: reaction [rx, ry] of support s (global, up
    /// positive) under a unit downward load at deck node k.
    pub reactions: Vec<[f64; 2]>,
}

impl InfluenceLines {
    /// Number of deck nodes.
    pub fn nd(&self) -> usize {
        self.deck.nodes.len()
    }

    /// Ordinates of member `m` at the deck nodes.
    pub fn member(&self, m: usize) -> &[f64] {
        let nd = self.nd();
        &self.members[m * nd..(m + 1) * nd]
    }

    /// Vertical-reaction ordinates of support `s` at the deck nodes.
    pub fn reaction_y(&self, s: usize) -> Vec<f64> {
        let nd = self.nd();
        self.reactions[s * nd..(s + 1) * nd]
            .iter()
            .map(|r| r[1])
            .collect()
    }

    /// Horizontal-reaction ordinates of support `s` at the deck nodes.
    pub fn reaction_x(&self, s: usize) -> Vec<f64> {
        let nd = self.nd();
        self.reactions[s * nd..(s + 1) * nd]
            .iter()
            .map(|r| r[0])
            .collect()
    }

    /// Force in member `m` per unit downward load at chainage `s` (linear
    /// between deck nodes, zero off the deck).
    pub fn member_at(&self, m: usize, s: f64) -> f64 {
        self.deck.interpolate(self.member(m), s)
    }
}

/// Influence lines of every member force and support reaction for a unit
/// downward load moving along `deck`, from the factorization in `prepared`.
pub fn influence_lines(
    model: &Model,
    prepared: &Prepared,
    deck: &Deck,
) -> Result<InfluenceLines, LoadError> {
    let nd = deck.nodes.len();
    let (nm, ns) = (model.members.len(), model.supports.len());
    let n = prepared.n();
    crate::analysis::results::check_memory(
        8.0 * nd as f64 * (nm + 2 * ns) as f64,
        || format!("influence lines of {nm} members at {nd} deck nodes"),
        "choose fewer members (--member) or a shorter deck (--deck)",
    )?;
    let mut members = vec![0.0; nm * nd];
    let mut reactions = vec![[0.0; 2]; ns * nd];
    let unit = |k: usize| LoadCase {
        id: format!(
            "unit load at deck node \"{}\"",
            model.nodes[deck.nodes[k]].id
        ),
        nodal: vec![NodalLoad {
            node: deck.nodes[k],
            fx: 0.0,
            fy: -1.0,
        }],
        ..Default::default()
    };
    let mut rhs = Vec::new();
    for start in (0..nd).step_by(BLOCK) {
        let cols = BLOCK.min(nd - start);
        rhs.clear();
        rhs.resize(n * cols, 0.0);
        let cases: Vec<LoadCase> = (start..start + cols).map(unit).collect();
        for (c, case) in cases.iter().enumerate() {
            prepared.load_vector(model, case, &mut rhs[c * n..(c + 1) * n]);
        }
        if n > 0 {
            prepared.factor.solve_in_place(&mut rhs, cols);
        }
        for (c, case) in cases.iter().enumerate() {
            let k = start + c;
            let r = prepared.recover(model, case, &rhs[c * n..(c + 1) * n])?;
            for (m, f) in r.forces.iter().enumerate() {
                members[m * nd + k] = *f;
            }
            for (s, re) in r.reactions.iter().enumerate() {
                reactions[s * nd + k] = *re;
            }
        }
    }
    // Round-off (a zero-force member's 1e-17) shown as the zero it is:
    // ordinates below 1e-12 of the largest ordinate are cleared.
    let largest = members
        .iter()
        .chain(reactions.iter().flatten())
        .fold(0.0f64, |a, v| a.max(v.abs()));
    let floor = 1e-12 * largest;
    members
        .iter_mut()
        .chain(reactions.iter_mut().flatten())
        .filter(|v| v.abs() < floor)
        .for_each(|v| *v = 0.0);
    Ok(InfluenceLines {
        deck: deck.clone(),
        members,
        reactions,
    })
}
