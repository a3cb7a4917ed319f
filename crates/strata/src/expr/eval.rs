//! Typed, column-at-a-time evaluation of a parsed expression over the
//! table's columns. Each operator runs once over whole columns; literals stay
//! constants and are never copied out to the column's length.
//!
//! Types: integer (`i64`), number (`f64`), boolean, text, date (days) and
//! date-time (ms since 1970, UTC). NULL follows SQL's
//! three-valued logic (ISO/IEC 9075, 8.x "boolean value expression").

use super::parse::{BinOp, Expr, ExprError, Literal, Span};
use crate::calendar::{civil_from_days, parse_date, parse_datetime};
use crate::data::table::{Column, Ints};

const DAY_MS: i64 = 86_400_000;

/// The type of an expression's value.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Ty {
    /// The bare literal NULL: no type yet; it takes the type of its company.
    Null,
    Int,
    Float,
    Bool,
    Text,
    Date,
    Timestamp,
}

impl Ty {
    pub fn word(self) -> &'static str {
        match self {
            Ty::Null => "NULL",
            Ty::Int => "an integer",
            Ty::Float => "a number",
            Ty::Bool => "true/false",
            Ty::Text => "text",
            Ty::Date => "a date",
            Ty::Timestamp => "a date-time",
        }
    }
    fn numeric(self) -> bool {
        matches!(self, Ty::Int | Ty::Float | Ty::Null)
    }
}

/// A column of values, or one value standing for every row.
#[derive(Debug, Clone)]
pub enum Data<T> {
    Const(Option<T>),
    Vec(Vec<Option<T>>),
}

impl<T: Clone> Data<T> {
    #[inline]
    pub(super) fn get(&self, i: usize) -> Option<&T> {
        match self {
            Data::Const(v) => v.as_ref(),
            Data::Vec(v) => v[i].as_ref(),
        }
    }
    fn map<U>(&self, n: usize, f: impl Fn(&T) -> Option<U>) -> Data<U> {
        match self {
            Data::Const(v) => Data::Const(v.as_ref().and_then(f)),
            Data::Vec(v) => Data::Vec(v.iter().take(n).map(|x| x.as_ref().and_then(&f)).collect()),
        }
    }
    fn into_vec(self, n: usize) -> Vec<Option<T>> {
        match self {
            Data::Const(v) => vec![v; n],
            Data::Vec(v) => v,
        }
    }
}

/// Combine two columns row by row; `f` sees NULLs (for three-valued logic).
fn zip<A: Clone, B: Clone, U>(a: &Data<A>, b: &Data<B>, n: usize, f: impl Fn(Option<&A>, Option<&B>) -> Option<U>) -> Data<U> {
    match (a, b) {
        (Data::Const(x), Data::Const(y)) => Data::Const(f(x.as_ref(), y.as_ref())),
        _ => Data::Vec((0..n).map(|i| f(a.get(i), b.get(i))).collect()),
    }
}

/// Combine two columns row by row, NULL in gives NULL out; `f` may fail
/// (integer overflow), which reports the row.
fn try_zip<A: Clone, B: Clone, U>(a: &Data<A>, b: &Data<B>, n: usize, f: impl Fn(&A, &B) -> Result<Option<U>, ()>) -> Result<Data<U>, Option<usize>> {
    match (a, b) {
        (Data::Const(x), Data::Const(y)) => match (x, y) {
            (Some(x), Some(y)) => f(x, y).map(Data::Const).map_err(|_| None),
            _ => Ok(Data::Const(None)),
        },
        _ => {
            let mut out = Vec::with_capacity(n);
            for i in 0..n {
                out.push(match (a.get(i), b.get(i)) {
                    (Some(x), Some(y)) => f(x, y).map_err(|_| Some(i))?,
                    _ => None,
                });
            }
            Ok(Data::Vec(out))
        }
    }
}

/// A typed column of results.
#[derive(Debug, Clone)]
pub enum Col {
    Null,
    Int(Data<i64>),
    Float(Data<f64>),
    Bool(Data<bool>),
    Text(Data<String>),
    Date(Data<i32>),
    Timestamp(Data<i64>),
}

impl Col {
    pub fn ty(&self) -> Ty {
        match self {
            Col::Null => Ty::Null,
            Col::Int(_) => Ty::Int,
            Col::Float(_) => Ty::Float,
            Col::Bool(_) => Ty::Bool,
            Col::Text(_) => Ty::Text,
            Col::Date(_) => Ty::Date,
            Col::Timestamp(_) => Ty::Timestamp,
        }
    }
    fn is_null_at(&self, i: usize) -> bool {
        match self {
            Col::Null => true,
            Col::Int(d) => d.get(i).is_none(),
            Col::Float(d) => d.get(i).is_none(),
            Col::Bool(d) => d.get(i).is_none(),
            Col::Text(d) => d.get(i).is_none(),
            Col::Date(d) => d.get(i).is_none(),
            Col::Timestamp(d) => d.get(i).is_none(),
        }
    }
    fn as_float(&self, n: usize) -> Option<Data<f64>> {
        match self {
            Col::Null => Some(Data::Const(None)),
            Col::Int(d) => Some(d.map(n, |v| Some(*v as f64))),
            Col::Float(d) => Some(d.clone()),
            _ => None,
        }
    }
    fn as_timestamp(&self, n: usize) -> Option<Data<i64>> {
        match self {
            Col::Null => Some(Data::Const(None)),
            Col::Date(d) => Some(d.map(n, |v| Some(*v as i64 * DAY_MS))),
            Col::Timestamp(d) => Some(d.clone()),
            _ => None,
        }
    }
    fn as_bool(&self) -> Option<Data<bool>> {
        match self {
            Col::Null => Some(Data::Const(None)),
            Col::Bool(d) => Some(d.clone()),
            _ => None,
        }
    }
    /// Cast to the type `to` (already checked with [`unify`]).
    fn cast(self, to: Ty, n: usize) -> Col {
        match (to, &self) {
            (t, c) if t == c.ty() => self,
            (Ty::Float, _) => Col::Float(self.as_float(n).expect("unified")),
            (Ty::Timestamp, _) => Col::Timestamp(self.as_timestamp(n).expect("unified")),
            (Ty::Int, Col::Null) => Col::Int(Data::Const(None)),
            (Ty::Bool, Col::Null) => Col::Bool(Data::Const(None)),
            (Ty::Text, Col::Null) => Col::Text(Data::Const(None)),
            (Ty::Date, Col::Null) => Col::Date(Data::Const(None)),
            _ => self,
        }
    }

    /// The column as a table column of `n` rows. NULL-typed results become
    /// an all-missing number column.
    pub fn into_column(self, n: usize) -> Column {
        match self {
            Col::Null => Column::Float(vec![f64::NAN; n].into()),
            Col::Int(d) => Column::Int(d.into_vec(n).into_iter().collect::<Ints>()),
            Col::Float(d) => Column::Float(d.into_vec(n).into_iter().collect()),
            Col::Bool(d) => Column::Bool(d.into_vec(n)),
            Col::Text(d) => Column::Text(d.into_vec(n).into_iter().collect()),
            Col::Date(d) => Column::Date(d.into_vec(n).into_iter().map(|v| v.map(|x| x as f64)).collect()),
            Col::Timestamp(d) => Column::DateTime(d.into_vec(n).into_iter().map(|v| v.map(|x| x as f64)).collect()),
        }
    }

    /// Read a table column. Non-finite numbers are read as NULL.
    pub fn from_column(a: &Column) -> Col {
        match a {
            Column::Float(v) => Col::Float(Data::Vec(v.iter().collect())),
            Column::Int(v) => Col::Int(Data::Vec(v.iter().collect())),
            Column::Bool(v) => Col::Bool(Data::Vec(v.clone())),
            Column::Text(v) => Col::Text(Data::Vec(v.iter().map(|v| v.map(str::to_string)).collect())),
            Column::Date(v) => Col::Date(Data::Vec(v.iter().map(|v| v.map(|d| d as i32)).collect())),
            Column::DateTime(v) => Col::Timestamp(Data::Vec(v.iter().map(|v| v.map(|x| x as i64)).collect())),
        }
    }
}

/// The type two values share, if any: integers widen to numbers, dates to
/// date-times, and NULL takes the other's type.
pub fn unify(a: Ty, b: Ty) -> Option<Ty> {
    Some(match (a, b) {
        (x, y) if x == y => x,
        (Ty::Null, y) => y,
        (x, Ty::Null) => x,
        (Ty::Int, Ty::Float) | (Ty::Float, Ty::Int) => Ty::Float,
        (Ty::Date, Ty::Timestamp) | (Ty::Timestamp, Ty::Date) => Ty::Timestamp,
        _ => return None,
    })
}

/// The columns an expression can see, by name.
pub struct Env<'a> {
    pub names: &'a [String],
    pub columns: &'a [Column],
    pub rows: usize,
}

type R = Result<Col, ExprError>;

/// Evaluate an expression over every row.
pub fn eval(e: &Expr, env: &Env) -> R {
    let n = env.rows;
    match e {
        Expr::Lit(l, _) => Ok(match l {
            Literal::Null => Col::Null,
            Literal::Bool(b) => Col::Bool(Data::Const(Some(*b))),
            Literal::Int(v) => Col::Int(Data::Const(Some(*v))),
            Literal::Float(v) => Col::Float(Data::Const(Some(*v))),
            Literal::Text(s) => Col::Text(Data::Const(Some(s.clone()))),
            Literal::Date(d) => Col::Date(Data::Const(Some(*d))),
            Literal::Timestamp(t) => Col::Timestamp(Data::Const(Some(*t))),
        }),
        Expr::Column(name, quoted, span) => column(name, *quoted, *span, env),
        Expr::Neg(inner, span) => {
            let c = eval(inner, env)?;
            match c {
                Col::Null => Ok(Col::Null),
                Col::Int(d) => {
                    try_zip(&d, &Data::Const(Some(())), n, |v, _| v.checked_neg().map(Some).ok_or(())).map(Col::Int).map_err(|row| overflow(*span, row))
                }
                Col::Float(d) => Ok(Col::Float(d.map(n, |v| Some(-v)))),
                c => Err(type_err("`-`", "a number", &c, inner.span())),
            }
        }
        Expr::Not(inner, _) => {
            let c = eval(inner, env)?;
            let b = c.as_bool().ok_or_else(|| type_err("NOT", "true/false", &c, inner.span()))?;
            Ok(Col::Bool(b.map(n, |v| Some(!v))))
        }
        Expr::Binary(op, l, r, span) => binary(*op, l, r, *span, env),
        Expr::IsNull { expr, negated, .. } => {
            let c = eval(expr, env)?;
            let neg = *negated;
            Ok(match c {
                Col::Null => Col::Bool(Data::Const(Some(!neg))),
                c => {
                    let v: Vec<Option<bool>> = (0..n).map(|i| Some(c.is_null_at(i) != neg)).collect();
                    Col::Bool(Data::Vec(v))
                }
            })
        }
        Expr::In { expr, list, negated, .. } => {
            // x IN (a, b) is x = a OR x = b, with three-valued OR (ISO/IEC 9075, 8.4).
            let x = eval(expr, env)?;
            let mut acc: Data<bool> = Data::Const(Some(false));
            for item in list {
                let y = eval(item, env)?;
                let eq = compare(BinOp::Eq, &x, &y, expr, item, env)?;
                let Col::Bool(eq) = eq else { unreachable!() };
                acc = zip(&acc, &eq, n, or3);
            }
            Ok(Col::Bool(if *negated { acc.map(n, |v| Some(!v)) } else { acc }))
        }
        Expr::Between { expr, low, high, negated, .. } => {
            // x BETWEEN a AND b is x >= a AND x <= b (ISO/IEC 9075, 8.3).
            let x = eval(expr, env)?;
            let lo = eval(low, env)?;
            let hi = eval(high, env)?;
            let Col::Bool(a) = compare(BinOp::Ge, &x, &lo, expr, low, env)? else { unreachable!() };
            let Col::Bool(b) = compare(BinOp::Le, &x, &hi, expr, high, env)? else { unreachable!() };
            let both = zip(&a, &b, n, and3);
            Ok(Col::Bool(if *negated { both.map(n, |v| Some(!v)) } else { both }))
        }
        Expr::Case { operand, whens, otherwise, .. } => case(operand.as_deref(), whens, otherwise.as_deref(), env),
        Expr::Call { name, args, span } => super::functions::call(name, args, *span, env),
    }
}

fn column(name: &str, quoted: bool, span: Span, env: &Env) -> R {
    let mut pos = env.names.iter().position(|c| c == name);
    if pos.is_none() && !quoted {
        // Bare names are case-insensitive (ISO SQL folds them) when that is unambiguous.
        let hits: Vec<usize> = (0..env.names.len()).filter(|i| env.names[*i].eq_ignore_ascii_case(name)).collect();
        if hits.len() == 1 {
            pos = Some(hits[0]);
        }
    }
    let Some(pos) = pos else {
        let mut err = ExprError::new(format!("there is no column `{name}`"), span);
        let near = crate::spec::closest(name, env.names.iter().map(String::as_str));
        let needs_quotes = |c: &str| !c.chars().all(|ch| ch.is_alphanumeric() || ch == '_') || c.is_empty();
        let show = |c: &str| if needs_quotes(c) { format!("\"{}\"", c.replace('"', "\"\"")) } else { c.to_string() };
        err = match near {
            Some(s) => {
                err.hint(format!("did you mean {}? The columns are: {}", show(s), crate::join(&env.names.iter().map(|c| show(c)).collect::<Vec<_>>(), ", ")))
            }
            None => err.hint(format!(
                "the columns are: {}; text values need single quotes, such as '{name}'",
                crate::join(&env.names.iter().map(|c| show(c)).collect::<Vec<_>>(), ", ")
            )),
        };
        return Err(err);
    };
    let _ = span;
    Ok(Col::from_column(&env.columns[pos]))
}

pub(super) fn type_err(what: &str, wanted: &str, got: &Col, span: Span) -> ExprError {
    ExprError::new(format!("{what} needs {wanted}, but this is {}", got.ty().word()), span)
}

pub(super) fn overflow(span: Span, row: Option<usize>) -> ExprError {
    let at = row.map(|r| format!(" in data row {}", r + 1)).unwrap_or_default();
    ExprError::new(format!("the result is too large for a 64-bit integer{at}"), span)
        .hint("multiply by 1.0 first to compute with approximate numbers instead of integers")
}

pub(super) fn and3(a: Option<&bool>, b: Option<&bool>) -> Option<bool> {
    match (a, b) {
        (Some(false), _) | (_, Some(false)) => Some(false),
        (Some(true), Some(true)) => Some(true),
        _ => None,
    }
}

pub(super) fn or3(a: Option<&bool>, b: Option<&bool>) -> Option<bool> {
    match (a, b) {
        (Some(true), _) | (_, Some(true)) => Some(true),
        (Some(false), Some(false)) => Some(false),
        _ => None,
    }
}

fn binary(op: BinOp, l: &Expr, r: &Expr, span: Span, env: &Env) -> R {
    let n = env.rows;
    let a = eval(l, env)?;
    let b = eval(r, env)?;
    match op {
        BinOp::And | BinOp::Or => {
            let x = a.as_bool().ok_or_else(|| type_err(op.symbol(), "true/false on both sides", &a, l.span()))?;
            let y = b.as_bool().ok_or_else(|| type_err(op.symbol(), "true/false on both sides", &b, r.span()))?;
            Ok(Col::Bool(zip(&x, &y, n, if op == BinOp::And { and3 } else { or3 })))
        }
        BinOp::Eq | BinOp::Ne | BinOp::Lt | BinOp::Le | BinOp::Gt | BinOp::Ge => compare(op, &a, &b, l, r, env),
        BinOp::Concat => {
            let text = |c: &Col, e: &Expr| match c {
                Col::Null => Ok(Data::Const(None)),
                Col::Text(d) => Ok(d.clone()),
                c => Err(type_err("`||`", "text on both sides", c, e.span())),
            };
            let (x, y) = (text(&a, l)?, text(&b, r)?);
            Ok(Col::Text(zip(&x, &y, n, |p, q| match (p, q) {
                (Some(p), Some(q)) => Some(format!("{p}{q}")),
                _ => None,
            })))
        }
        BinOp::Add | BinOp::Sub | BinOp::Mul | BinOp::Div => arithmetic(op, a, b, l, r, span, n),
    }
}

fn arithmetic(op: BinOp, a: Col, b: Col, l: &Expr, r: &Expr, span: Span, n: usize) -> R {
    let what = format!("`{}`", op.symbol());
    if !a.ty().numeric() {
        return Err(type_err(&what, "numbers on both sides", &a, l.span()));
    }
    if !b.ty().numeric() {
        return Err(type_err(&what, "numbers on both sides", &b, r.span()));
    }
    match (&a, &b) {
        (Col::Null, _) | (_, Col::Null) => Ok(Col::Null),
        (Col::Int(x), Col::Int(y)) => {
            let f = |p: &i64, q: &i64| -> Result<Option<i64>, ()> {
                match op {
                    BinOp::Add => p.checked_add(*q).map(Some).ok_or(()),
                    BinOp::Sub => p.checked_sub(*q).map(Some).ok_or(()),
                    BinOp::Mul => p.checked_mul(*q).map(Some).ok_or(()),
                    // Integer division truncates toward zero; by zero it gives NULL.
                    _ if *q == 0 => Ok(None),
                    _ => p.checked_div(*q).map(Some).ok_or(()),
                }
            };
            try_zip(x, y, n, f).map(Col::Int).map_err(|row| overflow(span, row))
        }
        _ => {
            let x = a.as_float(n).expect("numeric");
            let y = b.as_float(n).expect("numeric");
            Ok(Col::Float(zip(&x, &y, n, |p, q| {
                let (p, q) = (*p?, *q?);
                let v = match op {
                    BinOp::Add => p + q,
                    BinOp::Sub => p - q,
                    BinOp::Mul => p * q,
                    _ if q == 0.0 => return None,
                    _ => p / q,
                };
                v.is_finite().then_some(v)
            })))
        }
    }
}

/// A text literal compared with a date or date-time, read as that type.
fn coerce_literal(c: &Col, e: &Expr, other: Ty) -> Result<Option<Col>, ExprError> {
    if let (Col::Text(_), Expr::Lit(Literal::Text(s), span), Ty::Date | Ty::Timestamp) = (c, e, other) {
        if let Some(d) = parse_date(s) {
            return Ok(Some(Col::Date(Data::Const(Some(d as i32)))));
        }
        if let Some(t) = parse_datetime(s) {
            return Ok(Some(Col::Timestamp(Data::Const(Some(t)))));
        }
        return Err(ExprError::new(format!("'{s}' is compared with {} but is not one", other.word()), *span)
            .hint("write dates as 'yyyy-MM-dd' and date-times as 'yyyy-MM-dd HH:mm:ss'"));
    }
    Ok(None)
}

impl Col {
    /// The column as type `to` when that needs a conversion; `None` when it is already.
    fn cast_ref(&self, to: Ty, n: usize) -> Option<Col> {
        if self.ty() == to {
            return None;
        }
        Some(match to {
            Ty::Float => Col::Float(self.as_float(n)?),
            Ty::Timestamp => Col::Timestamp(self.as_timestamp(n)?),
            Ty::Int => Col::Int(Data::Const(None)),
            Ty::Bool => Col::Bool(Data::Const(None)),
            Ty::Text => Col::Text(Data::Const(None)),
            Ty::Date => Col::Date(Data::Const(None)),
            Ty::Null => Col::Null,
        })
    }
}

/// Compare two columns row by row (borrowed: `IN` compares one column with many).
pub(super) fn compare(op: BinOp, a: &Col, b: &Col, l: &Expr, r: &Expr, env: &Env) -> R {
    let n = env.rows;
    let a2 = coerce_literal(a, l, b.ty())?;
    let a = a2.as_ref().unwrap_or(a);
    let b2 = coerce_literal(b, r, a.ty())?;
    let b = b2.as_ref().unwrap_or(b);
    let Some(t) = unify(a.ty(), b.ty()) else {
        let err = ExprError::new(
            format!("`{}` compares {} with {}; both sides need the same kind of value", op.symbol(), a.ty().word(), b.ty().word()),
            l.span().to_span(r.span()),
        );
        let hint = match (a.ty(), b.ty()) {
            (Ty::Bool, Ty::Text) | (Ty::Text, Ty::Bool) => Some("write TRUE or FALSE without quotes"),
            (Ty::Text, Ty::Int | Ty::Float) | (Ty::Int | Ty::Float, Ty::Text) => Some("put text values in single quotes, such as '3'"),
            (Ty::Date | Ty::Timestamp, Ty::Int | Ty::Float) | (Ty::Int | Ty::Float, Ty::Date | Ty::Timestamp) => {
                Some("compare dates with dates, such as DATE '2024-03-01', or compare year(d) with a number")
            }
            _ => None,
        };
        return Err(match hint {
            Some(h) => err.hint(h),
            None => err,
        });
    };
    fn cmp<T: PartialOrd + Clone>(op: BinOp, x: &Data<T>, y: &Data<T>, n: usize) -> Data<bool> {
        zip(x, y, n, |p, q| {
            let (p, q) = (p?, q?);
            Some(match op {
                BinOp::Eq => p == q,
                BinOp::Ne => p != q,
                BinOp::Lt => p < q,
                BinOp::Le => p <= q,
                BinOp::Gt => p > q,
                _ => p >= q,
            })
        })
    }
    let a3 = a.cast_ref(t, n);
    let a = a3.as_ref().unwrap_or(a);
    let b3 = b.cast_ref(t, n);
    let b = b3.as_ref().unwrap_or(b);
    Ok(Col::Bool(match (a, b) {
        (Col::Int(x), Col::Int(y)) => cmp(op, x, y, n),
        (Col::Float(x), Col::Float(y)) => cmp(op, x, y, n),
        (Col::Bool(x), Col::Bool(y)) => cmp(op, x, y, n),
        (Col::Text(x), Col::Text(y)) => cmp(op, x, y, n),
        (Col::Date(x), Col::Date(y)) => cmp(op, x, y, n),
        (Col::Timestamp(x), Col::Timestamp(y)) => cmp(op, x, y, n),
        _ => Data::Const(None),
    }))
}

trait SpanTo {
    fn to_span(self, o: Span) -> Span;
}
impl SpanTo for Span {
    fn to_span(self, o: Span) -> Span {
        Span { start: self.start.min(o.start), end: self.end.max(o.end) }
    }
}

fn case(operand: Option<&Expr>, whens: &[(Expr, Expr)], otherwise: Option<&Expr>, env: &Env) -> R {
    let n = env.rows;
    let subject = operand.map(|e| eval(e, env)).transpose()?;
    let mut conds = Vec::with_capacity(whens.len());
    let mut vals = Vec::with_capacity(whens.len() + 1);
    let mut ty = Ty::Null;
    for (w, v) in whens {
        let c = eval(w, env)?;
        let c = match (&subject, operand) {
            (Some(s), Some(se)) => compare(BinOp::Eq, s, &c, se, w, env)?,
            _ => c,
        };
        let cb = c.as_bool().ok_or_else(|| type_err("WHEN", "a true/false condition", &c, w.span()))?;
        conds.push(cb);
        let val = eval(v, env)?;
        ty = unify(ty, val.ty())
            .ok_or_else(|| ExprError::new(format!("this CASE branch gives {}, but an earlier one gives {}", val.ty().word(), ty.word()), v.span()))?;
        vals.push(val);
    }
    let other = match otherwise {
        Some(e) => {
            let val = eval(e, env)?;
            ty = unify(ty, val.ty())
                .ok_or_else(|| ExprError::new(format!("the ELSE branch gives {}, but an earlier one gives {}", val.ty().word(), ty.word()), e.span()))?;
            val
        }
        None => Col::Null,
    };
    vals.push(other);
    let vals: Vec<Col> = vals.into_iter().map(|v| v.cast(ty, n)).collect();
    // For each row, the first WHEN that is TRUE (NULL counts as not true).
    let pick: Vec<usize> = (0..n).map(|i| conds.iter().position(|c| c.get(i) == Some(&true)).unwrap_or(whens.len())).collect();
    Ok(select(ty, &vals, &pick))
}

/// Row i takes its value from `cols[pick[i]]`; all `cols` share type `ty`.
pub(super) fn select(ty: Ty, cols: &[Col], pick: &[usize]) -> Col {
    macro_rules! sel {
        ($variant:ident) => {{
            let v = pick
                .iter()
                .enumerate()
                .map(|(i, k)| match &cols[*k] {
                    Col::$variant(d) => d.get(i).cloned(),
                    _ => None,
                })
                .collect();
            Col::$variant(Data::Vec(v))
        }};
    }
    match ty {
        Ty::Null => Col::Null,
        Ty::Int => sel!(Int),
        Ty::Float => sel!(Float),
        Ty::Bool => sel!(Bool),
        Ty::Text => sel!(Text),
        Ty::Date => sel!(Date),
        Ty::Timestamp => sel!(Timestamp),
    }
}

/// (year, month, day) of a date or date-time column.
pub(super) fn date_parts(c: &Col, n: usize) -> Option<Data<(i64, u32, u32)>> {
    match c {
        Col::Null => Some(Data::Const(None)),
        Col::Date(d) => Some(d.map(n, |v| Some(civil_from_days(*v as i64)))),
        Col::Timestamp(d) => Some(d.map(n, |v| Some(civil_from_days(v.div_euclid(DAY_MS))))),
        _ => None,
    }
}

impl Data<(i64, u32, u32)> {
    pub(super) fn part(&self, n: usize, f: fn(&(i64, u32, u32)) -> i64) -> Data<i64> {
        self.map(n, |v| Some(f(v)))
    }
}

pub(super) fn map_col<T: Clone, U>(d: &Data<T>, n: usize, f: impl Fn(&T) -> Option<U>) -> Data<U> {
    d.map(n, f)
}
