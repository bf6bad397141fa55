//! The server's state: the analysis host, the open documents with their
//! versions, and what was last published. One `std::sync::Mutex` guards it;
//! document mutations take it in the order the client sent them (see
//! `sequencer`), queries take it briefly to answer from a snapshot.

use std::collections::{HashMap, HashSet};
use std::path::{Path, PathBuf};
use std::sync::{Arc, Mutex, MutexGuard};

use plenum_ide::AnalysisHost;
use plenum_model::fs::normalize;
use tower_lsp_server::ls_types::Uri;

use crate::convert::{self, Encoding};
use crate::workspace;

/// An open document.
#[derive(Debug)]
pub(crate) struct Doc {
    pub version: i32,
    pub text: String,
}

pub(crate) struct State {
    pub host: AnalysisHost,
    pub docs: HashMap<PathBuf, Doc>,
    /// The URI the client used for each path (answers reuse it).
    pub uris: HashMap<PathBuf, Uri>,
    pub encoding: Encoding,
    /// Bumped by every mutation: a publish computed for an older generation is skipped.
    pub generation: u64,
    /// What was last published per file.
    pub published: HashMap<PathBuf, Vec<tower_lsp_server::ls_types::Diagnostic>>,
    /// Workspace folders (from the client, or found from the first file opened).
    pub folders: Vec<PathBuf>,
    /// Folders already scanned for design files.
    pub scanned: HashSet<PathBuf>,
    /// Changes dropped because their version was not newer than the document's.
    pub stale_changes: u64,
}

pub(crate) type Shared = Arc<Mutex<State>>;

/// Lock the state; a panic in an earlier holder does not make it unusable.
pub(crate) fn lock(s: &Mutex<State>) -> MutexGuard<'_, State> {
    s.lock().unwrap_or_else(|poisoned| poisoned.into_inner())
}

impl State {
    pub fn new() -> State {
        State {
            host: AnalysisHost::new(plenum_model::RealFs),
            docs: HashMap::new(),
            uris: HashMap::new(),
            encoding: Encoding::Utf16,
            generation: 0,
            published: HashMap::new(),
            folders: Vec::new(),
            scanned: HashSet::new(),
            stale_changes: 0,
        }
    }

    /// The URI of a path: the client's own when it sent one.
    pub fn uri(&self, path: &Path) -> Option<Uri> {
        self.uris
            .get(path)
            .cloned()
            .or_else(|| convert::uri_from_path(path))
    }

    /// Remember a client URI; its normalised path.
    pub fn path_of(&mut self, uri: &Uri) -> Option<PathBuf> {
        let path = normalize(&convert::path_from_uri(uri.as_str())?);
        self.uris.entry(path.clone()).or_insert_with(|| uri.clone());
        Some(path)
    }

    /// Scan a folder for design files once, and tell the host about them.
    pub fn scan(&mut self, folder: &Path) {
        if !self.scanned.insert(folder.to_path_buf()) {
            return;
        }
        let mut files: Vec<PathBuf> = Vec::new();
        for f in &self.scanned {
            files.extend(workspace::design_files(f));
        }
        self.host.set_disk_files(files);
    }

    /// When the client gave no workspace folder, the project of the first
    /// file opened stands in (the folder with `plenum.toml`, else the
    /// repository, else the file's folder), so its config and sibling
    /// designs are found.
    pub fn adopt_project_of(&mut self, file: &Path) {
        if !self.folders.is_empty() {
            return;
        }
        let root = plenum_model::fs::project_root(&plenum_model::RealFs, file);
        if root.is_dir() {
            self.scan(&root);
        }
    }
}
