//! Member self-weight as nodal loads: each member's weight (weight density
//! × gross area × length) times a factor for connection material (gusset
//! plates, rivet heads, lacing: common practice adds a few per cent), half
//! to each end node, acting downward (−y).

use crate::model::{Material, Member, NodalLoad, Node, Section};

/// Weight of one member, N: W = γ·A·L·factor (statics: weight of a prism).
pub fn member_weight(density: f64, area: f64, length: f64, factor: f64) -> f64 {
    density * area * length * factor
}

/// Self-weight nodal loads of every member, one load per node touched,
/// in order of node index. `Err` lists the materials (indices) used by a
/// member that have no density, with the first member using each.
pub fn self_weight_loads(
    nodes: &[Node],
    members: &[Member],
    sections: &[Section],
    materials: &[Material],
    factor: f64,
) -> Result<Vec<NodalLoad>, Vec<(usize, usize)>> {
    let mut fy = vec![0.0; nodes.len()];
    let mut touched = vec![false; nodes.len()];
    let mut missing: Vec<(usize, usize)> = Vec::new();
    for (m, mem) in members.iter().enumerate() {
        let Some(density) = materials[mem.material].density else {
            if !missing.iter().any(|&(mat, _)| mat == mem.material) {
                missing.push((mem.material, m));
            }
            continue;
        };
        let (a, b) = (&nodes[mem.start], &nodes[mem.end]);
        let length = (b.x - a.x).hypot(b.y - a.y);
        let w = member_weight(density, sections[mem.section].area, length, factor);
        // Half to each end: the reactions of a simply supported uniform bar.
        fy[mem.start] -= 0.5 * w;
        fy[mem.end] -= 0.5 * w;
        touched[mem.start] = true;
        touched[mem.end] = true;
    }
    if !missing.is_empty() {
        return Err(missing);
    }
    Ok(fy
        .iter()
        .enumerate()
        .filter(|&(i, _)| touched[i])
        .map(|(node, &fy)| NodalLoad { node, fx: 0.0, fy })
        .collect())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn half_the_weight_to_each_end() {
        let nodes = vec![
            Node {
                id: "A".into(),
                x: 0.0,
                y: 0.0,
            },
            Node {
                id: "B".into(),
                x: 3.0,
                y: 4.0,
            },
        ];
        let members = vec![Member {
            id: "AB".into(),
            start: 0,
            end: 1,
            section: 0,
            material: 0,
            k_in: 1.0,
            k_out: 1.0,
            unbraced_in: None,
            unbraced_out: None,
            tension_only: false,
            bars: 1,
        }];
        let sections = vec![Section {
            id: "s".into(),
            area: 0.01,
            i_in: 1e-6,
            i_out: 1e-6,
            net_area: 0.01,
            built_up: None,
            shear_lag: 1.0,
            shear_lag_given: false,
            holes_punched: None,
            torsion: None,
        }];
        let materials = vec![Material {
            id: "steel".into(),
            e: 200e9,
            fy: None,
            fu: None,
            density: Some(77_000.0),
            alpha: None,
            year: None,
        }];
        let loads = self_weight_loads(&nodes, &members, &sections, &materials, 1.1).unwrap();
        // Statics: W = 77 kN/m³ × 0.01 m² × 5 m × 1.1 = 4235 N, half per end.
        assert_eq!(loads.len(), 2);
        for l in &loads {
            assert!((l.fy + 2117.5).abs() < 1e-9, "{l:?}");
            assert_eq!(l.fx, 0.0);
        }
        let mut no_density = materials.clone();
        no_density[0].density = None;
        let err = self_weight_loads(&nodes, &members, &sections, &no_density, 1.0).unwrap_err();
        assert_eq!(err, vec![(0, 0)]);
    }
}
