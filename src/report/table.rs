//! Plain-text tables with aligned columns, for terminal reports. On a
//! narrow terminal, columns marked optional are left out (lowest priority
//! first) and a line says which; if the table is still too wide its widest
//! text column is wrapped onto continuation lines, and a line says so; rows can be emphasised (bold, or bold red
//! for over capacity) when the terminal takes colour.

use super::term::{Mark, Term};

/// A table: header row, then data rows; numeric columns right-aligned.
pub struct Table {
    pub headers: Vec<String>,
    pub rows: Vec<Vec<String>>,
    /// Emphasis per row (missing entries: plain).
    pub marks: Vec<Mark>,
    /// Column indices that may be left out to fit, first dropped first.
    pub optional: Vec<usize>,
}

impl Table {
    pub fn new(headers: &[&str]) -> Table {
        Table {
            headers: headers.iter().map(|h| h.to_string()).collect(),
            rows: Vec::new(),
            marks: Vec::new(),
            optional: Vec::new(),
        }
    }

    pub fn row(&mut self, cells: Vec<String>) {
        self.rows.push(cells);
    }

    /// A row with emphasis.
    pub fn row_marked(&mut self, cells: Vec<String>, mark: Mark) {
        self.marks.resize(self.rows.len(), Mark::Plain);
        self.marks.push(mark);
        self.rows.push(cells);
    }

    /// Let the columns with these headers be left out on a narrow
    /// terminal, in this order.
    pub fn optional(&mut self, headers: &[&str]) {
        for h in headers {
            if let Some(i) = self.headers.iter().position(|x| x == h) {
                self.optional.push(i);
            }
        }
    }

    pub fn render(&self) -> String {
        self.render_for(&Term::plain())
    }

    /// Render for `term`: drop optional columns while the table is wider
    /// than the terminal, then emphasise marked rows if colour is on.
    pub fn render_for(&self, term: &Term) -> String {
        let width = self.widths();
        let total = |keep: &[bool]| -> usize {
            let cols: Vec<usize> = (0..width.len()).filter(|&i| keep[i]).collect();
            cols.iter().map(|&i| width[i]).sum::<usize>() + 2 * cols.len().saturating_sub(1)
        };
        let mut keep = vec![true; self.headers.len()];
        let mut dropped = Vec::new();
        if let Some(limit) = term.width {
            for &i in &self.optional {
                if total(&keep) <= limit {
                    break;
                }
                keep[i] = false;
                dropped.push(self.headers[i].clone());
            }
        }
        // Still too wide with every optional column gone: put the headers on
        // two or more lines (a header wider than its column's values is
        // broken at its spaces), then wrap the widest text column.
        let mut headers = self.headers.clone();
        let mut width = width;
        if let Some(limit) = term.width {
            if total_of(&width, &keep) > limit {
                for (i, h) in headers.iter_mut().enumerate() {
                    let longest_word = h.split(' ').map(|w| w.chars().count()).max().unwrap_or(0);
                    let content = self.content_width(i).max(longest_word);
                    if content < width[i] {
                        *h = wrap_text(h, content).join("\n");
                        width[i] = content;
                    }
                }
            }
        }
        let headers_wrapped = headers != self.headers;
        let wrap = match term.width {
            Some(limit) if total_of(&width, &keep) > limit => {
                self.wrap_column(&width, &keep, total_of(&width, &keep) - limit)
            }
            _ => None,
        };
        // Last resort: leave out columns from the right (they are named).
        if let Some(limit) = term.width {
            if let Some((col, w)) = wrap {
                width[col] = w;
            }
            while total_of(&width, &keep) > limit && keep.iter().filter(|k| **k).count() > 1 {
                let Some(i) = (0..keep.len()).rev().find(|&i| keep[i]) else {
                    break;
                };
                keep[i] = false;
                dropped.push(self.headers[i].clone());
            }
        }
        let mut out = if dropped.is_empty() && wrap.is_none() && !headers_wrapped {
            self.render_all(term)
        } else {
            let pick = |v: &Vec<String>| -> Vec<String> {
                v.iter()
                    .enumerate()
                    .filter(|(i, _)| keep.get(*i).copied().unwrap_or(true))
                    .map(|(_, c)| c.clone())
                    .collect()
            };
            let mut narrow = Table {
                headers: pick(&headers),
                rows: self.rows.iter().map(pick).collect(),
                marks: self.marks.clone(),
                optional: Vec::new(),
            };
            if let Some((col, w)) = wrap.filter(|&(col, _)| keep[col]) {
                let kept = keep[..col].iter().filter(|k| **k).count();
                narrow = narrow.wrapped(kept, w);
            }
            narrow.render_all(term)
        };
        let limit = term.width.unwrap_or(0);
        let mut note = |text: String| {
            for l in wrap_text(&text, limit.max(MIN_WRAP)) {
                out.push_str(&l);
                out.push('\n');
            }
        };
        if !dropped.is_empty() {
            note(format!(
                "(left out to fit {limit} columns: {}; widen the terminal, set COLUMNS, or use --format csv)",
                dropped.join(", ")
            ));
        }
        if let Some((col, _)) = wrap.filter(|&(col, _)| keep[col]) {
            note(format!(
                "(column \"{}\" wrapped to fit {limit} columns)",
                self.headers[col]
            ));
        }
        out
    }

    /// The widest kept text column and the width to wrap it to, so the
    /// table loses `excess` characters; None when no text column can give
    /// that much and stay at least [`MIN_WRAP`] wide.
    fn wrap_column(&self, width: &[usize], keep: &[bool], excess: usize) -> Option<(usize, usize)> {
        let text = |i: usize| {
            self.rows.iter().any(|r| {
                r.get(i).is_some_and(|c| {
                    !(c.is_empty()
                        || c == "-"
                        || c.trim_start_matches(['-', '+'])
                            .starts_with(|ch: char| ch.is_ascii_digit()))
                })
            })
        };
        let col = (0..width.len())
            .filter(|&i| keep[i] && text(i))
            .max_by_key(|&i| width[i])?;
        let w = width[col].checked_sub(excess)?;
        (w >= MIN_WRAP).then_some((col, w))
    }

    /// This table with the cells of column `col` wider than `w` broken at
    /// spaces (or anywhere, for a word longer than `w`) onto continuation
    /// rows that are blank in the other columns.
    fn wrapped(&self, col: usize, w: usize) -> Table {
        let mut t = Table {
            headers: self.headers.clone(),
            rows: Vec::new(),
            marks: Vec::new(),
            optional: Vec::new(),
        };
        for (k, r) in self.rows.iter().enumerate() {
            let mark = self.marks.get(k).copied().unwrap_or_default();
            let cell = r.get(col).cloned().unwrap_or_default();
            for (n, piece) in wrap_text(&cell, w).into_iter().enumerate() {
                let mut row = if n == 0 {
                    r.clone()
                } else {
                    vec![String::new(); r.len()]
                };
                if col < row.len() {
                    row[col] = piece;
                }
                t.row_marked(row, mark);
            }
        }
        t.headers[col] = self.headers[col]
            .split('\n')
            .flat_map(|h| wrap_text(h, w))
            .collect::<Vec<_>>()
            .join("\n");
        t
    }

    /// Widest value in column `i` (header left out).
    fn content_width(&self, i: usize) -> usize {
        self.rows
            .iter()
            .filter_map(|r| r.get(i))
            .map(|c| c.chars().count())
            .max()
            .unwrap_or(0)
    }

    fn widths(&self) -> Vec<usize> {
        let n = self.headers.len();
        let mut width: Vec<usize> = self
            .headers
            .iter()
            .map(|h| h.split('\n').map(|l| l.chars().count()).max().unwrap_or(0))
            .collect();
        for r in &self.rows {
            for (i, c) in r.iter().enumerate().take(n) {
                width[i] = width[i].max(c.chars().count());
            }
        }
        width
    }

    fn render_all(&self, term: &Term) -> String {
        let n = self.headers.len();
        let width = self.widths();
        let numeric: Vec<bool> = (0..n)
            .map(|i| {
                self.rows.iter().all(|r| {
                    r.get(i).is_none_or(|c| {
                        c.is_empty()
                            || c == "-"
                            || c.trim_start_matches(['-', '+'])
                                .starts_with(|ch: char| ch.is_ascii_digit())
                    })
                }) && !self.rows.is_empty()
            })
            .collect();
        let mut out = String::new();
        let line = |cells: &[String], out: &mut String| {
            let mut s = String::new();
            for i in 0..n {
                let c = cells.get(i).map(String::as_str).unwrap_or("");
                let pad = width[i] - c.chars().count();
                if i > 0 {
                    s.push_str("  ");
                }
                if numeric[i] {
                    s.push_str(&" ".repeat(pad));
                    s.push_str(c);
                } else {
                    s.push_str(c);
                    s.push_str(&" ".repeat(pad));
                }
            }
            out.push_str(s.trim_end());
            out.push('\n');
        };
        // Headers may run over several lines (split at '\n'), bottom-aligned.
        let depth = self
            .headers
            .iter()
            .map(|h| h.split('\n').count())
            .max()
            .unwrap_or(1);
        for k in 0..depth {
            let cells: Vec<String> = self
                .headers
                .iter()
                .map(|h| {
                    let lines: Vec<&str> = h.split('\n').collect();
                    let skip = depth - lines.len();
                    if k < skip {
                        String::new()
                    } else {
                        lines[k - skip].to_string()
                    }
                })
                .collect();
            line(&cells, &mut out);
        }
        let rule: Vec<String> = width.iter().map(|&w| "-".repeat(w)).collect();
        out.push_str(&rule.join("  "));
        out.push('\n');
        for (k, r) in self.rows.iter().enumerate() {
            let mark = self.marks.get(k).copied().unwrap_or_default();
            if mark == Mark::Plain || !term.colour {
                line(r, &mut out);
            } else {
                let mut one = String::new();
                line(r, &mut one);
                out.push_str(&term.paint(one.trim_end_matches('\n'), mark));
                out.push('\n');
            }
        }
        out
    }
}

/// Width of the kept columns with two spaces between them.
fn total_of(width: &[usize], keep: &[bool]) -> usize {
    let cols: Vec<usize> = (0..width.len()).filter(|&i| keep[i]).collect();
    cols.iter().map(|&i| width[i]).sum::<usize>() + 2 * cols.len().saturating_sub(1)
}

/// A column is never wrapped narrower than this.
pub const MIN_WRAP: usize = 8;

/// `s` in lines of at most `w` characters, broken at spaces where it can.
fn wrap_text(s: &str, w: usize) -> Vec<String> {
    let mut lines = Vec::new();
    let mut cur = String::new();
    for word in s.split(' ') {
        let mut word: Vec<char> = word.chars().collect();
        loop {
            let len = cur.chars().count();
            let sep = usize::from(len > 0);
            if len + sep + word.len() <= w {
                if sep == 1 {
                    cur.push(' ');
                }
                cur.extend(word.iter());
                break;
            }
            if len > 0 {
                lines.push(std::mem::take(&mut cur));
                continue;
            }
            // A word longer than the column: split it.
            let rest = word.split_off(w);
            lines.push(word.iter().collect());
            word = rest;
        }
    }
    if !cur.is_empty() || lines.is_empty() {
        lines.push(cur);
    }
    lines
}

/// A number to about `sig` significant figures, fixed-point when readable.
pub fn sig(v: f64, sig: usize) -> String {
    if !v.is_finite() {
        return "-".into();
    }
    if v == 0.0 {
        return "0".into();
    }
    let mut mag = v.abs().log10().floor() as i32;
    if !(-4..9).contains(&mag) {
        return format!("{:.*e}", sig.saturating_sub(1), v);
    }
    // Round half away from zero, after snapping off round-off below a
    // millionth of the last digit, so that −3.6250 and 3.62500000001 both
    // read 3.63 (the formatter alone rounds ties to even and sees noise).
    let round = |decimals: i32| {
        let k = 10f64.powi(decimals);
        let scaled = v * k;
        let snapped = (scaled * 1e6).round() / 1e6;
        snapped.round() / k
    };
    let mut r = round((sig as i32 - 1 - mag).max(0));
    // 9.9996 to 3 figures is 10.0, not 10.00.
    if r != 0.0 && r.abs().log10().floor() as i32 > mag {
        mag += 1;
        r = round((sig as i32 - 1 - mag).max(0));
    }
    let decimals = (sig as i32 - 1 - mag).max(0) as usize;
    let s = format!("{r:.decimals$}");
    if s.trim_start_matches('-')
        .chars()
        .all(|c| c == '0' || c == '.')
    {
        "0".into()
    } else {
        s
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn formats_and_aligns() {
        assert_eq!(sig(15.1878, 4), "15.19");
        assert_eq!(sig(-0.05921, 3), "-0.0592");
        assert_eq!(sig(1234567.0, 4), "1234567");
        assert_eq!(sig(1e-9, 3), "1.00e-9");
        // Ties round away from zero, whatever the round-off (issue 21, defect 11).
        assert_eq!(sig(-3.625, 3), "-3.63");
        assert_eq!(sig(3.625, 3), "3.63");
        assert_eq!(sig(3.6249999999999, 3), "3.63");
        assert_eq!(sig(9.99999999, 3), "10.0");
        let mut t = Table::new(&["id", "force kip"]);
        t.row(vec!["A".into(), "1.5".into()]);
        t.row(vec!["BB".into(), "-10.25".into()]);
        let s = t.render();
        // Numbers right-aligned under a wider header, text left-aligned.
        assert!(s.contains("\nA         1.5\n"), "{s}");
        assert!(s.contains("\nBB     -10.25\n"), "{s}");
    }

    #[test]
    fn narrow_terminal_drops_optional_columns_and_says_so() {
        let mut t = Table::new(&["member", "detail", "util"]);
        t.row(vec![
            "A".into(),
            "a long column of detail".into(),
            "0.5".into(),
        ]);
        t.row_marked(vec!["B".into(), "x".into(), "1.2".into()], Mark::Fail);
        t.optional(&["detail"]);
        let wide = t.render_for(&Term {
            colour: false,
            width: Some(80),
        });
        assert!(
            wide.contains("detail") && !wide.contains("left out"),
            "{wide}"
        );
        let narrow = t.render_for(&Term {
            colour: false,
            width: Some(20),
        });
        assert!(!narrow.contains("a long column"), "{narrow}");
        assert!(
            narrow
                .replace('\n', " ")
                .contains("left out to fit 20 columns: detail"),
            "{narrow}"
        );
        assert!(
            narrow.lines().take(4).all(|l| l.chars().count() <= 20),
            "{narrow}"
        );
        // Narrower still: the text column wraps, nothing is lost.
        let mut t2 = Table::new(&["member", "case", "util"]);
        t2.row(vec![
            "A".into(),
            "strength-truck (truck max compression)".into(),
            "2.18".into(),
        ]);
        let w = t2.render_for(&Term {
            colour: false,
            width: Some(30),
        });
        assert!(w.lines().all(|l| l.chars().count() <= 30), "{w}");
        let words: Vec<&str> = w.split_whitespace().collect();
        for piece in ["strength-truck", "(truck", "max", "compression)"] {
            assert!(words.contains(&piece), "{w}");
        }
        assert!(
            w.replace('\n', " ")
                .contains("column \"case\" wrapped to fit 30 columns"),
            "{w}"
        );
        assert_eq!(wrap_text("abcdefghij", 4), vec!["abcd", "efgh", "ij"]);
        // Colour only when the terminal takes it; the failing row is red.
        assert!(!narrow.contains('\x1b'));
        let c = t.render_for(&Term {
            colour: true,
            width: None,
        });
        assert!(c.contains("\x1b[1;31mB"), "{c:?}");
    }
}
