#!/usr/bin/env bash
# Run the headless Neovim test against a built parax.
# Usage: run.sh [PATH_TO_PARAX]; NVIM=/path/to/nvim picks the Neovim (default: nvim on PATH).
set -euo pipefail
root="$(cd "$(dirname "$0")/../../.." && pwd)"
export PARAX_ROOT="$root"
export PARAX_BIN="${1:-${PARAX_BIN:-parax}}"
timeout 60 "${NVIM:-nvim}" --headless --clean -c "luafile $root/editors/neovim/test/headless.lua"
