//! The LSP lifecycle, notifications and diagnostics publishing. Requests
//! are answered in `requests`; every conversion is in `convert`.

use std::collections::HashSet;
use std::path::PathBuf;
use std::sync::Arc;

use tower_lsp_server::jsonrpc::{Error, Result};
use tower_lsp_server::ls_types::*;
use tower_lsp_server::{Client, LanguageServer};

use crate::convert::{self, Encoding};
use crate::requests;
use crate::state::{Shared, lock};

/// Options of the server (what the process is started with).
#[derive(Clone, Copy, Debug, Default)]
pub struct Options {
    /// Accept the `plenum/testPanic` request, which panics inside the
    /// server: protocol tests use it to check that a panic becomes an error
    /// response and the server goes on. Never on in `plenum lsp`.
    pub test_hooks: bool,
}

pub(crate) struct Backend {
    pub client: Client,
    pub state: Shared,
    /// Publishing is one at a time, so an older batch never lands after a newer one.
    pub publish_lock: Arc<tokio::sync::Mutex<()>>,
    pub options: Options,
}

impl Backend {
    /// Publish the diagnostics of every open document and of every file a
    /// design of an open document reads; clear those of files that left that
    /// set. Skipped when a newer mutation has come in (its own publish runs).
    pub async fn publish(&self, force: Option<PathBuf>) {
        let _one_at_a_time = self.publish_lock.lock().await;
        let batch = {
            let mut guard = lock(&self.state);
            let st = &mut *guard;
            let analysis = st.host.analysis();
            let enc = st.encoding;
            let mut targets: HashSet<PathBuf> = st.docs.keys().cloned().collect();
            for path in st.docs.keys() {
                targets.extend(analysis.related_files(path));
            }
            let mut batch: Vec<(Uri, Vec<Diagnostic>, Option<i32>)> = Vec::new();
            let mut paths: Vec<&PathBuf> = targets.iter().collect();
            paths.sort();
            for path in paths {
                let diags = match analysis.line_index(path) {
                    Some(index) => analysis
                        .diagnostics(path)
                        .iter()
                        .map(|d| requests::diagnostic(st, &analysis, index, d, enc))
                        .collect(),
                    None => Vec::new(),
                };
                let unchanged = st.published.get(path) == Some(&diags);
                if unchanged && force.as_ref() != Some(path) {
                    continue;
                }
                let version = st.docs.get(path).map(|d| d.version);
                if let Some(uri) = st.uri(path) {
                    batch.push((uri, diags.clone(), version));
                }
                st.published.insert(path.clone(), diags);
            }
            let gone: Vec<PathBuf> = st
                .published
                .keys()
                .filter(|p| !targets.contains(*p))
                .cloned()
                .collect();
            for path in gone {
                st.published.remove(&path);
                if let Some(uri) = st.uri(&path) {
                    batch.push((uri, Vec::new(), None));
                }
            }
            batch
        };
        for (uri, diags, version) in batch {
            self.client.publish_diagnostics(uri, diags, version).await;
        }
    }

    fn path(&self, uri: &Uri) -> Option<PathBuf> {
        lock(&self.state).path_of(uri)
    }
}

fn folders_of(params: &InitializeParams) -> Vec<PathBuf> {
    let mut out = Vec::new();
    if let Some(fs) = &params.workspace_folders {
        for f in fs {
            if let Some(p) = convert::path_from_uri(f.uri.as_str()) {
                out.push(plenum_model::fs::normalize(&p));
            }
        }
    }
    #[allow(deprecated)]
    if out.is_empty()
        && let Some(uri) = &params.root_uri
        && let Some(p) = convert::path_from_uri(uri.as_str())
    {
        out.push(plenum_model::fs::normalize(&p));
    }
    out
}

impl LanguageServer for Backend {
    async fn initialize(&self, params: InitializeParams) -> Result<InitializeResult> {
        let enc = Encoding::negotiate(
            params
                .capabilities
                .general
                .as_ref()
                .and_then(|g| g.position_encodings.as_deref()),
        );
        {
            let mut st = lock(&self.state);
            st.encoding = enc;
            st.folders = folders_of(&params);
            let folders = st.folders.clone();
            for f in &folders {
                st.scan(f);
            }
        }
        Ok(InitializeResult {
            capabilities: requests::capabilities(enc),
            server_info: Some(ServerInfo {
                name: "plenum".to_string(),
                version: Some(env!("CARGO_PKG_VERSION").to_string()),
            }),
            offset_encoding: None,
        })
    }

    async fn initialized(&self, _: InitializedParams) {
        // Watch design files and plenum.toml (when the client can be asked to).
        let watchers = ["**/*.plenum", "**/plenum.toml"]
            .into_iter()
            .map(|g| FileSystemWatcher {
                glob_pattern: GlobPattern::String(g.to_string()),
                kind: None,
            })
            .collect();
        let options = DidChangeWatchedFilesRegistrationOptions { watchers };
        if let Ok(value) = serde_json::to_value(options) {
            // Not awaited here: a client that never answers must not keep this
            // handler (and so the server's exit) waiting.
            let client = self.client.clone();
            tokio::spawn(async move {
                let _ = client
                    .register_capability(vec![Registration {
                        id: "plenum-watch".to_string(),
                        method: "workspace/didChangeWatchedFiles".to_string(),
                        register_options: Some(value),
                    }])
                    .await;
            });
        }
    }

    async fn shutdown(&self) -> Result<()> {
        Ok(())
    }

    async fn did_open(&self, p: DidOpenTextDocumentParams) {
        let path = self.path(&p.text_document.uri);
        self.publish(path).await;
    }

    async fn did_change(&self, p: DidChangeTextDocumentParams) {
        let path = self.path(&p.text_document.uri);
        self.publish(path).await;
    }

    async fn did_save(&self, p: DidSaveTextDocumentParams) {
        let path = self.path(&p.text_document.uri);
        self.publish(path).await;
    }

    async fn did_close(&self, _: DidCloseTextDocumentParams) {
        self.publish(None).await;
    }

    async fn did_change_watched_files(&self, _: DidChangeWatchedFilesParams) {
        self.publish(None).await;
    }

    async fn hover(&self, p: HoverParams) -> Result<Option<Hover>> {
        requests::run(&self.state, |st| requests::hover(st, p))
    }

    async fn completion(&self, p: CompletionParams) -> Result<Option<CompletionResponse>> {
        requests::run(&self.state, |st| requests::completion(st, p))
    }

    async fn goto_definition(
        &self,
        p: GotoDefinitionParams,
    ) -> Result<Option<GotoDefinitionResponse>> {
        requests::run(&self.state, |st| requests::definition(st, p))
    }

    async fn references(&self, p: ReferenceParams) -> Result<Option<Vec<Location>>> {
        requests::run(&self.state, |st| requests::references(st, p))
    }

    async fn prepare_rename(
        &self,
        p: TextDocumentPositionParams,
    ) -> Result<Option<PrepareRenameResponse>> {
        requests::run(&self.state, |st| requests::prepare_rename(st, p))?
    }

    async fn rename(&self, p: RenameParams) -> Result<Option<WorkspaceEdit>> {
        requests::run(&self.state, |st| requests::rename(st, p))?
    }

    async fn document_symbol(
        &self,
        p: DocumentSymbolParams,
    ) -> Result<Option<DocumentSymbolResponse>> {
        requests::run(&self.state, |st| requests::document_symbols(st, p))
    }

    async fn symbol(&self, p: WorkspaceSymbolParams) -> Result<Option<WorkspaceSymbolResponse>> {
        requests::run(&self.state, |st| requests::workspace_symbols(st, p))
    }

    async fn folding_range(&self, p: FoldingRangeParams) -> Result<Option<Vec<FoldingRange>>> {
        requests::run(&self.state, |st| requests::folding(st, p))
    }

    async fn document_link(&self, p: DocumentLinkParams) -> Result<Option<Vec<DocumentLink>>> {
        requests::run(&self.state, |st| requests::links(st, p))
    }

    async fn semantic_tokens_full(
        &self,
        p: SemanticTokensParams,
    ) -> Result<Option<SemanticTokensResult>> {
        requests::run(&self.state, |st| requests::semantic_tokens(st, p))
    }

    async fn inlay_hint(&self, p: InlayHintParams) -> Result<Option<Vec<InlayHint>>> {
        requests::run(&self.state, |st| requests::inlay_hints(st, p))
    }

    async fn code_action(&self, p: CodeActionParams) -> Result<Option<CodeActionResponse>> {
        requests::run(&self.state, |st| requests::code_actions(st, p))
    }

    async fn formatting(&self, p: DocumentFormattingParams) -> Result<Option<Vec<TextEdit>>> {
        let answer = requests::run(&self.state, |st| requests::formatting(st, p))?;
        match answer {
            Ok(edits) => Ok(Some(edits)),
            Err(message) => {
                self.client
                    .show_message(MessageType::WARNING, message.clone())
                    .await;
                Ok(None)
            }
        }
    }
}

impl Backend {
    /// `plenum/testPanic` (with [`Options::test_hooks`] only): panics inside
    /// a request, to show the panic is answered as an error.
    pub async fn test_panic(&self) -> Result<()> {
        if !self.options.test_hooks {
            return Err(Error::method_not_found());
        }
        requests::run(&self.state, |_| -> () {
            panic!("plenum/testPanic: a deliberate panic inside a request")
        })
    }

    /// `plenum/stats` (with [`Options::test_hooks`] only): counters for tests.
    pub async fn test_stats(&self) -> Result<serde_json::Value> {
        if !self.options.test_hooks {
            return Err(Error::method_not_found());
        }
        let st = lock(&self.state);
        Ok(serde_json::json!({
            "staleChanges": st.stale_changes,
            "generation": st.generation,
            "designBuilds": st.host.builds(),
            "openDocuments": st.docs.len(),
        }))
    }
}
