//! A value axis whose domain spans zero always labels zero, at every width
//! (the thinned tick sets of narrow charts too): -15, -5, 5, 15 hides where
//! gains turn to losses.

use strata::scene::SceneOptions;
use strata::{render, RenderOptions};

#[test]
fn a_diverging_axis_labels_zero_at_every_width() {
    let spec = include_str!("../../../tests/golden/specs/diverging.json");
    for width in [200.0, 280.0, 320.0, 375.0, 420.0, 480.0, 560.0, 640.0, 800.0, 1280.0] {
        let r = render(spec, None, &RenderOptions { scene: SceneOptions { width } }).unwrap();
        let labels: Vec<&str> = r.svg.split("</text>").filter_map(|t| t.rsplit('>').next()).filter(|t| t.parse::<f64>().is_ok()).collect();
        assert!(labels.len() >= 2, "{width}: {labels:?}");
        assert!(labels.iter().any(|l| l.parse::<f64>() == Ok(0.0)), "{width} px: no zero among {labels:?}");
    }
}
