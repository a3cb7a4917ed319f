//! Arrow IPC (file and stream formats) read straight from the wire: the
//! message headers through the format's generated flatbuffer bindings
//! (`arrow_ipc::gen`, re-exported at the crate's root), the column buffers
//! by the code below. No Arrow array code is reachable from here, which
//! keeps the page's Arrow add-on (`strata-wasm-arrow`) small.
//!
//! Every column is normalised to one of the table's types: signed and unsigned integers widen to
//! integers (UInt64 with values past i64::MAX becomes numbers); Float16/32
//! and Decimal128 become numbers; Utf8, LargeUtf8, Utf8View, null columns
//! and dictionary-encoded columns become text (or whatever their dictionary
//! values normalise to); Date32 and Date64 become dates; timestamps of any
//! unit become milliseconds (seconds scale up, micro- and nanoseconds round
//! toward negative infinity; a zone needs no shift, Arrow stores instants in
//! UTC). Other types (binary, lists, structs, durations, times of day,
//! decimals of other widths) are left out with a warning naming the column.
//!
//! Buffer layouts follow the Arrow columnar format's IPC chapter: one field
//! node per field in pre-order, and per field its buffers in order
//! (validity first). Every length and offset is checked against the bytes
//! there are, so damaged input is an error, never a panic.

use super::columns::{retype, unique_names};
use super::table::{Column, Ints, TextBuilder};
use super::{Nums, ReadOptions, Table};
use crate::error::{Diagnostic, Errors};
use arrow_ipc as fb;

fn invalid(msg: impl Into<String>) -> Errors {
    Diagnostic::error("data.arrow_invalid", format!("the Arrow IPC data is damaged: {}", msg.into()))
        .with_hint("check that the file is a complete Arrow IPC file or stream")
        .into()
}

fn header_error(e: impl std::fmt::Display) -> Errors {
    invalid(format!("a message header is not valid ({e})"))
}

fn read_u32(b: &[u8], pos: usize) -> Option<u32> {
    b.get(pos..pos + 4).map(|s| u32::from_le_bytes([s[0], s[1], s[2], s[3]]))
}

/// A type Strata reads, as the column's values are laid out.
#[derive(Clone, Copy, Debug, PartialEq)]
enum Val {
    Null,
    Bool,
    Int {
        bytes: usize,
        signed: bool,
    },
    /// Float16, Float32 or Float64 (2, 4 or 8 bytes).
    Float(usize),
    Decimal128 {
        scale: i32,
    },
    /// Date32 (days) or Date64 (milliseconds).
    Date {
        millis: bool,
    },
    /// Timestamp: how many of its units make a millisecond (negative: that
    /// many milliseconds make a unit).
    Timestamp {
        per_ms: i64,
    },
    /// Utf8 (4-byte offsets) or LargeUtf8 (8-byte offsets).
    Utf8 {
        offset: usize,
    },
    Utf8View,
}

/// The field's value type, when Strata reads it (a dictionary-encoded
/// field's values are of this type).
fn val_of(f: &fb::Field) -> Option<Val> {
    use fb::Type as T;
    Some(match f.type_type() {
        T::Null => Val::Null,
        T::Bool => Val::Bool,
        T::Int => {
            let i = f.type_as_int()?;
            let bytes = match i.bitWidth() {
                8 => 1,
                16 => 2,
                32 => 4,
                64 => 8,
                _ => return None,
            };
            Val::Int { bytes, signed: i.is_signed() }
        }
        T::FloatingPoint => Val::Float(match f.type_as_floating_point()?.precision() {
            fb::Precision::HALF => 2,
            fb::Precision::SINGLE => 4,
            fb::Precision::DOUBLE => 8,
            _ => return None,
        }),
        T::Decimal => {
            let d = f.type_as_decimal()?;
            if d.bitWidth() != 128 {
                return None;
            }
            Val::Decimal128 { scale: d.scale() }
        }
        T::Date => Val::Date { millis: f.type_as_date()?.unit() == fb::DateUnit::MILLISECOND },
        T::Timestamp => Val::Timestamp {
            per_ms: match f.type_as_timestamp()?.unit() {
                fb::TimeUnit::SECOND => -1000,
                fb::TimeUnit::MILLISECOND => 1,
                fb::TimeUnit::MICROSECOND => 1000,
                fb::TimeUnit::NANOSECOND => 1_000_000,
                _ => return None,
            },
        },
        T::Utf8 => Val::Utf8 { offset: 4 },
        T::LargeUtf8 => Val::Utf8 { offset: 8 },
        T::Utf8View => Val::Utf8View,
        _ => return None,
    })
}

/// The name of a field's Arrow type, for messages.
fn type_name(f: &fb::Field) -> String {
    let t = f.type_type().variant_name().unwrap_or("unknown").trim_end_matches('_');
    match f.dictionary() {
        Some(_) => format!("Dictionary({t})"),
        None => t.to_string(),
    }
}

fn children<'a>(f: &fb::Field<'a>) -> Vec<fb::Field<'a>> {
    f.children().map(|c| c.iter().collect()).unwrap_or_default()
}

/// Every dictionary-encoded field in `f` and below.
fn dictionary_fields<'a>(f: fb::Field<'a>, out: &mut Vec<fb::Field<'a>>) {
    if f.dictionary().is_some() {
        out.push(f);
    }
    for c in children(&f) {
        dictionary_fields(c, out);
    }
}

/// One record batch's field nodes and buffers, taken in order.
struct Batch<'a> {
    body: &'a [u8],
    nodes: Vec<(i64, i64)>,
    buffers: Vec<(i64, i64)>,
    variadic: Vec<i64>,
    v5: bool,
    /// The batch's length: no column it holds is longer.
    rows: usize,
    node: usize,
    buffer: usize,
    view: usize,
}

impl<'a> Batch<'a> {
    fn new(rb: fb::RecordBatch<'a>, body: &'a [u8], v5: bool) -> Result<Batch<'a>, Errors> {
        if let Some(c) = rb.compression() {
            // Compressed bodies are well-formed Arrow, just not readable here:
            // say so rather than call the file damaged.
            let codec = if c.codec() == fb::CompressionType::ZSTD { "zstd" } else { "LZ4" };
            return Err(Diagnostic::error("data.arrow_compressed", format!("the Arrow IPC data is compressed ({codec}); compression is not supported"))
                .with_hint(
                    "write the file without compression (pyarrow: IpcWriteOptions(compression=None); arrow-rs: IpcWriteOptions::try_with_compression(None))",
                )
                .into());
        }
        if rb.length() < 0 {
            return Err(invalid("a record batch has a negative length"));
        }
        let nodes: Vec<(i64, i64)> = rb.nodes().iter().flatten().map(|n| (n.length(), n.null_count())).collect();
        if nodes.iter().any(|(l, n)| *l < 0 || *n < 0) {
            return Err(invalid("a field node has a negative length"));
        }
        let buffers: Vec<(i64, i64)> = rb.buffers().iter().flatten().map(|b| (b.offset(), b.length())).collect();
        for &(off, len) in &buffers {
            if off < 0 || len < 0 || (off as u64).saturating_add(len as u64) > body.len() as u64 {
                return Err(invalid("a buffer lies outside its message body"));
            }
        }
        let variadic = rb.variadicBufferCounts().map(|v| v.iter().collect()).unwrap_or_default();
        Ok(Batch { body, nodes, buffers, variadic, v5, rows: rb.length() as usize, node: 0, buffer: 0, view: 0 })
    }

    fn next_node(&mut self) -> Result<(usize, usize), Errors> {
        let &(len, nulls) = self.nodes.get(self.node).ok_or_else(|| invalid("a record batch has fewer field nodes than the schema has fields"))?;
        self.node += 1;
        Ok((len as usize, nulls as usize))
    }

    fn next_buffer(&mut self) -> Result<&'a [u8], Errors> {
        let &(off, len) = self.buffers.get(self.buffer).ok_or_else(|| invalid("a record batch has fewer buffers than its schema needs"))?;
        self.buffer += 1;
        let body: &'a [u8] = self.body;
        Ok(&body[off as usize..(off + len) as usize])
    }

    fn next_view_count(&mut self) -> Result<usize, Errors> {
        let n = *self.variadic.get(self.view).ok_or_else(|| invalid("a view column has no buffer count"))?;
        self.view += 1;
        if !(0..=1 << 20).contains(&n) {
            return Err(invalid("a view column has a wrong buffer count"));
        }
        Ok(n as usize)
    }

    /// Pass over a field this reader leaves out (and its children).
    fn skip(&mut self, f: &fb::Field) -> Result<(), Errors> {
        use fb::Type as T;
        self.next_node()?;
        if f.dictionary().is_some() {
            self.buffer += 2;
            return Ok(());
        }
        let own = match f.type_type() {
            T::Null | T::RunEndEncoded => 0,
            T::Struct_ | T::FixedSizeList => 1,
            T::Utf8 | T::Binary | T::LargeUtf8 | T::LargeBinary | T::ListView | T::LargeListView => 3,
            T::Utf8View | T::BinaryView => 2 + self.next_view_count()?,
            T::Union => {
                let dense = f.type_as_union().is_some_and(|u| u.mode() == fb::UnionMode::Dense);
                usize::from(!self.v5) + 1 + usize::from(dense)
            }
            _ => 2,
        };
        self.buffer += own;
        for c in children(f) {
            self.skip(&c)?;
        }
        Ok(())
    }

    /// The next field's values as a column of one of the table's types.
    fn column(&mut self, v: Val, name: &str) -> Result<Column, Errors> {
        let (len, nulls) = self.next_node()?;
        // (Checked before anything is allocated for the column; the batch's
        // length is under the row cap.)
        if len > self.rows {
            return Err(invalid(format!("column `{name}` is longer than its record batch")));
        }
        if v == Val::Null {
            return Ok(Column::Text(std::iter::repeat_n(None::<&str>, len).collect()));
        }
        let validity = self.next_buffer()?;
        let short = || invalid(format!("a buffer of column `{name}` is shorter than its values"));
        // Arrow-rs keeps a validity bitmap only when the node counts nulls.
        let valid: Option<Vec<bool>> = if nulls > 0 {
            if validity.len() < len.div_ceil(8) {
                return Err(short());
            }
            Some((0..len).map(|i| validity[i / 8] >> (i % 8) & 1 == 1).collect())
        } else {
            None
        };
        let ok = |i: usize| valid.as_ref().is_none_or(|m| m[i]);
        let fixed = |b: &'a [u8], w: usize| -> Result<std::slice::ChunksExact<'a, u8>, Errors> {
            let n = len.checked_mul(w).filter(|n| *n <= b.len()).ok_or_else(short)?;
            Ok(b[..n].chunks_exact(w))
        };
        // Numbers with NaN in the null slots (none: the values as they are).
        let numbers = |values: Vec<f64>| -> Nums {
            match &valid {
                None => values.into(),
                Some(m) => values.iter().zip(m).map(|(x, ok)| ok.then_some(*x)).collect(),
            }
        };
        Ok(match v {
            Val::Null => unreachable!("handled above"),
            Val::Bool => {
                let b = self.next_buffer()?;
                if b.len() < len.div_ceil(8) {
                    return Err(short());
                }
                Column::Bool((0..len).map(|i| ok(i).then_some(b[i / 8] >> (i % 8) & 1 == 1)).collect())
            }
            Val::Int { bytes, signed } => {
                let values: Vec<i64> = fixed(self.next_buffer()?, bytes)?.map(|c| int(c, signed)).collect();
                if bytes == 8 && !signed {
                    let unsigned = |x: i64| x as u64;
                    if values.iter().any(|x| unsigned(*x) > i64::MAX as u64) {
                        return Ok(Column::Float(numbers(values.iter().map(|x| unsigned(*x) as f64).collect())));
                    }
                }
                Column::Int(Ints { values, valid })
            }
            Val::Float(bytes) => Column::Float(numbers(
                fixed(self.next_buffer()?, bytes)?
                    .map(|c| match bytes {
                        2 => half(u16::from_le_bytes([c[0], c[1]])),
                        4 => f32::from_le_bytes([c[0], c[1], c[2], c[3]]) as f64,
                        _ => f64::from_le_bytes([c[0], c[1], c[2], c[3], c[4], c[5], c[6], c[7]]),
                    })
                    .collect(),
            )),
            Val::Decimal128 { scale } => {
                let div = pow10(scale);
                let mut w = [0u8; 16];
                Column::Float(numbers(
                    fixed(self.next_buffer()?, 16)?
                        .map(|c| {
                            w.copy_from_slice(c);
                            i128::from_le_bytes(w) as f64 / div
                        })
                        .collect(),
                ))
            }
            Val::Date { millis } => {
                let b = self.next_buffer()?;
                let days: Vec<i64> = if millis {
                    fixed(b, 8)?.map(|c| int(c, true).div_euclid(86_400_000).clamp(i32::MIN as i64, i32::MAX as i64)).collect()
                } else {
                    fixed(b, 4)?.map(|c| int(c, true)).collect()
                };
                Column::Date(days.iter().enumerate().map(|(i, d)| ok(i).then_some(*d as f64)).collect())
            }
            Val::Timestamp { per_ms } => {
                let ms = |v: i64| match per_ms {
                    p if p < 0 => v.saturating_mul(-p),
                    p => v.div_euclid(p),
                };
                let values: Vec<i64> = fixed(self.next_buffer()?, 8)?.map(|c| ms(int(c, true))).collect();
                Column::DateTime(values.iter().enumerate().map(|(i, x)| ok(i).then_some(*x as f64)).collect())
            }
            Val::Utf8 { offset } => {
                let offsets: Vec<i64> = self.next_buffer()?.chunks_exact(offset).take(len + 1).map(|c| int(c, true)).collect();
                let data = self.next_buffer()?;
                // `len + 1` offsets; an empty column may have none.
                if len > 0 && offsets.len() < len + 1 {
                    return Err(short());
                }
                let mut b = TextBuilder::with_capacity(len);
                for i in 0..len {
                    if !ok(i) {
                        b.push(None);
                        continue;
                    }
                    let (Some(&s), Some(&e)) = (offsets.get(i), offsets.get(i + 1)) else { return Err(short()) };
                    if s < 0 || e < s || e as u64 > data.len() as u64 {
                        return Err(invalid(format!("an offset of column `{name}` lies outside its data")));
                    }
                    b.push(Some(text(&data[s as usize..e as usize], name)?));
                }
                Column::Text(utf8(b, name)?)
            }
            Val::Utf8View => {
                let views = self.next_buffer()?;
                let n = self.next_view_count()?;
                let mut data = Vec::with_capacity(n);
                for _ in 0..n {
                    data.push(self.next_buffer()?);
                }
                let views = fixed(views, 16)?;
                let mut b = TextBuilder::with_capacity(len);
                for (i, v) in views.enumerate() {
                    if !ok(i) {
                        b.push(None);
                        continue;
                    }
                    let l = int(&v[0..4], true);
                    let s: Option<&[u8]> = if (0..=12).contains(&l) {
                        Some(&v[4..4 + l as usize])
                    } else {
                        let (buf, off) = (int(&v[8..12], true), int(&v[12..16], true));
                        usize::try_from(buf).ok().and_then(|k| data.get(k)).and_then(|d| {
                            let (off, l) = (usize::try_from(off).ok()?, usize::try_from(l).ok()?);
                            d.get(off..off.checked_add(l)?)
                        })
                    };
                    let s = s.ok_or_else(|| invalid(format!("a view of column `{name}` lies outside its data")))?;
                    b.push(Some(text(s, name)?));
                }
                Column::Text(utf8(b, name)?)
            }
        })
    }
}

/// One value's bytes, checked as UTF-8 on its own (the column's text
/// together may be valid where a value alone splits a character).
fn text<'b>(b: &'b [u8], name: &str) -> Result<&'b [u8], Errors> {
    match std::str::from_utf8(b) {
        Ok(_) => Ok(b),
        Err(_) => Err(invalid(format!("column `{name}` has text that is not UTF-8"))),
    }
}

fn utf8(b: TextBuilder, name: &str) -> Result<super::table::Text, Errors> {
    b.finish_checked().map_err(|_| invalid(format!("column `{name}` has text that is not UTF-8")))
}

/// A little-endian integer of 1, 2, 4 or 8 bytes.
fn int(c: &[u8], signed: bool) -> i64 {
    let mut w = [0u8; 8];
    w[..c.len()].copy_from_slice(c);
    let v = u64::from_le_bytes(w);
    let bits = 8 * c.len() as u32;
    if signed && bits < 64 {
        // Sign-extend from the top bit of the value.
        ((v << (64 - bits)) as i64) >> (64 - bits)
    } else {
        v as i64
    }
}

/// An IEEE 754 binary16 value (exact in f64).
fn half(h: u16) -> f64 {
    let sign = if h >> 15 == 1 { -1.0 } else { 1.0 };
    let exp = (h >> 10 & 0x1f) as i32;
    let frac = (h & 0x3ff) as f64;
    sign * match exp {
        0 => frac * (2f64).powi(-24),
        31 if frac == 0.0 => f64::INFINITY,
        31 => f64::NAN,
        e => (1.0 + frac / 1024.0) * (2f64).powi(e - 15),
    }
}

/// 10^k as f64 by repeated multiplication (exact up to 10^22), as the
/// `arrow-array` reader divides decimals.
fn pow10(k: i32) -> f64 {
    let mut v = 1.0;
    for _ in 0..k.unsigned_abs().min(400) {
        v *= 10.0;
    }
    if k < 0 {
        1.0 / v
    } else {
        v
    }
}

/// One encapsulated message: its header and body.
struct Msg<'a> {
    msg: fb::Message<'a>,
    body: &'a [u8],
}

impl<'a> Msg<'a> {
    fn parse(meta: &'a [u8], body: &'a [u8]) -> Result<Msg<'a>, Errors> {
        let msg = fb::root_as_message(meta).map_err(header_error)?;
        let declared = msg.bodyLength();
        if declared < 0 {
            return Err(invalid("a message has a negative body length"));
        }
        Ok(Msg { msg, body: &body[..body.len().min(declared as usize)] })
    }
    fn v5(&self) -> bool {
        self.msg.version() >= fb::MetadataVersion::V5
    }
}

/// The messages of a stream.
fn stream_messages(b: &[u8]) -> Result<Vec<Msg<'_>>, Errors> {
    let mut pos = 0;
    let mut out = Vec::new();
    while let Some(mut len) = read_u32(b, pos) {
        pos += 4;
        if len == 0xFFFF_FFFF {
            let Some(l) = read_u32(b, pos) else { break };
            len = l;
            pos += 4;
        }
        let len = len as i32;
        if len == 0 {
            break;
        }
        if len < 0 || pos + len as usize > b.len() {
            return Err(invalid("a message header runs past the end of the data"));
        }
        let meta = &b[pos..pos + len as usize];
        pos += len as usize;
        let msg = fb::root_as_message(meta).map_err(header_error)?;
        let body = msg.bodyLength();
        if body < 0 || (pos as u64).saturating_add(body as u64) > b.len() as u64 {
            return Err(invalid("a message body runs past the end of the data"));
        }
        out.push(Msg::parse(meta, &b[pos..pos + body as usize])?);
        pos += body as usize;
    }
    Ok(out)
}

/// The schema and the dictionary and record-batch messages of a file.
fn file_messages(b: &[u8]) -> Result<(fb::Schema<'_>, Vec<Msg<'_>>), Errors> {
    let n = b.len();
    if n < 8 + 10 || &b[n - 6..] != b"ARROW1" {
        return Err(invalid("the file is cut short (no closing `ARROW1` footer)"));
    }
    let footer_len = read_u32(b, n - 10).unwrap_or(0) as i32;
    if footer_len < 0 || (footer_len as usize) > n - 10 - 8 {
        return Err(invalid("the footer length is wrong"));
    }
    let footer = fb::root_as_footer(&b[n - 10 - footer_len as usize..n - 10]).map_err(|e| invalid(format!("the footer is not valid ({e})")))?;
    let schema = footer.schema().ok_or_else(|| invalid("the footer has no schema"))?;
    let mut out = Vec::new();
    for block in footer.dictionaries().into_iter().flatten().chain(footer.recordBatches().into_iter().flatten()) {
        let (off, meta, body) = (block.offset(), block.metaDataLength(), block.bodyLength());
        if off < 0 || meta < 8 || meta % 8 != 0 || body < 0 || (off as u64).saturating_add(meta as u64).saturating_add(body as u64) > n as u64 {
            return Err(invalid("a record batch block lies outside the file"));
        }
        let (off, meta, body) = (off as usize, meta as usize, body as usize);
        let m = &b[off..off + meta];
        let m = if m[..4] == [0xff; 4] { &m[8..] } else { &m[4..] };
        out.push(Msg::parse(m, &b[off + meta..off + meta + body])?);
    }
    Ok((schema, out))
}

/// Read Arrow IPC bytes (file format when they start with `ARROW1`, else
/// stream format).
pub fn read(bytes: &[u8], opts: &ReadOptions) -> Result<Table, Errors> {
    let (schema, messages) = if bytes.starts_with(b"ARROW1") {
        file_messages(bytes)?
    } else {
        let mut m = stream_messages(bytes)?.into_iter();
        let first = m.next().ok_or_else(|| invalid("the stream has no schema"))?;
        let schema = first.msg.header_as_schema().ok_or_else(|| invalid("the stream does not start with a schema"))?;
        (schema, m.collect())
    };
    let fields: Vec<fb::Field> = schema.fields().map(|f| f.iter().collect()).unwrap_or_default();
    // Dictionaries by id, with the field whose values they hold.
    let mut dict_fields = Vec::new();
    for f in &fields {
        dictionary_fields(*f, &mut dict_fields);
    }
    let (mut type_ids, mut types) = (Ids::default(), Vec::new());
    for f in &dict_fields {
        let Some(v) = val_of(f) else {
            let t = f.type_type().variant_name().unwrap_or("unknown").trim_end_matches('_');
            return Err(Diagnostic::error("data.arrow_unsupported", format!("the Arrow data has dictionary-encoded {t} values, which Strata cannot read"))
                .with_hint("write dictionary-encoded columns only of strings, numbers, dates or times")
                .into());
        };
        match type_ids.place(f.dictionary().map(|d| d.id()).unwrap_or_default()) {
            Ok(j) => types[j] = v,
            Err(_) => types.push(v),
        }
    }
    let keep: Vec<Option<Val>> = fields.iter().map(val_of).collect();
    let (mut dict_ids, mut dicts): (Ids, Vec<Option<Column>>) = Default::default();
    let mut parts: Vec<Vec<Column>> = vec![Vec::new(); fields.len()];
    // The row cap before any column is decoded (a batch's length bounds
    // what its columns allocate; a dictionary's is under the cap too).
    let lengths = messages.iter().filter_map(|m| m.msg.header_as_record_batch().map(|rb| rb.length()));
    let rows = lengths.fold(0usize, |n, l| n.saturating_add(usize::try_from(l).unwrap_or(usize::MAX)));
    let too_long =
        messages.iter().filter_map(|m| m.msg.header_as_dictionary_batch()?.data()).any(|rb| !usize::try_from(rb.length()).is_ok_and(|l| l <= opts.max_rows));
    if rows > opts.max_rows || too_long {
        return Err(Diagnostic::error("data.too_many_rows", format!("the data has {rows} rows, more than the row cap of {}", opts.max_rows))
            .with_hint("raise the row cap (`ReadOptions::max_rows`) where the data is loaded, or filter the data before charting it")
            .into());
    }
    for m in &messages {
        if let Some(d) = m.msg.header_as_dictionary_batch() {
            let Some(rb) = d.data() else { continue };
            let v = *type_ids.get(d.id()).map(|j| &types[j]).ok_or_else(|| invalid("a dictionary batch has an id no field uses"))?;
            let mut batch = Batch::new(rb, m.body, m.v5())?;
            let col = batch.column(v, "dictionary")?;
            let col = match dict_ids.get(d.id()).and_then(|j| dicts[j].take()) {
                Some(old) if d.isDelta() => Column::concat(vec![old, col]).ok_or_else(|| invalid("a dictionary delta is of another type"))?,
                _ => col,
            };
            match dict_ids.place(d.id()) {
                Ok(j) => dicts[j] = Some(col),
                Err(_) => dicts.push(Some(col)),
            }
        } else if let Some(rb) = m.msg.header_as_record_batch() {
            let mut batch = Batch::new(rb, m.body, m.v5())?;
            let len = rb.length() as usize;
            for (i, f) in fields.iter().enumerate() {
                let name = f.name().unwrap_or("");
                let Some(v) = keep[i] else {
                    batch.skip(f)?;
                    continue;
                };
                let col = match f.dictionary() {
                    None => batch.column(v, name)?,
                    Some(d) => {
                        let (bytes, signed) = d.indexType().map(|t| (t.bitWidth() as usize / 8, t.is_signed())).unwrap_or((4, true));
                        if !matches!(bytes, 1 | 2 | 4 | 8) {
                            return Err(invalid(format!("column `{name}` has a dictionary index of a wrong width")));
                        }
                        let Column::Int(keys) = batch.column(Val::Int { bytes, signed: true }, name)? else {
                            return Err(invalid(format!("column `{name}` has a damaged dictionary index")));
                        };
                        let values = dict_ids
                            .get(d.id())
                            .and_then(|j| dicts[j].as_ref())
                            .ok_or_else(|| invalid(format!("column `{name}` uses a dictionary that was not sent")))?;
                        let n = values.len();
                        let mut idx = Vec::with_capacity(keys.len());
                        for k in keys.iter() {
                            // (An empty dictionary: every row is missing.)
                            idx.push(match k {
                                Some(k) if n > 0 => {
                                    let k = if signed { k } else { int(&k.to_le_bytes()[..bytes], false) };
                                    Some(
                                        usize::try_from(k)
                                            .ok()
                                            .filter(|k| *k < n)
                                            .ok_or_else(|| invalid(format!("a dictionary key of column `{name}` is out of range")))?,
                                    )
                                }
                                _ => None,
                            });
                        }
                        values.take(&idx)
                    }
                };
                if col.len() != len {
                    return Err(invalid(format!("column `{name}` has a length other than its record batch's")));
                }
                parts[i].push(col);
            }
        }
    }
    let raw: Vec<String> = fields.iter().zip(&keep).filter(|(_, k)| k.is_some()).map(|(f, _)| f.name().unwrap_or("").to_string()).collect();
    let (names, notes) = unique_names(raw);
    let mut warnings: Vec<Diagnostic> = notes.into_iter().map(|n| Diagnostic::warning("data.renamed_header", n)).collect();
    warnings.extend(super::unknown_type_keys(&opts.types, &names));
    for (f, _) in fields.iter().zip(&keep).filter(|(_, k)| k.is_none()) {
        warnings.push(Diagnostic::warning(
            "data.unsupported_column",
            format!("column `{}` has Arrow type {}, which Strata cannot chart; it was left out", f.name().unwrap_or(""), type_name(f)),
        ));
    }
    let mut out_names = Vec::new();
    let mut columns = Vec::new();
    let kept = parts.into_iter().zip(&keep).filter_map(|(p, k)| k.map(|k| (p, k)));
    for ((mut p, v), name) in kept.zip(&names) {
        if p.is_empty() {
            p.push(empty(v));
        }
        let Some(col) = Column::concat(p) else {
            warnings.push(Diagnostic::warning("data.unsupported_column", format!("column `{name}` changes type between record batches; it was left out")));
            continue;
        };
        let col = match opts.types.get(name) {
            Some(t) => retype(col, *t, name)?,
            None => col,
        };
        out_names.push(name.clone());
        columns.push(col);
    }
    Ok(Table::new(out_names, columns, rows, warnings))
}

/// A column of no rows of the type `v` normalises to.
fn empty(v: Val) -> Column {
    match v {
        Val::Int { .. } => Column::Int(Ints::default()),
        Val::Float(_) | Val::Decimal128 { .. } => Column::Float(Vec::<f64>::new().into()),
        Val::Bool => Column::Bool(Vec::new()),
        Val::Date { .. } => Column::Date(Vec::<f64>::new().into()),
        Val::Timestamp { .. } => Column::DateTime(Vec::<f64>::new().into()),
        Val::Null | Val::Utf8 { .. } | Val::Utf8View => Column::Text(Default::default()),
    }
}

/// Dictionary ids, each to its place in the caller's lists (found by the
/// engine's one hash index).
#[derive(Default)]
struct Ids {
    index: crate::index::Index,
    ids: Vec<i64>,
}

impl Ids {
    fn hash(h: crate::index::Hasher, id: i64) -> u64 {
        h.u64(id as u64).finish()
    }
    fn get(&self, id: i64) -> Option<usize> {
        self.index.find(Self::hash(self.index.hasher(), id), &|j| self.ids[j as usize] == id).map(|j| j as usize)
    }
    /// `Ok(place)` of a known id, or `Err(place)` after adding it at the end.
    fn place(&mut self, id: i64) -> Result<usize, usize> {
        let ids = &self.ids;
        match self.index.find_or_insert(&|h| Self::hash(h, id), &|j| ids[j as usize] == id, ids.len() as u32, &|j, h| Self::hash(h, ids[j as usize])) {
            Ok(j) => Ok(j as usize),
            Err(j) => {
                self.ids.push(id);
                Err(j as usize)
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn half_floats_match_ieee_754() {
        // Values from IEEE 754-2008's binary16 format: 0x3c00 = 1, 0xc000 = -2,
        // 0x7bff = 65504 (largest), 0x0001 = 2^-24 (smallest subnormal).
        assert_eq!(half(0x3c00), 1.0);
        assert_eq!(half(0xc000), -2.0);
        assert_eq!(half(0x7bff), 65504.0);
        assert_eq!(half(0x0001), 2f64.powi(-24));
        assert_eq!(half(0x7c00), f64::INFINITY);
        assert!(half(0x7e00).is_nan());
    }

    #[test]
    fn each_value_is_checked_as_utf8_alone() {
        // "ab\xF0" then "\x9F\x98\x80": the two together are valid UTF-8
        // (U+1F600), each alone is not.
        assert!(text(b"ab\xF0", "c").is_err());
        assert!(text(b"\x9F\x98\x80", "c").is_err());
        assert!(text("ab\u{1F600}".as_bytes(), "c").is_ok());
    }

    #[test]
    fn integers_sign_extend() {
        assert_eq!(int(&[0xff], true), -1);
        assert_eq!(int(&[0xff], false), 255);
        assert_eq!(int(&[0x00, 0x80], true), -32768);
        assert_eq!(int(&[0xff; 8], false), -1); // reinterpreted; callers widen
    }
}
