//! Characters that must not reach a terminal, an HTML page or an SVG
//! drawing from a user's file (issue 22, item 14): C0/C1 control characters
//! (ESC starts terminal escape sequences, BEL rings, NUL and CR hide text)
//! and the Unicode bidirectional formatting characters, which reorder how a
//! line is displayed ("Trojan Source", CVE-2021-42574): U+061C, U+200E,
//! U+200F, U+202A–U+202E, U+2066–U+2069. Ids, vehicle and moving-load ids
//! and sweep names holding one are refused; free text (the title) has them
//! removed, with a warning.

/// True for a control or bidirectional formatting character.
pub fn unsafe_char(c: char) -> bool {
    c.is_control()
        || matches!(
            c,
            '\u{061C}' | '\u{200E}' | '\u{200F}' | '\u{202A}'..='\u{202E}' | '\u{2066}'..='\u{2069}'
        )
}

/// True when `s` holds a character of [`unsafe_char`].
pub fn has_unsafe(s: &str) -> bool {
    s.chars().any(unsafe_char)
}

/// `s` without the characters of [`unsafe_char`] (tabs and line breaks
/// become spaces, so words stay apart).
pub fn strip(s: &str) -> String {
    s.chars()
        .filter_map(|c| match c {
            '\t' | '\n' | '\r' => Some(' '),
            c if unsafe_char(c) => None,
            c => Some(c),
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn controls_and_bidi_are_caught_and_stripped() {
        for c in [
            '\u{1b}', '\u{7}', '\0', '\r', '\u{85}', '\u{202E}', '\u{2067}', '\u{200F}',
        ] {
            assert!(unsafe_char(c), "{:?}", c);
        }
        for c in ['a', 'Ω', '✓', ' ', '"', '\u{00E9}'] {
            assert!(!unsafe_char(c), "{:?}", c);
        }
        assert_eq!(
            strip("Mill\u{1b}[31mrace\u{202E}\tbridge\u{7}"),
            "Mill[31mrace bridge"
        );
    }
}
