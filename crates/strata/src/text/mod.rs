//! Text measurement, the same on every platform so that the CLI and the
//! browser lay a chart out alike.
//!
//! Provisional: widths by character class, in ems, estimated for a
//! humanist sans-serif (value from memory, not from a font file).

/// The font stack the SVG names.
pub const FONT_FAMILY: &str = "system-ui, -apple-system, 'Segoe UI', Roboto, sans-serif";

/// Advance width in em of one character.
fn advance(c: char) -> f64 {
    match c {
        'i' | 'j' | 'l' | '.' | ',' | ':' | ';' | '\'' | '|' | '!' => 0.26,
        'f' | 't' | 'r' | 'I' | '(' | ')' | '[' | ']' | ' ' | '-' => 0.33,
        'm' | 'w' | 'M' | 'W' => 0.84,
        '0'..='9' => 0.56,
        'A'..='Z' => 0.66,
        '\u{2212}' | '+' | '=' | '<' | '>' => 0.58,
        _ => 0.52,
    }
}

/// Width in pixels of `text` at `size` px; bold text is about 6 % wider.
pub fn width(text: &str, size: f64, bold: bool) -> f64 {
    let em: f64 = text.chars().map(advance).sum();
    em * size * if bold { 1.06 } else { 1.0 }
}

/// Distance from the top of a line box to the baseline, as a fraction of size.
pub const ASCENT: f64 = 0.8;
/// Line height as a multiple of the font size.
pub const LINE_HEIGHT: f64 = 1.25;

/// Break `text` into lines no wider than `max_width` px (greedy, at spaces).
pub fn wrap(text: &str, size: f64, bold: bool, max_width: f64) -> Vec<String> {
    let mut lines = Vec::new();
    let mut cur = String::new();
    for word in text.split_whitespace() {
        let candidate = if cur.is_empty() { word.to_string() } else { format!("{cur} {word}") };
        if !cur.is_empty() && width(&candidate, size, bold) > max_width {
            lines.push(std::mem::take(&mut cur));
            cur = word.to_string();
        } else {
            cur = candidate;
        }
    }
    if !cur.is_empty() {
        lines.push(cur);
    }
    lines
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn wrap_respects_width() {
        let lines = wrap("a fairly long title that must wrap somewhere", 16.0, true, 150.0);
        assert!(lines.len() > 1);
        for l in &lines {
            assert!(width(l, 16.0, true) <= 150.0 || !l.contains(' '));
        }
    }
}
