;;; parax-mode.el --- Major mode for parax optical case files -*- lexical-binding: t; -*-

;; Version: 0.1.0
;; Package-Requires: ((emacs "28.1"))
;; Keywords: languages
;; SPDX-License-Identifier: MIT OR Apache-2.0

;;; Commentary:

;; A major mode for `.parax' case files: highlighting of block keywords,
;; statement keywords, numbers with units, strings, dates and comments;
;; two-space indentation; and registration of `parax lsp' with eglot, which
;; brings diagnostics, inlay hints with computed values, hovers with
;; derivations, completion, code actions and formatting.

;;; Code:

(defgroup parax nil
  "Editing parax optical case files."
  :group 'languages)

(defcustom parax-program "parax"
  "The parax executable (a name on `exec-path' or a full path)."
  :type 'string)

(defconst parax-block-keywords
  '("case" "eye" "frame" "spectacle-lens" "contact-lens" "system" "model-eye")
  "Keywords that open a block at column 0.")

(defconst parax-font-lock-keywords
  `((,(concat "^" (regexp-opt parax-block-keywords 'symbols)) . font-lock-keyword-face)
    ("^[ \t]+\\([a-z][a-z0-9_-]*\\)" 1 font-lock-builtin-face)
    ("\\_<[0-9]\\{4\\}-[0-9]\\{2\\}-[0-9]\\{2\\}\\_>" . font-lock-constant-face)
    ;; A unit right after a number: `13 mm', `13mm', `2Δ'. Letters-only units
    ;; end where the symbol ends, so `12 mmHg' is a number and a word.
    ("[0-9.][ \t]*\\(\\(?:mm\\|cm\\|m\\|DS\\|DC\\|D\\|deg\\|prism\\|y\\)\\_>\\|[°Δ%]\\)"
     1 font-lock-type-face)
    ;; Numbers, signed with +, - or the minus sign U+2212.
    ("\\_<[-+\u2212]?\\(?:[0-9]+\\(?:\\.[0-9]*\\)?\\|\\.[0-9]+\\)" . font-lock-constant-face))
  "Highlighting for `parax-mode'.")

(defvar parax-mode-syntax-table
  (let ((st (make-syntax-table)))
    (modify-syntax-entry ?# "<" st)
    (modify-syntax-entry ?\n ">" st)
    (modify-syntax-entry ?\" "\"" st)
    (modify-syntax-entry ?- "_" st)
    (modify-syntax-entry ?+ "_" st)
    (modify-syntax-entry ?\u2212 "_" st)
    (modify-syntax-entry ?. "_" st)
    st)
  "Syntax table for `parax-mode'.")

(defun parax-indent-line ()
  "Indent a statement by two spaces; block headers stay at column 0."
  (interactive)
  (let ((header (save-excursion
                  (back-to-indentation)
                  (looking-at (regexp-opt parax-block-keywords 'symbols)))))
    (indent-line-to (if header 0 2))))

;;;###autoload
(define-derived-mode parax-mode prog-mode "parax"
  "Major mode for parax optical case files."
  (setq-local comment-start "# ")
  (setq-local comment-start-skip "#+[ \t]*")
  (setq-local font-lock-defaults '(parax-font-lock-keywords))
  (setq-local indent-line-function #'parax-indent-line)
  (setq-local indent-tabs-mode nil))

;;;###autoload
(add-to-list 'auto-mode-alist '("\\.parax\\'" . parax-mode))

;; A function rather than a fixed list, so that setting `parax-program' after
;; this file is loaded still takes effect.
(defun parax-eglot-contact (&optional _interactive)
  "The command that starts the parax language server, for eglot."
  (list parax-program "lsp"))

(with-eval-after-load 'eglot
  (add-to-list 'eglot-server-programs '(parax-mode . parax-eglot-contact)))

(provide 'parax-mode)
;;; parax-mode.el ends here
