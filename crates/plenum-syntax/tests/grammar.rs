//! Keeps the grammar documentation and the examples honest: every `plenum`
//! code block in `grammar/README.md` and every design under `examples/` must
//! parse without a syntax error.

#![allow(clippy::unwrap_used)] // test helpers: a failure is the test failing

use std::path::{Path, PathBuf};

fn root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../..")
}

fn code_blocks(markdown: &str, lang: &str) -> Vec<(usize, String)> {
    let mut out = Vec::new();
    let mut current: Option<(usize, String)> = None;
    for (n, line) in markdown.lines().enumerate() {
        let trimmed = line.trim_start();
        match &mut current {
            None => {
                if trimmed.strip_prefix("```").map(str::trim) == Some(lang) {
                    current = Some((n + 2, String::new()));
                }
            }
            Some((_, text)) => {
                if trimmed.starts_with("```") {
                    out.push(current.take().unwrap());
                } else {
                    text.push_str(line);
                    text.push('\n');
                }
            }
        }
    }
    assert!(current.is_none(), "unterminated code block");
    out
}

fn plenum_files(dir: &Path, out: &mut Vec<PathBuf>) {
    for entry in std::fs::read_dir(dir).unwrap() {
        let path = entry.unwrap().path();
        if path.is_dir() {
            plenum_files(&path, out);
        } else if path.extension().is_some_and(|e| e == "plenum") {
            out.push(path);
        }
    }
}

#[test]
fn every_code_block_of_the_grammar_documentation_parses() {
    let doc = std::fs::read_to_string(root().join("grammar/README.md")).unwrap();
    let blocks = code_blocks(&doc, "plenum");
    assert!(blocks.len() >= 4, "expected the documentation's examples");
    for (line, text) in blocks {
        let parsed = plenum_syntax::parse(&text);
        assert!(
            parsed.errors.is_empty(),
            "grammar/README.md code block at line {line}: {:?}",
            parsed.errors
        );
    }
}

#[test]
fn every_example_design_parses() {
    let mut files = Vec::new();
    plenum_files(&root().join("examples"), &mut files);
    assert!(files.len() >= 2, "expected at least two example designs");
    for path in files {
        let text = std::fs::read_to_string(&path).unwrap();
        let parsed = plenum_syntax::parse(&text);
        assert!(
            parsed.errors.is_empty(),
            "{}: {:?}",
            path.display(),
            parsed.errors
        );
        assert!(!parsed.file.items.is_empty(), "{}", path.display());
    }
}

#[test]
fn the_grammar_file_names_every_keyword_the_lexer_reserves() {
    let ebnf = std::fs::read_to_string(root().join("grammar/plenum.ebnf")).unwrap();
    for kw in ["use", "let", "like", "to", "with", "none"] {
        assert!(
            ebnf.contains(&format!("\"{kw}\"")),
            "{kw} missing from the grammar"
        );
        let lexed = plenum_syntax::lex(kw);
        assert!(
            lexed.tokens[0].kind.is_keyword(),
            "{kw} is not a keyword token"
        );
    }
}
