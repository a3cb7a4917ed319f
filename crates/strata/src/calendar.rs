//! ISO 8601 dates and date-times to days and milliseconds since 1970-01-01 UTC.

/// Days since 1970-01-01 of a proleptic Gregorian date.
/// Algorithm: Howard Hinnant, "chrono-Compatible Low-Level Date Algorithms"
/// (days_from_civil), public domain.
pub fn days_from_civil(y: i64, m: u32, d: u32) -> i64 {
    let y = if m <= 2 { y - 1 } else { y };
    let era = if y >= 0 { y } else { y - 399 } / 400;
    let yoe = y - era * 400;
    let m = m as i64;
    let doy = (153 * (if m > 2 { m - 3 } else { m + 9 }) + 2) / 5 + d as i64 - 1;
    let doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
    era * 146097 + doe - 719468
}

/// Inverse of [`days_from_civil`] (Hinnant's civil_from_days).
pub fn civil_from_days(z: i64) -> (i64, u32, u32) {
    let z = z + 719468;
    let era = if z >= 0 { z } else { z - 146096 } / 146097;
    let doe = z - era * 146097;
    let yoe = (doe - doe / 1460 + doe / 36524 - doe / 146096) / 365;
    let y = yoe + era * 400;
    let doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    let mp = (5 * doy + 2) / 153;
    let d = (doy - (153 * mp + 2) / 5 + 1) as u32;
    let m = if mp < 10 { mp + 3 } else { mp - 9 } as u32;
    (if m <= 2 { y + 1 } else { y }, m, d)
}

fn is_leap(y: i64) -> bool {
    (y % 4 == 0 && y % 100 != 0) || y % 400 == 0
}

pub fn days_in_month(y: i64, m: u32) -> u32 {
    match m {
        1 | 3 | 5 | 7 | 8 | 10 | 12 => 31,
        4 | 6 | 9 | 11 => 30,
        _ => {
            if is_leap(y) {
                29
            } else {
                28
            }
        }
    }
}

fn digits(s: &[u8]) -> Option<i64> {
    if s.is_empty() || !s.iter().all(u8::is_ascii_digit) {
        return None;
    }
    Some(s.iter().fold(0i64, |a, b| a * 10 + (b - b'0') as i64))
}

/// `YYYY-MM-DD` to days since the epoch.
pub fn parse_date(s: &str) -> Option<i64> {
    parse_date_bytes(s.as_bytes())
}

/// [`parse_date`] over bytes.
pub fn parse_date_bytes(b: &[u8]) -> Option<i64> {
    if b.len() != 10 || b[4] != b'-' || b[7] != b'-' {
        return None;
    }
    let y = digits(&b[0..4])?;
    let m = digits(&b[5..7])? as u32;
    let d = digits(&b[8..10])? as u32;
    if !(1..=12).contains(&m) || d == 0 || d > days_in_month(y, m) {
        return None;
    }
    Some(days_from_civil(y, m, d))
}

/// ISO 8601's basic calendar date, `YYYYMMDD` (eight digits, no
/// separators), to days since the epoch. Read only in a column the spec
/// declares `date`: undeclared, eight digits stay a number.
pub fn parse_basic_date_bytes(b: &[u8]) -> Option<i64> {
    if b.len() != 8 {
        return None;
    }
    let y = digits(&b[0..4])?;
    let m = digits(&b[4..6])? as u32;
    let d = digits(&b[6..8])? as u32;
    if !(1..=12).contains(&m) || d == 0 || d > days_in_month(y, m) {
        return None;
    }
    Some(days_from_civil(y, m, d))
}

/// `YYYY-MM-DD[T ]HH:MM[:SS[.fff]][Z|±HH:MM|±HHMM]` to milliseconds since the
/// epoch, UTC. Without an offset the time is taken as UTC.
pub fn parse_datetime(s: &str) -> Option<i64> {
    parse_datetime_bytes(s.as_bytes())
}

/// [`parse_datetime`] over bytes.
pub fn parse_datetime_bytes(b: &[u8]) -> Option<i64> {
    if b.len() < 16 || (b[10] != b'T' && b[10] != b' ') {
        return None;
    }
    let days = parse_date_bytes(&b[0..10])?;
    let rest = &b[11..];
    if rest.len() < 5 || rest[2] != b':' {
        return None;
    }
    let hh = digits(&rest[0..2])?;
    let mm = digits(&rest[3..5])?;
    let mut i = 5;
    let mut ss = 0;
    let mut ms = 0i64;
    if rest.len() >= 8 && rest[5] == b':' {
        ss = digits(&rest[6..8])?;
        i = 8;
        if i < rest.len() && (rest[i] == b'.' || rest[i] == b',') {
            let start = i + 1;
            let mut end = start;
            while end < rest.len() && rest[end].is_ascii_digit() {
                end += 1;
            }
            if end == start {
                return None;
            }
            let frac = &rest[start..end];
            let mut v = 0i64;
            for k in 0..3 {
                v = v * 10 + frac.get(k).map(|c| (c - b'0') as i64).unwrap_or(0);
            }
            ms = v;
            i = end;
        }
    }
    if hh > 23 || mm > 59 || ss > 60 {
        return None;
    }
    let tz = &rest[i..];
    let offset_min = match tz {
        [] => 0,
        [b'Z'] | [b'z'] => 0,
        [sign @ (b'+' | b'-'), h1, h2, b':', m1, m2] | [sign @ (b'+' | b'-'), h1, h2, m1, m2] => {
            let h = digits(&[*h1, *h2])?;
            let m = digits(&[*m1, *m2])?;
            if h > 23 || m > 59 {
                return None;
            }
            let v = h * 60 + m;
            if *sign == b'-' {
                -v
            } else {
                v
            }
        }
        [sign @ (b'+' | b'-'), h1, h2] => {
            let v = digits(&[*h1, *h2])?.min(24) * 60;
            if v > 23 * 60 {
                return None;
            }
            if *sign == b'-' {
                -v
            } else {
                v
            }
        }
        _ => return None,
    };
    Some(((days * 24 + hh) * 60 + mm - offset_min) * 60_000 + ss * 1000 + ms)
}

#[cfg(test)]
mod tests {

    /// ISO 8601 basic calendar dates, against Python 3.11.7's
    /// `datetime.date.fromisoformat`, which reads the basic form (days since
    /// 1970-01-01 printed by that Python; invalid dates it rejects).
    #[test]
    fn basic_dates_match_python() {
        for (s, days) in [("19580329", -4296), ("20000229", 11016), ("19700101", 0), ("20241231", 20088)] {
            assert_eq!(parse_basic_date_bytes(s.as_bytes()), Some(days), "{s}");
        }
        for s in ["19590229", "20241301", "2024123", "2024-1-01"] {
            assert_eq!(parse_basic_date_bytes(s.as_bytes()), None, "{s}");
        }
    }

    use super::*;

    #[test]
    fn epoch_and_known_days() {
        // 2000-03-01 is day 11017 since 1970-01-01 (Python 3.11:
        // (date(2000,3,1)-date(1970,1,1)).days == 11017).
        assert_eq!(parse_date("1970-01-01"), Some(0));
        assert_eq!(parse_date("2000-03-01"), Some(11017));
        assert_eq!(parse_date("1969-12-31"), Some(-1));
        assert_eq!(parse_date("2023-02-29"), None);
        assert_eq!(civil_from_days(11017), (2000, 3, 1));
    }

    #[test]
    fn datetimes_with_offsets() {
        // 2024-05-06T07:08:09Z is 1714979289 s after the epoch
        // (Python 3.11 datetime(2024,5,6,7,8,9,tzinfo=timezone.utc).timestamp()).
        assert_eq!(parse_datetime("2024-05-06T07:08:09Z"), Some(1_714_979_289_000));
        assert_eq!(parse_datetime("2024-05-06T09:08:09+02:00"), Some(1_714_979_289_000));
        assert_eq!(parse_datetime("2024-05-06 07:08:09.5"), Some(1_714_979_289_500));
        assert_eq!(parse_datetime("2024-05-06T07:08"), Some(1_714_979_280_000));
        assert_eq!(parse_datetime("2024-05-06T25:08"), None);
    }
}
