//! Requests: each answered from an analysis snapshot, converted to LSP with
//! `convert`, inside `catch_unwind` so that a panic becomes an error
//! response and the server goes on.

use std::collections::HashMap;
use std::panic::{AssertUnwindSafe, catch_unwind};
use std::path::{Path, PathBuf};

use plenum_ide::{
    Analysis, CompletionKind, FoldKind, InlayKind, OutlineKind, Severity as IdeSeverity,
    SourceChange, TokenKind,
};
use plenum_syntax::LineIndex;
use tower_lsp_server::jsonrpc::{Error, ErrorCode, Result};
use tower_lsp_server::ls_types::*;

use crate::convert::{self, Encoding};
use crate::state::{State, lock};

/// Run a request against the state; a panic inside is answered as an
/// internal error, and the state stays usable.
pub(crate) fn run<T>(
    state: &std::sync::Mutex<State>,
    f: impl FnOnce(&mut State) -> T,
) -> Result<T> {
    let mut guard = lock(state);
    let st = &mut *guard;
    catch_unwind(AssertUnwindSafe(|| f(st))).map_err(|cause| {
        let what = cause
            .downcast_ref::<&str>()
            .map(|s| (*s).to_string())
            .or_else(|| cause.downcast_ref::<String>().cloned())
            .unwrap_or_else(|| "unknown cause".to_string());
        Error {
            code: ErrorCode::InternalError,
            message: format!(
                "plenum: the request failed inside the server ({what}); the server is still running"
            )
            .into(),
            data: None,
        }
    })
}

/// The token types of the semantic-token legend, in [`token_index`] order.
pub(crate) const TOKEN_TYPES: [SemanticTokenType; 7] = [
    SemanticTokenType::CLASS,       // zone
    SemanticTokenType::STRUCT,      // air handler
    SemanticTokenType::VARIABLE,    // let
    SemanticTokenType::PROPERTY,    // key
    SemanticTokenType::TYPE,        // unit
    SemanticTokenType::KEYWORD,     // block kind, keyword
    SemanticTokenType::ENUM_MEMBER, // word value
];

fn token_index(k: TokenKind) -> u32 {
    match k {
        TokenKind::Zone => 0,
        TokenKind::Ahu => 1,
        TokenKind::Let => 2,
        TokenKind::Key => 3,
        TokenKind::Unit => 4,
        TokenKind::Keyword => 5,
        TokenKind::Word => 6,
    }
}

pub(crate) fn capabilities(enc: Encoding) -> ServerCapabilities {
    ServerCapabilities {
        position_encoding: Some(enc.kind()),
        text_document_sync: Some(TextDocumentSyncCapability::Options(
            TextDocumentSyncOptions {
                open_close: Some(true),
                change: Some(TextDocumentSyncKind::INCREMENTAL),
                save: Some(TextDocumentSyncSaveOptions::SaveOptions(SaveOptions {
                    include_text: Some(false),
                })),
                ..Default::default()
            },
        )),
        hover_provider: Some(HoverProviderCapability::Simple(true)),
        completion_provider: Some(CompletionOptions {
            trigger_characters: Some(vec![" ".to_string(), ",".to_string()]),
            ..Default::default()
        }),
        definition_provider: Some(OneOf::Left(true)),
        references_provider: Some(OneOf::Left(true)),
        rename_provider: Some(OneOf::Right(RenameOptions {
            prepare_provider: Some(true),
            work_done_progress_options: Default::default(),
        })),
        document_symbol_provider: Some(OneOf::Left(true)),
        workspace_symbol_provider: Some(OneOf::Left(true)),
        folding_range_provider: Some(FoldingRangeProviderCapability::Simple(true)),
        document_link_provider: Some(DocumentLinkOptions {
            resolve_provider: Some(false),
            work_done_progress_options: Default::default(),
        }),
        semantic_tokens_provider: Some(SemanticTokensServerCapabilities::SemanticTokensOptions(
            SemanticTokensOptions {
                legend: SemanticTokensLegend {
                    token_types: TOKEN_TYPES.to_vec(),
                    token_modifiers: vec![SemanticTokenModifier::DECLARATION],
                },
                full: Some(SemanticTokensFullOptions::Bool(true)),
                range: None,
                work_done_progress_options: Default::default(),
            },
        )),
        inlay_hint_provider: Some(OneOf::Left(true)),
        code_action_provider: Some(CodeActionProviderCapability::Options(CodeActionOptions {
            code_action_kinds: Some(vec![CodeActionKind::QUICKFIX]),
            ..Default::default()
        })),
        document_formatting_provider: Some(OneOf::Left(true)),
        ..Default::default()
    }
}

/// What a request needs: the snapshot, the path and its line index.
struct At {
    analysis: Analysis,
    path: PathBuf,
    enc: Encoding,
}

impl At {
    fn new(st: &mut State, uri: &Uri) -> Option<At> {
        let path = st.path_of(uri)?;
        Some(At {
            analysis: st.host.analysis(),
            path,
            enc: st.encoding,
        })
    }

    fn index(&self) -> Option<&LineIndex> {
        self.analysis.line_index(&self.path)
    }

    fn offset(&self, pos: Position) -> Option<u32> {
        Some(convert::offset(self.index()?, pos, self.enc))
    }

    fn range(&self, span: plenum_ide::Span) -> Option<Range> {
        Some(convert::range(self.index()?, span, self.enc))
    }
}

fn location(
    st: &State,
    a: &Analysis,
    path: &Path,
    span: plenum_ide::Span,
    enc: Encoding,
) -> Option<Location> {
    let index = a.line_index(path)?;
    Some(Location {
        uri: st.uri(path)?,
        range: convert::range(index, span, enc),
    })
}

fn workspace_edit(st: &State, a: &Analysis, change: &SourceChange, enc: Encoding) -> WorkspaceEdit {
    let mut changes: HashMap<Uri, Vec<TextEdit>> = HashMap::new();
    for (path, edits) in &change.edits {
        let (Some(uri), Some(index)) = (st.uri(path), a.line_index(path)) else {
            continue;
        };
        changes.insert(
            uri,
            edits
                .iter()
                .map(|e| TextEdit {
                    range: convert::range(index, e.span, enc),
                    new_text: e.new_text.clone(),
                })
                .collect(),
        );
    }
    WorkspaceEdit {
        changes: Some(changes),
        ..Default::default()
    }
}

pub(crate) fn diagnostic(
    st: &State,
    a: &Analysis,
    index: &LineIndex,
    d: &plenum_ide::Diagnostic,
    enc: Encoding,
) -> Diagnostic {
    let mut message = d.message.clone();
    if let Some(h) = &d.help {
        message.push_str("\nhelp: ");
        message.push_str(h);
    }
    let related: Vec<DiagnosticRelatedInformation> = d
        .related
        .iter()
        .filter_map(|r| {
            Some(DiagnosticRelatedInformation {
                location: location(st, a, &r.range.path, r.range.span, enc)?,
                message: r.message.clone(),
            })
        })
        .collect();
    Diagnostic {
        range: convert::range(index, d.span, enc),
        severity: Some(match d.severity {
            IdeSeverity::Error => DiagnosticSeverity::ERROR,
            IdeSeverity::Warning => DiagnosticSeverity::WARNING,
            IdeSeverity::Info => DiagnosticSeverity::INFORMATION,
            IdeSeverity::Hint => DiagnosticSeverity::HINT,
        }),
        code: Some(NumberOrString::String(d.code.clone())),
        source: Some("plenum".to_string()),
        message,
        related_information: (!related.is_empty()).then_some(related),
        ..Default::default()
    }
}

pub(crate) fn hover(st: &mut State, p: HoverParams) -> Option<Hover> {
    let at = At::new(st, &p.text_document_position_params.text_document.uri)?;
    let offset = at.offset(p.text_document_position_params.position)?;
    let h = at.analysis.hover(&at.path, offset)?;
    Some(Hover {
        contents: HoverContents::Markup(MarkupContent {
            kind: MarkupKind::Markdown,
            value: h.markdown,
        }),
        range: at.range(h.span),
    })
}

pub(crate) fn completion(st: &mut State, p: CompletionParams) -> Option<CompletionResponse> {
    let at = At::new(st, &p.text_document_position.text_document.uri)?;
    let offset = at.offset(p.text_document_position.position)?;
    let items = at
        .analysis
        .completions(&at.path, offset)
        .into_iter()
        .filter_map(|c| {
            Some(CompletionItem {
                label: c.label.clone(),
                kind: Some(match c.kind {
                    CompletionKind::Keyword => CompletionItemKind::KEYWORD,
                    CompletionKind::Key => CompletionItemKind::PROPERTY,
                    CompletionKind::Unit => CompletionItemKind::UNIT,
                    CompletionKind::Zone => CompletionItemKind::CLASS,
                    CompletionKind::Ahu => CompletionItemKind::STRUCT,
                    CompletionKind::Let => CompletionItemKind::VARIABLE,
                    CompletionKind::Category => CompletionItemKind::ENUM_MEMBER,
                    CompletionKind::Word => CompletionItemKind::VALUE,
                }),
                detail: c.detail.clone(),
                documentation: c.documentation.map(|d| {
                    Documentation::MarkupContent(MarkupContent {
                        kind: MarkupKind::Markdown,
                        value: d,
                    })
                }),
                text_edit: Some(CompletionTextEdit::Edit(TextEdit {
                    range: at.range(c.replace)?,
                    new_text: c.insert_text,
                })),
                ..Default::default()
            })
        })
        .collect();
    Some(CompletionResponse::Array(items))
}

pub(crate) fn definition(
    st: &mut State,
    p: GotoDefinitionParams,
) -> Option<GotoDefinitionResponse> {
    let at = At::new(st, &p.text_document_position_params.text_document.uri)?;
    let offset = at.offset(p.text_document_position_params.position)?;
    let targets: Vec<Location> = at
        .analysis
        .definition(&at.path, offset)
        .iter()
        .filter_map(|t| location(st, &at.analysis, &t.path, t.focus_span, at.enc))
        .collect();
    (!targets.is_empty()).then_some(GotoDefinitionResponse::Array(targets))
}

pub(crate) fn references(st: &mut State, p: ReferenceParams) -> Option<Vec<Location>> {
    let at = At::new(st, &p.text_document_position.text_document.uri)?;
    let offset = at.offset(p.text_document_position.position)?;
    let refs: Vec<Location> = at
        .analysis
        .references(&at.path, offset, p.context.include_declaration)
        .iter()
        .filter_map(|r| location(st, &at.analysis, &r.path, r.span, at.enc))
        .collect();
    Some(refs)
}

fn request_failed(message: String) -> Error {
    Error {
        code: ErrorCode::ServerError(-32803),
        message: message.into(),
        data: None,
    }
}

pub(crate) fn prepare_rename(
    st: &mut State,
    p: TextDocumentPositionParams,
) -> Result<Option<PrepareRenameResponse>> {
    let Some(at) = At::new(st, &p.text_document.uri) else {
        return Ok(None);
    };
    let Some(offset) = at.offset(p.position) else {
        return Ok(None);
    };
    match at.analysis.prepare_rename(&at.path, offset) {
        Ok(span) => Ok(at.range(span).map(PrepareRenameResponse::Range)),
        Err(e) => Err(request_failed(e.to_string())),
    }
}

pub(crate) fn rename(st: &mut State, p: RenameParams) -> Result<Option<WorkspaceEdit>> {
    let Some(at) = At::new(st, &p.text_document_position.text_document.uri) else {
        return Ok(None);
    };
    let Some(offset) = at.offset(p.text_document_position.position) else {
        return Ok(None);
    };
    match at.analysis.rename(&at.path, offset, &p.new_name) {
        Ok(change) => Ok(Some(workspace_edit(st, &at.analysis, &change, at.enc))),
        Err(e) => Err(request_failed(e.to_string())),
    }
}

fn outline_kind(k: OutlineKind) -> SymbolKind {
    match k {
        OutlineKind::Project => SymbolKind::MODULE,
        OutlineKind::Site => SymbolKind::NAMESPACE,
        OutlineKind::Zone => SymbolKind::CLASS,
        OutlineKind::Ahu => SymbolKind::STRUCT,
        OutlineKind::Fan | OutlineKind::Coil | OutlineKind::Block => SymbolKind::OBJECT,
        OutlineKind::Let => SymbolKind::VARIABLE,
        OutlineKind::Use => SymbolKind::FILE,
        OutlineKind::Key => SymbolKind::PROPERTY,
    }
}

#[allow(deprecated)]
fn document_symbol(at: &At, s: &plenum_ide::DocumentSymbol) -> Option<DocumentSymbol> {
    Some(DocumentSymbol {
        name: if s.name.is_empty() {
            "?".to_string()
        } else {
            s.name.clone()
        },
        detail: s.detail.clone(),
        kind: outline_kind(s.kind),
        tags: None,
        deprecated: None,
        range: at.range(s.span)?,
        selection_range: at.range(s.selection)?,
        children: Some(
            s.children
                .iter()
                .filter_map(|c| document_symbol(at, c))
                .collect(),
        ),
    })
}

pub(crate) fn document_symbols(
    st: &mut State,
    p: DocumentSymbolParams,
) -> Option<DocumentSymbolResponse> {
    let at = At::new(st, &p.text_document.uri)?;
    let list = at
        .analysis
        .document_symbols(&at.path)
        .iter()
        .filter_map(|s| document_symbol(&at, s))
        .collect();
    Some(DocumentSymbolResponse::Nested(list))
}

pub(crate) fn workspace_symbols(
    st: &mut State,
    p: WorkspaceSymbolParams,
) -> Option<WorkspaceSymbolResponse> {
    let analysis = st.host.analysis();
    let enc = st.encoding;
    let list = analysis
        .workspace_symbols(&p.query)
        .iter()
        .filter_map(|s| {
            Some(WorkspaceSymbol {
                name: s.name.clone(),
                kind: match s.kind {
                    plenum_model::SymbolKind::Zone => SymbolKind::CLASS,
                    plenum_model::SymbolKind::Ahu => SymbolKind::STRUCT,
                    plenum_model::SymbolKind::Let => SymbolKind::VARIABLE,
                },
                tags: None,
                container_name: s.detail.clone(),
                location: OneOf::Left(location(st, &analysis, &s.path, s.span, enc)?),
                data: None,
            })
        })
        .collect();
    Some(WorkspaceSymbolResponse::Nested(list))
}

pub(crate) fn folding(st: &mut State, p: FoldingRangeParams) -> Option<Vec<FoldingRange>> {
    let at = At::new(st, &p.text_document.uri)?;
    let index = at.index()?;
    let ranges = at
        .analysis
        .folding_ranges(&at.path)
        .iter()
        .filter_map(|r| {
            let start = index
                .line_col(r.span.start, plenum_syntax::ColumnUnit::Utf8)
                .line;
            let mut end = index
                .line_col(r.span.end, plenum_syntax::ColumnUnit::Utf8)
                .line;
            // Keep a block's `}` line visible.
            if r.kind == FoldKind::Block && end > start + 1 {
                end -= 1;
            }
            (end > start).then_some(FoldingRange {
                start_line: start,
                end_line: end,
                kind: Some(match r.kind {
                    FoldKind::Block => FoldingRangeKind::Region,
                    FoldKind::Comment => FoldingRangeKind::Comment,
                }),
                ..Default::default()
            })
        })
        .collect();
    Some(ranges)
}

pub(crate) fn links(st: &mut State, p: DocumentLinkParams) -> Option<Vec<DocumentLink>> {
    let at = At::new(st, &p.text_document.uri)?;
    let links = at
        .analysis
        .document_links(&at.path)
        .iter()
        .filter_map(|l| {
            Some(DocumentLink {
                range: at.range(l.span)?,
                target: Some(st.uri(&l.target)?),
                tooltip: Some(l.target.display().to_string()),
                data: None,
            })
        })
        .collect();
    Some(links)
}

pub(crate) fn semantic_tokens(
    st: &mut State,
    p: SemanticTokensParams,
) -> Option<SemanticTokensResult> {
    let at = At::new(st, &p.text_document.uri)?;
    let index = at.index()?;
    let mut data = Vec::new();
    let (mut line, mut col) = (0u32, 0u32);
    for t in at.analysis.semantic_tokens(&at.path) {
        let s = convert::position(index, t.span.start, at.enc);
        let e = convert::position(index, t.span.end, at.enc);
        if e.line != s.line || e.character <= s.character {
            continue;
        }
        let delta_line = s.line - line;
        let delta_start = if delta_line == 0 {
            s.character - col
        } else {
            s.character
        };
        data.push(SemanticToken {
            delta_line,
            delta_start,
            length: e.character - s.character,
            token_type: token_index(t.kind),
            token_modifiers_bitset: u32::from(t.definition),
        });
        line = s.line;
        col = s.character;
    }
    Some(SemanticTokensResult::Tokens(SemanticTokens {
        result_id: None,
        data,
    }))
}

pub(crate) fn inlay_hints(st: &mut State, p: InlayHintParams) -> Option<Vec<InlayHint>> {
    let at = At::new(st, &p.text_document.uri)?;
    let index = at.index()?;
    let want = convert::span(index, p.range, at.enc);
    let hints = at
        .analysis
        .inlay_hints(&at.path)
        .into_iter()
        .filter(|h| want.touches(h.offset))
        .map(|h| InlayHint {
            position: convert::position(index, h.offset, at.enc),
            label: InlayHintLabel::String(h.label),
            kind: match h.kind {
                InlayKind::Capacity | InlayKind::Airflow => None,
            },
            text_edits: None,
            tooltip: h.tooltip.map(InlayHintTooltip::String),
            padding_left: Some(true),
            padding_right: None,
            data: None,
        })
        .collect();
    Some(hints)
}

pub(crate) fn code_actions(st: &mut State, p: CodeActionParams) -> Option<CodeActionResponse> {
    let at = At::new(st, &p.text_document.uri)?;
    let index = at.index()?;
    let span = convert::span(index, p.range, at.enc);
    let actions = at
        .analysis
        .code_actions(&at.path, span)
        .iter()
        .map(|a| {
            let diagnostics: Vec<Diagnostic> = p
                .context
                .diagnostics
                .iter()
                .filter(|d| {
                    a.diagnostic
                        .as_ref()
                        .is_some_and(|code| d.code == Some(NumberOrString::String(code.clone())))
                })
                .cloned()
                .collect();
            CodeActionOrCommand::CodeAction(CodeAction {
                title: a.title.clone(),
                kind: Some(CodeActionKind::QUICKFIX),
                diagnostics: (!diagnostics.is_empty()).then_some(diagnostics),
                edit: Some(workspace_edit(st, &at.analysis, &a.change, at.enc)),
                is_preferred: Some(a.preferred),
                ..Default::default()
            })
        })
        .collect();
    Some(actions)
}

pub(crate) fn formatting(
    st: &mut State,
    p: DocumentFormattingParams,
) -> std::result::Result<Vec<TextEdit>, String> {
    let at = At::new(st, &p.text_document.uri).ok_or("not a file")?;
    let index = at.index().ok_or("the file is not open")?;
    let edits = at.analysis.format(&at.path).map_err(|e| e.to_string())?;
    Ok(edits
        .into_iter()
        .map(|e| TextEdit {
            range: convert::range(index, e.span, at.enc),
            new_text: e.new_text,
        })
        .collect())
}
