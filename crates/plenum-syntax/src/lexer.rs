//! The logos lexer and the token-stream normalisation the parser relies on.
//!
//! Lexing happens in two steps:
//! 1. [`lex`]: logos turns text into raw tokens. Whitespace is skipped, comments
//!    are kept aside as trivia, anything unrecognised becomes an `Error` token.
//! 2. [`normalize`]: a single linear pass that (a) merges the contiguous tokens of
//!    a unit expression after a number (`kBtu/h`, `W/ft²`, `ft^2`) into one
//!    [`TokKind::Unit`] token, (b) drops newlines that cannot end an item (inside
//!    parentheses, after an operator or a comma, repeated blank lines), and
//!    (c) enforces the nesting-depth limit so the recursive parser can never
//!    overflow the stack.

use logos::Logos;

use crate::error::{SyntaxError, SyntaxErrorKind};
use crate::span::Span;

/// Deepest nesting of `{ }` and `( )` the parser accepts.
pub const MAX_NESTING: usize = 64;

/// Deepest nesting of parenthesised groups inside one unit (`Btu/(h·ft²)` is one).
pub const MAX_UNIT_GROUPS: usize = 4;

/// The kinds of token. `Unit` never comes out of logos: [`normalize`] makes it.
#[derive(Logos, Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
#[logos(skip r"[ \t\f\r\u{FEFF}]+")]
pub enum TokKind {
    #[regex(r"#[^\n]*", allow_greedy = true)]
    Comment,
    #[token("\n")]
    Newline,
    #[token(";")]
    Semi,
    #[token(",")]
    Comma,
    #[token("{")]
    LBrace,
    #[token("}")]
    RBrace,
    #[token("(")]
    LParen,
    #[token(")")]
    RParen,
    #[token("+")]
    Plus,
    #[token("-")]
    Minus,
    #[token("*")]
    Star,
    #[token("/")]
    Slash,
    #[token("·")]
    MidDot,
    #[token("^")]
    Caret,
    #[token("=")]
    Eq,
    #[regex(r"[0-9][0-9_]*(\.[0-9][0-9_]*)?([eE][+-]?[0-9][0-9_]*)?")]
    #[regex(r"\.[0-9][0-9_]*([eE][+-]?[0-9][0-9_]*)?")]
    Number,
    #[regex(r#""([^"\\\n]|\\[^\n])*""#)]
    Str,
    #[regex(r#""([^"\\\n]|\\[^\n])*\\?"#)]
    UnterminatedStr,
    #[regex(r"[A-Za-z_][A-Za-z0-9_\-]*")]
    Ident,
    #[token("use")]
    KwUse,
    #[token("let")]
    KwLet,
    #[token("like")]
    KwLike,
    #[token("to")]
    KwTo,
    #[token("with")]
    KwWith,
    #[token("none")]
    KwNone,
    /// `°F`, `°C`, `°R`, a lone `°`.
    #[regex(r"°[A-Za-z]*")]
    Degree,
    /// `%` or `%rh`.
    #[regex(r"%[A-Za-z]*")]
    Percent,
    /// A dotted unit word such as `in.wg`.
    #[regex(r"[A-Za-z]+(\.[A-Za-z]+)+")]
    DottedWord,
    /// A unit word ending in a superscript power: `ft²`, `m³`.
    #[regex(r"[A-Za-z_][A-Za-z0-9_]*[²³]")]
    SuperWord,
    /// A unit expression after a number (made by [`normalize`], never by logos).
    Unit,
    /// Input the lexer does not recognise.
    Error,
}

impl TokKind {
    pub const COUNT: usize = TokKind::Error as usize + 1;

    /// True for the keyword tokens, which are also valid as keys.
    pub fn is_keyword(self) -> bool {
        matches!(
            self,
            TokKind::KwUse
                | TokKind::KwLet
                | TokKind::KwLike
                | TokKind::KwTo
                | TokKind::KwWith
                | TokKind::KwNone
        )
    }

    /// How the token is named in an error message.
    pub fn describe(self) -> &'static str {
        match self {
            TokKind::Comment => "a comment",
            TokKind::Newline => "end of line",
            TokKind::Semi => "`;`",
            TokKind::Comma => "`,`",
            TokKind::LBrace => "`{`",
            TokKind::RBrace => "`}`",
            TokKind::LParen => "`(`",
            TokKind::RParen => "`)`",
            TokKind::Plus => "`+`",
            TokKind::Minus => "`-`",
            TokKind::Star => "`*`",
            TokKind::Slash => "`/`",
            TokKind::MidDot => "`·`",
            TokKind::Caret => "`^`",
            TokKind::Eq => "`=`",
            TokKind::Number => "a number",
            TokKind::Str => "a string",
            TokKind::UnterminatedStr => "an unterminated string",
            TokKind::Ident => "a name",
            TokKind::KwUse => "`use`",
            TokKind::KwLet => "`let`",
            TokKind::KwLike => "`like`",
            TokKind::KwTo => "`to`",
            TokKind::KwWith => "`with`",
            TokKind::KwNone => "`none`",
            TokKind::Degree | TokKind::Percent | TokKind::DottedWord | TokKind::SuperWord => {
                "a unit"
            }
            TokKind::Unit => "a unit",
            TokKind::Error => "an invalid character",
        }
    }

    /// Tokens that may begin a unit expression after a number.
    fn starts_unit(self) -> bool {
        matches!(
            self,
            TokKind::Ident
                | TokKind::Degree
                | TokKind::Percent
                | TokKind::DottedWord
                | TokKind::SuperWord
        )
    }
}

/// One token: its kind and where it is.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Token {
    pub kind: TokKind,
    pub span: Span,
}

/// The raw output of [`lex`].
#[derive(Clone, Debug, Default)]
pub struct Lexed {
    /// Every token except comments, in order (including newlines and errors).
    pub tokens: Vec<Token>,
    /// Comments, in order (`#` to end of line, without the line break).
    pub comments: Vec<Span>,
}

/// Lex `text` into tokens and comments. Never fails: unrecognised input becomes
/// `Error` tokens (consecutive ones merged).
pub fn lex(text: &str) -> Lexed {
    // Generated and hand-written designs run at about one token per 3.5 bytes.
    let mut tokens = Vec::with_capacity(text.len() / 3 + 16);
    let mut comments = Vec::new();
    let mut lexer = TokKind::lexer(text);
    while let Some(result) = lexer.next() {
        let span = Span::from_range(lexer.span());
        match result {
            Ok(TokKind::Comment) => comments.push(span),
            Ok(kind) => tokens.push(Token { kind, span }),
            Err(()) => {
                if let Some(last) = tokens.last_mut()
                    && last.kind == TokKind::Error
                    && last.span.end == span.start
                {
                    last.span.end = span.end;
                    continue;
                }
                tokens.push(Token {
                    kind: TokKind::Error,
                    span,
                });
            }
        }
    }
    Lexed { tokens, comments }
}

/// Words that follow a number as an air-state qualifier, never as its unit.
fn is_qualifier(word: &str) -> bool {
    matches!(word, "db" | "wb" | "dp")
}

/// Normalise raw tokens for the parser (see the module docs). Errors found here
/// (invalid characters, unterminated strings, nesting too deep) are pushed onto `errors`.
pub fn normalize(text: &str, raw: &[Token], errors: &mut Vec<SyntaxError>) -> Vec<Token> {
    let mut tokens = raw.to_vec();
    normalize_in_place(text, &mut tokens, errors);
    tokens
}

/// [`normalize`] without a second buffer: the output is written over the input
/// (it is never longer, and every write lands before the next read).
pub fn normalize_in_place(text: &str, tokens: &mut Vec<Token>, errors: &mut Vec<SyntaxError>) {
    let mut out = Output {
        buf: tokens,
        len: 0,
    };
    normalize_into(text, &mut out, errors);
    let len = out.len;
    tokens.truncate(len);
}

/// A write cursor over the token buffer that the normaliser reads from.
struct Output<'a> {
    buf: &'a mut Vec<Token>,
    len: usize,
}

impl Output<'_> {
    fn push(&mut self, t: Token) {
        self.buf[self.len] = t;
        self.len += 1;
    }

    fn last(&self) -> Option<&Token> {
        self.len.checked_sub(1).map(|i| &self.buf[i])
    }
}

fn normalize_into(text: &str, out: &mut Output<'_>, errors: &mut Vec<SyntaxError>) {
    let mut depth: usize = 0;
    let mut paren_depth: usize = 0;
    // Kinds of the open delimiters, to know whether a newline is inside parentheses.
    let mut stack: Vec<TokKind> = Vec::new();
    let mut i = 0;
    // Reads are at `i`, writes at `out.len <= i`: the output never overtakes the input.
    while i < out.buf.len() {
        let raw: &[Token] = out.buf;
        let tok = raw[i];
        match tok.kind {
            TokKind::Error => errors.push(SyntaxError::new(
                SyntaxErrorKind::InvalidCharacter,
                tok.span,
                describe_invalid(tok.span.text(text)),
            )),
            TokKind::UnterminatedStr => errors.push(
                SyntaxError::new(
                    SyntaxErrorKind::UnterminatedString,
                    tok.span,
                    "unterminated string".to_string(),
                )
                .with_help("close the string with `\"` before the end of the line"),
            ),
            _ => {}
        }
        match tok.kind {
            TokKind::LBrace | TokKind::LParen => {
                if depth >= MAX_NESTING {
                    // Replace the whole over-deep group, closers included, by one
                    // error token: the parser skips its item without further noise.
                    let end = skip_group(raw, i);
                    let last = raw[end.saturating_sub(1).max(i)].span;
                    out.push(Token {
                        kind: TokKind::Error,
                        span: tok.span.cover(last),
                    });
                    errors.push(
                        SyntaxError::new(
                            SyntaxErrorKind::NestingTooDeep,
                            tok.span.cover(Span::empty(tok.span.end)),
                            format!("nesting is deeper than {MAX_NESTING} levels"),
                        )
                        .with_help("a design file needs only a few levels of `{ }` and `( )`"),
                    );
                    i = end;
                    continue;
                }
                depth += 1;
                if tok.kind == TokKind::LParen {
                    paren_depth += 1;
                }
                stack.push(tok.kind);
                out.push(tok);
            }
            TokKind::RBrace | TokKind::RParen => {
                if let Some(open) = stack.pop() {
                    depth -= 1;
                    if open == TokKind::LParen {
                        paren_depth -= 1;
                    }
                }
                out.push(tok);
            }
            TokKind::Newline => {
                let drop = paren_depth > 0
                    || match out.last() {
                        None => true,
                        Some(prev) => matches!(
                            prev.kind,
                            TokKind::Newline
                                | TokKind::Semi
                                | TokKind::Comma
                                | TokKind::LBrace
                                | TokKind::LParen
                                | TokKind::Plus
                                | TokKind::Minus
                                | TokKind::Star
                                | TokKind::Slash
                                | TokKind::MidDot
                                | TokKind::Eq
                                | TokKind::KwTo
                                | TokKind::KwWith
                                | TokKind::KwLike
                        ),
                    };
                if !drop {
                    out.push(tok);
                }
            }
            TokKind::Number => {
                out.push(tok);
                if let Some(&next) = out.buf.get(i + 1)
                    && next.kind.starts_unit()
                    && !(next.kind == TokKind::Ident && is_qualifier(next.span.text(text)))
                {
                    let end = scan_unit(out.buf, i + 1, 0);
                    let last = out.buf[end - 1].span;
                    out.push(Token {
                        kind: TokKind::Unit,
                        span: next.span.cover(last),
                    });
                    i = end;
                    continue;
                }
            }
            _ => out.push(tok),
        }
        i += 1;
    }
}

/// Index just past the delimited group that starts at `start` (an opener),
/// or the end of input when it is never closed.
fn skip_group(raw: &[Token], start: usize) -> usize {
    let mut depth = 0usize;
    for (j, t) in raw.iter().enumerate().skip(start) {
        match t.kind {
            TokKind::LBrace | TokKind::LParen => depth += 1,
            TokKind::RBrace | TokKind::RParen => {
                depth -= 1;
                if depth == 0 {
                    return j + 1;
                }
            }
            _ => {}
        }
    }
    raw.len()
}

fn adjacent(a: Token, b: Token) -> bool {
    a.span.end == b.span.start
}

/// The end (exclusive) of the unit expression whose first atom is `raw[start]`.
///
/// A unit goes on while an operator (`/`, `*`, `·`) is written without spaces
/// between two unit atoms (or before a parenthesised group of them), or `^` is
/// written without spaces before a number (optionally negative). Spaces end
/// the unit, so `20 ft * 120 ft` is a product of two lengths while `Btu/h` is
/// one unit. Groups nest at most [`MAX_UNIT_GROUPS`] deep (`depth` counts them):
/// deeper parentheses are left as ordinary tokens, which the nesting limit
/// then governs, so no input can deepen this recursion without bound.
fn scan_unit(raw: &[Token], start: usize, depth: usize) -> usize {
    let mut end = start + 1;
    loop {
        let prev = raw[end - 1];
        let (Some(&op), Some(&next)) = (raw.get(end), raw.get(end + 1)) else {
            return end;
        };
        if !adjacent(prev, op) || !adjacent(op, next) {
            return end;
        }
        match op.kind {
            TokKind::Slash | TokKind::Star | TokKind::MidDot => {
                if next.kind.starts_unit() {
                    end += 2;
                } else if next.kind == TokKind::LParen {
                    match scan_unit_group(raw, end + 1, depth) {
                        Some(after) => end = after,
                        None => return end,
                    }
                } else {
                    return end;
                }
            }
            TokKind::Caret => {
                if next.kind == TokKind::Number {
                    end += 2;
                } else if next.kind == TokKind::Minus {
                    match raw.get(end + 2) {
                        Some(&n) if n.kind == TokKind::Number && adjacent(next, n) => end += 3,
                        _ => return end,
                    }
                } else {
                    return end;
                }
            }
            _ => return end,
        }
    }
}

/// A parenthesised unit group `(h·ft²)` starting at the `(` at `open`, written
/// without spaces. Returns the index after its `)`.
fn scan_unit_group(raw: &[Token], open: usize, depth: usize) -> Option<usize> {
    if depth >= MAX_UNIT_GROUPS {
        return None;
    }
    let first = *raw.get(open + 1)?;
    if !first.kind.starts_unit() || !adjacent(raw[open], first) {
        return None;
    }
    let end = scan_unit(raw, open + 1, depth + 1);
    let close = *raw.get(end)?;
    (close.kind == TokKind::RParen && adjacent(raw[end - 1], close)).then_some(end + 1)
}

fn describe_invalid(text: &str) -> String {
    let mut chars = text.chars();
    match (chars.next(), chars.next()) {
        (Some(c), None) if c.is_control() => {
            format!("invalid character U+{:04X}", c as u32)
        }
        (Some(c), None) => format!("invalid character `{c}`"),
        (Some(_), Some(_)) => {
            let shown: String = text
                .chars()
                .take(12)
                .map(|c| if c.is_control() { '\u{FFFD}' } else { c })
                .collect();
            format!("invalid characters `{shown}`")
        }
        _ => "invalid input".to_string(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn kinds(text: &str) -> Vec<(TokKind, &str)> {
        let lexed = lex(text);
        let mut errors = Vec::new();
        normalize(text, &lexed.tokens, &mut errors)
            .into_iter()
            .map(|t| (t.kind, t.span.text(text)))
            .collect()
    }

    #[test]
    fn numbers() {
        for n in ["1250", "1_250", "38.5", "1.2e3", "0.0098", "1e-3", ".5"] {
            assert_eq!(kinds(n), vec![(TokKind::Number, n)], "{n}");
        }
        // A trailing `e` without digits is not part of the number.
        assert_eq!(
            kinds("2e"),
            vec![(TokKind::Number, "2"), (TokKind::Unit, "e")]
        );
    }

    #[test]
    fn units_merge_when_written_without_spaces() {
        use TokKind::*;
        assert_eq!(
            kinds("38.5 kBtu/h"),
            vec![(Number, "38.5"), (Unit, "kBtu/h")]
        );
        assert_eq!(kinds("2_400 ft²"), vec![(Number, "2_400"), (Unit, "ft²")]);
        assert_eq!(kinds("3 ft^2"), vec![(Number, "3"), (Unit, "ft^2")]);
        assert_eq!(kinds("2.5 in.wg"), vec![(Number, "2.5"), (Unit, "in.wg")]);
        assert_eq!(kinds("57 °F"), vec![(Number, "57"), (Unit, "°F")]);
        assert_eq!(kinds("50 %rh"), vec![(Number, "50"), (Unit, "%rh")]);
        assert_eq!(
            kinds("1 Btu/(h·ft²)"),
            vec![(Number, "1"), (Unit, "Btu/(h·ft²)")]
        );
        assert_eq!(
            kinds("2 L/s/person"),
            vec![(Number, "2"), (Unit, "L/s/person")]
        );
        assert_eq!(kinds("1250ft"), vec![(Number, "1250"), (Unit, "ft")]);
        assert_eq!(
            kinds("20 ft * 120 ft"),
            vec![
                (Number, "20"),
                (Unit, "ft"),
                (Star, "*"),
                (Number, "120"),
                (Unit, "ft")
            ]
        );
        assert_eq!(
            kinds("10 ft/2"),
            vec![(Number, "10"), (Unit, "ft"), (Slash, "/"), (Number, "2")]
        );
        assert_eq!(
            kinds("94 °F db"),
            vec![(Number, "94"), (Unit, "°F"), (Ident, "db")]
        );
        assert_eq!(kinds("75 db"), vec![(Number, "75"), (Ident, "db")]);
    }

    #[test]
    fn newlines_that_cannot_end_an_item_are_dropped() {
        use TokKind::*;
        assert_eq!(
            kinds("\n\na 1,\n b\n\n\nc (1 +\n 2)\n"),
            vec![
                (Ident, "a"),
                (Number, "1"),
                (Comma, ","),
                (Ident, "b"),
                (Newline, "\n"),
                (Ident, "c"),
                (LParen, "("),
                (Number, "1"),
                (Plus, "+"),
                (Number, "2"),
                (RParen, ")"),
                (Newline, "\n"),
            ]
        );
    }

    #[test]
    fn comments_are_trivia() {
        let text = "a 1 # note °\nb";
        let lexed = lex(text);
        assert_eq!(lexed.comments.len(), 1);
        assert_eq!(lexed.comments[0].text(text), "# note °");
    }

    #[test]
    fn keywords_and_identifiers() {
        use TokKind::*;
        assert_eq!(
            kinds("use let like to with none user ahu_2 in_airstream draw-through"),
            vec![
                (KwUse, "use"),
                (KwLet, "let"),
                (KwLike, "like"),
                (KwTo, "to"),
                (KwWith, "with"),
                (KwNone, "none"),
                (Ident, "user"),
                (Ident, "ahu_2"),
                (Ident, "in_airstream"),
                (Ident, "draw-through"),
            ]
        );
    }

    #[test]
    fn deeply_nested_unit_groups_stop_merging_instead_of_recursing() {
        // Found by a differential test against the tree-sitter grammar: 300,000
        // nested groups overflowed the stack of a release build.
        let mut text = String::from("let a = 1 a");
        text.push_str(&"/(a".repeat(300_000));
        text.push_str(&")".repeat(300_000));
        let lexed = lex(&text);
        let mut errors = Vec::new();
        let toks = normalize(&text, &lexed.tokens, &mut errors);
        assert!(
            errors
                .iter()
                .any(|e| e.kind == SyntaxErrorKind::NestingTooDeep)
        );
        assert!(toks.len() < 1_000);
        // Groups up to the limit still make one unit.
        let ok = "1 a/(b/(c/(d/(e))))";
        assert_eq!(kinds(ok).last().map(|t| t.1), Some("a/(b/(c/(d/(e))))"));
    }

    #[test]
    fn deep_nesting_is_cut_with_one_error() {
        let text = "{".repeat(20_000);
        let lexed = lex(&text);
        let mut errors = Vec::new();
        let toks = normalize(&text, &lexed.tokens, &mut errors);
        assert_eq!(toks.len(), MAX_NESTING + 1);
        assert_eq!(toks[MAX_NESTING].kind, TokKind::Error);
        assert_eq!(errors.len(), 1);
        assert_eq!(errors[0].kind, SyntaxErrorKind::NestingTooDeep);
    }

    #[test]
    fn invalid_characters_merge() {
        let text = "a \u{0}\u{1}\u{2} b";
        let lexed = lex(text);
        let mut errors = Vec::new();
        let toks = normalize(text, &lexed.tokens, &mut errors);
        assert_eq!(toks.len(), 3);
        assert_eq!(errors.len(), 1);
    }
}
