//! "Did you mean ...?" suggestions by edit distance.

/// The candidate closest to `word` (case-insensitive edit distance with
/// transpositions, [`edit_distance`]),
/// if it is close enough to be a likely typo: at most a third of the longer
/// word's length, and at least 1.
pub fn closest<'a>(word: &str, candidates: impl IntoIterator<Item = &'a str>) -> Option<&'a str> {
    let w = crate::text::case::lower(word);
    let mut best: Option<(usize, &'a str)> = None;
    for c in candidates {
        let d = edit_distance(&w, &crate::text::case::lower(c));
        let limit = (c.chars().count().max(word.chars().count()) / 3).max(1);
        if d <= limit && best.is_none_or(|(bd, _)| d < bd) {
            best = Some((d, c));
        }
    }
    best.map(|(_, c)| c)
}

/// Optimal string alignment distance: Levenshtein's insertions, deletions
/// and substitutions plus Damerau's (1964) transposition of two adjacent
/// characters, each costing 1, no substring edited twice.
pub fn edit_distance(a: &str, b: &str) -> usize {
    let a: Vec<char> = a.chars().collect();
    let b: Vec<char> = b.chars().collect();
    let mut d = vec![vec![0usize; b.len() + 1]; a.len() + 1];
    for (i, row) in d.iter_mut().enumerate() {
        row[0] = i;
    }
    for (j, cell) in d[0].iter_mut().enumerate() {
        *cell = j;
    }
    for i in 1..=a.len() {
        for j in 1..=b.len() {
            let cost = usize::from(a[i - 1] != b[j - 1]);
            let mut v = (d[i - 1][j] + 1).min(d[i][j - 1] + 1).min(d[i - 1][j - 1] + cost);
            if i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1] {
                v = v.min(d[i - 2][j - 2] + 1);
            }
            d[i][j] = v;
        }
    }
    d[a.len()][b.len()]
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
        // A transposition is one edit in OSA distance, two in Levenshtein's.
        assert_eq!(levenshtein("titel", "title"), 2);
        assert_eq!(edit_distance("titel", "title"), 1);
        // OSA's textbook case: "ca" -> "abc" is 3 (no substring edited twice).
        assert_eq!(edit_distance("ca", "abc"), 3);
        assert_eq!(closest("titel", ["title", "subtitle"]), Some("title"));
        assert_eq!(closest("rul", ["rule", "width", "count"]), Some("rule"));
        assert_eq!(closest("colour", ["color", "size"]), Some("color"));
        assert_eq!(closest("zzz", ["rule", "width"]), None);
    }
}
