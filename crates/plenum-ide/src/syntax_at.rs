//! What is at an offset of a parsed file: the enclosing blocks and the
//! innermost node that touches it.

use plenum_model::keys::BlockKind;
use plenum_syntax::{
    Block, Element, Entry, Expr, Item, Let, Name, Number, Property, SourceFile, Span, Use, Value,
};

/// The innermost thing at an offset.
#[derive(Clone, Copy, Debug)]
pub(crate) enum Node<'a> {
    /// The kind word of a block header (`zone`, `ahu`, `coil`).
    BlockKind(&'a Block),
    /// The name of a block in its header.
    BlockName(&'a Block),
    /// Elsewhere in a block header (the label, the braces).
    Header(&'a Block),
    /// The name after `like`.
    LikeName(Name),
    /// A property's key.
    Key(&'a Property),
    /// A name inside a property's value.
    ValueName(&'a Property, Name),
    /// A number literal (with its unit) inside a property's value.
    Number(&'a Property, &'a Number),
    /// Elsewhere in a property's value.
    Value(&'a Property),
    /// The name a `let` defines.
    LetName(&'a Let),
    /// A name inside a `let` value.
    LetValueName(Name),
    /// A number literal inside a `let` value.
    LetNumber(&'a Number),
    /// A `use` item.
    Use(&'a Use),
    /// A comment.
    Comment(Span),
}

/// The blocks around an offset (outermost first) and the node at it.
#[derive(Clone, Debug, Default)]
pub(crate) struct Located<'a> {
    /// Blocks whose body holds the offset (between the braces).
    pub blocks: Vec<&'a Block>,
    pub node: Option<Node<'a>>,
}

impl<'a> Located<'a> {
    /// The innermost block holding the offset.
    pub fn block(&self) -> Option<&'a Block> {
        self.blocks.last().copied()
    }
}

/// The kind of a block from its kind word.
pub(crate) fn kind_of(block: &Block, text: &str) -> Option<BlockKind> {
    BlockKind::from_keyword(block.kind.text(text))
}

fn body_holds(block: &Block, offset: u32) -> bool {
    let start = block.body.open.end;
    match block.body.close {
        Some(c) => start <= offset && offset <= c.start,
        None => start <= offset,
    }
}

/// Locate `offset` in a file. `comments` are the file's comment spans.
pub(crate) fn locate<'a>(file: &'a SourceFile, comments: &[Span], offset: u32) -> Located<'a> {
    let mut out = Located::default();
    if let Some(c) = comments.iter().find(|c| c.touches(offset)) {
        out.node = Some(Node::Comment(*c));
        // Still record the enclosing blocks.
        for item in &file.items {
            if let Item::Block(b) = item
                && b.span.touches(offset)
            {
                enclosing(b, offset, &mut out.blocks);
            }
        }
        return out;
    }
    for item in &file.items {
        match item {
            Item::Block(b) if b.span.touches(offset) || body_holds_open(b, offset) => {
                block_at(b, offset, &mut out);
                if out.node.is_some() {
                    return out;
                }
            }
            Item::Let(l) if l.span.touches(offset) => {
                out.node = Some(if l.name.span.touches(offset) {
                    Node::LetName(l)
                } else {
                    match value_node(&l.value, offset) {
                        Some(ValueHit::Name(n)) => Node::LetValueName(n),
                        Some(ValueHit::Number(n)) => Node::LetNumber(n),
                        None => return out,
                    }
                });
                return out;
            }
            Item::Use(u) if u.span.touches(offset) => {
                out.node = Some(Node::Use(u));
                return out;
            }
            _ => {}
        }
    }
    out
}

/// An unclosed block runs to the end of the file.
fn body_holds_open(b: &Block, offset: u32) -> bool {
    b.body.close.is_none() && offset >= b.body.open.end
}

fn enclosing<'a>(b: &'a Block, offset: u32, blocks: &mut Vec<&'a Block>) {
    if body_holds(b, offset) {
        blocks.push(b);
        for inner in b.blocks() {
            if inner.span.touches(offset) || body_holds_open(inner, offset) {
                enclosing(inner, offset, blocks);
            }
        }
    }
}

fn block_at<'a>(b: &'a Block, offset: u32, out: &mut Located<'a>) {
    if b.kind.span.touches(offset) {
        out.node = Some(Node::BlockKind(b));
        return;
    }
    if let Some(n) = b.name
        && n.span.touches(offset)
    {
        out.node = Some(Node::BlockName(b));
        return;
    }
    if let Some(l) = &b.like
        && l.name.span.touches(offset)
    {
        out.node = Some(Node::LikeName(l.name));
        return;
    }
    if offset < b.body.open.end {
        out.node = Some(Node::Header(b));
        return;
    }
    if !body_holds(b, offset) {
        // On the closing brace.
        out.node = Some(Node::Header(b));
        return;
    }
    out.blocks.push(b);
    for e in &b.body.entries {
        if !e.span().touches(offset)
            && !matches!(e, Entry::Block(inner) if body_holds_open(inner, offset))
        {
            continue;
        }
        match e {
            Entry::Block(inner) => {
                block_at(inner, offset, out);
                if out.node.is_some() {
                    return;
                }
            }
            Entry::Property(p) => {
                out.node = Some(if p.key.span.touches(offset) {
                    Node::Key(p)
                } else {
                    match value_node(&p.value, offset) {
                        Some(ValueHit::Name(n)) => Node::ValueName(p, n),
                        Some(ValueHit::Number(n)) => Node::Number(p, n),
                        None => Node::Value(p),
                    }
                });
                return;
            }
            Entry::Error(_) => {}
        }
    }
}

enum ValueHit<'a> {
    Name(Name),
    Number(&'a Number),
}

fn value_node(v: &Value, offset: u32) -> Option<ValueHit<'_>> {
    for el in v.elements.iter() {
        if let Some(h) = element_node(el, offset) {
            return Some(h);
        }
    }
    for w in &v.with {
        if let Some(h) = value_node(&w.value, offset) {
            return Some(h);
        }
    }
    None
}

fn element_node(el: &Element, offset: u32) -> Option<ValueHit<'_>> {
    if !el.span.touches(offset) {
        return None;
    }
    if let Some(h) = expr_node(&el.expr, offset) {
        return Some(h);
    }
    if let Some(r) = &el.range_end {
        return expr_node(&r.expr, offset);
    }
    None
}

fn expr_node(e: &Expr, offset: u32) -> Option<ValueHit<'_>> {
    if !e.span().touches(offset) {
        return None;
    }
    match e {
        Expr::Number(n) => Some(ValueHit::Number(n)),
        Expr::Name(n) => Some(ValueHit::Name(*n)),
        Expr::None(_) => None,
        Expr::Paren(p) => expr_node(&p.inner, offset),
        Expr::Unary(u) => expr_node(&u.operand, offset),
        Expr::Binary(b) => expr_node(&b.lhs, offset).or_else(|| expr_node(&b.rhs, offset)),
    }
}

/// Every name inside a value, in order.
pub(crate) fn value_names(v: &Value, out: &mut Vec<Name>) {
    fn expr(e: &Expr, out: &mut Vec<Name>) {
        match e {
            Expr::Name(n) => out.push(*n),
            Expr::Paren(p) => expr(&p.inner, out),
            Expr::Unary(u) => expr(&u.operand, out),
            Expr::Binary(b) => {
                expr(&b.lhs, out);
                expr(&b.rhs, out);
            }
            Expr::Number(_) | Expr::None(_) => {}
        }
    }
    for el in v.elements.iter() {
        expr(&el.expr, out);
        if let Some(r) = &el.range_end {
            expr(&r.expr, out);
        }
    }
    for w in &v.with {
        value_names(&w.value, out);
    }
}

/// Every number literal inside a value, in order.
pub(crate) fn value_numbers<'a>(v: &'a Value, out: &mut Vec<&'a Number>) {
    fn expr<'a>(e: &'a Expr, out: &mut Vec<&'a Number>) {
        match e {
            Expr::Number(n) => out.push(n),
            Expr::Paren(p) => expr(&p.inner, out),
            Expr::Unary(u) => expr(&u.operand, out),
            Expr::Binary(b) => {
                expr(&b.lhs, out);
                expr(&b.rhs, out);
            }
            Expr::Name(_) | Expr::None(_) => {}
        }
    }
    for el in v.elements.iter() {
        expr(&el.expr, out);
        if let Some(r) = &el.range_end {
            expr(&r.expr, out);
        }
    }
    for w in &v.with {
        value_numbers(&w.value, out);
    }
}
