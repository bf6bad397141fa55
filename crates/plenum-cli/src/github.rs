//! GitHub Actions workflow commands: one annotation per diagnostic.
//!
//! `::error file=F,line=L,col=C,endLine=EL,endColumn=EC,title=T::MESSAGE`,
//! with `::warning` for warnings and `::notice` for infos. Escaping follows
//! the runner's rules (actions/toolkit, `command.ts`): in the message `%`,
//! `\r` and `\n` become `%25`, `%0D` and `%0A`; in a property value `:` and
//! `,` also become `%3A` and `%2C`.

use plenum_checks::{Project, Severity};

use crate::render::{display_path, positions};

/// Escape the message of a workflow command.
pub fn escape_data(s: &str) -> String {
    s.replace('%', "%25")
        .replace('\r', "%0D")
        .replace('\n', "%0A")
}

/// Escape a property value of a workflow command.
pub fn escape_property(s: &str) -> String {
    escape_data(s).replace(':', "%3A").replace(',', "%2C")
}

/// The command word of a severity.
pub fn command(s: Severity) -> &'static str {
    match s {
        Severity::Error => "error",
        Severity::Warning => "warning",
        Severity::Info => "notice",
    }
}

/// One annotation line per diagnostic.
pub fn annotations(project: &Project) -> String {
    let mut out = String::new();
    for (f, d) in project.diagnostics() {
        let (line, col, end_line, end_col) = positions(&f.lines, d.loc.span);
        let mut message = d.message.clone();
        if let Some(h) = &d.help {
            message.push_str("\nhelp: ");
            message.push_str(h);
        }
        out.push_str(&format!(
            "::{} file={},line={line},col={col},endLine={end_line},endColumn={end_col},title={}::{}\n",
            command(d.severity),
            escape_property(&display_path(&f.path)),
            escape_property(&format!("plenum {}", d.code)),
            escape_data(&message)
        ));
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn escapes_per_the_runner_rules() {
        assert_eq!(escape_data("50 % RH\r\nnext"), "50 %25 RH%0D%0Anext");
        assert_eq!(escape_property("a:b,c%"), "a%3Ab%2Cc%25");
        // `:` and `,` stay in a message.
        assert_eq!(escape_data("a: b, c"), "a: b, c");
    }
}
