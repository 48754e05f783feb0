//! Statics of one pin: the bars on it are point loads at their mid-thickness
//! (common practice for layered bars on a pin), each a force vector in the
//! truss plane. The pin is a free body: its shear and bending moment in the
//! two planes through its axis (global x and y directions) are summed along
//! it from one end, and their magnitudes are the vector sums
//! |V| = √(Vx² + Vy²), |M| = √(Mx² + My²).
//!
//! V(z) = Σ_{zi < z} Fi,   M(z) = Σ_{zi < z} Fi·(z − zi)
//!
//! Between loads |M| is the length of a vector linear in z, a convex function,
//! so its maximum is at a load point; the shear is constant between loads.
//! The pin's own equilibrium, ΣFi = 0 and Σ zi·Fi = 0, is checked: a stack
//! whose forces do not balance is an error naming the node.
//! Consistent units in, the same units out (the library passes SI).

/// A bar's force on the pin, at its mid-thickness `z` along the pin.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PointLoad {
    /// Position along the pin axis.
    pub z: f64,
    /// Force on the pin in the truss plane (x, y).
    pub force: [f64; 2],
}

/// Shear and moment along a pin.
#[derive(Clone, Debug, PartialEq)]
pub struct Diagram {
    /// Load positions in order along the pin (loads at one position summed).
    pub z: Vec<f64>,
    /// Moment vector (Mx-plane, My-plane components) at each position.
    pub moment: Vec<[f64; 2]>,
    /// Shear vector in each span between consecutive positions (len − 1).
    pub shear: Vec<[f64; 2]>,
    /// Largest |M| and where.
    pub max_moment: f64,
    pub max_moment_at: f64,
    /// Largest |V| and the span where it acts.
    pub max_shear: f64,
    pub max_shear_span: (f64, f64),
    /// Out-of-balance force and moment (magnitudes) of the loads as given.
    pub residual_force: f64,
    pub residual_moment: f64,
}

/// Why a pin's statics could not be accepted.
#[derive(Clone, Debug, PartialEq, thiserror::Error)]
pub enum PinError {
    #[error("the pin at node \"{node}\" is not in equilibrium: its bar forces leave {force:.4e} N and {moment:.4e} N·m unbalanced; every force on the pin (bars, hangers, the support) must be in its stack")]
    Unbalanced {
        node: String,
        force: f64,
        moment: f64,
    },
    #[error("the pin at node \"{node}\" has no bars")]
    Empty { node: String },
}

/// Relative out-of-balance accepted: of Σ|F| for the force, of Σ|F| times
/// the stack length for the moment (positions validated symmetric to 1e-4).
pub const BALANCE_TOLERANCE: f64 = 1e-3;

fn hyp(v: [f64; 2]) -> f64 {
    v[0].hypot(v[1])
}

/// The shear and moment diagram of the loads, without the equilibrium
/// check (for a validated pin). Empty input gives an empty diagram.
pub fn diagram_unchecked(loads: &[PointLoad]) -> Diagram {
    let mut sorted: Vec<PointLoad> = loads.to_vec();
    sorted.sort_by(|a, b| a.z.total_cmp(&b.z));
    let mut z: Vec<f64> = Vec::with_capacity(sorted.len());
    let mut f: Vec<[f64; 2]> = Vec::with_capacity(sorted.len());
    for l in sorted {
        match z.last() {
            Some(&last) if last == l.z => {
                let k = f.len() - 1;
                f[k][0] += l.force[0];
                f[k][1] += l.force[1];
            }
            _ => {
                z.push(l.z);
                f.push(l.force);
            }
        }
    }
    let mut moment = Vec::with_capacity(z.len());
    let mut shear = Vec::with_capacity(z.len().saturating_sub(1));
    let (mut v, mut m) = ([0.0; 2], [0.0; 2]);
    let (mut max_m, mut max_m_at, mut max_v, mut max_v_span) = (0.0, 0.0, 0.0, (0.0, 0.0));
    for i in 0..z.len() {
        if i > 0 {
            let dz = z[i] - z[i - 1];
            m = [m[0] + v[0] * dz, m[1] + v[1] * dz];
        }
        moment.push(m);
        if hyp(m) > max_m {
            max_m = hyp(m);
            max_m_at = z[i];
        }
        v = [v[0] + f[i][0], v[1] + f[i][1]];
        if i + 1 < z.len() {
            shear.push(v);
            if hyp(v) > max_v {
                max_v = hyp(v);
                max_v_span = (z[i], z[i + 1]);
            }
        }
    }
    // After the last load: V is the resultant, and M there (about the last
    // position) is −Σ zi·Fi + z_last·ΣFi: the moment residual.
    let residual_force = hyp(v);
    let residual_moment = hyp(m);
    Diagram {
        z,
        moment,
        shear,
        max_moment: max_m,
        max_moment_at: max_m_at,
        max_shear: max_v,
        max_shear_span: max_v_span,
        residual_force,
        residual_moment,
    }
}

/// The diagram of a pin's loads, checking the pin's equilibrium.
pub fn diagram(node: &str, loads: &[PointLoad]) -> Result<Diagram, PinError> {
    if loads.is_empty() {
        return Err(PinError::Empty { node: node.into() });
    }
    let d = diagram_unchecked(loads);
    let total: f64 = loads.iter().map(|l| hyp(l.force)).sum();
    let span = d.z.last().unwrap_or(&0.0) - d.z.first().unwrap_or(&0.0);
    let force_ok = d.residual_force <= BALANCE_TOLERANCE * total;
    let moment_ok = d.residual_moment <= BALANCE_TOLERANCE * total * span.max(f64::MIN_POSITIVE);
    if force_ok && (moment_ok || d.residual_moment == 0.0) {
        Ok(d)
    } else {
        Err(PinError::Unbalanced {
            node: node.into(),
            force: d.residual_force,
            moment: d.residual_moment,
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn load(z: f64, fx: f64, fy: f64) -> PointLoad {
        PointLoad { z, force: [fx, fy] }
    }

    /// Seven layered bars (kip, in), symmetric about z = 3.0 in:
    /// chord bars (−50, 0) at 0.5 and 5.5, diagonal bars (30, 40) at 1.5 and
    /// 4.5, chord bars (20, 0) at 2.5 and 3.5, hanger (0, −80) at 3.0.
    /// ΣFx = −100 + 60 + 40 = 0, ΣFy = 80 − 80 = 0.
    fn seven_bars() -> Vec<PointLoad> {
        vec![
            load(0.5, -50.0, 0.0),
            load(1.5, 30.0, 40.0),
            load(2.5, 20.0, 0.0),
            load(3.0, 0.0, -80.0),
            load(3.5, 20.0, 0.0),
            load(4.5, 30.0, 40.0),
            load(5.5, -50.0, 0.0),
        ]
    }

    #[test]
    fn layered_bars_by_hand_statics() {
        // Hand statics, summing from z = 0.5 (each step M += V·Δz):
        //   z = 1.5: V(0.5..1.5) = (−50, 0),  M = (−50, 0)
        //   z = 2.5: V(1.5..2.5) = (−20, 40), M = (−50, 0) + (−20, 40)·1 = (−70, 40)
        //   z = 3.0: V(2.5..3.0) = (0, 40),   M = (−70, 40) + (0, 40)·0.5 = (−70, 60)
        //   |M|max = √(70² + 60²) = √8500 = 92.1954 kip·in at z = 3.0;
        //   |V|max = 50 kip in the outer spans (0.5..1.5 and 4.5..5.5);
        //   the vector sum exceeds either plane alone (70 and 60).
        let d = diagram("L3", &seven_bars()).unwrap();
        assert_eq!(d.moment[1], [-50.0, 0.0]);
        assert_eq!(d.moment[2], [-70.0, 40.0]);
        assert_eq!(d.moment[3], [-70.0, 60.0]);
        assert!((d.max_moment - 8500f64.sqrt()).abs() < 1e-9);
        assert_eq!(d.max_moment_at, 3.0);
        assert!((d.max_shear - 50.0).abs() < 1e-12);
        assert_eq!(d.max_shear_span, (0.5, 1.5));
        // Closed: the moment returns to zero at the far bar.
        assert!(d.residual_force < 1e-12 && d.residual_moment < 1e-12);
        // Symmetric stack, symmetric diagram.
        assert_eq!(d.moment[4], [-70.0, 40.0]);
    }

    #[test]
    fn stack_order_changes_the_moment() {
        // Swap the outer chord bars with the diagonal bars: chord (−50, 0)
        // at 1.5/4.5, diagonal (30, 40) at 0.5/5.5. By hand:
        //   z = 1.5: M = (30, 40)·1 = (30, 40)
        //   z = 2.5: V = (−20, 40), M = (10, 80)
        //   z = 3.0: V = (0, 40),   M = (10, 100): |M| = √10100 = 100.499 kip·in
        // against 92.195 with the chord outside: order matters.
        let mut l = seven_bars();
        l[0].force = [30.0, 40.0];
        l[6].force = [30.0, 40.0];
        l[1].force = [-50.0, 0.0];
        l[5].force = [-50.0, 0.0];
        let d = diagram("L3", &l).unwrap();
        assert!((d.max_moment - 10100f64.sqrt()).abs() < 1e-9);
    }

    #[test]
    fn unbalanced_stack_names_the_node() {
        // Without the hanger the bars leave (0, 80) kip unbalanced.
        let mut l = seven_bars();
        l.remove(3);
        let e = diagram("L3", &l).unwrap_err();
        assert!(matches!(e, PinError::Unbalanced { ref node, force, .. }
            if node == "L3" && (force - 80.0).abs() < 1e-9));
        assert!(e.to_string().contains("node \"L3\""));
        // Balanced in force but not in moment: a couple of 10 kip, 1 in apart.
        let couple = [load(0.0, 10.0, 0.0), load(1.0, -10.0, 0.0)];
        let e = diagram("U2", &couple).unwrap_err();
        assert!(matches!(e, PinError::Unbalanced { moment, .. } if (moment - 10.0).abs() < 1e-12));
        assert!(diagram("U2", &[]).is_err());
    }

    #[test]
    fn coincident_loads_are_summed() {
        // Two loads at one position act as their sum: a simply supported
        // pin of span 4 with 10 at midspan as 4 + 6: M = P·L/4 = 10 (closed form).
        let l = [
            load(0.0, 0.0, -5.0),
            load(2.0, 0.0, 4.0),
            load(2.0, 0.0, 6.0),
            load(4.0, 0.0, -5.0),
        ];
        let d = diagram("X", &l).unwrap();
        assert_eq!(d.z, vec![0.0, 2.0, 4.0]);
        assert!((d.max_moment - 10.0).abs() < 1e-12);
    }
}
