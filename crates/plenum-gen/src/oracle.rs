//! The invariants the fuzz targets check, shared with the regression tests
//! that replay every saved crasher (`fuzz/regressions/<target>/`) under
//! plain `cargo test`.
//!
//! Each check returns `Err` with a description when an invariant is broken.
//! A panic inside the checked code is not caught here: the fuzzer reports it
//! as a crash, and a test that replays the input fails on it.

use std::path::Path;

use plenum_model::{Loc, MemoryFs, Model};
use plenum_syntax::{
    Block, Body, Element, Elements, Entry, Expr, Item, Let, Like, Name, Property, RangeEnd,
    SourceFile, Span, StrLit, Use, Value, With,
};

/// The project folder of the analysis check's two files.
pub const ANALYSIS_DIR: &str = "/fuzz";
/// The root file of the analysis check.
pub const ANALYSIS_ROOT: &str = "/fuzz/design.plenum";
/// The second file, which the root may `use` as `"shared/site.plenum"`.
pub const ANALYSIS_OTHER: &str = "/fuzz/shared/site.plenum";

/// `plenum_syntax::parse` must not panic, and every span it returns (tree,
/// errors, comments, and the lexer's tokens) must lie inside the text with
/// both ends on character boundaries.
pub fn check_parse(text: &str) -> Result<(), String> {
    let parsed = plenum_syntax::parse(text);
    let mut spans = Vec::new();
    source_file(&parsed.file, &mut spans);
    spans.extend(parsed.errors.iter().map(|e| ("error", e.span)));
    spans.extend(parsed.comments.iter().map(|&c| ("comment", c)));
    let lexed = plenum_syntax::lex(text);
    spans.extend(lexed.tokens.iter().map(|t| ("token", t.span)));
    for (what, span) in spans {
        let (start, end) = (span.start as usize, span.end as usize);
        if start > end || end > text.len() {
            return Err(format!(
                "{what} span {span:?} is out of range for a text of {} bytes",
                text.len()
            ));
        }
        if !text.is_char_boundary(start) || !text.is_char_boundary(end) {
            return Err(format!("{what} span {span:?} splits a character"));
        }
    }
    Ok(())
}

/// Split a fuzz input into the two files of the analysis check: the root
/// file before the first NUL byte, the `use`d file after it (empty when there
/// is no NUL). Both are decoded as lossy UTF-8.
pub fn split_analysis_input(data: &[u8]) -> (String, String) {
    let (root, other) = match data.iter().position(|&b| b == 0) {
        Some(i) => (&data[..i], &data[i + 1..]),
        None => (data, &[][..]),
    };
    (
        String::from_utf8_lossy(root).into_owned(),
        String::from_utf8_lossy(other).into_owned(),
    )
}

/// The whole analysis on two files — the root at [`ANALYSIS_ROOT`] and a
/// second file at [`ANALYSIS_OTHER`] that it may `use` — must not panic, and
/// every number of the engine's evaluation must be finite
/// ([`plenum_engine::Evaluation::first_non_finite`]). Every location the
/// model hands on — diagnostics with their related places and fixes,
/// symbols and references, hover's properties, the design's zones and air
/// handlers — must lie inside the file it names, on character boundaries.
pub fn check_analysis(root: &str, other: &str) -> Result<(), String> {
    let mut fs = MemoryFs::new();
    fs.insert(Path::new(ANALYSIS_DIR).join("plenum.toml"), "");
    fs.insert(ANALYSIS_OTHER, other.as_bytes());
    let model = Model::build(&fs, Path::new(ANALYSIS_ROOT), root.to_string());
    let mut locs: Vec<(&str, Loc)> = Vec::new();
    for d in &model.diagnostics {
        locs.push(("diagnostic", d.loc));
        locs.extend(d.related.iter().map(|(l, _)| ("related", *l)));
        if let Some(fix) = &d.fix {
            locs.extend(fix.edits.iter().map(|e| ("fix edit", e.loc)));
        }
    }
    for def in &model.symbols.defs {
        locs.push(("symbol", def.loc));
        locs.push(("symbol name", def.name_loc));
    }
    for r in &model.symbols.refs {
        if r.def >= model.symbols.defs.len() {
            return Err(format!(
                "a reference names symbol {} of {}",
                r.def,
                model.symbols.defs.len()
            ));
        }
        locs.push(("reference", r.loc));
    }
    for p in &model.properties {
        locs.push(("property", p.loc));
        locs.push(("property key", p.key_loc));
    }
    for z in &model.design.zones {
        locs.push(("zone", z.loc));
        locs.push(("zone name", z.name_loc));
    }
    for a in &model.design.ahus {
        locs.push(("ahu", a.loc));
        locs.push(("ahu name", a.name_loc));
        locs.extend(a.serves.iter().map(|s| ("serves", s.loc)));
    }
    for (what, l) in locs {
        let Some(file) = model.file(l.file) else {
            return Err(format!(
                "{what} location names file {:?}, not loaded",
                l.file
            ));
        };
        let (start, end) = (l.span.start as usize, l.span.end as usize);
        if start > end
            || end > file.text.len()
            || !file.text.is_char_boundary(start)
            || !file.text.is_char_boundary(end)
        {
            return Err(format!(
                "{what} span {:?} is not inside its file of {} bytes",
                l.span,
                file.text.len()
            ));
        }
    }
    let evaluation = plenum_engine::evaluate(&model.design);
    match evaluation.first_non_finite() {
        Some(field) => Err(format!("the evaluation holds a non-finite `{field}`")),
        None => Ok(()),
    }
}

/// Formatting round trips: when `plenum_fmt::format` succeeds, formatting
/// its output again changes nothing, the output parses without error, and
/// the edits of `plenum_fmt::format_edits` applied to the text give the same
/// output. When it fails it must fail for a syntax error: an internal error
/// is a formatter bug.
pub fn check_format(text: &str) -> Result<(), String> {
    let formatted = match plenum_fmt::format(text) {
        Ok(f) => f,
        Err(plenum_fmt::FormatError::Syntax { .. }) => {
            if plenum_syntax::parse(text).errors.is_empty() {
                return Err("format reports a syntax error the parser does not".to_string());
            }
            return Ok(());
        }
        Err(e @ plenum_fmt::FormatError::Internal { .. }) => return Err(e.to_string()),
    };
    if let Some(e) = plenum_syntax::parse(&formatted).errors.first() {
        return Err(format!(
            "the formatted text has a syntax error: {}",
            e.message
        ));
    }
    match plenum_fmt::format(&formatted) {
        Ok(again) if again == formatted => {}
        Ok(_) => return Err("formatting is not idempotent".to_string()),
        Err(e) => return Err(format!("the formatted text does not format: {e}")),
    }
    let edits = plenum_fmt::format_edits(text).map_err(|e| format!("format_edits: {e}"))?;
    match plenum_fmt::apply_edits(text, &edits) {
        Some(applied) if applied == formatted => Ok(()),
        Some(_) => Err("format_edits applied differ from format".to_string()),
        None => Err("format_edits are unsorted, overlapping or off a boundary".to_string()),
    }
}

type Spans = Vec<(&'static str, Span)>;

// Every node is destructured without `..`, so a field added to the tree
// later does not compile here until its spans are checked too.

fn source_file(f: &SourceFile, out: &mut Spans) {
    let SourceFile { items, span } = f;
    out.push(("file", *span));
    for item in items {
        match item {
            Item::Use(u) => use_item(u, out),
            Item::Let(l) => let_item(l, out),
            Item::Block(b) => block(b, out),
            Item::Error(s) => out.push(("item error", *s)),
        }
    }
}

fn use_item(u: &Use, out: &mut Spans) {
    let Use {
        span,
        keyword,
        path,
    } = u;
    out.push(("use", *span));
    out.push(("use keyword", *keyword));
    str_lit(path, out);
}

fn let_item(l: &Let, out: &mut Spans) {
    let Let {
        span,
        keyword,
        name: n,
        value: v,
    } = l;
    out.push(("let", *span));
    out.push(("let keyword", *keyword));
    name(n, out);
    value(v, out);
}

fn block(b: &Block, out: &mut Spans) {
    let Block {
        span,
        kind,
        name: n,
        label,
        like,
        body,
    } = b;
    out.push(("block", *span));
    name(kind, out);
    if let Some(n) = n {
        name(n, out);
    }
    if let Some(l) = label {
        str_lit(l, out);
    }
    if let Some(Like { keyword, name: n }) = like {
        out.push(("like keyword", *keyword));
        name(n, out);
    }
    let Body {
        open,
        entries,
        close,
    } = body;
    out.push(("open brace", *open));
    if let Some(c) = close {
        out.push(("close brace", *c));
    }
    for e in entries {
        match e {
            Entry::Property(p) => property(p, out),
            Entry::Block(b) => block(b, out),
            Entry::Error(s) => out.push(("entry error", *s)),
        }
    }
}

fn property(p: &Property, out: &mut Spans) {
    let Property {
        span,
        key,
        value: v,
    } = p;
    out.push(("property", *span));
    name(key, out);
    value(v, out);
}

fn value(v: &Value, out: &mut Spans) {
    let Value {
        span,
        elements,
        with,
    } = v;
    out.push(("value", *span));
    let Elements { first, rest } = elements;
    element(first, out);
    for e in rest.iter() {
        element(e, out);
    }
    for w in with.iter() {
        let With {
            span,
            keyword,
            key,
            value: v,
        } = w;
        out.push(("with", *span));
        out.push(("with keyword", *keyword));
        name(key, out);
        value(v, out);
    }
}

fn element(e: &Element, out: &mut Spans) {
    let Element {
        span,
        expr: x,
        qualifier,
        range_end,
    } = e;
    out.push(("element", *span));
    expr(x, out);
    if let Some(q) = qualifier {
        name(q, out);
    }
    if let Some(r) = range_end {
        let RangeEnd {
            keyword,
            expr: x,
            qualifier,
        } = &**r;
        out.push(("to keyword", *keyword));
        expr(x, out);
        if let Some(q) = qualifier {
            name(q, out);
        }
    }
}

fn expr(x: &Expr, out: &mut Spans) {
    match x {
        Expr::Number(plenum_syntax::Number {
            digits,
            value: _,
            unit,
        }) => {
            out.push(("number", *digits));
            if let Some(u) = unit {
                out.push(("unit", u.span));
            }
        }
        Expr::Name(n) => name(n, out),
        Expr::None(s) => out.push(("none", *s)),
        Expr::Paren(p) => {
            let plenum_syntax::Paren { span, inner } = &**p;
            out.push(("paren", *span));
            expr(inner, out);
        }
        Expr::Unary(u) => {
            let plenum_syntax::Unary {
                span,
                op: _,
                op_span,
                operand,
            } = &**u;
            out.push(("unary", *span));
            out.push(("unary operator", *op_span));
            expr(operand, out);
        }
        Expr::Binary(b) => {
            let plenum_syntax::Binary {
                span,
                op: _,
                op_span,
                lhs,
                rhs,
            } = &**b;
            out.push(("binary", *span));
            out.push(("binary operator", *op_span));
            expr(lhs, out);
            expr(rhs, out);
        }
    }
}

fn name(n: &Name, out: &mut Spans) {
    out.push(("name", n.span));
}

fn str_lit(s: &StrLit, out: &mut Spans) {
    let StrLit { span, value: _ } = s;
    out.push(("string", *span));
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_valid_design_passes_every_check() {
        let text = "site {\n  cooling 94 °F db, 75 °F wb\n}\n\nzone a {\n  area     100 ft²\n  sensible 2 kBtu/h\n}\n\nahu b {\n  serves a\n}\n";
        assert_eq!(check_parse(text), Ok(()));
        assert_eq!(check_analysis(text, ""), Ok(()));
        assert_eq!(check_format(text), Ok(()));
    }

    #[test]
    fn the_analysis_input_splits_at_the_first_nul() {
        assert_eq!(
            split_analysis_input(b"a\0b\0c"),
            ("a".to_string(), "b\0c".to_string())
        );
        assert_eq!(
            split_analysis_input(b"\xffx"),
            ("\u{fffd}x".to_string(), String::new())
        );
    }

    #[test]
    fn the_second_file_is_found_by_use() {
        let root = "use \"shared/site.plenum\"\n\nzone a {\n  area     100 ft²\n  sensible 2 kBtu/h\n}\n\nahu b {\n  serves a\n}\n";
        let site = "site {\n  cooling 94 °F db, 75 °F wb\n}\n";
        let mut fs = MemoryFs::new();
        fs.insert(Path::new(ANALYSIS_DIR).join("plenum.toml"), "");
        fs.insert(ANALYSIS_OTHER, site);
        let model = Model::build(&fs, Path::new(ANALYSIS_ROOT), root.to_string());
        assert!(model.diagnostics.is_empty(), "{:?}", model.diagnostics);
        assert_eq!(model.files.len(), 2);
        let e = plenum_engine::evaluate(&model.design);
        assert!(e.ahus[0].result.is_ok());
        assert_eq!(check_analysis(root, site), Ok(()));
    }

    #[test]
    fn text_with_syntax_errors_is_no_format_failure() {
        // Text with syntax errors is not formatted, and that is not a failure.
        assert_eq!(check_format("zone {"), Ok(()));
    }
}
