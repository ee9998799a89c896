//! The `LanguageServer` implementation. Edits are applied under a plain mutex
//! before any `.await`, so concurrently running handlers never reorder them.
//! Evaluation runs on a worker task, never in a handler: a change only marks its
//! document dirty and wakes the worker, so changes that arrive while one
//! evaluation runs are merged and only the newest text is evaluated. A first
//! reading of a document goes to the blocking pool; a small update
//! (proportional to the blocks the edits touched) runs on the worker task
//! itself, between two messages.
//!
//! A change is converted once, when it arrives, into the byte range it replaced
//! and its text, and queued on its document; the worker hands the queued changes
//! to `Analysis::edits` (a burst merged while an evaluation ran becomes that
//! sequence, evaluated once over one range covering it), so no whole text is
//! copied or compared per edit. Only a whole-document change (opening, or a
//! change without a range) goes through the whole text. A [`Gate`] (tests only)
//! holds the worker at each step so a test can decide exactly what is merged.

use crate::convert;
use crate::documents::apply_change;
use crate::gate::Gate;
use parax_ide::{actions, complete, format, hints, hover, labels, outline, tokens, Analysis};
use parax_syntax::ColumnUnit;
use ropey::Rope;
use std::collections::{BTreeSet, HashMap};
use std::ops::Range;
use std::sync::{Arc, Mutex};
use tokio::sync::Notify;
use tower_lsp_server::jsonrpc::Result;
use tower_lsp_server::ls_types::*;
use tower_lsp_server::{Client, LanguageServer};

struct Doc {
    uri: Uri,
    rope: Rope,
    version: i32,
    /// How many changes the rope has had since the document was opened: the
    /// number of its text, by which analyses and queued changes are matched.
    seq: u64,
    /// The newest analysis made of the document (by the worker or a request),
    /// of any text; `None` while the worker updates it.
    analysis: Option<Tagged>,
    /// The changes after the text of the newest analysis (or of the one the
    /// worker is updating), in order: that text with these applied is the rope.
    pending: Vec<Pending>,
}

/// An analysis with the number of the text it is of.
struct Tagged {
    seq: u64,
    analysis: Arc<Analysis>,
}

/// A change as queued for the worker, with the number of the text it makes.
struct Pending {
    seq: u64,
    change: Change,
}

/// One change of a document, as the analysis takes it.
enum Change {
    /// The bytes `range` of the text before it replaced by `text`.
    Edit { range: Range<usize>, text: String },
    /// A new whole text.
    Whole(String),
}

impl Doc {
    /// A document just opened with `text`: its one change is the whole text.
    fn new(uri: Uri, text: String, version: i32) -> Self {
        Doc {
            uri,
            rope: Rope::from_str(&text),
            version,
            seq: 1,
            analysis: None,
            pending: vec![Pending {
                seq: 1,
                change: Change::Whole(text),
            }],
        }
    }

    /// Keep `made` when it is newer than the analysis held (or none is held),
    /// and forget the queued changes its text already has. True when kept.
    fn keep(&mut self, made: Tagged) -> bool {
        if self.analysis.as_ref().is_some_and(|t| t.seq >= made.seq) {
            return false;
        }
        let done = self.pending.partition_point(|p| p.seq <= made.seq);
        self.pending.drain(..done);
        self.analysis = Some(made);
        true
    }
}

#[derive(Default)]
struct State {
    docs: HashMap<String, Doc>,
    dirty: BTreeSet<String>,
    unit: Option<ColumnUnit>,
    worker_started: bool,
    /// The client resolves an inlay hint's tooltip on demand
    /// (`inlayHint/resolve`), so hints are sent without it.
    lazy_tooltips: bool,
}

/// The server: shared state plus the client handle.
pub struct Server {
    client: Client,
    state: Arc<Mutex<State>>,
    wake: Arc<Notify>,
    gate: Option<Gate>,
}

impl Server {
    /// A server talking to `client`.
    pub fn new(client: Client) -> Self {
        Server {
            client,
            state: Arc::new(Mutex::new(State::default())),
            wake: Arc::new(Notify::new()),
            gate: None,
        }
    }

    /// A server whose worker waits at `gate` before taking up a document and
    /// before keeping what it computed (a test hook; see [`Gate`]).
    pub fn gated(client: Client, gate: Gate) -> Self {
        Server {
            gate: Some(gate),
            ..Server::new(client)
        }
    }

    fn lock(&self) -> std::sync::MutexGuard<'_, State> {
        // A panic in another handler must not take the server down with it.
        self.state.lock().unwrap_or_else(|p| p.into_inner())
    }

    fn unit(&self) -> ColumnUnit {
        self.lock().unit.unwrap_or(ColumnUnit::Utf16)
    }

    fn mark_dirty(&self, key: String) {
        let start = {
            let mut st = self.lock();
            st.dirty.insert(key);
            !std::mem::replace(&mut st.worker_started, true)
        };
        if start {
            tokio::spawn(worker(
                self.client.clone(),
                self.state.clone(),
                self.wake.clone(),
                self.gate.clone(),
            ));
        }
        self.wake.notify_one();
    }

    /// The analysis of the document's current text: cached when the newest
    /// version has been evaluated, computed now otherwise.
    async fn analysis(&self, uri: &Uri) -> Option<(Arc<Analysis>, ColumnUnit)> {
        let (text, seq) = {
            let st = self.lock();
            let doc = st.docs.get(uri.as_str())?;
            if let Some(t) = &doc.analysis {
                if t.seq == doc.seq {
                    return Some((t.analysis.clone(), st.unit.unwrap_or(ColumnUnit::Utf16)));
                }
            }
            (doc.rope.to_string(), doc.seq)
        };
        let a = Arc::new(
            tokio::task::spawn_blocking(move || Analysis::new(&text))
                .await
                .ok()?,
        );
        let mut st = self.lock();
        let unit = st.unit.unwrap_or(ColumnUnit::Utf16);
        if let Some(doc) = st.docs.get_mut(uri.as_str()) {
            doc.keep(Tagged {
                seq,
                analysis: a.clone(),
            });
        }
        Some((a, unit))
    }
}

/// What the worker takes up for one document: the analysis to start from (if
/// any) and the changes after its text.
struct Job {
    key: String,
    uri: Uri,
    seq: u64,
    version: i32,
    unit: ColumnUnit,
    start: Option<Arc<Analysis>>,
    changes: Vec<Change>,
}

impl Job {
    /// True when the job is bounded work that may run between two messages:
    /// it starts from an analysis, has no whole-text change, replaces and
    /// inserts at most [`LIGHT_BYTES`] in all, and no top-level block of the
    /// analysis is over [`LIGHT_BYTES`] (an edit re-reads whole blocks).
    fn light(&self) -> bool {
        let Some(start) = &self.start else {
            return false;
        };
        let mut bytes = 0;
        for c in &self.changes {
            match c {
                Change::Edit { range, text } => bytes += range.len() + text.len(),
                Change::Whole(_) => return false,
            }
        }
        bytes <= LIGHT_BYTES
            && start
                .parsed
                .blocks
                .iter()
                .all(|b| b.span.len() <= LIGHT_BYTES)
    }

    /// The analysis of the document's text: the last whole text (compared
    /// with the starting analysis, if any), then the edits after it.
    fn run(start: Option<Arc<Analysis>>, changes: Vec<Change>) -> Arc<Analysis> {
        // Nothing queued (a request analysed the newest text meanwhile): the
        // analysis is already the document's, shared as it is.
        if let (Some(start), true) = (&start, changes.is_empty()) {
            return start.clone();
        }
        // Unshared unless a request is reading it right now.
        let start = start.map(|p| Arc::try_unwrap(p).unwrap_or_else(|p| (*p).clone()));
        let whole = changes.iter().rposition(|c| matches!(c, Change::Whole(_)));
        let (a, edits) = match (whole, start) {
            (Some(i), start) => {
                let Change::Whole(text) = &changes[i] else {
                    unreachable!("found as a whole text")
                };
                let a = match start {
                    Some(p) => p.update(text),
                    None => Analysis::new(text),
                };
                (a, &changes[i + 1..])
            }
            (None, Some(p)) => (p, &changes[..]),
            // `take_job` always gives a whole text when there is no analysis.
            (None, None) => (Analysis::new(""), &changes[..]),
        };
        Arc::new(a.edits(edits.iter().filter_map(|c| match c {
            Change::Edit { range, text } => Some((range.clone(), text.as_str())),
            Change::Whole(_) => None,
        })))
    }
}

/// Take up the first dirty document: its analysis (taken out, so it can be
/// updated in place) and the changes queued after it. Without an analysis and
/// without a queued whole text (an update that was lost), the rope's text is
/// read whole.
fn take_job(st: &mut State) -> Option<Job> {
    let key = st.dirty.pop_first()?;
    let unit = st.unit.unwrap_or(ColumnUnit::Utf16);
    let d = st.docs.get_mut(&key)?;
    let start = d.analysis.take().map(|t| t.analysis);
    let mut changes: Vec<Change> = d.pending.drain(..).map(|p| p.change).collect();
    if start.is_none() && !changes.iter().any(|c| matches!(c, Change::Whole(_))) {
        // Sized once (`to_string` grows the string by doubling).
        let mut text = String::with_capacity(d.rope.len_bytes());
        for chunk in d.rope.chunks() {
            text.push_str(chunk);
        }
        changes = vec![Change::Whole(text)];
    }
    Some(Job {
        uri: d.uri.clone(),
        seq: d.seq,
        version: d.version,
        key,
        unit,
        start,
        changes,
    })
}

/// Evaluate dirty documents and publish their diagnostics, newest version only.
async fn worker(client: Client, state: Arc<Mutex<State>>, wake: Arc<Notify>, gate: Option<Gate>) {
    let lock = || state.lock().unwrap_or_else(|p| p.into_inner());
    loop {
        wake.notified().await;
        loop {
            if lock().dirty.is_empty() {
                break;
            }
            if let Some(g) = &gate {
                g.before_taking().await;
            }
            let Some(job) = take_job(&mut lock()) else {
                continue;
            };
            if let Some(g) = &gate {
                g.taken(job.changes.len());
            }
            let light = job.light();
            let Job {
                key,
                uri,
                seq,
                version,
                unit,
                start,
                changes,
            } = job;
            let a = if light {
                // An update re-reads and recomputes only the blocks the edits
                // touched (a fraction of a millisecond even in a 20,000-line
                // file), so a small one runs right here, between two messages:
                // sending it to the blocking pool and back cost more than the
                // update itself (two thread switches).
                Job::run(start, changes)
            } else {
                // A first reading, or an update that may re-read a lot of text
                // (a large block, a large paste): off the message loop.
                match tokio::task::spawn_blocking(move || Job::run(start, changes)).await {
                    Ok(a) => a,
                    Err(_) => continue,
                }
            };
            if let Some(g) = &gate {
                g.before_keeping().await;
            }
            let current = {
                let mut st = lock();
                match st.docs.get_mut(&key) {
                    // Kept unless a request made a newer one meanwhile; when a
                    // newer version arrived meanwhile, it is dirty again and the
                    // next round updates from this one.
                    Some(doc) => {
                        let current = doc.seq == seq;
                        doc.keep(Tagged {
                            seq,
                            analysis: a.clone(),
                        });
                        current
                    }
                    None => false,
                }
            };
            if let Some(g) = &gate {
                g.evaluated(current);
            }
            if current {
                let diags = a
                    .evaluation
                    .diagnostics
                    .iter()
                    .map(|d| convert::diagnostic(&a, d, unit))
                    .collect();
                client.publish_diagnostics(uri, diags, Some(version)).await;
            }
        }
    }
}

/// Most bytes an update may re-read on the message loop (see [`Job::light`]).
const LIGHT_BYTES: usize = 64 * 1024;

fn token_type(c: tokens::TokenClass) -> SemanticTokenType {
    use tokens::TokenClass as T;
    match c {
        T::BlockKeyword => SemanticTokenType::NAMESPACE,
        T::Keyword => SemanticTokenType::KEYWORD,
        T::Number => SemanticTokenType::NUMBER,
        T::Unit => SemanticTokenType::TYPE,
        T::Text => SemanticTokenType::STRING,
        T::Date => SemanticTokenType::ENUM,
        T::Operator => SemanticTokenType::OPERATOR,
        T::Label => SemanticTokenType::VARIABLE,
        T::Word => SemanticTokenType::ENUM_MEMBER,
        T::Comment => SemanticTokenType::COMMENT,
    }
}

fn symbol(a: &Analysis, s: &outline::Symbol, unit: ColumnUnit) -> DocumentSymbol {
    #[allow(deprecated)]
    DocumentSymbol {
        name: s.name.clone(),
        detail: Some(s.detail.clone()),
        kind: if s.block.is_some() {
            SymbolKind::NAMESPACE
        } else {
            SymbolKind::VARIABLE
        },
        tags: None,
        deprecated: None,
        range: convert::range(a, s.span, unit),
        selection_range: convert::range(a, s.selection, unit),
        children: Some(s.children.iter().map(|c| symbol(a, c, unit)).collect()),
    }
}

impl LanguageServer for Server {
    async fn initialize(&self, params: InitializeParams) -> Result<InitializeResult> {
        let offered = params
            .capabilities
            .general
            .as_ref()
            .and_then(|g| g.position_encodings.as_ref())
            .is_some_and(|e| e.contains(&PositionEncodingKind::UTF8));
        let (unit, kind) = if offered {
            (ColumnUnit::Utf8, PositionEncodingKind::UTF8)
        } else {
            (ColumnUnit::Utf16, PositionEncodingKind::UTF16)
        };
        // Tooltips are most of an inlay hint answer (every value of the line
        // with its label): sent only on request when the client can ask.
        let lazy_tooltips = params
            .capabilities
            .text_document
            .as_ref()
            .and_then(|t| t.inlay_hint.as_ref())
            .and_then(|h| h.resolve_support.as_ref())
            .is_some_and(|r| r.properties.iter().any(|p| p == "tooltip"));
        {
            let mut st = self.lock();
            st.unit = Some(unit);
            st.lazy_tooltips = lazy_tooltips;
        }
        Ok(InitializeResult {
            offset_encoding: None,
            server_info: Some(ServerInfo {
                name: "parax".into(),
                version: Some(env!("CARGO_PKG_VERSION").into()),
            }),
            capabilities: ServerCapabilities {
                position_encoding: Some(kind),
                text_document_sync: Some(TextDocumentSyncCapability::Kind(
                    TextDocumentSyncKind::INCREMENTAL,
                )),
                hover_provider: Some(HoverProviderCapability::Simple(true)),
                completion_provider: Some(CompletionOptions {
                    trigger_characters: Some(vec![" ".into()]),
                    ..Default::default()
                }),
                inlay_hint_provider: Some(OneOf::Right(InlayHintServerCapabilities::Options(
                    InlayHintOptions {
                        resolve_provider: Some(true),
                        ..Default::default()
                    },
                ))),
                document_formatting_provider: Some(OneOf::Left(true)),
                document_range_formatting_provider: Some(OneOf::Left(true)),
                code_action_provider: Some(CodeActionProviderCapability::Simple(true)),
                document_symbol_provider: Some(OneOf::Left(true)),
                folding_range_provider: Some(FoldingRangeProviderCapability::Simple(true)),
                definition_provider: Some(OneOf::Left(true)),
                references_provider: Some(OneOf::Left(true)),
                semantic_tokens_provider: Some(
                    SemanticTokensServerCapabilities::SemanticTokensOptions(
                        SemanticTokensOptions {
                            legend: SemanticTokensLegend {
                                token_types: tokens::TokenClass::ALL
                                    .iter()
                                    .map(|c| token_type(*c))
                                    .collect(),
                                token_modifiers: vec![],
                            },
                            full: Some(SemanticTokensFullOptions::Bool(true)),
                            range: None,
                            ..Default::default()
                        },
                    ),
                ),
                ..Default::default()
            },
        })
    }

    async fn shutdown(&self) -> Result<()> {
        Ok(())
    }

    async fn did_open(&self, params: DidOpenTextDocumentParams) {
        let d = params.text_document;
        let key = d.uri.as_str().to_string();
        {
            let mut st = self.lock();
            st.docs
                .insert(key.clone(), Doc::new(d.uri, d.text, d.version));
        }
        if let Some(g) = &self.gate {
            g.received();
        }
        self.mark_dirty(key);
    }

    async fn did_change(&self, params: DidChangeTextDocumentParams) {
        let key = params.text_document.uri.as_str().to_string();
        // Applied under the lock, before any await: edits are never reordered.
        let outcome: std::result::Result<(), String> = {
            let mut st = self.lock();
            let unit = st.unit.unwrap_or(ColumnUnit::Utf16);
            match st.docs.get_mut(&key) {
                None => Err(format!("change to a document that is not open: {key}")),
                Some(doc) => {
                    // Work on a clone (cheap: ropes share their chunks) so a bad
                    // change leaves the document as it was.
                    let mut rope = doc.rope.clone();
                    let mut changes = Vec::with_capacity(params.content_changes.len());
                    let mut result = Ok(());
                    for c in params.content_changes {
                        let range = c.range.map(|r| {
                            (
                                (r.start.line, r.start.character),
                                (r.end.line, r.end.character),
                            )
                        });
                        match apply_change(&mut rope, range, &c.text, unit) {
                            Ok(Some(range)) => changes.push(Change::Edit {
                                range,
                                text: c.text,
                            }),
                            Ok(None) => changes.push(Change::Whole(c.text)),
                            Err(e) => {
                                result = Err(format!(
                                    "rejected an edit to {key} (version {}): {e}",
                                    params.text_document.version
                                ));
                                break;
                            }
                        }
                    }
                    if result.is_ok() {
                        doc.rope = rope;
                        doc.version = params.text_document.version;
                        for change in changes {
                            doc.seq += 1;
                            doc.pending.push(Pending {
                                seq: doc.seq,
                                change,
                            });
                        }
                    }
                    result
                }
            }
        };
        if let Some(g) = &self.gate {
            g.received();
        }
        match outcome {
            Ok(()) => self.mark_dirty(key),
            Err(msg) => {
                eprintln!("parax lsp: {msg}");
                self.client.log_message(MessageType::ERROR, msg).await;
            }
        }
    }

    async fn did_close(&self, params: DidCloseTextDocumentParams) {
        let uri = params.text_document.uri;
        self.lock().docs.remove(uri.as_str());
        self.client.publish_diagnostics(uri, Vec::new(), None).await;
    }

    async fn hover(&self, params: HoverParams) -> Result<Option<Hover>> {
        let p = params.text_document_position_params;
        let Some((a, unit)) = self.analysis(&p.text_document.uri).await else {
            return Ok(None);
        };
        let off = convert::offset(&a, p.position, unit);
        Ok(hover::hover(&a, off).map(|h| Hover {
            contents: HoverContents::Markup(MarkupContent {
                kind: MarkupKind::Markdown,
                value: h.markdown,
            }),
            range: Some(convert::range(&a, h.span, unit)),
        }))
    }

    async fn inlay_hint(&self, params: InlayHintParams) -> Result<Option<Vec<InlayHint>>> {
        let uri = params.text_document.uri;
        let Some((a, unit)) = self.analysis(&uri).await else {
            return Ok(None);
        };
        let lazy = self.lock().lazy_tooltips;
        let span = convert::span(&a, params.range, unit);
        let found = if lazy {
            hints::inlay_hints_without_tooltips(&a, Some(span))
        } else {
            hints::inlay_hints(&a, Some(span))
        };
        Ok(Some(
            found
                .into_iter()
                .map(|h| {
                    let position = convert::position(&a, h.offset, unit);
                    let (tooltip, data) = if lazy {
                        (None, Some(serde_json::json!({ "uri": uri.as_str() })))
                    } else {
                        (Some(InlayHintTooltip::String(h.tooltip)), None)
                    };
                    InlayHint {
                        position,
                        label: InlayHintLabel::String(h.label),
                        kind: None,
                        text_edits: None,
                        tooltip,
                        padding_left: Some(true),
                        padding_right: None,
                        data,
                    }
                })
                .collect(),
        ))
    }

    async fn inlay_hint_resolve(&self, mut hint: InlayHint) -> Result<InlayHint> {
        // The hint of the line at its position, in the newest analysis; a hint
        // that no longer stands there (the text changed) is returned as it is.
        let uri = hint
            .data
            .as_ref()
            .and_then(|d| d["uri"].as_str())
            .and_then(|u| u.parse::<Uri>().ok());
        let Some(uri) = uri else {
            return Ok(hint);
        };
        let Some((a, unit)) = self.analysis(&uri).await else {
            return Ok(hint);
        };
        let offset = convert::offset(&a, hint.position, unit);
        let line = a.line_at(offset);
        let span = a.parsed.lines.get(line).map(|l| l.span);
        if let Some(h) = hints::inlay_hints(&a, span)
            .into_iter()
            .find(|h| h.offset == offset)
        {
            hint.tooltip = Some(InlayHintTooltip::String(h.tooltip));
        }
        Ok(hint)
    }

    async fn completion(&self, params: CompletionParams) -> Result<Option<CompletionResponse>> {
        let p = params.text_document_position;
        let Some((a, unit)) = self.analysis(&p.text_document.uri).await else {
            return Ok(None);
        };
        let off = convert::offset(&a, p.position, unit);
        let items = complete::complete(&a, off)
            .into_iter()
            .map(|i| {
                let kind = match i.kind {
                    complete::ItemKind::Block => CompletionItemKind::MODULE,
                    complete::ItemKind::Keyword => CompletionItemKind::KEYWORD,
                    complete::ItemKind::Unit => CompletionItemKind::UNIT,
                    complete::ItemKind::Label => CompletionItemKind::VARIABLE,
                    complete::ItemKind::Value => CompletionItemKind::VALUE,
                    complete::ItemKind::Word => CompletionItemKind::ENUM_MEMBER,
                };
                CompletionItem {
                    label: i.label.clone(),
                    kind: Some(kind),
                    detail: Some(i.detail),
                    text_edit: Some(CompletionTextEdit::Edit(TextEdit::new(
                        convert::range(&a, i.replace, unit),
                        i.label,
                    ))),
                    ..Default::default()
                }
            })
            .collect();
        Ok(Some(CompletionResponse::Array(items)))
    }

    async fn formatting(&self, params: DocumentFormattingParams) -> Result<Option<Vec<TextEdit>>> {
        let Some((a, unit)) = self.analysis(&params.text_document.uri).await else {
            return Ok(None);
        };
        Ok(Some(convert::edits(&a, &format::format_document(&a), unit)))
    }

    async fn range_formatting(
        &self,
        params: DocumentRangeFormattingParams,
    ) -> Result<Option<Vec<TextEdit>>> {
        let Some((a, unit)) = self.analysis(&params.text_document.uri).await else {
            return Ok(None);
        };
        let span = convert::span(&a, params.range, unit);
        Ok(Some(convert::edits(
            &a,
            &format::format_range(&a, span),
            unit,
        )))
    }

    async fn code_action(&self, params: CodeActionParams) -> Result<Option<CodeActionResponse>> {
        let uri = params.text_document.uri;
        let Some((a, unit)) = self.analysis(&uri).await else {
            return Ok(None);
        };
        let span = convert::span(&a, params.range, unit);
        let out = actions::code_actions(&a, span)
            .into_iter()
            .map(|x| {
                let kind = match x.kind {
                    actions::ActionKind::QuickFix => CodeActionKind::QUICKFIX,
                    actions::ActionKind::Rewrite => CodeActionKind::REFACTOR_REWRITE,
                    actions::ActionKind::Record => CodeActionKind::REFACTOR,
                };
                let mut changes = HashMap::new();
                changes.insert(uri.clone(), convert::edits(&a, &x.edits, unit));
                CodeActionOrCommand::CodeAction(CodeAction {
                    title: x.title,
                    kind: Some(kind),
                    diagnostics: x
                        .diagnostic
                        .map(|i| vec![convert::diagnostic(&a, &a.evaluation.diagnostics[i], unit)]),
                    edit: Some(WorkspaceEdit {
                        changes: Some(changes),
                        ..Default::default()
                    }),
                    is_preferred: Some(x.diagnostic.is_some()),
                    ..Default::default()
                })
            })
            .collect();
        Ok(Some(out))
    }

    async fn document_symbol(
        &self,
        params: DocumentSymbolParams,
    ) -> Result<Option<DocumentSymbolResponse>> {
        let Some((a, unit)) = self.analysis(&params.text_document.uri).await else {
            return Ok(None);
        };
        Ok(Some(DocumentSymbolResponse::Nested(
            outline::symbols(&a)
                .iter()
                .map(|s| symbol(&a, s, unit))
                .collect(),
        )))
    }

    async fn folding_range(&self, params: FoldingRangeParams) -> Result<Option<Vec<FoldingRange>>> {
        let Some((a, _)) = self.analysis(&params.text_document.uri).await else {
            return Ok(None);
        };
        Ok(Some(
            outline::folds(&a)
                .into_iter()
                .map(|f| FoldingRange {
                    start_line: f.start_line as u32,
                    end_line: f.end_line as u32,
                    kind: Some(if f.comment {
                        FoldingRangeKind::Comment
                    } else {
                        FoldingRangeKind::Region
                    }),
                    ..Default::default()
                })
                .collect(),
        ))
    }

    async fn semantic_tokens_full(
        &self,
        params: SemanticTokensParams,
    ) -> Result<Option<SemanticTokensResult>> {
        let Some((a, unit)) = self.analysis(&params.text_document.uri).await else {
            return Ok(None);
        };
        let mut data = Vec::new();
        let (mut line, mut col) = (0u32, 0u32);
        for t in tokens::tokens(&a) {
            let s = convert::position(&a, t.span.start(), unit);
            let e = convert::position(&a, t.span.end(), unit);
            let delta_line = s.line - line;
            let delta_start = if delta_line == 0 {
                s.character - col
            } else {
                s.character
            };
            data.push(SemanticToken {
                delta_line,
                delta_start,
                length: e.character.saturating_sub(s.character),
                token_type: tokens::TokenClass::ALL
                    .iter()
                    .position(|c| *c == t.class)
                    .unwrap_or(0) as u32,
                token_modifiers_bitset: 0,
            });
            line = s.line;
            col = s.character;
        }
        Ok(Some(SemanticTokensResult::Tokens(SemanticTokens {
            result_id: None,
            data,
        })))
    }

    async fn goto_definition(
        &self,
        params: GotoDefinitionParams,
    ) -> Result<Option<GotoDefinitionResponse>> {
        let p = params.text_document_position_params;
        let Some((a, unit)) = self.analysis(&p.text_document.uri).await else {
            return Ok(None);
        };
        let off = convert::offset(&a, p.position, unit);
        Ok(labels::definition(&a, off).map(|s| {
            GotoDefinitionResponse::Scalar(Location::new(
                p.text_document.uri.clone(),
                convert::range(&a, s, unit),
            ))
        }))
    }

    async fn references(&self, params: ReferenceParams) -> Result<Option<Vec<Location>>> {
        let p = params.text_document_position;
        let Some((a, unit)) = self.analysis(&p.text_document.uri).await else {
            return Ok(None);
        };
        let off = convert::offset(&a, p.position, unit);
        Ok(Some(
            labels::references(&a, off, params.context.include_declaration)
                .into_iter()
                .map(|s| Location::new(p.text_document.uri.clone(), convert::range(&a, s, unit)))
                .collect(),
        ))
    }
}

impl Server {
    /// The encoding columns are counted in (UTF-16 until `initialize` says otherwise).
    pub fn column_unit(&self) -> ColumnUnit {
        self.unit()
    }
}
