//! Every member's fatigue evaluation: its stress history under one
//! crossing of the fatigue vehicle (the worse of the two directions, by
//! Σ nᵢ·Δfᵢ³), counted by rainflow as a repeating passage, then the AASHTO
//! MBE Section 7 lives and the EN 1993-1-9 damage.

use super::en1993_1_9::{self, EnLife};
use super::history::{force_history, passages, Passage};
use super::mbe::{self, Category, MbeLife};
use super::rainflow::{count_repeating, effective, histogram};
use super::{FatigueError, Settings, StressArea};
use crate::analysis::results::Prepared;
use crate::loads::moving::{Deck, Direction};
use crate::loads::{influence_lines, LoadError};
use crate::model::Model;

/// One member's fatigue result, SI (Pa, years).
#[derive(Clone, Debug, PartialEq)]
pub struct MemberFatigue {
    /// Index into `model.members`.
    pub member: usize,
    pub category: Category,
    /// True when the AASHTO category is the default, not given.
    pub category_default: bool,
    /// EN 1993-1-9 detail category Δσ_C, Pa.
    pub en_category: f64,
    pub en_default: bool,
    /// The area dividing the force, m².
    pub area: f64,
    /// Direction of travel whose history governs.
    pub direction: Direction,
    /// Greatest and least stress of the passage with impact, Pa.
    pub max_stress: f64,
    pub min_stress: f64,
    /// Rainflow cycles of one passage (range Pa, count), largest first.
    pub cycles: Vec<(f64, f64)>,
    /// Σ nᵢ, cycles per passage.
    pub cycles_per_passage: f64,
    /// (Σ nᵢ·Δfᵢ³ / Σ nᵢ)^(1/3) of the calculated stresses, Pa (before the
    /// MBE factors R_s and γ, which `mbe.effective_range` includes).
    pub effective_range: f64,
    pub mbe: MbeLife,
    pub en: EnLife,
}

/// The fatigue evaluation of a model.
#[derive(Clone, Debug, PartialEq)]
pub struct Fatigue {
    pub settings: Settings,
    /// Fatigue vehicle id.
    pub vehicle: String,
    /// Members with a finite MBE remaining life first (least minimum-level
    /// remaining life first), then the rest in model order.
    pub members: Vec<MemberFatigue>,
}

/// Ranges below this fraction of the history's largest |stress| are
/// round-off ripples on a plateau (a sum of ordinates that should be
/// constant), not cycles: counted, they would raise n and lower (Δf)eff,
/// which could turn the infinite-life check unconservative.
pub const RIPPLE: f64 = 1e-9;

/// Cycles with their Σ n·r³ of one stress history.
fn counted(history: &[f64]) -> (Vec<(f64, f64)>, f64) {
    let largest = history.iter().fold(0.0f64, |a, v| a.max(v.abs()));
    let mut cycles = histogram(&count_repeating(history));
    cycles.retain(|c| c.0 > RIPPLE * largest);
    let s3 = cycles.iter().map(|&(r, n)| n * r.powi(3)).sum();
    (cycles, s3)
}

/// The governing passage of one member: its direction, stress history,
/// cycles and Σ n·r³.
struct Governing {
    direction: Direction,
    history: Vec<f64>,
    cycles: Vec<(f64, f64)>,
    s3: f64,
}

/// One member's evaluation from its influence `ordinates`.
fn member(
    model: &Model,
    s: &Settings,
    both: &[Passage; 2],
    ordinates: &[f64],
    m: usize,
) -> MemberFatigue {
    let section = &model.sections[model.members[m].section];
    let area = match s.area {
        StressArea::Net => section.net_area,
        StressArea::Gross => section.area,
    };
    let factor = (1.0 + s.impact) / area;
    let mut best: Option<Governing> = None;
    for p in both {
        let history: Vec<f64> = force_history(p, ordinates)
            .into_iter()
            .map(|f| f * factor)
            .collect();
        let (cycles, s3) = counted(&history);
        if best.as_ref().is_none_or(|b| s3 > b.s3) {
            best = Some(Governing {
                direction: p.direction,
                history,
                cycles,
                s3,
            });
        }
    }
    let g = best.expect("two passages");
    let (n, eff) = effective(&g.cycles);
    let given = s.detail(m);
    let category = given.aashto.unwrap_or(s.default_category);
    let en_category = given.en.unwrap_or(s.default_en);
    MemberFatigue {
        member: m,
        category,
        category_default: given.aashto.is_none(),
        en_category,
        en_default: given.en.is_none(),
        area,
        direction: g.direction,
        max_stress: g.history.iter().fold(0.0f64, |a, &v| a.max(v)),
        min_stress: g.history.iter().fold(0.0f64, |a, &v| a.min(v)),
        mbe: mbe::evaluate(category, &s.mbe, eff, n, &s.traffic),
        en: en1993_1_9::evaluate(en_category, &s.en, &g.cycles, &s.traffic),
        cycles: g.cycles,
        cycles_per_passage: n,
        effective_range: eff,
    }
}

/// Evaluate every member of `model` under its fatigue settings, with the
/// influence lines solved on the factorization in `prepared`.
///
/// Errors: no fatigue block, no deck line, or an analysis failure.
pub fn evaluate(model: &Model, prepared: &Prepared) -> Result<Fatigue, FatigueError> {
    use rayon::prelude::*;
    let s = model.fatigue.as_ref().ok_or(FatigueError::NoSettings)?;
    let deck = Deck::of_model(model)?;
    let lines = influence_lines(model, prepared, &deck)?;
    let vehicle = &model.live.vehicles[s.vehicle];
    let both = passages(&deck, vehicle)?;
    let mut members: Vec<MemberFatigue> = (0..model.members.len())
        .into_par_iter()
        .map(|m| member(model, s, &both, lines.member(m), m))
        .collect();
    members.sort_by(|a, b| match (a.mbe.remaining[0], b.mbe.remaining[0]) {
        (Some(x), Some(y)) => x.total_cmp(&y).then(a.member.cmp(&b.member)),
        (Some(_), None) => std::cmp::Ordering::Less,
        (None, Some(_)) => std::cmp::Ordering::Greater,
        (None, None) => a.member.cmp(&b.member),
    });
    Ok(Fatigue {
        settings: s.clone(),
        vehicle: vehicle.id.clone(),
        members,
    })
}

/// [`evaluate`] building its own factorization.
pub fn evaluate_model(model: &Model) -> Result<Fatigue, FatigueError> {
    // Tension-only members: the influence lines of the dead-load active set
    // (issue 16; they hold while that set does).
    let prepared = if model.has_tension_only() {
        crate::analysis::active_set::dead_prepared(model)
            .map(|(p, _)| p)
            .map_err(LoadError::Analysis)?
    } else {
        Prepared::new(model).map_err(LoadError::Analysis)?
    };
    evaluate(model, &prepared)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ripples_on_a_plateau_are_not_cycles() {
        // 0 → 10 → 10 ± 1e-15 wiggles → 0: one cycle of 10 (by hand), not
        // one of 10 plus ripples that would halve (Δf)eff's cube mean.
        let h = [0.0, 10.0, 10.0 - 1e-14, 10.0, 10.0 - 2e-14, 10.0, 0.0];
        let (cycles, s3) = counted(&h);
        assert_eq!(cycles, vec![(10.0, 1.0)]);
        assert_eq!(s3, 1000.0);
        // A real small cycle stays: 0 → 10 → 9 → 10 → 0 gives 10 and 1.
        let (cycles, _) = counted(&[0.0, 10.0, 9.0, 10.0, 0.0]);
        assert_eq!(cycles, vec![(10.0, 1.0), (1.0, 1.0)]);
    }
}
