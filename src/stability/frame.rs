//! A plane frame of Euler–Bernoulli beam-column elements, for buckling and
//! vibration: elastic stiffness, consistent geometric stiffness from the
//! elements' axial forces, consistent or lumped mass, grounded springs.
//!
//! Each element has local DOFs (u₁, v₁, θ₁, u₂, v₂, θ₂); each maps to one
//! global DOF with a coefficient, or to none (held). A coefficient other than
//! one carries an inclined roller: its node's u and v both map to the one
//! DOF along the rolling surface.
//!
//! Matrices (any structural-dynamics or stability text, e.g. Przemieniecki,
//! *Theory of Matrix Structural Analysis*, the standard forms):
//! elastic bending EI/L³·[12, 6L, −12, 6L; 6L, 4L², −6L, 2L²; …],
//! geometric N/(30L)·[36, 3L, −36, 3L; 3L, 4L², −3L, −L²; …] (tension N
//! positive stiffens), consistent mass mL/420·[156, 22L, 54, −13L; …] in
//! bending and mL/6·[2, 1; 1, 2] axially.

use nalgebra::DMatrix;

/// A global DOF and the coefficient of the element DOF on it; None: held.
pub type Dof = Option<(usize, f64)>;

/// One beam-column element.
#[derive(Clone, Debug, PartialEq)]
pub struct Beam {
    pub a: [f64; 2],
    pub b: [f64; 2],
    pub dofs: [Dof; 6],
    /// Axial stiffness E·A, N, and bending stiffness E·I, N·m².
    pub ea: f64,
    pub ei: f64,
    /// Axial force for the geometric stiffness, N, tension positive.
    pub axial: f64,
    /// Mass per length, kg/m.
    pub mass: f64,
    /// The member this element belongs to (index chosen by the builder's caller).
    pub member: usize,
}

impl Beam {
    pub fn length(&self) -> f64 {
        (self.b[0] - self.a[0]).hypot(self.b[1] - self.a[1])
    }
}

/// A frame node's three DOFs (u, v, θ).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct FrameNode {
    pub x: f64,
    pub y: f64,
    pub dofs: [Dof; 3],
}

/// The frame: DOF count, elements, grounded springs and point masses.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Frame {
    pub n_dofs: usize,
    pub beams: Vec<Beam>,
    pub springs: Vec<(Dof, f64)>,
    pub masses: Vec<(Dof, f64)>,
}

/// Which matrix to assemble.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Matrix {
    Stiffness,
    Geometric,
    Mass(MassKind),
}

/// How mass is distributed.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum MassKind {
    Consistent,
    /// Half of each element's mass at each end, translations only.
    Lumped,
}

impl Frame {
    /// A new free DOF.
    pub fn dof(&mut self) -> Dof {
        self.n_dofs += 1;
        Some((self.n_dofs - 1, 1.0))
    }

    /// A node; `hold` = which of (u, v, θ) are held.
    pub fn node(&mut self, x: f64, y: f64, hold: [bool; 3]) -> FrameNode {
        let mut dofs = [None; 3];
        for (d, h) in dofs.iter_mut().zip(hold) {
            if !h {
                *d = self.dof();
            }
        }
        FrameNode { x, y, dofs }
    }

    /// A member from `a` to `b` in `parts` equal elements; `rot_a`/`rot_b`
    /// are the rotation DOFs its ends use (the node's for a rigid joint, a
    /// new one for a pin). Interior points get new DOFs.
    #[allow(clippy::too_many_arguments)]
    pub fn member(
        &mut self,
        a: &FrameNode,
        b: &FrameNode,
        rot_a: Dof,
        rot_b: Dof,
        parts: usize,
        props: [f64; 3],
        axial: f64,
        member: usize,
    ) {
        let parts = parts.max(1);
        let [ea, ei, mass] = props;
        let mut prev = [a.dofs[0], a.dofs[1], rot_a];
        let mut prev_xy = [a.x, a.y];
        for k in 1..=parts {
            let t = k as f64 / parts as f64;
            let xy = [a.x + t * (b.x - a.x), a.y + t * (b.y - a.y)];
            let next = if k == parts {
                [b.dofs[0], b.dofs[1], rot_b]
            } else {
                [self.dof(), self.dof(), self.dof()]
            };
            self.beams.push(Beam {
                a: prev_xy,
                b: xy,
                dofs: [prev[0], prev[1], prev[2], next[0], next[1], next[2]],
                ea,
                ei,
                axial,
                mass,
                member,
            });
            prev = next;
            prev_xy = xy;
        }
    }

    /// Elastic stiffness K (with the springs).
    pub fn stiffness(&self) -> DMatrix<f64> {
        self.dense(Matrix::Stiffness)
    }

    /// G per the buckling convention K·φ = λ·G·φ: G = −K_g(N), so
    /// compression gives positive G.
    pub fn geometric(&self) -> DMatrix<f64> {
        self.dense(Matrix::Geometric)
    }

    /// Mass M (with the point masses).
    pub fn mass(&self, kind: MassKind) -> DMatrix<f64> {
        self.dense(Matrix::Mass(kind))
    }

    fn dense(&self, which: Matrix) -> DMatrix<f64> {
        let mut m = DMatrix::zeros(self.n_dofs, self.n_dofs);
        self.each(which, &mut |i, j, v| m[(i, j)] += v);
        m
    }

    /// The matrix as (row, column, value) triplets, duplicates not summed
    /// (both triangles), for the sparse solver.
    pub fn triplets(&self, which: Matrix) -> Vec<(usize, usize, f64)> {
        let mut t = Vec::with_capacity(36 * self.beams.len() + self.springs.len());
        self.each(which, &mut |i, j, v| t.push((i, j, v)));
        t
    }

    fn each(&self, which: Matrix, add: &mut dyn FnMut(usize, usize, f64)) {
        for beam in &self.beams {
            let local = match which {
                Matrix::Stiffness => local_elastic(beam),
                Matrix::Geometric => {
                    let mut kg = local_geometric(beam);
                    kg.iter_mut().flatten().for_each(|v| *v = -*v);
                    kg
                }
                Matrix::Mass(kind) => local_mass(beam, kind),
            };
            scatter(add, beam, &local);
        }
        let point = match which {
            Matrix::Stiffness => &self.springs,
            Matrix::Geometric => return,
            Matrix::Mass(_) => &self.masses,
        };
        for &(d, v) in point {
            if let Some((i, c)) = d {
                add(i, i, c * c * v);
            }
        }
    }

    /// Global displacement (u, v) of a node of the frame in a mode.
    pub fn translation(dofs: &[Dof; 3], phi: &nalgebra::DVector<f64>) -> [f64; 2] {
        let at = |d: Dof| d.map_or(0.0, |(i, c)| c * phi[i]);
        [at(dofs[0]), at(dofs[1])]
    }
}

/// φ_eᵀ·(−K_g)·φ_e of one element: its share of φᵀ·G·φ (the work of its
/// axial force in the mode; positive in compression).
#[allow(clippy::needless_range_loop)]
pub fn geometric_work(beam: &Beam, phi: &nalgebra::DVector<f64>) -> f64 {
    let l = beam.length();
    let (c, s) = ((beam.b[0] - beam.a[0]) / l, (beam.b[1] - beam.a[1]) / l);
    let g: Vec<f64> = beam
        .dofs
        .iter()
        .map(|d| d.map_or(0.0, |(i, k)| k * phi[i]))
        .collect();
    let mut d = [0.0; 6];
    for o in [0, 3] {
        d[o] = c * g[o] + s * g[o + 1];
        d[o + 1] = -s * g[o] + c * g[o + 1];
        d[o + 2] = g[o + 2];
    }
    let kg = local_geometric(beam);
    let mut w = 0.0;
    for i in 0..6 {
        for j in 0..6 {
            w -= d[i] * kg[i][j] * d[j];
        }
    }
    w
}

type Local = [[f64; 6]; 6];

/// Rotates a local matrix to global axes and adds it through the DOF map.
#[allow(clippy::needless_range_loop)] // index form mirrors Tᵀ·k·T
fn scatter(add: &mut dyn FnMut(usize, usize, f64), beam: &Beam, local: &Local) {
    let l = beam.length();
    let (c, s) = ((beam.b[0] - beam.a[0]) / l, (beam.b[1] - beam.a[1]) / l);
    // T maps global (u, v, θ) to local: u' = c·u + s·v, v' = −s·u + c·v.
    let mut t = [[0.0; 6]; 6];
    for o in [0, 3] {
        t[o][o] = c;
        t[o][o + 1] = s;
        t[o + 1][o] = -s;
        t[o + 1][o + 1] = c;
        t[o + 2][o + 2] = 1.0;
    }
    // Tᵀ·k·T.
    let mut kt = [[0.0; 6]; 6];
    for i in 0..6 {
        for j in 0..6 {
            kt[i][j] = (0..6).map(|p| local[i][p] * t[p][j]).sum();
        }
    }
    for i in 0..6 {
        let Some((gi, ci)) = beam.dofs[i] else {
            continue;
        };
        for j in 0..6 {
            let Some((gj, cj)) = beam.dofs[j] else {
                continue;
            };
            let v: f64 = (0..6).map(|p| t[p][i] * kt[p][j]).sum();
            add(gi, gj, ci * cj * v);
        }
    }
}

/// Local bending pattern [v₁, θ₁, v₂, θ₂] placed in a 6×6 matrix.
#[allow(clippy::needless_range_loop)]
fn bending(into: &mut Local, f: f64, m: [[f64; 4]; 4]) {
    let map = [1, 2, 4, 5];
    for i in 0..4 {
        for j in 0..4 {
            into[map[i]][map[j]] += f * m[i][j];
        }
    }
}

fn local_elastic(beam: &Beam) -> Local {
    let l = beam.length();
    let mut k = [[0.0; 6]; 6];
    let a = beam.ea / l;
    k[0][0] = a;
    k[3][3] = a;
    k[0][3] = -a;
    k[3][0] = -a;
    let f = beam.ei / (l * l * l);
    bending(
        &mut k,
        f,
        [
            [12.0, 6.0 * l, -12.0, 6.0 * l],
            [6.0 * l, 4.0 * l * l, -6.0 * l, 2.0 * l * l],
            [-12.0, -6.0 * l, 12.0, -6.0 * l],
            [6.0 * l, 2.0 * l * l, -6.0 * l, 4.0 * l * l],
        ],
    );
    k
}

fn local_geometric(beam: &Beam) -> Local {
    let l = beam.length();
    let mut k = [[0.0; 6]; 6];
    bending(
        &mut k,
        beam.axial / (30.0 * l),
        [
            [36.0, 3.0 * l, -36.0, 3.0 * l],
            [3.0 * l, 4.0 * l * l, -3.0 * l, -l * l],
            [-36.0, -3.0 * l, 36.0, -3.0 * l],
            [3.0 * l, -l * l, -3.0 * l, 4.0 * l * l],
        ],
    );
    k
}

fn local_mass(beam: &Beam, kind: MassKind) -> Local {
    let l = beam.length();
    let total = beam.mass * l;
    let mut m = [[0.0; 6]; 6];
    match kind {
        MassKind::Lumped => {
            for i in [0, 1, 3, 4] {
                m[i][i] = total / 2.0;
            }
        }
        MassKind::Consistent => {
            m[0][0] = total / 3.0;
            m[3][3] = total / 3.0;
            m[0][3] = total / 6.0;
            m[3][0] = total / 6.0;
            bending(
                &mut m,
                total / 420.0,
                [
                    [156.0, 22.0 * l, 54.0, -13.0 * l],
                    [22.0 * l, 4.0 * l * l, 13.0 * l, -3.0 * l * l],
                    [54.0, 13.0 * l, 156.0, -22.0 * l],
                    [-13.0 * l, -3.0 * l * l, -22.0 * l, 4.0 * l * l],
                ],
            );
        }
    }
    m
}
