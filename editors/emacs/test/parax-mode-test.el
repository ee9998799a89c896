;;; parax-mode-test.el --- Batch tests of parax-mode -*- lexical-binding: t; -*-

;;; Commentary:

;; Run by run.sh (and CI): the major mode alone (file association, highlighting
;; of an example, indentation, comments), the eglot registration when eglot is
;; present, and, when PARAX_BIN names a built parax, a real eglot session
;; against `parax lsp': diagnostics of an example, a hover and formatting.

;;; Code:

(require 'ert)
(require 'cl-lib)

(defconst parax-test-root
  (expand-file-name "../../.." (file-name-directory (or load-file-name buffer-file-name)))
  "The repository root.")

(add-to-list 'load-path (expand-file-name "editors/emacs" parax-test-root))
(require 'parax-mode)

(defun parax-test-example ()
  "Path of the example the tests open."
  (expand-file-name "examples/clinic-review.parax" parax-test-root))

(defmacro parax-test-with-example (&rest body)
  "Run BODY in a buffer visiting a scratch copy of the example."
  (declare (indent 0))
  `(let* ((dir (make-temp-file "parax-emacs-" t))
          (file (expand-file-name "clinic-review.parax" dir)))
     (copy-file (parax-test-example) file)
     (let ((buf (find-file-noselect file)))
       (unwind-protect
           (with-current-buffer buf ,@body)
         (with-current-buffer buf (set-buffer-modified-p nil))
         (kill-buffer buf)
         (delete-directory dir t)))))

(defun parax-test-face-at (line text)
  "The face at the first occurrence of TEXT on LINE (1-based)."
  (save-excursion
    (goto-char (point-min))
    (forward-line (1- line))
    (should (search-forward text (line-end-position) t))
    (let ((face (get-text-property (match-beginning 0) 'face)))
      (if (listp face) (car face) face))))

(ert-deftest parax-mode-opens-parax-files ()
  (parax-test-with-example
    (should (eq major-mode 'parax-mode))
    (should (equal comment-start "# "))
    (should-not indent-tabs-mode)))

(ert-deftest parax-mode-highlights-an-example ()
  (parax-test-with-example
    (font-lock-ensure)
    ;; Line numbers of examples/clinic-review.parax.
    (should (eq (parax-test-face-at 1 "Invented") 'font-lock-comment-face))
    (should (eq (parax-test-face-at 3 "\"Harbourview") 'font-lock-string-face))
    (should (eq (parax-test-face-at 4 "2026-11-18") 'font-lock-constant-face))
    (should (eq (parax-test-face-at 9 "eye") 'font-lock-keyword-face))
    (should (eq (parax-test-face-at 10 "refraction") 'font-lock-builtin-face))
    (should (eq (parax-test-face-at 10 "mm") 'font-lock-type-face))
    (should (eq (parax-test-face-at 10 "-5.75") 'font-lock-constant-face))
    (should (eq (parax-test-face-at 10 "measured") 'font-lock-comment-face))
    ;; `eye' inside a statement's text is not a block keyword.
    (should-not (eq (parax-test-face-at 25 "eye") 'font-lock-keyword-face))))

(ert-deftest parax-mode-highlights-units-only-as-units ()
  (with-temp-buffer
    (parax-mode)
    (insert "eye right\n  vertex 13mm\n  note 12 mmHg\n  prism 2Δ BU\n  refraction −4.75\n")
    (font-lock-ensure)
    (should (eq (parax-test-face-at 2 "mm") 'font-lock-type-face))
    (should (eq (parax-test-face-at 2 "13") 'font-lock-constant-face))
    (should-not (eq (parax-test-face-at 3 "mmHg") 'font-lock-type-face))
    (should (eq (parax-test-face-at 4 "Δ") 'font-lock-type-face))
    (should (eq (parax-test-face-at 5 "−4.75") 'font-lock-constant-face))))

(ert-deftest parax-mode-indents-statements-and-headers ()
  (with-temp-buffer
    (parax-mode)
    (insert "eye right\nrefraction -1.00 @ 12 mm\n      frame \"metal\"\n")
    (goto-char (point-min))
    (forward-line 1)
    (funcall indent-line-function)
    (should (equal (buffer-substring (line-beginning-position) (line-end-position))
                   "  refraction -1.00 @ 12 mm"))
    (forward-line 1)
    (funcall indent-line-function)
    (should (equal (buffer-substring (line-beginning-position) (line-end-position))
                   "frame \"metal\""))))

(ert-deftest parax-mode-comments-lines ()
  (with-temp-buffer
    (parax-mode)
    (insert "  add +1.50\n")
    (comment-region (point-min) (point-max))
    (should (equal (buffer-string) "  # add +1.50\n"))
    (uncomment-region (point-min) (point-max))
    (should (equal (buffer-string) "  add +1.50\n"))))

(ert-deftest parax-mode-eglot-is-there-when-required ()
  "CI sets PARAX_REQUIRE_EGLOT so that the eglot tests cannot be skipped there."
  (skip-unless (getenv "PARAX_REQUIRE_EGLOT"))
  (should (require 'eglot nil t))
  (should (getenv "PARAX_BIN")))

(ert-deftest parax-mode-registers-with-eglot ()
  (skip-unless (require 'eglot nil t))
  (let ((entry (assq 'parax-mode eglot-server-programs)))
    (should entry)
    (should (equal (funcall (cdr entry)) '("parax" "lsp")))
    (let ((parax-program "/opt/parax/bin/parax"))
      (should (equal (funcall (cdr entry)) '("/opt/parax/bin/parax" "lsp"))))))

(defun parax-test-wait (pred seconds)
  "Wait up to SECONDS for PRED to return non-nil; return its value."
  (let ((deadline (+ (float-time) seconds)) value)
    (while (and (not (setq value (funcall pred))) (< (float-time) deadline))
      (accept-process-output nil 0.05))
    value))

(ert-deftest parax-mode-eglot-session ()
  "A real eglot session against `parax lsp' (needs eglot and PARAX_BIN)."
  (skip-unless (and (require 'eglot nil t) (getenv "PARAX_BIN")))
  (let ((parax-program (getenv "PARAX_BIN"))
        (eglot-sync-connect t)
        (eglot-autoreconnect nil))
    (parax-test-with-example
      (let* ((project (cons 'transient default-directory))
             (server (eglot '(parax-mode) project 'eglot-lsp-server
                            (parax-eglot-contact) "parax")))
        (unwind-protect
            (progn
              (should (eglot-current-server))
              ;; Diagnostics: the example has two vertex notes (P0303) and no error.
              (let ((diags (parax-test-wait
                            (lambda ()
                                  ;; Flymake runs its backends on idle timers, which
                                  ;; batch mode never reaches: start it by hand.
                                  (flymake-start)
                                  (let ((d (flymake-diagnostics)))
                                    (and (>= (length d) 2) d)))
                            15)))
                (should (= (length diags) 2))
                (dolist (d diags)
                  (should (string-match-p "P0303" (format "%s" (flymake-diagnostic-text d))))))
              ;; Hover on the keratometry line: the mean K derivation and its source.
              (let* ((hover (jsonrpc-request
                             server :textDocument/hover
                             (list :textDocument
                                   (list :uri (concat "file://" (expand-file-name buffer-file-name)))
                                   :position (list :line 11 :character 20))))
                     (value (plist-get (plist-get hover :contents) :value)))
                (should (string-match-p "mean K" value))
                (should (string-match-p "Shammas" value)))
              ;; Formatting: spoil line 11, format the buffer, get the canonical line back.
              (goto-char (point-min))
              (forward-line 10)
              (delete-region (line-beginning-position) (line-end-position))
              (insert "    add    +1.50")
              (eglot-format-buffer)
              (goto-char (point-min))
              (forward-line 10)
              (should (equal (buffer-substring (line-beginning-position) (line-end-position))
                             "  add +1.50")))
          (eglot-shutdown server))))))

;;; parax-mode-test.el ends here
