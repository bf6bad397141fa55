//! The hand-written half of the parser: property lines and values.
//!
//! A design file is mostly `key value` lines, so this is the hot path. It is a
//! precedence-climbing parser over the normalised tokens, plugged into the
//! chumsky grammar (see `parser.rs`) with chumsky's `custom` combinator. Written
//! with combinators it ran at about a fifth of the speed (the figures are in
//! DEVELOPERS.md); the structure of the file, blocks and error recovery stay in
//! chumsky.

use crate::ast::*;
use crate::lexer::{TokKind, Token};
use crate::parser::{Custom, Label, PErr};
use crate::span::Span;

/// A cursor over the normalised tokens.
pub(crate) struct Cur<'a> {
    pub src: &'a str,
    pub toks: &'a [Token],
    pub pos: usize,
    pub eoi: Span,
    /// Errors that do not stop the parse (a number out of range, a bad escape).
    pub soft: Vec<PErr>,
    /// Operators (binary and signs) read so far in the current value, to
    /// bound its tree's depth by [`MAX_OPERATORS`].
    ops: usize,
}

/// The most operators (`+ - * / ·` and signs) one value may hold. Every later
/// stage walks a value's tree recursively (evaluation, formatting, hover), so
/// a bound on its depth keeps any input from overflowing their stacks; real
/// values hold a handful.
pub const MAX_OPERATORS: usize = 256;

fn bit(k: TokKind) -> u64 {
    1 << (k as u64)
}

impl<'a> Cur<'a> {
    pub fn new(src: &'a str, toks: &'a [Token], pos: usize, eoi: Span) -> Cur<'a> {
        Cur {
            src,
            toks,
            pos,
            eoi,
            soft: Vec::new(),
            ops: 0,
        }
    }

    #[inline]
    pub fn peek(&self) -> Option<TokKind> {
        self.toks.get(self.pos).map(|t| t.kind)
    }

    #[inline]
    fn span(&self) -> Span {
        self.toks.get(self.pos).map_or(self.eoi, |t| t.span)
    }

    #[inline]
    fn bump(&mut self) -> Span {
        let s = self.span();
        self.pos += 1;
        s
    }

    fn fail(&self, expected: u64, label: Option<Label>) -> PErr {
        PErr::at(self.span(), expected, label, self.peek())
    }

    fn name(&mut self) -> Name {
        Name { span: self.bump() }
    }

    /// True when the rest of the line holds a `{` outside parentheses: the
    /// line is a block header, not a property.
    pub fn line_opens_block(&self) -> bool {
        // A header is `KIND [NAME] ["Label"] [like OTHER] {`: when the second
        // token cannot be part of one, the line is a property (the common case,
        // decided without scanning the line).
        if !matches!(
            self.toks.get(self.pos + 1).map(|t| t.kind),
            Some(TokKind::LBrace | TokKind::Ident | TokKind::Str | TokKind::KwLike)
        ) {
            return false;
        }
        let mut depth = 0usize;
        for t in &self.toks[self.pos.min(self.toks.len())..] {
            match t.kind {
                TokKind::Newline | TokKind::Semi | TokKind::RBrace => return false,
                TokKind::LParen => depth += 1,
                TokKind::RParen => depth = depth.saturating_sub(1),
                TokKind::LBrace => return depth == 0,
                _ => {}
            }
        }
        false
    }

    /// True at a token that ends an item: a line break, `;`, `}` or the end.
    pub fn at_item_end(&self) -> bool {
        matches!(
            self.peek(),
            None | Some(TokKind::Newline | TokKind::Semi | TokKind::RBrace)
        )
    }

    /// Fail unless the item ends here.
    pub fn expect_item_end(&self) -> Result<(), PErr> {
        if self.at_item_end() {
            Ok(())
        } else {
            Err(self.fail(bit(TokKind::Newline), None))
        }
    }

    /// `key value`, ending at the end of the item.
    pub fn property(&mut self) -> Result<Property, PErr> {
        let start = self.span();
        let key = match self.peek() {
            Some(k) if k == TokKind::Ident || k.is_keyword() => self.name(),
            _ => return Err(self.fail(0, Some(Label::Key))),
        };
        let value = self.value()?;
        self.expect_item_end()?;
        Ok(Property {
            span: start.cover(value.span),
            key,
            value,
        })
    }

    /// Elements, then `with KEY VALUE` clauses.
    pub fn value(&mut self) -> Result<Value, PErr> {
        self.ops = 0;
        let elements = self.elements()?;
        let mut span = elements.first.span.cover(elements.last().span);
        let mut with = Vec::new();
        while self.peek() == Some(TokKind::KwWith) {
            let keyword = self.bump();
            let key = match self.peek() {
                Some(k) if k == TokKind::Ident || k.is_keyword() => self.name(),
                _ => return Err(self.fail(0, Some(Label::Key))),
            };
            let inner = self.elements()?;
            let inner_span = inner.first.span.cover(inner.last().span);
            let clause_span = keyword.cover(inner_span);
            span = span.cover(clause_span);
            with.push(With {
                span: clause_span,
                keyword,
                key,
                value: Value {
                    span: inner_span,
                    elements: inner,
                    with: Box::default(),
                },
            });
        }
        Ok(Value {
            span,
            elements,
            with: with.into_boxed_slice(),
        })
    }

    fn elements(&mut self) -> Result<Elements, PErr> {
        let first = self.element()?;
        let mut rest = Vec::new();
        while self.peek() == Some(TokKind::Comma) {
            self.bump();
            rest.push(self.element()?);
        }
        Ok(Elements {
            first,
            rest: rest.into_boxed_slice(),
        })
    }

    fn qualifier(&mut self) -> Option<Name> {
        (self.peek() == Some(TokKind::Ident)).then(|| self.name())
    }

    fn element(&mut self) -> Result<Element, PErr> {
        let expr = self.expr(0)?;
        let qualifier = self.qualifier();
        let mut span = expr.span();
        if let Some(q) = &qualifier {
            span = span.cover(q.span);
        }
        let range_end = if self.peek() == Some(TokKind::KwTo) {
            let keyword = self.bump();
            let end = self.expr(0)?;
            let q = self.qualifier();
            span = span.cover(end.span());
            if let Some(q) = &q {
                span = span.cover(q.span);
            }
            Some(Box::new(RangeEnd {
                keyword,
                expr: end,
                qualifier: q,
            }))
        } else {
            None
        };
        Ok(Element {
            span,
            expr,
            qualifier,
            range_end,
        })
    }

    /// Precedence climbing: `+ -` bind at 1, `* / ·` at 2; both left-associative.
    fn expr(&mut self, min_prec: u8) -> Result<Expr, PErr> {
        let mut lhs = self.unary()?;
        loop {
            let (op, prec) = match self.peek() {
                Some(TokKind::Plus) => (BinaryOp::Add, 1),
                Some(TokKind::Minus) => (BinaryOp::Sub, 1),
                Some(TokKind::Star | TokKind::MidDot) => (BinaryOp::Mul, 2),
                Some(TokKind::Slash) => (BinaryOp::Div, 2),
                _ => break,
            };
            if prec <= min_prec {
                break;
            }
            self.count_operator()?;
            let op_span = self.bump();
            let rhs = self.expr(prec)?;
            lhs = Expr::Binary(Box::new(Binary {
                span: lhs.span().cover(rhs.span()),
                op,
                op_span,
                lhs,
                rhs,
            }));
        }
        Ok(lhs)
    }

    /// Prefix `-` and `+`, any number of them (collected, then applied, so a
    /// long run of signs cannot deepen the recursion).
    fn unary(&mut self) -> Result<Expr, PErr> {
        let mut ops = Vec::new();
        loop {
            let op = match self.peek() {
                Some(TokKind::Minus) => UnaryOp::Neg,
                Some(TokKind::Plus) => UnaryOp::Pos,
                _ => break,
            };
            self.count_operator()?;
            ops.push((op, self.bump()));
        }
        let mut e = self.atom()?;
        for (op, op_span) in ops.into_iter().rev() {
            e = Expr::Unary(Box::new(Unary {
                span: op_span.cover(e.span()),
                op,
                op_span,
                operand: e,
            }));
        }
        Ok(e)
    }

    /// Count one more operator of the current value; past [`MAX_OPERATORS`]
    /// the value is an error at that operator.
    fn count_operator(&mut self) -> Result<(), PErr> {
        if self.ops >= MAX_OPERATORS {
            return Err(PErr::custom(self.span(), Custom::TooManyOperators));
        }
        self.ops += 1;
        Ok(())
    }

    fn atom(&mut self) -> Result<Expr, PErr> {
        match self.peek() {
            Some(TokKind::Number) => {
                let digits = self.bump();
                let value = match parse_number(digits.text(self.src)) {
                    Some(v) => v,
                    None => {
                        self.soft
                            .push(PErr::custom(digits, Custom::NumberOutOfRange));
                        0.0
                    }
                };
                let unit =
                    (self.peek() == Some(TokKind::Unit)).then(|| UnitLit { span: self.bump() });
                Ok(Expr::Number(Number {
                    digits,
                    value,
                    unit,
                }))
            }
            Some(TokKind::Ident) => Ok(Expr::Name(self.name())),
            Some(TokKind::KwNone) => Ok(Expr::None(self.bump())),
            Some(TokKind::LParen) => {
                let open = self.bump();
                let inner = self.expr(0)?;
                if self.peek() != Some(TokKind::RParen) {
                    return Err(self.fail(
                        bit(TokKind::RParen)
                            | bit(TokKind::Plus)
                            | bit(TokKind::Minus)
                            | bit(TokKind::Star)
                            | bit(TokKind::Slash),
                        None,
                    ));
                }
                let close = self.bump();
                Ok(Expr::Paren(Box::new(Paren {
                    span: open.cover(close),
                    inner,
                })))
            }
            _ => Err(self.fail(0, Some(Label::Value))),
        }
    }

    /// Skip a broken item: to the end of its line, keeping `{ }` and `( )`
    /// balanced; inside a block, stop before the block's closing `}`. Then skip
    /// the line break. Returns the skipped span (`None` when there was nothing).
    pub fn skip_item(&mut self, top_level: bool) -> Option<Span> {
        let start = self.pos;
        let mut depth = 0usize;
        while let Some(k) = self.peek() {
            match k {
                TokKind::Newline | TokKind::Semi if depth == 0 => break,
                TokKind::RBrace | TokKind::RParen if depth == 0 && !top_level => break,
                TokKind::LBrace | TokKind::LParen => depth += 1,
                TokKind::RBrace | TokKind::RParen => depth = depth.saturating_sub(1),
                _ => {}
            }
            self.pos += 1;
        }
        let span =
            (self.pos > start).then(|| self.toks[start].span.cover(self.toks[self.pos - 1].span));
        while matches!(self.peek(), Some(TokKind::Newline | TokKind::Semi)) {
            self.pos += 1;
        }
        span
    }

    /// Skip line breaks and `;`.
    pub fn skip_separators(&mut self) {
        while matches!(self.peek(), Some(TokKind::Newline | TokKind::Semi)) {
            self.pos += 1;
        }
    }

    /// A string literal with escapes resolved (a bad escape is a soft error).
    pub fn string(&mut self) -> Result<StrLit, PErr> {
        if self.peek() != Some(TokKind::Str) {
            return Err(self.fail(0, Some(Label::Path)));
        }
        let span = self.bump();
        Ok(string_lit(span, self.src, &mut self.soft))
    }

    /// A name (identifier).
    pub fn ident(&mut self) -> Result<Name, PErr> {
        if self.peek() != Some(TokKind::Ident) {
            return Err(self.fail(0, Some(Label::Name)));
        }
        Ok(self.name())
    }

    pub fn expect(&mut self, kind: TokKind) -> Result<Span, PErr> {
        if self.peek() == Some(kind) {
            Ok(self.bump())
        } else {
            Err(self.fail(bit(kind), None))
        }
    }
}

pub(crate) fn string_lit(span: Span, src: &str, soft: &mut Vec<PErr>) -> StrLit {
    let text = span.text(src);
    let inner = text.get(1..text.len().saturating_sub(1)).unwrap_or("");
    match unescape(inner) {
        Some(value) => StrLit { span, value },
        None => {
            soft.push(PErr::custom(span, Custom::InvalidEscape));
            StrLit {
                span,
                value: inner.to_string(),
            }
        }
    }
}

fn parse_number(text: &str) -> Option<f64> {
    let v: f64 = if text.contains('_') {
        text.replace('_', "").parse().ok()?
    } else {
        text.parse().ok()?
    };
    v.is_finite().then_some(v)
}

/// Resolve `\"` and `\\` in the text between the quotes; `None` on any other escape.
fn unescape(inner: &str) -> Option<String> {
    if !inner.contains('\\') {
        return Some(inner.to_string());
    }
    let mut out = String::with_capacity(inner.len());
    let mut chars = inner.chars();
    while let Some(c) = chars.next() {
        if c == '\\' {
            match chars.next() {
                Some('"') => out.push('"'),
                Some('\\') => out.push('\\'),
                _ => return None,
            }
        } else {
            out.push(c);
        }
    }
    Some(out)
}
