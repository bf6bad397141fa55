//! Test support: a span-free picture of a parsed file (written apart from the
//! formatter's own self-check, so the two can catch each other), and a
//! generator of valid, untidy design files.

#![allow(dead_code)]
#![allow(clippy::unwrap_used)] // test helpers: a failure is the test failing

use plenum_syntax::{Block, Element, Entry, Expr, Item, UnaryOp, Value};
use proptest::prelude::*;

// ---------------------------------------------------------------------------
// What a file means, without positions.

#[derive(Debug, PartialEq)]
pub enum Node {
    Use(String),
    Let(String, Val),
    Block {
        kind: String,
        name: Option<String>,
        label: Option<String>,
        like: Option<String>,
        body: Vec<Node>,
    },
    Prop(String, Val),
}

#[derive(Debug, PartialEq)]
pub struct Val {
    pub elements: Vec<El>,
    pub with: Vec<(String, Vec<El>)>,
}

#[derive(Debug, PartialEq)]
pub struct El {
    pub expr: Ex,
    pub qualifier: Option<String>,
    pub range: Option<(Ex, Option<String>)>,
}

#[derive(Debug, PartialEq)]
pub enum Ex {
    /// Digits as written, the value's bits, the unit as written.
    Num(String, u64, Option<String>),
    Name(String),
    None,
    Paren(Box<Ex>),
    Sign(bool, Box<Ex>),
    /// The operator as written (`*` and `·` are told apart).
    Bin(String, Box<Ex>, Box<Ex>),
}

/// The meaning of `text` (which must parse without errors) and its comments.
pub fn meaning(text: &str) -> (Vec<Node>, Vec<String>) {
    let parsed = plenum_syntax::parse(text);
    assert!(
        parsed.errors.is_empty(),
        "{:?}\n---\n{text}\n---",
        parsed.errors
    );
    let nodes = parsed
        .file
        .items
        .iter()
        .map(|i| match i {
            Item::Use(u) => Node::Use(u.path.span.text(text).to_string()),
            Item::Let(l) => Node::Let(l.name.text(text).to_string(), val(text, &l.value)),
            Item::Block(b) => block(text, b),
            Item::Error(_) => panic!("error node"),
        })
        .collect();
    let comments = parsed
        .comments
        .iter()
        .map(|c| c.text(text).trim_end().to_string())
        .collect();
    (nodes, comments)
}

fn block(src: &str, b: &Block) -> Node {
    Node::Block {
        kind: b.kind.text(src).to_string(),
        name: b.name.map(|n| n.text(src).to_string()),
        label: b.label.as_ref().map(|l| l.span.text(src).to_string()),
        like: b.like.as_ref().map(|l| l.name.text(src).to_string()),
        body: b
            .body
            .entries
            .iter()
            .map(|e| match e {
                Entry::Property(p) => Node::Prop(p.key.text(src).to_string(), val(src, &p.value)),
                Entry::Block(inner) => block(src, inner),
                Entry::Error(_) => panic!("error node"),
            })
            .collect(),
    }
}

fn val(src: &str, v: &Value) -> Val {
    Val {
        elements: v.elements.iter().map(|e| el(src, e)).collect(),
        with: v
            .with
            .iter()
            .map(|w| {
                (
                    w.key.text(src).to_string(),
                    w.value.elements.iter().map(|e| el(src, e)).collect(),
                )
            })
            .collect(),
    }
}

fn el(src: &str, e: &Element) -> El {
    El {
        expr: ex(src, &e.expr),
        qualifier: e.qualifier.map(|q| q.text(src).to_string()),
        range: e.range_end.as_ref().map(|r| {
            (
                ex(src, &r.expr),
                r.qualifier.map(|q| q.text(src).to_string()),
            )
        }),
    }
}

fn ex(src: &str, e: &Expr) -> Ex {
    match e {
        Expr::Number(n) => Ex::Num(
            n.digits.text(src).to_string(),
            n.value.to_bits(),
            n.unit.map(|u| u.text(src).to_string()),
        ),
        Expr::Name(n) => Ex::Name(n.text(src).to_string()),
        Expr::None(_) => Ex::None,
        Expr::Paren(p) => Ex::Paren(Box::new(ex(src, &p.inner))),
        Expr::Unary(u) => Ex::Sign(u.op == UnaryOp::Neg, Box::new(ex(src, &u.operand))),
        Expr::Binary(b) => Ex::Bin(
            b.op_span.text(src).to_string(),
            Box::new(ex(src, &b.lhs)),
            Box::new(ex(src, &b.rhs)),
        ),
    }
}

// ---------------------------------------------------------------------------
// Generated designs: a structure from proptest, laid out untidily from a seed.

/// A small deterministic random source for layout choices.
pub struct Rng(u64);

impl Rng {
    pub fn new(seed: u64) -> Rng {
        Rng(seed)
    }

    /// SplitMix64.
    pub fn next(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        z ^ (z >> 31)
    }

    /// True with probability `p` percent.
    pub fn chance(&mut self, p: u64) -> bool {
        self.next() % 100 < p
    }

    pub fn pick<'a>(&mut self, xs: &[&'a str]) -> &'a str {
        xs[(self.next() % xs.len() as u64) as usize]
    }

    /// Some horizontal space (never empty).
    pub fn ws(&mut self) -> &'static str {
        self.pick(&[" ", " ", " ", "  ", "\t", "   "])
    }

    /// Space or nothing.
    pub fn ws0(&mut self) -> &'static str {
        if self.chance(50) { "" } else { self.ws() }
    }

    pub fn indent(&mut self) -> String {
        self.pick(&["", "  ", "    ", "\t", " ", "      "])
            .to_string()
    }

    pub fn comment(&mut self) -> String {
        let body = self.pick(&[
            "# note",
            "#tight",
            "# design state, per ASHRAE",
            "# {not a block}; not an item",
            "# trailing spaces   ",
            "# °F and ft² in a comment",
            "#",
            "## double",
            "# \"quoted\"",
        ]);
        body.to_string()
    }
}

#[derive(Clone, Debug)]
pub enum GItem {
    Use(&'static str),
    Let(&'static str, GValue),
    Block(GBlock),
}

#[derive(Clone, Debug)]
pub struct GBlock {
    pub kind: &'static str,
    pub name: Option<&'static str>,
    pub label: Option<&'static str>,
    pub like: Option<&'static str>,
    pub entries: Vec<GEntry>,
}

#[derive(Clone, Debug)]
pub enum GEntry {
    Prop(&'static str, GValue),
    Block(GBlock),
}

#[derive(Clone, Debug)]
pub struct GValue {
    pub elements: Vec<GElement>,
    pub with: Option<(&'static str, Vec<GElement>)>,
}

#[derive(Clone, Debug)]
pub struct GElement {
    pub expr: GExpr,
    pub qualifier: Option<&'static str>,
    pub range: Option<(GExpr, Option<&'static str>)>,
}

#[derive(Clone, Debug)]
pub enum GExpr {
    Num(&'static str, Option<&'static str>),
    Name(&'static str),
    None,
    Paren(Box<GExpr>),
    Sign(&'static str, Box<GExpr>),
    Bin(Box<GExpr>, &'static str, Box<GExpr>),
}

const DIGITS: &[&str] = &[
    "0",
    "4",
    "40",
    "1250",
    "1_250",
    "38.5",
    "1.2e3",
    ".5",
    "12_000.25",
    "3E-2",
    "0.0098",
];
const UNITS: &[&str] = &[
    "ft",
    "ft²",
    "ft2",
    "ft^2",
    "kBtu/h",
    "Btu/h",
    "°F",
    "degF",
    "°C",
    "K",
    "%",
    "%rh",
    "cfm",
    "L/s",
    "in.wg",
    "hp",
    "ton",
    "W/ft²",
    "cfm/person",
    "MBH",
    "gpm",
    "Btu/(h·ft²)",
    "lb/lb",
    "gr/lb",
    "kW",
];
const NAMES: &[&str] = &[
    "reading",
    "stacks",
    "zone_1",
    "a-b",
    "ventilation",
    "x",
    "_tmp",
    "in_airstream",
    "ip",
];
const KEYS: &[&str] = &[
    "area",
    "people",
    "use",
    "indoor",
    "sensible",
    "latent",
    "serves",
    "supply_temp",
    "motor_efficiency",
    "rated_sensible",
    "k",
];
const KINDS: &[&str] = &["zone", "ahu", "site", "project", "fan", "coil"];
const LABELS: &[&str] = &[
    "\"Reading room\"",
    "\"Children's corner\"",
    "\"a \\\"quoted\\\" one\"",
    "\"back\\\\slash\"",
    "\"°F ünïcode — dash\"",
    "\"\"",
];
const QUALIFIERS: &[&str] = &["db", "wb", "dp"];

fn one_of(xs: &'static [&'static str]) -> impl Strategy<Value = &'static str> + Clone {
    proptest::sample::select(xs)
}

fn expr_strategy() -> impl Strategy<Value = GExpr> {
    let leaf = prop_oneof![
        4 => (one_of(DIGITS), proptest::option::of(one_of(UNITS))).prop_map(|(d, u)| GExpr::Num(d, u)),
        2 => one_of(NAMES).prop_map(GExpr::Name),
        1 => Just(GExpr::None),
    ];
    leaf.prop_recursive(3, 12, 2, |inner| {
        prop_oneof![
            1 => inner.clone().prop_map(|e| GExpr::Paren(Box::new(e))),
            1 => (one_of(&["-", "+"]), inner.clone()).prop_map(|(s, e)| GExpr::Sign(s, Box::new(e))),
            3 => (inner.clone(), one_of(&["+", "-", "*", "/", "·"]), inner)
                .prop_map(|(a, op, b)| GExpr::Bin(Box::new(a), op, Box::new(b))),
        ]
    })
}

fn element_strategy() -> impl Strategy<Value = GElement> {
    (
        expr_strategy(),
        proptest::option::weighted(0.2, one_of(QUALIFIERS)),
        proptest::option::weighted(
            0.15,
            (
                expr_strategy(),
                proptest::option::weighted(0.3, one_of(QUALIFIERS)),
            ),
        ),
    )
        .prop_map(|(expr, qualifier, range)| GElement {
            expr,
            qualifier,
            range,
        })
}

fn value_strategy() -> BoxedStrategy<GValue> {
    (
        proptest::collection::vec(element_strategy(), 1..4),
        proptest::option::weighted(
            0.1,
            (
                one_of(KEYS),
                proptest::collection::vec(element_strategy(), 1..3),
            ),
        ),
    )
        .prop_map(|(elements, with)| GValue { elements, with })
        .boxed()
}

fn block_strategy() -> impl Strategy<Value = GBlock> {
    let header = (
        one_of(KINDS),
        proptest::option::weighted(0.7, one_of(NAMES)),
        proptest::option::weighted(0.4, one_of(LABELS)),
        proptest::option::weighted(0.2, one_of(NAMES)),
    );
    let props = proptest::collection::vec(
        (one_of(KEYS), value_strategy()).prop_map(|(k, v)| GEntry::Prop(k, v)),
        0..6,
    );
    let leaf =
        (header.clone(), props.clone()).prop_map(|((kind, name, label, like), entries)| GBlock {
            kind,
            name,
            label,
            like,
            entries,
        });
    leaf.prop_recursive(2, 8, 3, move |inner| {
        (
            header.clone(),
            props.clone(),
            proptest::collection::vec(inner, 0..3),
            any::<u64>(),
        )
            .prop_map(|((kind, name, label, like), mut entries, blocks, seed)| {
                // Put the nested blocks among the properties.
                let mut rng = Rng::new(seed);
                for b in blocks {
                    let at = (rng.next() % (entries.len() as u64 + 1)) as usize;
                    entries.insert(at, GEntry::Block(b));
                }
                GBlock {
                    kind,
                    name,
                    label,
                    like,
                    entries,
                }
            })
    })
}

pub fn design_strategy() -> impl Strategy<Value = (Vec<GItem>, u64)> {
    let item = prop_oneof![
        1 => one_of(&["\"shared/site.plenum\"", "\"a b/c.plenum\""]).prop_map(GItem::Use),
        2 => (one_of(NAMES), value_strategy()).prop_map(|(n, v)| GItem::Let(n, v)),
        5 => block_strategy().prop_map(GItem::Block),
    ];
    (proptest::collection::vec(item, 0..6), any::<u64>())
}

/// Lays a generated design out as text, untidily but validly.
pub struct Writer {
    pub rng: Rng,
    pub out: String,
    /// Probability (percent) of each kind of comment.
    pub comments: u64,
}

impl Writer {
    pub fn new(seed: u64) -> Writer {
        let mut rng = Rng::new(seed);
        let comments = rng.pick(&["0", "10", "30"]).parse().unwrap_or(0);
        Writer {
            rng,
            out: String::new(),
            comments,
        }
    }

    fn push(&mut self, s: &str) {
        self.out.push_str(s);
    }

    fn ws(&mut self) {
        let s = self.rng.ws();
        self.push(s);
    }

    fn ws0(&mut self) {
        let s = self.rng.ws0();
        self.push(s);
    }

    /// A line break, maybe with blank lines and own-line comments, then an
    /// indent.
    fn breaks(&mut self) {
        self.push("\n");
        let n = self.rng.next() % 4;
        for _ in 0..n {
            if self.rng.chance(self.comments * 2) {
                let i = self.rng.indent();
                let c = self.rng.comment();
                self.push(&format!("{i}{c}\n"));
            } else if self.rng.chance(50) {
                self.push("\n");
            } else {
                let ws = self.rng.ws();
                self.push(&format!("{ws}\n"));
            }
        }
        let i = self.rng.indent();
        self.push(&i);
    }

    /// A break inside a value (after a comma or an operator), where the
    /// parser drops line breaks: maybe a comment, then a line break.
    fn inner_break(&mut self) {
        if self.rng.chance(self.comments) {
            self.ws();
            let c = self.rng.comment();
            self.push(&c);
            self.breaks();
        } else if self.rng.chance(10) {
            self.breaks();
        } else {
            self.ws0();
        }
    }

    /// Text of `e`; `glue_ok` says whether the previous character lets an
    /// operator follow without a space.
    fn expr(&mut self, e: &GExpr) {
        match e {
            GExpr::Num(d, u) => {
                self.push(d);
                if let Some(u) = u {
                    if self.rng.chance(30) {
                    } else {
                        self.ws();
                    }
                    self.push(u);
                }
            }
            GExpr::Name(n) => self.push(n),
            GExpr::None => self.push("none"),
            GExpr::Paren(inner) => {
                self.push("(");
                self.ws0();
                self.expr(inner);
                // A unit or a name must not touch `)`? It may: `)` ends both.
                self.ws0();
                self.push(")");
            }
            GExpr::Sign(s, inner) => {
                self.push(s);
                self.ws0();
                // A sign applies to an atom: parenthesise anything else.
                if matches!(**inner, GExpr::Bin(..) | GExpr::Sign(..)) {
                    self.push("(");
                    self.expr(inner);
                    self.push(")");
                } else {
                    self.expr(inner);
                }
            }
            GExpr::Bin(a, op, b) => {
                self.expr(a);
                // An operator may touch its left operand only after a bare
                // number or a `)`: after a name it would join the name
                // (`a-b` is one name), after a unit the unit.
                let glue_left =
                    matches!(**a, GExpr::Num(_, None) | GExpr::Paren(_)) && self.rng.chance(40);
                if !glue_left {
                    self.ws();
                }
                self.push(op);
                self.inner_break();
                self.expr(b);
            }
        }
    }

    fn element(&mut self, e: &GElement) {
        self.expr(&e.expr);
        if let Some(q) = e.qualifier {
            self.ws();
            self.push(q);
        }
        if let Some((end, q)) = &e.range {
            self.ws();
            self.push("to");
            self.ws();
            self.expr(end);
            if let Some(q) = q {
                self.ws();
                self.push(q);
            }
        }
    }

    fn elements(&mut self, els: &[GElement]) {
        for (i, e) in els.iter().enumerate() {
            if i > 0 {
                self.ws0();
                self.push(",");
                self.inner_break();
            }
            self.element(e);
        }
    }

    fn value(&mut self, v: &GValue) {
        self.elements(&v.elements);
        if let Some((k, els)) = &v.with {
            self.ws();
            self.push("with");
            self.ws();
            self.push(k);
            self.ws();
            self.elements(els);
        }
    }

    /// A trailing comment, maybe; true when one was written (the item must
    /// then end with a line break).
    fn trailing(&mut self) -> bool {
        if self.rng.chance(self.comments) {
            self.ws();
            let c = self.rng.comment();
            self.push(&c);
            true
        } else {
            false
        }
    }

    fn block(&mut self, b: &GBlock) {
        self.push(b.kind);
        if let Some(n) = b.name {
            self.ws();
            self.push(n);
        }
        if let Some(l) = b.label {
            self.ws();
            self.push(l);
        }
        if let Some(l) = b.like {
            self.ws();
            self.push("like");
            self.inner_break_or_space();
            self.push(l);
        }
        self.ws0();
        self.push("{");
        let one_line = b.entries.len() < 4 && self.rng.chance(25);
        if one_line {
            // `{ a 1; b 2 }`: no comments inside.
            for (i, e) in b.entries.iter().enumerate() {
                if i > 0 {
                    self.ws0();
                    self.push(";");
                }
                self.ws();
                match e {
                    GEntry::Prop(k, v) => {
                        self.push(k);
                        self.ws();
                        let saved = self.comments;
                        self.comments = 0;
                        self.value(v);
                        self.comments = saved;
                    }
                    GEntry::Block(inner) => {
                        let saved = self.comments;
                        self.comments = 0;
                        self.block(inner);
                        self.comments = saved;
                    }
                }
            }
            self.ws();
            self.push("}");
            return;
        }
        let mut must_break = self.trailing();
        for e in &b.entries {
            if must_break || self.rng.chance(85) {
                self.breaks();
            } else {
                self.ws0();
                self.push(";");
                self.ws0();
            }
            match e {
                GEntry::Prop(k, v) => {
                    self.push(k);
                    self.ws();
                    self.value(v);
                }
                GEntry::Block(inner) => self.block(inner),
            }
            must_break = self.trailing();
        }
        if must_break || self.rng.chance(80) {
            self.breaks();
        } else {
            self.ws();
        }
        self.push("}");
    }

    fn inner_break_or_space(&mut self) {
        if self.rng.chance(self.comments) {
            self.ws();
            let c = self.rng.comment();
            self.push(&c);
            self.breaks();
        } else {
            self.ws();
        }
    }

    pub fn file(mut self, items: &[GItem]) -> String {
        if self.rng.chance(self.comments * 2) {
            let c = self.rng.comment();
            self.push(&c);
            self.push("\n");
        }
        let mut must_break = false;
        for (i, item) in items.iter().enumerate() {
            if i > 0 || self.rng.chance(30) {
                if !must_break && i > 0 && self.rng.chance(5) {
                    self.push(";");
                    self.ws0();
                } else {
                    self.breaks();
                }
            }
            match item {
                GItem::Use(p) => {
                    self.push("use");
                    self.ws();
                    self.push(p);
                }
                GItem::Let(n, v) => {
                    self.push("let");
                    self.ws();
                    self.push(n);
                    self.ws0();
                    self.push("=");
                    self.inner_break();
                    self.value(v);
                }
                GItem::Block(b) => self.block(b),
            }
            must_break = self.trailing();
        }
        match self.rng.next() % 4 {
            0 => {}
            1 => self.push("\n"),
            2 => self.push("\n\n\n"),
            _ => {
                self.push("\n");
                let c = self.rng.comment();
                self.push(&c);
            }
        }
        let mut text = self.out;
        if self.rng.chance(25) {
            text = text.replace('\n', "\r\n");
        }
        text
    }
}

/// Re-space a valid file at random, keeping every token and comment, whether
/// each gap holds a line break (so the meaning stays) and whether it holds a
/// blank line (which the layout keeps).
pub fn perturb(text: &str, seed: u64) -> String {
    let mut rng = Rng::new(seed);
    let lexed = plenum_syntax::lex(text);
    let mut pieces: Vec<plenum_syntax::Span> = lexed
        .tokens
        .iter()
        .filter(|t| t.kind != plenum_syntax::TokKind::Newline)
        .map(|t| t.span)
        .chain(lexed.comments.iter().copied())
        .collect();
    pieces.sort_by_key(|s| s.start);
    let mut out = String::new();
    let mut at = 0usize;
    for p in pieces {
        let gap = &text[at..p.start as usize];
        let breaks = gap.matches('\n').count();
        if breaks > 0 {
            // One line break stays one; a blank line stays (one or more).
            let n = if breaks == 1 { 1 } else { 2 + rng.next() % 2 };
            for _ in 0..n {
                let ws = rng.ws0();
                out.push_str(ws);
                out.push('\n');
            }
            out.push_str(&rng.indent());
        } else if !gap.is_empty() {
            out.push_str(rng.ws());
        }
        out.push_str(p.text(text));
        at = p.end as usize;
    }
    if rng.chance(50) {
        out.push('\n');
    }
    if rng.chance(30) {
        out = out.replace('\n', "\r\n");
    }
    out
}
