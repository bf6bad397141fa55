//! From one design of the project runner (`plenum-checks`: its model, its
//! evaluation and its diagnostics) to what the report shows: which air
//! handlers are computed and which are left out (and why), the zone rows,
//! the diagnostics that left a value unknown, the findings and the
//! assumptions. Codes and messages are those of `plenum check`.
//!
//! # Which air handlers are left out
//!
//! Findings (the checks of the results: an undersized coil, a ventilation
//! shortfall, a humid room) never leave anything out. A diagnostic that
//! leaves a value unknown does — a syntax, model or engine error, or an
//! engine `not-evaluated` note:
//!
//! * inside an air handler's block: that unit;
//! * inside a zone's block: every unit that serves the zone, or a zone that
//!   inherits from it by `like` (followed through any chain of `like`);
//! * inside a `let`: every block that uses the `let` (also through other
//!   `let`s), and so the units above;
//! * inside the `project` block: no unit (its name and units feed no figure);
//! * anywhere else (the site, a `use`, the top level) and every syntax error:
//!   every unit of the design. While a file has a syntax error the model
//!   holds back its name-resolution findings, so that one mistake does not
//!   cascade; a name that did not resolve could then go unreported and a
//!   default be used in its place, so the report computes nothing from such
//!   a design.
//!
//! An air handler the engine could not compute is left out whatever the
//! diagnostics say (with the engine's error code as the reason if nothing
//! else names one).

use std::collections::{BTreeSet, HashMap};
use std::path::{Path, PathBuf};

use plenum_checks::{Diagnostic as Check, FileReport, Group, Severity};
use plenum_engine::{AhuResult, DesignCase, Evaluation, ZoneFlow};
use plenum_model::{Loc, Model, SymbolKind};
use plenum_syntax::{ColumnUnit, LineIndex};

use super::conv::Conv;
use super::words;

/// A place in a file, one-based, columns in characters.
#[derive(Clone, Debug, PartialEq, Eq, PartialOrd, Ord)]
pub struct Pos {
    pub file: String,
    pub line: u32,
    pub column: u32,
    pub end_line: u32,
    pub end_column: u32,
}

impl Pos {
    /// `file:line:column`
    pub fn short(&self) -> String {
        format!("{}:{}:{}", self.file, self.line, self.column)
    }
}

/// A diagnostic as the report shows it: something that left a value
/// unknown, or a finding.
#[derive(Clone, Debug, PartialEq)]
pub struct Note {
    pub pos: Pos,
    pub code: &'static str,
    pub severity: Severity,
    pub message: String,
    pub help: Option<String>,
    /// The air handler it concerns (inside its block, or a zone it serves).
    pub ahu: Option<String>,
}

/// A default the engine used.
#[derive(Clone, Debug, PartialEq, Eq, PartialOrd, Ord)]
pub struct Assumed {
    /// `site`, `zone reading`, `ahu ahu_1`.
    pub subject: String,
    /// The zone's name, for a zone's default.
    pub zone: Option<String>,
    pub key: &'static str,
    pub value: String,
    pub source: &'static str,
}

/// One air handler of a design.
pub struct AhuEntry {
    /// Index in the design (and the evaluation).
    pub index: usize,
    pub name: String,
    pub label: Option<String>,
    pub pos: Pos,
    /// Served zones, by name, in `serves` order.
    pub serves: Vec<String>,
    /// Why it is left out (empty: it is computed).
    pub reasons: Vec<Note>,
    pub findings: Vec<Note>,
    pub assumptions: Vec<Assumed>,
}

/// One zone of a design.
pub struct ZoneEntry {
    pub index: usize,
    pub name: String,
    pub label: Option<String>,
    pub pos: Pos,
    /// The computed air handler its figures come from.
    pub ahu: Option<usize>,
    /// Every air handler that names it in `serves`.
    pub served_by: Vec<String>,
    /// Its figures at that unit's governing case.
    pub flow: Option<ZoneFlow>,
    pub case: Option<DesignCase>,
    /// Why it has no figures.
    pub note: Option<String>,
}

/// One design: a root file and the files it uses.
pub struct DesignReport {
    pub model: Model,
    pub eval: Evaluation,
    /// The root file.
    pub file: String,
    pub project: Option<String>,
    pub ahus: Vec<AhuEntry>,
    pub zones: Vec<ZoneEntry>,
    /// Everything that left a value unknown.
    pub diagnostics: Vec<Note>,
    /// Findings that concern no one air handler (the site, unserved zones,
    /// settings); each unit's own are in [`AhuEntry::findings`].
    pub findings: Vec<Note>,
    /// Every default used by a computed unit, once each.
    pub assumptions: Vec<Assumed>,
}

impl DesignReport {
    /// The result of a computed air handler.
    pub fn result(&self, entry: &AhuEntry) -> Option<&AhuResult> {
        if !entry.reasons.is_empty() {
            return None;
        }
        self.eval.ahus.get(entry.index)?.result.as_ref().ok()
    }

    /// The computed air handlers with their results.
    pub fn computed(&self) -> impl Iterator<Item = (&AhuEntry, &AhuResult)> {
        self.ahus
            .iter()
            .filter_map(move |a| self.result(a).map(|r| (a, r)))
    }

    /// The air handlers left out.
    pub fn left_out(&self) -> impl Iterator<Item = &AhuEntry> {
        self.ahus.iter().filter(|a| !a.reasons.is_empty())
    }

    /// Every finding: the design's, then each computed unit's.
    pub fn all_findings(&self) -> impl Iterator<Item = &Note> {
        self.findings
            .iter()
            .chain(self.computed().flat_map(|(a, _)| a.findings.iter()))
    }
}

/// Line indexes of the files diagnostics point into.
pub struct Lines<'a>(pub HashMap<&'a Path, &'a LineIndex>);

impl<'a> Lines<'a> {
    pub fn new(files: &'a [FileReport], model: &'a Model) -> Lines<'a> {
        let mut map: HashMap<&Path, &LineIndex> = HashMap::new();
        for f in &model.files {
            map.insert(f.path.as_path(), &f.lines);
        }
        for f in files {
            map.entry(f.path.as_path()).or_insert(&f.lines);
        }
        Lines(map)
    }

    pub fn pos(&self, file: &Path, span: plenum_syntax::Span) -> Pos {
        let (s, e) = match self.0.get(file) {
            Some(lines) => (
                lines.line_col(span.start, ColumnUnit::Char),
                lines.line_col(span.end, ColumnUnit::Char),
            ),
            None => {
                let zero = plenum_syntax::LineCol { line: 0, col: 0 };
                (zero, zero)
            }
        };
        Pos {
            file: file.display().to_string(),
            line: s.line + 1,
            column: s.col + 1,
            end_line: e.line + 1,
            end_column: e.col + 1,
        }
    }
}

fn model_pos(model: &Model, lines: &Lines<'_>, loc: Loc) -> Pos {
    match model.file(loc.file) {
        Some(f) => lines.pos(&f.path, loc.span),
        None => lines.pos(Path::new(""), loc.span),
    }
}

fn inside(outer: Loc, inner: Loc) -> bool {
    outer.file == inner.file
        && outer.span.start <= inner.span.start
        && inner.span.start < outer.span.end.max(outer.span.start + 1)
}

/// Whether a diagnostic leaves a value unknown.
fn leaves_unknown(d: &Check) -> bool {
    let group = plenum_checks::lookup(d.code).map(|c| c.group);
    d.code == "not-evaluated"
        || (d.severity == Severity::Error
            && matches!(group, Some(Group::Syntax | Group::Model | Group::Engine)))
}

/// What a block depends on, for the left-out analysis.
#[derive(Default, Clone)]
struct Node {
    /// Diagnostics (indices) that leave one of its values unknown.
    own: BTreeSet<usize>,
    lets: BTreeSet<usize>,
    zones: BTreeSet<usize>,
    ahus: BTreeSet<usize>,
}

/// Where a place of the design lies: in which unit, zone or `let`.
enum Site {
    Ahu(usize),
    Zone(usize),
    Let(usize),
    Project,
    Elsewhere,
}

/// Build the report of one design from its model, evaluation and
/// diagnostics (`checks`, as `plenum_checks::check` returns them).
pub fn design(
    root: &Path,
    model: Model,
    eval: Evaluation,
    checks: Vec<Check>,
    files: &[FileReport],
    c: Conv,
) -> DesignReport {
    let lines = Lines::new(files, &model);
    let d = &model.design;
    let file_id = |p: &PathBuf| model.files.iter().find(|f| &f.path == p).map(|f| f.id);
    let lets: Vec<(usize, Loc)> = model
        .symbols
        .defs
        .iter()
        .enumerate()
        .filter(|(_, s)| s.kind == SymbolKind::Let)
        .map(|(i, s)| (i, s.loc))
        .collect();
    let site_of = |loc: Loc| -> Site {
        if let Some(j) = d.ahus.iter().position(|a| inside(a.loc, loc)) {
            Site::Ahu(j)
        } else if let Some(j) = d.zones.iter().position(|z| inside(z.loc, loc)) {
            Site::Zone(j)
        } else if let Some(j) = lets.iter().position(|(_, l)| inside(*l, loc)) {
            Site::Let(j)
        } else if d.project.loc.is_some_and(|p| inside(p, loc)) {
            Site::Project
        } else {
            Site::Elsewhere
        }
    };
    // The units a place concerns, for attributing findings.
    let served_by = |z: usize| -> Vec<usize> {
        d.ahus
            .iter()
            .enumerate()
            .filter(|(_, a)| a.serves.iter().any(|s| s.value.0 as usize == z))
            .map(|(j, _)| j)
            .collect()
    };

    // Split the diagnostics: those that leave a value unknown, the findings
    // (the defaults have their own table).
    let mut unknown: Vec<(Option<Loc>, Note)> = Vec::new();
    let mut findings: Vec<(Option<Loc>, Note)> = Vec::new();
    for x in checks {
        if x.code == plenum_checks::ASSUMPTION {
            continue;
        }
        let loc = file_id(&x.loc.file).map(|file| Loc {
            file,
            span: x.loc.span,
        });
        let note = Note {
            pos: lines.pos(&x.loc.file, x.loc.span),
            code: x.code,
            severity: x.severity,
            message: x.message.clone(),
            help: x.help.clone(),
            ahu: None,
        };
        if leaves_unknown(&x) {
            unknown.push((loc, note));
        } else {
            findings.push((loc, note));
        }
    }

    // The dependency graph of lets, zones and air handlers.
    let mut let_nodes = vec![Node::default(); lets.len()];
    let mut zone_nodes = vec![Node::default(); d.zones.len()];
    let mut ahu_nodes = vec![Node::default(); d.ahus.len()];
    let mut everywhere: BTreeSet<usize> = BTreeSet::new();
    for (i, (loc, note)) in unknown.iter().enumerate() {
        let group = plenum_checks::lookup(note.code).map(|c| c.group);
        match loc.map(site_of) {
            _ if group == Some(Group::Syntax) => {
                everywhere.insert(i);
            }
            Some(Site::Ahu(j)) => {
                ahu_nodes[j].own.insert(i);
            }
            Some(Site::Zone(j)) => {
                zone_nodes[j].own.insert(i);
            }
            Some(Site::Let(j)) => {
                let_nodes[j].own.insert(i);
            }
            Some(Site::Project) => {}
            Some(Site::Elsewhere) | None => {
                everywhere.insert(i);
            }
        }
    }
    for r in &model.symbols.refs {
        let Some(def) = model.symbols.defs.get(r.def) else {
            continue;
        };
        let target = match def.kind {
            SymbolKind::Let => lets.iter().position(|(i, _)| *i == r.def).map(|j| (0, j)),
            SymbolKind::Zone => d
                .zones
                .iter()
                .position(|z| z.name == def.name)
                .map(|j| (1, j)),
            SymbolKind::Ahu => d
                .ahus
                .iter()
                .position(|a| a.name == def.name)
                .map(|j| (2, j)),
        };
        let Some((kind, j)) = target else { continue };
        let from = match site_of(r.loc) {
            Site::Ahu(a) => ahu_nodes.get_mut(a),
            Site::Zone(z) => zone_nodes.get_mut(z),
            Site::Let(l) => let_nodes.get_mut(l),
            Site::Project | Site::Elsewhere => None,
        };
        if let Some(node) = from {
            match kind {
                0 => node.lets.insert(j),
                1 => node.zones.insert(j),
                _ => node.ahus.insert(j),
            };
        }
    }
    for (j, a) in d.ahus.iter().enumerate() {
        for z in &a.serves {
            ahu_nodes[j].zones.insert(z.value.0 as usize);
        }
    }
    // Propagate to a fixed point: a block is as unknown as what it uses.
    loop {
        let snapshot = (let_nodes.clone(), zone_nodes.clone(), ahu_nodes.clone());
        let mut changed = false;
        for nodes in [&mut let_nodes, &mut zone_nodes, &mut ahu_nodes] {
            for n in nodes.iter_mut() {
                let before = n.own.len();
                for &l in &n.lets {
                    if let Some(x) = snapshot.0.get(l) {
                        n.own.extend(x.own.iter().copied());
                    }
                }
                for &z in &n.zones {
                    if let Some(x) = snapshot.1.get(z) {
                        n.own.extend(x.own.iter().copied());
                    }
                }
                for &a in &n.ahus {
                    if let Some(x) = snapshot.2.get(a) {
                        n.own.extend(x.own.iter().copied());
                    }
                }
                changed |= n.own.len() != before;
            }
        }
        if !changed {
            break;
        }
    }

    let mut ahus = Vec::new();
    for (j, a) in d.ahus.iter().enumerate() {
        let causes: BTreeSet<usize> = ahu_nodes[j].own.union(&everywhere).copied().collect();
        let mut reasons: Vec<Note> = causes
            .into_iter()
            .filter_map(|i| unknown.get(i).map(|(_, x)| x.clone()))
            .collect();
        let outcome = eval.ahus.get(j).map(|o| &o.result);
        if reasons.is_empty() {
            match outcome {
                Some(Ok(_)) => {}
                Some(Err(e)) => reasons.push(Note {
                    pos: model_pos(&model, &lines, e.loc()),
                    code: plenum_checks::error_code(e),
                    severity: Severity::Error,
                    message: format!("`{}` has no result from the engine", a.name),
                    help: None,
                    ahu: Some(a.name.clone()),
                }),
                None => reasons.push(Note {
                    pos: model_pos(&model, &lines, a.name_loc),
                    code: "not-evaluated",
                    severity: Severity::Error,
                    message: format!("`{}` was not evaluated", a.name),
                    help: None,
                    ahu: Some(a.name.clone()),
                }),
            }
        }
        let assumptions = match (reasons.is_empty(), outcome) {
            (true, Some(Ok(r))) => r
                .assumptions
                .iter()
                .map(|x| Assumed {
                    subject: words::subject(x, d),
                    zone: match x.subject {
                        plenum_engine::Subject::Zone(z) => d.zone(z).map(|z| z.name.clone()),
                        _ => None,
                    },
                    key: x.key,
                    value: words::assumed_value(x, c),
                    source: x.source.label(),
                })
                .collect(),
            _ => Vec::new(),
        };
        ahus.push(AhuEntry {
            index: j,
            name: a.name.clone(),
            label: a.label.clone(),
            pos: model_pos(&model, &lines, a.name_loc),
            serves: a
                .serves
                .iter()
                .filter_map(|z| d.zone(z.value).map(|z| z.name.clone()))
                .collect(),
            reasons,
            findings: Vec::new(),
            assumptions,
        });
    }

    // Each finding goes with the computed unit it concerns, if one.
    let mut design_findings = Vec::new();
    for (loc, mut note) in findings {
        let unit = match loc.map(site_of) {
            Some(Site::Ahu(j)) => Some(j),
            Some(Site::Zone(z)) => served_by(z).into_iter().next(),
            _ => None,
        };
        match unit.and_then(|j| ahus.get_mut(j)) {
            Some(entry) if entry.reasons.is_empty() => {
                note.ahu = Some(entry.name.clone());
                entry.findings.push(note);
            }
            _ => design_findings.push(note),
        }
    }

    // Zones: figures from the first computed air handler that serves them.
    let mut zones = Vec::new();
    for (i, z) in d.zones.iter().enumerate() {
        let served = served_by(i);
        let mut found = None;
        for &j in &served {
            if !ahus[j].reasons.is_empty() {
                continue;
            }
            if let Some(Ok(r)) = eval.ahus.get(j).map(|o| &o.result)
                && let Some(f) = r.governing().zones.iter().find(|f| f.zone == z.id)
            {
                found = Some((j, f.clone(), r.governing));
                break;
            }
        }
        let note = match (&found, served.is_empty()) {
            (Some(_), _) => None,
            (None, true) => Some("served by no air handler".to_string()),
            (None, false) => {
                let names: Vec<String> = served
                    .iter()
                    .map(|&j| format!("`{}`", d.ahus[j].name))
                    .collect();
                Some(format!("{} left out", names.join(", ")))
            }
        };
        zones.push(ZoneEntry {
            index: i,
            name: z.name.clone(),
            label: z.label.clone(),
            pos: model_pos(&model, &lines, z.name_loc),
            ahu: found.as_ref().map(|f| f.0),
            served_by: served.iter().map(|&j| d.ahus[j].name.clone()).collect(),
            flow: found.as_ref().map(|f| f.1.clone()),
            case: found.as_ref().map(|f| f.2),
            note,
        });
    }

    let mut assumptions: Vec<Assumed> = Vec::new();
    for a in &ahus {
        for x in &a.assumptions {
            if !assumptions.contains(x) {
                assumptions.push(x.clone());
            }
        }
    }
    DesignReport {
        file: root.display().to_string(),
        project: d.project.name.clone(),
        ahus,
        zones,
        diagnostics: unknown.into_iter().map(|(_, x)| x).collect(),
        findings: design_findings,
        assumptions,
        eval,
        model,
    }
}
