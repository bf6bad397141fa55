//! The layout: the tree and the comments in, the lines of the formatted file out.
//!
//! Every item is first turned into the list of its tokens (their source text
//! and where each ends in the source, so that comments can find their anchor),
//! then laid out on lines. A block's entries are collected with the comments
//! between them before anything is printed, because the alignment of keys and
//! trailing comments needs the whole block.

use plenum_syntax::{
    Block, Element, Elements, Entry, Expr, Item, Let, Property, SourceFile, Span, TokKind, Token,
    Use, Value,
};

use crate::comments::{Comment, Comments, blank_before};

/// An inconsistency between the tree and the tokens: a bug, never the user's.
#[derive(Debug)]
pub(crate) struct Internal(pub String);

type R<T> = Result<T, Internal>;

/// Spaces per block level.
pub(crate) const INDENT: usize = 2;
/// Extra indent of the continuation lines of a header or a `use`/`let` that
/// a comment inside it broke.
const CONTINUATION: usize = 4;

/// One token as printed: its text and the end of its source span.
#[derive(Clone, Copy, Debug)]
struct Tok<'a> {
    text: &'a str,
    end: u32,
    /// Printed without a space before it.
    glue: bool,
}

#[derive(Default)]
struct Toks<'a> {
    v: Vec<Tok<'a>>,
    glue_next: bool,
}

impl<'a> Toks<'a> {
    fn push(&mut self, text: &'a str, end: u32) {
        self.v.push(Tok {
            text,
            end,
            glue: self.glue_next,
        });
        self.glue_next = false;
    }

    fn span(&mut self, src: &'a str, span: Span) {
        self.push(span.text(src), span.end);
    }

    fn glued(&mut self, src: &'a str, span: Span) {
        self.glue_next = true;
        self.span(src, span);
    }
}

/// What a container (the file or a block body) holds, in order.
#[derive(Clone, Copy)]
enum Kind<'a> {
    Comment(&'a str),
    Use(&'a Use),
    Let(&'a Let),
    Prop(&'a Property),
    Block(&'a Block),
}

#[derive(Clone, Copy)]
struct El<'a> {
    kind: Kind<'a>,
    /// A blank line precedes it in the source.
    blank: bool,
    /// The comment after it on its last line.
    trailing: Option<&'a str>,
}

/// An element laid out, before its trailing comment is placed.
struct Rendered<'a> {
    lines: Vec<String>,
    trailing: Option<&'a str>,
    /// The alignment group whose trailing comments share a column (a
    /// property printed on one line).
    align: Option<usize>,
}

pub(crate) struct Printer<'a> {
    src: &'a str,
    /// Raw tokens without line breaks and `;`, to find the `,` and `=` that
    /// the tree does not record.
    raw: Vec<Token>,
    comments: Comments<'a>,
}

/// Lay out a parsed file without syntax errors: the lines of the result,
/// without line breaks.
pub(crate) fn print(
    src: &str,
    file: &SourceFile,
    tokens: &[Token],
    comments: &[Span],
) -> R<Vec<String>> {
    let mut p = Printer {
        src,
        raw: tokens
            .iter()
            .copied()
            .filter(|t| !matches!(t.kind, TokKind::Newline | TokKind::Semi))
            .collect(),
        comments: Comments::new(src, tokens, comments),
    };
    let lines = p.file(file)?;
    if p.comments.taken != p.comments.total {
        return Err(Internal(format!(
            "{} of {} comments found no place",
            p.comments.total - p.comments.taken,
            p.comments.total
        )));
    }
    Ok(lines)
}

fn width(s: &str) -> usize {
    s.chars().count()
}

fn spaces(n: usize) -> String {
    " ".repeat(n)
}

fn comment_els<'a>(comments: Vec<Comment<'a>>) -> impl Iterator<Item = El<'a>> {
    comments.into_iter().map(|c| El {
        kind: Kind::Comment(c.text),
        blank: c.blank_before,
        trailing: None,
    })
}

impl<'a> Printer<'a> {
    fn file(&mut self, file: &'a SourceFile) -> R<Vec<String>> {
        let mut els: Vec<El<'a>> = comment_els(self.comments.take_leading()).collect();
        for item in &file.items {
            let (kind, start, end) = match item {
                Item::Use(u) => (Kind::Use(u), u.span.start, u.path.span.end),
                Item::Let(l) => (Kind::Let(l), l.span.start, l.value.span.end),
                Item::Block(b) => (Kind::Block(b), b.span.start, close(b)?.end),
                Item::Error(s) => return Err(Internal(format!("an error node at {s:?}"))),
            };
            self.push_el(&mut els, kind, start, end);
        }
        let mut out = Vec::new();
        self.emit(els, 0, true, &mut out)?;
        Ok(out)
    }

    /// Add an item and the comments after it.
    fn push_el(&mut self, els: &mut Vec<El<'a>>, kind: Kind<'a>, start: u32, end: u32) {
        let after = self.comments.take_after(end);
        els.push(El {
            kind,
            blank: blank_before(self.src, start),
            trailing: after.trailing.map(|c| c.text),
        });
        els.extend(comment_els(after.own_line));
    }

    /// The body of `b`: the comment on the line of its `{`, and its elements.
    fn body(&mut self, b: &'a Block) -> R<(Option<&'a str>, Vec<El<'a>>)> {
        let after_open = self.comments.take_after(b.body.open.end);
        let mut els: Vec<El<'a>> = comment_els(after_open.own_line).collect();
        for e in &b.body.entries {
            let (kind, start, end) = match e {
                Entry::Property(p) => (Kind::Prop(p), p.span.start, p.value.span.end),
                Entry::Block(inner) => (Kind::Block(inner), inner.span.start, close(inner)?.end),
                Entry::Error(s) => return Err(Internal(format!("an error node at {s:?}"))),
            };
            self.push_el(&mut els, kind, start, end);
        }
        Ok((after_open.trailing.map(|c| c.text), els))
    }

    /// Print the elements of one container at `level`.
    fn emit(&mut self, els: Vec<El<'a>>, level: usize, top: bool, out: &mut Vec<String>) -> R<()> {
        let n = els.len();
        // Blank lines: the author's, at most one; at the top level, one around
        // every block (before the comments directly above it).
        let mut blank: Vec<bool> = els.iter().map(|e| e.blank).collect();
        if top {
            for i in 0..n {
                if matches!(els[i].kind, Kind::Block(_)) {
                    if i + 1 < n {
                        blank[i + 1] = true;
                    }
                    let mut j = i;
                    while j > 0 && matches!(els[j - 1].kind, Kind::Comment(_)) && !els[j].blank {
                        j -= 1;
                    }
                    blank[j] = true;
                }
            }
        }
        if let Some(first) = blank.first_mut() {
            *first = false;
        }
        // Alignment groups: runs of elements without a blank line between.
        let mut group = Vec::with_capacity(n);
        let mut g = 0;
        for (i, e) in els.iter().enumerate() {
            if i > 0 && e.blank {
                g += 1;
            }
            group.push(g);
        }
        let mut key_width = vec![0usize; g + 1];
        for (e, &g) in els.iter().zip(&group) {
            if let Kind::Prop(p) = e.kind {
                key_width[g] = key_width[g].max(width(p.key.text(self.src)));
            }
        }
        let indent = spaces(level * INDENT);
        let mut rendered = Vec::with_capacity(n);
        for (e, &g) in els.iter().zip(&group) {
            rendered.push(self.render(e, level, &indent, g, key_width[g])?);
        }
        // Trailing comments of the one-line properties of a group share a column.
        let mut comment_col = vec![0usize; g + 1];
        for r in &rendered {
            if let (Some(g), Some(_), Some(line)) = (r.align, r.trailing, r.lines.last()) {
                comment_col[g] = comment_col[g].max(width(line) + 2);
            }
        }
        for (i, r) in rendered.into_iter().enumerate() {
            if blank[i] {
                out.push(String::new());
            }
            let mut lines = r.lines;
            if let (Some(c), Some(last)) = (r.trailing, lines.last_mut()) {
                let col = r.align.map_or(0, |g| comment_col[g]);
                let pad = col.saturating_sub(width(last)).max(2);
                last.push_str(&spaces(pad));
                last.push_str(c);
            }
            out.extend(lines);
        }
        Ok(())
    }

    fn render(
        &mut self,
        e: &El<'a>,
        level: usize,
        indent: &str,
        group: usize,
        key_width: usize,
    ) -> R<Rendered<'a>> {
        let src = self.src;
        let plain = |lines| Rendered {
            lines,
            trailing: e.trailing,
            align: None,
        };
        Ok(match e.kind {
            Kind::Comment(text) => plain(vec![format!("{indent}{text}")]),
            Kind::Use(u) => {
                let mut t = Toks::default();
                t.span(src, u.keyword);
                t.span(src, u.path.span);
                plain(self.lay_out(indent.to_string(), indent.len() + CONTINUATION, &t.v))
            }
            Kind::Let(l) => {
                let mut t = Toks::default();
                t.span(src, l.keyword);
                t.span(src, l.name.span);
                t.span(src, self.find(l.name.span.end, TokKind::Eq)?);
                self.value(&l.value, &mut t)?;
                plain(self.lay_out(indent.to_string(), indent.len() + CONTINUATION, &t.v))
            }
            Kind::Prop(p) => {
                let key = p.key.text(src);
                let prefix = format!(
                    "{indent}{key}{} ",
                    spaces(key_width.saturating_sub(width(key)))
                );
                let cont = width(&prefix);
                let mut t = Toks::default();
                self.value(&p.value, &mut t)?;
                let lines = self.lay_out(prefix, cont, &t.v);
                let align = (lines.len() == 1).then_some(group);
                Rendered {
                    lines,
                    trailing: e.trailing,
                    align,
                }
            }
            Kind::Block(b) => {
                let mut lines = Vec::new();
                self.block(b, level, indent, e.trailing, &mut lines)?;
                Rendered {
                    lines,
                    trailing: None,
                    align: None,
                }
            }
        })
    }

    fn block(
        &mut self,
        b: &'a Block,
        level: usize,
        indent: &str,
        mut close_trailing: Option<&'a str>,
        out: &mut Vec<String>,
    ) -> R<()> {
        let src = self.src;
        let mut t = Toks::default();
        t.span(src, b.kind.span);
        if let Some(name) = b.name {
            t.span(src, name.span);
        }
        if let Some(label) = &b.label {
            t.span(src, label.span);
        }
        if let Some(like) = &b.like {
            t.span(src, like.keyword);
            t.span(src, like.name.span);
        }
        t.span(src, b.body.open);
        let mut lines = self.lay_out(indent.to_string(), indent.len() + CONTINUATION, &t.v);
        let (open_trailing, els) = self.body(b)?;
        let Some(last) = lines.last_mut() else {
            return Err(Internal("a block header printed no line".to_string()));
        };
        if els.is_empty() && open_trailing.is_none() {
            last.push('}');
            if let Some(c) = close_trailing {
                last.push_str("  ");
                last.push_str(c);
            }
            out.extend(lines);
            return Ok(());
        }
        // A block written on one line and split here takes the comment after
        // its `}` onto its header line, where it was read.
        let mut head = open_trailing;
        if head.is_none()
            && close_trailing.is_some()
            && !close(b)?.cover(b.span).text(src).contains('\n')
        {
            head = close_trailing.take();
        }
        if let Some(c) = head {
            last.push_str("  ");
            last.push_str(c);
        }
        out.extend(lines);
        self.emit(els, level + 1, false, out)?;
        let mut end = format!("{indent}}}");
        if let Some(c) = close_trailing {
            end.push_str("  ");
            end.push_str(c);
        }
        out.push(end);
        Ok(())
    }

    /// Lay tokens out after `prefix`, breaking the line after a token that a
    /// comment follows (continuation lines start at column `cont`). The
    /// comments after the last token are the caller's.
    fn lay_out(&mut self, prefix: String, cont: usize, toks: &[Tok<'a>]) -> Vec<String> {
        let mut lines = Vec::new();
        let mut line = prefix;
        let mut fresh = true;
        for (i, tok) in toks.iter().enumerate() {
            if !fresh && !tok.glue {
                line.push(' ');
            }
            line.push_str(tok.text);
            fresh = false;
            if i + 1 < toks.len() && self.comments.has_after(tok.end) {
                let after = self.comments.take_after(tok.end);
                if let Some(c) = after.trailing {
                    line.push_str("  ");
                    line.push_str(c.text);
                }
                lines.push(std::mem::replace(&mut line, spaces(cont)));
                for c in after.own_line {
                    lines.push(format!("{}{}", spaces(cont), c.text));
                }
                fresh = true;
            }
        }
        lines.push(line);
        lines
    }

    /// The raw token of `kind` that is the first token at or after `offset`.
    fn find(&self, offset: u32, kind: TokKind) -> R<Span> {
        let i = self.raw.partition_point(|t| t.span.start < offset);
        match self.raw.get(i) {
            Some(t) if t.kind == kind => Ok(t.span),
            _ => Err(Internal(format!(
                "expected {} after offset {offset}",
                kind.describe()
            ))),
        }
    }

    fn value(&self, v: &'a Value, t: &mut Toks<'a>) -> R<()> {
        self.elements(&v.elements, t)?;
        for w in &v.with {
            t.span(self.src, w.keyword);
            t.span(self.src, w.key.span);
            self.elements(&w.value.elements, t)?;
        }
        Ok(())
    }

    fn elements(&self, elements: &'a Elements, t: &mut Toks<'a>) -> R<()> {
        let mut prev_end = None;
        for e in elements {
            if let Some(end) = prev_end {
                t.glued(self.src, self.find(end, TokKind::Comma)?);
            }
            self.element(e, t);
            prev_end = Some(e.span.end);
        }
        Ok(())
    }

    fn element(&self, e: &'a Element, t: &mut Toks<'a>) {
        self.expr(&e.expr, t);
        if let Some(q) = e.qualifier {
            t.span(self.src, q.span);
        }
        if let Some(r) = &e.range_end {
            t.span(self.src, r.keyword);
            self.expr(&r.expr, t);
            if let Some(q) = r.qualifier {
                t.span(self.src, q.span);
            }
        }
    }

    /// An expression, spaced: one space around a binary operator, none
    /// inside parentheses or after a sign, one between a number and its unit.
    /// Chains of operators and signs are walked without recursion (the
    /// parser builds them of any length); only parentheses nest, and they
    /// are limited by the parser.
    fn expr(&self, e: &'a Expr, t: &mut Toks<'a>) {
        let src = self.src;
        // The left spine of a chain `a + b - c`: print the leftmost operand,
        // then each operator and right operand.
        let mut spine = Vec::new();
        let mut leftmost = e;
        while let Expr::Binary(b) = leftmost {
            spine.push(&**b);
            leftmost = &b.lhs;
        }
        self.operand(leftmost, t);
        for b in spine.iter().rev() {
            t.span(src, b.op_span);
            self.expr(&b.rhs, t);
        }
    }

    fn operand(&self, e: &'a Expr, t: &mut Toks<'a>) {
        let src = self.src;
        let mut e = e;
        while let Expr::Unary(u) = e {
            t.span(src, u.op_span);
            t.glue_next = true;
            e = &u.operand;
        }
        match e {
            Expr::Number(n) => {
                t.span(src, n.digits);
                if let Some(u) = n.unit {
                    t.span(src, u.span);
                }
            }
            Expr::Name(n) => t.span(src, n.span),
            Expr::None(s) => t.span(src, *s),
            Expr::Paren(p) => {
                t.span(src, Span::new(p.span.start, p.span.start + 1));
                t.glue_next = true;
                self.expr(&p.inner, t);
                t.glued(src, Span::new(p.span.end.saturating_sub(1), p.span.end));
            }
            // The parser gives a sign an atom; any other operand is printed
            // as it stands.
            Expr::Binary(_) | Expr::Unary(_) => self.expr(e, t),
        }
    }
}

/// The closing brace of a block (always present in a file without errors).
fn close(b: &Block) -> R<Span> {
    b.body
        .close
        .ok_or_else(|| Internal(format!("a block without `}}` at {:?}", b.span)))
}
