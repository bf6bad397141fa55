//! The host: open documents over a base file system, and the designs built
//! from them, rebuilt only where an edit reaches.
//!
//! A *candidate* is an open document or a design file known on disk (the
//! language server lists the workspace's `*.plenum` files). A candidate that
//! no other candidate `use`s is the root of a design; a candidate that only
//! `use` cycles reach is made a root of its own, so every candidate belongs
//! to at least one design. An edit to a file drops the designs that read it
//! (and its cached `use` list); everything else is kept.

use std::collections::{BTreeMap, BTreeSet, HashMap, HashSet};
use std::path::{Path, PathBuf};
use std::sync::Arc;

use plenum_model::fs::{CONFIG_FILE, OverlayFs, normalize};
use plenum_model::{FileSystem, ModelCode, Parsed};
use plenum_syntax::{Item, Parse};

use crate::world::{Analysis, DesignData};

/// Holds the workspace state and hands out [`Analysis`] snapshots.
pub struct AnalysisHost {
    base: Box<dyn FileSystem + Send + Sync>,
    /// Open documents by normalised path: they win over the base file system.
    docs: HashMap<PathBuf, String>,
    /// Design files known on disk (not necessarily open).
    disk_files: BTreeSet<PathBuf>,
    /// The files each candidate `use`s directly (resolved, normalised).
    uses: HashMap<PathBuf, Vec<PathBuf>>,
    /// Built designs by root.
    designs: BTreeMap<PathBuf, Arc<DesignData>>,
    snapshot: Option<Analysis>,
    /// How many designs were built since the host was made (for tests).
    builds: u64,
}

impl AnalysisHost {
    pub fn new(base: impl FileSystem + Send + Sync + 'static) -> AnalysisHost {
        AnalysisHost {
            base: Box::new(base),
            docs: HashMap::new(),
            disk_files: BTreeSet::new(),
            uses: HashMap::new(),
            designs: BTreeMap::new(),
            snapshot: None,
            builds: 0,
        }
    }

    /// Open a document, or replace its text. An open `plenum.toml` is read
    /// as the project's settings (every design is re-checked), never as a design.
    pub fn set_document(&mut self, path: &Path, text: String) {
        let path = normalize(path);
        if is_config(&path) {
            self.invalidate_all();
        } else {
            self.changed(&path);
        }
        self.docs.insert(path, text);
    }

    /// Close a document: its file is read from the base file system again
    /// (when it is a known design file or another design uses it).
    pub fn close_document(&mut self, path: &Path) {
        let path = normalize(path);
        if self.docs.remove(&path).is_some() {
            if is_config(&path) {
                self.invalidate_all();
            } else {
                self.changed(&path);
            }
        }
    }

    /// The text of an open document.
    pub fn document(&self, path: &Path) -> Option<&str> {
        self.docs.get(&normalize(path)).map(String::as_str)
    }

    /// The paths of the open documents, sorted.
    pub fn documents(&self) -> Vec<PathBuf> {
        let mut v: Vec<PathBuf> = self.docs.keys().cloned().collect();
        v.sort();
        v
    }

    /// Replace the list of design files known on disk.
    pub fn set_disk_files(&mut self, files: impl IntoIterator<Item = PathBuf>) {
        let files: BTreeSet<PathBuf> = files.into_iter().map(|p| normalize(&p)).collect();
        if files != self.disk_files {
            self.disk_files = files;
            self.snapshot = None;
        }
    }

    /// A file changed, appeared or disappeared on disk. A `plenum.toml`
    /// change re-checks every design; a new or removed design file re-checks
    /// the designs that could not find a `use`d file.
    pub fn file_changed_on_disk(&mut self, path: &Path) {
        let path = normalize(path);
        if is_config(&path) {
            self.invalidate_all();
            return;
        }
        if self.docs.contains_key(&path) {
            // The open buffer is what counts until it is closed.
            return;
        }
        self.changed(&path);
        self.designs.retain(|_, d| {
            !d.model
                .diagnostics
                .iter()
                .any(|m| m.code == ModelCode::UseNotFound)
        });
        if path.extension().is_some_and(|e| e == "plenum") && !self.base.is_file(&path) {
            self.disk_files.remove(&path);
        }
    }

    /// Forget every built design (the next snapshot rebuilds them all).
    pub fn invalidate_all(&mut self) {
        self.designs.clear();
        self.uses.clear();
        self.snapshot = None;
    }

    /// How many designs have been built so far (every rebuild counts).
    pub fn builds(&self) -> u64 {
        self.builds
    }

    fn changed(&mut self, path: &Path) {
        self.uses.remove(path);
        self.designs
            .retain(|root, d| root.as_path() != path && !d.contains(path));
        self.snapshot = None;
    }

    /// The analysis of the current state; designs an edit did not reach are
    /// reused as they were.
    pub fn analysis(&mut self) -> Analysis {
        if let Some(s) = &self.snapshot {
            return s.clone();
        }
        let overlay: &HashMap<PathBuf, String> = &self.docs;
        let fs = OverlayFs {
            overlays: overlay,
            base: &*self.base,
        };
        let mut candidates: BTreeMap<PathBuf, String> = BTreeMap::new();
        for path in self.docs.keys().chain(self.disk_files.iter()) {
            if candidates.contains_key(path) || is_config(path) {
                continue;
            }
            if let Some(text) = read_text(&fs, path) {
                candidates.insert(path.clone(), text);
            }
        }
        // A file whose `use`s must be found again is parsed here, and the
        // design that reads it takes that parse rather than parsing again.
        let mut fresh: HashMap<PathBuf, Parse> = HashMap::new();
        for (path, text) in &candidates {
            if !self.uses.contains_key(path) {
                let parse = plenum_syntax::parse(text);
                self.uses.insert(path.clone(), direct_uses(path, &parse));
                fresh.insert(path.clone(), parse);
            }
        }
        // How many designs still to be built may read each fresh parse: the
        // last takes it, the others get a copy.
        let mut readers: HashMap<PathBuf, usize> = HashMap::new();
        let used: HashSet<&PathBuf> = candidates
            .keys()
            .flat_map(|c| {
                self.uses
                    .get(c)
                    .into_iter()
                    .flatten()
                    .filter(move |u| *u != c)
            })
            .collect();
        let mut roots: Vec<PathBuf> = candidates
            .keys()
            .filter(|c| !used.contains(c))
            .cloned()
            .collect();
        let mut covered: HashSet<PathBuf> = HashSet::new();
        let mut i = 0;
        loop {
            while i < roots.len() {
                let root = roots[i].clone();
                i += 1;
                let design = match self.designs.get(&root) {
                    Some(d) => d.clone(),
                    None => {
                        if readers.is_empty() && !fresh.is_empty() {
                            readers = self.readers(&roots, &fresh);
                        }
                        let mut take = |path: &Path| -> Option<Parsed> {
                            let text = candidates.get(path)?.clone();
                            let left = readers.get_mut(path)?;
                            let parse = if *left > 1 {
                                *left -= 1;
                                fresh.get(path)?.clone()
                            } else {
                                fresh.remove(path)?
                            };
                            Some(Parsed { text, parse })
                        };
                        let root_file = take(&root).unwrap_or_else(|| {
                            let text = candidates.get(&root).cloned().unwrap_or_default();
                            let parse = plenum_syntax::parse(&text);
                            Parsed { text, parse }
                        });
                        let d = Arc::new(DesignData::build(&fs, &root, root_file, &mut take));
                        self.builds += 1;
                        self.designs.insert(root.clone(), d.clone());
                        d
                    }
                };
                covered.extend(design.model.files.iter().map(|f| f.path.clone()));
            }
            // A file reached only through a `use` cycle is a root of its own.
            match candidates.keys().find(|c| !covered.contains(*c)) {
                Some(c) => roots.push(c.clone()),
                None => break,
            }
        }
        let keep: HashSet<&PathBuf> = roots.iter().collect();
        self.designs.retain(|root, _| keep.contains(root));
        let designs: Vec<Arc<DesignData>> = self.designs.values().cloned().collect();
        let snapshot = Analysis {
            designs: Arc::new(designs),
        };
        self.snapshot = Some(snapshot.clone());
        snapshot
    }
}

impl AnalysisHost {
    /// For each fresh parse, how many of the designs to build (the roots
    /// without a built design) can reach its file by `use`. (A root found
    /// later, through a `use` cycle, parses its files itself.)
    fn readers(
        &self,
        roots: &[PathBuf],
        fresh: &HashMap<PathBuf, Parse>,
    ) -> HashMap<PathBuf, usize> {
        let mut readers: HashMap<PathBuf, usize> = HashMap::new();
        for root in roots.iter().filter(|r| !self.designs.contains_key(*r)) {
            let mut seen: HashSet<&PathBuf> = HashSet::from([root]);
            let mut stack = vec![root];
            while let Some(p) = stack.pop() {
                for q in self.uses.get(p).into_iter().flatten() {
                    if seen.insert(q) {
                        stack.push(q);
                    }
                }
            }
            for p in seen {
                if fresh.contains_key(p) {
                    *readers.entry(p.clone()).or_default() += 1;
                }
            }
        }
        readers
    }
}

fn is_config(path: &Path) -> bool {
    path.file_name().is_some_and(|n| n == CONFIG_FILE)
}

fn read_text(fs: &dyn FileSystem, path: &Path) -> Option<String> {
    String::from_utf8(fs.read(path).ok()?).ok()
}

/// The files a parsed text `use`s, resolved against its folder.
fn direct_uses(path: &Path, parse: &Parse) -> Vec<PathBuf> {
    let dir = path.parent().unwrap_or(Path::new(""));
    parse
        .file
        .items
        .iter()
        .filter_map(|i| match i {
            Item::Use(u) if !u.path.value.is_empty() => Some(normalize(&dir.join(&u.path.value))),
            _ => None,
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use plenum_model::MemoryFs;

    const SITE: &str = "site { cooling 94 °F db, 75 °F wb }\n";

    #[test]
    fn an_edit_rebuilds_only_the_designs_that_read_the_file() {
        let mut fs = MemoryFs::new();
        fs.insert("/w/shared/site.plenum", SITE);
        fs.insert(
            "/w/a.plenum",
            "use \"shared/site.plenum\"\nzone a { sensible 10 kBtu/h }\nahu x { serves a }\n",
        );
        fs.insert(
            "/w/b.plenum",
            "use \"shared/site.plenum\"\nzone b { sensible 10 kBtu/h }\nahu y { serves b }\n",
        );
        fs.insert(
            "/w/c.plenum",
            "site { cooling 90 °F db, 70 °F wb }\nzone c { sensible 5 kBtu/h }\nahu z { serves c }\n",
        );
        let mut host = AnalysisHost::new(fs);
        host.set_disk_files(
            [
                "/w/shared/site.plenum",
                "/w/a.plenum",
                "/w/b.plenum",
                "/w/c.plenum",
            ]
            .map(PathBuf::from),
        );
        let a = host.analysis();
        assert_eq!(
            a.design_roots(),
            ["/w/a.plenum", "/w/b.plenum", "/w/c.plenum"].map(PathBuf::from)
        );
        assert_eq!(host.builds(), 3);
        // Editing the shared file rebuilds the two designs that use it.
        host.set_document(
            Path::new("/w/shared/site.plenum"),
            "site { cooling 95 °F db, 76 °F wb }\n".into(),
        );
        let _ = host.analysis();
        assert_eq!(host.builds(), 5);
        // Editing c rebuilds c alone.
        host.set_document(
            Path::new("/w/c.plenum"),
            "site { cooling 91 °F db, 70 °F wb }\nzone c { sensible 5 kBtu/h }\nahu z { serves c }\n"
                .into(),
        );
        let _ = host.analysis();
        assert_eq!(host.builds(), 6);
        // No edit, no rebuild.
        let _ = host.analysis();
        assert_eq!(host.builds(), 6);
    }

    #[test]
    fn a_file_reached_only_through_a_cycle_is_still_analysed() {
        let mut host = AnalysisHost::new(MemoryFs::new());
        host.set_document(Path::new("/w/a.plenum"), "use \"b.plenum\"\n".into());
        host.set_document(Path::new("/w/b.plenum"), "use \"a.plenum\"\n".into());
        let a = host.analysis();
        assert_eq!(a.files(), ["/w/a.plenum", "/w/b.plenum"].map(PathBuf::from));
        let diags = a.diagnostics(Path::new("/w/b.plenum"));
        assert!(diags.iter().any(|d| d.code == "use-cycle"), "{diags:?}");
    }
}
