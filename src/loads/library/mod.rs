//! Published live-load models by their standards' own designations: the
//! AASHTO trucks, design load, legal and notional loads and pedestrian
//! load (`aashto.rs`), the railway Cooper loading and its alternate
//! (`rail.rs`), and the EN 1991-2 models (`eurocode.rs`). Every number is
//! SI inside; every constant is marked "from memory" with its source in
//! [`LoadModel::source`], shown by `panelpoint vehicles` and in the docs.
//! A model is looked up by a fixed lower-case name ([`lookup`]).

pub mod aashto;
pub mod eurocode;
pub mod rail;

use super::{Axle, Vehicle};

/// 1 kip in N.
pub const KIP: f64 = 4_448.221_615_260_5;
/// 1 ft in m.
pub const FT: f64 = 0.3048;
/// 1 kip/ft in N/m.
pub const KLF: f64 = KIP / FT;
/// 1 lbf/ft² in N/m².
pub const PSF: f64 = 47.880_258_980_335_84;

/// How a model's standard finds its dynamic allowance.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Dynamic {
    /// None (static model, or the allowance is included in the loads).
    None,
    /// A fixed fraction on the axles (not on the lane).
    Fixed(f64),
    /// I = 50/(L + 125) ≤ 0.30 with the loaded length (AASHTO Standard).
    LoadedLength,
    /// The railway formula for steel spans with the rocking effect.
    Arema,
    /// EN 1991-2 Φ3 (true) or Φ2 (false) from the determinant length.
    EnPhi { phi3: bool },
}

/// Multiple-presence rule for lanes loaded together.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Presence {
    /// No factor (one track, or the model is per lane).
    None,
    /// AASHTO LRFD Table 3.6.1.1.2-1 (from memory): 1.20, 1.00, 0.85, 0.65
    /// for 1, 2, 3, more than 3 lanes loaded.
    Lrfd,
    /// AASHTO Standard Specifications §3.12.1 (from memory): 1.0 for one or
    /// two lanes, 0.90 for three, 0.75 for four or more.
    Standard,
}

impl Presence {
    /// The factor for `lanes` lanes loaded together.
    pub fn factor(self, lanes: usize) -> f64 {
        match (self, lanes) {
            (Presence::None, _) => 1.0,
            (Presence::Lrfd, 0 | 1) => 1.20,
            (Presence::Lrfd, 2) => 1.00,
            (Presence::Lrfd, 3) => 0.85,
            (Presence::Lrfd, _) => 0.65,
            (Presence::Standard, 0..=2) => 1.0,
            (Presence::Standard, 3) => 0.90,
            (Presence::Standard, _) => 0.75,
        }
    }
}

/// One published load model.
#[derive(Clone, Debug, PartialEq)]
pub struct LoadModel {
    /// Fixed lower-case name used in `moving_loads` (`"hs20"`).
    pub name: String,
    /// The standard's designation (`"HS20-44"`).
    pub designation: String,
    /// Standard, clause and "from memory" where recalled.
    pub source: String,
    /// Axles, lane load and placement rules, SI; `id` = `name`. For an
    /// area load (`area` set) the lane holds nothing until the deck's
    /// tributary width is known.
    pub vehicle: Vehicle,
    /// Area intensity, N/m², of a pedestrian or crowd load carried over the
    /// tributary width (constant; a length-dependent crowd uses
    /// `vehicle.rules.crowd` with width 1 m instead).
    pub area: Option<f64>,
    pub dynamic: Dynamic,
    /// Whether the dynamic allowance also multiplies the lane load.
    pub impact_on_lane: bool,
    pub presence: Presence,
    /// A legal (posting) load: the lead's posting uses these.
    pub legal: bool,
    /// Cautions the user should read.
    pub note: String,
}

impl LoadModel {
    /// Gross weight, N: the heaviest axle train's sum (the train only for a
    /// model with a trailing or lane load; 0 for an area load).
    pub fn gross_weight(&self) -> f64 {
        let own = self.vehicle.gross();
        self.vehicle
            .rules
            .alternatives
            .iter()
            .map(|t| t.axles.iter().map(|a| a.load).sum::<f64>())
            .fold(own, f64::max)
    }

    /// Whether the model is an area (pedestrian or crowd) load that needs a
    /// tributary width.
    pub fn is_area(&self) -> bool {
        self.area.is_some() || self.vehicle.rules.crowd.is_some()
    }
}

/// Axles from loads (kip) and spacings to the axle in front (ft).
pub(crate) fn axles_kip_ft(loads: &[f64], spacings: &[f64]) -> Vec<Axle> {
    axles_si(
        &loads.iter().map(|l| l * KIP).collect::<Vec<_>>(),
        &spacings.iter().map(|s| s * FT).collect::<Vec<_>>(),
    )
}

/// Axles from loads (N) and spacings to the axle in front (m);
/// `spacings.len() == loads.len() - 1`.
pub(crate) fn axles_si(loads: &[f64], spacings: &[f64]) -> Vec<Axle> {
    debug_assert_eq!(spacings.len() + 1, loads.len());
    let mut offset = 0.0;
    loads
        .iter()
        .enumerate()
        .map(|(i, &load)| {
            if i > 0 {
                offset += spacings[i - 1];
            }
            Axle { load, offset }
        })
        .collect()
}

/// The model of that fixed lower-case name (`"hs20"`, `"cooper-e72"` …).
pub fn lookup(name: &str) -> Option<LoadModel> {
    aashto::lookup(name)
        .or_else(|| rail::lookup(name))
        .or_else(|| eurocode::lookup(name))
}

/// Every model in the library (Cooper and its alternate at E80).
pub fn catalogue() -> Vec<LoadModel> {
    let mut out = Vec::new();
    for name in aashto::NAMES
        .iter()
        .chain(rail::NAMES)
        .chain(eurocode::NAMES)
    {
        out.extend(lookup(name));
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_listed_name_resolves_and_is_lower_case() {
        let all = catalogue();
        assert_eq!(
            all.len(),
            aashto::NAMES.len() + rail::NAMES.len() + eurocode::NAMES.len()
        );
        for m in &all {
            assert_eq!(m.name, m.name.to_lowercase());
            assert_eq!(m.vehicle.id, m.name);
            assert!(m.source.contains("from memory"), "{}", m.name);
            // Offsets non-decreasing (the scan's precondition).
            assert!(m
                .vehicle
                .axles
                .windows(2)
                .all(|w| w[0].offset <= w[1].offset));
        }
        assert!(lookup("nope").is_none());
        assert!(lookup("HS20").is_none(), "names are lower case only");
    }

    #[test]
    fn presence_factors_from_memory() {
        // AASHTO LRFD Table 3.6.1.1.2-1 (from memory).
        assert_eq!(Presence::Lrfd.factor(1), 1.20);
        assert_eq!(Presence::Lrfd.factor(2), 1.00);
        assert_eq!(Presence::Lrfd.factor(3), 0.85);
        assert_eq!(Presence::Lrfd.factor(4), 0.65);
        // AASHTO Standard Specifications 3.12.1 (from memory).
        assert_eq!(Presence::Standard.factor(3), 0.90);
        assert_eq!(Presence::Standard.factor(5), 0.75);
    }
}

#[cfg(test)]
mod impact_tests {
    use super::FT;
    use crate::loads::ImpactRule;

    #[test]
    fn railway_impact_by_hand() {
        // AREMA 15-1.3.5 (from memory), trusses S = 16 ft apart:
        // L = 40 ft < 80: 40 − 3·40²/1600 = 37 %, + 100/16 = 6.25 % → 43.25 %.
        let r = ImpactRule::Arema {
            span: 40.0 * FT,
            spacing: 16.0 * FT,
        };
        assert!((r.allowance(0.0, 0.0) - 0.4325).abs() < 1e-12);
        // L = 80 ft, both branches give 28 %: 40 − 12 = 16 + 600/50.
        let r = ImpactRule::Arema {
            span: 80.0 * FT,
            spacing: 20.0 * FT,
        };
        assert!((r.allowance(0.0, 0.0) - 0.33).abs() < 1e-12);
    }

    #[test]
    fn standard_impact_by_hand() {
        // AASHTO Standard 3.8.2.1 (from memory): L = 75 ft: 50/200 = 0.25;
        // L = 20 ft: 50/145 = 0.345 → 0.30.
        let r = ImpactRule::LoadedLength;
        assert!((r.allowance(0.0, 75.0 * FT) - 0.25).abs() < 1e-12);
        assert_eq!(r.allowance(0.0, 20.0 * FT), 0.30);
        assert_eq!(ImpactRule::Fixed.allowance(0.15, 99.0), 0.15);
    }
}
