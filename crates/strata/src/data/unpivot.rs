//! `unpivot`: wide columns into long rows (SQL's UNPIVOT). Each input row
//! becomes one row per listed column, in the listed order: the column's
//! name goes into the first `into` column, its value into the second, and
//! every other column is repeated. Rows are emitted row by row, so the
//! names column meets the names in the listed order, which is the order a
//! category scale takes (first appearance).

use super::table::{Column, TextBuilder};
use super::Table;
use crate::error::{Diagnostic, Errors};
use crate::spec::Unpivot;

/// The most bytes the long table may take before it is built (the budget
/// check after it would come too late to save the memory).
const MAX_LONG_BYTES: usize = 256 << 20;

pub fn apply(table: Table, u: &Unpivot) -> Result<Table, Errors> {
    let names = table.column_names();
    let mut errors = Vec::new();
    if u.columns.is_empty() {
        errors.push(
            Diagnostic::error("spec.unpivot_empty", "`unpivot` lists no columns")
                .at_path("unpivot.columns")
                .with_hint("list the wide columns to turn into rows, such as [\"jan\", \"feb\", \"mar\"]"),
        );
    }
    let mut picked: Vec<usize> = Vec::with_capacity(u.columns.len());
    for (j, c) in u.columns.iter().enumerate() {
        let path = format!("unpivot.columns[{j}]");
        match names.iter().position(|n| n == c) {
            Some(_) if u.columns[..j].contains(c) => {
                errors.push(Diagnostic::error("spec.unpivot_repeated", format!("`unpivot` lists column `{c}` twice")).at_path(path));
            }
            Some(p) => picked.push(p),
            None => {
                let d = Diagnostic::error("spec.unknown_column", format!("there is no column `{c}` in the data")).at_path(path);
                errors.push(match crate::spec::closest(c, names.iter().map(String::as_str)) {
                    Some(s) => d.with_hint(format!("did you mean `{s}`? The columns are: {}", crate::join(&names, ", "))),
                    None => d.with_hint(format!("the columns are: {}", crate::join(&names, ", "))),
                });
            }
        }
    }
    if u.into.len() != 2 {
        errors.push(
            Diagnostic::error("spec.unpivot_into", "`into` names two new columns: the names, then the values")
                .at_path("unpivot.into")
                .with_hint("such as [\"month\", \"value\"]"),
        );
    } else {
        for (k, n) in u.into.iter().enumerate() {
            let path = format!("unpivot.into[{k}]");
            let kept = names.iter().any(|m| m == n) && !u.columns.contains(n);
            if n.trim().is_empty() {
                errors.push(Diagnostic::error("spec.unpivot_into", "a new column needs a name").at_path(path));
            } else if k == 1 && u.into[0] == *n {
                errors.push(Diagnostic::error("spec.unpivot_into", format!("both new columns are called `{n}`")).at_path(path));
            } else if kept {
                errors.push(
                    Diagnostic::error("spec.unpivot_into", format!("the data already has a column `{n}`, which `unpivot` keeps"))
                        .at_path(path)
                        .with_hint("choose another name for the new column"),
                );
            }
        }
    }
    if !errors.is_empty() {
        return Err(Errors(errors));
    }
    // Every listed column must hold one kind of value (integers and numbers go together).
    let kinds: Vec<_> = picked.iter().map(|&p| table.column(p).kind()).collect();
    let numbers = |k: &super::table::Kind| matches!(k, super::table::Kind::Int | super::table::Kind::Float);
    if let Some(j) = kinds.iter().position(|k| *k != kinds[0] && !(numbers(k) && numbers(&kinds[0]))) {
        return Err(Diagnostic::error(
            "spec.unpivot_mixed",
            format!("column `{}` holds {} but `{}` holds {}; the values column takes one kind", u.columns[j], kinds[j].word(), u.columns[0], kinds[0].word()),
        )
        .at_path(format!("unpivot.columns[{j}]"))
        .with_hint("list columns of one kind, or set `data.types` so they read alike")
        .into());
    }
    let rows = table.num_rows();
    let k = picked.len();
    let kept: Vec<usize> = (0..names.len()).filter(|i| !picked.contains(i)).collect();
    let long = rows.saturating_mul(k);
    if long.saturating_mul(8).saturating_mul(kept.len() + 2) > MAX_LONG_BYTES {
        return Err(Diagnostic::error(
            "budget.table",
            format!("`unpivot` would make {long} rows of {} columns, more than the {} MB a chart may use", kept.len() + 2, MAX_LONG_BYTES >> 20),
        )
        .at_path("unpivot")
        .with_hint("keep only the rows and columns the chart needs (`where`) before unpivoting")
        .into());
    }
    // Row r, listed column j -> long row r * k + j.
    let repeat: Vec<Option<usize>> = (0..long).map(|i| Some(i / k)).collect();
    let (all_names, columns, _, warnings) = table.into_parts();
    let mut out_names = Vec::with_capacity(kept.len() + 2);
    let mut out_cols = Vec::with_capacity(kept.len() + 2);
    for &i in &kept {
        out_names.push(all_names[i].clone());
        out_cols.push(columns[i].take(&repeat));
    }
    let mut label = TextBuilder::with_capacity(long);
    for _ in 0..rows {
        for c in &u.columns {
            label.push(Some(c.as_bytes()));
        }
    }
    // The listed columns one after another (column j's row r at j * rows + r), then picked row by row.
    let stacked = Column::concat(picked.iter().map(|&p| columns[p].clone()).collect()).expect("kinds checked above");
    let order: Vec<Option<usize>> = (0..long).map(|i| Some((i % k) * rows + i / k)).collect();
    out_names.push(u.into[0].clone());
    out_cols.push(Column::Text(label.finish()));
    out_names.push(u.into[1].clone());
    out_cols.push(stacked.take(&order));
    Ok(Table::new(out_names, out_cols, long, warnings))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::data::{read, ReadOptions};
    use crate::spec::DataFormat;

    fn table(csv: &str) -> Table {
        read(csv.as_bytes(), &ReadOptions { format: Some(DataFormat::Csv), ..Default::default() }).unwrap()
    }

    fn u(columns: &[&str], into: &[&str]) -> Unpivot {
        Unpivot { columns: columns.iter().map(|s| s.to_string()).collect(), into: into.iter().map(|s| s.to_string()).collect() }
    }

    fn cells(t: &Table, name: &str) -> Vec<String> {
        let c = t.by_name(name).unwrap();
        (0..t.num_rows())
            .map(|i| match c {
                Column::Text(v) => v.get(i).unwrap_or("").to_string(),
                Column::Int(v) => v.get(i).map(|x| x.to_string()).unwrap_or_default(),
                Column::Float(v) => v.get(i).map(|x| x.to_string()).unwrap_or_default(),
                _ => "?".into(),
            })
            .collect()
    }

    #[test]
    fn wide_columns_become_long_rows_in_listed_order() {
        // Checked against SQLite: the same unpivot as a UNION ALL of one SELECT
        // per listed column, ordered by input row then listed order
        // (tests/reference/gen/sqlite_unpivot.py, fixtures/unpivot/).
        let wide = include_str!("../../../../tests/reference/fixtures/unpivot/wide.csv");
        let want = include_str!("../../../../tests/reference/fixtures/unpivot/long.csv");
        let long = apply(table(wide), &u(&["jan", "feb", "mar"], &["month", "rain"])).unwrap();
        assert_eq!(long.column_names(), ["station", "month", "rain"]);
        let rows: Vec<Vec<String>> = want.lines().skip(1).map(|l| l.split(',').map(str::to_string).collect()).collect();
        assert_eq!(cells(&long, "station"), rows.iter().map(|r| r[0].clone()).collect::<Vec<_>>());
        assert_eq!(cells(&long, "month"), rows.iter().map(|r| r[1].clone()).collect::<Vec<_>>());
        let rain: Vec<Option<f64>> = (0..long.num_rows())
            .map(|i| match long.by_name("rain").unwrap() {
                Column::Float(v) => v.get(i),
                Column::Int(v) => v.get(i).map(|x| x as f64),
                _ => None,
            })
            .collect();
        assert_eq!(rain, rows.iter().map(|r| r[2].parse::<f64>().ok()).collect::<Vec<_>>());
    }

    #[test]
    fn integers_and_numbers_mix_but_text_does_not() {
        let t = table("a,b,c\n1,2.5,x\n");
        let long = apply(t, &u(&["a", "b"], &["k", "v"])).unwrap();
        assert_eq!(cells(&long, "v"), ["1", "2.5"]);
        let e = apply(table("a,b,c\n1,2.5,x\n"), &u(&["a", "c"], &["k", "v"])).unwrap_err();
        assert_eq!(e.0[0].code, "spec.unpivot_mixed");
        assert_eq!(e.0[0].at.path, "unpivot.columns[1]");
    }

    #[test]
    fn mistakes_are_located() {
        let t = || table("station,jan,feb\nNorth,1,2\n");
        let e = apply(t(), &u(&["jan", "fbe"], &["month", "rain"])).unwrap_err();
        assert_eq!((e.0[0].code.as_str(), e.0[0].at.path.as_str()), ("spec.unknown_column", "unpivot.columns[1]"));
        assert!(e.0[0].hint.as_deref().unwrap().contains("did you mean `feb`?"));
        let e = apply(t(), &u(&["jan", "jan"], &["month", "rain"])).unwrap_err();
        assert_eq!(e.0[0].at.path, "unpivot.columns[1]");
        let e = apply(t(), &u(&["jan"], &["station", "rain"])).unwrap_err();
        assert_eq!((e.0[0].code.as_str(), e.0[0].at.path.as_str()), ("spec.unpivot_into", "unpivot.into[0]"));
        let e = apply(t(), &u(&["jan"], &["v", "v"])).unwrap_err();
        assert_eq!(e.0[0].at.path, "unpivot.into[1]");
        let e = apply(t(), &u(&[], &["m", "v"])).unwrap_err();
        assert_eq!(e.0[0].at.path, "unpivot.columns");
        // A listed column may take the name of a new one (it is gone by then).
        assert!(apply(t(), &u(&["jan", "feb"], &["jan", "rain"])).is_ok());
    }
}
