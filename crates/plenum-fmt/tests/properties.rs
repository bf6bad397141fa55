//! Properties of the formatter on generated designs: it accepts every valid
//! file, its output is stable, means the same, keeps every comment in order,
//! and has the canonical shape; the edits reproduce it; and no input at all
//! makes it panic.

#![allow(clippy::unwrap_used)] // test helpers: a failure is the test failing

mod common;

use proptest::prelude::*;

use common::{Writer, design_strategy, meaning};

/// Shape checks that hold for every formatted text.
fn assert_canonical(out: &str) {
    if out.is_empty() {
        return;
    }
    let crlf = out.contains("\r\n");
    assert!(
        out.ends_with('\n') && !out.ends_with("\n\n") && !out.ends_with("\n\r\n"),
        "{out:?}"
    );
    let body = if crlf {
        assert_eq!(
            out.matches('\n').count(),
            out.matches("\r\n").count(),
            "mixed line endings"
        );
        out.replace("\r\n", "\n")
    } else {
        out.to_string()
    };
    let lines: Vec<&str> = body.lines().collect();
    for (i, l) in lines.iter().enumerate() {
        assert!(
            !l.ends_with(' ') && !l.ends_with('\t'),
            "trailing space on line {}: {l:?}",
            i + 1
        );
        let indent = l.len() - l.trim_start_matches(' ').len();
        assert!(
            !l[indent..].starts_with('\t'),
            "tab indent on line {}",
            i + 1
        );
        assert!(
            !(l.is_empty() && i > 0 && lines[i - 1].is_empty()),
            "two blank lines at {}",
            i + 1
        );
    }
    assert!(!lines[0].is_empty(), "leading blank line");
    // No `;` is left outside comments and strings.
    let lexed = plenum_syntax::lex(out);
    assert!(
        lexed
            .tokens
            .iter()
            .all(|t| t.kind != plenum_syntax::TokKind::Semi)
    );
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 400, ..ProptestConfig::default() })]

    #[test]
    fn formatting_is_stable_and_keeps_the_meaning((items, seed) in design_strategy()) {
        let text = Writer::new(seed).file(&items);
        let before = meaning(&text);
        let once = plenum_fmt::format(&text).unwrap_or_else(|e| panic!("{e}\n---\n{text}"));
        let twice = plenum_fmt::format(&once).unwrap();
        prop_assert_eq!(&twice, &once, "not idempotent; input:\n{}", text);
        prop_assert_eq!(meaning(&once), before);
        assert_canonical(&once);
        if text.contains("\r\n") && !once.is_empty() {
            prop_assert!(once.contains("\r\n"));
        }
        let edits = plenum_fmt::format_edits(&text).unwrap();
        prop_assert_eq!(plenum_fmt::apply_edits(&text, &edits), Some(once.clone()));
        prop_assert!(plenum_fmt::format_edits(&once).unwrap().is_empty());
    }

    /// Text made of the format's own characters, mostly invalid: formatting
    /// returns an error or a stable, equivalent text, and never panics.
    #[test]
    fn no_input_makes_it_panic(text in "[a-z0-9 _{}();,#\n\r\t\"°²%*/+.=-]{0,160}") {
        check_any(&text)?;
    }
}

/// Check one text that may or may not be valid.
fn check_any(text: &str) -> Result<(), TestCaseError> {
    match plenum_fmt::format(text) {
        Err(plenum_fmt::FormatError::Syntax {
            count,
            line,
            column,
            ..
        }) => {
            prop_assert!(count >= 1 && line >= 1 && column >= 1);
            prop_assert!(plenum_syntax::parse(text).has_errors());
        }
        Err(e @ plenum_fmt::FormatError::Internal { .. }) => {
            prop_assert!(false, "{e}\n{text:?}");
        }
        Ok(out) => {
            prop_assert_eq!(meaning(&out), meaning(text));
            prop_assert_eq!(plenum_fmt::format(&out), Ok(out.clone()));
            assert_canonical(&out);
        }
    }
    Ok(())
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 300, ..ProptestConfig::default() })]

    /// A generated design with one character deleted or inserted: most are
    /// broken and refused; those still valid format like any other.
    #[test]
    fn damaged_designs_are_refused_or_formatted(
        (items, seed) in design_strategy(),
        at in any::<prop::sample::Index>(),
        insert in prop::option::of(prop::sample::select(vec!['{', '}', ';', ',', '#', '\n', '(', '"', ' ', 'x', '5'])),
    ) {
        let mut text = Writer::new(seed).file(&items);
        let bounds: Vec<usize> = (0..=text.len()).filter(|&i| text.is_char_boundary(i)).collect();
        let i = bounds[at.index(bounds.len())];
        match insert {
            Some(c) => text.insert(i, c),
            None => {
                if let Some(c) = text[i..].chars().next() {
                    text.replace_range(i..i + c.len_utf8(), "");
                }
            }
        }
        check_any(&text)?;
    }
}

/// The longest chain a value may hold (`plenum_syntax::MAX_OPERATORS`
/// operators) formats; a longer one is a syntax error and is refused, so no
/// chain is deep enough to exhaust the stack.
#[test]
fn long_operator_chains_do_not_exhaust_the_stack() {
    let terms: Vec<String> = (0..=plenum_syntax::MAX_OPERATORS)
        .map(|i| format!("{i} ft"))
        .collect();
    let text = format!("let total = {}\n", terms.join("+"));
    let out = plenum_fmt::format(&text).unwrap();
    assert_eq!(out, format!("let total = {}\n", terms.join(" + ")));
    let terms: Vec<String> = (0..3_000).map(|i| format!("{i} ft")).collect();
    let text = format!("let total = {}\n", terms.join("+"));
    assert!(matches!(
        plenum_fmt::format(&text),
        Err(plenum_fmt::FormatError::Syntax { count: 1, .. })
    ));
}
