//! Where each comment belongs.
//!
//! The tree holds no comments, so each one is tied to the token written just
//! before it (its *anchor*): the printer, after printing a token, asks for the
//! comments anchored there. A comment on the same source line as its anchor is
//! *trailing*; any other is *own-line*. Comments before the first token of the
//! file are anchored to nothing and lead the file.

use std::collections::BTreeMap;

use plenum_syntax::{Span, TokKind, Token};

/// One comment, ready to print.
#[derive(Clone, Copy, Debug)]
pub(crate) struct Comment<'a> {
    /// From `#` to the end of the line, trailing whitespace (and a CR) removed.
    pub text: &'a str,
    /// True when a blank line precedes the comment in the source.
    pub blank_before: bool,
}

/// The comments anchored after one token.
#[derive(Clone, Debug, Default)]
pub(crate) struct After<'a> {
    /// The comment on the anchor's own line, if any (at most one: a comment
    /// runs to the end of its line).
    pub trailing: Option<Comment<'a>>,
    /// Comments on lines of their own before the next token, in order.
    pub own_line: Vec<Comment<'a>>,
}

impl After<'_> {
    pub fn is_empty(&self) -> bool {
        self.trailing.is_none() && self.own_line.is_empty()
    }
}

/// Every comment of a file, by anchor.
#[derive(Debug, Default)]
pub(crate) struct Comments<'a> {
    /// Comments before the first token.
    pub leading: Vec<Comment<'a>>,
    /// Keyed by the end offset of the anchor token.
    after: BTreeMap<u32, After<'a>>,
    /// Comments handed out so far (to prove that none was dropped).
    pub taken: usize,
    pub total: usize,
}

impl<'a> Comments<'a> {
    /// Sort the comments of `src` to their anchors. `tokens` are the raw
    /// tokens of the lexer (line breaks and `;` are skipped here).
    pub fn new(src: &'a str, tokens: &[Token], comments: &[Span]) -> Comments<'a> {
        let anchors: Vec<Span> = tokens
            .iter()
            .filter(|t| !matches!(t.kind, TokKind::Newline | TokKind::Semi))
            .map(|t| t.span)
            .collect();
        let mut out = Comments {
            total: comments.len(),
            ..Comments::default()
        };
        let mut j = 0;
        for &c in comments {
            while j < anchors.len() && anchors[j].end <= c.start {
                j += 1;
            }
            let comment = Comment {
                text: c.text(src).trim_end(),
                blank_before: blank_before(src, c.start),
            };
            match j.checked_sub(1).map(|i| anchors[i]) {
                None => out.leading.push(comment),
                Some(anchor) => {
                    let between = Span::new(anchor.end, c.start).text(src);
                    let slot = out.after.entry(anchor.end).or_default();
                    if between.contains('\n') || slot.trailing.is_some() {
                        slot.own_line.push(comment);
                    } else {
                        slot.trailing = Some(comment);
                    }
                }
            }
        }
        out
    }

    /// The comments that lead the file.
    pub fn take_leading(&mut self) -> Vec<Comment<'a>> {
        let v = std::mem::take(&mut self.leading);
        self.taken += v.len();
        v
    }

    /// The comments anchored after the token that ends at `end`.
    pub fn take_after(&mut self, end: u32) -> After<'a> {
        let a = self.after.remove(&end).unwrap_or_default();
        self.taken += a.own_line.len() + usize::from(a.trailing.is_some());
        a
    }

    /// True when comments are anchored after the token that ends at `end`.
    pub fn has_after(&self, end: u32) -> bool {
        self.after.get(&end).is_some_and(|a| !a.is_empty())
    }
}

/// True when a blank line separates `offset` from the text before it
/// (whitespace and `;` do not count as text).
pub(crate) fn blank_before(src: &str, offset: u32) -> bool {
    let bytes = src.as_bytes();
    let mut i = (offset as usize).min(bytes.len());
    let mut breaks = 0;
    while i > 0 {
        match bytes[i - 1] {
            b'\n' => breaks += 1,
            b' ' | b'\t' | b'\r' | 0x0c | b';' => {}
            // U+FEFF, which the lexer skips like a space.
            0xBF if i >= 3 && bytes[i - 3..i] == [0xEF, 0xBB, 0xBF] => i -= 2,
            _ => break,
        }
        i -= 1;
    }
    breaks >= 2
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn blank_lines_are_seen_through_spaces_and_semicolons() {
        let src = "a 1\n  \t\n  b 2; \n\nc 3\nd 4";
        let at = |s: &str| src.find(s).unwrap() as u32;
        assert!(blank_before(src, at("b")));
        assert!(blank_before(src, at("c")));
        assert!(!blank_before(src, at("d")));
        assert!(!blank_before(src, 0));
    }

    #[test]
    fn comments_are_anchored_to_the_token_before_them() {
        let src = "# lead\nzone a {  # t\n  # own\n  area 5 ft\n}\n";
        let lexed = plenum_syntax::lex(src);
        let mut c = Comments::new(src, &lexed.tokens, &lexed.comments);
        assert_eq!(c.total, 3);
        assert_eq!(c.take_leading().len(), 1);
        let brace = src.find('{').unwrap() as u32 + 1;
        let after = c.take_after(brace);
        assert_eq!(after.trailing.map(|t| t.text), Some("# t"));
        assert_eq!(after.own_line.len(), 1);
        assert_eq!(c.taken, 3);
    }
}
