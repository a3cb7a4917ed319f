//! Diagnostics shared by every stage: an error or warning that names where it
//! went wrong, as a spec path (`layers[1].stat`), a data position (line and
//! column), or both.

use serde::Serialize;
use std::fmt;

#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Severity {
    Error,
    Warning,
}

/// Where a diagnostic points: a path into the spec, a position in the data.
#[derive(Debug, Clone, Default, PartialEq, Eq, Serialize)]
pub struct Location {
    /// JSON path into the spec, such as `layers[0].x`; empty for the whole spec.
    #[serde(skip_serializing_if = "String::is_empty")]
    pub path: String,
    /// 1-based line in the data file.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub line: Option<u64>,
    /// 1-based column (field number for delimited data, character for text).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub column: Option<u64>,
}

#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Diagnostic {
    pub severity: Severity,
    /// Short stable code, such as `spec.unknown_key` or `data.ragged_row`.
    pub code: String,
    pub message: String,
    #[serde(flatten)]
    pub at: Location,
    /// What to do about it, if we know.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub hint: Option<String>,
}

impl Diagnostic {
    pub fn error(code: &str, message: impl Into<String>) -> Self {
        Diagnostic { severity: Severity::Error, code: code.to_string(), message: message.into(), at: Location::default(), hint: None }
    }
    pub fn warning(code: &str, message: impl Into<String>) -> Self {
        Diagnostic { severity: Severity::Warning, ..Diagnostic::error(code, message) }
    }
    pub fn at_path(mut self, path: impl Into<String>) -> Self {
        self.at.path = path.into();
        self
    }
    pub fn at_data(mut self, line: u64, column: Option<u64>) -> Self {
        self.at.line = Some(line);
        self.at.column = column;
        self
    }
    pub fn with_hint(mut self, hint: impl Into<String>) -> Self {
        self.hint = Some(hint.into());
        self
    }

    /// Append this diagnostic as a JSON object, the bytes its `Serialize`
    /// gives through `serde_json::to_string` (the page engine writes its
    /// answer with this, without serde's serializer):
    /// `{"severity":"error","code":..,"message":..,"path":..,"line":..,"column":..,"hint":..}`,
    /// leaving out an empty path and absent parts.
    pub fn write_json(&self, out: &mut String) {
        let field = |out: &mut String, key: &str, value: &str| {
            out.push_str(",\"");
            out.push_str(key);
            out.push_str("\":");
            crate::json::write_str(out, value);
        };
        out.push_str(if self.severity == Severity::Error { "{\"severity\":\"error\"" } else { "{\"severity\":\"warning\"" });
        field(out, "code", &self.code);
        field(out, "message", &self.message);
        if !self.at.path.is_empty() {
            field(out, "path", &self.at.path);
        }
        for (key, n) in [("line", self.at.line), ("column", self.at.column)] {
            if let Some(n) = n {
                out.push_str(&format!(",\"{key}\":{n}"));
            }
        }
        if let Some(h) = &self.hint {
            field(out, "hint", h);
        }
        out.push('}');
    }
}

impl fmt::Display for Diagnostic {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let kind = match self.severity {
            Severity::Error => "error",
            Severity::Warning => "warning",
        };
        write!(f, "{kind}")?;
        if !self.at.path.is_empty() {
            write!(f, " at {}", self.at.path)?;
        }
        match (self.at.line, self.at.column) {
            (Some(l), Some(c)) => write!(f, " (data line {l}, column {c})")?,
            (Some(l), None) => write!(f, " (data line {l})")?,
            _ => {}
        }
        write!(f, ": {}", self.message)?;
        if let Some(h) = &self.hint {
            write!(f, "\n  hint: {h}")?;
        }
        Ok(())
    }
}

/// One or more errors; the pipeline stops at the first stage that reports any.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(transparent)]
pub struct Errors(pub Vec<Diagnostic>);

impl From<Diagnostic> for Errors {
    fn from(d: Diagnostic) -> Self {
        Errors(vec![d])
    }
}

impl fmt::Display for Errors {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        for (i, d) in self.0.iter().enumerate() {
            if i > 0 {
                writeln!(f)?;
            }
            write!(f, "{d}")?;
        }
        Ok(())
    }
}

impl std::error::Error for Errors {}
