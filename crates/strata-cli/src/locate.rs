//! Where a diagnostic's JSON path (`layers[0].stat.bin.rule`) sits in the
//! spec's text, so `check` and `bake` can name a line. A small scanner over
//! the JSON text (RFC 8259 grammar): it walks the path as far as the text
//! has it and answers the offset of the deepest part found: the member's key
//! for an object member, the element's first character for an array element.
//! The playground's `www/playground.js` does the same in the page.

/// One step of a path.
#[derive(Debug, Clone, PartialEq)]
enum Step {
    Key(String),
    Index(usize),
}

/// Split `a.b[2]."odd key".c` into steps; keys that are not plain words are
/// written as JSON strings (as the engine writes them).
fn steps(path: &str) -> Vec<Step> {
    let b = path.as_bytes();
    let mut out = Vec::new();
    let mut i = 0;
    while i < b.len() {
        match b[i] {
            b'.' => i += 1,
            b'[' => {
                let end = path[i..].find(']').map(|e| i + e).unwrap_or(b.len());
                if let Ok(n) = path[i + 1..end].parse() {
                    out.push(Step::Index(n));
                }
                i = end + 1;
            }
            b'"' => {
                // A quoted key: find the closing quote that is not escaped.
                let mut j = i + 1;
                while j < b.len() && b[j] != b'"' {
                    j += if b[j] == b'\\' { 2 } else { 1 };
                }
                let quoted = &path[i..(j + 1).min(b.len())];
                out.push(Step::Key(serde_json::from_str(quoted).unwrap_or_else(|_| quoted.trim_matches('"').to_string())));
                i = j + 1;
            }
            _ => {
                let end = path[i..].find(['.', '[']).map(|e| i + e).unwrap_or(b.len());
                out.push(Step::Key(path[i..end].to_string()));
                i = end;
            }
        }
    }
    out
}

struct Scan<'a> {
    b: &'a [u8],
    i: usize,
}

impl Scan<'_> {
    fn ws(&mut self) {
        while self.i < self.b.len() && matches!(self.b[self.i], b' ' | b'\t' | b'\n' | b'\r') {
            self.i += 1;
        }
    }
    fn peek(&self) -> Option<u8> {
        self.b.get(self.i).copied()
    }
    /// A string starting at `i` (on its quote); returns its decoded text.
    fn string(&mut self) -> Option<String> {
        let start = self.i;
        self.i += 1;
        while self.i < self.b.len() {
            match self.b[self.i] {
                b'\\' => self.i += 2,
                b'"' => {
                    self.i += 1;
                    let raw = std::str::from_utf8(&self.b[start..self.i]).ok()?;
                    return serde_json::from_str(raw).ok();
                }
                _ => self.i += 1,
            }
        }
        None
    }
    /// Skip any value.
    fn skip(&mut self) {
        self.ws();
        match self.peek() {
            Some(b'"') => {
                self.string();
            }
            Some(b'{') | Some(b'[') => {
                let mut depth = 0usize;
                while let Some(c) = self.peek() {
                    match c {
                        b'"' => {
                            self.string();
                            continue;
                        }
                        b'{' | b'[' => depth += 1,
                        b'}' | b']' => {
                            depth -= 1;
                            if depth == 0 {
                                self.i += 1;
                                return;
                            }
                        }
                        _ => {}
                    }
                    self.i += 1;
                }
            }
            _ => {
                while let Some(c) = self.peek() {
                    if matches!(c, b',' | b'}' | b']' | b' ' | b'\t' | b'\n' | b'\r') {
                        break;
                    }
                    self.i += 1;
                }
            }
        }
    }
    /// The value at `i` followed down `path`; the deepest offset found.
    fn find(&mut self, path: &[Step]) -> usize {
        self.ws();
        let here = self.i;
        let Some((first, rest)) = path.split_first() else { return here };
        match (self.peek(), first) {
            (Some(b'{'), Step::Key(want)) => {
                self.i += 1;
                loop {
                    self.ws();
                    if self.peek() != Some(b'"') {
                        return here;
                    }
                    let key_at = self.i;
                    let Some(key) = self.string() else { return here };
                    self.ws();
                    if self.peek() != Some(b':') {
                        return here;
                    }
                    self.i += 1;
                    if &key == want {
                        return if rest.is_empty() { key_at } else { self.find(rest) };
                    }
                    self.skip();
                    self.ws();
                    if self.peek() != Some(b',') {
                        return here;
                    }
                    self.i += 1;
                }
            }
            (Some(b'['), Step::Index(want)) => {
                self.i += 1;
                let mut n = 0;
                loop {
                    self.ws();
                    if self.peek() == Some(b']') || self.peek().is_none() {
                        return here;
                    }
                    if n == *want {
                        return self.find(rest);
                    }
                    self.skip();
                    self.ws();
                    if self.peek() != Some(b',') {
                        return here;
                    }
                    self.i += 1;
                    n += 1;
                }
            }
            _ => here,
        }
    }
}

/// Byte offset in `text` of the place `path` names (the start of the text's
/// first value for an empty path or one the text does not have at all).
pub fn offset(text: &str, path: &str) -> usize {
    Scan { b: text.as_bytes(), i: 0 }.find(&steps(path)).min(text.len())
}

/// 1-based line of a byte offset.
pub fn line_of(text: &str, offset: usize) -> usize {
    1 + text.as_bytes()[..offset.min(text.len())].iter().filter(|&&c| c == b'\n').count()
}

#[cfg(test)]
mod tests {
    use super::*;

    const SPEC: &str = "{\n  \"data\": {\"url\": \"d.csv\"},\n  \"layers\": [\n    {\"draw\": \"bar\", \"x\": \"k\"},\n    {\"draw\": \"point\",\n     \"stat\": {\"bin\": {\"rule\": \"nope\"}}}\n  ],\n  \"derive\": {\"a b\": \"x + 1\", \"c\\\"d\": \"1\"}\n}";

    fn at(path: &str) -> &str {
        &SPEC[offset(SPEC, path)..]
    }

    #[test]
    fn follows_keys_and_indexes() {
        assert!(at("layers[1].stat.bin.rule").starts_with("\"rule\": \"nope\""));
        assert!(at("layers[0].x").starts_with("\"x\": \"k\""));
        assert!(at("layers[1]").starts_with("{\"draw\": \"point\""));
        assert!(at("data.url").starts_with("\"url\""));
        assert_eq!(line_of(SPEC, offset(SPEC, "layers[1].stat.bin.rule")), 6);
    }

    #[test]
    fn quoted_keys_as_the_engine_writes_them() {
        assert!(at("derive.\"a b\"").starts_with("\"a b\""));
        assert!(at("derive.\"c\\\"d\"").starts_with("\"c\\\"d\""));
    }

    #[test]
    fn missing_parts_stop_at_the_deepest_found() {
        // `layers[0].y` is absent: the layer itself is the nearest place.
        assert!(at("layers[0].y").starts_with("{\"draw\": \"bar\""));
        assert!(at("layers[7]").starts_with("[\n    {"));
        assert_eq!(offset(SPEC, ""), 0);
        // Broken text never panics.
        for cut in 0..SPEC.len() {
            if SPEC.is_char_boundary(cut) {
                let _ = offset(&SPEC[..cut], "layers[1].stat.bin.rule");
            }
        }
    }
}
