//! Syntax errors, model findings and the engine's errors, findings and
//! assumptions, turned into coded [`Diagnostic`]s with their wording.

use foldhash::{HashMap, HashMapExt};

use plenum_engine::{
    AhuResult, AssumedValue, Assumption, DesignCase, EngineError, Evaluation, Finding, FindingKind,
    Iteration, Point, Subject,
};
use plenum_model::{FanArrangement, Model, ModelDiagnostic, ZoneId};
use plenum_syntax::{Block, Entry, Item, Span, SyntaxError};

use crate::diagnostic::{Diagnostic, Edit, Fix, Loc, Severity};
use crate::number::{btuh, cfm, dt, margin, pct, temp, tons};

/// The code of an engine error.
pub fn error_code(e: &EngineError) -> &'static str {
    match e {
        EngineError::NoSite { .. } => "missing-site",
        EngineError::SiteUnusable { .. }
        | EngineError::ZoneUnusable { .. }
        | EngineError::MissingInput { .. } => "not-evaluated",
        EngineError::InvalidInput { .. } | EngineError::InputNotFinite { .. } => "invalid-input",
        EngineError::ConflictingInputs { .. } => "conflicting-keys",
        EngineError::UnknownZone { .. } => "unknown-name",
        EngineError::ZoneServedTwice { .. } => "zone-served-twice",
        EngineError::UnknownCategory { .. } => "unknown-category",
        EngineError::SupplyNotBelowRoom { .. } => "supply-not-below-room",
        EngineError::OutdoorAirExceedsSupply { .. } => "outdoor-air-exceeds-supply",
        EngineError::CoilNotCooling { .. } => "coil-not-cooling",
        EngineError::NoConvergence { .. }
        | EngineError::NoSteadyState { .. }
        | EngineError::NoApparatusDewPoint { .. }
        | EngineError::NotFinite { .. } => "no-solution",
        EngineError::Psychro { .. } => "invalid-air-state",
    }
}

/// The code of an engine finding.
pub fn finding_code(k: &FindingKind) -> &'static str {
    match k {
        FindingKind::UnknownCategory { .. } => "unknown-category",
        FindingKind::AreaMissingForVentilation { .. } => "ventilation-area-missing",
        FindingKind::ElevationIgnored { .. } | FindingKind::MotorEfficiencyIgnored { .. } => {
            "ignored-value"
        }
        FindingKind::VentilationShortfall { .. } => "ventilation-shortfall",
        FindingKind::RoomAboveDesignHumidity { .. } => "above-design-humidity",
        FindingKind::RoomRhAboveLimit { .. } | FindingKind::RoomRhOutsideComfort { .. } => {
            "room-humidity"
        }
        FindingKind::LeavingRhLow { .. } => "leaving-rh",
        FindingKind::SupplyDtOutOfRange { .. } => "supply-dt-range",
        FindingKind::CfmPerTonOutOfRange { .. } => "airflow-per-ton",
        FindingKind::FaceVelocityHigh { .. } => "coil-face-velocity",
        FindingKind::CoilCannotDehumidify { .. } => "coil-cannot-dehumidify",
        FindingKind::DryCoil { .. } => "dry-coil",
        FindingKind::Undersized { .. } => "undersized-coil",
        FindingKind::Oversized { .. } => "oversized-coil",
    }
}

/// The code of the assumptions.
pub const ASSUMPTION: &str = "assumption";

/// Converts located facts of one model into diagnostics.
pub(crate) struct Ctx<'a> {
    pub model: &'a Model,
    /// Show SI figures beside IP ones (the project's display units).
    pub si: bool,
    /// Per file: whether its items are in source order without overlap, so
    /// that the block at a span can be found by binary search.
    ordered: Vec<bool>,
}

impl<'a> Ctx<'a> {
    pub fn new(model: &'a Model) -> Ctx<'a> {
        let si = matches!(
            model.design.project.units.map(|u| u.value),
            Some(plenum_units::UnitSystem::Si)
        );
        let ordered = model
            .files
            .iter()
            .map(|f| {
                f.parse
                    .file
                    .items
                    .windows(2)
                    .all(|w| w[0].span().end <= w[1].span().start)
            })
            .collect();
        Ctx { model, si, ordered }
    }

    pub fn loc(&self, l: plenum_model::Loc) -> Loc {
        let file = self
            .model
            .file(l.file)
            .map(|f| f.path.clone())
            .unwrap_or_default();
        Loc::new(file, l.span)
    }

    /// A location narrowed to a block's header when it spans a whole block
    /// (the engine locates defaults at the block they belong to).
    pub fn header_loc(&self, l: plenum_model::Loc) -> Loc {
        let ordered = self.ordered.get(l.file.0 as usize).copied() == Some(true);
        let span = self
            .model
            .file(l.file)
            .and_then(|f| find_block(&f.parse.file.items, l.span, ordered))
            .map_or(l.span, header);
        self.loc(plenum_model::Loc { span, ..l })
    }

    fn zone(&self, id: ZoneId) -> String {
        self.model
            .design
            .zone(id)
            .map_or_else(|| format!("#{}", id.0), |z| z.name.clone())
    }

    /// `ahu_1` or `ahu_1` ("Public areas unit").
    fn ahu_title(&self, index: usize) -> String {
        match self.model.design.ahus.get(index) {
            Some(a) => match &a.label {
                Some(l) => format!("`{}` (\"{l}\")", a.name),
                None => format!("`{}`", a.name),
            },
            None => format!("air handler #{index}"),
        }
    }

    fn has_dehumid(&self) -> bool {
        self.model
            .design
            .site
            .as_ref()
            .is_some_and(|s| s.dehumid.is_some())
    }
}

/// The outermost block whose span is `span`, else the innermost block
/// around it (the first in source order). `ordered` says the items are
/// sorted without overlap: then only the items from the first that ends at
/// or after `span` starts, to the last that starts at or before it, can
/// hold it, and a binary search finds the first (a scan of every item per
/// assumption was quadratic in the design).
fn find_block(items: &[Item], span: Span, ordered: bool) -> Option<&Block> {
    fn within(b: &Block, span: Span) -> Option<&Block> {
        if b.span == span {
            return Some(b);
        }
        if !(b.span.start <= span.start && span.end <= b.span.end) {
            return None;
        }
        b.body.entries.iter().find_map(|e| match e {
            Entry::Block(inner) => within(inner, span),
            _ => None,
        })
    }
    let from = if ordered {
        items.partition_point(|i| i.span().end < span.start)
    } else {
        0
    };
    items[from..]
        .iter()
        .take_while(|i| !ordered || i.span().start <= span.start)
        .find_map(|i| match i {
            Item::Block(b) => within(b, span),
            _ => None,
        })
}

/// From a block's kind to its name, label or `like` (without the body).
fn header(b: &Block) -> Span {
    let mut s = b.kind.span;
    if let Some(n) = &b.name {
        s = s.cover(n.span);
    }
    if let Some(l) = &b.label {
        s = s.cover(l.span);
    }
    if let Some(l) = &b.like {
        s = s.cover(l.name.span);
    }
    s
}

// ------------------------------------------------------------- syntax, model

pub(crate) fn syntax(path: &std::path::Path, e: &SyntaxError) -> Diagnostic {
    let at = |span| Loc::new(path, span);
    let mut d = Diagnostic::new(e.kind.code(), at(e.span), e.message.clone());
    d.label = e.label.clone();
    d.help = e.help.clone();
    for (span, text) in &e.related {
        d = d.related(at(*span), text.clone());
    }
    d
}

impl Ctx<'_> {
    pub fn model_diag(&self, m: &ModelDiagnostic) -> Diagnostic {
        let mut d = Diagnostic::new(m.code.code(), self.loc(m.loc), m.message.clone());
        d.severity = match m.severity {
            plenum_model::Severity::Error => Severity::Error,
            plenum_model::Severity::Warning => Severity::Warning,
            plenum_model::Severity::Info => Severity::Info,
        };
        d.label = m.label.clone();
        d.help = m.help.clone();
        for (loc, text) in &m.related {
            d = d.related(self.loc(*loc), text.clone());
        }
        d.fix = m.fix.as_ref().map(|f| Fix {
            title: f.title.clone(),
            edits: f
                .edits
                .iter()
                .map(|e| Edit {
                    loc: self.loc(e.loc),
                    text: e.text.clone(),
                })
                .collect(),
        });
        d
    }
}

// ------------------------------------------------------------------- engine

/// The wording of a design case for messages, when the design has two.
fn case_note(ctx: &Ctx<'_>, case: Option<DesignCase>, both: bool) -> String {
    match case {
        Some(c) if ctx.has_dehumid() => {
            if both {
                format!(" (at the {} design state, the worse of both)", c.key())
            } else {
                format!(" (at the {} design state)", c.key())
            }
        }
        _ => String::new(),
    }
}

impl Ctx<'_> {
    /// Engine errors of the site, the zones and the air handlers. Errors
    /// that follow from another error (a missing value already reported by
    /// the model) become one `not-evaluated` note per air handler.
    pub fn engine_errors(&self, eval: &Evaluation) -> Vec<Diagnostic> {
        let mut out = Vec::new();
        if let Err(e) = &eval.site {
            match e {
                EngineError::NoSite { .. } | EngineError::MissingInput { .. } => {}
                other => out.push(self.error(other, None)),
            }
        }
        for z in &eval.zones {
            if let Err(e) = &z.inputs {
                match e {
                    EngineError::SiteUnusable { .. } | EngineError::MissingInput { .. } => {}
                    other => out.push(self.error(other, None)),
                }
            }
        }
        for a in &eval.ahus {
            if let Err(e) = &a.result {
                out.push(self.error(e, Some(a.index)));
            }
        }
        out
    }

    fn error(&self, e: &EngineError, ahu: Option<usize>) -> Diagnostic {
        let code = error_code(e);
        let loc = self.loc(e.loc());
        let who = ahu.map_or_else(|| "the design".to_string(), |i| self.ahu_title(i));
        let case = |c: Option<DesignCase>| case_note(self, c, false);
        match e {
            EngineError::NoSite { .. } => Diagnostic::new(
                code,
                loc,
                "the design has no `site` block: the outdoor design state is unknown",
            ),
            EngineError::SiteUnusable { .. } => {
                let mut d = Diagnostic::new(
                    code,
                    loc,
                    format!("{who} was not evaluated: the site cannot be used"),
                )
                .label("no results for this unit")
                .help("fix the error reported at the `site` block");
                if let Some(s) = &self.model.design.site {
                    d = d.related(self.header_loc(s.loc), "the site");
                }
                d
            }
            EngineError::ZoneUnusable { zone, .. } => Diagnostic::new(
                code,
                loc,
                format!(
                    "{who} was not evaluated: zone `{}` cannot be used",
                    self.zone(*zone)
                ),
            )
            .label("this zone has an error")
            .help("fix the error reported in the zone's block"),
            EngineError::MissingInput { key, zone, .. } => {
                let what = match zone {
                    Some(z) => format!("zone `{}` has no usable `{key}`", self.zone(*z)),
                    None => format!("no usable `{key}`"),
                };
                Diagnostic::new(code, loc, format!("{who} was not evaluated: {what}"))
                    .help(format!("give `{key}` a valid value"))
            }
            EngineError::InvalidInput {
                key,
                value,
                allowed,
                ..
            } => {
                let message = if *key == "chilled_water" {
                    "the chilled-water return must be warmer than its supply".to_string()
                } else {
                    let (shown, desc) = match allowed {
                        plenum_engine::Allowed::Positive => (num(*value), "above zero"),
                        plenum_engine::Allowed::NonNegative => (num(*value), "zero or above"),
                        plenum_engine::Allowed::Fraction => {
                            (pct(*value * 100.0), "between 0 % and 100 %")
                        }
                        plenum_engine::Allowed::PositiveFraction => {
                            (pct(*value * 100.0), "above 0 % and at most 100 %")
                        }
                        plenum_engine::Allowed::Finite => (num(*value), "a finite number"),
                    };
                    format!("`{key}` must be {desc} for the coil-load method: it is {shown}")
                };
                Diagnostic::new(code, loc, message)
            }
            EngineError::InputNotFinite { key, .. } => {
                Diagnostic::new(code, loc, format!("`{key}` is not a finite number"))
            }
            EngineError::ConflictingInputs { first, second, .. } => Diagnostic::new(
                code,
                loc,
                format!("`{second}` cannot be given together with `{first}`"),
            )
            .help(format!("keep either `{first}` or `{second}`")),
            EngineError::UnknownZone { .. } => Diagnostic::new(
                code,
                loc,
                format!("{who} serves a zone that is not in the design"),
            ),
            EngineError::ZoneServedTwice { zone, .. } => Diagnostic::new(
                code,
                loc,
                format!("zone `{}` is named twice in `serves`", self.zone(*zone)),
            ),
            EngineError::UnknownCategory { written, .. } => self.unknown_category(loc, written),
            EngineError::SupplyNotBelowRoom {
                zone,
                supply_f,
                room_f,
                ..
            } => Diagnostic::new(
                code,
                loc,
                format!(
                    "the supply air of {who} ({}) is not colder than zone `{}` ({})",
                    temp(*supply_f, self.si),
                    self.zone(*zone),
                    temp(*room_f, self.si)
                ),
            )
            .help("lower the supply temperature below every served zone's indoor temperature"),
            EngineError::OutdoorAirExceedsSupply {
                case: c,
                fraction,
                outdoor_cfm,
                supply_cfm,
                ..
            } => Diagnostic::new(
                code,
                loc,
                format!(
                    "{who} would take {} of outdoor air but supplies only {} (an outdoor-air fraction of {}){}",
                    cfm(*outdoor_cfm, self.si),
                    cfm(*supply_cfm, self.si),
                    pct(fraction * 100.0),
                    case(Some(*c))
                ),
            )
            .help("reduce the outdoor air, or make the unit a dedicated outdoor-air unit with `outdoor_air 100 %`"),
            EngineError::NoSteadyState { case: c, .. } => Diagnostic::new(
                code,
                loc,
                format!(
                    "{who} has a dry coil and no outdoor air: the room's moisture has no way out, so there is no steady state{}",
                    case(Some(*c))
                ),
            ),
            EngineError::CoilNotCooling {
                case: c,
                entering_f,
                leaving_f,
                ..
            } => Diagnostic::new(
                code,
                loc,
                format!(
                    "the air enters the coil of {who} at {} and leaves at {}: the coil does no cooling{}",
                    temp(*entering_f, self.si),
                    temp(*leaving_f, self.si),
                    case(Some(*c))
                ),
            ),
            EngineError::NoConvergence {
                iteration,
                passes,
                case: c,
                ..
            } => {
                let what = match iteration {
                    Iteration::Airflow => "airflow and leaving-coil state",
                    Iteration::DryCoil => "dry-coil humidity",
                    Iteration::ApparatusDewPoint => "apparatus dew point",
                };
                Diagnostic::new(
                    code,
                    loc,
                    format!(
                        "the {what} of {who} did not converge in {passes} passes{}",
                        case(*c)
                    ),
                )
            }
            EngineError::NoApparatusDewPoint { case: c, .. } => Diagnostic::new(
                code,
                loc,
                format!(
                    "the coil line of {who} never meets the saturation curve: it has no apparatus dew point{}",
                    case(Some(*c))
                ),
            )
            .help("check the leaving-coil state: a leaving RH far below 85–95 % is the usual cause"),
            EngineError::Psychro {
                point,
                case: c,
                error,
                ..
            } => Diagnostic::new(
                code,
                loc,
                format!(
                    "{} is outside the psychrometric domain: {error}{}",
                    self.point(*point, ahu),
                    case(*c)
                ),
            ),
            EngineError::NotFinite { field, .. } => Diagnostic::new(
                code,
                loc,
                format!("the computed `{field}` of {who} is not a finite number"),
            ),
        }
    }

    fn point(&self, p: Point, ahu: Option<usize>) -> String {
        let of = ahu.map_or_else(String::new, |i| format!(" of {}", self.ahu_title(i)));
        match p {
            Point::DesignOutdoor(c) => format!("the {} design outdoor state", c.key()),
            Point::ZoneIndoor(z) => format!("the indoor state of zone `{}`", self.zone(z)),
            Point::ZoneRoom(z) => format!("the resulting room state of zone `{}`", self.zone(z)),
            Point::Outdoor => format!("the outdoor air{of}"),
            Point::OutdoorAfterFan => format!("the outdoor air after its fan{of}"),
            Point::Return => format!("the return air{of}"),
            Point::Mixed => format!("the mixed air{of}"),
            Point::Entering => format!("the air entering the coil{of}"),
            Point::Leaving => format!("the air leaving the coil{of}"),
            Point::Supply => format!("the supply air{of}"),
            Point::Room => format!("the room state{of}"),
            Point::Saturation => format!("a saturation state{of}"),
            Point::SitePressure => "the site pressure".to_string(),
        }
    }

    fn unknown_category(&self, loc: Loc, written: &str) -> Diagnostic {
        let names = plenum_engine::VENTILATION_CATEGORIES.iter().map(|c| c.name);
        let d = Diagnostic::new(
            "unknown-category",
            loc.clone(),
            format!("`{written}` is not a ventilation category of the ASHRAE 62.1 table"),
        )
        .label("unknown category");
        match plenum_model::keys::nearest(written, names) {
            Some(s) => d
                .help(format!("did you mean `{s}`?"))
                .fix(format!("write `{s}`"), loc, s),
            None => d.help("see the ventilation categories in the language reference"),
        }
    }
}

fn num(v: f64) -> String {
    let s = format!("{v:.4}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    if s == "-0" {
        "0".to_string()
    } else {
        s.to_string()
    }
}

// ---------------------------------------------------------------- findings

/// Findings of one air handler that say the same thing: code, place, zone.
type GroupKey = (&'static str, plenum_model::Loc, Option<ZoneId>);

/// A finding turned into a diagnostic, with what decides between the cases.
struct Candidate {
    diag: Diagnostic,
    /// Higher is worse; compared within one group only.
    badness: f64,
    case: Option<DesignCase>,
}

impl Ctx<'_> {
    /// The findings of the design and of every air handler. A finding that
    /// holds at both design cases is reported once, at the worse case
    /// (named in the message); `oversized-coil` only at the governing case
    /// (the larger coil load, the one the coil is selected for).
    pub fn findings(&self, eval: &Evaluation) -> Vec<Diagnostic> {
        let mut out = Vec::new();
        for f in &eval.findings {
            if let Some(c) = self.finding(f, None) {
                out.push(c.diag);
            }
        }
        for a in &eval.ahus {
            let Ok(r) = &a.result else { continue };
            out.extend(self.ahu_findings(a.index, r));
        }
        out
    }

    fn ahu_findings(&self, index: usize, r: &AhuResult) -> Vec<Diagnostic> {
        // Group by (code, location, zone): one diagnostic per group.
        let mut groups: Vec<(GroupKey, Vec<Candidate>)> = Vec::new();
        // Zones whose RH is outside the band: `room-humidity` says it all.
        let band: Vec<ZoneId> = r
            .findings
            .iter()
            .filter_map(|f| match &f.kind {
                FindingKind::RoomRhAboveLimit { zone, .. } => Some(*zone),
                FindingKind::RoomRhOutsideComfort {
                    zone,
                    room_rh_pct,
                    high_pct,
                    ..
                } if room_rh_pct > high_pct => Some(*zone),
                _ => None,
            })
            .collect();
        for f in &r.findings {
            if let FindingKind::Oversized { .. } = f.kind
                && f.case.is_some_and(|c| c != r.governing)
            {
                continue;
            }
            if let FindingKind::LeavingRhLow { .. } = f.kind
                && f.case.and_then(|c| r.case(c)).is_some_and(|c| c.coil.dry)
            {
                // A dry coil's leaving RH follows from the entering air: it
                // is no assumption to question.
                continue;
            }
            if let FindingKind::RoomAboveDesignHumidity { zone, .. } = f.kind
                && band.contains(&zone)
            {
                continue;
            }
            if let FindingKind::RoomAboveDesignHumidity { zone, .. } = f.kind
                && r.findings.iter().any(|g| {
                    g.case == f.case
                        && matches!(g.kind, FindingKind::CoilCannotDehumidify { zone: z, .. } if z == zone)
                })
            {
                // The coil cannot reach the design state: that finding says it.
                continue;
            }
            let Some(c) = self.finding(f, Some((index, r))) else {
                continue;
            };
            let key = (c.diag.code, f.loc, zone_of(&f.kind));
            match groups.iter_mut().find(|(k, _)| *k == key) {
                Some((_, v)) => v.push(c),
                None => groups.push((key, vec![c])),
            }
        }
        groups
            .into_iter()
            .filter_map(|(_, mut cands)| {
                let both = cands.len() > 1;
                cands.sort_by(|a, b| {
                    a.diag
                        .severity
                        .cmp(&b.diag.severity)
                        .then(b.badness.total_cmp(&a.badness))
                });
                let best = cands.into_iter().next()?;
                let mut d = best.diag;
                d.message.push_str(&case_note(self, best.case, both));
                Some(d)
            })
            .collect()
    }

    fn finding(&self, f: &Finding, ahu: Option<(usize, &AhuResult)>) -> Option<Candidate> {
        let code = finding_code(&f.kind);
        let loc = self.loc(f.loc);
        let si = self.si;
        let who = ahu.map_or_else(|| "the unit".to_string(), |(i, _)| self.ahu_title(i));
        let (diag, badness) = match &f.kind {
            FindingKind::UnknownCategory { written, .. } => {
                (self.unknown_category(loc, written), 0.0)
            }
            FindingKind::AreaMissingForVentilation { zone, category } => (
                Diagnostic::new(
                    code,
                    loc,
                    format!(
                        "zone `{}` has no `area`, so the area part of its `{category}` outdoor air is missing",
                        self.zone(*zone)
                    ),
                )
                .help("give the zone its floor area"),
                0.0,
            ),
            FindingKind::ElevationIgnored {
                elevation_ft,
                pressure_psia,
            } => (
                Diagnostic::new(
                    code,
                    loc,
                    format!(
                        "`elevation` ({}) is not used: the given `pressure` ({}) governs",
                        length(*elevation_ft, si),
                        pressure(*pressure_psia, si)
                    ),
                )
                .help("remove one of `elevation` and `pressure`"),
                0.0,
            ),
            FindingKind::MotorEfficiencyIgnored { motor_efficiency } => (
                Diagnostic::new(
                    code,
                    loc,
                    format!(
                        "`motor_efficiency` ({}) is not used: the motor is outside the air stream, so only the shaft power reaches the air",
                        pct(motor_efficiency * 100.0)
                    ),
                )
                .help("remove `motor_efficiency`, or say `motor in_airstream` if the motor is in the air stream"),
                0.0,
            ),
            FindingKind::VentilationShortfall {
                provided_cfm,
                required_cfm,
            } => (
                Diagnostic::new(
                    code,
                    loc,
                    format!(
                        "{who} brings in {} of outdoor air, below the ASHRAE 62.1 minimum of {} (short by {})",
                        cfm(*provided_cfm, si),
                        cfm(*required_cfm, si),
                        cfm(required_cfm - provided_cfm, si)
                    ),
                )
                .label("below the ventilation minimum")
                .help("raise the outdoor air to at least the minimum, or write `outdoor_air ventilation`"),
                required_cfm - provided_cfm,
            ),
            FindingKind::RoomAboveDesignHumidity {
                zone,
                room_rh_pct,
                design_rh_pct,
                room_w_lb_lb,
                design_w_lb_lb,
            } => (
                Diagnostic::new(
                    code,
                    loc,
                    format!(
                        "zone `{}` runs at {} RH, above its design {} (humidity ratio {:.4} against {:.4} lb/lb)",
                        self.zone(*zone),
                        pct(*room_rh_pct),
                        pct(*design_rh_pct),
                        room_w_lb_lb,
                        design_w_lb_lb
                    ),
                )
                .help("a colder or drier leaving-coil state (supply temperature, `leaving_rh`) lowers the room humidity"),
                room_w_lb_lb - design_w_lb_lb,
            ),
            FindingKind::RoomRhAboveLimit {
                zone,
                room_rh_pct,
                limit_pct,
            } => (
                Diagnostic::new(
                    code,
                    loc,
                    format!(
                        "zone `{}` would run at {} RH, above the {} limit",
                        self.zone(*zone),
                        pct(*room_rh_pct),
                        pct(*limit_pct)
                    ),
                )
                .severity(Severity::Error)
                .help("a colder or drier leaving-coil state, less latent load or separately treated outdoor air lowers it"),
                *room_rh_pct,
            ),
            FindingKind::RoomRhOutsideComfort {
                zone,
                room_rh_pct,
                low_pct,
                high_pct,
            } => (
                Diagnostic::new(
                    code,
                    loc,
                    format!(
                        "zone `{}` would run at {} RH, outside the {}–{} comfort band",
                        self.zone(*zone),
                        pct(*room_rh_pct),
                        pct_bare(*low_pct),
                        pct(*high_pct)
                    ),
                )
                .severity(Severity::Warning),
                if room_rh_pct > high_pct {
                    room_rh_pct - high_pct
                } else {
                    low_pct - room_rh_pct
                },
            ),
            FindingKind::LeavingRhLow {
                leaving_rh_pct,
                min_pct,
            } => (
                Diagnostic::new(
                    code,
                    loc,
                    format!(
                        "the air leaves the coil of {who} at {} RH, below the {} a wet coil usually reaches",
                        pct(*leaving_rh_pct),
                        pct(*min_pct)
                    ),
                )
                .help("use 90–95 % unless the coil's selection says otherwise"),
                min_pct - leaving_rh_pct,
            ),
            FindingKind::SupplyDtOutOfRange {
                zone,
                dt_f,
                min_f,
                max_f,
            } => (
                Diagnostic::new(
                    code,
                    loc,
                    format!(
                        "the supply air of {who} is {} below zone `{}`, outside {:.0}–{:.0} °F",
                        dt(*dt_f, si),
                        self.zone(*zone),
                        min_f,
                        max_f
                    ),
                )
                .help("a supply 15–20 °F below the room is usual"),
                if dt_f > max_f { dt_f - max_f } else { min_f - dt_f },
            ),
            FindingKind::CfmPerTonOutOfRange {
                cfm_per_ton,
                min,
                max,
            } => (
                Diagnostic::new(
                    code,
                    loc,
                    format!(
                        "{who} moves {:.0} cfm per ton of coil load, outside {:.0}–{:.0} cfm/ton",
                        cfm_per_ton, min, max
                    ),
                )
                .help("check the loads, the supply temperature and the outdoor air"),
                if cfm_per_ton > max {
                    cfm_per_ton - max
                } else {
                    min - cfm_per_ton
                },
            ),
            FindingKind::FaceVelocityHigh {
                face_velocity_fpm,
                limit_fpm,
            } => (
                Diagnostic::new(
                    code,
                    loc,
                    format!(
                        "the coil of {who} has a face velocity of {:.0} fpm, above {:.0} fpm (condensate carry-over)",
                        face_velocity_fpm, limit_fpm
                    ),
                )
                .help("select a coil with a larger face area"),
                *face_velocity_fpm,
            ),
            FindingKind::CoilCannotDehumidify {
                zone,
                leaving_dp_f,
                leaving_w_lb_lb,
                design_w_lb_lb,
                design_rh_pct,
            } => (
                Diagnostic::new(
                    code,
                    loc,
                    format!(
                        "the air leaving the coil of {who} (dew point {}, {:.4} lb/lb) is not drier than the design state of zone `{}` ({:.4} lb/lb, {} RH): the coil cannot dehumidify it",
                        temp(*leaving_dp_f, si),
                        leaving_w_lb_lb,
                        self.zone(*zone),
                        design_w_lb_lb,
                        pct(*design_rh_pct)
                    ),
                )
                .label("supply air too moist for the design state")
                .help("lower the leaving-coil state (supply temperature or `leaving_rh`), or raise the zone's design humidity if it allows"),
                leaving_w_lb_lb - design_w_lb_lb,
            ),
            FindingKind::DryCoil { leaving_rh_pct } => (
                Diagnostic::new(
                    code,
                    loc,
                    format!(
                        "the coil of {who} runs dry: nothing condenses, and the air leaves at {} RH",
                        pct(*leaving_rh_pct)
                    ),
                ),
                0.0,
            ),
            FindingKind::Undersized {
                rated_btuh,
                required_btuh,
                rated_sensible_btuh,
                required_sensible_btuh,
            } => {
                // A margin only against a load above zero (never inf or NaN).
                let ratio = |rated: Option<f64>, required: f64| {
                    rated
                        .filter(|_| required > 0.0)
                        .map(|r| r / required - 1.0)
                        .filter(|m| m.is_finite())
                };
                let total_m = ratio(*rated_btuh, *required_btuh);
                let sens_m = ratio(*rated_sensible_btuh, *required_sensible_btuh);
                let total_short = total_m.is_some_and(|m| m < 0.0);
                let total = match (rated_btuh, total_m) {
                    (Some(r), Some(m)) => Some(format!(
                        "needs {} total and is rated {}, a margin of {}",
                        capacity(*required_btuh, si),
                        capacity(*r, si),
                        margin(m)
                    )),
                    _ => None,
                };
                let sensible = match (rated_sensible_btuh, sens_m) {
                    (Some(r), Some(m)) => Some(format!(
                        "needs {} sensible and is rated {} sensible, a margin of {}",
                        capacity(*required_sensible_btuh, si),
                        capacity(*r, si),
                        margin(m)
                    )),
                    _ => None,
                };
                let (what, parts) = if total_short {
                    ("undersized", [total, sensible])
                } else {
                    ("undersized in sensible capacity", [sensible, total])
                };
                let parts: Vec<String> = parts.into_iter().flatten().collect();
                let worst = total_m.into_iter().chain(sens_m).fold(f64::INFINITY, f64::min);
                (
                    Diagnostic::new(code, loc, format!("{who} is {what}: {}", parts.join("; ")))
                        .label("rated below the load")
                        .help("select a larger coil and update `rated`, or reduce the load it serves"),
                    if worst.is_finite() { -worst } else { 0.0 },
                )
            }
            FindingKind::Oversized {
                rated_btuh,
                required_btuh,
                margin: m,
            } => (
                Diagnostic::new(
                    code,
                    loc,
                    format!(
                        "{who} is oversized: it needs {} total and is rated {}, a margin of {} (more than {})",
                        capacity(*required_btuh, si),
                        capacity(*rated_btuh, si),
                        margin(*m),
                        pct_bare(plenum_engine::OVERSIZE_MARGIN * 100.0)
                            + " %"
                    ),
                )
                .label("more than 25 % above the load")
                .help("select a coil closer to the load; an oversized coil controls humidity poorly at part load"),
                *m,
            ),
        };
        Some(Candidate {
            diag,
            badness,
            case: f.case,
        })
    }
}

fn zone_of(k: &FindingKind) -> Option<ZoneId> {
    match k {
        FindingKind::UnknownCategory { zone, .. }
        | FindingKind::AreaMissingForVentilation { zone, .. }
        | FindingKind::RoomAboveDesignHumidity { zone, .. }
        | FindingKind::CoilCannotDehumidify { zone, .. }
        | FindingKind::RoomRhAboveLimit { zone, .. }
        | FindingKind::RoomRhOutsideComfort { zone, .. }
        | FindingKind::SupplyDtOutOfRange { zone, .. } => Some(*zone),
        _ => None,
    }
}

/// `12.47 ton (149,640 Btu/h)`, with kW for SI projects.
fn capacity(v: f64, si: bool) -> String {
    if si {
        format!(
            "{} ({}, {:.1} kW)",
            tons(v),
            btuh(v),
            v * 0.293_071_07 / 1000.0
        )
    } else {
        format!("{} ({})", tons(v), btuh(v))
    }
}

fn pct_bare(v: f64) -> String {
    pct(v).trim_end_matches(" %").to_string()
}

fn length(ft: f64, si: bool) -> String {
    if si {
        format!("{} ft ({:.0} m)", group(ft.round()), ft * 0.3048)
    } else {
        format!("{} ft", group(ft.round()))
    }
}

fn pressure(psia: f64, si: bool) -> String {
    if si {
        format!("{psia:.3} psia ({:.2} kPa)", psia * 6.894_757)
    } else {
        format!("{psia:.3} psia")
    }
}

fn group(v: f64) -> String {
    crate::number::grouped(v)
}

// ------------------------------------------------------------- assumptions

impl Ctx<'_> {
    /// One `assumption` note per default used (site, zone and air-handler
    /// defaults each once, although several air handlers share them).
    pub fn assumptions(&self, eval: &Evaluation) -> Vec<Diagnostic> {
        let mut all: Vec<&Assumption> = Vec::new();
        if let Ok(s) = &eval.site {
            all.extend(&s.assumptions);
        }
        for z in &eval.zones {
            all.extend(&z.assumptions);
        }
        for a in &eval.ahus {
            if let Ok(r) = &a.result {
                all.extend(
                    r.assumptions
                        .iter()
                        .filter(|x| matches!(x.subject, Subject::Ahu(_))),
                );
            }
        }
        let mut seen: HashMap<(Subject, &'static str, plenum_model::Loc), ()> = HashMap::new();
        let mut out = Vec::new();
        for a in all {
            if seen.insert((a.subject, a.key, a.loc), ()).is_some() {
                continue;
            }
            out.push(self.assumption(a));
        }
        out
    }

    fn assumption(&self, a: &Assumption) -> Diagnostic {
        let si = self.si;
        let of = match a.subject {
            Subject::Site => "the site".to_string(),
            Subject::Zone(z) => format!("zone `{}`", self.zone(z)),
            Subject::Ahu(i) => self.ahu_title(i),
        };
        let value = match a.value {
            AssumedValue::LengthFt(v) => length(v, si),
            AssumedValue::TemperatureF(v) => temp(v, si),
            AssumedValue::TemperatureDifferenceF(v) => dt(v, si),
            AssumedValue::Ratio(v) => pct(v * 100.0),
            AssumedValue::Count(v) => num(v),
            AssumedValue::HeatBtuh(v) => btuh(v),
            AssumedValue::IndoorState { db_f, rh } => {
                format!("{}, {} RH", temp(db_f, si), pct(rh * 100.0))
            }
            AssumedValue::BelowLowestRoom { dt_f, supply_f } => format!(
                "{} ({} below the lowest served zone)",
                temp(supply_f, si),
                dt(dt_f, si)
            ),
            AssumedValue::RisePer100Ft { dt_f, rise_f } => format!(
                "{} per 100 ft of duct, a rise of {}",
                dt(dt_f, si),
                dt(rise_f, si)
            ),
            AssumedValue::FanRise { dt_f, arrangement } => format!(
                "a fan rise of {}, {}",
                dt(dt_f, si),
                match arrangement {
                    FanArrangement::DrawThrough => "draw-through",
                    FanArrangement::BlowThrough => "blow-through",
                }
            ),
            AssumedValue::Keyword(k) => format!("`{k}`"),
        };
        let what = match a.value {
            AssumedValue::RisePer100Ft { .. } => {
                format!("the rise per 100 ft of `{}` of {of} is not given", a.key)
            }
            _ => format!("`{}` of {of} is not given", a.key),
        };
        Diagnostic::new(
            ASSUMPTION,
            self.header_loc(a.loc),
            format!(
                "{what}: {value} is used ({})",
                match a.source {
                    plenum_engine::Source::CommonPractice => "common practice",
                    plenum_engine::Source::ProjectDefault => "a project default",
                    plenum_engine::Source::Ashrae621FromMemory =>
                        "ASHRAE 62.1-2019, written from memory",
                }
            ),
        )
        .label("a default is used here")
        .help(format!(
            "write `{}` in the block if the default is not right",
            a.key
        ))
    }
}
