//! The HTML report's tables and cell formatting, shared by its sections.

pub(super) use super::svg::esc;
use super::table::sig;
use std::fmt::Write;

/// A table under construction: header cells, then rows of (class, cells);
/// a cell is (is_number, already-escaped HTML).
pub(super) struct HTable {
    head: Vec<String>,
    rows: Vec<(String, Vec<(bool, String)>)>,
}

impl HTable {
    pub(super) fn new(head: &[&str]) -> HTable {
        HTable {
            head: head.iter().map(|h| esc(h)).collect(),
            rows: Vec::new(),
        }
    }
    pub(super) fn row(&mut self, class: &str, cells: Vec<(bool, String)>) {
        self.rows.push((class.to_string(), cells));
    }
    pub(super) fn html(&self, out: &mut String) {
        self.head_html(out);
        for (class, cells) in &self.rows {
            row_html(out, class, cells);
        }
        foot_html(out);
    }
    /// The table's opening and header row, for a table whose rows are
    /// written one by one with [`row_html`] (streamed) and closed with
    /// [`foot_html`].
    pub(super) fn head_html(&self, out: &mut String) {
        out.push_str("<div class=\"wide\"><table>\n<thead><tr>");
        for h in &self.head {
            let _ = write!(out, "<th>{h}</th>");
        }
        out.push_str("</tr></thead>\n<tbody>\n");
    }
}

/// One body row.
pub(super) fn row_html(out: &mut String, class: &str, cells: &[(bool, String)]) {
    if class.is_empty() {
        out.push_str("<tr>");
    } else {
        let _ = write!(out, r#"<tr class="{class}">"#);
    }
    for (num, c) in cells {
        if *num {
            let _ = write!(out, r#"<td class="n">{c}</td>"#);
        } else {
            let _ = write!(out, "<td>{c}</td>");
        }
    }
    out.push_str("</tr>\n");
}

/// The end of a table.
pub(super) fn foot_html(out: &mut String) {
    out.push_str("</tbody>\n</table></div>\n");
}

/// Hands the HTML written so far to the output and empties the buffer.
pub(super) type Flush<'a> = dyn FnMut(&mut String) -> std::io::Result<()> + 'a;

pub(super) fn t(s: &str) -> (bool, String) {
    (false, esc(s))
}
pub(super) fn n(v: f64, d: usize) -> (bool, String) {
    (true, esc(&sig(v, d)))
}
pub(super) fn on(v: Option<f64>, d: usize) -> (bool, String) {
    (true, v.map_or("-".into(), |v| esc(&sig(v, d))))
}
