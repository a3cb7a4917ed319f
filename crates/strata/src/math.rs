//! Transcendental functions for the whole engine.
//!
//! The CLI (native) and the page (wasm32) must write the same bytes. Native
//! `f64::ln` and friends call the platform's libm, whose last-bit results can
//! differ from the libm linked into wasm32. Every stage therefore calls these
//! wrappers, which use the portable `libm` crate on every target.
//! Basic arithmetic and `sqrt` are IEEE 754 correctly rounded everywhere and
//! need no wrapper.

#[inline]
pub fn ln(x: f64) -> f64 {
    libm::log(x)
}
#[inline]
pub fn log10(x: f64) -> f64 {
    libm::log10(x)
}
#[inline]
pub fn log2(x: f64) -> f64 {
    libm::log2(x)
}
#[inline]
pub fn exp(x: f64) -> f64 {
    libm::exp(x)
}
#[inline]
pub fn pow(x: f64, y: f64) -> f64 {
    libm::pow(x, y)
}
#[inline]
pub fn powi(x: f64, n: i32) -> f64 {
    libm::pow(x, n as f64)
}
#[inline]
pub fn sin(x: f64) -> f64 {
    libm::sin(x)
}
#[inline]
pub fn cos(x: f64) -> f64 {
    libm::cos(x)
}
#[inline]
pub fn atan2(y: f64, x: f64) -> f64 {
    libm::atan2(y, x)
}
#[inline]
pub fn cbrt(x: f64) -> f64 {
    libm::cbrt(x)
}
#[inline]
pub fn hypot(x: f64, y: f64) -> f64 {
    libm::hypot(x, y)
}

/// `x.clamp(lo, hi)` for floats, without its panic on `lo > hi` (whose
/// message would bring core's float printing into the page module): the
/// same comparisons, in the same order, so the same result when `lo <= hi`.
#[inline]
pub fn clamp(x: f64, lo: f64, hi: f64) -> f64 {
    let mut x = x;
    if x < lo {
        x = lo;
    }
    if x > hi {
        x = hi;
    }
    x
}
