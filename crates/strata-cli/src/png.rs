//! PNG output: the SVG rasterised with resvg, text set in the bundled font
//! (loaded explicitly, so the picture never depends on the machine's fonts).

use resvg::{tiny_skia, usvg};

/// The bundled font files, compiled in.
const FONTS: [&[u8]; 2] =
    [include_bytes!("../../../fonts/AtkinsonHyperlegibleNext-Regular.ttf"), include_bytes!("../../../fonts/AtkinsonHyperlegibleNext-Bold.ttf")];

/// Parse options whose font database holds only the bundled font, which is
/// also every generic family.
pub fn options() -> usvg::Options<'static> {
    let mut opt = usvg::Options::default();
    let db = opt.fontdb_mut();
    for f in FONTS {
        db.load_font_data(f.to_vec());
    }
    let family = strata::text::BUNDLED_FAMILY;
    db.set_sans_serif_family(family);
    db.set_serif_family(family);
    db.set_monospace_family(family);
    db.set_cursive_family(family);
    db.set_fantasy_family(family);
    opt.font_family = family.to_string();
    opt
}

/// Rasterise SVG text at `scale` (1 = one pixel per SVG unit).
pub fn pixmap(svg: &str, scale: f32) -> Result<tiny_skia::Pixmap, String> {
    let tree = usvg::Tree::from_str(svg, &options()).map_err(|e| format!("strata: cannot read the SVG: {e}"))?;
    let size = tree.size().to_int_size().scale_by(scale).ok_or("strata: empty picture")?;
    let mut pix = tiny_skia::Pixmap::new(size.width(), size.height()).ok_or("strata: picture too large")?;
    resvg::render(&tree, tiny_skia::Transform::from_scale(scale, scale), &mut pix.as_mut());
    Ok(pix)
}

/// PNG bytes of SVG text.
pub fn encode(svg: &str, scale: f32) -> Result<Vec<u8>, String> {
    pixmap(svg, scale)?.encode_png().map_err(|e| format!("strata: cannot encode PNG: {e}"))
}
