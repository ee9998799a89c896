#!/usr/bin/env bash
# Run the headless Neovim test against a built parax.
# Usage: run.sh [PATH_TO_PARAX]; NVIM=/path/to/nvim picks the Neovim (default: nvim on PATH).
set -euo pipefail
root="$(cd "$(dirname "$0")/../../.." && pwd)"
export PARAX_ROOT="$root"
export PARAX_BIN="${1:-${PARAX_BIN:-parax}}"
# The tree-sitter grammar as a Neovim parser (used by the test on Neovim 0.11+).
if [ -z "${PARAX_TS_PARSER:-}" ] && command -v cc >/dev/null 2>&1; then
  PARAX_TS_PARSER="$(mktemp -d)/parax.so"
  cc -shared -fPIC -O1 -I "$root/editors/tree-sitter-parax/src" \
    "$root/editors/tree-sitter-parax/src/parser.c" -o "$PARAX_TS_PARSER"
  export PARAX_TS_PARSER
fi
timeout 60 "${NVIM:-nvim}" --headless --clean -c "luafile $root/editors/neovim/test/headless.lua"
