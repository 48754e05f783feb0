//! Problems found in a model file, each with the place it was found, so
//! the engineer can go straight to the line.

use std::fmt;

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Severity {
    Error,
    Warning,
}

#[derive(Clone, Debug, PartialEq)]
pub struct Diagnostic {
    pub severity: Severity,
    pub message: String,
    /// 1-based line and column in the model file, when known.
    pub location: Option<(usize, usize)>,
}

impl fmt::Display for Diagnostic {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if let Some((line, col)) = self.location {
            write!(f, "line {line}, column {col}: ")?;
        }
        f.write_str(&self.message)
    }
}

/// All errors found in one model, reported together.
#[derive(Clone, Debug, PartialEq)]
pub struct Diagnostics {
    pub errors: Vec<Diagnostic>,
}

impl fmt::Display for Diagnostics {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let n = self.errors.len();
        for (i, d) in self.errors.iter().enumerate() {
            if i > 0 {
                writeln!(f)?;
            }
            write!(f, "{d}")?;
        }
        if n > 1 {
            write!(f, "\n({n} errors)")?;
        }
        Ok(())
    }
}

/// Finds where a quoted string sits in the source, for messages.
pub struct Locator<'a> {
    text: &'a str,
}

impl<'a> Locator<'a> {
    pub fn new(text: &'a str) -> Self {
        Locator { text }
    }

    /// 1-based line and column of byte offset `pos`.
    pub fn line_col(&self, pos: usize) -> (usize, usize) {
        let before = &self.text[..pos.min(self.text.len())];
        let line = before.matches('\n').count() + 1;
        let col = before.rfind('\n').map_or(pos, |nl| pos - nl - 1) + 1;
        (line, col)
    }

    /// The `nth` (0-based) occurrence of `"value"` after the field `key:`.
    pub fn field(&self, key: &str, value: &str, nth: usize) -> Option<(usize, usize)> {
        let quoted = format!("\"{value}\"");
        let mut count = 0;
        for (pos, _) in self.text.match_indices(&quoted) {
            let before = self.text[..pos].trim_end();
            if let Some(b) = before.strip_suffix(':') {
                if b.trim_end().ends_with(key) {
                    if count == nth {
                        return Some(self.line_col(pos));
                    }
                    count += 1;
                }
            }
        }
        None
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_fields() {
        let text = "(\n  (id: \"A\"),\n  (id:\"A\", node: \"B\"),\n)";
        let loc = Locator::new(text);
        assert_eq!(loc.field("id", "A", 0), Some((2, 8)));
        assert_eq!(loc.field("id", "A", 1), Some((3, 7)));
        assert_eq!(loc.field("node", "B", 0), Some((3, 18)));
        assert_eq!(loc.field("id", "B", 0), None);
    }
}
