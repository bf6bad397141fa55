//! `plenum fmt`: rewrite design files in the canonical layout of `plenum-fmt`.
//!
//! Exit codes: 0 when every file is formatted (or was rewritten); 1 when, with
//! `--check`, a file would change, or when a file has syntax errors (it is not
//! formatted) or is not UTF-8; 2 for a usage error, a file that cannot be read
//! or written, or an internal error of the formatter.

use std::io::{Read, Write};
use std::path::{Path, PathBuf};
use std::process::ExitCode;

use plenum_fmt::FormatError;

use crate::files::{self, Loaded};

#[derive(clap::Args, Debug)]
pub struct FmtArgs {
    /// Files or folders to format (folders are searched for `*.plenum`,
    /// respecting `.gitignore`); `-` formats standard input to standard
    /// output. Default: the current folder.
    pub paths: Vec<PathBuf>,
    /// Change nothing: list the files that would be reformatted, and exit
    /// with 1 if there are any.
    #[arg(long)]
    pub check: bool,
    /// Change nothing: print a unified diff of what formatting would change
    /// (exits with 1 on changes only together with `--check`).
    #[arg(long)]
    pub diff: bool,
}

/// Run `plenum fmt` on the process's standard streams.
pub fn run(args: &FmtArgs) -> Result<ExitCode, String> {
    let code = run_with(
        args,
        &mut std::io::stdin().lock(),
        &mut std::io::stdout().lock(),
        &mut std::io::stderr().lock(),
    )?;
    Ok(ExitCode::from(code))
}

/// What became of one input.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
enum Outcome {
    Unchanged,
    /// Rewritten, or (with `--check`/`--diff`) would be.
    Changed,
    /// Syntax errors or not UTF-8: left as it is.
    NotFormatted,
    /// Could not be read or written, or the formatter failed.
    Failed,
}

impl Outcome {
    fn code(self, check: bool) -> u8 {
        match self {
            Outcome::Unchanged => 0,
            Outcome::Changed => u8::from(check),
            Outcome::NotFormatted => 1,
            Outcome::Failed => 2,
        }
    }
}

/// [`run`] with the streams given, returning the exit code. An `Err` is a
/// usage error (or an unreadable path), which the caller reports with code 2.
pub(crate) fn run_with(
    args: &FmtArgs,
    stdin: &mut dyn Read,
    out: &mut dyn Write,
    err: &mut dyn Write,
) -> Result<u8, String> {
    let uses_stdin = args.paths.iter().any(|p| p.as_os_str() == "-");
    if uses_stdin {
        if args.paths.len() > 1 {
            return Err("`-` (standard input) cannot be combined with other paths".to_string());
        }
        return Ok(stdin_mode(args, stdin, out, err));
    }
    let paths = files::discover(&args.paths)?;
    let mut code = 0u8;
    let mut changed = 0usize;
    let mut not_formatted = 0usize;
    for path in &paths {
        let outcome = one_file(args, path, out, err);
        match outcome {
            Outcome::Changed => changed += 1,
            Outcome::NotFormatted | Outcome::Failed => not_formatted += 1,
            Outcome::Unchanged => {}
        }
        code = code.max(outcome.code(args.check));
    }
    let _ = writeln!(
        err,
        "{}",
        summary(args, paths.len(), changed, not_formatted)
    );
    Ok(code)
}

fn plural(n: usize, word: &str) -> String {
    if n == 1 {
        format!("{n} {word}")
    } else {
        format!("{n} {word}s")
    }
}

fn summary(args: &FmtArgs, total: usize, changed: usize, not_formatted: usize) -> String {
    if total == 0 {
        return "no design files (`*.plenum`) found".to_string();
    }
    let dry = args.check || args.diff;
    let mut s = match (changed, dry) {
        (0, _) => format!(
            "{} already formatted",
            plural(total - not_formatted, "file")
        ),
        (n, true) => format!("{} of {total} would be reformatted", plural(n, "file")),
        (n, false) => format!("reformatted {} of {total}", plural(n, "file")),
    };
    if not_formatted > 0 {
        s.push_str(&format!(
            "; {} not formatted (see above)",
            plural(not_formatted, "file")
        ));
    }
    s
}

fn one_file(args: &FmtArgs, path: &Path, out: &mut dyn Write, err: &mut dyn Write) -> Outcome {
    let name = path.display().to_string();
    let text = match files::load(path) {
        Ok(Loaded::Text(t)) => t,
        Ok(Loaded::NotUtf8 { offset, .. }) => {
            let _ = writeln!(
                err,
                "error: `{name}` is not valid UTF-8 (the first invalid byte is at offset {offset}); not formatted"
            );
            return Outcome::NotFormatted;
        }
        Err(message) => {
            let _ = writeln!(err, "error: {message}");
            return Outcome::Failed;
        }
    };
    let formatted = match plenum_fmt::format(&text) {
        Ok(f) => f,
        Err(e) => return refused(&name, &e, err),
    };
    if formatted == text {
        return Outcome::Unchanged;
    }
    if args.diff {
        let _ = out.write_all(unified_diff(&name, &text, &formatted).as_bytes());
    } else if args.check {
        let _ = writeln!(out, "{name}");
    } else if let Err(message) = write_atomically(path, &formatted) {
        let _ = writeln!(err, "error: {message}");
        return Outcome::Failed;
    }
    Outcome::Changed
}

/// Report a text that was not formatted.
fn refused(name: &str, e: &FormatError, err: &mut dyn Write) -> Outcome {
    match e {
        FormatError::Syntax {
            count,
            first,
            line,
            column,
        } => {
            let errors = plural(*count, "syntax error");
            let _ = writeln!(
                err,
                "error: `{name}` has {errors} (the first at line {line}, column {column}: {}); \
                 not formatted",
                first.message
            );
            if name != "<stdin>" {
                let _ = writeln!(err, "  run `plenum check {name}` to see them all");
            }
            Outcome::NotFormatted
        }
        FormatError::Internal { .. } => {
            let _ = writeln!(err, "error: `{name}`: {e}");
            Outcome::Failed
        }
    }
}

fn stdin_mode(
    args: &FmtArgs,
    stdin: &mut dyn Read,
    out: &mut dyn Write,
    err: &mut dyn Write,
) -> u8 {
    const NAME: &str = "<stdin>";
    let mut bytes = Vec::new();
    if let Err(e) = stdin.read_to_end(&mut bytes) {
        let _ = writeln!(
            err,
            "error: cannot read standard input: {}",
            files::io_reason(&e)
        );
        return 2;
    }
    let text = match String::from_utf8(bytes) {
        Ok(t) => t,
        Err(e) => {
            let offset = e.utf8_error().valid_up_to();
            let _ = writeln!(
                err,
                "error: standard input is not valid UTF-8 (the first invalid byte is at offset {offset}); not formatted"
            );
            return 1;
        }
    };
    let formatted = match plenum_fmt::format(&text) {
        Ok(f) => f,
        Err(e) => return refused(NAME, &e, err).code(args.check),
    };
    let changed = formatted != text;
    let written = if args.diff {
        if changed {
            out.write_all(unified_diff(NAME, &text, &formatted).as_bytes())
        } else {
            Ok(())
        }
    } else if args.check {
        if changed {
            writeln!(out, "{NAME}")
        } else {
            Ok(())
        }
    } else {
        out.write_all(formatted.as_bytes())
    };
    if let Err(e) = written.and_then(|()| out.flush()) {
        let _ = writeln!(
            err,
            "error: cannot write standard output: {}",
            files::io_reason(&e)
        );
        return 2;
    }
    if changed && args.check { 1 } else { 0 }
}

/// A unified diff (three lines of context) from `old` to `new`, both headed
/// by `name`, so that `patch -p0` applies it.
fn unified_diff(name: &str, old: &str, new: &str) -> String {
    similar::TextDiff::from_lines(old, new)
        .unified_diff()
        .context_radius(3)
        .header(name, name)
        .to_string()
}

/// Replace the file's content by way of a temporary file in the same folder
/// and a rename, so that a failure never leaves it half-written. A symbolic
/// link is followed: the file it points to is rewritten. The permissions are
/// kept.
fn write_atomically(path: &Path, text: &str) -> Result<(), String> {
    let shown = path.display();
    let target = std::fs::canonicalize(path)
        .map_err(|e| format!("cannot write `{shown}`: {}", files::io_reason(&e)))?;
    let meta = std::fs::metadata(&target)
        .map_err(|e| format!("cannot write `{shown}`: {}", files::io_reason(&e)))?;
    let (Some(dir), Some(file_name)) = (target.parent(), target.file_name()) else {
        return Err(format!("cannot write `{shown}`: not a file"));
    };
    let tmp = dir.join(format!(
        ".{}.plenum-fmt-{}.tmp",
        file_name.to_string_lossy(),
        std::process::id()
    ));
    let result = (|| {
        let _ = std::fs::remove_file(&tmp);
        let mut f = std::fs::OpenOptions::new()
            .write(true)
            .create_new(true)
            .open(&tmp)?;
        f.write_all(text.as_bytes())?;
        f.sync_all()?;
        drop(f);
        std::fs::set_permissions(&tmp, meta.permissions())?;
        std::fs::rename(&tmp, &target)
    })();
    result.map_err(|e| {
        let _ = std::fs::remove_file(&tmp);
        format!("cannot write `{shown}`: {}", files::io_reason(&e))
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    const UNTIDY: &str = "zone a {area 5ft;people 2}\n";
    const TIDY: &str = "zone a {\n  area   5 ft\n  people 2\n}\n";

    struct Run {
        code: Result<u8, String>,
        out: String,
        err: String,
    }

    fn fmt(paths: &[&Path], check: bool, diff: bool, stdin: &str) -> Run {
        let args = FmtArgs {
            paths: paths.iter().map(|p| p.to_path_buf()).collect(),
            check,
            diff,
        };
        let (mut out, mut err) = (Vec::new(), Vec::new());
        let code = run_with(&args, &mut stdin.as_bytes(), &mut out, &mut err);
        Run {
            code,
            out: String::from_utf8(out).unwrap(),
            err: String::from_utf8(err).unwrap(),
        }
    }

    fn project(files: &[(&str, &str)]) -> tempfile::TempDir {
        let dir = tempfile::tempdir().unwrap();
        for (name, text) in files {
            let path = dir.path().join(name);
            std::fs::create_dir_all(path.parent().unwrap()).unwrap();
            std::fs::write(path, text).unwrap();
        }
        dir
    }

    fn read(dir: &tempfile::TempDir, name: &str) -> String {
        std::fs::read_to_string(dir.path().join(name)).unwrap()
    }

    #[test]
    fn rewrites_files_in_place_and_honours_gitignore() {
        let dir = project(&[
            ("a.plenum", UNTIDY),
            ("sub/b.plenum", TIDY),
            ("ignored/c.plenum", UNTIDY),
            (".gitignore", "ignored/\n"),
            ("notes.txt", UNTIDY),
        ]);
        let r = fmt(&[dir.path()], false, false, "");
        assert_eq!(r.code, Ok(0), "{}", r.err);
        assert_eq!(read(&dir, "a.plenum"), TIDY);
        assert_eq!(read(&dir, "sub/b.plenum"), TIDY);
        assert_eq!(read(&dir, "ignored/c.plenum"), UNTIDY);
        assert_eq!(read(&dir, "notes.txt"), UNTIDY);
        assert!(r.out.is_empty());
        assert!(r.err.contains("reformatted 1 file of 2"), "{}", r.err);
        // No temporary file is left behind.
        let left: Vec<_> = std::fs::read_dir(dir.path())
            .unwrap()
            .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
            .filter(|n| n.contains("plenum-fmt"))
            .collect();
        assert!(left.is_empty(), "{left:?}");
    }

    #[test]
    fn check_lists_the_files_that_would_change_and_changes_nothing() {
        let dir = project(&[("a.plenum", UNTIDY), ("b.plenum", TIDY)]);
        let r = fmt(&[dir.path()], true, false, "");
        assert_eq!(r.code, Ok(1));
        let a = dir.path().join("a.plenum");
        assert_eq!(r.out, format!("{}\n", a.display()));
        assert!(
            r.err.contains("1 file of 2 would be reformatted"),
            "{}",
            r.err
        );
        assert_eq!(read(&dir, "a.plenum"), UNTIDY);
        let r = fmt(&[&dir.path().join("b.plenum")], true, false, "");
        assert_eq!(r.code, Ok(0));
        assert!(r.out.is_empty());
    }

    #[test]
    fn diff_prints_a_unified_diff_and_changes_nothing() {
        let dir = project(&[("a.plenum", UNTIDY)]);
        let a = dir.path().join("a.plenum");
        let r = fmt(&[&a], false, true, "");
        assert_eq!(r.code, Ok(0));
        let name = a.display().to_string();
        assert!(
            r.out.starts_with(&format!("--- {name}\n+++ {name}\n@@ ")),
            "{}",
            r.out
        );
        assert!(
            r.out.contains("\n-zone a {area 5ft;people 2}\n"),
            "{}",
            r.out
        );
        assert!(r.out.contains("\n+  area   5 ft\n"), "{}", r.out);
        assert_eq!(read(&dir, "a.plenum"), UNTIDY);
        let r = fmt(&[&a], true, true, "");
        assert_eq!(r.code, Ok(1));
        assert!(r.out.starts_with("--- "));
    }

    #[test]
    fn a_file_with_syntax_errors_is_reported_and_left_alone() {
        let broken = "zone a {\n  area 5 ft 12\n";
        let dir = project(&[("a.plenum", UNTIDY), ("bad.plenum", broken)]);
        let r = fmt(&[dir.path()], false, false, "");
        assert_eq!(r.code, Ok(1));
        let bad = dir.path().join("bad.plenum");
        assert!(
            r.err.contains(&format!(
                "error: `{}` has 2 syntax errors (the first at line 2, column 13:",
                bad.display()
            )),
            "{}",
            r.err
        );
        assert!(r.err.contains("not formatted"), "{}", r.err);
        assert_eq!(read(&dir, "bad.plenum"), broken);
        // The other file is still formatted.
        assert_eq!(read(&dir, "a.plenum"), TIDY);
        assert!(r.err.contains("1 file not formatted"), "{}", r.err);
    }

    #[test]
    fn a_file_that_is_not_utf8_is_not_formatted() {
        let dir = tempfile::tempdir().unwrap();
        let path = dir.path().join("x.plenum");
        std::fs::write(&path, b"zone a {}\n\xff\n").unwrap();
        let r = fmt(&[&path], false, false, "");
        assert_eq!(r.code, Ok(1));
        assert!(r.err.contains("not valid UTF-8"), "{}", r.err);
        assert_eq!(std::fs::read(&path).unwrap(), b"zone a {}\n\xff\n");
    }

    #[test]
    fn stdin_is_formatted_to_stdout() {
        let r = fmt(&[Path::new("-")], false, false, UNTIDY);
        assert_eq!(r.code, Ok(0));
        assert_eq!(r.out, TIDY);
        let r = fmt(&[Path::new("-")], true, false, UNTIDY);
        assert_eq!((r.code, r.out.as_str()), (Ok(1), "<stdin>\n"));
        let r = fmt(&[Path::new("-")], true, false, TIDY);
        assert_eq!((r.code, r.out.as_str()), (Ok(0), ""));
        let r = fmt(&[Path::new("-")], false, true, UNTIDY);
        assert!(r.out.starts_with("--- <stdin>\n+++ <stdin>\n"), "{}", r.out);
        let r = fmt(&[Path::new("-")], false, false, "zone a {");
        assert_eq!(r.code, Ok(1));
        assert!(r.out.is_empty());
        assert!(r.err.contains("`<stdin>` has 1 syntax error"), "{}", r.err);
    }

    #[test]
    fn usage_errors_are_errors() {
        let dir = project(&[("a.plenum", TIDY)]);
        let r = fmt(
            &[Path::new("-"), &dir.path().join("a.plenum")],
            false,
            false,
            "",
        );
        assert!(r.code.is_err());
        let r = fmt(&[&dir.path().join("missing.plenum")], false, false, "");
        assert!(r.code.unwrap_err().contains("no such file or folder"));
    }

    #[test]
    fn crlf_files_stay_crlf() {
        let dir = project(&[("w.plenum", "zone a {\r\narea 5ft\r\n}\r\n")]);
        let r = fmt(&[dir.path()], false, false, "");
        assert_eq!(r.code, Ok(0));
        assert_eq!(read(&dir, "w.plenum"), "zone a {\r\n  area 5 ft\r\n}\r\n");
    }

    #[test]
    fn a_folder_without_design_files_is_fine() {
        let dir = project(&[("readme.txt", "x")]);
        let r = fmt(&[dir.path()], true, false, "");
        assert_eq!(r.code, Ok(0));
        assert!(r.err.contains("no design files"), "{}", r.err);
    }
}
