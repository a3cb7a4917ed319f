//! Text to syntax tree: a lexer and a precedence-climbing parser for the
//! SQL-subset expression language (ISO/IEC 9075 value expressions, a small
//! subset). Positions are character offsets into the expression text.

use std::fmt;

/// A half-open range of character offsets (0-based) in the expression text.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Span {
    pub start: usize,
    pub end: usize,
}

impl Span {
    fn to(self, other: Span) -> Span {
        Span { start: self.start.min(other.start), end: self.end.max(other.end) }
    }
}

/// How many characters of the expression an error message shows.
pub const SHOWN: usize = 120;

/// A problem in an expression, at a character range.
#[derive(Debug, Clone, PartialEq)]
pub struct ExprError {
    pub message: String,
    pub span: Span,
    pub hint: Option<String>,
}

impl ExprError {
    pub fn new(message: impl Into<String>, span: Span) -> Self {
        ExprError { message: message.into(), span, hint: None }
    }
    pub fn hint(mut self, h: impl Into<String>) -> Self {
        self.hint = Some(h.into());
        self
    }
    /// The message with the expression underneath and a caret line under
    /// the offending characters, and the 1-based character position.
    ///
    /// A long expression is shown as a window of at most [`SHOWN`]
    /// characters around the error, so the message stays short however long
    /// the text is.
    pub fn render(&self, text: &str) -> String {
        let n = text.chars().count();
        let start = self.span.start.min(n);
        let (from, to) = if n <= SHOWN {
            (0, n)
        } else {
            let from = start.saturating_sub(SHOWN / 2).min(n - SHOWN);
            (from, from + SHOWN)
        };
        let width = self.span.end.saturating_sub(self.span.start).max(1).min(to.saturating_sub(start).max(1));
        let mut one_line: String = text.chars().skip(from).take(to - from).map(|c| if c == '\n' || c == '\r' || c == '\t' { ' ' } else { c }).collect();
        let mut lead = start - from;
        if from > 0 {
            one_line.insert_str(0, "...");
            lead += 3;
        }
        if to < n {
            one_line.push_str("...");
        }
        format!("{} (character {})\n    {}\n    {}{}", self.message, start + 1, one_line, " ".repeat(lead), "^".repeat(width))
    }
}

#[derive(Debug, Clone, PartialEq)]
pub enum Literal {
    Null,
    Bool(bool),
    Int(i64),
    Float(f64),
    Text(String),
    /// `DATE 'yyyy-MM-dd'`: days since 1970-01-01.
    Date(i32),
    /// `TIMESTAMP 'yyyy-MM-dd HH:mm:ss'`: milliseconds since 1970-01-01 UTC.
    Timestamp(i64),
}

#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum BinOp {
    Add,
    Sub,
    Mul,
    Div,
    Concat,
    Eq,
    Ne,
    Lt,
    Le,
    Gt,
    Ge,
    And,
    Or,
}

impl BinOp {
    pub fn symbol(self) -> &'static str {
        match self {
            BinOp::Add => "+",
            BinOp::Sub => "-",
            BinOp::Mul => "*",
            BinOp::Div => "/",
            BinOp::Concat => "||",
            BinOp::Eq => "=",
            BinOp::Ne => "<>",
            BinOp::Lt => "<",
            BinOp::Le => "<=",
            BinOp::Gt => ">",
            BinOp::Ge => ">=",
            BinOp::And => "AND",
            BinOp::Or => "OR",
        }
    }
}

#[derive(Debug, Clone, PartialEq)]
pub enum Expr {
    Lit(Literal, Span),
    Column(String, bool, Span),
    Neg(Box<Expr>, Span),
    Not(Box<Expr>, Span),
    Binary(BinOp, Box<Expr>, Box<Expr>, Span),
    IsNull { expr: Box<Expr>, negated: bool, span: Span },
    In { expr: Box<Expr>, list: Vec<Expr>, negated: bool, span: Span },
    Between { expr: Box<Expr>, low: Box<Expr>, high: Box<Expr>, negated: bool, span: Span },
    Case { operand: Option<Box<Expr>>, whens: Vec<(Expr, Expr)>, otherwise: Option<Box<Expr>>, span: Span },
    Call { name: String, args: Vec<Expr>, span: Span },
}

impl Expr {
    pub fn span(&self) -> Span {
        match self {
            Expr::Lit(_, s) | Expr::Column(_, _, s) | Expr::Neg(_, s) | Expr::Not(_, s) | Expr::Binary(_, _, _, s) => *s,
            Expr::IsNull { span, .. } | Expr::In { span, .. } | Expr::Between { span, .. } | Expr::Case { span, .. } | Expr::Call { span, .. } => *span,
        }
    }
}

// ---------------------------------------------------------------- lexer

#[derive(Debug, Clone, PartialEq)]
enum Tok {
    Int(i64),
    Float(f64),
    Str(String),
    /// A bare word: identifier or keyword (keywords are matched case-insensitively).
    Word(String),
    /// A double-quoted identifier.
    Quoted(String),
    Sym(&'static str),
    End,
}

impl fmt::Display for Tok {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Tok::Int(v) => write!(f, "`{v}`"),
            Tok::Float(v) => write!(f, "`{}`", crate::format::float::Plain(*v)),
            Tok::Str(s) => write!(f, "'{s}'"),
            Tok::Word(w) => write!(f, "`{w}`"),
            Tok::Quoted(w) => write!(f, "\"{w}\""),
            Tok::Sym(s) => write!(f, "`{s}`"),
            Tok::End => f.write_str("the end of the expression"),
        }
    }
}

const SYMBOLS: [&str; 15] = ["<>", "<=", ">=", "!=", "||", "+", "-", "*", "/", "=", "<", ">", "(", ")", ","];

fn lex(text: &str) -> Result<Vec<(Tok, Span)>, ExprError> {
    let chars: Vec<char> = text.chars().collect();
    let mut out = Vec::new();
    let mut i = 0;
    while i < chars.len() {
        let c = chars[i];
        if c.is_whitespace() {
            i += 1;
            continue;
        }
        let start = i;
        if c.is_ascii_digit() || (c == '.' && chars.get(i + 1).is_some_and(|d| d.is_ascii_digit())) {
            let mut float = false;
            while i < chars.len() && chars[i].is_ascii_digit() {
                i += 1;
            }
            if i < chars.len() && chars[i] == '.' {
                float = true;
                i += 1;
                while i < chars.len() && chars[i].is_ascii_digit() {
                    i += 1;
                }
            }
            if i < chars.len() && (chars[i] == 'e' || chars[i] == 'E') {
                let mut j = i + 1;
                if j < chars.len() && (chars[j] == '+' || chars[j] == '-') {
                    j += 1;
                }
                if j < chars.len() && chars[j].is_ascii_digit() {
                    float = true;
                    i = j;
                    while i < chars.len() && chars[i].is_ascii_digit() {
                        i += 1;
                    }
                }
            }
            if i < chars.len() && (chars[i].is_alphanumeric() || chars[i] == '_') {
                return Err(ExprError::new("a number runs into a name; put a space or an operator between them", Span { start, end: i + 1 }));
            }
            let s: String = chars[start..i].iter().collect();
            let span = Span { start, end: i };
            let tok = if float {
                Tok::Float(crate::format::float::parse(&s).ok_or_else(|| ExprError::new("not a number", span))?)
            } else {
                match s.parse::<i64>() {
                    Ok(v) => Tok::Int(v),
                    // Integer literals too large for 64 bits are read as approximate numbers.
                    Err(_) => Tok::Float(crate::format::float::parse(&s).ok_or_else(|| ExprError::new("not a number", span))?),
                }
            };
            out.push((tok, span));
            continue;
        }
        if c.is_alphabetic() || c == '_' {
            while i < chars.len() && (chars[i].is_alphanumeric() || chars[i] == '_') {
                i += 1;
            }
            out.push((Tok::Word(chars[start..i].iter().collect()), Span { start, end: i }));
            continue;
        }
        if c == '\'' || c == '"' {
            let mut s = String::new();
            i += 1;
            loop {
                if i >= chars.len() {
                    let what = if c == '\'' { "text" } else { "quoted name" };
                    return Err(ExprError::new(format!("this {what} is never closed"), Span { start, end: start + 1 })
                        .hint(format!("end it with {c}; write {c}{c} for a {c} inside it")));
                }
                if chars[i] == c {
                    if chars.get(i + 1) == Some(&c) {
                        s.push(c);
                        i += 2;
                        continue;
                    }
                    i += 1;
                    break;
                }
                s.push(chars[i]);
                i += 1;
            }
            let span = Span { start, end: i };
            out.push((if c == '\'' { Tok::Str(s) } else { Tok::Quoted(s) }, span));
            continue;
        }
        let rest: String = chars[i..chars.len().min(i + 2)].iter().collect();
        if let Some(sym) = SYMBOLS.iter().find(|s| rest.starts_with(**s)) {
            i += sym.chars().count();
            let sym: &'static str = if *sym == "!=" { "<>" } else { sym };
            out.push((Tok::Sym(sym), Span { start, end: i }));
            continue;
        }
        let hint = match c {
            '`' => "quote a column name with double quotes, such as \"my column\"",
            '%' => "there is no remainder operator; see the list of operators in docs/spec.md",
            '&' | '|' => "write AND or OR",
            '!' => "write NOT, or <> for not equal",
            _ => "see the expression language in docs/spec.md",
        };
        return Err(ExprError::new(format!("unexpected character `{c}`"), Span { start, end: start + 1 }).hint(hint));
    }
    out.push((Tok::End, Span { start: chars.len(), end: chars.len() }));
    Ok(out)
}

// ---------------------------------------------------------------- parser

/// Words that cannot be bare column names (quote them: `"end"`).
pub const RESERVED: [&str; 17] =
    ["AND", "OR", "NOT", "IN", "BETWEEN", "IS", "NULL", "CASE", "WHEN", "THEN", "ELSE", "END", "TRUE", "FALSE", "DATE", "TIMESTAMP", "UNKNOWN"];

struct Parser {
    toks: Vec<(Tok, Span)>,
    pos: usize,
    depth: usize,
}

/// Nesting limit: deeper expressions are refused instead of overflowing the stack.
const MAX_DEPTH: usize = 64;

/// Bound on the depth of the whole syntax tree, however it was built: a
/// flat chain `a + a + ... + a` parses without nesting but gives a left-deep
/// tree one level per operator, and evaluation recurses once per level.
/// Measured: a level of evaluation takes about 0.5 KB of a release build's
/// stack (wasm or native) and 10 KB of a debug build's; 128 levels stay inside
/// a 1 MB WebAssembly stack and a 2 MB native thread, debug build included
/// (`long_chains_are_refused_not_overflowed`, below; 200 overflowed there).
pub const MAX_TREE_DEPTH: usize = 128;

/// Bound on the number of tokens (and so of tree nodes) in one expression.
pub const MAX_TOKENS: usize = 8192;

/// Parse an expression.
pub fn parse(text: &str) -> Result<Expr, ExprError> {
    let toks = lex(text)?;
    if toks.len() > MAX_TOKENS + 1 {
        return Err(ExprError::new(format!("the expression has more than {MAX_TOKENS} words, numbers and operators"), toks[MAX_TOKENS].1)
            .hint("split it into several `derive` steps"));
    }
    let mut p = Parser { toks, pos: 0, depth: 0 };
    if p.peek() == &Tok::End {
        return Err(ExprError::new("the expression is empty", Span { start: 0, end: 0 }));
    }
    let e = p.expr()?;
    if p.peek() != &Tok::End {
        let (t, s) = p.toks[p.pos].clone();
        let hint = if matches!(t, Tok::Word(_) | Tok::Quoted(_) | Tok::Int(_) | Tok::Float(_) | Tok::Str(_)) {
            "two values in a row: is an operator (AND, OR, +, =, ...) or a comma missing?"
        } else {
            "check the brackets and operators before this point"
        };
        return Err(ExprError::new(format!("unexpected {t}"), s).hint(hint));
    }
    check_depth(&e)?;
    Ok(e)
}

/// The children of a node, for walks that must not recurse.
pub fn children(e: &Expr) -> Vec<&Expr> {
    match e {
        Expr::Lit(..) | Expr::Column(..) => Vec::new(),
        Expr::Neg(a, _) | Expr::Not(a, _) => vec![a],
        Expr::Binary(_, a, b, _) => vec![a, b],
        Expr::IsNull { expr, .. } => vec![expr],
        Expr::In { expr, list, .. } => std::iter::once(&**expr).chain(list.iter()).collect(),
        Expr::Between { expr, low, high, .. } => vec![expr, low, high],
        Expr::Case { operand, whens, otherwise, .. } => {
            operand.iter().map(|b| &**b).chain(whens.iter().flat_map(|(w, t)| [w, t])).chain(otherwise.iter().map(|b| &**b)).collect()
        }
        Expr::Call { args, .. } => args.iter().collect(),
    }
}

/// Refuse a tree deeper than [`MAX_TREE_DEPTH`], pointing at the operator
/// where it gets too deep. The walk keeps its own stack.
fn check_depth(root: &Expr) -> Result<(), ExprError> {
    let mut stack = vec![(root, 1usize)];
    while let Some((e, d)) = stack.pop() {
        if d > MAX_TREE_DEPTH {
            // For a chain, the operator after the left-hand side.
            let at = match e {
                Expr::Binary(_, l, r, _) => Span { start: l.span().end, end: r.span().start.max(l.span().end + 1) },
                _ => e.span(),
            };
            return Err(ExprError::new(format!("the expression is more than {MAX_TREE_DEPTH} operations deep"), at)
                .hint("a long chain of operators nests one level per operator: split it into several `derive` steps"));
        }
        stack.extend(children(e).into_iter().map(|c| (c, d + 1)));
    }
    Ok(())
}

impl Parser {
    fn peek(&self) -> &Tok {
        &self.toks[self.pos].0
    }
    fn span(&self) -> Span {
        self.toks[self.pos].1
    }
    fn prev_span(&self) -> Span {
        self.toks[self.pos.saturating_sub(1)].1
    }
    fn bump(&mut self) -> (Tok, Span) {
        let t = self.toks[self.pos].clone();
        if self.pos + 1 < self.toks.len() {
            self.pos += 1;
        }
        t
    }
    fn is_kw(&self, kw: &str) -> bool {
        matches!(self.peek(), Tok::Word(w) if w.eq_ignore_ascii_case(kw))
    }
    fn is_kw_at(&self, k: usize, kw: &str) -> bool {
        matches!(self.toks.get(self.pos + k), Some((Tok::Word(w), _)) if w.eq_ignore_ascii_case(kw))
    }
    fn eat_kw(&mut self, kw: &str) -> bool {
        if self.is_kw(kw) {
            self.bump();
            true
        } else {
            false
        }
    }
    fn is_sym(&self, s: &str) -> bool {
        matches!(self.peek(), Tok::Sym(x) if *x == s)
    }
    fn eat_sym(&mut self, s: &str) -> bool {
        if self.is_sym(s) {
            self.bump();
            true
        } else {
            false
        }
    }
    fn expect_sym(&mut self, s: &str, what: &str) -> Result<Span, ExprError> {
        if self.is_sym(s) {
            Ok(self.bump().1)
        } else {
            Err(ExprError::new(format!("expected `{s}` {what}, found {}", self.peek()), self.span()))
        }
    }
    fn expect_kw(&mut self, kw: &str, what: &str) -> Result<Span, ExprError> {
        if self.is_kw(kw) {
            Ok(self.bump().1)
        } else {
            Err(ExprError::new(format!("expected {kw} {what}, found {}", self.peek()), self.span()))
        }
    }

    fn enter(&mut self) -> Result<(), ExprError> {
        self.depth += 1;
        if self.depth > MAX_DEPTH {
            return Err(ExprError::new(format!("the expression nests deeper than {MAX_DEPTH} levels"), self.span()));
        }
        Ok(())
    }

    fn expr(&mut self) -> Result<Expr, ExprError> {
        self.enter()?;
        let r = self.or();
        self.depth -= 1;
        r
    }

    fn or(&mut self) -> Result<Expr, ExprError> {
        let mut l = self.and()?;
        while self.eat_kw("OR") {
            let r = self.operand(Self::and, "OR")?;
            let s = l.span().to(r.span());
            l = Expr::Binary(BinOp::Or, Box::new(l), Box::new(r), s);
        }
        Ok(l)
    }

    fn and(&mut self) -> Result<Expr, ExprError> {
        let mut l = self.not()?;
        while self.eat_kw("AND") {
            let r = self.operand(Self::not, "AND")?;
            let s = l.span().to(r.span());
            l = Expr::Binary(BinOp::And, Box::new(l), Box::new(r), s);
        }
        Ok(l)
    }

    fn not(&mut self) -> Result<Expr, ExprError> {
        if self.is_kw("NOT") {
            let s = self.bump().1;
            self.enter()?;
            let e = self.operand(Self::not, "NOT");
            self.depth -= 1;
            let e = e?;
            let span = s.to(e.span());
            return Ok(Expr::Not(Box::new(e), span));
        }
        self.comparison()
    }

    /// The right-hand side of an operator, with a clear error when it is missing.
    fn operand(&mut self, f: fn(&mut Self) -> Result<Expr, ExprError>, after: &str) -> Result<Expr, ExprError> {
        if matches!(self.peek(), Tok::End | Tok::Sym(")") | Tok::Sym(",")) {
            return Err(ExprError::new(format!("expected a value after `{after}`, found {}", self.peek()), self.span()));
        }
        f(self)
    }

    fn comparison(&mut self) -> Result<Expr, ExprError> {
        let mut l = self.additive()?;
        loop {
            let op = match self.peek() {
                Tok::Sym("=") => BinOp::Eq,
                Tok::Sym("<>") => BinOp::Ne,
                Tok::Sym("<") => BinOp::Lt,
                Tok::Sym("<=") => BinOp::Le,
                Tok::Sym(">") => BinOp::Gt,
                Tok::Sym(">=") => BinOp::Ge,
                _ => {
                    if self.is_kw("IS") {
                        self.bump();
                        let negated = self.eat_kw("NOT");
                        let end = self.expect_kw("NULL", "after IS (write IS NULL or IS NOT NULL)")?;
                        let span = l.span().to(end);
                        l = Expr::IsNull { expr: Box::new(l), negated, span };
                        continue;
                    }
                    let negated = self.is_kw("NOT") && (self.is_kw_at(1, "IN") || self.is_kw_at(1, "BETWEEN"));
                    if negated {
                        self.bump();
                    }
                    if self.eat_kw("IN") {
                        self.expect_sym("(", "after IN (write IN ('a', 'b'))")?;
                        let mut list = Vec::new();
                        if self.is_sym(")") {
                            return Err(ExprError::new("the IN list is empty", self.span()));
                        }
                        loop {
                            list.push(self.expr()?);
                            if self.eat_sym(",") {
                                continue;
                            }
                            let end = self.expect_sym(")", "to close the IN list")?;
                            let span = l.span().to(end);
                            l = Expr::In { expr: Box::new(l), list, negated, span };
                            break;
                        }
                        continue;
                    }
                    if self.eat_kw("BETWEEN") {
                        let low = self.operand(Self::additive, "BETWEEN")?;
                        self.expect_kw("AND", "between the two bounds of BETWEEN")?;
                        let high = self.operand(Self::additive, "AND")?;
                        let span = l.span().to(high.span());
                        l = Expr::Between { expr: Box::new(l), low: Box::new(low), high: Box::new(high), negated, span };
                        continue;
                    }
                    return Ok(l);
                }
            };
            let sym = op.symbol();
            self.bump();
            let r = self.operand(Self::additive, sym)?;
            let s = l.span().to(r.span());
            l = Expr::Binary(op, Box::new(l), Box::new(r), s);
        }
    }

    fn additive(&mut self) -> Result<Expr, ExprError> {
        let mut l = self.multiplicative()?;
        loop {
            let op = match self.peek() {
                Tok::Sym("+") => BinOp::Add,
                Tok::Sym("-") => BinOp::Sub,
                _ => return Ok(l),
            };
            self.bump();
            let r = self.operand(Self::multiplicative, op.symbol())?;
            let s = l.span().to(r.span());
            l = Expr::Binary(op, Box::new(l), Box::new(r), s);
        }
    }

    fn multiplicative(&mut self) -> Result<Expr, ExprError> {
        let mut l = self.concat()?;
        loop {
            let op = match self.peek() {
                Tok::Sym("*") => BinOp::Mul,
                Tok::Sym("/") => BinOp::Div,
                _ => return Ok(l),
            };
            self.bump();
            let r = self.operand(Self::concat, op.symbol())?;
            let s = l.span().to(r.span());
            l = Expr::Binary(op, Box::new(l), Box::new(r), s);
        }
    }

    fn concat(&mut self) -> Result<Expr, ExprError> {
        let mut l = self.unary()?;
        while self.eat_sym("||") {
            let r = self.operand(Self::unary, "||")?;
            let s = l.span().to(r.span());
            l = Expr::Binary(BinOp::Concat, Box::new(l), Box::new(r), s);
        }
        Ok(l)
    }

    fn unary(&mut self) -> Result<Expr, ExprError> {
        if self.is_sym("-") || self.is_sym("+") {
            let (t, s) = self.bump();
            self.enter()?;
            let e = self.operand(Self::unary, if t == Tok::Sym("-") { "-" } else { "+" });
            self.depth -= 1;
            let e = e?;
            let span = s.to(e.span());
            // Fold a minus into a number literal.
            if t == Tok::Sym("+") {
                return Ok(e);
            }
            return Ok(match e {
                Expr::Lit(Literal::Int(v), _) => Expr::Lit(Literal::Int(-v), span),
                Expr::Lit(Literal::Float(v), _) => Expr::Lit(Literal::Float(-v), span),
                e => Expr::Neg(Box::new(e), span),
            });
        }
        self.primary()
    }

    fn primary(&mut self) -> Result<Expr, ExprError> {
        let (tok, span) = self.bump();
        match tok {
            Tok::Int(v) => Ok(Expr::Lit(Literal::Int(v), span)),
            Tok::Float(v) => Ok(Expr::Lit(Literal::Float(v), span)),
            Tok::Str(s) => Ok(Expr::Lit(Literal::Text(s), span)),
            Tok::Quoted(s) => Ok(Expr::Column(s, true, span)),
            Tok::Sym("(") => {
                let e = self.expr()?;
                self.expect_sym(")", "to close the bracket")?;
                Ok(e)
            }
            Tok::Word(w) => {
                let up = w.to_ascii_uppercase();
                match up.as_str() {
                    "NULL" => return Ok(Expr::Lit(Literal::Null, span)),
                    "TRUE" => return Ok(Expr::Lit(Literal::Bool(true), span)),
                    "FALSE" => return Ok(Expr::Lit(Literal::Bool(false), span)),
                    "UNKNOWN" => return Ok(Expr::Lit(Literal::Null, span)),
                    "CASE" => return self.case(span),
                    "DATE" | "TIMESTAMP" if matches!(self.peek(), Tok::Str(_)) => {
                        let (Tok::Str(s), sspan) = self.bump() else { unreachable!() };
                        let full = span.to(sspan);
                        return if up == "DATE" {
                            crate::calendar::parse_date(&s)
                                .map(|d| Expr::Lit(Literal::Date(d as i32), full))
                                .ok_or_else(|| ExprError::new(format!("'{s}' is not a date"), sspan).hint("write DATE 'yyyy-MM-dd', such as DATE '2024-03-01'"))
                        } else {
                            crate::calendar::parse_datetime(&s)
                                .or_else(|| crate::calendar::parse_date(&s).map(|d| d * 86_400_000))
                                .map(|t| Expr::Lit(Literal::Timestamp(t), full))
                                .ok_or_else(|| {
                                    ExprError::new(format!("'{s}' is not a date-time"), sspan)
                                        .hint("write TIMESTAMP 'yyyy-MM-dd HH:mm:ss', such as TIMESTAMP '2024-03-01 12:00:00'")
                                })
                        };
                    }
                    _ => {}
                }
                if self.is_sym("(") {
                    self.bump();
                    let mut args = Vec::new();
                    if !self.is_sym(")") {
                        loop {
                            args.push(self.expr()?);
                            if !self.eat_sym(",") {
                                break;
                            }
                        }
                    }
                    let end = self.expect_sym(")", "to close the function's arguments")?;
                    return Ok(Expr::Call { name: w.to_ascii_lowercase(), args, span: span.to(end) });
                }
                if RESERVED.contains(&up.as_str()) {
                    return Err(ExprError::new(format!("expected a value, found the keyword {up}"), span)
                        .hint(format!("a column named {w} must be written in double quotes: \"{w}\"")));
                }
                Ok(Expr::Column(w, false, span))
            }
            t => {
                let what = if t == Tok::End { "the expression ends too early".to_string() } else { format!("expected a value, found {t}") };
                let _ = self.prev_span();
                Err(ExprError::new(what, span))
            }
        }
    }

    fn case(&mut self, start: Span) -> Result<Expr, ExprError> {
        let operand = if self.is_kw("WHEN") { None } else { Some(Box::new(self.expr()?)) };
        let mut whens = Vec::new();
        while self.eat_kw("WHEN") {
            let cond = self.expr()?;
            self.expect_kw("THEN", "after the WHEN condition")?;
            let val = self.expr()?;
            whens.push((cond, val));
        }
        if whens.is_empty() {
            return Err(ExprError::new(format!("expected WHEN in CASE, found {}", self.peek()), self.span())
                .hint("write CASE WHEN condition THEN value ELSE other END"));
        }
        let otherwise = if self.eat_kw("ELSE") { Some(Box::new(self.expr()?)) } else { None };
        let end = self.expect_kw("END", "to close CASE")?;
        Ok(Expr::Case { operand, whens, otherwise, span: start.to(end) })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn precedence_follows_sql() {
        // a + b * c; NOT binds looser than comparison; AND before OR.
        let e = parse("1 + 2 * 3").unwrap();
        assert!(matches!(e, Expr::Binary(BinOp::Add, _, _, _)));
        let e = parse("NOT a = 1 OR b AND c").unwrap();
        let Expr::Binary(BinOp::Or, l, r, _) = e else { panic!() };
        assert!(matches!(*l, Expr::Not(_, _)));
        assert!(matches!(*r, Expr::Binary(BinOp::And, _, _, _)));
    }

    #[test]
    fn errors_point_at_characters() {
        let e = parse("rain_mm > 10 AND").unwrap_err();
        assert_eq!(e.span.start, 16);
        assert!(e.render("rain_mm > 10 AND").contains("character 17"));
        let e = parse("station IN ('a', 'b'").unwrap_err();
        assert!(e.message.contains("close the IN list"), "{}", e.message);
        let e = parse("name = 'open").unwrap_err();
        assert_eq!(e.span.start, 7);
        let e = parse("a b").unwrap_err();
        assert_eq!(e.span.start, 2);
        let e = parse("end > 3").unwrap_err();
        assert!(e.hint.unwrap().contains("\"end\""));
    }

    #[test]
    fn quoted_names_literals_and_keywords() {
        assert_eq!(parse("\"rain \"\"mm\"\"\"").unwrap(), Expr::Column("rain \"mm\"".into(), true, Span { start: 0, end: 13 }));
        assert_eq!(parse("'it''s'").unwrap(), Expr::Lit(Literal::Text("it's".into()), Span { start: 0, end: 7 }));
        assert!(matches!(parse("DATE '2024-02-29'").unwrap(), Expr::Lit(Literal::Date(19782), _)));
        assert!(parse("DATE '2023-02-29'").is_err());
        assert!(matches!(parse("-5").unwrap(), Expr::Lit(Literal::Int(-5), _)));
        assert!(matches!(parse("x not between 1 and 2").unwrap(), Expr::Between { negated: true, .. }));
        assert!(matches!(parse("x is not null").unwrap(), Expr::IsNull { negated: true, .. }));
    }

    #[test]
    fn deep_nesting_is_refused_not_overflowed() {
        let s = "(".repeat(3000) + "1" + &")".repeat(3000);
        assert!(parse(&s).unwrap_err().message.contains("nests deeper"));
        let s = "NOT ".repeat(5000) + "TRUE";
        assert!(parse(&s).is_err());
        let s = "-".repeat(5000) + "1";
        assert!(parse(&s).is_err());
    }

    /// A render in a thread with a small stack, as a page's engine or a
    /// worker thread would have.
    fn render_small_stack(expr: String) -> Result<usize, String> {
        std::thread::Builder::new()
            .stack_size(2 << 20)
            .spawn(move || {
                let spec = serde_json::json!({
                    "data": {"rows": [{"a": 1}, {"a": 2}]},
                    "derive": {"b": expr},
                    "layers": [{"draw": "point", "x": "a", "y": "b"}]
                });
                crate::render(&spec.to_string(), None, &Default::default()).map(|r| r.svg.len()).map_err(|e| e.to_string())
            })
            .unwrap()
            .join()
            .unwrap()
    }

    #[test]
    fn long_chains_are_refused_not_overflowed() {
        // 20,000 terms once aborted the process (issue 16): refused with a place.
        for op in ["+", "*", "||", "AND", "OR", "=", "<"] {
            let chain = vec!["a"; 20_000].join(&format!(" {op} "));
            let e = render_small_stack(chain).unwrap_err();
            assert!(e.contains("derive.b") && e.contains("(character "), "{op}: {e}");
            assert!(e.len() < 1000, "the message stays short: {} bytes", e.len());
        }
        // Within the bound, the deepest chains render in a 2 MB thread.
        let ok = vec!["a"; MAX_TREE_DEPTH].join(" + ");
        assert!(render_small_stack(ok).is_ok());
        let over = vec!["a"; MAX_TREE_DEPTH + 1].join(" + ");
        let e = parse(&over).unwrap_err();
        assert!(e.message.contains("operations deep"), "{e:?}");
        // Deep trees of other shapes: nested function calls and CASE inside chains.
        let nested = "abs(".repeat(60) + "a" + &")".repeat(60);
        assert!(render_small_stack(nested).is_ok());
        let mixed = (0..300).map(|i| format!("CASE WHEN a > {i} THEN a ELSE 0 END")).collect::<Vec<_>>().join(" + ");
        assert!(parse(&mixed).is_err());
        // Too many tokens, even in a flat IN list.
        let wide = format!("a IN ({})", vec!["1"; MAX_TOKENS].join(", "));
        assert!(parse(&wide).unwrap_err().message.contains("more than"));
    }

    #[test]
    fn long_expressions_are_shown_as_a_window() {
        let text = "1 + ".repeat(100) + "'open";
        let e = parse(&text).unwrap_err();
        let r = e.render(&text);
        assert!(r.lines().nth(1).unwrap().chars().count() <= SHOWN + 10, "{r}");
        let caret = r.lines().nth(2).unwrap();
        let line = r.lines().nth(1).unwrap();
        // The caret stays under the offending quote.
        assert_eq!(line.chars().nth(caret.find('^').unwrap()), Some('\''), "{r}");
    }
}
