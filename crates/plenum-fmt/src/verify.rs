//! A span-free rendering of a parsed file, to prove that the formatter's
//! output means what its input meant.
//!
//! It records everything the parser keeps except where things are: the kind,
//! name, label and parent of every block, the key of every property and the
//! whole shape of every value, with numbers, units, names and strings exactly
//! as written (so `1_250` and `1250`, or `ft2` and `ft²`, differ here).

use std::fmt::Write;

use plenum_syntax::{Block, Element, Elements, Entry, Expr, Item, SourceFile, Span, Value};

pub(crate) fn dump(src: &str, file: &SourceFile) -> String {
    let mut d = Dump {
        src,
        out: String::new(),
    };
    for item in &file.items {
        match item {
            Item::Use(u) => d.line(0, &format!("use {}", u.path.span.text(src))),
            Item::Let(l) => {
                let v = d.value(&l.value);
                d.line(0, &format!("let {} = {v}", l.name.text(src)));
            }
            Item::Block(b) => d.block(b, 0),
            Item::Error(s) => d.line(0, &format!("error {:?}", s.text(src))),
        }
    }
    d.out
}

/// The comments of a file, in order, as the formatter prints them.
pub(crate) fn comment_texts<'a>(src: &'a str, comments: &[Span]) -> Vec<&'a str> {
    comments.iter().map(|c| c.text(src).trim_end()).collect()
}

struct Dump<'a> {
    src: &'a str,
    out: String,
}

impl Dump<'_> {
    fn line(&mut self, depth: usize, text: &str) {
        let _ = writeln!(self.out, "{:depth$}{text}", "", depth = depth * 2);
    }

    fn block(&mut self, b: &Block, depth: usize) {
        let src = self.src;
        let mut head = format!("block {}", b.kind.text(src));
        if let Some(n) = b.name {
            let _ = write!(head, " name={}", n.text(src));
        }
        if let Some(l) = &b.label {
            let _ = write!(head, " label={}", l.span.text(src));
        }
        if let Some(l) = &b.like {
            let _ = write!(head, " like={}", l.name.text(src));
        }
        self.line(depth, &head);
        for e in &b.body.entries {
            match e {
                Entry::Property(p) => {
                    let v = self.value(&p.value);
                    self.line(depth + 1, &format!("prop {} = {v}", p.key.text(src)));
                }
                Entry::Block(inner) => self.block(inner, depth + 1),
                Entry::Error(s) => self.line(depth + 1, &format!("error {:?}", s.text(src))),
            }
        }
        self.line(depth, "end");
    }

    fn value(&self, v: &Value) -> String {
        let mut s = self.elements(&v.elements);
        for w in &v.with {
            let _ = write!(
                s,
                " with {} {}",
                w.key.text(self.src),
                self.elements(&w.value.elements)
            );
        }
        s
    }

    fn elements(&self, e: &Elements) -> String {
        let parts: Vec<String> = e.iter().map(|e| self.element(e)).collect();
        format!("[{}]", parts.join(" | "))
    }

    fn element(&self, e: &Element) -> String {
        let mut s = self.expr(&e.expr);
        if let Some(q) = e.qualifier {
            let _ = write!(s, " q={}", q.text(self.src));
        }
        if let Some(r) = &e.range_end {
            let _ = write!(s, " to {}", self.expr(&r.expr));
            if let Some(q) = r.qualifier {
                let _ = write!(s, " q={}", q.text(self.src));
            }
        }
        s
    }

    /// Prefix notation; operator chains and signs are walked in loops, so a
    /// long chain cannot exhaust the stack.
    fn expr(&self, e: &Expr) -> String {
        let src = self.src;
        let mut spine = Vec::new();
        let mut left = e;
        while let Expr::Binary(b) = left {
            spine.push(&**b);
            left = &b.lhs;
        }
        let mut s = self.operand(left);
        for b in spine.iter().rev() {
            s = format!("({} {s} {})", b.op_span.text(src), self.expr(&b.rhs));
        }
        s
    }

    fn operand(&self, e: &Expr) -> String {
        let src = self.src;
        let mut signs = String::new();
        let mut e = e;
        while let Expr::Unary(u) = e {
            signs.push_str(u.op_span.text(src));
            e = &u.operand;
        }
        let core = match e {
            Expr::Number(n) => match n.unit {
                Some(u) => format!("{}<{}>[{}]", n.digits.text(src), n.value, u.text(src)),
                None => format!("{}<{}>", n.digits.text(src), n.value),
            },
            Expr::Name(n) => format!("name:{}", n.text(src)),
            Expr::None(_) => "none".to_string(),
            Expr::Paren(p) => format!("paren({})", self.expr(&p.inner)),
            Expr::Binary(_) | Expr::Unary(_) => self.expr(e),
        };
        if signs.is_empty() {
            core
        } else {
            format!("sign{signs}({core})")
        }
    }
}
