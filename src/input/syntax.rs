//! Syntax errors of a RON file told in the file's own words, and as many of
//! them as one reading can find.
//!
//! The RON parser stops at the first error. An unknown field (a typo in a
//! field name, the commonest slip) does not confuse what follows it, so the
//! field and its value are blanked out with spaces (line and column of all
//! else unchanged) and the text is read again, up to [`MAX_SYNTAX_ERRORS`]
//! times. Any other syntax error ends the reading.

use super::diagnostics::{Diagnostic, Diagnostics, Severity};
use serde::de::DeserializeOwned;

/// Unknown fields reported from one file before giving up.
pub const MAX_SYNTAX_ERRORS: usize = 50;

/// The file's word for a schema type: `MemberFile` → `member entry`.
pub fn entry_name(type_name: &str) -> String {
    match type_name {
        "ModelFile" => return "the model (top level)".into(),
        "VehiclesFile" => return "the vehicles file (top level)".into(),
        "SweepFile" => return "the sweep file (top level)".into(),
        "PartFile" => return "part kind".into(),
        _ => {}
    }
    let base = type_name.strip_suffix("File").unwrap_or(type_name);
    let mut words = String::new();
    for (i, c) in base.chars().enumerate() {
        if c.is_uppercase() && i > 0 {
            words.push(' ');
        }
        words.extend(c.to_lowercase());
    }
    format!("{words} entry")
}

fn one_of(expected: &[&str]) -> String {
    let quoted: Vec<String> = expected.iter().map(|e| format!("`{e}`")).collect();
    match quoted.len() {
        0 => "no fields are expected here".into(),
        1 => format!("expected {}", quoted[0]),
        n => format!(
            "expected one of {}, or {}",
            quoted[..n - 1].join(", "),
            quoted[n - 1]
        ),
    }
}

/// The message for a RON error, naming no internal type.
pub fn message(e: &ron::Error) -> String {
    use ron::Error as E;
    let within = |outer: &Option<String>| {
        outer
            .as_deref()
            .map_or(String::new(), |o| format!(" in a {}", entry_name(o)))
    };
    match e {
        E::NoSuchStructField {
            expected,
            found,
            outer,
        } => format!(
            "unknown field `{found}`{}; {}",
            within(outer),
            one_of(expected)
        ),
        E::NoSuchEnumVariant {
            expected,
            found,
            outer,
        } => format!(
            "unknown kind `{found}`{}; {}",
            within(outer),
            one_of(expected).replace("fields", "kinds")
        ),
        E::MissingStructField { field, outer } => {
            format!("missing field `{field}`{}", within(outer))
        }
        E::DuplicateStructField { field, outer } => {
            format!("field `{field}` given twice{}", within(outer))
        }
        other => other.to_string(),
    }
}

/// Read `text` as `T`, reporting every unknown field and then the first
/// other syntax error, each with line and column.
///
/// An unknown field is blanked out and the text read again. When that
/// leaves a required field missing (the typo was in its name), the whole
/// list entry holding it is blanked instead, so the entries after it are
/// still read.
pub fn read<T: DeserializeOwned>(options: &ron::Options, text: &str) -> Result<T, Diagnostics> {
    let mut errors = Vec::new();
    let mut current = text.to_string();
    // The text before the last blanking, and where that field stood.
    let mut last: Option<(String, usize, usize)> = None;
    // Each retry reads the whole text again: few on a very large file.
    let cap = if text.len() > 8 << 20 {
        3
    } else {
        MAX_SYNTAX_ERRORS
    };
    loop {
        let e = match options.from_str::<T>(&current) {
            Ok(v) if errors.is_empty() => return Ok(v),
            Ok(_) => return Err(Diagnostics { errors }),
            Err(e) => e,
        };
        if matches!(e.code, ron::Error::MissingStructField { .. }) {
            if let Some((before, line, col)) = last.take() {
                match blank_entry(&before, line, col) {
                    Some(next) => {
                        current = next;
                        continue;
                    }
                    // The message of the misspelt field lists what is expected.
                    None => return Err(Diagnostics { errors }),
                }
            }
        }
        let pos = e.span.start;
        errors.push(Diagnostic {
            severity: Severity::Error,
            message: format!("syntax: {}", message(&e.code)),
            location: Some((pos.line, pos.col)),
        });
        let again = matches!(e.code, ron::Error::NoSuchStructField { .. }) && errors.len() < cap;
        match again
            .then(|| blank_field(&current, pos.line, pos.col))
            .flatten()
        {
            Some(next) => {
                last = Some((std::mem::replace(&mut current, next), pos.line, pos.col));
            }
            None => return Err(Diagnostics { errors }),
        }
    }
}

/// Byte offset of 1-based `line`, `col` (columns in characters).
fn offset(text: &str, line: usize, col: usize) -> Option<usize> {
    let line_start = if line <= 1 {
        0
    } else {
        text.match_indices('\n').nth(line - 2)?.0 + 1
    };
    Some(
        line_start
            + text[line_start..]
                .char_indices()
                .nth(col.checked_sub(1)?)?
                .0,
    )
}

/// `text[start..end]` replaced by one space per character, newlines kept.
fn blank(text: &str, start: usize, end: usize) -> String {
    let mut out = String::with_capacity(text.len());
    out.push_str(&text[..start]);
    out.extend(
        text[start..end]
            .chars()
            .map(|c| if c == '\n' { '\n' } else { ' ' }),
    );
    out.push_str(&text[end..]);
    out
}

/// `text` with the list entry (a parenthesised struct, with a variant name
/// before it and a comma after) around the field at `line`, `col` blanked;
/// None when that field is not inside an entry of a list.
pub fn blank_entry(text: &str, line: usize, col: usize) -> Option<String> {
    let at = offset(text, line, col)?;
    let b = text.as_bytes();
    // Open brackets from the start up to the field, strings and comments skipped.
    let mut stack: Vec<usize> = Vec::new();
    let mut i = 0;
    while i < at {
        match b[i] {
            b'"' => {
                i += 1;
                while i < b.len() && b[i] != b'"' {
                    i += if b[i] == b'\\' { 2 } else { 1 };
                }
            }
            b'/' if b.get(i + 1) == Some(&b'/') => {
                while i < b.len() && b[i] != b'\n' {
                    i += 1;
                }
                continue;
            }
            b'(' | b'[' | b'{' => stack.push(i),
            b')' | b']' | b'}' => {
                stack.pop();
            }
            _ => {}
        }
        i += 1;
    }
    let open = *stack.last()?;
    let outer = *stack.get(stack.len().checked_sub(2)?)?;
    if b[open] != b'(' || b[outer] != b'[' {
        return None;
    }
    // A variant name just before the parenthesis belongs to the entry.
    let mut start = open;
    while start > 0 && b[start - 1].is_ascii_whitespace() {
        start -= 1;
    }
    let name_end = start;
    while start > 0 && (b[start - 1].is_ascii_alphanumeric() || b[start - 1] == b'_') {
        start -= 1;
    }
    if start == name_end {
        start = open;
    }
    let close = scan(text, open + 1, false)?;
    if b.get(close) != Some(&b')') {
        return None;
    }
    let mut end = close + 1;
    let mut j = end;
    while j < b.len() && b[j].is_ascii_whitespace() {
        j += 1;
    }
    if b.get(j) == Some(&b',') {
        end = j + 1;
    }
    Some(blank(text, start, end))
}

/// `text` with the field `name: value,` starting at 1-based `line`, `col`
/// (columns in characters) replaced by one space per character (newlines
/// kept), or None when the field's extent cannot be found.
pub fn blank_field(text: &str, line: usize, col: usize) -> Option<String> {
    let start = offset(text, line, col)?;
    let end = field_end(text, start)?;
    Some(blank(text, start, end))
}

/// Byte offset just past `name: value` (and a following comma) at `start`.
fn field_end(text: &str, start: usize) -> Option<usize> {
    let b = text.as_bytes();
    let mut i = start;
    while i < b.len() && (b[i].is_ascii_alphanumeric() || b[i] == b'_' || b[i] == b'#') {
        i += 1;
    }
    if i == start {
        return None;
    }
    while i < b.len() && b[i].is_ascii_whitespace() {
        i += 1;
    }
    if b.get(i) != Some(&b':') {
        return None;
    }
    let end = scan(text, i + 1, true)?;
    Some(if b[end] == b',' { end + 1 } else { end })
}

/// Byte offset of the closing bracket at depth 0 from `i` (or of a `,` at
/// depth 0 when `comma`), strings and comments skipped: the end of a value.
fn scan(text: &str, mut i: usize, comma: bool) -> Option<usize> {
    let b = text.as_bytes();
    let mut depth = 0usize;
    while i < b.len() {
        match b[i] {
            b'"' => {
                i += 1;
                while i < b.len() && b[i] != b'"' {
                    i += if b[i] == b'\\' { 2 } else { 1 };
                }
            }
            b'/' if b.get(i + 1) == Some(&b'/') => {
                while i < b.len() && b[i] != b'\n' {
                    i += 1;
                }
                continue;
            }
            b'(' | b'[' | b'{' => depth += 1,
            b')' | b']' | b'}' if depth == 0 => return Some(i),
            b')' | b']' | b'}' => depth -= 1,
            b',' if depth == 0 && comma => return Some(i),
            _ => {}
        }
        i += 1;
    }
    None
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn entry_names_are_the_files_words() {
        assert_eq!(entry_name("MemberFile"), "member entry");
        assert_eq!(entry_name("NodalLoadFile"), "nodal load entry");
    }

    #[test]
    fn blanking_keeps_lines_and_columns() {
        let t = "(a: 1,\n bad: [(x: \"),\"), 2],\n c: 3)";
        let b = blank_field(t, 2, 2).unwrap();
        assert_eq!(b.len(), t.len());
        assert_eq!(b.lines().nth(1).unwrap().trim(), "");
        assert!(b.ends_with(" c: 3)"));
        // The last field, before the closing parenthesis.
        let b = blank_field("(a: 1, z: (1, 2))", 1, 8).unwrap();
        assert_eq!(b, format!("(a: 1, {})", " ".repeat(9)));
    }

    #[test]
    fn blanking_an_entry_keeps_the_rest_of_the_list() {
        let t = "(l: [(a: 1), P(bad: 2, b: \")\"), (c: 3)])";
        let b = blank_entry(t, 1, 16).unwrap();
        assert_eq!(b.len(), t.len());
        assert_eq!(
            b.split_whitespace().collect::<String>(),
            "(l:[(a:1),(c:3)])"
        );
    }
}
