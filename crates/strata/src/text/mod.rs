//! Text measurement, the same on every platform so that the CLI and the
//! browser lay a chart out alike: the advance widths of the bundled font,
//! Atkinson Hyperlegible Next 2.001 (fonts/, SIL OFL 1.1), generated into `widths.rs` by
//! `tests/reference/gen/font_metrics.py`. Kerning is not applied; Chromium's
//! measurements of the same strings agree to a tenth of a pixel (test below).

pub mod case;
mod case_table;
pub mod place;
pub mod widths;

use widths::{ADVANCES, CAP_HEIGHT, UNITS_PER_EM};

/// The font stack the SVG names: the bundled font first.
pub const FONT_FAMILY: &str = "Atkinson Hyperlegible Next, Segoe UI, Helvetica Neue, Arial, sans-serif";

/// The family name of the bundled font.
pub const BUNDLED_FAMILY: &str = "Atkinson Hyperlegible Next";

/// Line height as a multiple of the font size.
pub const LINE_HEIGHT: f64 = 1.25;
/// Cap height as a fraction of the font size (OS/2 sCapHeight).
pub const CAP: f64 = CAP_HEIGHT / UNITS_PER_EM;
/// Distance from the top of a line box to the baseline, as a fraction of
/// size: capitals sit centred in the line box.
pub const ASCENT: f64 = (LINE_HEIGHT + CAP) / 2.0;

fn lookup(c: char) -> Option<(u16, u16)> {
    let cp = c as u32;
    ADVANCES.binary_search_by_key(&cp, |r| r.0).ok().map(|i| (ADVANCES[i].1, ADVANCES[i].2))
}

/// Advance width in em of one character.
pub fn advance(c: char, bold: bool) -> f64 {
    let pick = |(r, b): (u16, u16)| if bold { b } else { r } as f64 / UNITS_PER_EM;
    if let Some(a) = lookup(c) {
        return pick(a);
    }
    match c {
        // Narrow no-break space (French grouping): not in the font; as a thin space.
        '\u{202f}' => lookup('\u{2009}').map(pick).unwrap_or(0.2),
        // Zero-width characters.
        '\u{200b}'..='\u{200d}' | '\u{2060}' | '\u{feff}' => 0.0,
        // Wide scripts (CJK, Hangul, full-width forms) take about an em.
        '\u{1100}'..='\u{115f}' | '\u{2e80}'..='\u{a4cf}' | '\u{ac00}'..='\u{d7a3}' | '\u{f900}'..='\u{faff}' | '\u{ff00}'..='\u{ff60}' => 1.0,
        // Anything else: the width of a lower-case 'o'.
        _ => lookup('o').map(pick).unwrap_or(0.55),
    }
}

/// A column name as a reader would write it, for a legend's title: `_` as
/// spaces, the first letter capitalised (`harbour_kg` -> `Harbour kg`).
pub fn readable_name(name: &str) -> String {
    let spaced = name.replace('_', " ");
    let words: Vec<&str> = spaced.split_whitespace().collect();
    let joined = crate::join(&words, " ");
    case::capitalise_first(&joined)
}

/// Width in pixels of `text` at `size` px.
pub fn width(text: &str, size: f64, bold: bool) -> f64 {
    let em: f64 = text.chars().map(|c| advance(c, bold)).sum();
    em * size
}

/// Break `text` into lines no wider than `max_width` px: greedy at spaces;
/// a word wider than the line is cut between characters.
pub fn wrap(text: &str, size: f64, bold: bool, max_width: f64) -> Vec<String> {
    let mut lines = Vec::new();
    let mut cur = String::new();
    for word in text.split_whitespace() {
        let candidate = if cur.is_empty() { word.to_string() } else { format!("{cur} {word}") };
        if width(&candidate, size, bold) <= max_width {
            cur = candidate;
            continue;
        }
        if !cur.is_empty() {
            lines.push(std::mem::take(&mut cur));
        }
        if width(word, size, bold) <= max_width {
            cur = word.to_string();
            continue;
        }
        // Cut an over-long word.
        for ch in word.chars() {
            let mut next = cur.clone();
            next.push(ch);
            if !cur.is_empty() && width(&next, size, bold) > max_width {
                lines.push(std::mem::take(&mut cur));
                cur.push(ch);
            } else {
                cur = next;
            }
        }
    }
    if !cur.is_empty() {
        lines.push(cur);
    }
    lines
}

/// `text`, cut with an ellipsis so that it fits `max_width` px.
pub fn fit(text: &str, size: f64, bold: bool, max_width: f64) -> String {
    if width(text, size, bold) <= max_width {
        return text.to_string();
    }
    let ell = width("\u{2026}", size, bold);
    let mut out = String::new();
    let mut w = 0.0;
    for c in text.chars() {
        let a = advance(c, bold) * size;
        if w + a + ell > max_width {
            break;
        }
        out.push(c);
        w += a;
    }
    let mut out = out.trim_end().to_string();
    out.push('\u{2026}');
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[derive(serde::Deserialize)]
    struct Case {
        text: String,
        weight: String,
        units: f64,
        units_per_em: f64,
    }
    #[derive(serde::Deserialize)]
    struct Fixture {
        cases: Vec<Case>,
    }

    /// Sums of hmtx advances read by fontTools 4.68.0 from the bundled font
    /// files (tests/reference/gen/font_metrics.py).
    #[test]
    fn widths_match_the_font_files() {
        let f: Fixture = serde_json::from_str(include_str!("../../../../tests/reference/fixtures/format/text_widths.json")).unwrap();
        assert_eq!(f.cases.len(), 16);
        for c in &f.cases {
            let got = width(&c.text, c.units_per_em, c.weight == "bold");
            assert!((got - c.units).abs() < 1e-9, "{:?} {}: {got} vs {}", c.text, c.weight, c.units);
        }
    }

    #[derive(serde::Deserialize)]
    struct BrowserCase {
        text: String,
        weight: String,
        size: f64,
        width: f64,
    }
    #[derive(serde::Deserialize)]
    struct BrowserFixture {
        loaded: bool,
        cases: Vec<BrowserCase>,
    }

    /// Debian Chromium's canvas measureText with the bundled font loaded
    /// and kerning off, as the SVG (`font-kerning="none"`) and the theme
    /// sheet ask (tests/reference/gen/browser_widths.sh): the tolerance is a
    /// tenth of a pixel.
    #[test]
    fn widths_match_a_browser() {
        let f: BrowserFixture = serde_json::from_str(include_str!("../../../../tests/reference/fixtures/format/browser_widths.json")).unwrap();
        assert!(f.loaded, "the browser did not load the font when the fixture was made");
        assert_eq!(f.cases.len(), 20);
        for c in &f.cases {
            let ours = width(&c.text, c.size, c.weight == "bold");
            assert!((ours - c.width).abs() <= 0.1, "{:?} {} {}px: ours {ours}, browser {}", c.text, c.weight, c.size, c.width);
        }
    }

    #[test]
    fn readable_names() {
        assert_eq!(readable_name("harbour_kg"), "Harbour kg");
        assert_eq!(readable_name("speed"), "Speed");
        assert_eq!(readable_name("__a__b"), "A b");
        assert_eq!(readable_name("été_moyen"), "Été moyen");
        assert_eq!(readable_name(""), "");
    }

    #[test]
    fn wrap_respects_width() {
        let lines = wrap("a fairly long title that must wrap somewhere", 16.0, true, 150.0);
        assert!(lines.len() > 1);
        for l in &lines {
            assert!(width(l, 16.0, true) <= 150.0);
        }
        assert_eq!(lines.join(" "), "a fairly long title that must wrap somewhere");
        let cut = wrap("Supercalifragilistic", 16.0, false, 60.0);
        assert!(cut.len() > 1 && cut.iter().all(|l| width(l, 16.0, false) <= 60.0));
    }

    #[test]
    fn fit_adds_an_ellipsis() {
        let s = fit("Northern lighthouse gate", 12.0, false, 60.0);
        assert!(s.ends_with('\u{2026}') && width(&s, 12.0, false) <= 60.0);
        assert_eq!(fit("Cox", 12.0, false, 60.0), "Cox");
    }
}
