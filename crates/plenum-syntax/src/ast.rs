//! The syntax tree. Every node carries the byte span of the text it came from.
//!
//! The tree is generic over block kinds: the parser knows that a file holds
//! `use`, `let` and blocks, that a block holds properties and nested blocks, and
//! what a value looks like; which blocks and keys exist is the model's business.

use crate::span::Span;

/// A whole design file.
#[derive(Clone, Debug, PartialEq)]
pub struct SourceFile {
    pub items: Vec<Item>,
    pub span: Span,
}

/// A top-level item.
#[derive(Clone, Debug, PartialEq)]
pub enum Item {
    Use(Use),
    Let(Let),
    Block(Block),
    /// Text the parser skipped after a syntax error.
    Error(Span),
}

impl Item {
    pub fn span(&self) -> Span {
        match self {
            Item::Use(u) => u.span,
            Item::Let(l) => l.span,
            Item::Block(b) => b.span,
            Item::Error(s) => *s,
        }
    }
}

/// `use "shared/site.plenum"`
#[derive(Clone, Debug, PartialEq)]
pub struct Use {
    pub span: Span,
    pub keyword: Span,
    pub path: StrLit,
}

/// `let NAME = VALUE`
#[derive(Clone, Debug, PartialEq)]
pub struct Let {
    pub span: Span,
    pub keyword: Span,
    pub name: Name,
    pub value: Value,
}

/// `KIND [NAME] ["Label"] [like OTHER] { ... }`: `project`, `site`, `zone`, `ahu`, `fan`, `coil`, ...
#[derive(Clone, Debug, PartialEq)]
pub struct Block {
    pub span: Span,
    pub kind: Name,
    pub name: Option<Name>,
    pub label: Option<StrLit>,
    pub like: Option<Like>,
    pub body: Body,
}

impl Block {
    /// The span of the header, from the kind to the opening brace.
    pub fn header_span(&self) -> Span {
        self.kind.span.cover(self.body.open)
    }

    /// The properties of this block, in order.
    pub fn properties(&self) -> impl Iterator<Item = &Property> {
        self.body.entries.iter().filter_map(|e| match e {
            Entry::Property(p) => Some(p),
            _ => None,
        })
    }

    /// The nested blocks of this block, in order.
    pub fn blocks(&self) -> impl Iterator<Item = &Block> {
        self.body.entries.iter().filter_map(|e| match e {
            Entry::Block(b) => Some(&**b),
            _ => None,
        })
    }
}

/// `like OTHER`
#[derive(Clone, Debug, PartialEq)]
pub struct Like {
    pub keyword: Span,
    pub name: Name,
}

/// `{ entries }`
#[derive(Clone, Debug, PartialEq)]
pub struct Body {
    pub open: Span,
    pub entries: Vec<Entry>,
    /// The closing brace; `None` when the file ended first (an error is reported).
    pub close: Option<Span>,
}

/// An item inside a block.
#[derive(Clone, Debug, PartialEq)]
pub enum Entry {
    Property(Property),
    Block(Box<Block>),
    /// Text the parser skipped after a syntax error.
    Error(Span),
}

impl Entry {
    pub fn span(&self) -> Span {
        match self {
            Entry::Property(p) => p.span,
            Entry::Block(b) => b.span,
            Entry::Error(s) => *s,
        }
    }
}

/// `key value`
#[derive(Clone, Debug, PartialEq)]
pub struct Property {
    pub span: Span,
    pub key: Name,
    pub value: Value,
}

/// A property value: one or more comma-separated elements, then optional
/// `with KEY VALUE` clauses (`static 2.5 in.wg with efficiency 62 %`).
#[derive(Clone, Debug, PartialEq)]
pub struct Value {
    pub span: Span,
    pub elements: Elements,
    /// `with` clauses (a boxed slice: most values have none, and it costs no allocation then).
    pub with: Box<[With]>,
}

/// The comma-separated elements of a value: at least one. Stored as the
/// first element plus the rest, so that the common one-element value costs no
/// separate allocation.
#[derive(Clone, Debug, PartialEq)]
pub struct Elements {
    pub first: Element,
    pub rest: Box<[Element]>,
}

impl Elements {
    pub fn len(&self) -> usize {
        1 + self.rest.len()
    }

    /// Always false: a value has at least one element.
    pub fn is_empty(&self) -> bool {
        false
    }

    pub fn get(&self, i: usize) -> Option<&Element> {
        if i == 0 {
            Some(&self.first)
        } else {
            self.rest.get(i - 1)
        }
    }

    pub fn iter(&self) -> impl Iterator<Item = &Element> + Clone {
        std::iter::once(&self.first).chain(self.rest.iter())
    }

    pub fn last(&self) -> &Element {
        self.rest.last().unwrap_or(&self.first)
    }
}

impl<'a> IntoIterator for &'a Elements {
    type Item = &'a Element;
    type IntoIter = std::iter::Chain<std::iter::Once<&'a Element>, std::slice::Iter<'a, Element>>;

    fn into_iter(self) -> Self::IntoIter {
        std::iter::once(&self.first).chain(self.rest.iter())
    }
}

/// One element of a value: an expression with an optional qualifier
/// (`94 °F db`) and an optional range end (`44 °F to 56 °F`).
#[derive(Clone, Debug, PartialEq)]
pub struct Element {
    pub span: Span,
    pub expr: Expr,
    pub qualifier: Option<Name>,
    pub range_end: Option<Box<RangeEnd>>,
}

/// `to EXPR [qualifier]`
#[derive(Clone, Debug, PartialEq)]
pub struct RangeEnd {
    pub keyword: Span,
    pub expr: Expr,
    pub qualifier: Option<Name>,
}

/// `with KEY VALUE` (the inner value has no `with` clauses of its own).
#[derive(Clone, Debug, PartialEq)]
pub struct With {
    pub span: Span,
    pub keyword: Span,
    pub key: Name,
    pub value: Value,
}

/// An expression: quantities, names and arithmetic.
#[derive(Clone, Debug, PartialEq)]
pub enum Expr {
    /// A number with an optional unit: `38.5 kBtu/h`, `40`.
    Number(Number),
    /// A name: a `let` value, a zone, or a word such as `ip` or `ventilation`.
    Name(Name),
    /// `none`
    None(Span),
    Paren(Box<Paren>),
    Unary(Box<Unary>),
    Binary(Box<Binary>),
}

impl Expr {
    pub fn span(&self) -> Span {
        match self {
            Expr::Number(n) => n.span(),
            Expr::Name(n) => n.span,
            Expr::None(s) => *s,
            Expr::Paren(p) => p.span,
            Expr::Unary(u) => u.span,
            Expr::Binary(b) => b.span,
        }
    }
}

/// A numeric literal, with its unit when one is written.
#[derive(Clone, Debug, PartialEq)]
pub struct Number {
    /// The span of the digits alone.
    pub digits: Span,
    /// The value of the digits (underscores removed). Always finite.
    pub value: f64,
    pub unit: Option<UnitLit>,
}

impl Number {
    /// The digits and the unit.
    pub fn span(&self) -> Span {
        match &self.unit {
            Some(u) => self.digits.cover(u.span),
            None => self.digits,
        }
    }
}

/// A unit expression exactly as written (`kBtu/h`, `ft²`, `°F`, `%rh`); a unit
/// never holds spaces, so its text is the source text of its span.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct UnitLit {
    pub span: Span,
}

impl UnitLit {
    pub fn text(self, src: &str) -> &str {
        self.span.text(src)
    }
}

/// `( EXPR )`
#[derive(Clone, Debug, PartialEq)]
pub struct Paren {
    pub span: Span,
    pub inner: Expr,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum UnaryOp {
    Neg,
    Pos,
}

#[derive(Clone, Debug, PartialEq)]
pub struct Unary {
    pub span: Span,
    pub op: UnaryOp,
    pub op_span: Span,
    pub operand: Expr,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum BinaryOp {
    Add,
    Sub,
    Mul,
    Div,
}

impl BinaryOp {
    pub fn symbol(self) -> &'static str {
        match self {
            BinaryOp::Add => "+",
            BinaryOp::Sub => "-",
            BinaryOp::Mul => "*",
            BinaryOp::Div => "/",
        }
    }
}

#[derive(Clone, Debug, PartialEq)]
pub struct Binary {
    pub span: Span,
    pub op: BinaryOp,
    pub op_span: Span,
    pub lhs: Expr,
    pub rhs: Expr,
}

/// An identifier (or a keyword used as a key). Its text is the source text of
/// its span: the tree stores spans, not copies of the source.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub struct Name {
    pub span: Span,
}

impl Name {
    pub fn text(self, src: &str) -> &str {
        self.span.text(src)
    }
}

/// A string literal with its escapes resolved.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct StrLit {
    pub span: Span,
    pub value: String,
}

/// Calls `f` on every block in the file, outer blocks before the blocks nested in them.
pub fn walk_blocks<'a>(file: &'a SourceFile, f: &mut dyn FnMut(&'a Block, usize)) {
    fn go<'a>(b: &'a Block, depth: usize, f: &mut dyn FnMut(&'a Block, usize)) {
        f(b, depth);
        for inner in b.blocks() {
            go(inner, depth + 1, f);
        }
    }
    for item in &file.items {
        if let Item::Block(b) = item {
            go(b, 0, f);
        }
    }
}
