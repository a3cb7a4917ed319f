//! Named functions of the expression language. Every function gives NULL
//! for a NULL argument (except `coalesce`, whose point is NULLs).

use super::eval::{date_parts, eval, map_col, overflow, select, type_err, unify, Col, Data, Env, Ty};
use super::parse::{Expr, ExprError, Span};
use crate::math;

/// The function names, for suggestions and documentation.
pub const NAMES: [&str; 15] = ["abs", "ceil", "coalesce", "day", "exp", "floor", "length", "ln", "log", "lower", "month", "round", "sqrt", "upper", "year"];

fn arity(name: &str, args: &[Expr], lo: usize, hi: usize, span: Span) -> Result<(), ExprError> {
    if args.len() < lo || args.len() > hi {
        let want = if lo == hi {
            format!("{lo}")
        } else if hi == usize::MAX {
            format!("at least {lo}")
        } else {
            format!("{lo} or {hi}")
        };
        return Err(ExprError::new(format!("{name}() takes {want} argument{}, not {}", if hi == 1 { "" } else { "s" }, args.len()), span));
    }
    Ok(())
}

/// A real result, or NULL where the value is undefined or not finite.
fn real(x: f64) -> Option<f64> {
    x.is_finite().then_some(x)
}

/// Round half away from zero to `digits` decimals, on the shortest decimal
/// representation of `x` (so 2.675 rounds to 2.68, as written, not as the
/// nearest binary fraction 2.67499999... would).
pub fn round_decimal(x: f64, digits: i64) -> f64 {
    if digits <= 0 {
        return x.round();
    }
    if digits > 30 {
        return x;
    }
    let s = crate::format::float::plain(x.abs());
    let Some(dot) = s.find('.') else { return x };
    let frac = &s[dot + 1..];
    let d = digits as usize;
    if frac.len() <= d {
        return x;
    }
    let keep = &s[..dot + 1 + d];
    let next = frac.as_bytes()[d];
    let mut digits_vec: Vec<u8> = keep.bytes().filter(|b| *b != b'.').collect();
    if next >= b'5' {
        let mut k = digits_vec.len();
        loop {
            if k == 0 {
                digits_vec.insert(0, b'1');
                break;
            }
            k -= 1;
            if digits_vec[k] == b'9' {
                digits_vec[k] = b'0';
            } else {
                digits_vec[k] += 1;
                break;
            }
        }
    }
    let int_len = digits_vec.len() - d;
    let text = format!("{}.{}", std::str::from_utf8(&digits_vec[..int_len]).unwrap(), std::str::from_utf8(&digits_vec[int_len..]).unwrap());
    let v: f64 = crate::format::float::parse(&text).unwrap_or(x.abs());
    if x < 0.0 {
        -v
    } else {
        v
    }
}

pub fn call(name: &str, args: &[Expr], span: Span, env: &Env) -> Result<Col, ExprError> {
    let n = env.rows;
    let num1 = |what: &str| -> Result<(Col, Data<f64>), ExprError> {
        let c = eval(&args[0], env)?;
        let d = match &c {
            Col::Null => Data::Const(None),
            Col::Int(d) => map_col(d, n, |v| Some(*v as f64)),
            Col::Float(d) => d.clone(),
            _ => return Err(type_err(what, "a number", &c, args[0].span())),
        };
        Ok((c, d))
    };
    let float_fn = |f: fn(f64) -> Option<f64>| -> Result<Col, ExprError> {
        arity(name, args, 1, 1, span)?;
        let (_, d) = num1(&format!("{name}()"))?;
        Ok(Col::Float(map_col(&d, n, |v| f(*v))))
    };
    match name {
        // log(x) is the base-10 logarithm, as in SQLite 3.35+ (and log(b, x)
        // is the base-b logarithm); ln(x) is the natural one. Not defined
        // (NULL) for x <= 0.
        "log" if args.len() == 2 => {
            let b = eval(&args[0], env)?;
            let x = eval(&args[1], env)?;
            let fb = to_float(&b, n).ok_or_else(|| type_err("log()", "a number as its base", &b, args[0].span()))?;
            let fx = to_float(&x, n).ok_or_else(|| type_err("log()", "a number", &x, args[1].span()))?;
            let out = match (&fb, &fx) {
                (Data::Const(p), Data::Const(q)) => Data::Const(log_base(*p, *q)),
                _ => Data::Vec((0..n).map(|i| log_base(get(&fb, i), get(&fx, i))).collect()),
            };
            Ok(Col::Float(out))
        }
        "log" => float_fn(|v| if v > 0.0 { real(math::log10(v)) } else { None }),
        "ln" => float_fn(|v| if v > 0.0 { real(math::ln(v)) } else { None }),
        "exp" => float_fn(|v| real(math::exp(v))),
        "sqrt" => float_fn(|v| if v >= 0.0 { real(v.sqrt()) } else { None }),
        "abs" | "floor" | "ceil" => {
            arity(name, args, 1, 1, span)?;
            let c = eval(&args[0], env)?;
            match c {
                Col::Null => Ok(Col::Null),
                // Integers stay integers (floor and ceil of an integer are itself).
                Col::Int(d) => {
                    if name == "abs" {
                        let mut out = Vec::with_capacity(n);
                        for i in 0..n {
                            out.push(match d.get(i) {
                                Some(v) => Some(v.checked_abs().ok_or_else(|| overflow(span, Some(i)))?),
                                None => None,
                            });
                        }
                        Ok(Col::Int(Data::Vec(out)))
                    } else {
                        Ok(Col::Int(d))
                    }
                }
                Col::Float(d) => Ok(Col::Float(map_col(&d, n, |v| {
                    Some(match name {
                        "abs" => v.abs(),
                        "floor" => v.floor(),
                        _ => v.ceil(),
                    })
                }))),
                c => Err(type_err(&format!("{name}()"), "a number", &c, args[0].span())),
            }
        }
        "round" => {
            arity(name, args, 1, 2, span)?;
            let (_, d) = num1("round()")?;
            if args.len() == 1 {
                return Ok(Col::Float(map_col(&d, n, |v| Some(v.round()))));
            }
            let k = eval(&args[1], env)?;
            let kd = match &k {
                Col::Null => Data::Const(None),
                Col::Int(kd) => kd.clone(),
                _ => return Err(type_err("round()", "an integer number of decimals", &k, args[1].span())),
            };
            let out = match (&d, &kd) {
                (Data::Const(p), Data::Const(q)) => Data::Const(p.zip(*q).map(|(p, q)| round_decimal(p, q))),
                _ => Data::Vec((0..n).map(|i| get(&d, i).zip(get_i(&kd, i)).map(|(p, q)| round_decimal(p, q))).collect()),
            };
            Ok(Col::Float(out))
        }
        "lower" | "upper" | "length" => {
            arity(name, args, 1, 1, span)?;
            let c = eval(&args[0], env)?;
            match c {
                Col::Null => Ok(Col::Null),
                // Full Unicode case mapping (Unicode default case conversion).
                Col::Text(d) if name == "lower" => Ok(Col::Text(map_col(&d, n, |s| Some(crate::text::case::lower(s))))),
                Col::Text(d) if name == "upper" => Ok(Col::Text(map_col(&d, n, |s| Some(crate::text::case::upper(s))))),
                // Length in characters (Unicode scalar values), not bytes.
                Col::Text(d) => Ok(Col::Int(map_col(&d, n, |s| Some(s.chars().count() as i64)))),
                c => Err(type_err(&format!("{name}()"), "text", &c, args[0].span())),
            }
        }
        "year" | "month" | "day" => {
            arity(name, args, 1, 1, span)?;
            let c = eval(&args[0], env)?;
            let parts = date_parts(&c, n).ok_or_else(|| type_err(&format!("{name}()"), "a date or date-time", &c, args[0].span()))?;
            Ok(Col::Int(match name {
                "year" => parts.part(n, |p| p.0),
                "month" => parts.part(n, |p| p.1 as i64),
                _ => parts.part(n, |p| p.2 as i64),
            }))
        }
        "coalesce" => {
            arity(name, args, 1, usize::MAX, span)?;
            let mut cols = Vec::with_capacity(args.len());
            let mut ty = Ty::Null;
            for a in args {
                let c = eval(a, env)?;
                ty = unify(ty, c.ty()).ok_or_else(|| ExprError::new(format!("coalesce() mixes {} with {}", ty.word(), c.ty().word()), a.span()))?;
                cols.push(c);
            }
            let cols: Vec<Col> = cols.into_iter().map(|c| cast(c, ty, n)).collect();
            let last = cols.len() - 1;
            let pick: Vec<usize> = (0..n).map(|i| (0..cols.len()).find(|k| !is_null(&cols[*k], i)).unwrap_or(last)).collect();
            Ok(select(ty, &cols, &pick))
        }
        _ => {
            let mut e = ExprError::new(format!("there is no function `{name}`"), span);
            if let Some(s) = crate::spec::closest(name, NAMES.iter().copied()) {
                e = e.hint(format!("did you mean {s}()? The functions are: {}", crate::join(&NAMES, ", ")));
            } else {
                e = e.hint(format!("the functions are: {}", crate::join(&NAMES, ", ")));
            }
            Err(e)
        }
    }
}

fn log_base(b: Option<f64>, x: Option<f64>) -> Option<f64> {
    let (b, x) = (b?, x?);
    if b <= 0.0 || b == 1.0 || x <= 0.0 {
        return None;
    }
    real(math::ln(x) / math::ln(b))
}

fn get(d: &Data<f64>, i: usize) -> Option<f64> {
    match d {
        Data::Const(v) => *v,
        Data::Vec(v) => v[i],
    }
}

fn get_i(d: &Data<i64>, i: usize) -> Option<i64> {
    match d {
        Data::Const(v) => *v,
        Data::Vec(v) => v[i],
    }
}

fn to_float(c: &Col, n: usize) -> Option<Data<f64>> {
    match c {
        Col::Null => Some(Data::Const(None)),
        Col::Int(d) => Some(map_col(d, n, |v| Some(*v as f64))),
        Col::Float(d) => Some(d.clone()),
        _ => None,
    }
}

fn is_null(c: &Col, i: usize) -> bool {
    match c {
        Col::Null => true,
        Col::Int(d) => get_i(d, i).is_none(),
        Col::Float(d) => get(d, i).is_none(),
        Col::Bool(d) => matches!(d, Data::Const(None)) || matches!(d, Data::Vec(v) if v[i].is_none()),
        Col::Text(d) => matches!(d, Data::Const(None)) || matches!(d, Data::Vec(v) if v[i].is_none()),
        Col::Date(d) => matches!(d, Data::Const(None)) || matches!(d, Data::Vec(v) if v[i].is_none()),
        Col::Timestamp(d) => matches!(d, Data::Const(None)) || matches!(d, Data::Vec(v) if v[i].is_none()),
    }
}

fn cast(c: Col, ty: Ty, n: usize) -> Col {
    match (ty, c) {
        (Ty::Float, Col::Int(d)) => Col::Float(map_col(&d, n, |v| Some(*v as f64))),
        (Ty::Timestamp, Col::Date(d)) => Col::Timestamp(map_col(&d, n, |v| Some(*v as i64 * 86_400_000))),
        (_, c) => c,
    }
}
