//! Fixture tests: each file under `tests/fixtures/` is parsed and its syntax
//! errors are compared with the annotations written in the file itself (the
//! annotation syntax is documented in the `plenum-testkit` crate). Files under
//! `valid/` must parse without errors and carry no annotations.

use std::path::Path;

use plenum_testkit::{Actual, annotations, check, fixtures};

fn run_dir(dir: &str, valid: bool) {
    let root = Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("tests/fixtures")
        .join(dir);
    let files = fixtures(&root);
    assert!(!files.is_empty(), "no fixtures in {}", root.display());
    let mut failures = Vec::new();
    for path in &files {
        let text = std::fs::read_to_string(path).expect("fixture is UTF-8");
        if valid && !annotations(&text).is_empty() {
            failures.push(format!(
                "{}: a valid fixture carries annotations",
                path.display()
            ));
            continue;
        }
        let actual: Vec<Actual> = plenum_syntax::parse(&text)
            .errors
            .iter()
            .map(|e| Actual {
                code: e.kind.code().to_string(),
                severity: "error".to_string(),
                start: e.span.start as usize,
                end: e.span.end as usize,
                message: e.message.clone(),
            })
            .collect();
        if let Err(e) = check(&text, &actual) {
            failures.push(format!("{}:\n{e}", path.display()));
        }
    }
    assert!(failures.is_empty(), "\n{}", failures.join("\n\n"));
}

#[test]
fn valid_fixtures_parse_without_errors() {
    run_dir("valid", true);
}

#[test]
fn invalid_fixtures_report_exactly_their_annotations() {
    run_dir("invalid", false);
}
