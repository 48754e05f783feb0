//! Unit names, their physical dimensions and SI factors.
//!
//! Everything inside panelpoint is SI (m, N, Pa); a model's own units are
//! kept only to read its numbers and to print results back in them.

use std::fmt;

/// The physical dimension a number in the model must have.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Dimension {
    Length,
    Force,
    Stress,
    Area,
    SecondMoment,
    /// Force per unit length (a lane or crowd load).
    ForcePerLength,
    /// Weight density, force per unit volume.
    Density,
    Temperature,
    /// Thermal expansion, per degree.
    PerTemperature,
    Angle,
}

impl Dimension {
    pub fn name(self) -> &'static str {
        match self {
            Dimension::Length => "length",
            Dimension::Force => "force",
            Dimension::Stress => "stress",
            Dimension::Area => "area",
            Dimension::SecondMoment => "second moment of area",
            Dimension::ForcePerLength => "force per length",
            Dimension::Density => "weight density",
            Dimension::Temperature => "temperature difference",
            Dimension::PerTemperature => "thermal expansion coefficient",
            Dimension::Angle => "angle",
        }
    }
}

impl fmt::Display for Dimension {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

/// A unit: its printed name, dimension and factor to SI.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Unit {
    pub name: &'static str,
    pub dimension: Dimension,
    /// Multiply a value in this unit by `to_si` to get SI.
    pub to_si: f64,
}

const FT: f64 = 0.3048;
const INCH: f64 = 0.0254;
const LBF: f64 = 4.448_221_615_260_5;
const KIP: f64 = 1000.0 * LBF;

/// Every unit the model accepts. Exact factors: 1 in = 25.4 mm and
/// 1 lbf = 4.4482216152605 N (international definitions).
const UNITS: &[(&str, Dimension, f64)] = &[
    ("m", Dimension::Length, 1.0),
    ("cm", Dimension::Length, 0.01),
    ("mm", Dimension::Length, 0.001),
    ("ft", Dimension::Length, FT),
    ("in", Dimension::Length, INCH),
    ("N", Dimension::Force, 1.0),
    ("kN", Dimension::Force, 1e3),
    ("MN", Dimension::Force, 1e6),
    ("lbf", Dimension::Force, LBF),
    ("lb", Dimension::Force, LBF),
    ("kip", Dimension::Force, KIP),
    ("kips", Dimension::Force, KIP),
    ("tonf", Dimension::Force, 2000.0 * LBF),
    ("Pa", Dimension::Stress, 1.0),
    ("kPa", Dimension::Stress, 1e3),
    ("MPa", Dimension::Stress, 1e6),
    ("GPa", Dimension::Stress, 1e9),
    ("N/mm2", Dimension::Stress, 1e6),
    ("N/mm^2", Dimension::Stress, 1e6),
    ("N/mm²", Dimension::Stress, 1e6),
    ("psi", Dimension::Stress, LBF / (INCH * INCH)),
    ("ksi", Dimension::Stress, KIP / (INCH * INCH)),
    ("psf", Dimension::Stress, LBF / (FT * FT)),
    ("ksf", Dimension::Stress, KIP / (FT * FT)),
    ("m2", Dimension::Area, 1.0),
    ("cm2", Dimension::Area, 1e-4),
    ("mm2", Dimension::Area, 1e-6),
    ("in2", Dimension::Area, INCH * INCH),
    ("ft2", Dimension::Area, FT * FT),
    ("m4", Dimension::SecondMoment, 1.0),
    ("cm4", Dimension::SecondMoment, 1e-8),
    ("mm4", Dimension::SecondMoment, 1e-12),
    ("in4", Dimension::SecondMoment, INCH * INCH * INCH * INCH),
    ("N/m", Dimension::ForcePerLength, 1.0),
    ("kN/m", Dimension::ForcePerLength, 1e3),
    ("lbf/ft", Dimension::ForcePerLength, LBF / FT),
    ("plf", Dimension::ForcePerLength, LBF / FT),
    ("kip/ft", Dimension::ForcePerLength, KIP / FT),
    ("klf", Dimension::ForcePerLength, KIP / FT),
    ("N/m3", Dimension::Density, 1.0),
    ("kN/m3", Dimension::Density, 1e3),
    ("pcf", Dimension::Density, LBF / (FT * FT * FT)),
    ("lbf/ft3", Dimension::Density, LBF / (FT * FT * FT)),
    ("kip/ft3", Dimension::Density, KIP / (FT * FT * FT)),
    ("kip/in3", Dimension::Density, KIP / (INCH * INCH * INCH)),
    ("C", Dimension::Temperature, 1.0),
    ("degC", Dimension::Temperature, 1.0),
    ("K", Dimension::Temperature, 1.0),
    ("F", Dimension::Temperature, 5.0 / 9.0),
    ("degF", Dimension::Temperature, 5.0 / 9.0),
    ("/C", Dimension::PerTemperature, 1.0),
    ("/K", Dimension::PerTemperature, 1.0),
    ("/F", Dimension::PerTemperature, 9.0 / 5.0),
    ("deg", Dimension::Angle, std::f64::consts::PI / 180.0),
    ("rad", Dimension::Angle, 1.0),
];

/// Normalise spellings (`in^2`, `in²`, `ft³`) before lookup.
fn canonical(name: &str) -> String {
    name.trim()
        .replace("^2", "2")
        .replace("^3", "3")
        .replace("^4", "4")
        .replace('²', "2")
        .replace('³', "3")
        .replace('⁴', "4")
        .replace('°', "deg")
}

/// Look a unit up by name (case-sensitive, as `MPa` and `mPa` differ).
pub fn lookup(name: &str) -> Option<Unit> {
    let name = canonical(name);
    UNITS
        .iter()
        .find(|(n, _, _)| canonical(n) == name)
        .map(|&(n, dimension, to_si)| Unit {
            name: n,
            dimension,
            to_si,
        })
}

/// The unit names of one dimension, for error messages.
pub fn names_of(dimension: Dimension) -> Vec<&'static str> {
    UNITS
        .iter()
        .filter(|(_, d, _)| *d == dimension)
        .map(|(n, _, _)| *n)
        .collect()
}

/// The units a model is written and reported in.
#[derive(Clone, Debug, PartialEq)]
pub struct DisplayUnits {
    /// Geometry: node coordinates and member lengths.
    pub length: Unit,
    /// Forces: loads, member forces, reactions.
    pub force: Unit,
    /// Section properties (area in unit², second moments in unit⁴) and displacements.
    pub section: Unit,
    /// Stresses and moduli.
    pub stress: Unit,
}

impl DisplayUnits {
    /// US customary units of the trade: ft, kip, in, ksi.
    pub fn us() -> Self {
        DisplayUnits {
            length: lookup("ft").unwrap(),
            force: lookup("kip").unwrap(),
            section: lookup("in").unwrap(),
            stress: lookup("ksi").unwrap(),
        }
    }

    /// SI units of the trade: m, kN, mm, MPa.
    pub fn si() -> Self {
        DisplayUnits {
            length: lookup("m").unwrap(),
            force: lookup("kN").unwrap(),
            section: lookup("mm").unwrap(),
            stress: lookup("MPa").unwrap(),
        }
    }

    pub fn area_to_si(&self) -> f64 {
        self.section.to_si * self.section.to_si
    }

    pub fn second_moment_to_si(&self) -> f64 {
        self.area_to_si() * self.area_to_si()
    }

    /// The implied unit a bare number of `dimension` is read in.
    pub fn factor_for(&self, dimension: Dimension) -> f64 {
        match dimension {
            Dimension::Length => self.length.to_si,
            Dimension::Force => self.force.to_si,
            Dimension::Stress => self.stress.to_si,
            Dimension::Area => self.area_to_si(),
            Dimension::SecondMoment => self.second_moment_to_si(),
            Dimension::ForcePerLength => self.force.to_si / self.length.to_si,
            Dimension::Density => self.force.to_si / self.length.to_si.powi(3),
            Dimension::Temperature | Dimension::PerTemperature => 1.0,
            Dimension::Angle => std::f64::consts::PI / 180.0,
        }
    }

    /// Printed name of the implied unit of `dimension`.
    pub fn name_for(&self, dimension: Dimension) -> String {
        match dimension {
            Dimension::Length => self.length.name.to_string(),
            Dimension::Force => self.force.name.to_string(),
            Dimension::Stress => self.stress.name.to_string(),
            Dimension::Area => format!("{}2", self.section.name),
            Dimension::SecondMoment => format!("{}4", self.section.name),
            Dimension::ForcePerLength => format!("{}/{}", self.force.name, self.length.name),
            Dimension::Density => format!("{}/{}3", self.force.name, self.length.name),
            Dimension::Temperature => "deg".to_string(),
            Dimension::PerTemperature => "/deg".to_string(),
            Dimension::Angle => "deg".to_string(),
        }
    }
}

/// A number for a message to a person: four significant digits, no float
/// noise (`0.038099999999999995` → `0.0381`), at least one decimal
/// (`1.0`), exponent form only outside 1e-4 ..= 1e7.
pub fn plain(v: f64) -> String {
    if !v.is_finite() {
        return format!("{v}");
    }
    if v == 0.0 {
        return "0.0".into();
    }
    let a = v.abs();
    if !(1e-4..1e7).contains(&a) {
        return format!("{v:.3e}");
    }
    let digits = (3 - a.log10().floor() as i32).max(0) as usize;
    let s = format!("{v:.digits$}");
    let s = if s.contains('.') {
        s.trim_end_matches('0').to_string()
    } else {
        s
    };
    if let Some(stripped) = s.strip_suffix('.') {
        format!("{stripped}.0")
    } else if s.contains('.') {
        s
    } else {
        format!("{s}.0")
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn plain_numbers_have_no_float_noise() {
        // 1.5 in in metres and back: 0.0381 / 0.0254 carries float noise.
        assert_eq!(plain(0.038099999999999995 / 0.0254), "1.5");
        assert_eq!(plain(1.0), "1.0");
        assert_eq!(plain(0.038099999999999995), "0.0381");
        assert_eq!(plain(-200000.0), "-200000.0");
        assert_eq!(plain(29000.0), "29000.0");
        assert_eq!(plain(1.23456), "1.235");
        assert_eq!(plain(4.0e12), "4.000e12");
    }
    use approx::assert_relative_eq;

    #[test]
    fn exact_international_factors() {
        // 1 in = 25.4 mm exactly; 1 lbf = 4.4482216152605 N exactly (international yard and pound, 1959).
        assert_relative_eq!(lookup("in").unwrap().to_si, 0.0254);
        assert_relative_eq!(lookup("ft").unwrap().to_si, 0.3048);
        // 1 ksi = 6.894757 MPa (to the 7 figures usually printed in conversion tables).
        assert_relative_eq!(
            lookup("ksi").unwrap().to_si / 1e6,
            6.894757,
            max_relative = 1e-7
        );
        // 29,000 ksi ≈ 199.95 GPa: structural steel's modulus in both systems (common practice).
        let e = 29000.0 * lookup("ksi").unwrap().to_si;
        assert!((e / 1e9 - 199.948).abs() < 0.001);
    }

    #[test]
    fn spellings_and_dimensions() {
        assert_eq!(lookup("in^2").unwrap().dimension, Dimension::Area);
        assert_eq!(lookup("mm²").unwrap().dimension, Dimension::Area);
        assert_eq!(lookup("in4").unwrap().dimension, Dimension::SecondMoment);
        assert!(lookup("furlong").is_none());
        assert!(lookup("mpa").is_none());
    }
}
