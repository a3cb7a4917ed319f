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
/// Sine and cosine of an angle in degrees, for the page's own angles (label
/// turns, star points, OKLCH hues). The angle is reduced exactly in degrees
/// (`%` 360 and the nearest quarter turn are exact in binary floating
/// point), so only |x| <= pi/4 reaches the polynomials and libm's radian
/// argument reduction (`rem_pio2` with its 1,200-bit table of 2/pi, about
/// 3 KB gzip of the page's core engine) is not needed; whole quarter turns
/// give exactly 0 and +-1. The kernels are FreeBSD msun's `__kernel_sin`
/// and `__kernel_cos` (k_sin.c, k_cos.c; the same coefficients as the
/// `libm` crate 0.2.16 uses), so results are libm's to within an ulp
/// (tests below, against `libm::sin`/`libm::cos`).
pub fn sin_cos_deg(deg: f64) -> (f64, f64) {
    let r = deg % 360.0;
    let q = (r / 90.0).round();
    // Exact: r and q * 90 are multiples of r's ulp, and |r - q * 90| <= 45.
    let x = (r - q * 90.0).to_radians();
    let (s, c) = (kernel_sin(x), kernel_cos(x));
    match (q as i64).rem_euclid(4) {
        0 => (s, c),
        1 => (c, -s),
        2 => (-s, -c),
        _ => (-c, s),
    }
}

/// sin(x) for |x| <= pi/4 (msun's `__kernel_sin` with no tail; its
/// coefficients as published, digits and all).
#[allow(clippy::excessive_precision)]
fn kernel_sin(x: f64) -> f64 {
    const S1: f64 = -1.666_666_666_666_663_243_48e-1;
    const S2: f64 = 8.333_333_333_322_489_461_24e-3;
    const S3: f64 = -1.984_126_982_985_794_931_34e-4;
    const S4: f64 = 2.755_731_370_707_006_767_89e-6;
    const S5: f64 = -2.505_076_025_340_686_341_95e-8;
    const S6: f64 = 1.589_690_995_211_550_102_21e-10;
    if x == 0.0 {
        return x; // keeps -0.0
    }
    let z = x * x;
    let w = z * z;
    let r = S2 + z * (S3 + z * S4) + z * w * (S5 + z * S6);
    x + z * x * (S1 + z * r)
}

/// cos(x) for |x| <= pi/4 (msun's `__kernel_cos` with no tail).
#[allow(clippy::excessive_precision)]
fn kernel_cos(x: f64) -> f64 {
    const C1: f64 = 4.166_666_666_666_660_190_37e-2;
    const C2: f64 = -1.388_888_888_887_410_957_49e-3;
    const C3: f64 = 2.480_158_728_947_672_941_78e-5;
    const C4: f64 = -2.755_731_435_139_066_330_35e-7;
    const C5: f64 = 2.087_572_321_298_174_827_90e-9;
    const C6: f64 = -1.135_964_755_778_819_482_65e-11;
    let z = x * x;
    let w = z * z;
    let r = z * (C1 + z * (C2 + z * C3)) + w * w * (C4 + z * (C5 + z * C6));
    let hz = 0.5 * z;
    let w = 1.0 - hz;
    w + (((1.0 - w) - hz) + z * r)
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

#[cfg(test)]
mod tests {
    use super::*;

    /// Against the `libm` crate 0.2.16 (musl's sin and cos with full radian
    /// argument reduction): within 1 ulp where both see the same radians
    /// (|angle| <= 45 degrees, no reduction), within 1e-14 absolute over
    /// +-1000 degrees (libm is handed `to_radians` of the whole angle,
    /// rounded once more than ours), and exact at whole quarter turns
    /// (common practice: a label turned -90 degrees must be exactly upright).
    #[test]
    fn sin_cos_deg_match_libm() {
        let mut d = -1000.0;
        while d <= 1000.0 {
            let (s, c) = sin_cos_deg(d);
            let x = (d % 360.0_f64).to_radians();
            for (got, want) in [(s, libm::sin(x)), (c, libm::cos(x))] {
                if d.abs() <= 45.0 {
                    assert!((got - want).abs() <= want.abs() * f64::EPSILON, "{d}: {got} vs {want}");
                } else {
                    assert!((got - want).abs() < 1e-14, "{d}: {got} vs {want}");
                }
            }
            d += 0.013;
        }
        for q in -12i32..=12 {
            let (s, c) = sin_cos_deg(90.0 * q as f64);
            let want: (f64, f64) = [(0.0, 1.0), (1.0, 0.0), (0.0, -1.0), (-1.0, 0.0)][q.rem_euclid(4) as usize];
            assert_eq!((s.abs(), c.abs()), (want.0.abs(), want.1.abs()), "{q}");
            assert_eq!((s.signum() * (s != 0.0) as i32 as f64, c.signum() * (c != 0.0) as i32 as f64), want, "{q}");
        }
        let (s, c) = sin_cos_deg(1e17 + 45.0);
        assert!(s.is_finite() && c.is_finite() && (s * s + c * c - 1.0).abs() < 1e-15);
        assert!(sin_cos_deg(f64::NAN).0.is_nan());
    }
}
