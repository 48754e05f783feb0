//! Loads that rating needs beyond plain nodal forces: self-weight,
//! temperature and lack of fit (as initial member elongations), and
//! vehicles rolled across a deck line, evaluated through influence lines
//! into per-member force envelopes. Everything here is SI and does no I/O.

pub mod distribution;
pub mod envelope;
pub mod influence;
pub mod library;
pub mod moving;
pub mod rules;
pub mod self_weight;
pub mod thermal;

pub use envelope::{
    envelopes, envelopes_with, Extreme, MemberEnvelope, MovingEnvelope, ReactionEnvelope,
};
pub use influence::{influence_lines, InfluenceLines};
pub use moving::{Deck, Direction, Placement};

use crate::analysis::results::AnalysisError;

/// One axle of a vehicle.
#[derive(Clone, Debug, PartialEq)]
pub struct Axle {
    /// Axle load, N (acting downward).
    pub load: f64,
    /// Distance behind the front axle, m (0 for the front axle).
    pub offset: f64,
}

/// A vehicle: an axle train and an optional uniform lane (crowd) load,
/// with the placement rules of a published load model when it is one.
#[derive(Clone, Debug, PartialEq, Default)]
pub struct Vehicle {
    pub id: String,
    /// Front axle first; offsets non-decreasing.
    pub axles: Vec<Axle>,
    /// Uniform load per unit length of deck, N/m (downward), placed only
    /// where it adds to the effect sought.
    pub lane: Option<f64>,
    /// Placement rules beyond a fixed axle train (empty for a user's vehicle).
    pub rules: Rules,
}

impl Vehicle {
    /// Gross weight: the sum of the axle loads, N (a lane load has none).
    pub fn weight(&self) -> f64 {
        self.axles.iter().map(|a| a.load).sum()
    }

    /// Distance from the front axle to the rear axle, m (spacings at their
    /// least where they vary).
    pub fn length(&self) -> f64 {
        self.axles.last().map_or(0.0, |a| a.offset)
    }

    /// Sum of the axle loads of the primary train, N.
    pub fn gross(&self) -> f64 {
        self.axles.iter().map(|a| a.load).sum()
    }

    /// The same vehicle with every load (axles, lane, trailing uniform
    /// load, crowd width) multiplied by `factor`.
    pub fn scaled(&self, factor: f64) -> Vehicle {
        let mut v = self.clone();
        let scale = |axles: &mut Vec<Axle>| axles.iter_mut().for_each(|a| a.load *= factor);
        scale(&mut v.axles);
        v.rules
            .alternatives
            .iter_mut()
            .for_each(|t| scale(&mut t.axles));
        if let Some(w) = v.lane.as_mut() {
            *w *= factor;
        }
        if let Some(t) = v.rules.trailing.as_mut() {
            t.load *= factor;
        }
        if let Some(c) = v.rules.crowd.as_mut() {
            c.width *= factor;
        }
        v
    }
}

impl Vehicle {
    /// Whether the vehicle has placement rules that choose among trains or
    /// spacings (alternatives or a variable axle spacing).
    pub fn chooses_train(&self) -> bool {
        !self.rules.alternatives.is_empty()
            || self.rules.variable_gap.is_some()
            || self
                .rules
                .alternatives
                .iter()
                .any(|t| t.variable_gap.is_some())
    }

    /// The name of train `train` (0 the vehicle's own, 1… its alternatives).
    pub fn train_label(&self, train: usize) -> &str {
        match train {
            0 => self.rules.label.as_deref().unwrap_or(&self.id),
            k => self
                .rules
                .alternatives
                .get(k - 1)
                .map_or(self.id.as_str(), |t| t.label.as_str()),
        }
    }
}

/// An axle spacing that varies: the spacing between axle `axle − 1` and
/// `axle` runs from `min` to `max` (m) and the one giving the greatest
/// effect governs (the HS truck's rear axle, 14 to 30 ft). The axle
/// offsets of the train are written with the spacing at `min`.
#[derive(Clone, Debug, PartialEq)]
pub struct VariableGap {
    pub axle: usize,
    pub min: f64,
    pub max: f64,
}

/// An alternative axle train: the vehicle's effect is the greater of its
/// own train and each alternative (the design truck or the design tandem).
#[derive(Clone, Debug, PartialEq)]
pub struct Train {
    pub label: String,
    pub axles: Vec<Axle>,
    pub variable_gap: Option<VariableGap>,
}

/// A uniform load following the axle train (Cooper's trailing load): N/m,
/// from `offset` behind the front axle to the end of the deck behind.
#[derive(Clone, Debug, PartialEq)]
pub struct Trailing {
    pub load: f64,
    pub offset: f64,
}

/// A crowd (area) load whose intensity depends on the loaded length; the
/// load per length of deck is the intensity times `width` (m).
#[derive(Clone, Debug, PartialEq)]
pub struct Crowd {
    pub rule: CrowdRule,
    /// Tributary width of deck this truss carries, m.
    pub width: f64,
}

/// How a crowd intensity follows the loaded length.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum CrowdRule {
    /// EN 1991-2 §5.3.2.1 Eq. (5.1): q_fk = 2.0 + 120/(L + 30) kN/m², with
    /// 2.5 ≤ q_fk ≤ 5.0 kN/m², L the loaded length in m (from memory).
    En1991Footbridge,
}

impl CrowdRule {
    /// Intensity, N/m², for a loaded length `l` (m).
    pub fn intensity(self, l: f64) -> f64 {
        match self {
            CrowdRule::En1991Footbridge => {
                1000.0 * (2.0 + 120.0 / (l.max(0.0) + 30.0)).clamp(2.5, 5.0)
            }
        }
    }
}

/// Placement rules of a published load model.
#[derive(Clone, Debug, PartialEq, Default)]
pub struct Rules {
    /// The spacing of the primary train varied for the extreme.
    pub variable_gap: Option<VariableGap>,
    /// Other axle trains, the greatest effect governing.
    pub alternatives: Vec<Train>,
    /// The name of the vehicle's own train beside its alternatives
    /// ("design truck"); the vehicle's id when not given.
    pub label: Option<String>,
    pub trailing: Option<Trailing>,
    pub crowd: Option<Crowd>,
    /// Leave off axles whose effect relieves the one sought (AASHTO LRFD
    /// §3.6.1.3.1 "axles that do not contribute … shall be neglected";
    /// EN 1991-2 §6.8.1 "up to four of the concentrated loads").
    pub ignore_relieving: bool,
}

/// How the dynamic allowance of a moving load is found.
#[derive(Clone, Copy, Debug, PartialEq, Default)]
pub enum ImpactRule {
    /// `MovingLoad::impact` as given.
    #[default]
    Fixed,
    /// AASHTO Standard Specifications §3.8.2.1: I = 50/(L + 125) ≤ 0.30, L
    /// in ft the loaded length: here the length of the part of each
    /// member's influence line that adds to the effect sought (from memory).
    LoadedLength,
    /// AREMA Ch. 15 §1.3.5, steel spans, equipment without hammer blow
    /// (from memory): I % = 100/S + (40 − 3L²/1600 for L < 80 ft, else
    /// 16 + 600/(L − 30)), S the spacing of the trusses (ft), L the span
    /// (ft, `span` m), 100/S the rocking effect.
    Arema { span: f64, spacing: f64 },
    /// EN 1991-2 §6.4.5.2 (from memory): Φ2 = 1.44/(√LΦ − 0.2) + 0.82 within
    /// 1.00…1.67 (carefully maintained track) or Φ3 = 2.16/(√LΦ − 0.2) + 0.73
    /// within 1.00…2.00 (standard maintenance); impact = Φ − 1; LΦ (m) the
    /// determinant length, the span for a simply supported main girder.
    EnPhi { phi3: bool, length: f64 },
}

impl ImpactRule {
    /// The allowance (fraction) for an effect whose influence line adds
    /// over `loaded` m; `fixed` for [`ImpactRule::Fixed`].
    pub fn allowance(self, fixed: f64, loaded: f64) -> f64 {
        const FT: f64 = 0.3048;
        match self {
            ImpactRule::Fixed => fixed,
            ImpactRule::LoadedLength => (50.0 / (loaded / FT + 125.0)).min(0.30),
            ImpactRule::Arema { span, spacing } => {
                let l = span / FT;
                let vertical = if l < 80.0 {
                    40.0 - 3.0 * l * l / 1600.0
                } else {
                    16.0 + 600.0 / (l - 30.0)
                };
                (100.0 / (spacing / FT) + vertical) / 100.0
            }
            ImpactRule::EnPhi { phi3, length } => {
                let r = length.max(0.0).sqrt() - 0.2;
                let phi = if phi3 {
                    (2.16 / r + 0.73).clamp(1.0, 2.0)
                } else {
                    (1.44 / r + 0.82).clamp(1.0, 1.67)
                };
                phi - 1.0
            }
        }
    }

    pub fn describe(self) -> String {
        match self {
            ImpactRule::Fixed => "as given".into(),
            ImpactRule::LoadedLength => {
                "I = 50/(L + 125) <= 0.30, L the loaded length in ft (AASHTO Standard Specifications 3.8.2.1, from memory)".into()
            }
            ImpactRule::Arema { .. } => {
                "100/S + 40 - 3L^2/1600 (L < 80 ft) or 16 + 600/(L - 30) percent (AREMA Ch. 15 1.3.5, steel, no hammer blow, from memory)".into()
            }
            ImpactRule::EnPhi { phi3: true, .. } => {
                "Phi3 = 2.16/(sqrt(L_phi) - 0.2) + 0.73 within 1.00..2.00 (EN 1991-2 6.4.5.2(3), from memory)".into()
            }
            ImpactRule::EnPhi { phi3: false, .. } => {
                "Phi2 = 1.44/(sqrt(L_phi) - 0.2) + 0.82 within 1.00..1.67 (EN 1991-2 6.4.5.2(2), from memory)".into()
            }
        }
    }
}

/// A vehicle rolled across the deck.
#[derive(Clone, Debug, PartialEq)]
pub struct MovingLoad {
    pub id: String,
    /// Index into [`LiveLoads::vehicles`].
    pub vehicle: usize,
    /// Step between positions of the front axle, m.
    pub step: f64,
    /// Dynamic allowance as a fraction: axle effects are multiplied by 1 + impact.
    pub impact: f64,
    /// Whether the lane load is multiplied by 1 + impact too.
    pub impact_on_lane: bool,
    /// A legal load: rated at the legal level and posted.
    pub legal: bool,
    /// How the allowance is found (per effect for a length-dependent rule).
    pub impact_rule: ImpactRule,
    /// The library model's name when the vehicle is one (`"hs20"`).
    pub model: Option<String>,
    /// Transverse share of the vehicle this truss carries (already in the
    /// vehicle's loads), with any multiple-presence factor and scale.
    pub share: f64,
    /// The moving load's own `scale` (already in the vehicle's loads).
    pub scale: f64,
    /// Whether the model gave `impact` (kept when a sweep changes the vehicle).
    pub impact_given: bool,
}

impl Default for MovingLoad {
    /// No impact, the whole vehicle on this truss (share 1).
    fn default() -> Self {
        MovingLoad {
            id: String::new(),
            vehicle: 0,
            step: 1.0,
            impact: 0.0,
            impact_on_lane: false,
            impact_rule: ImpactRule::Fixed,
            model: None,
            share: 1.0,
            legal: false,
            scale: 1.0,
            impact_given: false,
        }
    }
}

/// The moving-load part of a model.
#[derive(Clone, Debug, PartialEq, Default)]
pub struct LiveLoads {
    /// Deck nodes in order along the deck (indices into `model.nodes`).
    pub deck: Vec<usize>,
    pub vehicles: Vec<Vehicle>,
    pub moving: Vec<MovingLoad>,
    /// Load cases (indices into `model.cases`) summed as the dead load.
    pub dead_cases: Vec<usize>,
    /// The first `user_vehicles` of `vehicles` are the model's own, as given.
    pub user_vehicles: usize,
    /// The deck's transverse layout, when the model gives one.
    pub layout: Option<distribution::DeckLayout>,
}

/// What can go wrong computing influence lines and envelopes.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum LoadError {
    #[error("no deck line: give `deck: [...]` in the model or --deck on the command line")]
    NoDeck,
    #[error("the deck line needs at least two nodes")]
    ShortDeck,
    #[error("deck node \"{0}\" appears more than once")]
    RepeatedDeckNode(String),
    #[error("deck nodes \"{0}\" and \"{1}\" are at the same place")]
    ZeroDeckSegment(String, String),
    #[error("deck node \"{0}\" is not defined")]
    UnknownDeckNode(String),
    #[error("deck node \"{0}\" has no member and no support, so it cannot carry load")]
    LooseDeckNode(String),
    #[error("unknown member \"{0}\"")]
    UnknownMember(String),
    #[error("the model has no moving loads: add `vehicles: [...]` and `moving_loads: [...]`")]
    NoMovingLoads,
    #[error("moving load \"{id}\": {positions} positions × {axles} axles = {work:.3e} axle placements (limits: {max_positions:.0e} positions, {max_work:.0e} axle placements); {advice}")]
    TooManyPositions {
        id: String,
        positions: f64,
        axles: usize,
        work: f64,
        max_positions: f64,
        max_work: f64,
        advice: String,
    },
    /// An envelope value overflowed (issue 22, item 12).
    #[error("moving load \"{id}\": the envelope of {of} is not a finite number (overflow); the axle loads or impact are out of range")]
    NonFinite { id: String, of: String },
    #[error(transparent)]
    Analysis(#[from] AnalysisError),
}

impl LoadError {
    /// True when the fault is ours rather than the input's.
    pub fn is_internal(&self) -> bool {
        matches!(self, LoadError::Analysis(AnalysisError::Internal))
    }
}
