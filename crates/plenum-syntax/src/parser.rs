//! The chumsky grammar over the normalised token stream, and its error type.
//!
//! Chumsky drives the structure: the file's items, block headers and bodies.
//! Property lines and values, the hot path, are parsed by the hand-written
//! parser in `values.rs`, plugged in with `custom`.
//!
//! Recovery works at two levels: an item (a property, a nested block, a top-level
//! `use`/`let`/block) that fails to parse is skipped to the end of its line,
//! keeping `{ }` balanced, becomes an `Error` node, and its error is emitted; a
//! block whose closing brace is missing at the end of the file is closed there
//! (one error for it is added after parsing, see `lib.rs`).

use chumsky::DefaultExpected;
use chumsky::error::{Error as ChumskyError, LabelError};
use chumsky::input::{Input, InputRef, MappedInput};
use chumsky::prelude::*;
use chumsky::util::MaybeRef;

use crate::ast::*;
use crate::error::{SyntaxError, SyntaxErrorKind};
use crate::lexer::{TokKind, Token};
use crate::span::Span;
use crate::values::{Cur, MAX_OPERATORS, string_lit};

/// What the parser looked for, named for messages.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
#[repr(u8)]
pub(crate) enum Label {
    Value = 0,
    Key = 1,
    Name = 2,
    Item = 3,
    Path = 4,
}

impl Label {
    fn describe(self) -> &'static str {
        match self {
            Label::Value => "a value",
            Label::Key => "a key",
            Label::Name => "a name",
            Label::Item => "`use`, `let` or a block",
            Label::Path => "a quoted path",
        }
    }
    const ALL: [Label; 5] = [
        Label::Value,
        Label::Key,
        Label::Name,
        Label::Item,
        Label::Path,
    ];
}

/// Errors that the grammar raises itself, beyond "expected X, found Y".
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) enum Custom {
    NumberOutOfRange,
    InvalidEscape,
    /// A `key value` line outside any block; the span is the key.
    PropertyOutsideBlock,
    /// More than `MAX_OPERATORS` operators in one value; the span is the
    /// first operator past the limit.
    TooManyOperators,
}

/// A parse error cheap enough to create on every failed alternative: the
/// expected tokens and labels are bit sets, nothing is allocated.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) struct PErr {
    span: Span,
    expected: u64,
    labels: u8,
    found: Option<TokKind>,
    custom: Option<Custom>,
}

const EOI_BIT: u64 = 1 << 63;

impl PErr {
    /// "expected X, found Y" at `span`.
    pub(crate) fn at(
        span: Span,
        expected: u64,
        label: Option<Label>,
        found: Option<TokKind>,
    ) -> PErr {
        PErr {
            span,
            expected,
            labels: label.map_or(0, |l| 1 << (l as u8)),
            found,
            custom: None,
        }
    }

    pub(crate) fn custom(span: Span, c: Custom) -> PErr {
        PErr {
            span,
            expected: 0,
            labels: 0,
            found: None,
            custom: Some(c),
        }
    }
}

impl PErr {
    /// True when the offending token is one the lexer has already reported.
    pub(crate) fn is_lexical(&self) -> bool {
        matches!(
            self.found,
            Some(TokKind::Error) | Some(TokKind::UnterminatedStr)
        )
    }

    /// An error that says nothing: the end of a repetition, never reported.
    pub(crate) fn nothing(span: Span) -> PErr {
        PErr {
            span,
            expected: 0,
            labels: 0,
            found: None,
            custom: None,
        }
    }
}

impl<'src, I> ChumskyError<'src, I> for PErr
where
    I: Input<'src, Token = TokKind, Span = Span>,
{
    fn merge(mut self, other: Self) -> Self {
        if self.custom.is_none() {
            self.custom = other.custom;
        }
        self.expected |= other.expected;
        self.labels |= other.labels;
        self
    }
}

impl<'src, I> LabelError<'src, I, DefaultExpected<'src, TokKind>> for PErr
where
    I: Input<'src, Token = TokKind, Span = Span>,
{
    fn expected_found<E: IntoIterator<Item = DefaultExpected<'src, TokKind>>>(
        expected: E,
        found: Option<MaybeRef<'src, TokKind>>,
        span: Span,
    ) -> Self {
        let mut bits = 0u64;
        for e in expected {
            match e {
                DefaultExpected::Token(t) => bits |= 1 << (*t as u64),
                DefaultExpected::EndOfInput => bits |= EOI_BIT,
                _ => {}
            }
        }
        PErr {
            span,
            expected: bits,
            labels: 0,
            found: found.map(|t| *t),
            custom: None,
        }
    }
}

impl<'src, I> LabelError<'src, I, Label> for PErr
where
    I: Input<'src, Token = TokKind, Span = Span>,
{
    fn expected_found<E: IntoIterator<Item = Label>>(
        expected: E,
        found: Option<MaybeRef<'src, TokKind>>,
        span: Span,
    ) -> Self {
        let mut labels = 0u8;
        for l in expected {
            labels |= 1 << (l as u8);
        }
        PErr {
            span,
            expected: 0,
            labels,
            found: found.map(|t| *t),
            custom: None,
        }
    }

    fn label_with(&mut self, label: Label) {
        self.expected = 0;
        self.labels = 1 << (label as u8);
    }
}

impl PErr {
    /// Turn into a reportable error, or `None` when the lexer already reported
    /// the offending token.
    pub(crate) fn into_syntax_error(self, src: &str) -> Option<SyntaxError> {
        if let Some(c) = self.custom {
            return Some(match c {
                Custom::PropertyOutsideBlock => SyntaxError::new(
                    SyntaxErrorKind::Unexpected,
                    self.span,
                    format!(
                        "`{}` is a property, but it is outside any block",
                        self.span.text(src)
                    ),
                )
                .with_label("expected `use`, `let` or a block here")
                .with_help("move it into the block it belongs to, such as `site { ... }`"),
                Custom::NumberOutOfRange => SyntaxError::new(
                    SyntaxErrorKind::NumberOutOfRange,
                    self.span,
                    "number is too large".to_string(),
                )
                .with_help("numbers must be below about 1.8e308"),
                Custom::TooManyOperators => SyntaxError::new(
                    SyntaxErrorKind::NestingTooDeep,
                    self.span,
                    format!("a value may hold at most {MAX_OPERATORS} operators"),
                )
                .with_label("one operator too many")
                .with_help("split the value into `let`s"),
                Custom::InvalidEscape => SyntaxError::new(
                    SyntaxErrorKind::InvalidEscape,
                    self.span,
                    "invalid escape in string".to_string(),
                )
                .with_help("only `\\\"` and `\\\\` are escapes"),
            });
        }
        if self.is_lexical() {
            return None;
        }
        let found = match self.found {
            None => "end of file",
            Some(t) => t.describe(),
        };
        let mut wanted: Vec<&'static str> = Vec::new();
        for l in Label::ALL {
            if self.labels & (1 << (l as u8)) != 0 {
                wanted.push(l.describe());
            }
        }
        // Say what matters, not every token that could continue: a missing value
        // first, then the end of the item (listing every operator that could also
        // continue a value is noise), then the tokens themselves.
        let ends_item = self.expected & (1 << (TokKind::Newline as u64)) != 0;
        let has = |l: Label| self.labels & (1 << (l as u8)) != 0;
        let mut help = None;
        if has(Label::Value) {
            wanted = vec![Label::Value.describe()];
            if self.found == Some(TokKind::Eq) {
                help = Some("a property is written `key value`, without `=`");
            }
        } else if has(Label::Item) || has(Label::Path) {
            wanted.retain(|w| *w == Label::Item.describe() || *w == Label::Path.describe());
        } else if ends_item {
            wanted = vec!["the end of the line"];
            help = Some("put each item on its own line, or separate items with `;`");
        } else {
            for i in 0..TokKind::COUNT as u64 {
                if self.expected & (1 << i) != 0
                    && let Some(kind) = kind_from_index(i)
                    && !wanted.contains(&kind.describe())
                {
                    wanted.push(kind.describe());
                }
            }
        }
        if self.expected & EOI_BIT != 0 && wanted.is_empty() {
            wanted.push("end of file");
        }
        let message = if wanted.is_empty() {
            format!("unexpected {found}")
        } else {
            format!("expected {}, found {found}", join_or(&wanted))
        };
        let mut err = SyntaxError::new(SyntaxErrorKind::Unexpected, self.span, message);
        if let Some(help) = help {
            err = err.with_help(help);
        }
        if self.found == Some(TokKind::RBrace) && wanted.contains(&Label::Item.describe()) {
            err = SyntaxError::new(
                SyntaxErrorKind::UnmatchedClose,
                self.span,
                "unmatched `}`".to_string(),
            )
            .with_help("remove it, or add the block header it closes");
        }
        Some(err)
    }
}

fn kind_from_index(i: u64) -> Option<TokKind> {
    use TokKind::*;
    const KINDS: [TokKind; TokKind::COUNT] = [
        Comment,
        Newline,
        Semi,
        Comma,
        LBrace,
        RBrace,
        LParen,
        RParen,
        Plus,
        Minus,
        Star,
        Slash,
        MidDot,
        Caret,
        Eq,
        Number,
        Str,
        UnterminatedStr,
        Ident,
        KwUse,
        KwLet,
        KwLike,
        KwTo,
        KwWith,
        KwNone,
        Degree,
        Percent,
        DottedWord,
        SuperWord,
        Unit,
        Error,
    ];
    KINDS.get(i as usize).copied()
}

fn join_or(items: &[&str]) -> String {
    match items {
        [] => String::new(),
        [one] => (*one).to_string(),
        [init @ .., last] => format!("{} or {}", init.join(", "), last),
    }
}

type Extra = extra::Err<PErr>;

/// The parser's input: the normalised tokens, split into kind and span.
pub(crate) type TokenInput<'src> =
    MappedInput<'src, TokKind, Span, &'src [Token], fn(&'src Token) -> (&'src TokKind, &'src Span)>;

fn split(t: &Token) -> (&TokKind, &Span) {
    (&t.kind, &t.span)
}

fn input<'src>(tokens: &'src [Token], eoi: Span) -> TokenInput<'src> {
    tokens.map(eoi, split as fn(&'src Token) -> (&'src TokKind, &'src Span))
}

type Inp<'src, 'parse> = InputRef<'src, 'parse, TokenInput<'src>, Extra>;

/// The index of the next token.
fn index(inp: &Inp<'_, '_>) -> usize {
    inp.cursor().inner().0
}

/// Move chumsky's input up to the hand parser's position and hand over the
/// hand parser's soft errors.
fn sync(inp: &mut Inp<'_, '_>, cur: &mut Cur<'_>) {
    let from = index(inp);
    for _ in from..cur.pos {
        inp.skip();
    }
    for e in cur.soft.drain(..) {
        inp.emit(e);
    }
}

fn name_of(span: Span) -> Name {
    Name { span }
}

/// What a parsed block is followed by: the end of its item, or an error that
/// skips the rest of the line.
fn finish_block_line(inp: &mut Inp<'_, '_>, cur: &mut Cur<'_>, top_level: bool) {
    if let Err(e) = cur.expect_item_end() {
        inp.emit(e);
        cur.skip_item(top_level);
    }
    cur.skip_separators();
}

/// Give up on the item that starts at `start`: report `err` and skip its line.
fn give_up(
    inp: &mut Inp<'_, '_>,
    cur: &mut Cur<'_>,
    start: usize,
    err: PErr,
    top_level: bool,
) -> Span {
    cur.pos = start;
    cur.soft.clear();
    inp.emit(err);
    let span = cur
        .skip_item(top_level)
        .unwrap_or_else(|| Span::empty(err.span.start));
    if cur.pos == start {
        // Always make progress.
        cur.pos += 1;
    }
    span
}

fn file_parser<'src>(
    src: &'src str,
    toks: &'src [Token],
    eoi: Span,
) -> impl Parser<'src, TokenInput<'src>, SourceFile, Extra> {
    let separators = custom(move |inp: &mut Inp<'src, '_>| {
        let mut cur = Cur::new(src, toks, index(inp), eoi);
        cur.skip_separators();
        sync(inp, &mut cur);
        Ok::<(), PErr>(())
    });

    let ident = select! { TokKind::Ident = e => name_of(e.span()) }.labelled(Label::Name);
    let string =
        select! { TokKind::Str = e => e.span() }.validate(move |span: Span, _, emitter| {
            let mut soft = Vec::new();
            let lit = string_lit(span, src, &mut soft);
            for e in soft {
                emitter.emit(e);
            }
            lit
        });

    let block = recursive(|block| {
        let entry = custom(move |inp: &mut Inp<'src, '_>| {
            let start = index(inp);
            let mut cur = Cur::new(src, toks, start, eoi);
            if matches!(cur.peek(), None | Some(TokKind::RBrace)) {
                return Err(PErr::nothing(eoi));
            }
            if cur.line_opens_block() {
                let before = inp.save();
                match inp.parse(&block) {
                    Ok(b) => {
                        cur.pos = index(inp);
                        finish_block_line(inp, &mut cur, false);
                        sync(inp, &mut cur);
                        Ok(Entry::Block(Box::new(b)))
                    }
                    Err(e) => {
                        inp.rewind(before);
                        let span = give_up(inp, &mut cur, start, e, false);
                        sync(inp, &mut cur);
                        Ok(Entry::Error(span))
                    }
                }
            } else {
                match cur.property() {
                    Ok(p) => {
                        cur.skip_separators();
                        sync(inp, &mut cur);
                        Ok(Entry::Property(p))
                    }
                    Err(e) => {
                        let span = give_up(inp, &mut cur, start, e, false);
                        sync(inp, &mut cur);
                        Ok(Entry::Error(span))
                    }
                }
            }
        });

        let body = just(TokKind::LBrace)
            .map_with(|_, e| e.span())
            .then_ignore(separators)
            .then(entry.repeated().collect::<Vec<_>>())
            .then(
                just(TokKind::RBrace)
                    .map_with(|_, e| Some(e.span()))
                    .or(end().to(None)),
            )
            .map(|((open, entries), close)| Body {
                open,
                entries,
                close,
            });

        ident
            .then(ident.or_not())
            .then(string.or_not())
            .then(
                just(TokKind::KwLike)
                    .map_with(|_, e| e.span())
                    .then(ident)
                    .map(|(keyword, name)| Like { keyword, name })
                    .or_not(),
            )
            .then(body)
            .map_with(|((((kind, name), label), like), body), e| Block {
                span: e.span(),
                kind,
                name,
                label,
                like,
                body,
            })
    });

    let item = custom(move |inp: &mut Inp<'src, '_>| {
        let start = index(inp);
        let mut cur = Cur::new(src, toks, start, eoi);
        let Some(first) = cur.peek() else {
            return Err(PErr::nothing(eoi));
        };
        let result: Result<Item, PErr> = match first {
            TokKind::KwUse => (|| {
                let keyword = cur.expect(TokKind::KwUse)?;
                let path = cur.string()?;
                cur.expect_item_end()?;
                Ok(Item::Use(Use {
                    span: keyword.cover(path.span),
                    keyword,
                    path,
                }))
            })(),
            TokKind::KwLet => (|| {
                let keyword = cur.expect(TokKind::KwLet)?;
                let name = cur.ident()?;
                cur.expect(TokKind::Eq)?;
                let value = cur.value()?;
                cur.expect_item_end()?;
                Ok(Item::Let(Let {
                    span: keyword.cover(value.span),
                    keyword,
                    name,
                    value,
                }))
            })(),
            TokKind::Ident if cur.line_opens_block() => {
                let before = inp.save();
                match inp.parse(&block) {
                    Ok(b) => {
                        cur.pos = index(inp);
                        finish_block_line(inp, &mut cur, true);
                        sync(inp, &mut cur);
                        return Ok(Item::Block(b));
                    }
                    Err(e) => {
                        inp.rewind(before);
                        Err(e)
                    }
                }
            }
            k if k == TokKind::Ident || k.is_keyword() => match cur.property() {
                // A property at top level is a common slip (a `site` key written
                // outside its block): say exactly that.
                Ok(p) => Err(PErr::custom(p.key.span, Custom::PropertyOutsideBlock)),
                // Already reported by the lexer: say nothing more.
                Err(e) if e.is_lexical() => Err(e),
                Err(_) => Err(PErr::at(
                    cur_span(toks, start, eoi),
                    0,
                    Some(Label::Item),
                    Some(k),
                )),
            },
            k => Err(PErr::at(
                cur_span(toks, start, eoi),
                0,
                Some(Label::Item),
                Some(k),
            )),
        };
        match result {
            Ok(item) => {
                cur.skip_separators();
                sync(inp, &mut cur);
                Ok(item)
            }
            Err(e) => {
                let span = give_up(inp, &mut cur, start, e, true);
                sync(inp, &mut cur);
                Ok(Item::Error(span))
            }
        }
    });

    separators
        .ignore_then(item.repeated().collect::<Vec<_>>())
        .then_ignore(end())
        .map_with(|items, e| SourceFile {
            items,
            span: e.span(),
        })
}

fn cur_span(toks: &[Token], i: usize, eoi: Span) -> Span {
    toks.get(i).map_or(eoi, |t| t.span)
}

pub(crate) fn parse_tokens(src: &str, tokens: &[Token]) -> (SourceFile, Vec<PErr>) {
    let eoi = Span::empty(u32::try_from(src.len()).unwrap_or(u32::MAX));
    let whole = Span::new(0, eoi.end);
    let (out, errs) = file_parser(src, tokens, eoi)
        .parse(input(tokens, eoi))
        .into_output_errors();
    let mut file = out.unwrap_or(SourceFile {
        items: Vec::new(),
        span: whole,
    });
    file.span = whole;
    (file, errs)
}

pub(crate) fn parse_value_tokens(src: &str, tokens: &[Token]) -> (Option<Value>, Vec<PErr>) {
    let eoi = Span::empty(u32::try_from(src.len()).unwrap_or(u32::MAX));
    let mut cur = Cur::new(src, tokens, 0, eoi);
    cur.skip_separators();
    let result = cur.value().and_then(|v| {
        cur.skip_separators();
        match cur.peek() {
            None => Ok(v),
            Some(_) => Err(PErr::at(
                cur_span(tokens, cur.pos, eoi),
                1 << 63,
                None,
                cur.peek(),
            )),
        }
    });
    let mut errs = std::mem::take(&mut cur.soft);
    match result {
        Ok(v) => (Some(v), errs),
        Err(e) => {
            errs.push(e);
            (None, errs)
        }
    }
}
