//! Problems found in a model file, each with the place it was found, so
//! the engineer can go straight to the line.

use std::collections::HashMap;
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

/// Where each `key: "value"` field stands: (key, value) → positions.
type FieldIndex<'a> = HashMap<(&'a str, &'a str), Vec<(usize, usize)>>;

/// Finds where a quoted string sits in the source, for messages.
///
/// The first lookup scans the text once and indexes every `key: "value"`
/// pair, so a file with a hundred thousand bad rows costs one pass, not one
/// pass per message.
pub struct Locator<'a> {
    text: &'a str,
    index: std::cell::OnceCell<FieldIndex<'a>>,
    /// Lookups so far: the first few scan the text directly (ids of
    /// materials and sections sit near the top), so a good model never pays
    /// for the index; only many lookups build it.
    lookups: std::cell::Cell<usize>,
}

/// Lookups answered by a direct scan before the index is built.
const DIRECT_LOOKUPS: usize = 32;

/// Every `key: "value"` in `text` (strings inside comments skipped), with
/// the 1-based line and column of the opening quote, in file order.
fn index_fields(text: &str) -> HashMap<(&str, &str), Vec<(usize, usize)>> {
    let mut map: HashMap<(&str, &str), Vec<(usize, usize)>> = HashMap::new();
    let b = text.as_bytes();
    let (mut i, mut line, mut line_start) = (0usize, 1usize, 0usize);
    while i < b.len() {
        match b[i] {
            b'\n' => {
                line += 1;
                line_start = i + 1;
                i += 1;
            }
            b'/' if b.get(i + 1) == Some(&b'/') => {
                while i < b.len() && b[i] != b'\n' {
                    i += 1;
                }
            }
            b'/' if b.get(i + 1) == Some(&b'*') => {
                i += 2;
                while i < b.len() && !(b[i] == b'*' && b.get(i + 1) == Some(&b'/')) {
                    if b[i] == b'\n' {
                        line += 1;
                        line_start = i + 1;
                    }
                    i += 1;
                }
                i += 2;
            }
            b'"' => {
                let open = i;
                i += 1;
                while i < b.len() && b[i] != b'"' {
                    if b[i] == b'\\' {
                        i += 1;
                    } else if b[i] == b'\n' {
                        line += 1;
                        line_start = i + 1;
                    }
                    i += 1;
                }
                let close = i.min(b.len());
                i += 1;
                // The key: an identifier, then blanks, then ':' just before.
                let before = text[..open].trim_end();
                let Some(before) = before.strip_suffix(':') else {
                    continue;
                };
                let before = before.trim_end();
                let key_start = before
                    .rfind(|c: char| !(c.is_ascii_alphanumeric() || c == '_'))
                    .map_or(0, |p| p + 1);
                let key = &before[key_start..];
                if key.is_empty() || !text.is_char_boundary(open + 1) {
                    continue;
                }
                let value = &text[open + 1..close];
                let col = text[line_start.min(open)..open].chars().count() + 1;
                let at = if line_start <= open {
                    (line, col)
                } else {
                    // A string spanning lines: report where it opened.
                    let l = text[..open].matches('\n').count() + 1;
                    let c = open - text[..open].rfind('\n').map_or(0, |p| p + 1) + 1;
                    (l, c)
                };
                map.entry((key, value)).or_default().push(at);
            }
            _ => i += 1,
        }
    }
    map
}

impl<'a> Locator<'a> {
    pub fn new(text: &'a str) -> Self {
        Locator {
            text,
            index: std::cell::OnceCell::new(),
            lookups: std::cell::Cell::new(0),
        }
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
        let used = self.lookups.get();
        self.lookups.set(used + 1);
        if used < DIRECT_LOOKUPS && self.index.get().is_none() {
            return self.scan(key, value, nth);
        }
        let index = self.index.get_or_init(|| index_fields(self.text));
        index.get(&(key, value)).and_then(|v| v.get(nth)).copied()
    }

    /// The `nth` `key: "value"` by a direct search that stops at the find.
    fn scan(&self, key: &str, value: &str, nth: usize) -> Option<(usize, usize)> {
        let quoted = format!("\"{value}\"");
        let mut count = 0;
        for (pos, _) in self.text.match_indices(&quoted) {
            let before = self.text[..pos].trim_end();
            let Some(b) = before.strip_suffix(':') else {
                continue;
            };
            let b = b.trim_end();
            let start = b
                .rfind(|c: char| !(c.is_ascii_alphanumeric() || c == '_'))
                .map_or(0, |p| p + 1);
            if &b[start..] == key {
                if count == nth {
                    return Some(self.line_col(pos));
                }
                count += 1;
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
        // Past the direct lookups the index answers the same.
        for _ in 0..DIRECT_LOOKUPS {
            loc.field("id", "A", 0);
        }
        assert_eq!(loc.field("id", "A", 1), Some((3, 7)));
        assert_eq!(loc.field("node", "B", 0), Some((3, 18)));
    }
}
