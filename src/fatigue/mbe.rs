//! Fatigue life of a steel detail by AASHTO's Manual for Bridge Evaluation
//! (MBE), Section 7, on the detail categories of AASHTO LRFD Bridge Design
//! Specifications Art. 6.6.1.2.
//!
//! Every constant here is from memory of the editions named beside it and
//! is overridable through [`MbeParameters`]; editions differ.
//!
//! - Detail constants A (Table 6.6.1.2.5-1) and constant-amplitude
//!   thresholds (ΔF)TH (Table 6.6.1.2.5-3), LRFD 7th edition (2014), from
//!   memory: see [`Category::constants`].
//! - Infinite life (MBE 2nd edition, 2011, §7.2.4, from memory):
//!   (Δf)max = 2.0·(Δf)eff ≤ (ΔF)TH, the factor 2.0 being the ratio of the
//!   largest stress range to the effective one assumed there.
//! - Finite life (MBE §7.2.5.1, Eq. 7.2.5.1-1, from memory):
//!   Y = R_R·A / [365·n·(ADTT)SL·((Δf)eff)³], years, with n the cycles per
//!   truck passage and (ADTT)SL the single-lane average daily truck traffic;
//!   (Δf)eff = R_s·γ·Δf (§7.2.2: R_s the stress-range estimate factor, γ a
//!   fatigue load factor; both default 1.0 here, which never lowers a
//!   stress range).
//! - Resistance factors R_R (MBE Table 7.2.5.2-1, from memory): 1.0 at the
//!   minimum life; per category at the evaluation and mean lives, see
//!   [`Category::rr`].
//! - Remaining life with traffic growth: see [`total_life`].

/// The ksi in Pa (exact by the definition of the pound and the inch).
pub const KSI: f64 = 6.894_757_293_168_361e6;

/// An AASHTO LRFD detail category.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Category {
    A,
    B,
    BPrime,
    C,
    CPrime,
    D,
    E,
    EPrime,
}

impl Category {
    pub const ALL: [Category; 8] = [
        Category::A,
        Category::B,
        Category::BPrime,
        Category::C,
        Category::CPrime,
        Category::D,
        Category::E,
        Category::EPrime,
    ];

    /// "A", "B", "B'", "C", "C'", "D", "E", "E'".
    pub fn name(self) -> &'static str {
        match self {
            Category::A => "A",
            Category::B => "B",
            Category::BPrime => "B'",
            Category::C => "C",
            Category::CPrime => "C'",
            Category::D => "D",
            Category::E => "E",
            Category::EPrime => "E'",
        }
    }

    /// The category named `s` (prime written ' or ′, case-insensitive).
    pub fn from_name(s: &str) -> Option<Category> {
        let t = s.trim().replace('′', "'").to_ascii_uppercase();
        Category::ALL.into_iter().find(|c| c.name() == t)
    }

    /// (A in ksi³, (ΔF)TH in ksi): AASHTO LRFD Tables 6.6.1.2.5-1 and
    /// 6.6.1.2.5-3 (7th edition, 2014; from memory).
    pub fn constants(self) -> (f64, f64) {
        match self {
            Category::A => (250.0e8, 24.0),
            Category::B => (120.0e8, 16.0),
            Category::BPrime => (61.0e8, 12.0),
            Category::C => (44.0e8, 10.0),
            Category::CPrime => (44.0e8, 12.0),
            Category::D => (22.0e8, 7.0),
            Category::E => (11.0e8, 4.5),
            Category::EPrime => (3.9e8, 2.6),
        }
    }

    /// (R_R evaluation, R_R mean): MBE 2nd edition Table 7.2.5.2-1 (from
    /// memory); the minimum life takes R_R = 1.0 throughout. C′ is not
    /// recalled with certainty (possibly 1.4 and 2.0): C's lower values are
    /// taken, which can only shorten the lives.
    pub fn rr(self) -> (f64, f64) {
        match self {
            Category::A => (1.7, 2.8),
            Category::B => (1.4, 2.0),
            Category::BPrime => (1.5, 2.4),
            Category::C | Category::CPrime => (1.2, 1.3),
            Category::D | Category::E => (1.3, 1.6),
            Category::EPrime => (1.6, 2.0),
        }
    }
}

/// Overridable MBE parameters; `Default` gives the values stated in the
/// module documentation (from memory).
#[derive(Clone, Debug, PartialEq)]
pub struct MbeParameters {
    /// (Δf)max / (Δf)eff in the infinite-life check (2.0).
    pub infinite_factor: f64,
    /// Stress-range estimate factor R_s (1.0).
    pub rs: f64,
    /// Fatigue load factor γ on the calculated range (1.0).
    pub load_factor: f64,
    /// R_R at the minimum life (1.0).
    pub rr_minimum: f64,
    /// R_R at the evaluation and mean lives, replacing the per-category
    /// values of [`Category::rr`] when set.
    pub rr_evaluation: Option<f64>,
    pub rr_mean: Option<f64>,
    /// (A in ksi³, (ΔF)TH in ksi) per category, replacing the table's.
    pub constants: Vec<(Category, f64, f64)>,
}

impl Default for MbeParameters {
    fn default() -> Self {
        MbeParameters {
            infinite_factor: 2.0,
            rs: 1.0,
            load_factor: 1.0,
            rr_minimum: 1.0,
            rr_evaluation: None,
            rr_mean: None,
            constants: Vec::new(),
        }
    }
}

impl MbeParameters {
    /// (A, (ΔF)TH) of `c` in SI: Pa³ and Pa.
    pub fn constants_si(&self, c: Category) -> (f64, f64) {
        let (a, th) = self
            .constants
            .iter()
            .find(|o| o.0 == c)
            .map_or(c.constants(), |o| (o.1, o.2));
        (a * KSI.powi(3), th * KSI)
    }

    /// R_R at the minimum, evaluation and mean levels for `c`.
    pub fn rr(&self, c: Category) -> [f64; 3] {
        let (e, m) = c.rr();
        [
            self.rr_minimum,
            self.rr_evaluation.unwrap_or(e),
            self.rr_mean.unwrap_or(m),
        ]
    }
}

/// One detail's MBE Section 7 result. Lives in years; `None` is infinite.
#[derive(Clone, Debug, PartialEq)]
pub struct MbeLife {
    /// (Δf)eff = R_s·γ·(calculated effective range), Pa.
    pub effective_range: f64,
    /// (Δf)max = infinite_factor·(Δf)eff, Pa.
    pub max_range: f64,
    /// (ΔF)TH, Pa.
    pub threshold: f64,
    /// A, Pa³.
    pub a: f64,
    /// R_R at the three levels.
    pub rr: [f64; 3],
    /// Total finite life at the minimum, evaluation and mean levels
    /// (years from opening; at constant present traffic when g = 0).
    pub life: [Option<f64>; 3],
    /// Remaining life at the three levels (life − present age; negative
    /// when the calculated life is spent).
    pub remaining: [Option<f64>; 3],
}

/// Traffic of a detail's evaluation.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Traffic {
    /// Present single-lane average daily truck traffic, (ADTT)SL.
    pub adtt: f64,
    /// Present age of the bridge, years.
    pub age: f64,
    /// Yearly traffic growth rate g (0.02 = 2 % a year).
    pub growth: f64,
}

/// Finite life at constant traffic, MBE Eq. 7.2.5.1-1:
/// Y = R_R·A / [365·n·(ADTT)SL·((Δf)eff)³] (years; A in Pa³, range in Pa,
/// or any consistent pair of units).
pub fn finite_life(rr: f64, a: f64, n: f64, adtt: f64, range: f64) -> f64 {
    rr * a / (365.0 * n * adtt * range.powi(3))
}

/// Total life in years from opening when the detail's finite life at the
/// constant present traffic is `y` years and traffic grows by g a year.
///
/// Trucks in year k (k = 0 the first year) are T₁·(1+g)^k with the
/// present year's T₀ = T₁·(1+g)^a (a the present age), the same growth
/// assumed before and after today. The detail's capacity is T₀·y trucks;
/// the geometric sum gives T₁·((1+g)^t − 1)/g = T₀·y, so
/// t = ln(1 + g·y·(1+g)^a) / ln(1+g), and t = y when g = 0.
/// For g < 0 the traffic dies away: when 1 + g·y·(1+g)^a ≤ 0 the detail
/// never reaches its capacity (None, infinite).
pub fn total_life(y: f64, traffic: &Traffic) -> Option<f64> {
    let g = traffic.growth;
    if g == 0.0 {
        return Some(y);
    }
    let arg = 1.0 + g * y * (1.0 + g).powf(traffic.age);
    if arg <= 0.0 {
        return None;
    }
    Some(arg.ln() / (1.0 + g).ln())
}

/// MBE Section 7 evaluation of one detail of category `c` under `n`
/// cycles per passage of calculated effective range `range` (Pa, with the
/// dynamic allowance already in it).
pub fn evaluate(c: Category, p: &MbeParameters, range: f64, n: f64, traffic: &Traffic) -> MbeLife {
    let (a, threshold) = p.constants_si(c);
    let eff = p.rs * p.load_factor * range;
    let max_range = p.infinite_factor * eff;
    let rr = p.rr(c);
    let infinite = max_range <= threshold || n <= 0.0 || eff <= 0.0;
    let mut life = [None; 3];
    let mut remaining = [None; 3];
    if !infinite {
        for k in 0..3 {
            let y = finite_life(rr[k], a, n, traffic.adtt, eff);
            life[k] = total_life(y, traffic);
            remaining[k] = life[k].map(|t| t - traffic.age);
        }
    }
    MbeLife {
        effective_range: eff,
        max_range,
        threshold,
        a,
        rr,
        life,
        remaining,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn traffic(age: f64, growth: f64) -> Traffic {
        Traffic {
            adtt: 500.0,
            age,
            growth,
        }
    }

    #[test]
    fn finite_life_category_d_by_hand() {
        // By hand: Y = 1.0·22·10⁸ / (365·1·500·4.5³)
        //            = 22·10⁸ / (182 500·91.125) = 132.29 years.
        let y = finite_life(1.0, 22.0e8, 1.0, 500.0, 4.5);
        assert!((y - 132.29).abs() < 0.01, "{y}");
        // The same through the evaluation in SI (units cancel).
        let r = evaluate(
            Category::D,
            &MbeParameters::default(),
            4.5 * KSI,
            1.0,
            &traffic(80.0, 0.0),
        );
        let min = r.life[0].unwrap();
        assert!((min - 132.29).abs() < 0.01, "{min}");
        assert!((r.remaining[0].unwrap() - 52.29).abs() < 0.01);
        // Evaluation and mean lives scale with R_R (1.3 and 1.6 for D, MBE
        // Table 7.2.5.2-1 from memory): 171.98 and 211.67 years.
        assert!((r.life[1].unwrap() - 1.3 * 132.29).abs() < 0.02);
        assert!((r.life[2].unwrap() - 1.6 * 132.29).abs() < 0.02);
        // (Δf)max = 9.0 ksi > (ΔF)TH = 7 ksi: finite.
        assert!((r.max_range / KSI - 9.0).abs() < 1e-12);
    }

    #[test]
    fn infinite_life_branch() {
        // Category D, (ΔF)TH = 7 ksi (LRFD Table 6.6.1.2.5-3, from memory):
        // 2·3.5 = 7.0 ≤ 7.0 → infinite; 2·3.51 = 7.02 > 7 → finite.
        let p = MbeParameters::default();
        let r = evaluate(Category::D, &p, 3.5 * KSI, 1.0, &traffic(80.0, 0.0));
        assert_eq!(r.life, [None; 3]);
        assert_eq!(r.remaining, [None; 3]);
        let r = evaluate(Category::D, &p, 3.51 * KSI, 1.0, &traffic(80.0, 0.0));
        assert!(r.life.iter().all(|l| l.is_some()));
        // Category A's threshold 24 ksi: 2·11.9 = 23.8 → infinite.
        let r = evaluate(Category::A, &p, 11.9 * KSI, 1.0, &traffic(80.0, 0.0));
        assert_eq!(r.life, [None; 3]);
    }

    #[test]
    fn overrides_replace_constants_and_factors() {
        let p = MbeParameters {
            rr_evaluation: Some(1.0),
            constants: vec![(Category::D, 11.0e8, 7.0)],
            ..Default::default()
        };
        let r = evaluate(Category::D, &p, 4.5 * KSI, 1.0, &traffic(0.0, 0.0));
        // Half of A: 132.29 / 2 = 66.14 years at both levels.
        assert!((r.life[0].unwrap() - 66.145).abs() < 0.01);
        assert!((r.life[1].unwrap() - 66.145).abs() < 0.01);
    }

    #[test]
    fn growth_closed_form_by_hand() {
        // g = 2 %, a = 20, y = 100 at present traffic. Geometric sum by
        // hand: (1.02)^t = 1 + 0.02·100·1.02^20 = 1 + 2·1.485947 = 3.971895,
        // t = ln 3.971895 / ln 1.02 = 1.379242 / 0.0198026 = 69.65 years.
        let t = total_life(100.0, &traffic(20.0, 0.02)).unwrap();
        assert!((t - 69.65).abs() < 0.01, "{t}");
        // Check by summing the traffic year by year: 69 whole years carry
        // less than the capacity, 70 more (capacity 100 present-years).
        let year = |k: i32| 1.02f64.powi(k - 20);
        let sum = |n: i32| (0..n).map(year).sum::<f64>();
        assert!(sum(69) < 100.0 && sum(70) > 100.0);
        assert_eq!(total_life(100.0, &traffic(20.0, 0.0)), Some(100.0));
        // Dying traffic never reaching the capacity.
        assert_eq!(total_life(100.0, &traffic(0.0, -0.05)), None);
    }

    #[test]
    fn names_round_trip() {
        for c in Category::ALL {
            assert_eq!(Category::from_name(c.name()), Some(c));
        }
        assert_eq!(Category::from_name("e′"), Some(Category::EPrime));
        assert_eq!(Category::from_name("F"), None);
    }
}
