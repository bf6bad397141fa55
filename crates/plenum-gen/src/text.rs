//! Writing design text directly in the canonical layout of `plenum-fmt`:
//! two-space indents, the values of a block's properties aligned one space
//! after its longest key, trailing comments of a block's one-line properties
//! in one column two spaces after the longest commented line, and one blank
//! line around every top-level block.

/// A number as a person writes it: at most `decimals` decimals, trailing
/// zeros dropped, `_` between the thousands of an integer part of four digits
/// or more (`1_250 ft`, as the examples do).
pub fn num(v: f64, decimals: usize) -> String {
    let s = format!("{:.*}", decimals, v);
    let s = if s.contains('.') {
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        s
    };
    let s = if s == "-0" { "0".to_string() } else { s };
    let (sign, rest) = match s.strip_prefix('-') {
        Some(r) => ("-", r),
        None => ("", s.as_str()),
    };
    let (int, frac) = match rest.split_once('.') {
        Some((i, f)) => (i, Some(f)),
        None => (rest, None),
    };
    let mut grouped = String::new();
    if int.len() >= 4 {
        for (i, c) in int.chars().enumerate() {
            if i > 0 && (int.len() - i) % 3 == 0 {
                grouped.push('_');
            }
            grouped.push(c);
        }
    } else {
        grouped.push_str(int);
    }
    match frac {
        Some(f) => format!("{sign}{grouped}.{f}"),
        None => format!("{sign}{grouped}"),
    }
}

/// A quantity: a number, one space, a unit.
pub fn q(v: f64, decimals: usize, unit: &str) -> String {
    format!("{} {unit}", num(v, decimals))
}

/// One line of a block body.
#[derive(Clone, Debug)]
pub enum Line {
    /// `key value  # comment`
    Prop {
        key: &'static str,
        value: String,
        comment: Option<String>,
    },
    /// A comment on a line of its own.
    Comment(String),
    /// A nested block.
    Block(BlockText),
}

/// A block to be written: its header (`zone a "A" like b`), an optional note
/// after the `{`, and its lines.
#[derive(Clone, Debug, Default)]
pub struct BlockText {
    pub header: String,
    pub note: Option<String>,
    pub lines: Vec<Line>,
}

impl BlockText {
    pub fn new(header: impl Into<String>) -> BlockText {
        BlockText {
            header: header.into(),
            note: None,
            lines: Vec::new(),
        }
    }

    pub fn prop(&mut self, key: &'static str, value: impl Into<String>) {
        self.lines.push(Line::Prop {
            key,
            value: value.into(),
            comment: None,
        });
    }

    pub fn prop_note(&mut self, key: &'static str, value: impl Into<String>, note: Option<String>) {
        self.lines.push(Line::Prop {
            key,
            value: value.into(),
            comment: note,
        });
    }

    /// Write the block at `depth` levels of indent, ending with a line break.
    pub fn write(&self, out: &mut String, depth: usize) {
        let indent = "  ".repeat(depth);
        let inner = "  ".repeat(depth + 1);
        out.push_str(&indent);
        out.push_str(&self.header);
        if self.lines.is_empty() && self.note.is_none() {
            out.push_str(" {}\n");
            return;
        }
        out.push_str(" {");
        if let Some(n) = &self.note {
            out.push_str("  # ");
            out.push_str(n);
        }
        out.push('\n');
        let width = self
            .lines
            .iter()
            .filter_map(|l| match l {
                Line::Prop { key, .. } => Some(key.len()),
                _ => None,
            })
            .max()
            .unwrap_or(0);
        let text_of = |key: &str, value: &str| format!("{inner}{key:<width$} {value}");
        let comment_col = self
            .lines
            .iter()
            .filter_map(|l| match l {
                Line::Prop {
                    key,
                    value,
                    comment: Some(_),
                } => Some(text_of(key, value).chars().count()),
                _ => None,
            })
            .max()
            .map_or(0, |w| w + 2);
        for l in &self.lines {
            match l {
                Line::Prop {
                    key,
                    value,
                    comment,
                } => {
                    let t = text_of(key, value);
                    out.push_str(&t);
                    if let Some(c) = comment {
                        let pad = comment_col - t.chars().count();
                        out.extend(std::iter::repeat_n(' ', pad));
                        out.push_str("# ");
                        out.push_str(c);
                    }
                    out.push('\n');
                }
                Line::Comment(c) => {
                    out.push_str(&inner);
                    out.push_str("# ");
                    out.push_str(c);
                    out.push('\n');
                }
                Line::Block(b) => b.write(out, depth + 1),
            }
        }
        out.push_str(&indent);
        out.push_str("}\n");
    }
}

/// What was written last at the top level.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
enum Prev {
    #[default]
    Nothing,
    Block,
    Line,
    /// Own-line comments that belong to the item after them.
    AttachedComment,
    /// Own-line comments set off from what follows by a blank line.
    Comment,
}

/// A file being written: items at the top level, each block set off by one
/// blank line, comment paragraphs either attached to the next item or set
/// off by a blank line.
#[derive(Debug, Default)]
pub struct FileText {
    pub text: String,
    prev: Prev,
}

impl FileText {
    pub fn new() -> FileText {
        FileText::default()
    }

    /// Own-line comments; `attached` keeps them directly above the next item.
    pub fn comments<S: AsRef<str>>(&mut self, lines: &[S], attached: bool) {
        if self.prev != Prev::Nothing {
            self.text.push('\n');
        }
        for l in lines {
            self.text.push_str("# ");
            self.text.push_str(l.as_ref());
            self.text.push('\n');
        }
        self.prev = if attached {
            Prev::AttachedComment
        } else {
            Prev::Comment
        };
    }

    /// A top-level line that is not a block (`use`, `let`).
    pub fn line(&mut self, line: &str) {
        if matches!(self.prev, Prev::Block | Prev::Comment) {
            self.text.push('\n');
        }
        self.text.push_str(line);
        self.text.push('\n');
        self.prev = Prev::Line;
    }

    /// A top-level block.
    pub fn block(&mut self, b: &BlockText) {
        if matches!(self.prev, Prev::Block | Prev::Line | Prev::Comment) {
            self.text.push('\n');
        }
        b.write(&mut self.text, 0);
        self.prev = Prev::Block;
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn numbers_are_written_as_people_write_them() {
        assert_eq!(num(1250.0, 0), "1_250");
        assert_eq!(num(950.0, 0), "950");
        assert_eq!(num(19.50, 1), "19.5");
        assert_eq!(num(19.04, 1), "19");
        assert_eq!(num(125_000.25, 2), "125_000.25");
        assert_eq!(num(-0.001, 1), "0");
        assert_eq!(num(0.0626, 3), "0.063");
    }

    #[test]
    fn a_block_is_aligned_and_its_comments_share_a_column() {
        let mut b = BlockText::new("zone a \"A\"");
        b.prop("area", "900 ft²");
        b.prop_note("sensible", "19.5 kBtu/h", Some("west glass".into()));
        b.prop_note("people", "29", Some("two classes".into()));
        let mut fan = BlockText::new("fan");
        fan.prop("power", "5 hp");
        b.lines.push(Line::Block(fan));
        let mut out = String::new();
        b.write(&mut out, 0);
        assert_eq!(
            out,
            "zone a \"A\" {\n  area     900 ft²\n  sensible 19.5 kBtu/h  # west glass\n  people   29           # two classes\n  fan {\n    power 5 hp\n  }\n}\n"
        );
        let mut e = String::new();
        BlockText::new("zone b like a").write(&mut e, 0);
        assert_eq!(e, "zone b like a {}\n");
    }
}
