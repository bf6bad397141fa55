//! Lowering the parsed files of a design into the typed [`Design`].
//!
//! Steps: collect the top-level blocks and `let`s of every file; resolve
//! `like` (a block inherits every key of the block it is like, then its own
//! keys override, including a key's alternatives); check each block's own
//! keys against the key table; evaluate every value with its units; and
//! assemble zones and air handlers.

use foldhash::{HashMap, HashMapExt, HashSet, HashSetExt};

use plenum_syntax::{Block, Element, Entry, Expr, Item, Property, Span, Value};
use plenum_units::{Dimension, Quantity, Unit, UnitSystem};

use crate::design::*;
use crate::diag::{ModelCode, ModelDiagnostic};
use crate::eval::{Evaluator, loc};
use crate::keys::{BlockKind, KeyDef, ValueKind, dimension_words, key_def, keys_of, nearest};
use crate::load::SourceFile;
use crate::symbols::SymbolKind;

/// What evaluating one property gave, for hover.
#[derive(Clone, Debug, PartialEq)]
pub struct PropertyInfo {
    /// The whole property.
    pub loc: Loc,
    /// Its key.
    pub key_loc: Loc,
    pub block: BlockKind,
    pub def: &'static KeyDef,
    /// The value when it is one quantity.
    pub quantity: Option<Quantity>,
}

/// A block and the file it is in.
#[derive(Clone, Copy)]
struct Blk<'a> {
    file: FileId,
    block: &'a Block,
}

/// A property and the file it is in (inherited properties keep their file).
#[derive(Clone, Copy)]
struct Prop<'a> {
    file: FileId,
    prop: &'a Property,
}

impl Prop<'_> {
    fn loc(&self) -> Loc {
        loc(self.file, self.prop.span)
    }
}

/// Keys and the properties that give them.
type Props<'a> = Vec<(&'a str, Prop<'a>)>;

/// The effective keys of a block after `like`, and of its nested blocks.
#[derive(Clone, Default)]
struct Effective<'a> {
    props: Props<'a>,
    nested: Vec<(BlockKind, Blk<'a>, Props<'a>)>,
}

impl<'a> Effective<'a> {
    fn get(&self, key: &str) -> Option<Prop<'a>> {
        self.props.iter().find(|(k, _)| *k == key).map(|(_, p)| *p)
    }
}

fn props_get<'a>(props: &[(&'a str, Prop<'a>)], key: &str) -> Option<Prop<'a>> {
    props.iter().find(|(k, _)| *k == key).map(|(_, p)| *p)
}

/// Override `base` with `own`: a key replaces the same key and its alternatives.
fn overlay<'a>(block: BlockKind, base: &mut Vec<(&'a str, Prop<'a>)>, own: &[(&'a str, Prop<'a>)]) {
    for (k, p) in own {
        let alts: &[&str] = key_def(block, k).map_or(&[], |d| d.alternatives);
        base.retain(|(bk, _)| bk != k && !alts.contains(bk));
        base.push((k, *p));
    }
}

pub(crate) struct Lowering<'a> {
    ev: Evaluator<'a>,
    files: &'a [SourceFile],
    zones_by_name: HashMap<&'a str, (Blk<'a>, usize)>,
    ahus_by_name: HashMap<&'a str, (Blk<'a>, usize)>,
    effective: HashMap<(FileId, u32), Effective<'a>>,
    like_stack: Vec<(FileId, u32)>,
    /// Blocks whose `like` closes a cycle: their `like` is reported and not followed.
    cut_like: HashSet<(FileId, u32)>,
    pub properties: Vec<PropertyInfo>,
    /// Where each recorded property is in `properties`, so that recording
    /// stays linear in the design (a search was quadratic: minutes for a
    /// campus of 40,000 zones).
    property_at: HashMap<Loc, usize>,
}

pub(crate) struct Lowered {
    pub lets: Vec<crate::LetValue>,
    pub design: Design,
    pub diags: Vec<ModelDiagnostic>,
    pub symbols: crate::symbols::Symbols,
    pub properties: Vec<PropertyInfo>,
}

fn block_key(b: Blk<'_>) -> (FileId, u32) {
    (b.file, b.block.span.start)
}

impl<'a> Lowering<'a> {
    pub fn run(files: &'a [SourceFile], texts: &'a [&'a str]) -> Lowered {
        let mut l = Lowering {
            ev: Evaluator::new(texts),
            files,
            zones_by_name: HashMap::new(),
            ahus_by_name: HashMap::new(),
            effective: HashMap::new(),
            like_stack: Vec::new(),
            cut_like: HashSet::new(),
            properties: Vec::new(),
            property_at: HashMap::new(),
        };
        let design = l.lower();
        let lets = l.ev.let_values();
        let mut diags = l.ev.diags;
        // Inherited values are evaluated once per block that inherits them:
        // keep one copy of each finding.
        let mut seen = HashSet::new();
        diags.retain(|d| seen.insert((d.code, d.loc, d.message.clone())));
        diags.sort_by_key(|d| d.loc);
        Lowered {
            lets,
            design,
            diags,
            symbols: l.ev.symbols,
            properties: l.properties,
        }
    }

    fn text(&self, file: FileId, span: Span) -> &'a str {
        self.ev.slice(file, span)
    }

    fn lower(&mut self) -> Design {
        let mut projects: Vec<Blk<'a>> = Vec::new();
        let mut sites: Vec<Blk<'a>> = Vec::new();
        let mut zones: Vec<Blk<'a>> = Vec::new();
        let mut ahus: Vec<Blk<'a>> = Vec::new();

        for f in self.files {
            for item in &f.parse.file.items {
                match item {
                    Item::Let(l) => self.ev.add_let(f.id, l),
                    Item::Block(b) => {
                        let blk = Blk {
                            file: f.id,
                            block: b,
                        };
                        let kind_text = self.text(f.id, b.kind.span);
                        match BlockKind::from_keyword(kind_text) {
                            Some(BlockKind::Project) => projects.push(blk),
                            Some(BlockKind::Site) => sites.push(blk),
                            Some(BlockKind::Zone) => zones.push(blk),
                            Some(BlockKind::Ahu) => ahus.push(blk),
                            Some(k @ (BlockKind::Fan | BlockKind::Coil)) => {
                                self.ev.report(
                                    ModelDiagnostic::new(
                                        ModelCode::UnknownBlock,
                                        loc(f.id, b.kind.span),
                                        format!(
                                            "a `{}` block belongs inside an `ahu`",
                                            k.keyword()
                                        ),
                                    )
                                    .help("move it into the air handler it belongs to"),
                                );
                            }
                            None => self.unknown_block(f.id, b, BlockKind::TOP_LEVEL.as_slice()),
                        }
                    }
                    Item::Use(_) | Item::Error(_) => {}
                }
            }
        }
        self.ev.evaluate_all_lets();

        // Names first, so that `serves` and `like` can refer to anything.
        for b in &zones {
            self.define(*b, SymbolKind::Zone);
        }
        for b in &ahus {
            self.define(*b, SymbolKind::Ahu);
        }

        // Every `like`, parents first (no recursion along a chain).
        let defined_zones: Vec<Blk<'a>> = zones
            .iter()
            .copied()
            .filter(|b| self.is_definition(*b, SymbolKind::Zone))
            .collect();
        let defined_ahus: Vec<Blk<'a>> = ahus
            .iter()
            .copied()
            .filter(|b| self.is_definition(*b, SymbolKind::Ahu))
            .collect();
        self.resolve_likes(&defined_zones, BlockKind::Zone);
        self.resolve_likes(&defined_ahus, BlockKind::Ahu);

        let project = self.project(&projects);
        let site = self.site(&sites);

        let mut design_zones = Vec::new();
        for b in &zones {
            if !self.is_definition(*b, SymbolKind::Zone) {
                continue;
            }
            let id = ZoneId(u32::try_from(design_zones.len()).unwrap_or(u32::MAX));
            if let Some(z) = self.zone(*b, id) {
                design_zones.push(z);
            }
        }
        let names: HashMap<String, ZoneId> = design_zones
            .iter()
            .map(|z: &Zone| (z.name.clone(), z.id))
            .collect();
        let mut design_ahus = Vec::new();
        for b in &ahus {
            if !self.is_definition(*b, SymbolKind::Ahu) {
                continue;
            }
            if let Some(a) = self.ahu(*b, &names) {
                design_ahus.push(a);
            }
        }
        self.served_checks(&design_zones, &design_ahus);
        if site.is_none() && !design_ahus.is_empty() {
            let first = design_ahus[0].name_loc;
            self.ev.report(
                ModelDiagnostic::new(
                    ModelCode::MissingSite,
                    first,
                    "the design has no `site` block: the outdoor design state is unknown",
                )
                .label("this air handler needs the outdoor state")
                .help("add `site { elevation …; cooling 94 °F db, 75 °F wb }` (or `use` a shared site file)"),
            );
        }
        Design {
            project,
            site,
            zones: design_zones,
            ahus: design_ahus,
        }
    }

    fn unknown_block(&mut self, file: FileId, b: &Block, allowed: &[BlockKind]) {
        let word = self.text(file, b.kind.span);
        let at = loc(file, b.kind.span);
        let names: Vec<&str> = allowed.iter().map(|k| k.keyword()).collect();
        let mut d = ModelDiagnostic::new(
            ModelCode::UnknownBlock,
            at,
            format!("unknown block `{word}`"),
        )
        .label("not a block kind");
        if let Some(near) = nearest(word, names.iter().copied()) {
            d = d.help(format!("did you mean `{near}`?")).fix(
                format!("change to `{near}`"),
                at,
                near,
            );
        } else {
            d = d.help(format!("blocks here are {}", quoted_list(&names)));
        }
        self.ev.report(d);
    }

    /// Whether this block is the one its name stands for (not a duplicate, not nameless).
    fn is_definition(&self, b: Blk<'a>, kind: SymbolKind) -> bool {
        let Some(name) = b.block.name else {
            return false;
        };
        let map = if kind == SymbolKind::Zone {
            &self.zones_by_name
        } else {
            &self.ahus_by_name
        };
        map.get(self.text(b.file, name.span))
            .is_some_and(|(d, _)| block_key(*d) == block_key(b))
    }

    fn define(&mut self, b: Blk<'a>, kind: SymbolKind) {
        let Some(name) = b.block.name else {
            let what = if kind == SymbolKind::Zone {
                "zone"
            } else {
                "ahu"
            };
            self.ev.report(
                ModelDiagnostic::new(
                    ModelCode::MissingKey,
                    loc(b.file, b.block.kind.span),
                    format!("a `{what}` needs a name"),
                )
                .help(format!("write `{what} NAME \"Label\" {{ … }}`")),
            );
            return;
        };
        let text = self.text(b.file, name.span);
        let name_loc = loc(b.file, name.span);
        let map = if kind == SymbolKind::Zone {
            &self.zones_by_name
        } else {
            &self.ahus_by_name
        };
        if let Some((first, _)) = map.get(text) {
            let first_loc = first
                .block
                .name
                .map_or(loc(first.file, first.block.span), |n| {
                    loc(first.file, n.span)
                });
            self.ev.report(
                ModelDiagnostic::new(
                    ModelCode::DuplicateName,
                    name_loc,
                    format!("{} `{text}` is defined twice", kind.describe()),
                )
                .label("defined again here")
                .related(first_loc, "first defined here")
                .help("give each a name of its own"),
            );
            return;
        }
        let sym =
            self.ev
                .symbols
                .define(kind, text.to_string(), name_loc, loc(b.file, b.block.span));
        let map = if kind == SymbolKind::Zone {
            &mut self.zones_by_name
        } else {
            &mut self.ahus_by_name
        };
        map.insert(text, (b, sym));
    }

    /// The block's own properties and nested blocks, checked against the key table.
    fn own(&mut self, b: Blk<'a>, kind: BlockKind) -> Effective<'a> {
        let mut eff = Effective::default();
        for entry in &b.block.body.entries {
            match entry {
                Entry::Property(p) => {
                    let key = self.text(b.file, p.key.span);
                    let at = loc(b.file, p.key.span);
                    let Some(def) = key_def(kind, key) else {
                        self.unknown_key(at, key, kind);
                        continue;
                    };
                    if let Some((_, first)) = eff.props.iter().find(|(k, _)| *k == key) {
                        self.ev.report(
                            ModelDiagnostic::new(
                                ModelCode::DuplicateKey,
                                at,
                                format!("`{key}` is given twice"),
                            )
                            .label("given again here")
                            .related(loc(first.file, first.prop.key.span), "first given here")
                            .help("keep one of them"),
                        );
                        continue;
                    }
                    if let Some((other, _)) =
                        eff.props.iter().find(|(k, _)| def.alternatives.contains(k))
                    {
                        self.ev.report(
                            ModelDiagnostic::new(
                                ModelCode::ConflictingKeys,
                                at,
                                format!("`{key}` and `{other}` say the same thing two ways"),
                            )
                            .help("keep one of them"),
                        );
                        continue;
                    }
                    eff.props.push((
                        key,
                        Prop {
                            file: b.file,
                            prop: p,
                        },
                    ));
                }
                Entry::Block(inner) => {
                    let word = self.text(b.file, inner.kind.span);
                    match BlockKind::from_keyword(word) {
                        Some(k) if kind.children().contains(&k) => {
                            let inner_blk = Blk {
                                file: b.file,
                                block: inner,
                            };
                            if eff.nested.iter().any(|(nk, _, _)| *nk == k) {
                                self.ev.report(
                                    ModelDiagnostic::new(
                                        ModelCode::DuplicateKey,
                                        loc(b.file, inner.kind.span),
                                        format!("`{word}` is given twice"),
                                    )
                                    .help("an air handler has one fan and one coil block"),
                                );
                                continue;
                            }
                            if inner.name.is_some() || inner.label.is_some() || inner.like.is_some()
                            {
                                self.ev.report(ModelDiagnostic::new(
                                    ModelCode::InvalidValue,
                                    loc(b.file, inner.header_span()),
                                    format!("a `{word}` block takes no name, label or `like`"),
                                ));
                            }
                            let inner_eff = self.own(inner_blk, k);
                            eff.nested.push((k, inner_blk, inner_eff.props));
                        }
                        _ => self.unknown_block(b.file, inner, kind.children()),
                    }
                }
                Entry::Error(_) => {}
            }
        }
        eff
    }

    fn unknown_key(&mut self, at: Loc, key: &str, kind: BlockKind) {
        let mut d = ModelDiagnostic::new(
            ModelCode::UnknownKey,
            at,
            format!("`{key}` is not a key of a `{}` block", kind.keyword()),
        )
        .label("unknown key");
        if let Some(near) = nearest(key, keys_of(kind).map(|k| k.name)) {
            d = d.help(format!("did you mean `{near}`?")).fix(
                format!("change to `{near}`"),
                at,
                near,
            );
        } else {
            let all: Vec<&str> = keys_of(kind).map(|k| k.name).collect();
            d = d.help(format!(
                "the keys of `{}` are {}",
                kind.keyword(),
                quoted_list(&all)
            ));
        }
        self.ev.report(d);
    }

    /// The block a block is `like`, when it names one that exists.
    fn like_parent(&self, b: Blk<'a>, kind: BlockKind) -> Option<Blk<'a>> {
        let like = b.block.like.as_ref()?;
        let target = self.text(b.file, like.name.span);
        let found = match kind {
            BlockKind::Zone => self.zones_by_name.get(target),
            _ => self.ahus_by_name.get(target),
        };
        found.map(|(p, _)| *p)
    }

    /// Resolve the `like` of every block, each after the block it is like:
    /// a depth-first walk of the `like` links with an explicit stack, so a
    /// chain of thousands of blocks deepens no recursion ([`Self::effective`]
    /// then always finds its parent resolved). A link that closes a cycle is
    /// cut, and reported by `effective`.
    fn resolve_likes(&mut self, blocks: &[Blk<'a>], kind: BlockKind) {
        let mut done: HashSet<(FileId, u32)> = HashSet::new();
        let mut open: HashSet<(FileId, u32)> = HashSet::new();
        for &root in blocks {
            if done.contains(&block_key(root)) {
                continue;
            }
            let mut stack = vec![root];
            open.insert(block_key(root));
            while let Some(&b) = stack.last() {
                if let Some(p) = self.like_parent(b, kind) {
                    let pk = block_key(p);
                    if open.contains(&pk) && !done.contains(&pk) {
                        // The parent is still being resolved: this link closes a cycle.
                        self.cut_like.insert(block_key(b));
                    } else if !done.contains(&pk) {
                        open.insert(pk);
                        stack.push(p);
                        continue;
                    }
                }
                stack.pop();
                let _ = self.effective(b, kind);
                done.insert(block_key(b));
            }
        }
    }

    /// The effective keys of a zone or air handler after `like`.
    fn effective(&mut self, b: Blk<'a>, kind: BlockKind) -> Effective<'a> {
        if let Some(e) = self.effective.get(&block_key(b)) {
            return e.clone();
        }
        if self.like_stack.contains(&block_key(b)) {
            // Reported by the caller that closed the cycle.
            return Effective::default();
        }
        self.like_stack.push(block_key(b));
        let own = self.own(b, kind);
        let mut eff = Effective::default();
        if let Some(like) = &b.block.like {
            let target = self.text(b.file, like.name.span);
            let at = loc(b.file, like.name.span);
            let found = match kind {
                BlockKind::Zone => self.zones_by_name.get(target).copied(),
                _ => self.ahus_by_name.get(target).copied(),
            };
            match found {
                Some((parent, sym)) => {
                    self.ev.reference(sym, at);
                    if self.cut_like.contains(&block_key(b))
                        || self.like_stack.contains(&block_key(parent))
                    {
                        self.ev.report(
                            ModelDiagnostic::new(
                                ModelCode::LikeCycle,
                                at,
                                format!(
                                    "`like {target}` makes a cycle: the block inherits from itself"
                                ),
                            )
                            .help("remove one `like` of the cycle"),
                        );
                    } else {
                        eff = self.effective(parent, kind);
                    }
                }
                None => {
                    let kind_word = kind.keyword();
                    let names: Vec<&str> = match kind {
                        BlockKind::Zone => self.zones_by_name.keys().copied().collect(),
                        _ => self.ahus_by_name.keys().copied().collect(),
                    };
                    let mut d = ModelDiagnostic::new(
                        ModelCode::UnknownName,
                        at,
                        format!("no {kind_word} named `{target}`"),
                    )
                    .label(format!("`like` needs another `{kind_word}`"));
                    if let Some(near) = nearest(target, names) {
                        d = d.help(format!("did you mean `{near}`?")).fix(
                            format!("change to `{near}`"),
                            at,
                            near,
                        );
                    }
                    self.ev.report(d);
                }
            }
        }
        overlay(kind, &mut eff.props, &own.props);
        for (k, blk, props) in own.nested {
            if let Some(existing) = eff.nested.iter_mut().find(|(nk, _, _)| *nk == k) {
                overlay(k, &mut existing.2, &props);
                existing.1 = blk;
            } else {
                eff.nested.push((k, blk, props));
            }
        }
        self.like_stack.pop();
        self.effective.insert(block_key(b), eff.clone());
        eff
    }

    fn project(&mut self, blocks: &[Blk<'a>]) -> Project {
        let mut project = Project::default();
        let Some(first) = blocks.first() else {
            return project;
        };
        self.only_one(blocks, "project");
        self.no_name_or_like(*first, "project");
        let own = self.own(*first, BlockKind::Project);
        project.loc = Some(loc(first.file, first.block.span));
        project.name = first.block.label.as_ref().map(|l| l.value.clone());
        if let Some(p) = own.get("units") {
            self.note(p, BlockKind::Project, None);
            if let Some(w) = self.word(p, &["ip", "si"]) {
                let system = if w == "si" {
                    UnitSystem::Si
                } else {
                    UnitSystem::Ip
                };
                project.units = Some(At::new(system, p.loc()));
            }
        }
        project
    }

    fn only_one(&mut self, blocks: &[Blk<'a>], what: &str) {
        for extra in blocks.iter().skip(1) {
            self.ev.report(
                ModelDiagnostic::new(
                    ModelCode::DuplicateName,
                    loc(extra.file, extra.block.kind.span),
                    format!("a design has one `{what}` block; this is another"),
                )
                .related(
                    loc(blocks[0].file, blocks[0].block.kind.span),
                    "the first one",
                )
                .help(format!("merge the two `{what}` blocks")),
            );
        }
    }

    fn no_name_or_like(&mut self, b: Blk<'a>, what: &str) {
        if let Some(n) = b.block.name {
            self.ev.report(ModelDiagnostic::new(
                ModelCode::InvalidValue,
                loc(b.file, n.span),
                format!("a `{what}` block has no name"),
            ));
        }
        if let Some(l) = &b.block.like {
            self.ev.report(ModelDiagnostic::new(
                ModelCode::InvalidValue,
                loc(b.file, l.keyword.cover(l.name.span)),
                format!("a `{what}` block cannot be `like` another"),
            ));
        }
    }

    fn site(&mut self, blocks: &[Blk<'a>]) -> Option<Site> {
        let first = *blocks.first()?;
        self.only_one(blocks, "site");
        self.no_name_or_like(first, "site");
        if let Some(l) = &first.block.label {
            self.ev.report(ModelDiagnostic::new(
                ModelCode::InvalidValue,
                loc(first.file, l.span),
                "a `site` block has no label",
            ));
        }
        let own = self.own(first, BlockKind::Site);
        let site_loc = loc(first.file, first.block.span);
        let mut site = Site {
            loc: site_loc,
            elevation_ft: None,
            pressure_psia: None,
            cooling: None,
            dehumid: None,
        };
        site.elevation_ft = self.number(&own, BlockKind::Site, "elevation", "ft", Range::Any);
        site.pressure_psia =
            self.number(&own, BlockKind::Site, "pressure", "psia", Range::Positive);
        if let Some(p) = own.get("cooling") {
            self.note(p, BlockKind::Site, None);
            site.cooling = self.air_state(p).map(|s| At::new(s, p.loc()));
        } else {
            self.missing(
                first,
                "cooling",
                "the cooling design outdoor state, e.g. `cooling 94 °F db, 75 °F wb`",
            );
        }
        if let Some(p) = own.get("dehumid") {
            self.note(p, BlockKind::Site, None);
            site.dehumid = self.air_state(p).map(|s| At::new(s, p.loc()));
        }
        if let Some(e) = &site.elevation_ft
            && !(-1_500.0..=30_000.0).contains(&e.value)
        {
            self.ev.report(
                ModelDiagnostic::new(
                    ModelCode::OutOfRange,
                    e.loc,
                    format!("an elevation of {:.0} ft is outside the standard atmosphere's range here (−1,500 to 30,000 ft)", e.value),
                ),
            );
            site.elevation_ft = None;
        }
        Some(site)
    }

    fn missing(&mut self, b: Blk<'a>, key: &str, what: &str) {
        self.ev.report(
            ModelDiagnostic::new(
                ModelCode::MissingKey,
                loc(b.file, b.block.header_span()),
                format!("`{key}` is required here"),
            )
            .label(format!("this block has no `{key}`"))
            .help(format!("add {what}")),
        );
    }

    fn zone(&mut self, b: Blk<'a>, id: ZoneId) -> Option<Zone> {
        let name = b.block.name?;
        let eff = self.effective(b, BlockKind::Zone);
        let k = BlockKind::Zone;
        let mut z = Zone {
            id,
            name: self.text(b.file, name.span).to_string(),
            label: b.block.label.as_ref().map(|l| l.value.clone()),
            loc: loc(b.file, b.block.span),
            name_loc: loc(b.file, name.span),
            area_ft2: self.number(&eff, k, "area", "ft²", Range::Positive),
            people: None,
            category: None,
            indoor: None,
            sensible_btuh: self.number(&eff, k, "sensible", "Btu/h", Range::NonNegative),
            latent_btuh: self.number(&eff, k, "latent", "Btu/h", Range::NonNegative),
            distribution_effectiveness: self.ratio(&eff, k, "distribution_effectiveness", 1.5),
        };
        if let Some(p) = eff.get("people") {
            self.note(p, k, None);
            z.people = self.count(p).map(|n| At::new(n, p.loc()));
        }
        if let Some(p) = eff.get("use") {
            self.note(p, k, None);
            z.category = self.word_any(p).map(|w| At::new(w.to_string(), p.loc()));
        }
        if let Some(p) = eff.get("indoor") {
            self.note(p, k, None);
            z.indoor = self.air_state(p).map(|s| At::new(s, p.loc()));
        }
        if eff.get("sensible").is_none() {
            self.missing(
                b,
                "sensible",
                "the zone's peak sensible gain, e.g. `sensible 12 kBtu/h`",
            );
        }
        Some(z)
    }

    fn ahu(&mut self, b: Blk<'a>, zones: &HashMap<String, ZoneId>) -> Option<Ahu> {
        let name = b.block.name?;
        let eff = self.effective(b, BlockKind::Ahu);
        let k = BlockKind::Ahu;
        let mut a = Ahu {
            name: self.text(b.file, name.span).to_string(),
            label: b.block.label.as_ref().map(|l| l.value.clone()),
            loc: loc(b.file, b.block.span),
            name_loc: loc(b.file, name.span),
            serves: Vec::new(),
            supply: None,
            diversity: self.ratio(&eff, k, "diversity", 1.0),
            supply_duct: None,
            return_duct: None,
            plenum_gain_btuh: self.number(&eff, k, "plenum_gain", "Btu/h", Range::NonNegative),
            fan: None,
            outdoor_air: None,
            occupant_diversity: self.ratio(&eff, k, "occupant_diversity", 1.0),
            ventilation_efficiency: None,
            outdoor_fan_rise_f: self.number(&eff, k, "outdoor_fan_rise", "Δ°F", Range::NonNegative),
            coil: None,
        };
        match eff.get("serves") {
            Some(p) => {
                self.note(p, k, None);
                a.serves = self.zone_list(p, zones);
            }
            None => self.missing(
                b,
                "serves",
                "the zones it serves, e.g. `serves reading, stacks`",
            ),
        }
        if let Some(t) = self.number(&eff, k, "supply_temp", "°F", Range::Any) {
            a.supply = Some(At::new(SupplyTemp::Temp { f: t.value }, t.loc));
        } else if let Some(dt) = self.number(&eff, k, "supply_dt", "Δ°F", Range::Positive) {
            a.supply = Some(At::new(SupplyTemp::BelowRoom { dt_f: dt.value }, dt.loc));
        }
        if let Some(l) = self.number(&eff, k, "supply_duct", "ft", Range::NonNegative) {
            a.supply_duct = Some(At::new(SupplyDuct::Length { ft: l.value }, l.loc));
        } else if let Some(r) = self.number(&eff, k, "supply_duct_rise", "Δ°F", Range::NonNegative)
        {
            a.supply_duct = Some(At::new(SupplyDuct::Rise { dt_f: r.value }, r.loc));
        }
        if let Some(p) = eff.get("return_duct") {
            self.note(p, k, None);
            a.return_duct = self.length_or_none(p).map(|r| At::new(r, p.loc()));
        } else if let Some(r) = self.number(&eff, k, "return_duct_rise", "Δ°F", Range::NonNegative)
        {
            a.return_duct = Some(At::new(ReturnDuct::Rise { dt_f: r.value }, r.loc));
        }
        if let Some(p) = eff.get("outdoor_air") {
            self.note(p, k, None);
            a.outdoor_air = self.outdoor_air(p).map(|o| At::new(o, p.loc()));
        }
        if let Some(p) = eff.get("ventilation_efficiency") {
            self.note(p, k, None);
            a.ventilation_efficiency = self.ventilation_efficiency(p).map(|v| At::new(v, p.loc()));
        }
        for (kind, blk, props) in &eff.nested {
            let sub = Effective {
                props: props.clone(),
                nested: Vec::new(),
            };
            match kind {
                BlockKind::Fan => a.fan = Some(self.fan(*blk, &sub)),
                BlockKind::Coil => a.coil = Some(self.coil(*blk, &sub)),
                _ => {}
            }
        }
        Some(a)
    }

    fn fan(&mut self, b: Blk<'a>, eff: &Effective<'a>) -> Fan {
        let k = BlockKind::Fan;
        let mut fan = Fan {
            loc: loc(b.file, b.block.span),
            power: None,
            rise_f: self.number(eff, k, "rise", "Δ°F", Range::NonNegative),
            motor_efficiency: self.ratio(eff, k, "motor_efficiency", 1.0),
            motor: None,
            arrangement: None,
        };
        if let Some(hp) = self.number(eff, k, "power", "hp", Range::Positive) {
            fan.power = Some(At::new(FanPower::Shaft { hp: hp.value }, hp.loc));
        } else if let Some(p) = eff.get("static") {
            self.note(p, k, None);
            fan.power = self.static_pressure(p).map(|s| At::new(s, p.loc()));
        }
        if let Some(p) = eff.get("motor") {
            self.note(p, k, None);
            fan.motor = self.word(p, &["in_airstream", "outside"]).map(|w| {
                At::new(
                    if w == "outside" {
                        MotorLocation::Outside
                    } else {
                        MotorLocation::InAirstream
                    },
                    p.loc(),
                )
            });
        }
        if let Some(p) = eff.get("arrangement") {
            self.note(p, k, None);
            fan.arrangement = self.word(p, &["draw_through", "blow_through"]).map(|w| {
                At::new(
                    if w == "blow_through" {
                        FanArrangement::BlowThrough
                    } else {
                        FanArrangement::DrawThrough
                    },
                    p.loc(),
                )
            });
        }
        fan
    }

    fn coil(&mut self, b: Blk<'a>, eff: &Effective<'a>) -> Coil {
        let k = BlockKind::Coil;
        let mut coil = Coil {
            loc: loc(b.file, b.block.span),
            leaving_rh: self.ratio(eff, k, "leaving_rh", 1.0),
            rated_btuh: self.number(eff, k, "rated", "Btu/h", Range::Positive),
            rated_sensible_btuh: self.number(eff, k, "rated_sensible", "Btu/h", Range::Positive),
            chilled_water: None,
            face_area_ft2: self.number(eff, k, "face_area", "ft²", Range::Positive),
        };
        if let Some(p) = eff.get("chilled_water") {
            self.note(p, k, None);
            coil.chilled_water = self.temperature_range(p).map(|r| At::new(r, p.loc()));
        }
        coil
    }

    /// Record a property for hover.
    fn note(&mut self, p: Prop<'a>, block: BlockKind, quantity: Option<Quantity>) {
        let key = self.text(p.file, p.prop.key.span);
        let Some(def) = key_def(block, key) else {
            return;
        };
        let l = p.loc();
        if let Some(&i) = self.property_at.get(&l) {
            if let Some(existing) = self.properties.get_mut(i)
                && existing.quantity.is_none()
            {
                existing.quantity = quantity;
            }
            return;
        }
        self.property_at.insert(l, self.properties.len());
        self.properties.push(PropertyInfo {
            loc: l,
            key_loc: loc(p.file, p.prop.key.span),
            block,
            def,
            quantity,
        });
    }

    /// A key that takes one quantity, converted to the IP `unit`.
    fn number(
        &mut self,
        eff: &Effective<'a>,
        block: BlockKind,
        key: &'static str,
        unit: &str,
        range: Range,
    ) -> Option<At<f64>> {
        let p = props_get(&eff.props, key)?;
        let def = key_def(block, key)?;
        let ValueKind::Quantity(dim) = def.value else {
            return None;
        };
        let q = self.ev.quantity_of(p.file, key, &p.prop.value, dim);
        self.note(p, block, q);
        let q = q?;
        let v = ip(&q, unit)?;
        self.check_range(p, key, v, unit, range)?;
        Some(At::new(v, p.loc()))
    }

    fn check_range(
        &mut self,
        p: Prop<'a>,
        key: &str,
        v: f64,
        unit: &str,
        range: Range,
    ) -> Option<()> {
        let bad = match range {
            Range::Any => None,
            Range::Positive if v <= 0.0 => Some("greater than zero"),
            Range::NonNegative if v < 0.0 => Some("zero or more"),
            _ => None,
        };
        if let Some(what) = bad {
            let shown = if unit == "Δ°F" { "°F" } else { unit };
            self.ev.report(ModelDiagnostic::new(
                ModelCode::OutOfRange,
                loc(p.file, p.prop.value.span),
                format!("`{key}` must be {what}: it is {} {shown}", trim_number(v)),
            ));
            return None;
        }
        Some(())
    }

    /// A key that takes a fraction (`95 %` or `0.95`), at most `max`.
    fn ratio(
        &mut self,
        eff: &Effective<'a>,
        block: BlockKind,
        key: &'static str,
        max: f64,
    ) -> Option<At<f64>> {
        let p = props_get(&eff.props, key)?;
        let v = self.ratio_value(p, key, max);
        self.note(p, block, v.and_then(|v| Quantity::number(v).ok()));
        v.map(|v| At::new(v, p.loc()))
    }

    fn ratio_value(&mut self, p: Prop<'a>, key: &str, max: f64) -> Option<f64> {
        if !self.ev.plain(p.file, key, &p.prop.value) {
            return None;
        }
        let el = &p.prop.value.elements.first;
        self.ratio_expr(p.file, key, &el.expr, max)
    }

    fn ratio_expr(&mut self, file: FileId, key: &str, e: &'a Expr, max: f64) -> Option<f64> {
        let v = self.ev.expr(file, e)?;
        let q = self
            .ev
            .require(file, key, e.span(), v, Dimension::RATIO, Some(e))?;
        let f = round_significant(q.value(), 12);
        if f <= 0.0 || f > max {
            let mut d = ModelDiagnostic::new(
                ModelCode::OutOfRange,
                loc(file, e.span()),
                format!(
                    "`{key}` must be above 0 % and at most {} %: it is {} %",
                    trim_number(max * 100.0),
                    trim_number(f * 100.0)
                ),
            );
            if v.unitless && f > 1.0 && f <= max * 100.0 {
                d = d
                    .help(format!(
                        "a plain number is a fraction: did you mean `{} %`?",
                        trim_number(f)
                    ))
                    .fix(
                        format!("write `{} %`", trim_number(f)),
                        loc(file, e.span()),
                        format!("{} %", self.ev.slice(file, e.span())),
                    );
            }
            self.ev.report(d);
            return None;
        }
        Some(f)
    }

    fn count(&mut self, p: Prop<'a>) -> Option<f64> {
        let key = "people";
        if !self.ev.plain(p.file, key, &p.prop.value) {
            return None;
        }
        let e = &p.prop.value.elements.first.expr;
        let v = self.ev.expr(p.file, e)?;
        // A plain number (written, or through a `let`) is a count.
        let n = if v.q.dimension() == Dimension::RATIO {
            v.q.value()
        } else {
            self.ev
                .require(p.file, key, e.span(), v, Dimension::COUNT, Some(e))?
                .value()
        };
        if n < 0.0 {
            self.ev.report(ModelDiagnostic::new(
                ModelCode::OutOfRange,
                loc(p.file, e.span()),
                format!("`{key}` must be zero or more: it is {}", trim_number(n)),
            ));
            return None;
        }
        Some(n)
    }

    /// A value that is one bare word.
    fn word_any(&mut self, p: Prop<'a>) -> Option<&'a str> {
        let key = self.text(p.file, p.prop.key.span);
        if !self.ev.plain(p.file, key, &p.prop.value) {
            return None;
        }
        match &p.prop.value.elements.first.expr {
            Expr::Name(n) => Some(self.text(p.file, n.span)),
            other => {
                self.ev.report(ModelDiagnostic::new(
                    ModelCode::InvalidValue,
                    loc(p.file, other.span()),
                    format!("`{key}` takes a word, such as a category name"),
                ));
                None
            }
        }
    }

    /// One of `words`.
    fn word(&mut self, p: Prop<'a>, words: &[&'static str]) -> Option<&'static str> {
        let key = self.text(p.file, p.prop.key.span);
        let w = self.word_any(p)?;
        if let Some(found) = words.iter().find(|x| **x == w) {
            return Some(found);
        }
        let at = loc(p.file, p.prop.value.span);
        let mut d = ModelDiagnostic::new(
            ModelCode::InvalidValue,
            at,
            format!("`{key}` is {}, not `{w}`", quoted_or(words)),
        );
        if let Some(near) = nearest(w, words.iter().copied()) {
            d = d.help(format!("did you mean `{near}`?")).fix(
                format!("change to `{near}`"),
                at,
                near,
            );
        }
        self.ev.report(d);
        None
    }

    fn zone_list(&mut self, p: Prop<'a>, zones: &HashMap<String, ZoneId>) -> Vec<At<ZoneId>> {
        let mut out = Vec::new();
        if let Some(w) = p.prop.value.with.first() {
            self.ev.report(ModelDiagnostic::new(
                ModelCode::InvalidValue,
                loc(p.file, w.span),
                "`serves` takes no `with` clause",
            ));
        }
        for el in &p.prop.value.elements {
            let Expr::Name(n) = &el.expr else {
                self.ev.report(
                    ModelDiagnostic::new(
                        ModelCode::InvalidValue,
                        loc(p.file, el.span),
                        "`serves` lists zone names",
                    )
                    .help("write `serves reading, stacks`"),
                );
                continue;
            };
            if let Some(q) = el.qualifier {
                self.ev.report(
                    ModelDiagnostic::new(
                        ModelCode::InvalidValue,
                        loc(p.file, q.span),
                        format!(
                            "unexpected `{}` after a zone name",
                            self.text(p.file, q.span)
                        ),
                    )
                    .help("separate zone names with commas")
                    .fix(
                        "add a comma",
                        loc(p.file, Span::empty(n.span.end)),
                        ",",
                    ),
                );
            }
            let name = self.text(p.file, n.span);
            let at = loc(p.file, n.span);
            match (zones.get(name), self.zones_by_name.get(name)) {
                (Some(id), Some((_, sym))) => {
                    let sym = *sym;
                    self.ev.reference(sym, at);
                    if out.iter().any(|z: &At<ZoneId>| z.value == *id) {
                        self.ev.report(ModelDiagnostic::new(
                            ModelCode::DuplicateKey,
                            at,
                            format!("`{name}` is listed twice"),
                        ));
                        continue;
                    }
                    out.push(At::new(*id, at));
                }
                _ => {
                    let mut d = ModelDiagnostic::new(
                        ModelCode::UnknownName,
                        at,
                        format!("no zone named `{name}`"),
                    )
                    .label("not defined in this file or a file it uses");
                    if let Some(near) = nearest(name, zones.keys().map(String::as_str)) {
                        d = d.help(format!("did you mean `{near}`?")).fix(
                            format!("change to `{near}`"),
                            at,
                            near,
                        );
                    }
                    self.ev.report(d);
                }
            }
        }
        out
    }

    /// The elements of a value, following a bare name to a compound `let`.
    fn elements(&mut self, file: FileId, value: &'a Value) -> (FileId, Vec<&'a Element>) {
        if value.elements.len() == 1
            && value.with.is_empty()
            && value.elements.first.qualifier.is_none()
            && value.elements.first.range_end.is_none()
            && let Expr::Name(n) = &value.elements.first.expr
        {
            let name = self.text(file, n.span);
            if let Some((lf, lv)) = self.ev.let_value(name) {
                if let Some(sym) = self.ev.let_symbol(name) {
                    self.ev.reference(sym, loc(file, n.span));
                }
                return (lf, lv.elements.iter().collect());
            }
        }
        (file, value.elements.iter().collect())
    }

    fn air_state(&mut self, p: Prop<'a>) -> Option<AirSpec> {
        let key = self.text(p.file, p.prop.key.span);
        if let Some(w) = p.prop.value.with.first() {
            self.ev.report(ModelDiagnostic::new(
                ModelCode::InvalidValue,
                loc(p.file, w.span),
                format!("`{key}` takes no `with` clause"),
            ));
            return None;
        }
        let (file, elements) = self.elements(p.file, &p.prop.value);
        let whole = loc(p.file, p.prop.value.span);
        let mut db: Option<(f64, Span)> = None;
        let mut humidity: Option<(Humidity, Span)> = None;
        let mut ok = true;
        for el in elements {
            if let Some(r) = &el.range_end {
                self.ev.report(ModelDiagnostic::new(
                    ModelCode::InvalidValue,
                    loc(file, r.keyword),
                    format!("`{key}` takes an air state, not a range"),
                ));
                ok = false;
                continue;
            }
            let Some(v) = self.ev.expr(file, &el.expr) else {
                ok = false;
                continue;
            };
            let qual = el.qualifier.map(|q| self.text(file, q.span));
            let span = el.span;
            let dim = v.q.dimension();
            let part = if dim == Dimension::TEMPERATURE {
                let f = ip(&v.q, "°F")?;
                match qual {
                    None | Some("db") => Part::Db(f),
                    Some("wb") => Part::Humidity(Humidity::Wb(f)),
                    Some("dp") => Part::Humidity(Humidity::Dp(f)),
                    Some(other) => {
                        let mut d = ModelDiagnostic::new(
                            ModelCode::InvalidValue,
                            loc(file, el.qualifier.map_or(span, |q| q.span)),
                            format!("`{other}` is not a part of an air state"),
                        )
                        .help("a temperature is `db` (dry bulb, the default), `wb` (wet bulb) or `dp` (dew point)");
                        if let (Some(q), Some(near)) =
                            (el.qualifier, nearest(other, ["db", "wb", "dp"]))
                        {
                            d = d.fix(format!("change to `{near}`"), loc(file, q.span), near);
                        }
                        self.ev.report(d);
                        ok = false;
                        continue;
                    }
                }
            } else if dim == Dimension::RATIO && !v.unitless {
                if qual.is_some() {
                    self.qualifier_not_allowed(file, el);
                    ok = false;
                    continue;
                }
                Part::Humidity(Humidity::Rh(round_significant(v.q.value(), 12)))
            } else if dim == Dimension::HUMIDITY_RATIO {
                if qual.is_some() {
                    self.qualifier_not_allowed(file, el);
                    ok = false;
                    continue;
                }
                Part::Humidity(Humidity::W(ip(&v.q, "lb/lb")?))
            } else if v.unitless {
                let mut d = ModelDiagnostic::new(
                    ModelCode::MissingUnit,
                    loc(file, el.expr.span()),
                    format!("`{key}`: this number needs a unit"),
                )
                .label("a number without a unit")
                .help("write a temperature (`94 °F db`), a relative humidity (`50 %rh`) or a humidity ratio (`0.0098 lb/lb`)");
                if let Expr::Number(n) = &el.expr {
                    d = d.fix("add `°F`", loc(file, Span::empty(n.digits.end)), " °F");
                }
                self.ev.report(d);
                ok = false;
                continue;
            } else {
                self.ev.report(
                    ModelDiagnostic::new(
                        ModelCode::UnitMismatch,
                        loc(file, el.expr.span()),
                        format!(
                            "`{key}` expects an air state, found {}",
                            dimension_words(dim)
                        ),
                    )
                    .help("an air state is a dry bulb with a wet bulb, dew point, relative humidity (%rh) or humidity ratio (lb/lb, gr/lb, g/kg)"),
                );
                ok = false;
                continue;
            };
            match part {
                Part::Db(f) => {
                    if let Some((_, first)) = db {
                        self.ev.report(
                            ModelDiagnostic::new(
                                ModelCode::InvalidValue,
                                loc(file, span),
                                format!("`{key}` has two dry bulbs"),
                            )
                            .related(loc(file, first), "the first")
                            .help("qualify the other temperature: `wb` or `dp`"),
                        );
                        ok = false;
                    } else {
                        db = Some((f, span));
                    }
                }
                Part::Humidity(h) => {
                    if let Some((_, first)) = humidity {
                        self.ev.report(
                            ModelDiagnostic::new(
                                ModelCode::InvalidValue,
                                loc(file, span),
                                format!("`{key}` has two humidity measures: give one"),
                            )
                            .related(loc(file, first), "the first"),
                        );
                        ok = false;
                    } else {
                        humidity = Some((h, span));
                    }
                }
            }
        }
        if !ok {
            return None;
        }
        let Some((db, db_span)) = db else {
            self.ev.report(
                ModelDiagnostic::new(
                    ModelCode::InvalidValue,
                    whole,
                    format!("`{key}` needs a dry bulb"),
                )
                .help("for example `94 °F db, 75 °F wb`"),
            );
            return None;
        };
        let Some((h, h_span)) = humidity else {
            self.ev.report(
                ModelDiagnostic::new(
                    ModelCode::InvalidValue,
                    whole,
                    format!("`{key}` needs a humidity measure with the dry bulb"),
                )
                .help("add a wet bulb (`75 °F wb`), a dew point (`55 °F dp`), a relative humidity (`50 %rh`) or a humidity ratio (`0.0098 lb/lb`)"),
            );
            return None;
        };
        let range_err = |what: String| {
            ModelDiagnostic::new(ModelCode::OutOfRange, loc(file, h_span), what)
                .related(loc(file, db_span), "the dry bulb")
        };
        let spec = match h {
            Humidity::Wb(wb) if wb > db + 1e-9 => {
                self.ev.report(range_err(format!(
                    "the wet bulb ({} °F) is above the dry bulb ({} °F)",
                    trim_number(wb),
                    trim_number(db)
                )));
                return None;
            }
            Humidity::Dp(dp) if dp > db + 1e-9 => {
                self.ev.report(range_err(format!(
                    "the dew point ({} °F) is above the dry bulb ({} °F)",
                    trim_number(dp),
                    trim_number(db)
                )));
                return None;
            }
            Humidity::Rh(rh) if !(rh > 0.0 && rh <= 1.0) => {
                self.ev.report(range_err(format!(
                    "a relative humidity must be above 0 % and at most 100 %: it is {} %",
                    trim_number(rh * 100.0)
                )));
                return None;
            }
            Humidity::W(w) if w < 0.0 => {
                self.ev
                    .report(range_err("a humidity ratio cannot be negative".to_string()));
                return None;
            }
            Humidity::Wb(wb_f) => AirSpec::DbWb { db_f: db, wb_f },
            Humidity::Dp(dp_f) => AirSpec::DbDp { db_f: db, dp_f },
            Humidity::Rh(rh) => AirSpec::DbRh { db_f: db, rh },
            Humidity::W(w) => AirSpec::DbW { db_f: db, w },
        };
        Some(spec)
    }

    fn qualifier_not_allowed(&mut self, file: FileId, el: &Element) {
        if let Some(q) = el.qualifier {
            self.ev.report(ModelDiagnostic::new(
                ModelCode::InvalidValue,
                loc(file, q.span),
                format!("`{}` qualifies a temperature only", self.text(file, q.span)),
            ));
        }
    }

    fn outdoor_air(&mut self, p: Prop<'a>) -> Option<OutdoorAir> {
        let key = "outdoor_air";
        if !self.ev.plain(p.file, key, &p.prop.value) {
            return None;
        }
        let e = &p.prop.value.elements.first.expr;
        if let Expr::Name(n) = e {
            let w = self.text(p.file, n.span);
            if w == "ventilation" {
                return Some(OutdoorAir::Ventilation);
            }
            if self.ev.let_symbol(w).is_none() {
                let at = loc(p.file, n.span);
                let mut d = ModelDiagnostic::new(
                    ModelCode::InvalidValue,
                    at,
                    format!("`outdoor_air` is `ventilation` or an amount, not `{w}`"),
                );
                if nearest(w, ["ventilation"]).is_some() {
                    d = d.fix("change to `ventilation`", at, "ventilation");
                }
                self.ev.report(d);
                return None;
            }
        }
        let v = self.ev.expr(p.file, e)?;
        let dim = v.q.dimension();
        let out = if dim == Dimension::AIRFLOW {
            OutdoorAir::Airflow {
                cfm: ip(&v.q, "cfm")?,
            }
        } else if dim == Dimension::RATIO && !v.unitless {
            let f = round_significant(v.q.value(), 12);
            if !(f > 0.0 && f <= 1.0 + 1e-12) {
                self.ev.report(ModelDiagnostic::new(
                    ModelCode::OutOfRange,
                    loc(p.file, e.span()),
                    format!("`outdoor_air` as a percentage of supply must be above 0 % and at most 100 %: it is {} %", trim_number(f * 100.0)),
                ));
                return None;
            }
            if f >= 1.0 - 1e-12 {
                OutdoorAir::All
            } else {
                OutdoorAir::FractionOfSupply { fraction: f }
            }
        } else if dim == Dimension::AIRFLOW_PER_PERSON {
            OutdoorAir::PerPerson {
                cfm: ip(&v.q, "cfm/person")?,
            }
        } else if dim == Dimension::AIRFLOW_PER_AREA {
            OutdoorAir::PerArea {
                cfm_per_ft2: ip(&v.q, "cfm/ft²")?,
            }
        } else {
            let (code, message) = if v.unitless {
                (
                    ModelCode::MissingUnit,
                    "`outdoor_air` needs a unit".to_string(),
                )
            } else {
                (
                    ModelCode::UnitMismatch,
                    format!(
                        "`outdoor_air` expects an airflow, a percentage or a rate per person or per area, found {}",
                        dimension_words(dim)
                    ),
                )
            };
            self.ev.report(
                ModelDiagnostic::new(code, loc(p.file, e.span()), message)
                    .help("for example `1_200 cfm`, `20 %`, `15 cfm/person`, `0.06 cfm/ft²`, `100 %` or `ventilation`"),
            );
            return None;
        };
        let amount = match out {
            OutdoorAir::Airflow { cfm } => cfm,
            OutdoorAir::PerPerson { cfm } => cfm,
            OutdoorAir::PerArea { cfm_per_ft2 } => cfm_per_ft2,
            _ => 1.0,
        };
        if amount < 0.0 {
            self.ev.report(ModelDiagnostic::new(
                ModelCode::OutOfRange,
                loc(p.file, e.span()),
                "`outdoor_air` cannot be negative",
            ));
            return None;
        }
        self.note(p, BlockKind::Ahu, Some(v.q));
        Some(out)
    }

    fn length_or_none(&mut self, p: Prop<'a>) -> Option<ReturnDuct> {
        let key = "return_duct";
        if !self.ev.plain(p.file, key, &p.prop.value) {
            return None;
        }
        let e = &p.prop.value.elements.first.expr;
        if matches!(e, Expr::None(_)) {
            return Some(ReturnDuct::None);
        }
        let v = self.ev.expr(p.file, e)?;
        let q = self
            .ev
            .require(p.file, key, e.span(), v, Dimension::LENGTH, Some(e))?;
        self.note(p, BlockKind::Ahu, Some(q));
        let ft = ip(&q, "ft")?;
        self.check_range(p, key, ft, "ft", Range::NonNegative)?;
        Some(ReturnDuct::Length { ft })
    }

    fn static_pressure(&mut self, p: Prop<'a>) -> Option<FanPower> {
        let key = "static";
        let value = &p.prop.value;
        if value.elements.len() != 1 {
            self.ev.report(ModelDiagnostic::new(
                ModelCode::InvalidValue,
                loc(p.file, value.span),
                "`static` takes one pressure and `with efficiency`",
            ));
            return None;
        }
        let el = &value.elements.first;
        let v = self.ev.expr(p.file, &el.expr)?;
        let q = self.ev.require(
            p.file,
            key,
            el.expr.span(),
            v,
            Dimension::PRESSURE,
            Some(&el.expr),
        )?;
        self.note(p, BlockKind::Fan, Some(q));
        let in_wg = ip(&q, "in.wg")?;
        self.check_range(p, key, in_wg, "in.wg", Range::Positive)?;
        let mut efficiency = None;
        for w in &value.with {
            let wk = self.text(p.file, w.key.span);
            if wk != "efficiency" {
                let at = loc(p.file, w.key.span);
                let mut d = ModelDiagnostic::new(
                    ModelCode::UnknownKey,
                    at,
                    format!("`with {wk}` is not known here; `static` takes `with efficiency`"),
                );
                if nearest(wk, ["efficiency"]).is_some() {
                    d = d.fix("change to `efficiency`", at, "efficiency");
                }
                self.ev.report(d);
                return None;
            }
            if !self.ev.plain(p.file, "efficiency", &w.value) {
                return None;
            }
            efficiency = self.ratio_expr(p.file, "efficiency", &w.value.elements.first.expr, 1.0);
            efficiency?;
        }
        let Some(efficiency) = efficiency else {
            self.ev.report(
                ModelDiagnostic::new(
                    ModelCode::MissingKey,
                    loc(p.file, value.span),
                    "`static` needs the fan efficiency",
                )
                .help("write `static 2.5 in.wg with efficiency 62 %`")
                .fix(
                    "add `with efficiency 60 %`",
                    loc(p.file, Span::empty(value.span.end)),
                    " with efficiency 60 %",
                ),
            );
            return None;
        };
        Some(FanPower::Static { in_wg, efficiency })
    }

    fn ventilation_efficiency(&mut self, p: Prop<'a>) -> Option<VentilationEfficiency> {
        let key = "ventilation_efficiency";
        if !self.ev.plain(p.file, key, &p.prop.value) {
            return None;
        }
        let e = &p.prop.value.elements.first.expr;
        if let Expr::Name(n) = e {
            let w = self.text(p.file, n.span);
            match w {
                "simplified" => return Some(VentilationEfficiency::Simplified),
                "calculated" => return Some(VentilationEfficiency::Calculated),
                _ if self.ev.let_symbol(w).is_none() => {
                    let at = loc(p.file, n.span);
                    let mut d = ModelDiagnostic::new(
                        ModelCode::InvalidValue,
                        at,
                        format!("`{key}` is `simplified`, `calculated` or a percentage, not `{w}`"),
                    );
                    if let Some(near) = nearest(w, ["simplified", "calculated"]) {
                        d = d.fix(format!("change to `{near}`"), at, near);
                    }
                    self.ev.report(d);
                    return None;
                }
                _ => {}
            }
        }
        let ev = self.ratio_expr(p.file, key, e, 1.0)?;
        Some(VentilationEfficiency::Given { ev })
    }

    fn temperature_range(&mut self, p: Prop<'a>) -> Option<(f64, f64)> {
        let key = "chilled_water";
        let value = &p.prop.value;
        let el = &value.elements.first;
        let Some(end) = el
            .range_end
            .as_ref()
            .filter(|_| value.elements.len() == 1 && value.with.is_empty())
        else {
            self.ev.report(
                ModelDiagnostic::new(
                    ModelCode::InvalidValue,
                    loc(p.file, value.span),
                    format!("`{key}` takes a range: supply `to` return"),
                )
                .help("write `chilled_water 44 °F to 56 °F`"),
            );
            return None;
        };
        let a = self.ev.expr(p.file, &el.expr);
        let b = self.ev.expr(p.file, &end.expr);
        let a = self.ev.require(
            p.file,
            key,
            el.expr.span(),
            a?,
            Dimension::TEMPERATURE,
            Some(&el.expr),
        )?;
        let b = self.ev.require(
            p.file,
            key,
            end.expr.span(),
            b?,
            Dimension::TEMPERATURE,
            Some(&end.expr),
        )?;
        let (sf, rf) = (ip(&a, "°F")?, ip(&b, "°F")?);
        if rf <= sf {
            self.ev.report(
                ModelDiagnostic::new(
                    ModelCode::OutOfRange,
                    loc(p.file, value.span),
                    format!(
                        "the chilled water must return warmer than it is supplied ({} °F to {} °F)",
                        trim_number(sf),
                        trim_number(rf)
                    ),
                )
                .help("write the supply temperature first: `44 °F to 56 °F`"),
            );
            return None;
        }
        Some((sf, rf))
    }

    fn served_checks(&mut self, zones: &[Zone], ahus: &[Ahu]) {
        let mut served: HashMap<ZoneId, Vec<(&str, Loc)>> = HashMap::new();
        for a in ahus {
            for z in &a.serves {
                served
                    .entry(z.value)
                    .or_default()
                    .push((a.name.as_str(), z.loc));
            }
        }
        for z in zones {
            match served.get(&z.id).map(Vec::as_slice) {
                None | Some([]) => {
                    if !ahus.is_empty() {
                        self.ev.report(
                            ModelDiagnostic::new(
                                ModelCode::UnservedZone,
                                z.name_loc,
                                format!("zone `{}` is served by no air handler", z.name),
                            )
                            .label("its load is in no coil")
                            .help("add it to the `serves` list of the air handler that serves it"),
                        );
                    }
                }
                Some([_]) => {}
                Some([(first, first_loc), rest @ ..]) => {
                    for (other, other_loc) in rest {
                        self.ev.report(
                            ModelDiagnostic::new(
                                ModelCode::ZoneServedTwice,
                                *other_loc,
                                format!(
                                    "zone `{}` is served by both `{first}` and `{other}`",
                                    z.name
                                ),
                            )
                            .related(*first_loc, format!("also served by `{first}`"))
                            .help("a zone's load belongs to one air handler; remove it from one `serves` list"),
                        );
                    }
                }
            }
        }
    }
}

#[derive(Clone, Copy, Debug)]
enum Humidity {
    Wb(f64),
    Dp(f64),
    Rh(f64),
    W(f64),
}

enum Part {
    Db(f64),
    Humidity(Humidity),
}

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
enum Range {
    Any,
    Positive,
    NonNegative,
}

/// The number of IP `unit`s in `q` (`Δ°F` reads a difference in °F).
///
/// Quantities are held in SI, so `94 °F` comes back as 94.00000000000006 after
/// its trip through kelvin. The result is rounded to 12 significant digits,
/// far below any physical meaning, so that a value reads back as written.
fn ip(q: &Quantity, unit: &str) -> Option<f64> {
    let text = if unit == "Δ°F" { "°F" } else { unit };
    let v = match ip_units().iter().find(|(s, _)| *s == text) {
        Some((_, u)) => q.in_unit(u.as_ref()?),
        None => q.in_unit(&Unit::parse(text).ok()?),
    };
    let v = v.ok().filter(|v| v.is_finite())?;
    Some(round_significant(v, 12))
}

/// The IP units the lowering converts to, parsed once for the process
/// (parsing one per value cost more than the rest of the lowering).
fn ip_units() -> &'static [(&'static str, Option<Unit>)] {
    static UNITS: std::sync::OnceLock<Vec<(&'static str, Option<Unit>)>> =
        std::sync::OnceLock::new();
    UNITS.get_or_init(|| {
        [
            "Btu/h",
            "ft",
            "ft²",
            "°F",
            "hp",
            "in.wg",
            "psia",
            "cfm",
            "cfm/ft²",
            "cfm/person",
            "lb/lb",
        ]
        .into_iter()
        .map(|s| (s, Unit::parse(s).ok()))
        .collect()
    })
}

fn round_significant(v: f64, digits: i32) -> f64 {
    if v == 0.0 || !v.is_finite() {
        return v;
    }
    let magnitude = v.abs().log10().floor() as i32;
    let scale = 10f64.powi(digits - 1 - magnitude);
    if !scale.is_finite() || scale == 0.0 {
        return v;
    }
    let r = (v * scale).round() / scale;
    if r.is_finite() { r } else { v }
}

/// A number without needless digits (`18`, `2.5`, `0.0098`).
pub(crate) fn trim_number(v: f64) -> String {
    let s = format!("{v:.6}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    if s == "-0" {
        "0".to_string()
    } else {
        s.to_string()
    }
}

fn quoted_list(words: &[&str]) -> String {
    let q: Vec<String> = words.iter().map(|w| format!("`{w}`")).collect();
    q.join(", ")
}

fn quoted_or(words: &[&str]) -> String {
    match words {
        [] => String::new(),
        [one] => format!("`{one}`"),
        [init @ .., last] => format!("{} or `{last}`", quoted_list(init)),
    }
}
