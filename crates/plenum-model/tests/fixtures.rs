//! Fixture tests: each file under `tests/fixtures/` is loaded as a design and
//! the model's findings are compared with the annotations in the file (syntax
//! in the `plenum-testkit` crate). Fixtures must be free of syntax errors.

use std::path::Path;

use plenum_model::{MemoryFs, Model, Severity};
use plenum_testkit::{Actual, check, fixtures};

#[test]
fn model_fixtures_report_exactly_their_annotations() {
    let root = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fixtures");
    let files = fixtures(&root);
    assert!(files.len() >= 5, "expected the model fixtures");
    let mut failures = Vec::new();
    for path in &files {
        let text = std::fs::read_to_string(path).expect("fixture is UTF-8");
        let fs = MemoryFs::new();
        let model = Model::build(&fs, Path::new("/project/fixture.plenum"), text.clone());
        let syntax = &model.files[0].parse.errors;
        if !syntax.is_empty() {
            failures.push(format!("{}: syntax errors {syntax:?}", path.display()));
            continue;
        }
        let actual: Vec<Actual> = model
            .diagnostics
            .iter()
            .map(|d| Actual {
                code: d.code.code().to_string(),
                severity: match d.severity {
                    Severity::Error => "error",
                    Severity::Warning => "warning",
                    Severity::Info => "info",
                }
                .to_string(),
                start: d.loc.span.start as usize,
                end: d.loc.span.end as usize,
                message: d.message.clone(),
            })
            .collect();
        if let Err(e) = check(&text, &actual) {
            failures.push(format!("{}:\n{e}", path.display()));
        }
    }
    assert!(failures.is_empty(), "\n{}", failures.join("\n\n"));
}
