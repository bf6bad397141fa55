//! Property tests: the parser never panics, and every span it returns lies
//! inside the input on character boundaries.

#![allow(clippy::unwrap_used)]

use std::path::Path;

use plenum_syntax::*;
use proptest::prelude::*;

fn expr_spans(e: &Expr, out: &mut Vec<Span>) {
    out.push(e.span());
    match e {
        Expr::Number(n) => {
            out.push(n.digits);
            if let Some(u) = &n.unit {
                out.push(u.span);
            }
        }
        Expr::Name(n) => out.push(n.span),
        Expr::None(s) => out.push(*s),
        Expr::Paren(p) => expr_spans(&p.inner, out),
        Expr::Unary(u) => {
            out.push(u.op_span);
            expr_spans(&u.operand, out);
        }
        Expr::Binary(b) => {
            out.push(b.op_span);
            expr_spans(&b.lhs, out);
            expr_spans(&b.rhs, out);
        }
    }
}

fn value_spans(v: &Value, out: &mut Vec<Span>) {
    out.push(v.span);
    for el in &v.elements {
        out.push(el.span);
        expr_spans(&el.expr, out);
        if let Some(q) = &el.qualifier {
            out.push(q.span);
        }
        if let Some(r) = &el.range_end {
            out.push(r.keyword);
            expr_spans(&r.expr, out);
        }
    }
    for w in &v.with {
        out.push(w.span);
        out.push(w.key.span);
        value_spans(&w.value, out);
    }
}

fn block_spans(b: &Block, out: &mut Vec<Span>) {
    out.push(b.span);
    out.push(b.kind.span);
    out.extend(b.name.map(|n| n.span));
    out.extend(b.label.as_ref().map(|l| l.span));
    out.push(b.body.open);
    out.extend(b.body.close);
    for e in &b.body.entries {
        out.push(e.span());
        match e {
            Entry::Property(p) => {
                out.push(p.key.span);
                value_spans(&p.value, out);
            }
            Entry::Block(inner) => block_spans(inner, out),
            Entry::Error(_) => {}
        }
    }
}

/// Every span in the parse result.
fn all_spans(p: &Parse) -> Vec<Span> {
    let mut out = vec![p.file.span];
    out.extend(p.comments.iter().copied());
    for e in &p.errors {
        out.push(e.span);
        out.extend(e.related.iter().map(|r| r.0));
    }
    for item in &p.file.items {
        out.push(item.span());
        match item {
            Item::Use(u) => out.push(u.path.span),
            Item::Let(l) => {
                out.push(l.name.span);
                value_spans(&l.value, &mut out);
            }
            Item::Block(b) => block_spans(b, &mut out),
            Item::Error(_) => {}
        }
    }
    out
}

fn check_spans(text: &str) -> Result<(), TestCaseError> {
    let parsed = parse(text);
    for s in all_spans(&parsed) {
        prop_assert!(s.start <= s.end, "reversed span {s:?}");
        prop_assert!(s.end as usize <= text.len(), "span {s:?} past the end");
        prop_assert!(text.is_char_boundary(s.start as usize), "{s:?} start");
        prop_assert!(text.is_char_boundary(s.end as usize), "{s:?} end");
    }
    // Errors come sorted by position.
    for w in parsed.errors.windows(2) {
        prop_assert!(w[0].span.start <= w[1].span.start);
    }
    Ok(())
}

fn examples() -> Vec<String> {
    let root = Path::new(env!("CARGO_MANIFEST_DIR")).join("../../examples");
    let mut out = Vec::new();
    for name in ["library.plenum", "middle-school.plenum"] {
        out.push(std::fs::read_to_string(root.join(name)).unwrap());
    }
    out.push(
        std::fs::read_to_string(
            Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures/valid/core.plenum"),
        )
        .unwrap(),
    );
    out
}

/// A mutation of a text: delete, insert or replace a run of characters.
#[derive(Debug, Clone)]
enum Mutation {
    Delete { at: usize, len: usize },
    Insert { at: usize, text: String },
    Replace { at: usize, len: usize, text: String },
}

fn apply(text: &str, m: &Mutation) -> String {
    let chars: Vec<char> = text.chars().collect();
    let clamp = |i: usize| i.min(chars.len());
    let (at, len, ins) = match m {
        Mutation::Delete { at, len } => (clamp(*at), *len, ""),
        Mutation::Insert { at, text } => (clamp(*at), 0, text.as_str()),
        Mutation::Replace { at, len, text } => (clamp(*at), *len, text.as_str()),
    };
    let end = clamp(at + len);
    let mut out: String = chars[..at].iter().collect();
    out.push_str(ins);
    out.extend(&chars[end..]);
    out
}

/// Fragments that matter to the grammar, to make mutations interesting.
fn fragment() -> impl Strategy<Value = String> {
    prop_oneof![
        Just("{".to_string()),
        Just("}".to_string()),
        Just("(".to_string()),
        Just(")".to_string()),
        Just("\"".to_string()),
        Just("\n".to_string()),
        Just("\r\n".to_string()),
        Just(";".to_string()),
        Just(",".to_string()),
        Just(" to ".to_string()),
        Just(" with ".to_string()),
        Just("°F".to_string()),
        Just("ft²".to_string()),
        Just("/".to_string()),
        Just("^".to_string()),
        Just("#".to_string()),
        Just("\\".to_string()),
        Just("\u{0}".to_string()),
        Just("use ".to_string()),
        Just("let x = ".to_string()),
        "[0-9]{1,400}",
        ".{0,8}",
    ]
}

fn mutation() -> impl Strategy<Value = Mutation> {
    prop_oneof![
        (0usize..6000, 1usize..40).prop_map(|(at, len)| Mutation::Delete { at, len }),
        (0usize..6000, fragment()).prop_map(|(at, text)| Mutation::Insert { at, text }),
        (0usize..6000, 1usize..10, fragment()).prop_map(|(at, len, text)| Mutation::Replace {
            at,
            len,
            text
        }),
    ]
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(400))]

    #[test]
    fn arbitrary_strings_never_panic(text in ".{0,400}") {
        check_spans(&text)?;
    }

    #[test]
    fn arbitrary_token_soup_never_panics(parts in proptest::collection::vec(fragment(), 0..60)) {
        check_spans(&parts.concat())?;
    }

    #[test]
    fn mutated_examples_never_panic(
        which in 0usize..3,
        muts in proptest::collection::vec(mutation(), 1..6),
    ) {
        let mut text = examples()[which].clone();
        for m in &muts {
            text = apply(&text, m);
        }
        check_spans(&text)?;
    }

    #[test]
    fn values_parse_standalone_without_panicking(text in ".{0,80}") {
        let (value, errors) = parse_value(&text);
        prop_assert!(value.is_some() || !errors.is_empty());
        for e in errors {
            prop_assert!(e.span.end as usize <= text.len());
            prop_assert!(text.is_char_boundary(e.span.start as usize));
        }
    }

    #[test]
    fn line_index_round_trips_on_char_boundaries(text in "(.|\r\n|\n){0,200}") {
        let index = LineIndex::new(&text);
        for (offset, _) in text.char_indices().chain(std::iter::once((text.len(), ' '))) {
            let offset = offset as u32;
            // A '\r' of a CRLF belongs to the line break; skip it.
            if text.as_bytes().get(offset as usize) == Some(&b'\n')
                && offset > 0
                && text.as_bytes()[offset as usize - 1] == b'\r'
            {
                continue;
            }
            for unit in [ColumnUnit::Utf8, ColumnUnit::Utf16, ColumnUnit::Char] {
                let lc = index.line_col(offset, unit);
                let back = index.offset(lc, unit);
                let at_cr = text.as_bytes().get(offset as usize) == Some(&b'\r')
                    && text.as_bytes().get(offset as usize + 1) == Some(&b'\n');
                if !at_cr {
                    prop_assert_eq!(back, offset, "{:?} {:?}", unit, lc);
                }
            }
        }
    }
}

#[test]
fn hostile_inputs_give_located_errors() {
    let cases: Vec<String> = vec![
        "{".repeat(20_000),
        "(".repeat(20_000),
        format!("let x = 1{}", "0".repeat(5_000)),
        "zone a { label \"never closed\n}".to_string(),
        "\u{0}\u{1}\u{7f}binary\u{0}".to_string(),
        "}".repeat(1_000),
        "-".repeat(50_000) + "1",
    ];
    for text in cases {
        let parsed = parse(&text);
        assert!(
            !parsed.errors.is_empty(),
            "no error for {:?}",
            &text[..text.len().min(40)]
        );
        check_spans(&text).unwrap();
    }
}
