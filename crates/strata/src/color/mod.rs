//! Colours: palettes for the colour channel and the theme's colours.

/// Categorical palette "harbour": eight hues at OKLCH lightness 0.58 and
/// chroma 0.12, hue angles 250, 40, 150, 320, 85, 200, 10, 120 (our own
/// choice; converted with Ottosson's 2020 OKLab matrices).
pub const HARBOUR: [&str; 8] = ["#3c7ebe", "#b55f40", "#3d8e53", "#9961a6", "#9b7300", "#008e96", "#b5596a", "#728426"];

/// Colour of category `i`, cycling when there are more categories than hues.
pub fn category(i: usize) -> &'static str {
    HARBOUR[i % HARBOUR.len()]
}

/// The colours a chart is drawn with.
#[derive(Debug, Clone, PartialEq)]
pub struct Palette {
    pub background: String,
    pub text: String,
    pub muted: String,
    pub grid: String,
    pub axis: String,
    pub mark: String,
}

impl Palette {
    pub fn light() -> Self {
        Palette {
            background: "#ffffff".into(),
            text: "#1d232b".into(),
            muted: "#555e69".into(),
            grid: "#e3e6ea".into(),
            axis: "#8a939e".into(),
            mark: HARBOUR[0].into(),
        }
    }
    pub fn dark() -> Self {
        Palette {
            background: "#16191d".into(),
            text: "#e8ebef".into(),
            muted: "#a9b1bb".into(),
            grid: "#2c3239".into(),
            axis: "#6f7883".into(),
            mark: "#6fa6e0".into(),
        }
    }
}

/// A sequential ramp for numbers, t in 0..1: from a light to a dark blue,
/// interpolated in sRGB between two stops of our own.
pub fn ramp(t: f64) -> String {
    let t = t.clamp(0.0, 1.0);
    let a = [0xd6, 0xe6, 0xf4];
    let b = [0x1c, 0x4a, 0x7e];
    let c: Vec<u8> = (0..3).map(|k| (a[k] as f64 + (b[k] as f64 - a[k] as f64) * t).round() as u8).collect();
    format!("#{:02x}{:02x}{:02x}", c[0], c[1], c[2])
}
