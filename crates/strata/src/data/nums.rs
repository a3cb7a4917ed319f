//! A column of numbers as plain `f64`, NaN (or any non-finite value) for a
//! missing one: the table's number, date and date-time columns and the
//! plan's channel values alike.
//!
//! The storage is shared (cloning a column costs a reference count), and
//! with the `arrow` feature a null-free Arrow `Float64` buffer is held as it
//! is, so a 10M-row column handed in by native code is never copied.

/// The storage: with the `arrow` feature an Arrow buffer (a `Vec<f64>`
/// becomes one without a copy, and an Arrow column is held as it is);
/// without it a shared `Vec`. One kind of storage a build, so reading a
/// value is one slice access, with no branch, in the hot loops.
#[cfg(feature = "arrow")]
type Store = arrow_buffer::ScalarBuffer<f64>;
#[cfg(not(feature = "arrow"))]
type Store = std::sync::Arc<Vec<f64>>;

/// A column of numbers (or of times, in ms since 1970-01-01 UTC).
/// `get(i)` is `None` where the value is missing or not finite.
#[derive(Clone, Default)]
pub struct Nums(Store);

impl Nums {
    /// Share an Arrow buffer as it is; its non-finite numbers read as missing.
    #[cfg(feature = "arrow")]
    pub fn shared(values: arrow_buffer::ScalarBuffer<f64>) -> Nums {
        Nums(values)
    }
    pub fn len(&self) -> usize {
        self.raw().len()
    }
    pub fn is_empty(&self) -> bool {
        self.raw().is_empty()
    }
    #[inline]
    pub fn get(&self, i: usize) -> Option<f64> {
        let x = self.raw()[i];
        x.is_finite().then_some(x)
    }
    /// Every row, missing ones as `None`.
    pub fn iter(&self) -> impl Iterator<Item = Option<f64>> + '_ {
        self.raw().iter().map(|x| x.is_finite().then_some(*x))
    }
    /// The present values only, in row order.
    pub fn present(&self) -> impl Iterator<Item = f64> + '_ {
        self.raw().iter().copied().filter(|x| x.is_finite())
    }
    /// The stored numbers, NaN (or an infinity) where a value is missing.
    #[inline]
    pub fn raw(&self) -> &[f64] {
        &self.0
    }
    /// Lowest and highest present value, `None` when none is present.
    /// Branch-free so the compiler can vectorise it over millions of rows.
    pub fn extent(&self) -> Option<(f64, f64)> {
        let (mut lo, mut hi) = (f64::INFINITY, f64::NEG_INFINITY);
        for &x in self.raw().iter() {
            // A missing value becomes NaN, which fails both comparisons.
            // (Plain comparisons map to minpd/maxpd; f64::min's NaN rule
            // does not vectorise as well.)
            let x = if x.is_finite() { x } else { f64::NAN };
            lo = if x < lo { x } else { lo };
            hi = if x > hi { x } else { hi };
        }
        (lo <= hi).then_some((lo, hi))
    }
    pub fn map(&self, f: impl Fn(f64) -> f64) -> Nums {
        let mut v = Vec::with_capacity(self.len());
        for &x in self.raw() {
            v.push(if x.is_finite() { f(x) } else { f64::NAN });
        }
        v.into()
    }
    /// The rows where `keep` is true.
    pub fn filter(&self, keep: &[bool]) -> Nums {
        let mut v = Vec::new();
        for (x, k) in self.raw().iter().zip(keep) {
            if *k {
                v.push(*x);
            }
        }
        v.into()
    }
}

impl std::fmt::Debug for Nums {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.debug_list().entries(self.iter()).finish()
    }
}

/// Equal when the same rows are missing and the present values are equal.
impl PartialEq for Nums {
    fn eq(&self, other: &Nums) -> bool {
        self.len() == other.len() && self.raw().iter().zip(other.raw()).all(|(x, y)| if x.is_finite() { x == y } else { !y.is_finite() })
    }
}

impl FromIterator<Option<f64>> for Nums {
    fn from_iter<I: IntoIterator<Item = Option<f64>>>(it: I) -> Nums {
        // A plain loop: one function per iterator type (a `collect` is four).
        let it = it.into_iter();
        let mut v = Vec::with_capacity(it.size_hint().0);
        for x in it {
            v.push(x.unwrap_or(f64::NAN));
        }
        v.into()
    }
}

impl From<Vec<Option<f64>>> for Nums {
    fn from(v: Vec<Option<f64>>) -> Nums {
        let mut out = Vec::with_capacity(v.len());
        for x in &v {
            out.push(x.unwrap_or(f64::NAN));
        }
        out.into()
    }
}

impl From<Vec<f64>> for Nums {
    fn from(v: Vec<f64>) -> Nums {
        Nums(v.into())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn missing_and_non_finite_read_as_none() {
        let n: Nums = vec![Some(1.0), None, Some(f64::INFINITY), Some(-2.5)].into();
        assert_eq!(n.iter().collect::<Vec<_>>(), vec![Some(1.0), None, None, Some(-2.5)]);
        assert_eq!(n.present().collect::<Vec<_>>(), vec![1.0, -2.5]);
        assert_eq!(n.extent(), Some((-2.5, 1.0)));
        assert_eq!(Nums::from(vec![None, None]).extent(), None);
        assert_eq!(n, Nums::from(vec![1.0, f64::NAN, f64::NEG_INFINITY, -2.5]));
        assert_eq!(n.filter(&[true, false, false, true]), Nums::from(vec![1.0, -2.5]));
    }
}
