;;; hmb-mode.el --- Major mode for hmb calc files  -*- lexical-binding: t; -*-

;; Version: 0.1.0
;; Package-Requires: ((emacs "27.1"))
;; Keywords: languages

;;; Commentary:

;; Editing support for hmb calc files (*.hmb): heat and material balances of steam and water
;; systems.  Highlighting, comments and indentation come from this file; diagnostics, hover,
;; completion and formatting come from the hmb language server (`hmb lsp') through eglot:
;;
;;   (add-to-list 'load-path "/path/to/hmb/editors/emacs")
;;   (require 'hmb-mode)
;;   (add-hook 'hmb-mode-hook #'eglot-ensure)   ; optional: start the server on opening a file
;;
;; M-x hmb-check runs `hmb check' on the file in a compilation buffer, whose errors link back to
;; the source; M-x hmb-stream-table shows the solved stream table.

;;; Code:

(require 'seq)

(defgroup hmb nil
  "Editing hmb calc files."
  :group 'languages
  :prefix "hmb-")

(defcustom hmb-executable "hmb"
  "The hmb program: a name looked up on `exec-path', or an absolute file name."
  :type 'string)

(defcustom hmb-indent-offset 2
  "Indentation of the entries of a { } block."
  :type 'integer
  :safe #'integerp)

(defface hmb-number-face '((t :inherit font-lock-constant-face))
  "Face for numbers.")

(defface hmb-unit-face '((t :inherit font-lock-type-face :slant italic))
  "Face for unit spellings after a number (psig, kJ/kg, °F).")

(defconst hmb--kinds
  '("boiler" "cooler" "deaerator" "desuperheater" "exchanger" "flash" "heater" "mixer" "pump"
    "splitter" "turbine" "valve")
  "Unit kinds: the equipment a block can declare.")

(defconst hmb--settings
  '("title" "display" "atmosphere" "elevation" "tolerance" "ambient" "project" "document"
    "revision" "prepared_by" "checked_by" "date" "display_flow" "display_vol_flow"
    "display_pressure" "display_temperature" "display_enthalpy" "display_entropy"
    "display_volume" "display_density" "display_power" "display_duty" "display_heat_rate")
  "Top-level settings.")

(defconst hmb--roles
  '("in" "out" "blowdown" "vent" "steam" "water" "hot_in" "hot_out" "cold_in" "cold_out" "vapor"
    "liquid" "vapour")
  "Port roles: the entries of a unit block that name streams.")

(defconst hmb--properties
  '("flow" "p" "T" "h" "s" "x" "v" "rho" "vol_flow" "Tsat" "superheat" "subcooling" "power_out"
    "power_in" "net_power" "heat_in" "heat_out" "efficiency" "heat_rate" "duty" "dp" "fuel"
    "T_boundary" "blowdown_rate" "sgen" "heat_loss" "vent_rate" "dp_hot" "dp_cold" "arrangement"
    "min_approach" "dT_min" "lmtd" "UA" "power" "fluid")
  "Stream properties, unit parameters and results.")

(defconst hmb--name "\\(?:\\sw\\|\\s_\\)+")

(defconst hmb--entry-start "\\(?:^\\|[{;]\\)[ \t]*"
  "Where a statement or a block entry begins.")

(defconst hmb--number
  "\\_<[-+]?\\(?:[0-9]+\\(?:\\.[0-9]*\\)?\\|\\.[0-9]+\\)\\(?:[eE][-+]?[0-9]+\\)?"
  "A number, as the scanner reads one.")

(defconst hmb--unit
  "\\(?:[^][ \t\n{},;#\"=<>±()0-9.+-]\\|([^)\n]*)\\)\\(?:[^ \t\n{},;#\"=<>±(]\\|([^)\n]*)\\)*"
  "A unit spelling: a run without spaces or punctuation.
Inside parentheses spaces belong to the spelling: kJ/(kg K).")

(defconst hmb-font-lock-keywords
  `((,(concat "\\_<\\(stream\\)\\_>")
     (1 font-lock-keyword-face)
     (,(concat "\\=[ \t]*,?[ \t]*\\(" hmb--name "\\)") nil nil
      (1 font-lock-variable-name-face)))
    (,(concat "\\_<\\(expect\\)\\_>[ \t]*\\(" hmb--name "\\)?[ \t]*\\(" hmb--name "\\)?")
     (1 font-lock-keyword-face)
     (2 font-lock-variable-name-face nil t)
     (3 font-lock-builtin-face nil t))
    (,(concat hmb--entry-start (regexp-opt hmb--kinds 'symbols) "[ \t]+\\(" hmb--name "\\)")
     (1 font-lock-type-face)
     (2 font-lock-function-name-face))
    (,(concat hmb--entry-start "\\(display\\)\\_>[ \t]+\\_<\\(SI\\|US\\)\\_>")
     (1 font-lock-preprocessor-face)
     (2 font-lock-constant-face))
    (,(concat hmb--entry-start (regexp-opt hmb--settings 'symbols)) 1 font-lock-preprocessor-face)
    (,(concat hmb--entry-start "\\_<\\(fluid\\)\\_>[ \t]*\\(" hmb--name "\\)?")
     (1 font-lock-builtin-face)
     (2 font-lock-constant-face nil t))
    (,(concat hmb--entry-start (regexp-opt hmb--roles 'symbols))
     (1 font-lock-keyword-face)
     (,(concat "\\=[ \t]*,?[ \t]*\\(" hmb--name "\\)") nil nil
      (1 font-lock-variable-name-face)))
    (,(concat hmb--entry-start (regexp-opt hmb--properties 'symbols)) 1 font-lock-builtin-face)
    (,(concat hmb--entry-start "\\_<\\(case\\|sweep\\)\\_>[ \t]*\\(" hmb--name "\\)?")
     (1 font-lock-keyword-face)
     (2 font-lock-function-name-face nil t))
    ("\\_<\\(?:free\\|from\\|to\\|step\\|count\\|show\\)\\_>" . font-lock-keyword-face)
    ("\\_<within\\_>\\|±\\|\\+/-\\|\\+-\\|[<>]=?\\|=" . font-lock-keyword-face)
    (,(concat "\\(" hmb--number "\\)\\(?:[ \t]*\\(\\_<\\(?:within\\|to\\|step\\|count\\)\\_>\\|" hmb--unit "\\)\\)?")
     (1 'hmb-number-face)
     (2 (unless (member (match-string 2) '("within" "to" "step" "count")) 'hmb-unit-face) nil t)))
  "Highlighting for `hmb-mode'.")

(defvar hmb-mode-syntax-table
  (let ((st (make-syntax-table)))
    (modify-syntax-entry ?# "<" st)
    (modify-syntax-entry ?\n ">" st)
    (modify-syntax-entry ?\" "\"" st)
    (modify-syntax-entry ?\\ "\\" st)
    (modify-syntax-entry ?_ "_" st)
    (modify-syntax-entry ?- "_" st)
    (modify-syntax-entry ?{ "(}" st)
    (modify-syntax-entry ?} "){" st)
    (modify-syntax-entry ?\( "()" st)
    (modify-syntax-entry ?\) ")(" st)
    (dolist (c '(?/ ?% ?° ?± ?= ?< ?> ?, ?\; ?+ ?*))
      (modify-syntax-entry c "." st))
    st)
  "Syntax table for `hmb-mode'.")

(defun hmb-indent-line ()
  "Indent the current line: one `hmb-indent-offset' per enclosing { } block."
  (interactive)
  (let* ((depth (save-excursion
                  (let ((ppss (syntax-ppss (line-beginning-position))))
                    ;; Only braces count; a parenthesis belongs to a unit spelling.
                    (seq-count (lambda (pos) (eq (char-after pos) ?{)) (nth 9 ppss)))))
         (closing (save-excursion
                    (back-to-indentation)
                    (eq (char-after) ?})))
         (target (* hmb-indent-offset (max 0 (- depth (if closing 1 0)))))
         (offset (- (current-column) (current-indentation))))
    (indent-line-to target)
    (when (> offset 0)
      (move-to-column (+ target offset)))))

(defun hmb--file ()
  (or buffer-file-name (user-error "This buffer is not visiting a file")))

(defun hmb-check ()
  "Run `hmb check' on the current file in a compilation buffer."
  (interactive)
  (let ((file (hmb--file)))
    (save-buffer)
    (compile (mapconcat #'shell-quote-argument (list hmb-executable "check" file) " "))))

(defun hmb-stream-table ()
  "Show the solved stream table of the current file.
Runs `hmb table --format md'; an hmb without that command gets
`hmb check' instead, whose report ends with the same table."
  (interactive)
  (let ((file (hmb--file))
        (buf (get-buffer-create "*hmb stream table*")))
    (save-buffer)
    (with-current-buffer buf
      (let ((inhibit-read-only t))
        (erase-buffer)
        (let ((status (call-process hmb-executable nil (list t nil) nil
                                    "table" "--format" "md" file)))
          (when (eq status 2)
            (erase-buffer)
            (call-process hmb-executable nil t nil "check" file))))
      (goto-char (point-min))
      (special-mode))
    (display-buffer buf)))

(defvar hmb-mode-map
  (let ((map (make-sparse-keymap)))
    (define-key map (kbd "C-c C-c") #'hmb-check)
    (define-key map (kbd "C-c C-t") #'hmb-stream-table)
    map)
  "Keymap for `hmb-mode'.")

;;;###autoload
(define-derived-mode hmb-mode prog-mode "hmb"
  "Major mode for hmb calc files.

\\{hmb-mode-map}"
  :syntax-table hmb-mode-syntax-table
  (setq-local comment-start "# ")
  (setq-local comment-start-skip "#+[ \t]*")
  (setq-local comment-end "")
  (setq-local indent-line-function #'hmb-indent-line)
  (setq-local indent-tabs-mode nil)
  (setq-local electric-indent-chars (cons ?} electric-indent-chars))
  (setq-local font-lock-defaults '(hmb-font-lock-keywords nil nil)))

;;;###autoload
(add-to-list 'auto-mode-alist '("\\.hmb\\'" . hmb-mode))

(with-eval-after-load 'eglot
  (defvar eglot-server-programs)
  (add-to-list 'eglot-server-programs
               `(hmb-mode . ,(lambda (&rest _) (list hmb-executable "lsp")))))

(provide 'hmb-mode)
;;; hmb-mode.el ends here
