#!/usr/bin/env bash
# Batch tests of parax-mode. Usage: run.sh [PATH_TO_PARAX]
# With a parax binary (argument or PARAX_BIN) and eglot available (built in from
# Emacs 29; Debian's elpa-eglot or GNU ELPA on Emacs 28), the tests also drive a
# real eglot session against `parax lsp`.
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
if [ -n "${1:-}" ]; then export PARAX_BIN="$1"; fi
# package-initialize activates packages installed in ~/.emacs.d/elpa and, with
# Debian's directory added (-Q skips Debian's start-up files that add it), the
# system-wide elpa-* packages; -Q keeps the user's init file out.
timeout 120 emacs -Q --batch \
  --eval '(progn (require (quote package))
                 (add-to-list (quote package-directory-list) "/usr/share/emacs/site-lisp/elpa")
                 (package-initialize))' \
  -l "$here/parax-mode-test.el" \
  -f ert-run-tests-batch-and-exit
