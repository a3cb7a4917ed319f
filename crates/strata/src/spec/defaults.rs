//! Defaults of statistic options, defined once: the plan applies these,
//! and `tests/spec_schema.rs` holds the schema's descriptions and
//! docs/spec.md to them (see [`documented`]).

use super::vocab::{BandwidthRule, BinRule, WindowAlign, WindowSummary};

pub const BIN_RULE: BinRule = BinRule::Sturges;
pub const BANDWIDTH: BandwidthRule = BandwidthRule::Scott;
/// Points at which a density is evaluated.
pub const DENSITY_GRID: u32 = 256;
pub const WINDOW_ROWS: u32 = 7;
pub const WINDOW_SUMMARY: WindowSummary = WindowSummary::Mean;
pub const WINDOW_ALIGN: WindowAlign = WindowAlign::Center;
/// Confidence level of a fit's band.
pub const FIT_BAND: f64 = 0.95;
pub const LOESS_SPAN: f64 = 0.75;
/// Local lines (2 would be local parabolas).
pub const LOESS_DEGREE: u32 = 1;
/// Robustness iterations of `"robust": true`.
pub const LOESS_ROBUST_ITERATIONS: u32 = 3;
/// The probability of a `quantile` summary.
pub const QUANTILE_P: f64 = 0.5;

/// Each default as the docs write it, by its key in the schema (the
/// object holding it, then the key).
pub fn documented() -> Vec<(&'static str, &'static str, String)> {
    vec![
        ("bin", "rule", BIN_RULE.word().to_string()),
        ("density", "bandwidth", BANDWIDTH.word().to_string()),
        ("density", "grid", DENSITY_GRID.to_string()),
        ("window", "rows", WINDOW_ROWS.to_string()),
        ("window", "summary", WINDOW_SUMMARY.word().to_string()),
        ("window", "align", WINDOW_ALIGN.word().to_string()),
        ("stat", "band", crate::format::float::plain(FIT_BAND)),
        ("stat", "span", crate::format::float::plain(LOESS_SPAN)),
        ("stat", "degree", LOESS_DEGREE.to_string()),
        ("stat", "p", crate::format::float::plain(QUANTILE_P)),
    ]
}
