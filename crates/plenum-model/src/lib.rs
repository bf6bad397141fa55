//! The Plenum design model: files and `use`, name resolution (`serves`,
//! `like`, `let`), unit checking of every key against the one key table
//! ([`keys`]), and lowering into the typed [`Design`] the coil engine
//! computes from. Every value keeps the place in the source it came from.
//!
//! The model does no IO of its own: files are read through a [`FileSystem`],
//! so tests run on in-memory files and the language server on its buffers.
//!
//! ```
//! let text = "site { cooling 94 °F db, 75 °F wb }\n\
//!             zone office { area 1_000 ft²; sensible 12 kBtu/h }\n\
//!             ahu a { serves office }\n";
//! let (design, diagnostics) = plenum_model::lower_text(text);
//! assert!(diagnostics.is_empty());
//! assert_eq!(design.zones[0].sensible_btuh.map(|s| s.value), Some(12_000.0));
//! ```

pub mod design;
mod diag;
mod eval;
pub mod fs;
pub mod keys;
mod load;
mod lower;
pub mod symbols;

use std::path::{Path, PathBuf};

pub use design::*;
pub use diag::{Edit, Fix, ModelCode, ModelDiagnostic, Severity};
pub use fs::{FileSystem, MemoryFs, RealFs};
pub use load::SourceFile;
pub use lower::PropertyInfo;
pub use symbols::{SymbolDef, SymbolKind, SymbolRef, Symbols};

/// A file's text and its parse, for [`Model::build_parsed`].
#[derive(Clone, Debug)]
pub struct Parsed {
    pub text: String,
    pub parse: plenum_syntax::Parse,
}

/// A design's files, read and parsed, not yet lowered ([`Model::load`]).
#[derive(Clone, Debug)]
pub struct Loaded {
    root: FileId,
    files: Vec<SourceFile>,
    diagnostics: Vec<ModelDiagnostic>,
    project_root: PathBuf,
}

impl Loaded {
    /// The files read, the root first.
    pub fn files(&self) -> &[SourceFile] {
        &self.files
    }

    /// Lower the loaded files into the [`Model`] (names, `like`, units,
    /// the typed design): what [`Model::build`] gives.
    pub fn lower(self) -> Model {
        let Loaded {
            root,
            files,
            mut diagnostics,
            project_root,
        } = self;
        let texts: Vec<&str> = files.iter().map(|f| f.text.as_str()).collect();
        let lowered = lower::Lowering::run(&files, &texts);
        diagnostics.extend(lowered.diags);
        if files.iter().any(|f| f.parse.has_errors()) {
            diagnostics.retain(|d| !d.code.is_global());
        }
        diagnostics.sort_by_key(|d| d.loc);
        Model {
            root,
            design: lowered.design,
            diagnostics,
            symbols: lowered.symbols,
            properties: lowered.properties,
            lets: lowered.lets,
            files,
            project_root,
        }
    }
}

/// A design loaded from its root file and the files it uses.
#[derive(Clone, Debug)]
pub struct Model {
    pub root: FileId,
    /// The root file first, then the files it uses in the order they were read.
    pub files: Vec<SourceFile>,
    pub design: Design,
    /// The model's findings (syntax errors stay in each file's `parse`).
    pub diagnostics: Vec<ModelDiagnostic>,
    pub symbols: Symbols,
    /// Every property that was read, with its evaluated quantity, for hover.
    pub properties: Vec<PropertyInfo>,
    /// Every `let`, with its value when it is one quantity, for hover.
    pub lets: Vec<LetValue>,
    /// The folder `use` paths are confined to.
    pub project_root: PathBuf,
}

impl Model {
    /// Load the design whose root file is `path` with text `text` (already
    /// read by the caller); `use`d files are read through `fs`.
    pub fn build(fs: &dyn FileSystem, path: &Path, text: String) -> Model {
        let parse = plenum_syntax::parse(&text);
        Model::build_parsed(fs, path, Parsed { text, parse }, &mut |_| None)
    }

    /// [`Model::build`] for a caller that has already read and parsed
    /// files: `root` is the root file's text and parse, and `parsed` is
    /// asked for every file the design `use`s (by normalised path) before
    /// the file is read through `fs` and parsed. The caller vouches that a
    /// parse is of its text; the model is the one [`Model::build`] gives.
    pub fn build_parsed(
        fs: &dyn FileSystem,
        path: &Path,
        root: Parsed,
        parsed: &mut dyn FnMut(&Path) -> Option<Parsed>,
    ) -> Model {
        Model::load(fs, path, root, parsed).lower()
    }

    /// The first half of [`Model::build_parsed`]: find the project root and
    /// read and parse every file the design `use`s, through `fs` (and
    /// `parsed`). [`Loaded::lower`] does the rest without the file system,
    /// so that designs can be lowered on other threads.
    pub fn load(
        fs: &dyn FileSystem,
        path: &Path,
        root: Parsed,
        parsed: &mut dyn FnMut(&Path) -> Option<Parsed>,
    ) -> Loaded {
        let project_root = fs::project_root(fs, path);
        let mut loader = load::Loader::new(fs, &project_root, parsed);
        let root = loader.add_root(path, root);
        Loaded {
            root,
            files: loader.files,
            diagnostics: loader.diags,
            project_root,
        }
    }

    pub fn file(&self, id: FileId) -> Option<&SourceFile> {
        self.files.get(id.0 as usize)
    }

    /// True when any file has a syntax error or the model an error.
    pub fn has_errors(&self) -> bool {
        self.files.iter().any(|f| f.parse.has_errors())
            || self
                .diagnostics
                .iter()
                .any(|d| d.severity == Severity::Error)
    }
}

/// A `let` and what it evaluated to.
#[derive(Clone, Debug, PartialEq)]
pub struct LetValue {
    pub name: String,
    pub name_loc: Loc,
    /// The value when it is one quantity (`None` for a compound value such as
    /// an air state, or one with an error).
    pub quantity: Option<plenum_units::Quantity>,
}

/// Lower one file's text on its own (a `use` in it finds nothing). Syntax
/// errors are not included; see [`Model::build`] for the whole picture.
pub fn lower_text(text: &str) -> (Design, Vec<ModelDiagnostic>) {
    let fs = MemoryFs::new();
    let model = Model::build(&fs, Path::new("design.plenum"), text.to_string());
    (model.design, model.diagnostics)
}

/// An error in a standalone air state: where (a byte span of the state's
/// text) and what.
#[derive(Clone, Debug, PartialEq)]
pub struct StateError {
    pub code: &'static str,
    pub span: plenum_syntax::Span,
    pub message: String,
    pub help: Option<String>,
}

/// Read an air state given on its own (`94 °F db, 75 °F wb`, `24 °C,
/// 0.0093 kg/kg`), by exactly the rules of a design file's `cooling` key.
pub fn parse_air_state(text: &str) -> Result<AirSpec, Vec<StateError>> {
    const PREFIX: &str = "site {\ncooling ";
    if text.contains(['\n', '{', '}', ';']) {
        return Err(vec![StateError {
            code: "invalid-value",
            span: plenum_syntax::Span::new(0, u32::try_from(text.len()).unwrap_or(u32::MAX)),
            message: "an air state is one line of values, such as `94 °F db, 75 °F wb`".to_string(),
            help: None,
        }]);
    }
    let src = format!("{PREFIX}{text}\n}}\n");
    let fs = MemoryFs::new();
    let model = Model::build(&fs, Path::new("state.plenum"), src);
    let shift = |s: plenum_syntax::Span| {
        let len = u32::try_from(text.len()).unwrap_or(u32::MAX);
        let p = PREFIX.len() as u32;
        plenum_syntax::Span::new(
            s.start.saturating_sub(p).min(len),
            s.end.saturating_sub(p).min(len),
        )
    };
    let mut errors: Vec<StateError> = model.files[0]
        .parse
        .errors
        .iter()
        .map(|e| StateError {
            code: e.kind.code(),
            span: shift(e.span),
            message: e.message.clone(),
            help: e.help.clone(),
        })
        .collect();
    errors.extend(model.diagnostics.iter().map(|d| {
        StateError {
            code: d.code.code(),
            span: shift(d.loc.span),
            message: d
                .message
                .replace("`cooling` ", "the state ")
                .replace("`cooling`", "the state"),
            help: d.help.clone(),
        }
    }));
    match model.design.site.and_then(|s| s.cooling) {
        Some(state) if errors.is_empty() => Ok(state.value),
        _ => {
            if errors.is_empty() {
                errors.push(StateError {
                    code: "invalid-value",
                    span: plenum_syntax::Span::new(0, 0),
                    message: "not an air state".to_string(),
                    help: None,
                });
            }
            Err(errors)
        }
    }
}
