//! Reading the files a page or a spec names, as a browser serving the site
//! would reach them and no further.
//!
//! A page handed to `strata bake` may have been written by anyone who can
//! open a pull request, so every file it names is resolved like a URL against
//! the site root (`--root`): HTML character references and percent-encoding
//! are decoded as a browser decodes them, `.` and `..` are resolved on the
//! URL path (a browser never climbs above the site's `/`), and then the file
//! system path, symbolic links resolved, must still lie under the root and be
//! a regular file. Reads go through a byte cap, so a huge file is refused
//! before its bytes are in memory. Refusals name the reference and the rule,
//! never the file's contents.

use std::fs::File;
use std::io::Read;
use std::path::{Path, PathBuf};

/// The most bytes read from one data file.
pub const MAX_DATA_BYTES: u64 = 128 << 20;
/// The most bytes read from one spec or page.
pub const MAX_TEXT_BYTES: u64 = 16 << 20;

/// The folder a page's files must come from.
#[derive(Debug, Clone)]
pub struct Site {
    root: PathBuf,
}

impl Site {
    /// The site rooted at `root` (an existing folder).
    pub fn new(root: &Path) -> Result<Site, String> {
        let root = std::fs::canonicalize(root).map_err(|e| format!("the site root {} cannot be used: {e}", root.display()))?;
        if !root.is_dir() {
            return Err(format!("the site root {} is not a folder", root.display()));
        }
        Ok(Site { root })
    }

    /// The URL path segments of a folder under the root (empty for the root).
    pub fn segments_of(&self, dir: &Path) -> Result<Vec<String>, String> {
        let dir = if dir.as_os_str().is_empty() { Path::new(".") } else { dir };
        let canon = std::fs::canonicalize(dir).map_err(|e| format!("cannot use the folder {}: {e}", dir.display()))?;
        let rel = canon.strip_prefix(&self.root).map_err(|_| format!("{} is outside the site root {} (give --root)", dir.display(), self.root.display()))?;
        Ok(rel.components().map(|c| c.as_os_str().to_string_lossy().into_owned()).collect())
    }

    /// Resolve a reference found in the page (already decoded of HTML
    /// character references when it came from an attribute) against the URL
    /// folder `base` (segments under the root), as a browser would; the
    /// result is a regular file under the root.
    pub fn resolve(&self, base: &[String], reference: &str) -> Result<PathBuf, String> {
        let segments = url_path(base, reference)?;
        let mut path = self.root.clone();
        for s in &segments {
            path.push(s);
        }
        let canon = std::fs::canonicalize(&path).map_err(|e| {
            let climbs = if reference.contains("..") || reference.to_ascii_lowercase().contains("%2e") {
                " (`..` never climbs above the site root; give --root for a wider site)"
            } else {
                ""
            };
            format!("cannot read `{reference}`: {}{climbs}", plain_io(&e))
        })?;
        if !canon.starts_with(&self.root) {
            return Err(format!("`{reference}` leads outside the site root through a symbolic link; only files under --root are read"));
        }
        let meta = std::fs::metadata(&canon).map_err(|e| format!("cannot read `{reference}`: {}", plain_io(&e)))?;
        if !meta.is_file() {
            return Err(format!("`{reference}` is not a regular file (a folder, device, pipe or socket); only regular files are read"));
        }
        Ok(canon)
    }
}

/// An I/O error without the path (the caller names the reference).
fn plain_io(e: &std::io::Error) -> String {
    match e.kind() {
        std::io::ErrorKind::NotFound => "no such file".into(),
        std::io::ErrorKind::PermissionDenied => "permission denied".into(),
        _ => e.to_string(),
    }
}

/// Read at most `cap` bytes of a file; a longer file is refused without
/// reading more than `cap + 1` bytes.
pub fn read_capped(path: &Path, cap: u64, what: &str) -> Result<Vec<u8>, String> {
    let f = File::open(path).map_err(|e| format!("cannot read {what} {}: {}", path.display(), plain_io(&e)))?;
    let mut out = Vec::new();
    f.take(cap + 1).read_to_end(&mut out).map_err(|e| format!("cannot read {what} {}: {}", path.display(), plain_io(&e)))?;
    if out.len() as u64 > cap {
        return Err(format!("{what} {} is larger than {} MB, the most Strata reads", path.display(), cap >> 20));
    }
    Ok(out)
}

/// Text through the cap; a leading byte order mark is dropped.
pub fn read_text_capped(path: &Path, cap: u64, what: &str) -> Result<String, String> {
    let bytes = read_capped(path, cap, what)?;
    let text = String::from_utf8(bytes).map_err(|_| format!("{what} {} is not UTF-8 text", path.display()))?;
    Ok(match text.strip_prefix('\u{feff}') {
        Some(t) => t.to_string(),
        None => text,
    })
}

/// The URL path a reference leads to from the folder `base`, as segments
/// under the site's `/`: the WHATWG URL parser's steps for a path-relative or
/// root-relative reference (strip surrounding C0 controls and spaces, drop
/// tabs and newlines, `\` as `/`, query and fragment cut, percent-decoding,
/// `.` and `..` segments, `%2e` counted as a dot; `..` at the root stays at
/// the root). References with a scheme or a host are refused.
pub fn url_path(base: &[String], reference: &str) -> Result<Vec<String>, String> {
    let trimmed = reference.trim_matches(|c: char| c <= ' ');
    let cleaned: String = trimmed.chars().filter(|c| !matches!(c, '\t' | '\n' | '\r')).map(|c| if c == '\\' { '/' } else { c }).collect();
    if cleaned.is_empty() {
        return Err("an empty file reference".into());
    }
    if cleaned.starts_with("//") || has_scheme(&cleaned) {
        return Err(format!("`{reference}` is not a file of this site; bake reads files under the site root only"));
    }
    let path = cleaned.split(['?', '#']).next().unwrap_or("");
    let (mut out, rest) = match path.strip_prefix('/') {
        Some(r) => (Vec::new(), r),
        None => (base.to_vec(), path),
    };
    let parts: Vec<&str> = rest.split('/').collect();
    for raw in &parts {
        let bytes = percent_decode(raw);
        let seg = String::from_utf8(bytes).map_err(|_| format!("`{reference}` does not decode to UTF-8 text"))?;
        if seg.contains(['/', '\\', '\0']) {
            return Err(format!("`{reference}` encodes a slash or a NUL in a file name; refused"));
        }
        match seg.as_str() {
            "." | "" => {}
            ".." => {
                out.pop();
            }
            _ => out.push(seg),
        }
    }
    if out.is_empty() {
        return Err(format!("`{reference}` names a folder, not a file"));
    }
    Ok(out)
}

fn has_scheme(s: &str) -> bool {
    let mut chars = s.chars();
    if !chars.next().is_some_and(|c| c.is_ascii_alphabetic()) {
        return false;
    }
    for c in chars {
        if c == ':' {
            return true;
        }
        if !(c.is_ascii_alphanumeric() || matches!(c, '+' | '-' | '.')) {
            return false;
        }
    }
    false
}

fn percent_decode(s: &str) -> Vec<u8> {
    let b = s.as_bytes();
    let mut out = Vec::with_capacity(b.len());
    let mut i = 0;
    while i < b.len() {
        if b[i] == b'%' && i + 2 < b.len() && b[i + 1].is_ascii_hexdigit() && b[i + 2].is_ascii_hexdigit() {
            let h = |c: u8| (c as char).to_digit(16).unwrap() as u8;
            out.push(h(b[i + 1]) * 16 + h(b[i + 2]));
            i += 3;
        } else {
            out.push(b[i]);
            i += 1;
        }
    }
    out
}

/// Decode the HTML character references of an attribute value as a browser
/// does (HTML Living Standard, "character reference state"): decimal and
/// hexadecimal references, and the named references that can spell a path or
/// a URL. Named ones the table lacks are left as written, which can only name
/// a different file under the root, never one outside it.
pub fn decode_entities(s: &str) -> String {
    const NAMED: [(&str, char); 33] = [
        ("amp", '&'),
        ("lt", '<'),
        ("gt", '>'),
        ("quot", '"'),
        ("apos", '\''),
        ("period", '.'),
        ("sol", '/'),
        ("bsol", '\\'),
        ("colon", ':'),
        ("percnt", '%'),
        ("num", '#'),
        ("quest", '?'),
        ("commat", '@'),
        ("lowbar", '_'),
        ("hyphen", '-'),
        ("dash", '-'),
        ("excl", '!'),
        ("dollar", '$'),
        ("equals", '='),
        ("plus", '+'),
        ("comma", ','),
        ("semi", ';'),
        ("lpar", '('),
        ("rpar", ')'),
        ("ast", '*'),
        ("midast", '*'),
        ("Tab", '\t'),
        ("NewLine", '\n'),
        ("nbsp", '\u{a0}'),
        ("tilde", '~'),
        ("grave", '`'),
        ("lsqb", '['),
        ("rsqb", ']'),
    ];
    let mut out = String::with_capacity(s.len());
    let mut rest = s;
    while let Some(i) = rest.find('&') {
        out.push_str(&rest[..i]);
        rest = &rest[i..];
        let after = &rest[1..];
        if let Some(num) = after.strip_prefix('#') {
            let (hex, digits) = match num.strip_prefix(['x', 'X']) {
                Some(h) => (true, h),
                None => (false, num),
            };
            let n = digits.chars().take_while(|c| if hex { c.is_ascii_hexdigit() } else { c.is_ascii_digit() }).count();
            if n > 0 {
                let radix = if hex { 16 } else { 10 };
                let v = digits[..n].chars().fold(0u32, |v, c| v.saturating_mul(radix).saturating_add(c.to_digit(radix).unwrap_or(0)));
                let c = char::from_u32(v).filter(|&c| c != '\0').unwrap_or('\u{fffd}');
                out.push(c);
                let used = 1 + 1 + usize::from(hex) + n;
                rest = &rest[used..];
                if let Some(r) = rest.strip_prefix(';') {
                    rest = r;
                }
                continue;
            }
        } else if let Some((name, c)) = NAMED.iter().find(|(name, _)| after.starts_with(name) && after[name.len()..].starts_with(';')) {
            out.push(*c);
            rest = &rest[1 + name.len() + 1..];
            continue;
        } else if let Some((name, c)) = [("amp", '&'), ("lt", '<'), ("gt", '>'), ("quot", '"')].iter().find(|(name, _)| after.starts_with(name)) {
            // Legacy references without the semicolon.
            out.push(*c);
            rest = &rest[1 + name.len()..];
            continue;
        }
        out.push('&');
        rest = &rest[1..];
    }
    out.push_str(rest);
    out
}

/// A reference (`src`, `spec-src`, `data.url`) made in `dir`, resolved under
/// the site root (`root`, or `dir` itself) by the rules of [`Site::resolve`].
pub fn local(dir: &Path, reference: &str, root: Option<&Path>) -> Result<PathBuf, String> {
    let dir = if dir.as_os_str().is_empty() { Path::new(".") } else { dir };
    let site = Site::new(root.unwrap_or(dir))?;
    let base = site.segments_of(dir)?;
    site.resolve(&base, &decode_entities(reference))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn segs(base: &[&str], r: &str) -> Result<String, String> {
        let base: Vec<String> = base.iter().map(|s| s.to_string()).collect();
        url_path(&base, r).map(|v| v.join("/"))
    }

    #[test]
    fn references_resolve_as_a_browser_resolves_them() {
        // WHATWG URL Standard, path state: `..` never climbs above the root,
        // `%2e` is a dot, `\` is a slash, query and fragment are cut.
        assert_eq!(segs(&["docs"], "d.csv").unwrap(), "docs/d.csv");
        assert_eq!(segs(&["docs"], "/data/x.csv").unwrap(), "data/x.csv");
        assert_eq!(segs(&["docs"], "../../../../etc/passwd").unwrap(), "etc/passwd");
        assert_eq!(segs(&[], "%2e%2e/%2E%2e/etc/passwd").unwrap(), "etc/passwd");
        assert_eq!(segs(&["a"], "..\\..\\x.csv?v=1#top").unwrap(), "x.csv");
        assert_eq!(segs(&["a"], " ./b/./c.csv ").unwrap(), "a/b/c.csv");
        assert_eq!(segs(&[], "my%20data.csv").unwrap(), "my data.csv");
        assert!(segs(&[], "a%2f..%2f..%2fetc%2fpasswd").is_err());
        assert!(segs(&[], "file:///etc/passwd").is_err());
        assert!(segs(&[], "https://example.org/d.csv").is_err());
        assert!(segs(&[], "//example.org/d.csv").is_err());
        assert!(segs(&[], "data:text/csv,a").is_err());
        assert!(segs(&[], "/").is_err());
    }

    #[test]
    fn character_references_decode_as_in_html() {
        // HTML Living Standard, named and numeric character references.
        assert_eq!(decode_entities("&period;&period;&sol;x"), "../x");
        assert_eq!(decode_entities("&#46;&#x2E;&#X2f;y"), "../y");
        assert_eq!(decode_entities("a&amp;b&ampc"), "a&b&c");
        assert_eq!(decode_entities("&unknown;&"), "&unknown;&");
        assert_eq!(decode_entities("&#0;&#99999999999;&#x000000002e"), "\u{fffd}\u{fffd}.");
    }
}
