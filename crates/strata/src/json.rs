//! JSON text to [`serde_json::Value`] and JSON strings out, without serde's
//! deserializer and serializer machinery (which weighed on the page engine).
//!
//! The reader keeps serde_json's behaviour exactly, so specs, data and shapes
//! read as before and every message stays: RFC 8259 grammar; numbers typed as
//! serde_json types them (`u64`, then `i64` for negatives, else `f64`; `-0`
//! is the float -0.0; a float out of range is "number out of range"); strings
//! with escapes and UTF-16 surrogate pairs, refusing lone surrogates, control
//! characters and invalid UTF-8; a repeated key keeps its first place and its
//! last value; no byte order mark (callers strip it); whitespace is space,
//! tab, line feed and carriage return; at most 127 nested arrays or objects
//! ("recursion limit exceeded" at the 128th), so hostile input can neither
//! overflow the stack nor hang; errors are serde_json's text with its line
//! and column (`EOF while parsing an object at line 1 column 5`). Floats are
//! read by [`parse_float`], the one place that turns number text into `f64`.
//! `tests/json_reader.rs` checks all of this against serde_json itself.
//!
//! The writer ([`write_str`], [`write_f64`], [`to_string`]) writes what
//! `serde_json::to_string` writes for a string, a float and a value. This module names nothing else in the
//! crate but the engine's one float parser, [`crate::format::float::parse`], and writes floats with
//! zmij, as serde_json does.

use serde_json::{Map, Number, Value};
use std::fmt;

/// A JSON syntax error: serde_json's message with its 1-based line and its
/// column (bytes since the line's start, as serde_json counts them).
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Error {
    what: &'static str,
    line: usize,
    column: usize,
}

impl Error {
    pub fn line(&self) -> usize {
        self.line
    }
    pub fn column(&self) -> usize {
        self.column
    }
}

impl fmt::Display for Error {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{} at line {} column {}", self.what, self.line, self.column)
    }
}

impl std::error::Error for Error {}

const EOF_LIST: &str = "EOF while parsing a list";
const EOF_OBJECT: &str = "EOF while parsing an object";
const EOF_STRING: &str = "EOF while parsing a string";
const EOF_VALUE: &str = "EOF while parsing a value";
const COLON: &str = "expected `:`";
const LIST_COMMA_OR_END: &str = "expected `,` or `]`";
const OBJECT_COMMA_OR_END: &str = "expected `,` or `}`";
const IDENT: &str = "expected ident";
const VALUE: &str = "expected value";
const INVALID_ESCAPE: &str = "invalid escape";
const INVALID_NUMBER: &str = "invalid number";
const OUT_OF_RANGE: &str = "number out of range";
const CODE_POINT: &str = "invalid unicode code point";
const CONTROL: &str = "control character (\\u0000-\\u001F) found while parsing a string";
const KEY_STRING: &str = "key must be a string";
const LONE_SURROGATE: &str = "lone leading surrogate in hex escape";
const TRAILING_COMMA: &str = "trailing comma";
const TRAILING: &str = "trailing characters";
const HEX_END: &str = "unexpected end of hex escape";
const RECURSION: &str = "recursion limit exceeded";

/// Number text (JSON's grammar, already checked) to `f64`: the engine's one
/// float reader for JSON.
pub fn parse_float(text: &str) -> f64 {
    crate::format::float::parse(text).unwrap_or(f64::NAN)
}

/// Parse JSON text (serde_json::from_str).
pub fn from_str(text: &str) -> Result<Value, Error> {
    from_slice(text.as_bytes())
}

/// Parse JSON bytes (serde_json::from_slice): strings must be UTF-8.
pub fn from_slice(bytes: &[u8]) -> Result<Value, Error> {
    let mut r = Reader { b: bytes, i: 0, depth: 128 };
    let v = r.value()?;
    r.space();
    if r.i < bytes.len() {
        return Err(r.peek_err(TRAILING));
    }
    Ok(v)
}

struct Reader<'a> {
    b: &'a [u8],
    i: usize,
    /// Levels of nesting left (serde_json's limit: 128).
    depth: u8,
}

impl Reader<'_> {
    fn peek(&self) -> Option<u8> {
        self.b.get(self.i).copied()
    }
    fn next(&mut self) -> Option<u8> {
        let c = self.peek()?;
        self.i += 1;
        Some(c)
    }
    /// The error of a byte already read (serde_json's `error`).
    fn err(&self, what: &'static str) -> Error {
        self.at(what, self.i)
    }
    /// The error of the byte looked at (serde_json's `peek_error`).
    fn peek_err(&self, what: &'static str) -> Error {
        self.at(what, (self.i + 1).min(self.b.len()))
    }
    fn at(&self, what: &'static str, i: usize) -> Error {
        let head = &self.b[..i];
        let line_start = head.iter().rposition(|&c| c == b'\n').map_or(0, |p| p + 1);
        Error { what, line: 1 + head[..line_start].iter().filter(|&&c| c == b'\n').count(), column: i - line_start }
    }
    fn space(&mut self) {
        while let Some(b' ' | b'\n' | b'\t' | b'\r') = self.peek() {
            self.i += 1;
        }
    }

    fn value(&mut self) -> Result<Value, Error> {
        self.space();
        let Some(c) = self.peek() else { return Err(self.peek_err(EOF_VALUE)) };
        Ok(match c {
            b'n' => self.ident(b"null", Value::Null)?,
            b't' => self.ident(b"true", Value::Bool(true))?,
            b'f' => self.ident(b"false", Value::Bool(false))?,
            b'-' | b'0'..=b'9' => self.number()?,
            b'"' => {
                self.i += 1;
                Value::String(self.string()?)
            }
            b'[' | b'{' => {
                self.depth -= 1;
                if self.depth == 0 {
                    return Err(self.peek_err(RECURSION));
                }
                self.i += 1;
                let v = if c == b'[' { Value::Array(self.array()?) } else { Value::Object(self.object()?) };
                self.depth += 1;
                // The closing bracket, which ended the loop.
                self.i += 1;
                v
            }
            _ => return Err(self.peek_err(VALUE)),
        })
    }

    fn ident(&mut self, word: &[u8], v: Value) -> Result<Value, Error> {
        self.i += 1;
        for &want in &word[1..] {
            match self.next() {
                None => return Err(self.err(EOF_VALUE)),
                Some(c) if c != want => return Err(self.err(IDENT)),
                Some(_) => {}
            }
        }
        Ok(v)
    }

    /// Before each item: the first one, or a comma then one; `Ok(false)` at
    /// the closing bracket.
    fn more(&mut self, first: &mut bool, close: u8, eof: &'static str, comma_or_end: &'static str) -> Result<bool, Error> {
        self.space();
        let Some(c) = self.peek() else { return Err(self.peek_err(eof)) };
        if c == close {
            return Ok(false);
        }
        if std::mem::take(first) {
            return if close == b'}' && c != b'"' { Err(self.peek_err(KEY_STRING)) } else { Ok(true) };
        }
        if c != b',' {
            return Err(self.peek_err(comma_or_end));
        }
        self.i += 1;
        self.space();
        match self.peek() {
            None => Err(self.peek_err(EOF_VALUE)),
            Some(c) if c == close => Err(self.peek_err(TRAILING_COMMA)),
            Some(c) if close == b'}' && c != b'"' => Err(self.peek_err(KEY_STRING)),
            Some(_) => Ok(true),
        }
    }

    fn array(&mut self) -> Result<Vec<Value>, Error> {
        let mut items = Vec::new();
        let mut first = true;
        while self.more(&mut first, b']', EOF_LIST, LIST_COMMA_OR_END)? {
            items.push(self.value()?);
        }
        Ok(items)
    }

    fn object(&mut self) -> Result<Map<String, Value>, Error> {
        let mut map = Map::new();
        let mut first = true;
        while self.more(&mut first, b'}', EOF_OBJECT, OBJECT_COMMA_OR_END)? {
            self.i += 1;
            let key = self.string()?;
            self.space();
            match self.peek() {
                Some(b':') => self.i += 1,
                Some(_) => return Err(self.peek_err(COLON)),
                None => return Err(self.peek_err(EOF_OBJECT)),
            }
            let v = self.value()?;
            map.insert(key, v);
        }
        Ok(map)
    }

    /// A string's contents after its opening quote, through its closing one.
    fn string(&mut self) -> Result<String, Error> {
        let mut out = Vec::new();
        let mut start = self.i;
        loop {
            while let Some(c) = self.peek() {
                if c == b'"' || c == b'\\' || c < 0x20 {
                    break;
                }
                self.i += 1;
            }
            let Some(c) = self.next() else { return Err(self.err(EOF_STRING)) };
            out.extend_from_slice(&self.b[start..self.i - 1]);
            match c {
                b'"' => {
                    return String::from_utf8(out).map_err(|e| {
                        // serde_json points back from the closing quote by the
                        // bytes after the last valid one.
                        let mut err = self.err(CODE_POINT);
                        err.column = err.column.saturating_sub(e.as_bytes().len() - e.utf8_error().valid_up_to());
                        err
                    });
                }
                b'\\' => self.escape(&mut out)?,
                _ => return Err(self.err(CONTROL)),
            }
            start = self.i;
        }
    }

    fn escape(&mut self, out: &mut Vec<u8>) -> Result<(), Error> {
        let Some(c) = self.next() else { return Err(self.err(EOF_STRING)) };
        let byte = match c {
            b'"' | b'\\' | b'/' => c,
            b'b' => 8,
            b'f' => 12,
            b'n' => b'\n',
            b'r' => b'\r',
            b't' => b'\t',
            b'u' => {
                let mut n = self.hex4()? as u32;
                if (0xDC00..=0xDFFF).contains(&n) {
                    return Err(self.err(LONE_SURROGATE));
                }
                if (0xD800..=0xDBFF).contains(&n) {
                    for want in [b'\\', b'u'] {
                        match self.next() {
                            None => return Err(self.err(EOF_STRING)),
                            Some(c) if c != want => return Err(self.err(HEX_END)),
                            Some(_) => {}
                        }
                    }
                    let low = self.hex4()? as u32;
                    if !(0xDC00..=0xDFFF).contains(&low) {
                        return Err(self.err(LONE_SURROGATE));
                    }
                    n = 0x1_0000 + ((n - 0xD800) << 10) + (low - 0xDC00);
                }
                let ch = char::from_u32(n).unwrap_or(char::REPLACEMENT_CHARACTER);
                out.extend_from_slice(ch.encode_utf8(&mut [0; 4]).as_bytes());
                return Ok(());
            }
            _ => return Err(self.err(INVALID_ESCAPE)),
        };
        out.push(byte);
        Ok(())
    }

    fn hex4(&mut self) -> Result<u16, Error> {
        let Some(digits) = self.b.get(self.i..self.i + 4) else {
            self.i = self.b.len();
            return Err(self.err(EOF_STRING));
        };
        self.i += 4;
        let mut n = 0u16;
        for &d in digits {
            let v = match d {
                b'0'..=b'9' => d - b'0',
                b'a'..=b'f' => d - b'a' + 10,
                b'A'..=b'F' => d - b'A' + 10,
                _ => return Err(self.err(INVALID_ESCAPE)),
            };
            n = n << 4 | v as u16;
        }
        Ok(n)
    }

    fn digits(&mut self) {
        while let Some(b'0'..=b'9') = self.peek() {
            self.i += 1;
        }
    }

    /// A number from its first byte (`-` or a digit).
    fn number(&mut self) -> Result<Value, Error> {
        let start = self.i;
        let negative = self.peek() == Some(b'-');
        self.i += negative as usize;
        match self.next() {
            None => return Err(self.err(EOF_VALUE)),
            Some(b'0') => {
                if let Some(b'0'..=b'9') = self.peek() {
                    return Err(self.peek_err(INVALID_NUMBER));
                }
            }
            Some(b'1'..=b'9') => self.digits(),
            Some(_) => return Err(self.err(INVALID_NUMBER)),
        }
        let int_end = self.i;
        let mut float = false;
        if self.peek() == Some(b'.') {
            self.i += 1;
            float = true;
            match self.peek() {
                Some(b'0'..=b'9') => self.digits(),
                Some(_) => return Err(self.peek_err(INVALID_NUMBER)),
                None => return Err(self.peek_err(EOF_VALUE)),
            }
        }
        if let Some(b'e' | b'E') = self.peek() {
            self.i += 1;
            float = true;
            let positive_exp = self.peek() != Some(b'-');
            if let Some(b'+' | b'-') = self.peek() {
                self.i += 1;
            }
            let mut exp = match self.next() {
                None => return Err(self.err(EOF_VALUE)),
                Some(c @ b'0'..=b'9') => (c - b'0') as i32,
                Some(_) => return Err(self.err(INVALID_NUMBER)),
            };
            while let Some(c @ b'0'..=b'9') = self.peek() {
                self.i += 1;
                match exp.checked_mul(10).and_then(|e| e.checked_add((c - b'0') as i32)) {
                    Some(e) => exp = e,
                    None => {
                        // serde_json: an exponent past i32 is out of range
                        // (growing) or zero (shrinking, or zero digits).
                        let mantissa = &self.b[start + negative as usize..self.i];
                        let zero = mantissa.iter().take_while(|&&c| c != b'e' && c != b'E').all(|&c| c == b'0' || c == b'.');
                        if positive_exp && !zero {
                            return Err(self.err(OUT_OF_RANGE));
                        }
                        self.digits();
                        return Ok(Value::Number(Number::from_f64(if negative { -0.0 } else { 0.0 }).unwrap_or_else(|| 0.into())));
                    }
                }
            }
        }
        if !float {
            let digits = &self.b[start + negative as usize..int_end];
            let int = digits.iter().try_fold(0u64, |n, &d| n.checked_mul(10)?.checked_add((d - b'0') as u64));
            match (int, negative) {
                (Some(n), false) => return Ok(Value::Number(n.into())),
                (Some(n), true) if n != 0 && n <= 1 << 63 => return Ok(Value::Number((n.wrapping_neg() as i64).into())),
                _ => {}
            }
        }
        // The text is ASCII digits, signs, `.` and `e`.
        let text = std::str::from_utf8(&self.b[start..self.i]).unwrap_or("");
        let f = parse_float(text);
        if f.is_infinite() {
            return Err(self.err(OUT_OF_RANGE));
        }
        Ok(Number::from_f64(f).map_or(Value::Null, Value::Number))
    }
}

/// `v` as compact JSON text, what `v.to_string()` (serde_json's `Display`)
/// gives.
pub fn to_string(v: &Value) -> String {
    let mut out = String::new();
    write_value(&mut out, v);
    out
}

/// Append `v` as compact JSON text.
pub fn write_value(out: &mut String, v: &Value) {
    match v {
        Value::Null => out.push_str("null"),
        Value::Bool(b) => out.push_str(if *b { "true" } else { "false" }),
        Value::Number(n) => match (n.as_u64(), n.as_i64(), n.as_f64()) {
            (Some(u), ..) => out.push_str(&u.to_string()),
            (None, Some(i), _) => out.push_str(&i.to_string()),
            (.., f) => write_f64(out, f.unwrap_or(f64::NAN)),
        },
        Value::String(s) => write_str(out, s),
        Value::Array(items) => {
            out.push('[');
            for (i, item) in items.iter().enumerate() {
                if i > 0 {
                    out.push(',');
                }
                write_value(out, item);
            }
            out.push(']');
        }
        Value::Object(map) => {
            out.push('{');
            for (i, (k, item)) in map.iter().enumerate() {
                if i > 0 {
                    out.push(',');
                }
                write_str(out, k);
                out.push(':');
                write_value(out, item);
            }
            out.push('}');
        }
    }
}

/// Write `s` as a JSON string, quoted and escaped as serde_json writes it:
/// `\"`, `\\`, `\b`, `\f`, `\n`, `\r`, `\t`, other control characters as
/// `\u00xx`, everything else as it is.
pub fn write_str(out: &mut String, s: &str) {
    out.push('"');
    let mut start = 0;
    for (i, b) in s.bytes().enumerate() {
        let short = match b {
            b'"' => '"',
            b'\\' => '\\',
            8 => 'b',
            12 => 'f',
            b'\n' => 'n',
            b'\r' => 'r',
            b'\t' => 't',
            0..=0x1F => 'u',
            _ => continue,
        };
        out.push_str(&s[start..i]);
        out.push('\\');
        out.push(short);
        if short == 'u' {
            const HEX: &[u8; 16] = b"0123456789abcdef";
            out.push_str("00");
            out.push(HEX[(b >> 4) as usize] as char);
            out.push(HEX[(b & 15) as usize] as char);
        }
        start = i + 1;
    }
    out.push_str(&s[start..]);
    out.push('"');
}

/// Write `f` as serde_json writes an `f64` (zmij's layout of the shortest
/// digits that read back to `f`): plain from 1e-5 to below 1e16 (`300.0`,
/// `0.001234`), else `1e+16`, `1.5e-7`; NaN and infinities as `null`.
pub fn write_f64(out: &mut String, f: f64) {
    if !f.is_finite() {
        out.push_str("null");
        return;
    }
    // serde_json writes a finite f64 with zmij's `format_finite`; so does
    // this (core's `{:e}` would bring its float printing back into the page).
    out.push_str(zmij::Buffer::new().format_finite(f));
}
