//! The one door to the file system, so that the analysis runs on in-memory
//! files in tests and on the editor's unsaved buffers in the language server.

use std::collections::HashMap;
use std::io;
use std::path::{Component, Path, PathBuf};

/// Reading design files.
pub trait FileSystem {
    /// The file's bytes.
    fn read(&self, path: &Path) -> io::Result<Vec<u8>>;
    fn is_file(&self, path: &Path) -> bool;
    fn is_dir(&self, path: &Path) -> bool;
}

/// The real file system.
#[derive(Clone, Copy, Debug, Default)]
pub struct RealFs;

impl FileSystem for RealFs {
    fn read(&self, path: &Path) -> io::Result<Vec<u8>> {
        std::fs::read(path)
    }
    fn is_file(&self, path: &Path) -> bool {
        path.is_file()
    }
    fn is_dir(&self, path: &Path) -> bool {
        path.is_dir()
    }
}

/// Files held in memory, keyed by normalised path. Folders exist implicitly
/// above every file.
#[derive(Clone, Debug, Default)]
pub struct MemoryFs {
    files: HashMap<PathBuf, Vec<u8>>,
}

impl MemoryFs {
    pub fn new() -> MemoryFs {
        MemoryFs::default()
    }

    pub fn insert(&mut self, path: impl AsRef<Path>, text: impl Into<Vec<u8>>) {
        self.files.insert(normalize(path.as_ref()), text.into());
    }

    pub fn remove(&mut self, path: impl AsRef<Path>) {
        self.files.remove(&normalize(path.as_ref()));
    }
}

impl FileSystem for MemoryFs {
    fn read(&self, path: &Path) -> io::Result<Vec<u8>> {
        self.files
            .get(&normalize(path))
            .cloned()
            .ok_or_else(|| io::Error::new(io::ErrorKind::NotFound, "no such file"))
    }
    fn is_file(&self, path: &Path) -> bool {
        self.files.contains_key(&normalize(path))
    }
    fn is_dir(&self, path: &Path) -> bool {
        let dir = normalize(path);
        self.files.keys().any(|f| f.starts_with(&dir) && *f != dir)
    }
}

/// A file system that prefers the given overlays (e.g. an editor's unsaved
/// buffers) and falls back to another.
pub struct OverlayFs<'a> {
    pub overlays: &'a HashMap<PathBuf, String>,
    pub base: &'a dyn FileSystem,
}

impl FileSystem for OverlayFs<'_> {
    fn read(&self, path: &Path) -> io::Result<Vec<u8>> {
        match self.overlays.get(&normalize(path)) {
            Some(text) => Ok(text.clone().into_bytes()),
            None => self.base.read(path),
        }
    }
    fn is_file(&self, path: &Path) -> bool {
        self.overlays.contains_key(&normalize(path)) || self.base.is_file(path)
    }
    fn is_dir(&self, path: &Path) -> bool {
        self.base.is_dir(path)
    }
}

/// Resolve `.` and `..` lexically (without touching the file system). A `..`
/// above the root of a relative path is kept.
pub fn normalize(path: &Path) -> PathBuf {
    let mut out: Vec<Component<'_>> = Vec::new();
    for c in path.components() {
        match c {
            Component::CurDir => {}
            Component::ParentDir => match out.last() {
                Some(Component::Normal(_)) => {
                    out.pop();
                }
                Some(Component::RootDir | Component::Prefix(_)) => {}
                _ => out.push(c),
            },
            other => out.push(other),
        }
    }
    let mut p = PathBuf::new();
    for c in out {
        p.push(c.as_os_str());
    }
    if p.as_os_str().is_empty() {
        p.push(".");
    }
    p
}

/// The name of the project configuration file.
pub const CONFIG_FILE: &str = "plenum.toml";

/// The project root of a design file: the nearest folder above it holding
/// `plenum.toml`, else the nearest holding `.git` (the repository root), else
/// the file's own folder. `use` paths may not leave it. The one discovery
/// routine for the CLI and the language server.
pub fn project_root(fs: &dyn FileSystem, file: &Path) -> PathBuf {
    let file = normalize(file);
    let start = file.parent().map(Path::to_path_buf).unwrap_or_default();
    for marker in [CONFIG_FILE, ".git"] {
        for d in ancestors(&start) {
            let candidate = d.join(marker);
            if fs.is_file(&candidate) || fs.is_dir(&candidate) {
                return normalize(&d);
            }
        }
    }
    normalize(&start)
}

/// The folder and every folder above it; a relative path ends with `.`, the
/// working folder (so `design/u.plenum` also looks in `.`).
fn ancestors(dir: &Path) -> Vec<PathBuf> {
    let mut out: Vec<PathBuf> = dir
        .ancestors()
        .filter(|p| !p.as_os_str().is_empty())
        .map(Path::to_path_buf)
        .collect();
    if dir.is_relative() && out.last().is_none_or(|p| p != Path::new(".")) {
        out.push(PathBuf::from("."));
    }
    out
}

/// The `plenum.toml` that applies to `file`, if there is one.
pub fn config_file(fs: &dyn FileSystem, file: &Path) -> Option<PathBuf> {
    let file = normalize(file);
    let start = file.parent().map(Path::to_path_buf).unwrap_or_default();
    ancestors(&start)
        .into_iter()
        .map(|d| d.join(CONFIG_FILE))
        .find(|c| fs.is_file(c))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn normalize_resolves_dots() {
        assert_eq!(normalize(Path::new("a/./b/../c")), PathBuf::from("a/c"));
        assert_eq!(normalize(Path::new("../x")), PathBuf::from("../x"));
        assert_eq!(normalize(Path::new("/a/../../b")), PathBuf::from("/b"));
        assert_eq!(normalize(Path::new("a/..")), PathBuf::from("."));
    }

    #[test]
    fn project_root_prefers_plenum_toml_then_git() {
        let mut fs = MemoryFs::new();
        fs.insert("/w/repo/.git/HEAD", "ref");
        fs.insert("/w/repo/campus/plenum.toml", "");
        fs.insert("/w/repo/campus/east/a.plenum", "");
        fs.insert("/w/repo/other/b.plenum", "");
        fs.insert("/w/loose/c.plenum", "");
        assert_eq!(
            project_root(&fs, Path::new("/w/repo/campus/east/a.plenum")),
            PathBuf::from("/w/repo/campus")
        );
        assert_eq!(
            project_root(&fs, Path::new("/w/repo/other/b.plenum")),
            PathBuf::from("/w/repo")
        );
        assert_eq!(
            project_root(&fs, Path::new("/w/loose/c.plenum")),
            PathBuf::from("/w/loose")
        );
        assert_eq!(
            config_file(&fs, Path::new("/w/repo/campus/east/a.plenum")),
            Some(PathBuf::from("/w/repo/campus/plenum.toml"))
        );
    }

    #[test]
    fn relative_paths_look_in_the_working_folder_too() {
        let mut fs = MemoryFs::new();
        fs.insert("plenum.toml", "");
        fs.insert("design/u.plenum", "");
        assert_eq!(
            project_root(&fs, Path::new("design/u.plenum")),
            PathBuf::from(".")
        );
        assert_eq!(
            config_file(&fs, Path::new("design/u.plenum")),
            Some(PathBuf::from("./plenum.toml"))
        );
        assert_eq!(project_root(&fs, Path::new("u.plenum")), PathBuf::from("."));
    }
}
