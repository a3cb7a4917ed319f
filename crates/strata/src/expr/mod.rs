//! SQL-subset expressions for `derive` and `where`.
//!
//! Not yet implemented: specs that use `derive` or `where` get a located
//! error saying so.

use crate::data::Table;
use crate::error::{Diagnostic, Errors};

/// Add derived columns and filter rows.
pub fn apply(table: Table, derive: &indexmap::IndexMap<String, String>, where_: Option<&str>) -> Result<Table, Errors> {
    if let Some((name, _)) = derive.iter().next() {
        return Err(Diagnostic::error("spec.unsupported", "`derive` expressions are not supported by this build yet")
            .at_path(format!("derive.{name}"))
            .into());
    }
    if where_.is_some() {
        return Err(Diagnostic::error("spec.unsupported", "`where` expressions are not supported by this build yet").at_path("where").into());
    }
    Ok(table)
}
