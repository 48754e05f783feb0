//! The forces of a pin's bars from the model's member forces.
//!
//! A member in tension pulls the pin toward its other node: its force on the
//! pin is F·u, u the unit vector from the pin's node to the member's other
//! node (F tension positive; compression pushes, F < 0). The member's bars on
//! the pin share F in proportion to their thicknesses (equal bars: F/N each;
//! the bearing area t·D is in that proportion). The load entries share, by
//! thickness too, the force that balances the members on the pin: the node's
//! applied load (a hanger, a floor beam) and its support reaction.

use super::statics::PointLoad;
use super::{Carrier, Pin};
use crate::model::{Member, Node};

/// Per bar: the member whose force it carries (None: a load entry), the
/// direction of that force on the pin, and its share.
#[derive(Clone, Debug, PartialEq)]
pub struct Resolved {
    pub member: Vec<Option<usize>>,
    pub unit: Vec<[f64; 2]>,
    pub share: Vec<f64>,
    /// The members bearing on the pin, each once, in stack order.
    pub members: Vec<usize>,
}

impl Resolved {
    /// Directions and shares of a validated pin's bars.
    pub fn new(pin: &Pin, nodes: &[Node], all: &[Member]) -> Resolved {
        let n = pin.stack.len();
        let mut member = Vec::with_capacity(n);
        let mut unit = Vec::with_capacity(n);
        let mut members: Vec<usize> = Vec::new();
        let node = &nodes[pin.node];
        for bar in &pin.stack {
            match bar.carrier {
                Carrier::Member(m) => {
                    let mm = &all[m];
                    let other = if mm.start == pin.node {
                        mm.end
                    } else {
                        mm.start
                    };
                    let o = &nodes[other];
                    let (dx, dy) = (o.x - node.x, o.y - node.y);
                    let l = dx.hypot(dy);
                    member.push(Some(m));
                    unit.push([dx / l, dy / l]);
                    if !members.contains(&m) {
                        members.push(m);
                    }
                }
                Carrier::Load => {
                    member.push(None);
                    unit.push([0.0, 0.0]);
                }
            }
        }
        let mut share = vec![0.0; n];
        for i in 0..n {
            let total: f64 = (0..n)
                .filter(|&j| member[j] == member[i])
                .map(|j| pin.stack[j].thickness)
                .sum();
            share[i] = pin.stack[i].thickness / total;
        }
        Resolved {
            member,
            unit,
            share,
            members,
        }
    }

    /// Each bar's force on the pin under member forces `forces` (N, tension
    /// positive, one per member): the members' shares, then the load
    /// entries' shares of the balance.
    pub fn forces(&self, forces: &[f64]) -> Vec<[f64; 2]> {
        let mut out = Vec::with_capacity(self.share.len());
        let mut sum = [0.0, 0.0];
        for i in 0..self.share.len() {
            let f = match self.member[i] {
                Some(m) => {
                    let f = forces[m] * self.share[i];
                    [f * self.unit[i][0], f * self.unit[i][1]]
                }
                None => [0.0, 0.0],
            };
            sum[0] += f[0];
            sum[1] += f[1];
            out.push(f);
        }
        for ((f, m), share) in out.iter_mut().zip(&self.member).zip(&self.share) {
            if m.is_none() {
                *f = [-sum[0] * share, -sum[1] * share];
            }
        }
        out
    }

    /// The point loads on the pin (mid-thickness positions).
    pub fn loads(&self, pin: &Pin, forces: &[f64]) -> Vec<PointLoad> {
        self.forces(forces)
            .into_iter()
            .zip(&pin.stack)
            .map(|(force, bar)| PointLoad {
                z: bar.position,
                force,
            })
            .collect()
    }
}

#[cfg(test)]
mod tests {
    use super::super::statics::diagram;
    use super::super::{Bar, BarKind, Factors};
    use super::*;

    fn node(id: &str, x: f64, y: f64) -> Node {
        Node {
            id: id.into(),
            x,
            y,
        }
    }

    fn member(id: &str, start: usize, end: usize) -> Member {
        Member {
            id: id.into(),
            start,
            end,
            section: 0,
            material: 0,
            k_in: 1.0,
            k_out: 1.0,
            unbraced_in: None,
            unbraced_out: None,
            tension_only: false,
            bars: 1,
        }
    }

    fn bar(carrier: Carrier, t: f64, z: f64) -> Bar {
        Bar {
            carrier,
            label: String::new(),
            kind: BarKind::Plain,
            thickness: t,
            position: z,
            fy: None,
        }
    }

    #[test]
    fn bar_forces_balance_with_the_hanger() {
        // Bottom-chord joint L1 at (0,0) of a 3-4-5 panel: chord L0-L1 to
        // (−3,0), chord L1-L2 to (3,0), diagonal L1-U2 to (3,4). Node
        // equilibrium without load: with diagonal D = 50 (tension), chord
        // L1-L2 T2 and chord L0-L1 T1: x: −T1 + T2 + 0.6·50 = 0, y: 0.8·50 =
        // the hanger's 40 downward. Take T1 = 100, T2 = 70.
        let nodes = vec![
            node("L0", -3.0, 0.0),
            node("L1", 0.0, 0.0),
            node("L2", 3.0, 0.0),
            node("U2", 3.0, 4.0),
        ];
        let members = vec![member("a", 0, 1), member("b", 1, 2), member("d", 1, 3)];
        // Stack: chord a split in two bars (0.5 outside), chord b two bars,
        // the diagonal one bar in the middle beside the hanger... symmetric:
        // a | b | d | hanger | d | b | a with d split in two.
        let stack = vec![
            bar(Carrier::Member(0), 1.0, 0.5),
            bar(Carrier::Member(1), 1.0, 1.5),
            bar(Carrier::Member(2), 1.0, 2.5),
            bar(Carrier::Load, 1.0, 3.5),
            bar(Carrier::Member(2), 1.0, 4.5),
            bar(Carrier::Member(1), 1.0, 5.5),
            bar(Carrier::Member(0), 1.0, 6.5),
        ];
        let pin = Pin {
            node: 1,
            diameter: 0.1,
            fy: 250e6,
            stack,
            factors: Factors::default(),
        };
        let r = Resolved::new(&pin, &nodes, &members);
        assert_eq!(r.members, vec![0, 1, 2]);
        let f = r.forces(&[100.0, 70.0, 50.0]);
        // Each chord-a bar pulls toward L0 with 50; each chord-b bar toward
        // L2 with 35; each diagonal bar 25 along (0.6, 0.8) = (15, 20); the
        // hanger takes the balance (0, −40).
        assert_eq!(f[0], [-50.0, 0.0]);
        assert_eq!(f[1], [35.0, 0.0]);
        assert!((f[2][0] - 15.0).abs() < 1e-12 && (f[2][1] - 20.0).abs() < 1e-12);
        assert!(f[3][0].abs() < 1e-12 && (f[3][1] + 40.0).abs() < 1e-12);
        // And the pin is in equilibrium.
        let d = diagram("L1", &r.loads(&pin, &[100.0, 70.0, 50.0])).unwrap();
        // By hand, z from 0.5: M(1.5) = (−50, 0); V = (−15, 0) → M(2.5) =
        // (−65, 0); V = (0, 20) → M(3.5) = (−65, 20): |M| = √4625 = 68.007.
        assert!((d.max_moment - 4625f64.sqrt()).abs() < 1e-9);
    }
}
