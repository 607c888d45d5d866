;;; hmb-eglot-test.el --- hmb-mode with eglot and a real hmb lsp  -*- lexical-binding: t; -*-

;; Run: HMB=/path/to/hmb emacs --batch -L editors/emacs -l editors/emacs/test/hmb-eglot-test.el \
;;        -f ert-run-tests-batch-and-exit
;; Opens the Neovim test's fixture (two mistakes on purpose), lets eglot start `hmb lsp' through
;; the registration in hmb-mode.el, and checks the diagnostics flymake shows and a hover.

;;; Code:

(require 'ert)
(require 'hmb-mode)
(require 'eglot)
(require 'flymake)

(defconst hmb-eglot-test--fixture
  (expand-file-name "../../nvim/test/fixture.hmb"
                    (file-name-directory (or load-file-name buffer-file-name))))

(defun hmb-eglot-test--wait (pred seconds)
  "Process events until PRED is non-nil or SECONDS pass; return PRED's value."
  (let ((end (+ (float-time) seconds)) val)
    (while (and (not (setq val (funcall pred))) (< (float-time) end))
      (accept-process-output nil 0.05))
    val))

(defun hmb-eglot-test--where (d)
  "Line and 0-based column where diagnostic D starts."
  (save-excursion
    (goto-char (flymake-diagnostic-beg d))
    (list (line-number-at-pos) (current-column))))

(ert-deftest hmb-eglot-end-to-end ()
  (skip-unless (getenv "HMB"))
  (let* ((hmb-executable (getenv "HMB"))
         ;; The fixture's directory is the whole project: no version control needed.
         (project-find-functions (list (lambda (dir) (cons 'transient dir))))
         (eglot-sync-connect 10)
         (buf (find-file-noselect hmb-eglot-test--fixture)))
    (unwind-protect
        (with-current-buffer buf
          (should (eq major-mode 'hmb-mode))
          (apply #'eglot (eglot--guess-contact))
          (should (eglot-current-server))
          (should (equal (process-command (jsonrpc--process (eglot-current-server)))
                         (list hmb-executable "lsp")))
          ;; Flymake waits for the buffer to be shown in a window, which batch mode never does.
          (let ((diags (hmb-eglot-test--wait
                        (lambda ()
                          (flymake-start)
                          (let ((ds (flymake-diagnostics)))
                            (and (>= (length ds) 2) ds)))
                        15)))
            (should diags)
            (let ((by-text (lambda (s)
                             (seq-find (lambda (d) (string-match-p s (flymake-diagnostic-text d)))
                                       diags))))
              ;; Line 6 "p 10 bra": unknown unit; line 10 "out LQ": undeclared stream.
              (let ((d (funcall by-text "unknown unit bra")))
                (should d)
                (should (eq (flymake-diagnostic-type d) 'eglot-error))
                (should (equal (hmb-eglot-test--where d) '(6 34))))
              (let ((d (funcall by-text "stream LQ is not declared")))
                (should d)
                (should (equal (hmb-eglot-test--where d) '(10 6))))))
          ;; Hover on HP where the valve takes it in (line 9, column 5).
          (goto-char (point-min))
          (forward-line 8)
          (move-to-column 5)
          (let* ((hover (jsonrpc-request (eglot-current-server) :textDocument/hover
                                         (eglot--TextDocumentPositionParams)))
                 (contents (plist-get hover :contents))
                 (text (if (stringp contents) contents (plist-get contents :value))))
            (should (stringp text))
            (should (string-match-p "`HP`" text))
            (should (string-match-p "high-pressure steam" text))))
      (with-current-buffer buf
        (when (eglot-current-server)
          (eglot-shutdown (eglot-current-server))))
      (kill-buffer buf))))

;;; hmb-eglot-test.el ends here
