"""The real `parax lsp` under the client capability sets recorded from several
editors (shipped with pytest-lsp, and Helix's in `clients/`): position encoding
negotiation, diagnostics, inlay hints on a non-ASCII line, hover, formatting and
a code action.

Run: PARAX_BIN=/path/to/parax pytest editors/test-clients
"""

import json
import os
import pathlib

import pytest
import pytest_lsp
from lsprotocol import types
from lsprotocol.converters import get_converter
from pytest_lsp import ClientServerConfig, LanguageClient, client_capabilities

PARAX = os.environ.get("PARAX_BIN", "parax")
HERE = pathlib.Path(__file__).parent
ROOT = HERE.parent.parent

# Editors whose recorded capabilities are tested; the UTF-8 column is the
# expected column where the client offers UTF-8.
CLIENTS = [
    "neovim@v0.11.0",
    "neovim@v0.7.0",
    "emacs@v29.1",
    "visual-studio-code@v1.65.2",
    # Not shipped with pytest-lsp: written from the `initialize` request of
    # helix-editor/helix, helix-lsp/src/client.rs (commit 0002bec4aaf2), as JSON.
    # It offers UTF-8 before UTF-32 and UTF-16, and cannot resolve hint tooltips.
    "helix",
]


def capabilities(name: str) -> types.ClientCapabilities:
    """A recorded capability set: pytest-lsp's, or one of `clients/*.json`."""
    ours = HERE / "clients" / f"{name}.json"
    if ours.exists():
        return get_converter().structure(json.loads(ours.read_text()), types.ClientCapabilities)
    return client_capabilities(name)

# Invented demo data: not a real person. `×` is two UTF-8 bytes, one UTF-16 unit.
CASE = """# Invented demo data for tests: Zoë Núñez is not a real person.
case "Zoë Núñez, revisión"
  note "prisma 2Δ BU, ángulo 10°"

eye right
  refraction -1.00 / -0.50 x 90 @ 12 mm
  keratometry 7.80 mm × 180, 7.70 mm × 90
  expect mean-k 43.5 D
"""
URI = (ROOT / "target-test" / "zoe.parax").as_uri()


@pytest_lsp.fixture(
    params=CLIENTS,
    config=ClientServerConfig(server_command=[PARAX, "lsp"]),
)
async def client(request, lsp_client: LanguageClient):
    caps = capabilities(request.param)
    result = await lsp_client.initialize_session(types.InitializeParams(capabilities=caps))
    offered = (caps.general and caps.general.position_encodings) or []
    lsp_client.utf8 = "utf-8" in offered
    hint_caps = caps.text_document and caps.text_document.inlay_hint
    resolve = hint_caps and hint_caps.resolve_support
    lsp_client.lazy_tooltips = bool(resolve and "tooltip" in resolve.properties)
    lsp_client.result = result
    yield
    await lsp_client.shutdown_session()


async def open_case(client: LanguageClient):
    client.text_document_did_open(
        types.DidOpenTextDocumentParams(
            text_document=types.TextDocumentItem(uri=URI, language_id="parax", version=1, text=CASE)
        )
    )
    await client.wait_for_notification(types.TEXT_DOCUMENT_PUBLISH_DIAGNOSTICS)


async def test_negotiates_the_position_encoding(client: LanguageClient):
    want = "utf-8" if client.utf8 else "utf-16"
    assert client.result.capabilities.position_encoding == want


async def test_diagnostics_and_hints_in_the_negotiated_encoding(client: LanguageClient):
    await open_case(client)
    diags = client.diagnostics[URI]
    # The recorded mean K 43.5 D misses the computed 43.55 D [C: (337.5/7.80 + 337.5/7.70)/2].
    assert [d.code for d in diags] == ["P0401"]
    assert diags[0].range.start == types.Position(line=7, character=16)

    hints = await client.text_document_inlay_hint_async(
        types.InlayHintParams(
            text_document=types.TextDocumentIdentifier(uri=URI),
            range=types.Range(start=types.Position(0, 0), end=types.Position(20, 0)),
        )
    )
    k = [h for h in hints if h.position.line == 6][0]
    # End of the keratometry line: 41 characters, two of them `×`.
    assert k.position.character == (43 if client.utf8 else 41)
    assert k.label.startswith("K +43.55 D")
    # A client that resolves tooltips gets them on demand; any other with the hint.
    if client.lazy_tooltips:
        assert k.tooltip is None
        k = await client.inlay_hint_resolve_async(k)
    assert "mean K: +43.55 D" in str(k.tooltip), k.tooltip


async def test_hover_formatting_and_fix(client: LanguageClient):
    await open_case(client)
    hover = await client.text_document_hover_async(
        types.HoverParams(
            text_document=types.TextDocumentIdentifier(uri=URI),
            position=types.Position(line=5, character=16),
        )
    )
    assert "M = S + C/2" in hover.contents.value
    assert "verify clinically" in hover.contents.value

    edits = await client.text_document_formatting_async(
        types.DocumentFormattingParams(
            text_document=types.TextDocumentIdentifier(uri=URI),
            options=types.FormattingOptions(tab_size=2, insert_spaces=True),
        )
    )
    assert list(edits) == []

    actions = await client.text_document_code_action_async(
        types.CodeActionParams(
            text_document=types.TextDocumentIdentifier(uri=URI),
            range=types.Range(start=types.Position(7, 0), end=types.Position(7, 5)),
            context=types.CodeActionContext(diagnostics=[]),
        )
    )
    titles = [a.title for a in actions]
    assert any("+43.55 D" in t for t in titles), titles
