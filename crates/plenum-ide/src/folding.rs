//! Folding ranges: blocks that span lines, and runs of comment lines.

use std::path::Path;

use plenum_syntax::{Block, Item};

use crate::Span;
use crate::world::Analysis;

#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum FoldKind {
    Block,
    Comment,
}

#[derive(Clone, Debug, PartialEq, Eq)]
pub struct FoldingRange {
    /// From the block's `{` to its `}` (or the comment run's first to last byte).
    pub span: Span,
    pub kind: FoldKind,
}

fn blocks(b: &Block, text: &str, out: &mut Vec<FoldingRange>) {
    let end = b.body.close.map_or(b.span.end, |c| c.end);
    let span = Span::new(b.body.open.start, end);
    if span.text(text).contains('\n') {
        out.push(FoldingRange {
            span,
            kind: FoldKind::Block,
        });
    }
    for inner in b.blocks() {
        blocks(inner, text, out);
    }
}

impl Analysis {
    pub fn folding_ranges(&self, path: &Path) -> Vec<FoldingRange> {
        let Some(ctx) = self.ctx(path) else {
            return Vec::new();
        };
        let text = ctx.text();
        let mut out = Vec::new();
        for item in &ctx.file.parse.file.items {
            if let Item::Block(b) = item {
                blocks(b, text, &mut out);
            }
        }
        // Runs of two or more comments on consecutive lines, each alone on its line.
        let lines = &ctx.file.lines;
        let own_line = |c: &Span| {
            let lc = lines.line_col_utf8(c.start);
            lines
                .line_start(lc.line)
                .is_some_and(|s| text[s as usize..c.start as usize].trim().is_empty())
        };
        let mut run: Option<(Span, u32, u32)> = None; // (span, first line, last line)
        let flush = |run: &mut Option<(Span, u32, u32)>, out: &mut Vec<FoldingRange>| {
            if let Some((span, a, b)) = run.take()
                && b > a
            {
                out.push(FoldingRange {
                    span,
                    kind: FoldKind::Comment,
                });
            }
        };
        for c in ctx.file.parse.comments.iter().filter(|c| own_line(c)) {
            let line = lines.line_col_utf8(c.start).line;
            match &mut run {
                Some((span, _, last)) if *last + 1 == line => {
                    *span = span.cover(*c);
                    *last = line;
                }
                _ => {
                    flush(&mut run, &mut out);
                    run = Some((*c, line, line));
                }
            }
        }
        flush(&mut run, &mut out);
        out.sort_by_key(|r| (r.span.start, r.span.end));
        out
    }
}
