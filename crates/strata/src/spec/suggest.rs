//! "Did you mean ...?" suggestions by edit distance.

/// The candidate closest to `word` (case-insensitive Levenshtein distance),
/// if it is close enough to be a likely typo: at most a third of the longer
/// word's length, and at least 1.
pub fn closest<'a>(word: &str, candidates: impl IntoIterator<Item = &'a str>) -> Option<&'a str> {
    let w = word.to_lowercase();
    let mut best: Option<(usize, &'a str)> = None;
    for c in candidates {
        let d = levenshtein(&w, &c.to_lowercase());
        let limit = (c.chars().count().max(word.chars().count()) / 3).max(1);
        if d <= limit && best.is_none_or(|(bd, _)| d < bd) {
            best = Some((d, c));
        }
    }
    best.map(|(_, c)| c)
}

/// Levenshtein (1966) edit distance over characters.
pub fn levenshtein(a: &str, b: &str) -> usize {
    let b: Vec<char> = b.chars().collect();
    let mut prev: Vec<usize> = (0..=b.len()).collect();
    for (i, ca) in a.chars().enumerate() {
        let mut cur = vec![i + 1; b.len() + 1];
        for (j, cb) in b.iter().enumerate() {
            cur[j + 1] = (prev[j] + usize::from(ca != *cb)).min(prev[j + 1] + 1).min(cur[j] + 1);
        }
        prev = cur;
    }
    prev[b.len()]
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn textbook_distances() {
        // kitten -> sitting is 3 (the standard worked example, common practice).
        assert_eq!(levenshtein("kitten", "sitting"), 3);
        assert_eq!(levenshtein("", "abc"), 3);
        assert_eq!(closest("rul", ["rule", "width", "count"]), Some("rule"));
        assert_eq!(closest("colour", ["color", "size"]), Some("color"));
        assert_eq!(closest("zzz", ["rule", "width"]), None);
    }
}
