//! Loading a design: its root file and every file it `use`s.

use std::collections::HashMap;
use std::path::{Path, PathBuf};

use plenum_syntax::{Item, LineIndex, Parse, Span};

use crate::Parsed;
use crate::design::{FileId, Loc};
use crate::diag::{ModelCode, ModelDiagnostic};
use crate::fs::{FileSystem, normalize};

/// One loaded file.
#[derive(Clone, Debug)]
pub struct SourceFile {
    pub id: FileId,
    /// The path, normalised (relative paths stay relative to the working folder).
    pub path: PathBuf,
    pub text: String,
    pub parse: Parse,
    pub lines: LineIndex,
    /// The files this one `use`s, with the span of each `use` path.
    pub uses: Vec<(FileId, Span)>,
}

pub(crate) struct Loader<'a> {
    fs: &'a dyn FileSystem,
    /// Files the caller has already read and parsed.
    parsed: &'a mut dyn FnMut(&Path) -> Option<Parsed>,
    root_dir: PathBuf,
    pub files: Vec<SourceFile>,
    by_path: HashMap<PathBuf, FileId>,
    /// Files whose `use`s are being followed, outermost first (for cycles).
    stack: Vec<FileId>,
    pub diags: Vec<ModelDiagnostic>,
}

impl<'a> Loader<'a> {
    pub fn new(
        fs: &'a dyn FileSystem,
        project_root: &Path,
        parsed: &'a mut dyn FnMut(&Path) -> Option<Parsed>,
    ) -> Loader<'a> {
        Loader {
            fs,
            parsed,
            root_dir: normalize(project_root),
            files: Vec::new(),
            by_path: HashMap::new(),
            stack: Vec::new(),
            diags: Vec::new(),
        }
    }

    /// Add a file whose text is already known, and everything it uses.
    pub fn add_root(&mut self, path: &Path, root: Parsed) -> FileId {
        let id = self.add(normalize(path), root);
        self.follow_uses(id);
        id
    }

    fn add(&mut self, path: PathBuf, Parsed { text, parse }: Parsed) -> FileId {
        let id = FileId(u32::try_from(self.files.len()).unwrap_or(u32::MAX));
        let lines = LineIndex::new(&text);
        self.by_path.insert(path.clone(), id);
        self.files.push(SourceFile {
            id,
            path,
            text,
            parse,
            lines,
            uses: Vec::new(),
        });
        id
    }

    fn follow_uses(&mut self, id: FileId) {
        self.stack.push(id);
        let file = &self.files[id.0 as usize];
        let dir = file
            .path
            .parent()
            .map(Path::to_path_buf)
            .unwrap_or_default();
        let uses: Vec<(Span, String)> = file
            .parse
            .file
            .items
            .iter()
            .filter_map(|i| match i {
                Item::Use(u) => Some((u.path.span, u.path.value.clone())),
                _ => None,
            })
            .collect();
        for (span, rel) in uses {
            let at = Loc { file: id, span };
            if let Some(target) = self.resolve(at, &dir, &rel) {
                self.files[id.0 as usize].uses.push((target, span));
            }
        }
        self.stack.pop();
    }

    /// Resolve one `use`, loading the file the first time; report problems at `at`.
    fn resolve(&mut self, at: Loc, dir: &Path, rel: &str) -> Option<FileId> {
        let rel_path = Path::new(rel);
        if rel.is_empty() || rel_path.is_absolute() || rel_path.has_root() {
            self.diags.push(
                ModelDiagnostic::new(
                    ModelCode::UseOutsideProject,
                    at,
                    format!("`use` paths are relative to the file: `{rel}` is not"),
                )
                .help("write the path from this file's folder, e.g. `use \"shared/site.plenum\"`"),
            );
            return None;
        }
        let path = normalize(&dir.join(rel_path));
        if !path.starts_with(&self.root_dir) && !self.root_dir.as_os_str().eq(".") {
            self.diags.push(
                ModelDiagnostic::new(
                    ModelCode::UseOutsideProject,
                    at,
                    format!("`{rel}` is outside the project"),
                )
                .label("leaves the project folder")
                .help(format!(
                    "the project is `{}` (the folder with plenum.toml, else the repository); move the file inside it",
                    self.root_dir.display()
                )),
            );
            return None;
        }
        if self.root_dir.as_os_str().eq(".") && path.starts_with("..") {
            self.diags.push(
                ModelDiagnostic::new(
                    ModelCode::UseOutsideProject,
                    at,
                    format!("`{rel}` is outside the project"),
                )
                .label("leaves the project folder"),
            );
            return None;
        }
        if let Some(&existing) = self.by_path.get(&path) {
            if let Some(pos) = self.stack.iter().position(|&f| f == existing) {
                let mut chain: Vec<String> = self.stack[pos..]
                    .iter()
                    .map(|f| self.files[f.0 as usize].path.display().to_string())
                    .collect();
                chain.push(path.display().to_string());
                self.diags.push(
                    ModelDiagnostic::new(
                        ModelCode::UseCycle,
                        at,
                        format!("`use` cycle: {}", chain.join(" → ")),
                    )
                    .label("this file is already being read")
                    .help("move what both files need into a third file that both use"),
                );
                return None;
            }
            return Some(existing);
        }
        if let Some(known) = (self.parsed)(&path) {
            let id = self.add(path, known);
            self.follow_uses(id);
            return Some(id);
        }
        let bytes = match self.fs.read(&path) {
            Ok(b) => b,
            Err(_) => {
                self.diags.push(
                    ModelDiagnostic::new(
                        ModelCode::UseNotFound,
                        at,
                        format!("cannot read `{rel}`"),
                    )
                    .label(format!("no file at {}", path.display())),
                );
                return None;
            }
        };
        let text = match String::from_utf8(bytes) {
            Ok(t) => t,
            Err(_) => {
                self.diags.push(
                    ModelDiagnostic::new(
                        ModelCode::UseNotFound,
                        at,
                        format!("`{rel}` is not a UTF-8 text file"),
                    )
                    .help("save it as UTF-8"),
                );
                return None;
            }
        };
        let parse = plenum_syntax::parse(&text);
        let id = self.add(path, Parsed { text, parse });
        self.follow_uses(id);
        Some(id)
    }
}
