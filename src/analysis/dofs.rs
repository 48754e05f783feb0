//! Numbering of the free degrees of freedom.
//!
//! Each node moves in the plane. A support removes directions: a pin both,
//! a roller the vertical, an inclined roller the normal to its surface. A
//! free DOF is a unit direction at a node, so an inclined roller needs no
//! special treatment anywhere else: the displacement of a node is the sum
//! of its free directions times their amplitudes, plus any settlement.

use crate::model::Model;

#[derive(Clone, Debug)]
pub struct Dofs {
    /// First free DOF of each node; its DOFs are `first[i]..first[i+1]`.
    pub first: Vec<u32>,
    /// Global unit direction of each free DOF.
    pub direction: Vec<[f64; 2]>,
    /// Node of each free DOF.
    pub node: Vec<u32>,
    /// Restraint of each node, if supported (index into `model.supports`).
    pub support_of: Vec<Option<u32>>,
}

impl Dofs {
    pub fn new(model: &Model) -> Dofs {
        let n = model.nodes.len();
        let mut support_of = vec![None; n];
        for (k, s) in model.supports.iter().enumerate() {
            support_of[s.node] = Some(k as u32);
        }
        // Nodes no member meets carry no stiffness: they get no DOFs (the
        // validator has warned about them and refused loads on them).
        let mut connected = vec![false; n];
        for m in &model.members {
            connected[m.start] = true;
            connected[m.end] = true;
        }
        let mut first = Vec::with_capacity(n + 1);
        let mut direction = Vec::with_capacity(2 * n);
        let mut node = Vec::with_capacity(2 * n);
        for i in 0..n {
            first.push(direction.len() as u32);
            if !connected[i] {
                continue;
            }
            let (dirs, count) = match support_of[i] {
                Some(k) => match model.supports[k as usize].restraint.free_direction() {
                    Some(d) => ([d, [0.0; 2]], 1),
                    None => ([[0.0; 2]; 2], 0),
                },
                None => ([[1.0, 0.0], [0.0, 1.0]], 2),
            };
            for &d in &dirs[..count] {
                direction.push(d);
                node.push(i as u32);
            }
        }
        first.push(direction.len() as u32);
        Dofs {
            first,
            direction,
            node,
            support_of,
        }
    }

    pub fn len(&self) -> usize {
        self.direction.len()
    }

    pub fn is_empty(&self) -> bool {
        self.direction.is_empty()
    }

    /// The free DOFs of node `i`.
    pub fn of_node(&self, i: usize) -> std::ops::Range<usize> {
        self.first[i] as usize..self.first[i + 1] as usize
    }

    /// Name of the direction of DOF `d`, for messages: "x", "y" or an angle.
    pub fn direction_name(&self, d: usize) -> String {
        let [cx, cy] = self.direction[d];
        if (cx - 1.0).abs() < 1e-12 {
            "x".into()
        } else if (cy - 1.0).abs() < 1e-12 {
            "y".into()
        } else {
            format!("{:.1}° from x", cy.atan2(cx).to_degrees())
        }
    }
}
