//! Evaluating expressions and `let` values to quantities.

use foldhash::{HashMap, HashMapExt, HashSet, HashSetExt};

use plenum_syntax::{BinaryOp, Expr, Let, Span, UnaryOp, Value};
use plenum_units::{Dimension, Quantity, QuantityError, Unit, UnitError};

use crate::design::{FileId, Loc};
use crate::diag::{ModelCode, ModelDiagnostic};
use crate::keys::{dimension_words, nearest};
use crate::symbols::{SymbolKind, Symbols};

/// A quantity and how it was written.
#[derive(Clone, Copy, Debug)]
pub struct Evaluated {
    pub q: Quantity,
    /// No unit was written anywhere in the expression (and no name was used):
    /// a bare number, for the `missing-unit` check.
    pub unitless: bool,
}

/// A `let` of the design, and what evaluating it gave.
pub(crate) struct LetEntry<'a> {
    pub file: FileId,
    pub decl: &'a Let,
    pub symbol: usize,
    state: LetState,
}

#[derive(Clone, Copy)]
enum LetState {
    Unvisited,
    InProgress,
    Done(Option<Evaluated>),
}

/// The evaluation context: the design's texts, its `let` values, and where
/// findings go.
pub(crate) struct Evaluator<'a> {
    pub texts: &'a [&'a str],
    pub lets: HashMap<&'a str, LetEntry<'a>>,
    pub diags: Vec<ModelDiagnostic>,
    pub symbols: Symbols,
    /// Names of the `let`s being evaluated, innermost last (for cycles).
    stack: Vec<&'a str>,
    /// Every unit spelling read so far, parsed once: a design writes a few
    /// dozen spellings tens of thousands of times.
    units: HashMap<&'a str, Result<Unit, UnitError>>,
    /// The references recorded in `symbols`, so that recording one stays
    /// constant time (a search of every reference was quadratic).
    referenced: HashSet<(usize, Loc)>,
}

pub(crate) fn loc(file: FileId, span: Span) -> Loc {
    Loc { file, span }
}

impl<'a> Evaluator<'a> {
    pub fn new(texts: &'a [&'a str]) -> Evaluator<'a> {
        Evaluator {
            texts,
            lets: HashMap::new(),
            diags: Vec::new(),
            symbols: Symbols::default(),
            stack: Vec::new(),
            units: HashMap::new(),
            referenced: HashSet::new(),
        }
    }

    /// Record a use of a defined name (once per place), as
    /// [`Symbols::reference`] does.
    pub fn reference(&mut self, def: usize, at: Loc) {
        if self.referenced.insert((def, at)) {
            self.symbols
                .refs
                .push(crate::symbols::SymbolRef { def, loc: at });
        }
    }

    /// The unit a spelling stands for, parsed the first time it is seen.
    fn unit(&mut self, text: &'a str) -> &Result<Unit, UnitError> {
        self.units.entry(text).or_insert_with(|| Unit::parse(text))
    }

    pub fn text(&self, file: FileId) -> &'a str {
        self.texts.get(file.0 as usize).copied().unwrap_or("")
    }

    pub fn slice(&self, file: FileId, span: Span) -> &'a str {
        span.text(self.text(file))
    }

    pub fn report(&mut self, d: ModelDiagnostic) {
        self.diags.push(d);
    }

    /// Register a `let`; a second one of the same name is a `duplicate-name`.
    pub fn add_let(&mut self, file: FileId, decl: &'a Let) {
        let name = self.slice(file, decl.name.span);
        let name_loc = loc(file, decl.name.span);
        if let Some(first) = self.lets.get(name) {
            let first_loc = loc(first.file, first.decl.name.span);
            self.report(
                ModelDiagnostic::new(
                    ModelCode::DuplicateName,
                    name_loc,
                    format!("`{name}` is defined twice"),
                )
                .label("defined again here")
                .related(first_loc, "first defined here")
                .help("rename one of them"),
            );
            return;
        }
        let symbol = self.symbols.define(
            SymbolKind::Let,
            name.to_string(),
            name_loc,
            loc(file, decl.span),
        );
        self.lets.insert(
            name,
            LetEntry {
                file,
                decl,
                symbol,
                state: LetState::Unvisited,
            },
        );
    }

    /// The value of a `let`, evaluated once. A `let` naming a compound value
    /// (`94 °F db, 75 °F wb`) has no single quantity: `None`, and the caller
    /// that needs the compound value reads [`Evaluator::let_value`].
    fn let_quantity(&mut self, name: &'a str, use_loc: Loc) -> Option<Evaluated> {
        let entry = self.lets.get(name)?;
        let (file, decl, state) = (entry.file, entry.decl, entry.state);
        match state {
            LetState::Done(v) => v,
            LetState::InProgress => {
                let mut cycle: Vec<&str> = self.stack.clone();
                cycle.push(name);
                self.report(
                    ModelDiagnostic::new(
                        ModelCode::LetCycle,
                        use_loc,
                        format!("`let {name}` depends on itself: {}", cycle.join(" → ")),
                    )
                    .label("used here while it is being defined")
                    .help("break the cycle by giving one of these a value of its own"),
                );
                None
            }
            LetState::Unvisited => {
                self.set_let_state(name, LetState::InProgress);
                self.stack.push(name);
                let v = self.single_quantity(file, &decl.value);
                self.stack.pop();
                self.set_let_state(name, LetState::Done(v));
                v
            }
        }
    }

    fn set_let_state(&mut self, name: &str, state: LetState) {
        if let Some(e) = self.lets.get_mut(name) {
            e.state = state;
        }
    }

    /// The compound value of a `let` and its file (for air states and lists).
    pub fn let_value(&self, name: &str) -> Option<(FileId, &'a Value)> {
        self.lets.get(name).map(|e| (e.file, &e.decl.value))
    }

    pub fn let_symbol(&self, name: &str) -> Option<usize> {
        self.lets.get(name).map(|e| e.symbol)
    }

    /// Every `let` with its value (after [`Evaluator::evaluate_all_lets`]),
    /// in source order; `None` for a compound or invalid value.
    pub fn let_values(&self) -> Vec<crate::LetValue> {
        let mut out: Vec<crate::LetValue> = self
            .lets
            .iter()
            .map(|(name, e)| crate::LetValue {
                name: (*name).to_string(),
                name_loc: loc(e.file, e.decl.name.span),
                quantity: match e.state {
                    LetState::Done(Some(v)) => Some(v.q),
                    _ => None,
                },
            })
            .collect();
        out.sort_by_key(|l| l.name_loc);
        out
    }

    /// Evaluate every `let` (so that errors in unused ones are reported
    /// too), each after the `let`s it uses: the order comes from a depth-first
    /// walk of the references with an explicit stack, so a chain of thousands
    /// of `let`s deepens no recursion. A reference that closes a cycle is
    /// reported where it is written, and the `let` it names gets no value.
    pub fn evaluate_all_lets(&mut self) {
        let mut names: Vec<(&'a str, Loc)> = self
            .lets
            .iter()
            .map(|(n, e)| (*n, loc(e.file, e.decl.name.span)))
            .collect();
        names.sort_by_key(|(_, l)| *l);
        let refs: HashMap<&'a str, Vec<(&'a str, Loc)>> = names
            .iter()
            .map(|(n, _)| (*n, self.let_references(n)))
            .collect();
        #[derive(Clone, Copy, PartialEq)]
        enum Mark {
            Open,
            Done,
        }
        let mut mark: HashMap<&'a str, Mark> = HashMap::new();
        let mut order: Vec<&'a str> = Vec::new();
        for (root, _) in &names {
            if mark.contains_key(root) {
                continue;
            }
            // (let, index of the next reference to follow)
            let mut stack: Vec<(&'a str, usize)> = vec![(root, 0)];
            mark.insert(root, Mark::Open);
            while let Some(top) = stack.last_mut() {
                let name = top.0;
                let list = refs.get(name).map(Vec::as_slice).unwrap_or(&[]);
                if let Some(&(target, at)) = list.get(top.1) {
                    top.1 += 1;
                    match mark.get(target) {
                        None => {
                            mark.insert(target, Mark::Open);
                            stack.push((target, 0));
                        }
                        Some(Mark::Open) => {
                            let from = stack.iter().position(|(n, _)| *n == target).unwrap_or(0);
                            let mut cycle: Vec<&str> =
                                stack[from..].iter().map(|(n, _)| *n).collect();
                            cycle.push(target);
                            self.report(
                                ModelDiagnostic::new(
                                    ModelCode::LetCycle,
                                    at,
                                    format!(
                                        "`let {target}` depends on itself: {}",
                                        cycle.join(" → ")
                                    ),
                                )
                                .label("used here while it is being defined")
                                .help("break the cycle by giving one of these a value of its own"),
                            );
                            // It has no value: everything that uses it fails quietly.
                            self.set_let_state(target, LetState::Done(None));
                        }
                        Some(Mark::Done) => {}
                    }
                } else {
                    mark.insert(name, Mark::Done);
                    order.push(name);
                    stack.pop();
                }
            }
        }
        for name in order {
            if let Some(l) = names.iter().find(|(n, _)| *n == name).map(|(_, l)| *l) {
                let _ = self.let_quantity(name, l);
            }
        }
    }

    /// The `let`s that a `let`'s value names, with where each is named.
    fn let_references(&self, name: &str) -> Vec<(&'a str, Loc)> {
        let Some(e) = self.lets.get(name) else {
            return Vec::new();
        };
        let (file, value) = (e.file, &e.decl.value);
        let mut out = Vec::new();
        let mut exprs: Vec<&'a Expr> = Vec::new();
        let mut values: Vec<&'a Value> = vec![value];
        while let Some(v) = values.pop() {
            for el in &v.elements {
                exprs.push(&el.expr);
                if let Some(r) = &el.range_end {
                    exprs.push(&r.expr);
                }
            }
            for w in v.with.iter() {
                values.push(&w.value);
            }
        }
        while let Some(x) = exprs.pop() {
            match x {
                Expr::Name(n) => {
                    let text = self.slice(file, n.span);
                    if let Some((key, _)) = self.lets.get_key_value(text) {
                        out.push((*key, loc(file, n.span)));
                    }
                }
                Expr::Paren(p) => exprs.push(&p.inner),
                Expr::Unary(u) => exprs.push(&u.operand),
                Expr::Binary(b) => {
                    exprs.push(&b.lhs);
                    exprs.push(&b.rhs);
                }
                Expr::Number(_) | Expr::None(_) => {}
            }
        }
        out.sort_by_key(|(_, l)| *l);
        out
    }

    /// A value that must be one plain quantity: one element, no qualifier, no
    /// range, no `with`. A compound value is fine for a `let` (it is read where
    /// it is used) and yields `None` without an error.
    fn single_quantity(&mut self, file: FileId, value: &'a Value) -> Option<Evaluated> {
        if value.elements.len() != 1 || !value.with.is_empty() {
            return None;
        }
        let el = &value.elements.first;
        if el.qualifier.is_some() || el.range_end.is_some() {
            return None;
        }
        self.expr(file, &el.expr)
    }

    /// Evaluate an expression; findings are reported, `None` means one was.
    pub fn expr(&mut self, file: FileId, e: &'a Expr) -> Option<Evaluated> {
        match e {
            Expr::Number(n) => {
                let Some(unit_lit) = n.unit else {
                    return Some(Evaluated {
                        q: Quantity::number(n.value).ok()?,
                        unitless: true,
                    });
                };
                let text = self.slice(file, unit_lit.span);
                let made = match self.unit(text) {
                    Ok(unit) => Quantity::new(n.value, unit),
                    Err(err) => {
                        let err = err.clone();
                        self.unit_error(file, unit_lit.span, text, err);
                        return None;
                    }
                };
                match made {
                    Ok(q) => Some(Evaluated { q, unitless: false }),
                    Err(err) => {
                        self.report(ModelDiagnostic::new(
                            ModelCode::InvalidArithmetic,
                            loc(file, n.span()),
                            format!(
                                "`{}` cannot be represented: {err}",
                                self.slice(file, n.span())
                            ),
                        ));
                        None
                    }
                }
            }
            Expr::Name(name) => {
                let text = self.slice(file, name.span);
                let use_loc = loc(file, name.span);
                if let Some(sym) = self.let_symbol(text) {
                    self.reference(sym, use_loc);
                    let v = self.let_quantity(text, use_loc)?;
                    return Some(Evaluated {
                        q: v.q,
                        unitless: false,
                    });
                }
                let mut d = ModelDiagnostic::new(
                    ModelCode::UnknownName,
                    use_loc,
                    format!("no `let` named `{text}`"),
                )
                .label("not defined");
                let names: Vec<&str> = self.lets.keys().copied().collect();
                if let Some(near) = nearest(text, names) {
                    d = d.help(format!("did you mean `{near}`?")).fix(
                        format!("change to `{near}`"),
                        use_loc,
                        near,
                    );
                } else {
                    d = d.help(format!("define it with `let {text} = …`, or write a value"));
                }
                self.report(d);
                None
            }
            Expr::None(span) => {
                self.report(
                    ModelDiagnostic::new(
                        ModelCode::InvalidValue,
                        loc(file, *span),
                        "`none` is not a quantity",
                    )
                    .help("`none` is only a value of `return_duct`"),
                );
                None
            }
            Expr::Paren(p) => self.expr(file, &p.inner),
            Expr::Unary(u) => {
                let v = self.expr(file, &u.operand)?;
                let r = match u.op {
                    UnaryOp::Pos => Ok(v.q),
                    UnaryOp::Neg => -v.q,
                };
                match r {
                    Ok(q) => Some(Evaluated {
                        q,
                        unitless: v.unitless,
                    }),
                    Err(err) => {
                        self.arith_error(file, u.op_span, u.span, err);
                        None
                    }
                }
            }
            Expr::Binary(b) => {
                let l = self.expr(file, &b.lhs);
                let r = self.expr(file, &b.rhs);
                let (l, r) = (l?, r?);
                let result = match b.op {
                    BinaryOp::Add => l.q + r.q,
                    BinaryOp::Sub => l.q - r.q,
                    BinaryOp::Mul => l.q * r.q,
                    BinaryOp::Div => l.q / r.q,
                };
                match result {
                    Ok(q) => Some(Evaluated {
                        q,
                        unitless: l.unitless && r.unitless,
                    }),
                    Err(QuantityError::Incompatible { op, left, right }) => {
                        let verb = if op == '+' { "add" } else { "subtract" };
                        self.report(
                            ModelDiagnostic::new(
                                ModelCode::UnitMismatch,
                                loc(file, b.op_span),
                                format!(
                                    "cannot {verb} {} and {}",
                                    dimension_words(left),
                                    dimension_words(right)
                                ),
                            )
                            .label(format!("`{}` needs two values of one kind", b.op.symbol()))
                            .related(loc(file, b.lhs.span()), dimension_words(left))
                            .related(loc(file, b.rhs.span()), dimension_words(right)),
                        );
                        None
                    }
                    Err(err) => {
                        self.arith_error(file, b.op_span, b.span, err);
                        None
                    }
                }
            }
        }
    }

    fn arith_error(&mut self, file: FileId, op: Span, whole: Span, err: QuantityError) {
        let mut d =
            ModelDiagnostic::new(ModelCode::InvalidArithmetic, loc(file, op), err.to_string())
                .related(loc(file, whole), "in this expression");
        if matches!(err, QuantityError::AbsoluteSum) {
            d = d.help("°F − °F is a temperature difference; °F + °F has no meaning");
        }
        self.report(d);
    }

    fn unit_error(&mut self, file: FileId, span: Span, text: &str, err: UnitError) {
        let at = |r: std::ops::Range<usize>| {
            let s = span.start as usize;
            Span::from_range(s + r.start..(s + r.end).min(span.end as usize))
        };
        let whole = loc(file, span);
        let d = match err {
            UnitError::UnknownSymbol {
                symbol,
                span: r,
                nearest,
                corrected,
            } => {
                let mut d = ModelDiagnostic::new(
                    ModelCode::UnknownUnit,
                    loc(file, at(r)),
                    format!("unknown unit `{symbol}`"),
                )
                .label("not a unit Plenum knows");
                if let (Some(near), Some(fixed)) = (nearest, corrected) {
                    d = d.help(format!("did you mean `{near}`?")).fix(
                        format!("change the unit to `{fixed}`"),
                        whole,
                        fixed,
                    );
                } else {
                    d = d.help("`plenum explain unknown-unit` lists the units");
                }
                d
            }
            UnitError::Ambiguous {
                span: r,
                suggestion,
            } => ModelDiagnostic::new(
                ModelCode::UnknownUnit,
                loc(file, at(r)),
                format!("`{text}` is ambiguous"),
            )
            .label("a product after a division")
            .help(format!("write `{suggestion}`"))
            .fix(format!("write `{suggestion}`"), whole, suggestion),
            UnitError::Malformed { span: r, reason } => ModelDiagnostic::new(
                ModelCode::UnknownUnit,
                loc(file, at(r)),
                format!("`{text}` is not a unit expression: {reason}"),
            ),
            UnitError::OutOfRange { span: r } => ModelDiagnostic::new(
                ModelCode::UnknownUnit,
                loc(file, at(r)),
                format!("the power in `{text}` is out of range"),
            ),
            UnitError::Empty => {
                ModelDiagnostic::new(ModelCode::UnknownUnit, whole, "empty unit".to_string())
            }
        };
        self.report(d);
    }

    /// The value of a key that takes one quantity of `expected` dimension.
    /// Reports `missing-unit`, `unit-mismatch` and shape errors naming `key`.
    pub fn quantity_of(
        &mut self,
        file: FileId,
        key: &str,
        value: &'a Value,
        expected: Dimension,
    ) -> Option<Quantity> {
        if !self.plain(file, key, value) {
            return None;
        }
        let el = &value.elements.first;
        let v = self.expr(file, &el.expr)?;
        self.require(file, key, el.expr.span(), v, expected, Some(&el.expr))
    }

    /// Check that a value is one plain element; report what is extra.
    pub fn plain(&mut self, file: FileId, key: &str, value: &Value) -> bool {
        if value.elements.len() > 1 {
            let second = value.elements.rest[0].span;
            self.report(
                ModelDiagnostic::new(
                    ModelCode::InvalidValue,
                    loc(file, second.cover(value.elements.last().span)),
                    format!("`{key}` takes one value"),
                )
                .label("extra values"),
            );
            return false;
        }
        if let Some(w) = value.with.first() {
            self.report(
                ModelDiagnostic::new(
                    ModelCode::InvalidValue,
                    loc(file, w.span),
                    format!("`{key}` takes no `with` clause"),
                )
                .help("`with efficiency …` goes with a fan's `static` pressure"),
            );
            return false;
        }
        let el = &value.elements.first;
        if let Some(q) = el.qualifier {
            let word = self.slice(file, q.span);
            self.report(
                ModelDiagnostic::new(
                    ModelCode::InvalidValue,
                    loc(file, q.span),
                    format!("unexpected `{word}` after the value of `{key}`"),
                )
                .help(if matches!(word, "db" | "wb" | "dp") {
                    "qualifiers such as `db` belong to air states".to_string()
                } else {
                    "is a comma missing, or an operator?".to_string()
                }),
            );
            return false;
        }
        if let Some(r) = &el.range_end {
            self.report(ModelDiagnostic::new(
                ModelCode::InvalidValue,
                loc(file, r.keyword.cover(r.expr.span())),
                format!("`{key}` takes one value, not a range"),
            ));
            return false;
        }
        true
    }

    /// Check a quantity's dimension for `key`, with the trade's fixes.
    pub fn require(
        &mut self,
        file: FileId,
        key: &str,
        span: Span,
        v: Evaluated,
        expected: Dimension,
        expr: Option<&Expr>,
    ) -> Option<Quantity> {
        match v.q.require(expected) {
            Ok(q) => Some(q),
            Err(_) if v.unitless && expected != Dimension::RATIO => {
                let system = plenum_units::UnitSystem::Ip;
                let unit = system.preferred_unit(expected).map(|u| u.to_string());
                let mut d = ModelDiagnostic::new(
                    ModelCode::MissingUnit,
                    loc(file, span),
                    format!(
                        "`{key}` needs a unit: {} is expected",
                        dimension_words(expected)
                    ),
                )
                .label("a number without a unit");
                if let (Some(u), Some(Expr::Number(n))) = (unit, expr) {
                    d = d
                        .help(format!(
                            "add the unit, e.g. `{} {u}`",
                            self.slice(file, n.digits)
                        ))
                        .fix(
                            format!("add `{u}`"),
                            loc(file, Span::empty(n.digits.end)),
                            format!(" {u}"),
                        );
                }
                self.report(d);
                None
            }
            Err(_) => {
                let found = v.q.dimension();
                let mut d = ModelDiagnostic::new(
                    ModelCode::UnitMismatch,
                    loc(file, span),
                    format!(
                        "`{key}` expects {}, found {}",
                        dimension_words(expected),
                        dimension_words(found)
                    ),
                )
                .label(format!("this is {}", dimension_words(found)));
                // One unit fixes it when the value is a literal whose unit is close.
                if let Some(Expr::Number(n)) = expr
                    && let Some(u) = n.unit
                {
                    let text = self.slice(file, u.span);
                    if let Ok(unit) = Unit::parse(text)
                        && let Some(fixed) = unit.suggest(expected)
                    {
                        let fixed = fixed.to_string();
                        d = d.help(format!("did you mean `{fixed}`?")).fix(
                            format!("change the unit to `{fixed}`"),
                            loc(file, u.span),
                            fixed,
                        );
                    }
                }
                if d.help.is_none()
                    && let Some(u) = plenum_units::UnitSystem::Ip.preferred_unit(expected)
                {
                    d = d.help(format!(
                        "give {} (for example in `{u}`)",
                        dimension_words(expected)
                    ));
                }
                self.report(d);
                None
            }
        }
    }
}
