//! The capacity of one member, independent of load: slenderness about both
//! section axes (for the reports), the nominal column strength of the
//! method's curve at the slenderness of the governing buckling mode
//! (`modes`: principal axes, torsional and flexural-torsional buckling,
//! AISC 360-16 §E3/§E4) on the §E7 effective area, the nominal tension
//! strengths on gross and net area, and the resistances a rating method's
//! level makes of them.

use super::RateError;
use crate::capacity::{self, ColumnCheck};
use crate::method::{Method, Resistance};
use crate::model::Model;
use crate::section;

/// The section axis whose slenderness governs.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Axis {
    /// Buckling in the plane of the truss (`i_in`).
    In,
    /// Buckling out of the plane (`i_out`).
    Out,
}

impl Axis {
    pub fn as_str(self) -> &'static str {
        match self {
            Axis::In => "in",
            Axis::Out => "out",
        }
    }
}

#[derive(Clone, Debug, PartialEq)]
pub struct MemberCapacity {
    /// The member's system factor φs (the model's, or 0.90 for a
    /// multiple-eyebar member under lrfr).
    pub phi_s: f64,
    /// K·L/r in and out of plane.
    pub slenderness_in: f64,
    pub slenderness_out: f64,
    /// L/r with K = 1 on the smaller radius, for the tension limit.
    pub slenderness_tension: f64,
    pub axis: Axis,
    /// The column check on the governing axis (stresses in Pa); its
    /// `capacity` is the check-level resistance of the method.
    pub compression: ColumnCapacity,
    /// Check-level tension resistance, N (the method's check factors, and
    /// φc·φs where the method applies them), and the nominal value
    /// min(Fy·Ag, Fu·An·U).
    pub tension_capacity: f64,
    pub tension_nominal: f64,
    /// Nominal gross-section yield Fy·Ag and net-section fracture
    /// Fu·An·U (without Rp), N.
    pub tension_yield_nominal: f64,
    pub tension_fracture_nominal: f64,
    /// Reduction factor for holes Rp (AASHTO LRFD 6.8.2.1): 0.90 punched
    /// full size, 1.0 drilled or reamed.
    pub rp: f64,
    /// Shear-lag factor U used on the net area.
    pub shear_lag: f64,
    /// Which tension limit governs at the check level, and its clause.
    pub tension_governs: &'static str,
    pub tension_clause: &'static str,
    pub fy: f64,
    pub e: f64,
    /// The effect of lacing on slenderness, for built-up laced members.
    pub lacing: Option<LacingEffect>,
    /// Every buckling mode checked, the governing one, and the plate
    /// elements (`rate::modes`); the column check uses the governing mode.
    pub modes: super::modes::CompressionModes,
    /// §E7 effective area at the column check's critical stress.
    pub effective_area: super::modes::EffectiveArea,
    /// §E6.2 checks of the lacing bars, when the lacing describes them.
    pub lacing_bars: Option<super::lacing::LacingBarCheck>,
}

/// AISC 360-16 §E6 for one laced member.
#[derive(Clone, Debug, PartialEq)]
pub struct LacingEffect {
    /// (KL/r)o, the slenderness of the whole section about the laced axis.
    pub overall: f64,
    /// The slenderness used: a member with lacing and tie plates is designed
    /// by §E3/§E4/§E7 with the §E6.2 detailing (§E6.1(b)), so this equals
    /// `overall`; the modified slenderness of Eq. E6-2 (§E6.1(a)) is for
    /// shapes joined by bolts or welds only.
    pub modified: f64,
    /// a/ri of one component between connectors.
    pub component: f64,
    /// §E6.2: K·a/ri within 3/4 of the governing slenderness.
    pub component_ok: bool,
}

#[derive(Clone, Debug, PartialEq)]
pub struct ColumnCapacity {
    pub check: ColumnCheck,
    /// Nominal compressive strength Pn = Fcr·Ag, N.
    pub nominal: f64,
    /// The method's compression clause.
    pub clause: &'static str,
    pub regime: capacity::Regime,
    pub critical_stress: f64,
    pub euler_stress: f64,
    /// Design compression capacity, N.
    pub capacity: f64,
    pub yields_before_buckling: bool,
}

impl MemberCapacity {
    /// The slenderness the column curve is entered with: the governing
    /// buckling mode's (equivalent) slenderness, `π·√(E/Fe)`.
    pub fn slenderness(&self) -> f64 {
        self.modes.slenderness()
    }
    pub fn slenderness_unit_k(&self) -> f64 {
        self.slenderness_tension
    }

    /// Tension resistance with a level's factors (before φc·φs), N, and
    /// which limit governs.
    pub fn tension_at(&self, r: &Resistance) -> (f64, &'static str) {
        let y = r.tension_yield * self.tension_yield_nominal;
        let rp = if r.uses_rp { self.rp } else { 1.0 };
        let f = r.tension_fracture * self.tension_fracture_nominal * rp;
        if f < y {
            (f, "fracture")
        } else {
            (y, "yield")
        }
    }

    /// Compression resistance with a level's factors (before φc·φs), N.
    pub fn compression_at(&self, r: &Resistance) -> f64 {
        r.compression * self.compression.nominal
    }
}

pub fn member_capacity(
    model: &Model,
    m: usize,
    method: &Method,
) -> Result<MemberCapacity, RateError> {
    let mem = &model.members[m];
    let mat = &model.materials[mem.material];
    let sec = &model.sections[mem.section];
    let fy = mat.fy.ok_or_else(|| RateError::NoYield(mat.id.clone()))?;
    let fu = mat.fu.ok_or_else(|| RateError::NoTensile(mat.id.clone()))?;
    let l = model.length(m);
    let (r_in, r_out) = (sec.r_in(), sec.r_out());
    let slenderness_in = mem.k_in * mem.unbraced_in.unwrap_or(l) / r_in;
    let slenderness_out = mem.k_out * mem.unbraced_out.unwrap_or(l) / r_out;
    // Every buckling mode (principal axes, §E4) and the §E7 plate elements.
    let modes = super::modes::compression_modes(model, m)?;
    let kl_r = modes.slenderness();
    // AISC 360-16 §E6.1(b): lacing with tie plates, no modified slenderness;
    // §E6.2: each component between connectors within 3/4 of the governing.
    let lacing = sec
        .built_up
        .as_ref()
        .and_then(|b| b.lacing.as_ref())
        .map(|lc| {
            let overall = if lc.out_of_plane {
                slenderness_out
            } else {
                slenderness_in
            };
            LacingEffect {
                overall,
                modified: overall,
                component: lc.spacing / lc.component_r,
                component_ok: section::component_slenderness_ok(lc.spacing, lc.component_r, kl_r),
            }
        });
    let axis = match modes.governing().kind {
        super::modes::ModeKind::FlexuralIn => Axis::In,
        super::modes::ModeKind::FlexuralOut => Axis::Out,
        _ if slenderness_out > slenderness_in => Axis::Out,
        _ => Axis::In,
    };
    let err = |source| RateError::Capacity {
        member: mem.id.to_string(),
        source,
    };
    let check = capacity::column(&method.curve, fy, mat.e, kl_r).map_err(err)?;
    // §E7, Eq. E7-1: Pn = Fcr·Ae (Ae = Ag when no element is slender).
    let effective_area = modes.effective_area(check.critical_stress);
    // The nominal tension strengths; checked for sign and overflow by the
    // shared tension check (its factors are not used).
    capacity::tension(&method.curve, fy, fu, sec.area, sec.net_area).map_err(err)?;
    let fracture_nominal = fu * sec.net_area * sec.shear_lag;
    let nominal_tension = (fy * sec.area).min(fracture_nominal);
    let rp = if sec.holes_punched.unwrap_or(true) {
        RP_PUNCHED
    } else {
        1.0
    };
    // The check level: the method's check factors and, for LRFR, φc·φs.
    let phi_s = method.member_phi_s(mem.bars);
    let cs = method
        .design_levels
        .first()
        .map_or(1.0, |l| method.condition_system_with(l, phi_s));
    let mut cap = MemberCapacity {
        phi_s,
        slenderness_in,
        slenderness_out,
        slenderness_tension: l / r_in.min(r_out),
        axis,
        compression: ColumnCapacity {
            regime: check.regime,
            critical_stress: check.critical_stress,
            euler_stress: check.euler_stress,
            nominal: check.critical_stress * effective_area.area,
            capacity: 0.0,
            clause: method.check.compression_clause,
            yields_before_buckling: check.yields_before_buckling,
            check,
        },
        tension_capacity: 0.0,
        tension_nominal: nominal_tension,
        tension_yield_nominal: fy * sec.area,
        tension_fracture_nominal: fracture_nominal,
        rp,
        shear_lag: sec.shear_lag,
        tension_governs: "yield",
        tension_clause: method.check.tension_clause,
        fy,
        e: mat.e,
        lacing,
        modes,
        effective_area,
        lacing_bars: None,
    };
    let (t, governs) = cap.tension_at(&method.check);
    cap.tension_capacity = cs * t;
    cap.tension_governs = governs;
    cap.compression.capacity = cs * cap.compression_at(&method.check);
    // §E6.2: the lacing carries 2 % of the member's available strength.
    if let Some(lc) = sec.built_up.as_ref().and_then(|b| b.lacing.as_ref()) {
        if let Some(bars) = &lc.bars {
            cap.lacing_bars = Some(
                super::lacing::lacing_bar_check(
                    lc,
                    bars,
                    cap.compression.capacity,
                    &method.curve,
                    fy,
                    mat.e,
                )
                .map_err(err)?,
            );
        }
    }
    Ok(cap)
}

/// AASHTO LRFD 6.8.2.1: Rp = 0.90 for holes punched full size (from memory).
pub const RP_PUNCHED: f64 = 0.90;
