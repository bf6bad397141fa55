//! Syntax of Plenum design files: lexer, error-recovering parser, syntax tree
//! and line index.
//!
//! [`parse`] never fails and never panics: it returns the tree it could build
//! and every syntax error, each located by a byte [`Span`].
//!
//! ```
//! let text = "zone office {\n  area 1_200 ft²\n  sensible 14 kBtu/h\n}\n";
//! let parsed = plenum_syntax::parse(text);
//! assert!(parsed.errors.is_empty());
//! let plenum_syntax::Item::Block(zone) = &parsed.file.items[0] else { panic!() };
//! assert_eq!(zone.kind.text(text), "zone");
//! assert_eq!(zone.properties().count(), 2);
//! ```

pub mod ast;
mod error;
mod lexer;
mod parser;
mod span;
mod values;

pub use ast::*;
pub use error::{SyntaxError, SyntaxErrorKind};
pub use lexer::{
    Lexed, MAX_NESTING, MAX_UNIT_GROUPS, TokKind, Token, lex, normalize, normalize_in_place,
};
pub use span::{ColumnUnit, LineCol, LineIndex, Span};
pub use values::MAX_OPERATORS;

/// The result of parsing one file.
#[derive(Clone, Debug)]
pub struct Parse {
    pub file: SourceFile,
    /// Every syntax error, in source order.
    pub errors: Vec<SyntaxError>,
    /// The comments of the file, in order (trivia the tree does not hold).
    pub comments: Vec<Span>,
}

impl Parse {
    pub fn has_errors(&self) -> bool {
        !self.errors.is_empty()
    }
}

/// Largest text the parser accepts (spans are 32-bit).
pub const MAX_TEXT_LEN: usize = u32::MAX as usize / 2;

/// Parse a design file.
pub fn parse(text: &str) -> Parse {
    if text.len() > MAX_TEXT_LEN {
        return too_large(text);
    }
    let Lexed {
        mut tokens,
        comments,
    } = lex(text);
    let mut errors = Vec::new();
    normalize_in_place(text, &mut tokens, &mut errors);
    let (file, perrs) = parser::parse_tokens(text, &tokens);
    drop(tokens);
    errors.extend(perrs.into_iter().filter_map(|e| e.into_syntax_error(text)));
    report_unclosed(text, &file, &mut errors);
    finish(&mut errors);
    Parse {
        file,
        errors,
        comments,
    }
}

/// Parse a standalone value, such as the air state `94 °F db, 75 °F wb` given
/// on a command line. Spans refer to `text`.
pub fn parse_value(text: &str) -> (Option<Value>, Vec<SyntaxError>) {
    if text.len() > MAX_TEXT_LEN {
        return (None, too_large(text).errors);
    }
    let lexed = lex(text);
    let mut errors = Vec::new();
    let tokens = normalize(text, &lexed.tokens, &mut errors);
    let (value, perrs) = parser::parse_value_tokens(text, &tokens);
    errors.extend(perrs.into_iter().filter_map(|e| e.into_syntax_error(text)));
    finish(&mut errors);
    (value, errors)
}

fn too_large(text: &str) -> Parse {
    let _ = text;
    Parse {
        file: SourceFile {
            items: Vec::new(),
            span: Span::new(0, 0),
        },
        errors: vec![SyntaxError::new(
            SyntaxErrorKind::Unexpected,
            Span::new(0, 0),
            format!("file is larger than {MAX_TEXT_LEN} bytes"),
        )],
        comments: Vec::new(),
    }
}

/// Sort errors by position and drop duplicates at the same place.
fn finish(errors: &mut Vec<SyntaxError>) {
    errors.sort_by_key(|e| (e.span.start, e.span.end));
    errors.dedup_by(|a, b| a.span == b.span && a.kind == b.kind);
}

/// One error for the blocks left open at the end of the file: it names the
/// innermost one (the likeliest culprit) and points at its opening brace.
fn report_unclosed(text: &str, file: &SourceFile, errors: &mut Vec<SyntaxError>) {
    // A block left open runs to the end of the file, so only the last item
    // and, inside it, the last entries can be open: follow that chain.
    let mut open: Vec<&Block> = Vec::new();
    let mut next = match file.items.last() {
        Some(Item::Block(b)) => Some(b),
        _ => None,
    };
    while let Some(b) = next {
        if b.body.close.is_some() {
            break;
        }
        open.push(b);
        next = match b.body.entries.last() {
            Some(Entry::Block(inner)) => Some(&**inner),
            _ => None,
        };
    }
    let Some(inner) = open.last() else {
        return;
    };
    let end = u32::try_from(text.len()).unwrap_or(u32::MAX);
    let what = match &inner.name {
        Some(n) => format!("`{} {}`", inner.kind.text(text), n.text(text)),
        None => format!("`{}`", inner.kind.text(text)),
    };
    let mut err = SyntaxError::new(
        SyntaxErrorKind::UnclosedBlock,
        Span::empty(end),
        format!("expected `}}` to close {what} before the end of the file"),
    )
    .with_label("the file ends here")
    .with_related(inner.body.open, format!("{what} opens here"));
    err.help = Some(if open.len() > 1 {
        format!(
            "{} blocks are still open at the end of the file; add a `}}` for each",
            open.len()
        )
    } else {
        "add the missing `}`".to_string()
    });
    errors.push(err);
}
