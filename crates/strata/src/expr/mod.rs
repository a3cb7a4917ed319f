//! SQL-subset expressions for `derive` and `where`.
//!
//! The language is a small subset of ISO/IEC 9075 (SQL) value expressions:
//! literals (`12`, `1.5`, `'text'`, `TRUE`, `NULL`, `DATE '2024-03-01'`,
//! `TIMESTAMP '2024-03-01 12:00:00'`), column names (bare, or in double
//! quotes), `+ - * /`, `||`, `= <> < <= > >=`, `AND OR NOT`, `IN`,
//! `BETWEEN`, `IS [NOT] NULL`, `CASE`, and the functions in
//! [`functions::NAMES`]. `docs/spec.md` is the reader's reference.
//!
//! Semantics chosen (and tested against SQLite, see
//! `tests/reference/gen/sqlite_expr.py`):
//! - integer / integer truncates toward zero (`7 / 2` is 3, `-7 / 2` is -3);
//!   write `7 * 1.0 / 2` for 3.5. Division by zero gives NULL, not an error.
//! - integer overflow is an error naming the data row.
//! - `log(x)` is base 10, `ln(x)` natural, `log(b, x)` base b; logarithms
//!   of x <= 0 and `sqrt` of a negative number give NULL; so does any
//!   result that is not a finite number.
//! - NULL follows three-valued logic; `where` keeps rows whose condition
//!   is TRUE (FALSE and NULL rows are dropped).

pub mod eval;
pub mod functions;
pub mod parse;

pub use parse::{parse, Expr, ExprError, Span};

use crate::data::Column;
use crate::data::Table;
use crate::error::{Diagnostic, Errors};
use eval::{Col, Env};

/// A located expression error as a spec diagnostic.
pub(crate) fn diagnostic(path: &str, text: &str, e: &ExprError) -> Diagnostic {
    let mut d = Diagnostic::error("expr.invalid", e.render(text)).at_path(path);
    d.hint = e.hint.clone();
    d
}

/// Evaluate one expression over a table, giving a column of its rows.
pub fn evaluate(table: &Table, text: &str) -> Result<Column, ExprError> {
    let e = parse(text)?;
    let env = Env { names: table.names(), columns: table.columns(), rows: table.num_rows() };
    Ok(eval::eval(&e, &env)?.into_column(table.num_rows()))
}

/// Add derived columns (in order; each may use the ones before) and keep
/// the rows where `where_` is TRUE. A derived column with the name of an
/// existing one replaces it.
pub fn apply(table: Table, derive: &crate::spec::Pairs<String>, where_: Option<&str>) -> Result<Table, Errors> {
    if derive.is_empty() && where_.is_none() {
        return Ok(table);
    }
    // Parse everything first, so that every syntax error is reported at once.
    let mut errors = Vec::new();
    let mut parsed = Vec::new();
    for (name, text) in derive {
        let path = format!("derive.{}", path_key(name));
        match parse(text) {
            Ok(e) => parsed.push((name, path, text.as_str(), Some(e))),
            Err(e) => {
                errors.push(diagnostic(&path, text, &e));
                parsed.push((name, path, text.as_str(), None));
            }
        }
    }
    let filter = match where_.map(|w| (w, parse(w))) {
        Some((w, Ok(e))) => Some((w, Some(e))),
        Some((w, Err(e))) => {
            errors.push(diagnostic("where", w, &e));
            Some((w, None))
        }
        None => None,
    };

    let (mut names, mut columns, n, warnings) = table.into_parts();
    for (name, path, text, e) in parsed {
        let col = match e {
            Some(e) => {
                let env = Env { names: &names, columns: &columns, rows: n };
                match eval::eval(&e, &env) {
                    Ok(c) => c.into_column(n),
                    Err(err) => {
                        errors.push(diagnostic(&path, text, &err));
                        Col::Null.into_column(n)
                    }
                }
            }
            // A column that failed stays known (as all-NULL), so later
            // expressions using it do not report a second, confusing error.
            None => Col::Null.into_column(n),
        };
        match names.iter().position(|c| c == name) {
            Some(i) => columns[i] = col,
            None => {
                names.push(name.clone());
                columns.push(col);
            }
        }
    }
    let mut keep: Option<Vec<bool>> = None;
    if let Some((w, Some(e))) = filter {
        let env = Env { names: &names, columns: &columns, rows: n };
        match eval::eval(&e, &env) {
            Ok(Col::Bool(d)) => keep = Some((0..n).map(|i| d.clone_row(i) == Some(true)).collect()),
            Ok(Col::Null) => keep = Some(vec![false; n]),
            Ok(c) => {
                let err = ExprError::new(format!("`where` needs a true/false condition, but this gives {}", c.ty().word()), e.span())
                    .hint("compare the value with something, such as rain_mm > 0");
                errors.push(diagnostic("where", w, &err));
            }
            Err(err) => errors.push(diagnostic("where", w, &err)),
        }
    }
    if !errors.is_empty() {
        return Err(Errors(errors));
    }
    let (columns, rows) = match &keep {
        Some(mask) => (columns.iter().map(|c| c.filter(mask)).collect::<Vec<_>>(), mask.iter().filter(|b| **b).count()),
        None => (columns, n),
    };
    Ok(Table::new(names, columns, rows, warnings))
}

/// A derive name as a path segment: plain names as they are, others quoted.
pub(crate) fn path_key(name: &str) -> String {
    if !name.is_empty() && name.chars().all(|c| c.is_alphanumeric() || c == '_') {
        name.to_string()
    } else {
        format!("{name:?}")
    }
}

impl<T: Clone> eval::Data<T> {
    fn clone_row(&self, i: usize) -> Option<T> {
        match self {
            eval::Data::Const(v) => v.clone(),
            eval::Data::Vec(v) => v[i].clone(),
        }
    }
}

#[cfg(test)]
mod tests;
