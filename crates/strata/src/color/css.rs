//! A syntax check for colours written in a spec: CSS Color Module Level 4
//! (W3C), the forms a page author writes by hand. A colour from the spec is
//! written into SVG attributes, so anything else (`url(...)`, which makes a
//! reader's browser call another host, `expression(...)`, stray quotes) is
//! refused before it reaches output.
//!
//! Accepted: the named colours of CSS Color 4 §6.1, `transparent`,
//! `currentColor`; hex `#rgb`, `#rgba`, `#rrggbb`, `#rrggbbaa` (§5.2); and
//! `rgb()`, `rgba()`, `hsl()`, `hsla()` in their legacy comma form and their
//! modern space form, `hwb()`, `lab()`, `lch()`, `oklab()`, `oklch()` (§5.1,
//! §7, §8, §9), with numbers, percentages, angles (deg, grad, rad, turn) where
//! a hue goes, `none` in the modern forms, and an alpha after `/`.

/// CSS Color 4 §6.1 named colours (lower case).
pub const NAMED: [&str; 148] = [
    "aliceblue",
    "antiquewhite",
    "aqua",
    "aquamarine",
    "azure",
    "beige",
    "bisque",
    "black",
    "blanchedalmond",
    "blue",
    "blueviolet",
    "brown",
    "burlywood",
    "cadetblue",
    "chartreuse",
    "chocolate",
    "coral",
    "cornflowerblue",
    "cornsilk",
    "crimson",
    "cyan",
    "darkblue",
    "darkcyan",
    "darkgoldenrod",
    "darkgray",
    "darkgreen",
    "darkgrey",
    "darkkhaki",
    "darkmagenta",
    "darkolivegreen",
    "darkorange",
    "darkorchid",
    "darkred",
    "darksalmon",
    "darkseagreen",
    "darkslateblue",
    "darkslategray",
    "darkslategrey",
    "darkturquoise",
    "darkviolet",
    "deeppink",
    "deepskyblue",
    "dimgray",
    "dimgrey",
    "dodgerblue",
    "firebrick",
    "floralwhite",
    "forestgreen",
    "fuchsia",
    "gainsboro",
    "ghostwhite",
    "gold",
    "goldenrod",
    "gray",
    "green",
    "greenyellow",
    "grey",
    "honeydew",
    "hotpink",
    "indianred",
    "indigo",
    "ivory",
    "khaki",
    "lavender",
    "lavenderblush",
    "lawngreen",
    "lemonchiffon",
    "lightblue",
    "lightcoral",
    "lightcyan",
    "lightgoldenrodyellow",
    "lightgray",
    "lightgreen",
    "lightgrey",
    "lightpink",
    "lightsalmon",
    "lightseagreen",
    "lightskyblue",
    "lightslategray",
    "lightslategrey",
    "lightsteelblue",
    "lightyellow",
    "lime",
    "limegreen",
    "linen",
    "magenta",
    "maroon",
    "mediumaquamarine",
    "mediumblue",
    "mediumorchid",
    "mediumpurple",
    "mediumseagreen",
    "mediumslateblue",
    "mediumspringgreen",
    "mediumturquoise",
    "mediumvioletred",
    "midnightblue",
    "mintcream",
    "mistyrose",
    "moccasin",
    "navajowhite",
    "navy",
    "oldlace",
    "olive",
    "olivedrab",
    "orange",
    "orangered",
    "orchid",
    "palegoldenrod",
    "palegreen",
    "paleturquoise",
    "palevioletred",
    "papayawhip",
    "peachpuff",
    "peru",
    "pink",
    "plum",
    "powderblue",
    "purple",
    "rebeccapurple",
    "red",
    "rosybrown",
    "royalblue",
    "saddlebrown",
    "salmon",
    "sandybrown",
    "seagreen",
    "seashell",
    "sienna",
    "silver",
    "skyblue",
    "slateblue",
    "slategray",
    "slategrey",
    "snow",
    "springgreen",
    "steelblue",
    "tan",
    "teal",
    "thistle",
    "tomato",
    "turquoise",
    "violet",
    "wheat",
    "white",
    "whitesmoke",
    "yellow",
    "yellowgreen",
];

/// The longest colour text looked at; real colours are far shorter.
pub const MAX_COLOR_CHARS: usize = 100;

/// Whether `s` is a CSS Color 4 colour in one of the accepted forms.
pub fn is_css_color(s: &str) -> bool {
    check(s).is_ok()
}

/// Check a colour; the error says what is wrong in a few words.
pub fn check(s: &str) -> Result<(), &'static str> {
    if s.len() > MAX_COLOR_CHARS {
        return Err("it is too long to be a colour");
    }
    let t = s.trim();
    if t.is_empty() {
        return Err("it is empty");
    }
    if let Some(hex) = t.strip_prefix('#') {
        return if matches!(hex.len(), 3 | 4 | 6 | 8) && hex.bytes().all(|b| b.is_ascii_hexdigit()) {
            Ok(())
        } else {
            Err("a hex colour has 3, 4, 6 or 8 hex digits after #")
        };
    }
    let lower = t.to_ascii_lowercase();
    if let Some(open) = lower.find('(') {
        let name = &lower[..open];
        let Some(inner) = lower[open + 1..].strip_suffix(')') else { return Err("a colour function ends with `)`") };
        if inner.contains(['(', ')']) {
            return Err("nested functions such as calc() or url() are not accepted in a colour");
        }
        return function(name, inner);
    }
    if lower == "transparent" || lower == "currentcolor" || NAMED.binary_search(&lower.as_str()).is_ok() {
        return Ok(());
    }
    Err("it is not a CSS colour name, hex colour or colour function")
}

/// The sRGB channels and alpha (each 0..1) of a colour that [`check`]
/// accepts, in the forms whose value needs no colour space conversion
/// (CSS Color 4, 5.1 and 5.2): `#rgb`, `#rgba`, `#rrggbb`, `#rrggbbaa`,
/// `rgb()`/`rgba()` (numbers or percentages; `none` is not read), and
/// `black`, `white`, `transparent`. `None` for any other colour.
pub fn srgb(s: &str) -> Option<[f64; 4]> {
    check(s).ok()?;
    let t = s.trim();
    let mut c = [0.0, 0.0, 0.0, 1.0];
    if let Some(hex) = t.strip_prefix('#') {
        // 3 or 4 digits: each stands doubled (#0f08 is #00ff0088).
        let short = hex.len() <= 4;
        for (slot, digits) in c.iter_mut().zip(hex.as_bytes().chunks(if short { 1 } else { 2 })) {
            let v = digits.iter().fold(0, |a, d| a * 16 + (*d as char).to_digit(16).unwrap_or(0));
            *slot = f64::from(if short { v * 17 } else { v }) / 255.0;
        }
        return Some(c);
    }
    let is = |w: &str| t.eq_ignore_ascii_case(w);
    if is("black") || is("white") || is("transparent") {
        let v = if is("white") { 1.0 } else { 0.0 };
        return Some([v, v, v, if is("transparent") { 0.0 } else { 1.0 }]);
    }
    let open = t.find('(')?;
    if !(t[..open].eq_ignore_ascii_case("rgb") || t[..open].eq_ignore_ascii_case("rgba")) {
        return None;
    }
    // The check has seen three channels, then maybe the alpha after a
    // comma or a slash; the parts are split by bytes (separators are ASCII).
    let inner = &t[open + 1..t.len() - 1];
    let b = inner.as_bytes();
    let sep = |x: u8| x == b',' || x == b'/' || x.is_ascii_whitespace();
    let (mut at, mut n) = (0, 0);
    while n < 4 {
        while at < b.len() && sep(b[at]) {
            at += 1;
        }
        if at == b.len() {
            break;
        }
        let start = at;
        while at < b.len() && !sep(b[at]) {
            at += 1;
        }
        let p = &inner[start..at];
        let (num, unit) = match p.strip_suffix('%') {
            Some(x) => (x, 100.0),
            None if n < 3 => (p, 255.0),
            None => (p, 1.0),
        };
        c[n] = (crate::format::float::parse(num)? / unit).clamp(0.0, 1.0);
        n += 1;
    }
    Some(c)
}

#[derive(Clone, Copy, PartialEq)]
enum Kind {
    Number,
    Percent,
    Angle,
    Missing,
}

fn token(t: &str) -> Option<Kind> {
    if t == "none" {
        return Some(Kind::Missing);
    }
    // "grad" is tried before "rad", which it ends with.
    let (num, unit) = match ["%", "deg", "grad", "rad", "turn"].iter().find(|u| t.ends_with(*u)) {
        Some(u) => (&t[..t.len() - u.len()], *u),
        None => (t, ""),
    };
    if !is_number(num) {
        return None;
    }
    match unit {
        "" => Some(Kind::Number),
        "%" => Some(Kind::Percent),
        "deg" | "grad" | "rad" | "turn" => Some(Kind::Angle),
        _ => None,
    }
}

/// A CSS `<number>`: sign, digits with an optional fraction, exponent; finite.
fn is_number(s: &str) -> bool {
    let b = s.as_bytes();
    let mut i = 0;
    if i < b.len() && (b[i] == b'+' || b[i] == b'-') {
        i += 1;
    }
    let int_start = i;
    while i < b.len() && b[i].is_ascii_digit() {
        i += 1;
    }
    let mut digits = i - int_start;
    if i < b.len() && b[i] == b'.' {
        i += 1;
        let f = i;
        while i < b.len() && b[i].is_ascii_digit() {
            i += 1;
        }
        if i == f {
            return false;
        }
        digits += i - f;
    }
    if digits == 0 {
        return false;
    }
    if i < b.len() && (b[i] == b'e' || b[i] == b'E') {
        i += 1;
        if i < b.len() && (b[i] == b'+' || b[i] == b'-') {
            i += 1;
        }
        let e = i;
        while i < b.len() && b[i].is_ascii_digit() {
            i += 1;
        }
        if i == e {
            return false;
        }
    }
    i == b.len() && crate::format::float::parse(s).is_some_and(f64::is_finite)
}

fn function(name: &str, inner: &str) -> Result<(), &'static str> {
    use Kind::*;
    let hue_at = match name {
        "rgb" | "rgba" | "lab" | "oklab" => None,
        "hsl" | "hsla" | "hwb" => Some(0),
        "lch" | "oklch" => Some(2),
        _ => return Err("the colour functions accepted are rgb, rgba, hsl, hsla, hwb, lab, lch, oklab and oklch"),
    };
    let bad = "the values in this colour function do not follow CSS Color 4";
    if inner.contains(',') {
        // Legacy form: rgb/rgba/hsl/hsla only, commas, no `none`, 3 or 4 values.
        if !matches!(name, "rgb" | "rgba" | "hsl" | "hsla") {
            return Err(bad);
        }
        let mut kinds = Vec::with_capacity(4);
        for p in inner.split(',') {
            kinds.push(token(p.trim()).ok_or(bad)?);
        }
        if !(3..=4).contains(&kinds.len()) {
            return Err(bad);
        }
        let ok_channels = if hue_at.is_some() {
            matches!(kinds[0], Number | Angle) && kinds[1] == Percent && kinds[2] == Percent
        } else {
            kinds[..3].iter().all(|k| *k == Number) || kinds[..3].iter().all(|k| *k == Percent)
        };
        let ok_alpha = kinds.get(3).is_none_or(|k| matches!(k, Number | Percent));
        return if ok_channels && ok_alpha { Ok(()) } else { Err(bad) };
    }
    // Modern form: three values separated by spaces, then `/ alpha`.
    let (channels, alpha) = match inner.split_once('/') {
        Some((c, a)) => (c, Some(a.trim())),
        None => (inner, None),
    };
    if channels.split_whitespace().count() != 3 {
        return Err(bad);
    }
    for (i, p) in channels.split_whitespace().enumerate() {
        let k = token(p).ok_or(bad)?;
        let ok = if Some(i) == hue_at { matches!(k, Number | Angle | Missing) } else { matches!(k, Number | Percent | Missing) };
        if !ok {
            return Err(bad);
        }
    }
    if let Some(a) = alpha {
        if a.contains(char::is_whitespace) || !matches!(token(a), Some(Number | Percent | Missing)) {
            return Err(bad);
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_named_list_is_sorted_for_binary_search() {
        assert!(NAMED.windows(2).all(|w| w[0] < w[1]));
    }

    #[test]
    fn css_color_4_examples_are_accepted() {
        // Examples as written in CSS Color Module Level 4 (W3C), §5-§9.
        for c in [
            "red",
            "RebeccaPurple",
            "transparent",
            "currentColor",
            "#f00",
            "#f00a",
            "#ff0000",
            "#ff000080",
            "rgb(255, 0, 0)",
            "rgb(100%, 0%, 0%)",
            "rgba(255, 0, 0, 0.5)",
            "rgb(255 0 0)",
            "rgb(255 0 0 / 50%)",
            "rgb(29 164 192 / 95%)",
            "rgb(none 0 0)",
            "hsl(120deg 100% 50%)",
            "hsl(120, 100%, 50%)",
            "hsla(120, 100%, 50%, .5)",
            "hsl(0.3turn 60% 45% / .7)",
            "hwb(12 50% 0%)",
            "hwb(194 0% 0% / .5)",
            "lab(29.2345% 39.3825 20.0664)",
            "lab(52.2345% 40.1645 59.9971 / .5)",
            "lch(29.2345% 44.2 27)",
            "lch(52.2345% 72.2 56.2 / .5)",
            "oklab(40.101% 0.1147 0.0453)",
            "oklch(40.101% 0.12332 21.555)",
            "oklch(59.686% 0.15619 49.7694 / .5)",
            "oklch(0.7 0.1 1.2rad)",
            " #3c7ebe ",
        ] {
            assert!(is_css_color(c), "{c}: {:?}", check(c));
        }
    }

    #[test]
    fn everything_else_is_refused() {
        for c in [
            "url(http://example.org/x)",
            "url(#grad)",
            "red;background:url(x)",
            "expression(alert(1))",
            "javascript:alert(1)",
            "\"><script>",
            "#ff000",
            "#gggggg",
            "#",
            "",
            "redd",
            "rgb(255 0)",
            "rgb(255, 0 0)",
            "rgb(255, 0%, 0)",
            "rgb(calc(1) 0 0)",
            "rgb(1e999 0 0)",
            "rgb(255 0 0 / 1 2)",
            "hsl(120 100% 50% 0.5)",
            "hsl(none, 100%, 50%)",
            "lab(1deg 0 0)",
            "var(--x)",
            "color(srgb 1 0 0)",
            "rgb(255 0 0",
        ] {
            assert!(!is_css_color(c), "{c} accepted");
        }
        assert!(!is_css_color(&"a".repeat(MAX_COLOR_CHARS + 1)));
    }
}
