//! What-if sweeps: many variants of one model (load scale factors, moving
//! loads scaled, given another impact or another vehicle, added cases, node moves, a deeper or shallower truss, section and material
//! substitutions, members removed), each analysed and rated, one summary
//! row per variant. The types here are format-free; `input::sweep` reads
//! them from RON and `report::sweep_out` writes the rows.
//!
//! Everything is in SI, like the [`Model`](crate::model::Model).

pub mod redundancy;
pub mod run;
pub mod variant;

pub use run::{run, Outcome, RunOptions, VariantResult};
pub use variant::{apply, Kind, VariantError};

use crate::model::CaseKind;

/// A whole sweep: the listed variants (index 0 first), then the product
/// of the axes, which is not expanded: [`Sweep::variant`] builds variant
/// `i` when it is run, so a shard or a large product never holds every
/// variant in memory (issue 22, items 9 and 16).
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Sweep {
    pub variants: Vec<Variant>,
    /// The axes: name and steps (label, changes); empty when none.
    pub axes: Vec<Axis>,
}

/// An axis of a sweep: its name and its steps (label, changes).
pub type Axis = (String, Vec<(String, Vec<Change>)>);

impl Sweep {
    /// Number of variants of the axes' product (0 without axes).
    pub fn product_len(&self) -> usize {
        if self.axes.is_empty() {
            0
        } else {
            self.axes.iter().map(|(_, s)| s.len()).product()
        }
    }

    /// Number of variants: listed, then the product.
    pub fn len(&self) -> usize {
        self.variants.len() + self.product_len()
    }

    pub fn is_empty(&self) -> bool {
        self.len() == 0
    }

    /// Variant `i` (listed first, then the product with the last axis
    /// varying fastest); built on demand for the product.
    pub fn variant(&self, i: usize) -> std::borrow::Cow<'_, Variant> {
        if let Some(v) = self.variants.get(i) {
            return std::borrow::Cow::Borrowed(v);
        }
        let mut k = i - self.variants.len();
        let mut pick = vec![0; self.axes.len()];
        for (a, (_, steps)) in self.axes.iter().enumerate().rev() {
            pick[a] = k % steps.len();
            k /= steps.len();
        }
        let mut v = Variant::default();
        for (a, (name, steps)) in self.axes.iter().enumerate() {
            let (label, changes) = &steps[pick[a]];
            v.parameters.push((name.clone(), label.clone()));
            v.changes.extend(changes.iter().cloned());
        }
        v.name = v
            .parameters
            .iter()
            .map(|(_, l)| l.as_str())
            .collect::<Vec<_>>()
            .join(" / ");
        std::borrow::Cow::Owned(v)
    }
}

/// One variant: a name, a description of its parameters and the changes
/// applied, in order, to a copy of the base model.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct Variant {
    pub name: String,
    /// `key=value` pairs describing the variant, for the report.
    pub parameters: Vec<(String, String)>,
    pub changes: Vec<Change>,
}

/// Which nodes a change of depth moves.
#[derive(Clone, Debug, PartialEq)]
pub enum DepthNodes {
    /// Every node whose id starts with this prefix ("U" by default).
    Prefix(String),
    /// Every node above the lowest support (the top chord and any
    /// mid-height nodes of the web).
    AboveSupports,
}

/// A load case added by a variant (SI).
#[derive(Clone, Debug, PartialEq)]
pub struct AddedCase {
    pub id: String,
    pub kind: CaseKind,
    pub impact: f64,
    /// `(node id, fx, fy)`, N.
    pub loads: Vec<(String, f64, f64)>,
}

/// New properties of a section (SI); `None` keeps the old value.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct SectionProps {
    pub area: Option<f64>,
    pub i_in: Option<f64>,
    pub i_out: Option<f64>,
    pub net_area: Option<f64>,
}

/// New properties of a material (SI); `None` keeps the old value.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct MaterialProps {
    pub e: Option<f64>,
    pub fy: Option<f64>,
    pub fu: Option<f64>,
}

/// One change to the base model.
#[derive(Clone, Debug, PartialEq)]
pub enum Change {
    /// Multiply every load, settlement and initial elongation of a case.
    ScaleCase { case: String, factor: f64 },
    /// Add a load case.
    AddCase(AddedCase),
    /// Move a node: to `x`/`y` where given, then by `dx`/`dy` (m).
    MoveNode {
        node: String,
        x: Option<f64>,
        y: Option<f64>,
        dx: f64,
        dy: f64,
    },
    /// Change the truss depth: move the selected nodes up by `dy` (m).
    Depth { nodes: DepthNodes, dy: f64 },
    /// Give a member another existing section.
    MemberSection { member: String, section: String },
    /// Give a member another existing material.
    MemberMaterial { member: String, material: String },
    /// Change a section's properties (every member using it).
    SectionProperties {
        section: String,
        props: SectionProps,
    },
    /// Change a material's properties.
    MaterialProperties {
        material: String,
        props: MaterialProps,
    },
    /// Remove a member (the pattern of K changes).
    RemoveMember { member: String },
    /// Multiply a moving load's vehicle: every axle load and the lane
    /// load (the vehicle is copied, so other moving loads keep theirs).
    ScaleMoving { moving: String, factor: f64 },
    /// Set the dynamic allowance (a fraction) of a moving load or of a
    /// live load case.
    Impact { load: String, impact: f64 },
    /// Give a moving load another vehicle (applied before every other
    /// change of its variant, so a scale or impact of the same variant acts
    /// on the new vehicle).
    Vehicle {
        moving: String,
        choice: Box<VehicleChoice>,
    },
}

/// A moving load's new vehicle, made ready by the sweep reader as the
/// model file would have it: a library model with its standard's rules,
/// the moving load's `scale` and the deck layout's lever-rule share; or one
/// of the model's own vehicles with the same scale and share (SI).
#[derive(Clone, Debug, PartialEq)]
pub struct VehicleChoice {
    /// The name given (`"h10"`, or a vehicle id of the model).
    pub name: String,
    pub vehicle: crate::loads::Vehicle,
    /// New allowance, its rule and whether it acts on the lane load;
    /// `None` keeps the moving load's (its `impact` was given in the model).
    pub impact: Option<(f64, crate::loads::ImpactRule, bool)>,
    /// The library model's name, `None` for a vehicle of the model.
    pub model: Option<String>,
    pub share: f64,
    /// A legal load of its standard; `None` keeps the moving load's flag.
    pub legal: Option<bool>,
}

impl Change {
    /// What the change alters, for reusing factorizations.
    pub fn kind(&self) -> Kind {
        match self {
            Change::ScaleCase { .. }
            | Change::AddCase(_)
            | Change::ScaleMoving { .. }
            | Change::Impact { .. }
            | Change::Vehicle { .. } => Kind::LoadsOnly,
            Change::MoveNode { .. }
            | Change::Depth { .. }
            | Change::MemberSection { .. }
            | Change::MemberMaterial { .. }
            | Change::SectionProperties { .. }
            | Change::MaterialProperties { .. } => Kind::Stiffness,
            Change::RemoveMember { .. } => Kind::Topology,
        }
    }
}

impl Variant {
    /// The strongest kind among the changes: what must be redone.
    pub fn kind(&self) -> Kind {
        self.changes
            .iter()
            .map(Change::kind)
            .max()
            .unwrap_or(Kind::LoadsOnly)
    }

    /// The parameters as one `key=value; key=value` string.
    pub fn describe(&self) -> String {
        if self.parameters.is_empty() {
            return "base".into();
        }
        self.parameters
            .iter()
            .map(|(k, v)| format!("{k}={v}"))
            .collect::<Vec<_>>()
            .join("; ")
    }
}

/// Parse `I/N` (1 ≤ I ≤ N) for `--shard`.
pub fn parse_shard(s: &str) -> Result<(usize, usize), String> {
    let bad = || format!("--shard \"{s}\": write I/N with 1 ≤ I ≤ N, e.g. 2/4");
    let (i, n) = s.split_once('/').ok_or_else(bad)?;
    let i: usize = i.trim().parse().map_err(|_| bad())?;
    let n: usize = n.trim().parse().map_err(|_| bad())?;
    if n == 0 || i == 0 || i > n {
        return Err(bad());
    }
    Ok((i, n))
}

/// Indices of the variants shard `i` of `n` runs: index % n == i − 1.
pub fn shard_indices(total: usize, shard: Option<(usize, usize)>) -> Vec<usize> {
    match shard {
        None => (0..total).collect(),
        Some((i, n)) => (0..total).filter(|k| k % n == i - 1).collect(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn shards_partition_the_indices() {
        let all: Vec<usize> = (0..23).collect();
        let mut union: Vec<usize> = (1..=4)
            .flat_map(|i| shard_indices(23, Some((i, 4))))
            .collect();
        union.sort();
        assert_eq!(union, all);
        assert_eq!(parse_shard("2/4"), Ok((2, 4)));
        assert!(parse_shard("0/4").is_err());
        assert!(parse_shard("5/4").is_err());
        assert!(parse_shard("x").is_err());
    }
}
