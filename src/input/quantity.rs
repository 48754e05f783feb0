//! A number as the model file writes it: a bare number in the model's
//! implied unit, or a string with its own unit (`"18 ft"`, `"200 GPa"`).

use crate::units::{self, Dimension};
use serde::de::{self, Deserialize, Deserializer, Visitor};
use std::fmt;

/// A value read from the model, not yet converted.
#[derive(Clone, Debug, PartialEq)]
pub enum Quantity {
    Number(f64),
    Text(String),
}

impl<'de> Deserialize<'de> for Quantity {
    fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        struct V;
        impl<'de> Visitor<'de> for V {
            type Value = Quantity;
            fn expecting(&self, f: &mut fmt::Formatter) -> fmt::Result {
                f.write_str("a number, or a string with a unit such as \"18 ft\"")
            }
            fn visit_f64<E: de::Error>(self, v: f64) -> Result<Quantity, E> {
                Ok(Quantity::Number(v))
            }
            fn visit_i64<E: de::Error>(self, v: i64) -> Result<Quantity, E> {
                Ok(Quantity::Number(v as f64))
            }
            fn visit_u64<E: de::Error>(self, v: u64) -> Result<Quantity, E> {
                Ok(Quantity::Number(v as f64))
            }
            fn visit_i128<E: de::Error>(self, v: i128) -> Result<Quantity, E> {
                Ok(Quantity::Number(v as f64))
            }
            fn visit_u128<E: de::Error>(self, v: u128) -> Result<Quantity, E> {
                Ok(Quantity::Number(v as f64))
            }
            fn visit_str<E: de::Error>(self, v: &str) -> Result<Quantity, E> {
                Ok(Quantity::Text(v.to_string()))
            }
        }
        d.deserialize_any(V)
    }
}

/// Split `"18 ft"`, `"18ft"` or `"-2.5e3 kN/m"` into number and unit text.
fn split(text: &str) -> Option<(f64, &str)> {
    let t = text.trim();
    let bytes = t.as_bytes();
    let mut end = 0;
    while end < bytes.len() {
        let c = bytes[end] as char;
        let exponent = (c == 'e' || c == 'E')
            && end > 0
            && bytes
                .get(end + 1)
                .is_some_and(|&n| (n as char).is_ascii_digit() || n == b'-' || n == b'+');
        if c.is_ascii_digit() || c == '.' || c == '-' || c == '+' || exponent {
            end += 1;
        } else {
            break;
        }
    }
    let number: f64 = t[..end].parse().ok()?;
    Some((number, t[end..].trim()))
}

impl Quantity {
    /// Convert to SI. `implied` is the SI factor of a bare number, and
    /// `implied_name` its unit's name for messages.
    pub fn to_si(&self, dimension: Dimension, implied: f64) -> Result<f64, String> {
        let value = match self {
            Quantity::Number(v) => v * implied,
            Quantity::Text(text) => {
                let (number, unit) = split(text).ok_or_else(|| {
                    format!("\"{text}\" is not a number with a unit (write e.g. \"18 ft\")")
                })?;
                if unit.is_empty() {
                    number * implied
                } else {
                    let u = units::lookup(unit).ok_or_else(|| {
                        format!(
                            "unknown unit \"{unit}\" in \"{text}\" (units of {dimension}: {})",
                            units::names_of(dimension).join(", ")
                        )
                    })?;
                    if u.dimension != dimension {
                        return Err(format!(
                            "\"{text}\" is a {}, but a {dimension} is expected here",
                            u.dimension
                        ));
                    }
                    number * u.to_si
                }
            }
        };
        if !value.is_finite() {
            return Err(format!("{} is not a finite number", self.show()));
        }
        Ok(value)
    }

    /// The value as written, for messages.
    /// As [`Quantity::show`], a bare number with the unit it is read in.
    pub fn show_in(&self, unit: &str) -> String {
        match self {
            Quantity::Number(v) => format!("{v} {unit}"),
            Quantity::Text(t) => format!("\"{t}\""),
        }
    }

    pub fn show(&self) -> String {
        match self {
            Quantity::Number(v) => format!("{v}"),
            Quantity::Text(t) => format!("\"{t}\""),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn splits_numbers_and_units() {
        assert_eq!(split("18 ft"), Some((18.0, "ft")));
        assert_eq!(split("18ft"), Some((18.0, "ft")));
        assert_eq!(split("-2.5e3 kN/m"), Some((-2500.0, "kN/m")));
        assert_eq!(split("5.5 m"), Some((5.5, "m")));
        assert_eq!(split("ft"), None);
    }

    #[test]
    fn converts_and_rejects() {
        let q = Quantity::Text("200 GPa".into());
        assert_eq!(q.to_si(Dimension::Stress, 1.0).unwrap(), 200e9);
        let wrong = Quantity::Text("18 ft".into()).to_si(Dimension::Stress, 1.0);
        assert!(wrong.unwrap_err().contains("length"));
        let unknown = Quantity::Text("3 furlong".into()).to_si(Dimension::Length, 1.0);
        assert!(unknown.unwrap_err().contains("unknown unit"));
        assert!(Quantity::Number(f64::NAN)
            .to_si(Dimension::Length, 1.0)
            .is_err());
        assert!(Quantity::Text("inf m".into())
            .to_si(Dimension::Length, 1.0)
            .is_err());
        assert!(Quantity::Number(1e300)
            .to_si(Dimension::Length, 1e10)
            .is_err());
    }
}
