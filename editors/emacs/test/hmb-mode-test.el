;;; hmb-mode-test.el --- Tests of hmb-mode  -*- lexical-binding: t; -*-

;; Run: emacs --batch -L editors/emacs -l editors/emacs/test/hmb-mode-test.el -f ert-run-tests-batch-and-exit

;;; Code:

(require 'ert)
(require 'hmb-mode)

(defconst hmb-test--sample
  "# Invented sample for the tests.
title \"Test rig\"
display SI
stream A1, A2 \"feed\" { p 40 bar; T 400 C }
turbine T1 \"expander\" {
in A1
out A2 # exhaust {
efficiency 80 %
}
expect A2 x >= 0.9 within 0.01
")

(defmacro hmb-test--with-sample (&rest body)
  `(with-temp-buffer
     (insert hmb-test--sample)
     (hmb-mode)
     (font-lock-ensure)
     ,@body))

(defun hmb-test--face-at (text &optional nth)
  "The face at the NTH (default first) occurrence of TEXT."
  (save-excursion
    (goto-char (point-min))
    (search-forward text nil nil (or nth 1))
    (get-text-property (match-beginning 0) 'face)))

(ert-deftest hmb-mode-auto-mode ()
  (should (eq (cdr (assoc "\\.hmb\\'" auto-mode-alist)) 'hmb-mode)))

(ert-deftest hmb-mode-font-lock ()
  (hmb-test--with-sample
   (dolist (c '(("Invented" font-lock-comment-face)
                ("\"Test rig\"" font-lock-string-face)
                ("title" font-lock-preprocessor-face)
                ("SI" font-lock-constant-face)
                ("stream" font-lock-keyword-face)
                ("A1," font-lock-variable-name-face)
                ("A2 \"feed" font-lock-variable-name-face)
                ("40" hmb-number-face)
                ("bar" hmb-unit-face)
                ("turbine" font-lock-type-face)
                ("T1" font-lock-function-name-face)
                ("in A1" font-lock-keyword-face)
                ("efficiency" font-lock-builtin-face)
                ("%" hmb-unit-face)
                ("expect" font-lock-keyword-face)
                (">=" font-lock-keyword-face)
                ("within" font-lock-keyword-face)
                ("0.01" hmb-number-face)))
     (should (equal (list (car c) (hmb-test--face-at (car c))) (list (car c) (cadr c)))))
   ;; A brace in a comment opens no block; a number inside a name is not a number.
   (should (eq (hmb-test--face-at "{\nefficiency") 'font-lock-comment-face))
   (should-not (eq (hmb-test--face-at "1," ) 'hmb-number-face))))

(ert-deftest hmb-mode-indent ()
  (hmb-test--with-sample
   (indent-region (point-min) (point-max))
   (should (equal (buffer-substring-no-properties (point-min) (point-max))
                  "# Invented sample for the tests.
title \"Test rig\"
display SI
stream A1, A2 \"feed\" { p 40 bar; T 400 C }
turbine T1 \"expander\" {
  in A1
  out A2 # exhaust {
  efficiency 80 %
}
expect A2 x >= 0.9 within 0.01
"))))

(ert-deftest hmb-mode-comment ()
  (hmb-test--with-sample
   (goto-char (point-min))
   (forward-line 2)
   (comment-line 1)
   (should (equal (buffer-substring-no-properties (line-beginning-position 0) (line-end-position 0))
                  "# display SI"))))

(ert-deftest hmb-mode-eglot ()
  (skip-unless (require 'eglot nil t))
  (let* ((entry (assoc 'hmb-mode eglot-server-programs))
         (hmb-executable "/opt/hmb/bin/hmb"))
    (should entry)
    (should (equal (funcall (cdr entry) nil) '("/opt/hmb/bin/hmb" "lsp")))))

;;; hmb-mode-test.el ends here
