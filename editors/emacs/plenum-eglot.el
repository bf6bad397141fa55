;;; plenum-eglot.el --- Plenum design files with eglot  -*- lexical-binding: t; -*-

;; Put this file on your `load-path' and `(require 'plenum-eglot)', or copy
;; the forms into your init file. Needs Emacs 29 (eglot built in) or eglot
;; from ELPA.

;;; Code:

(require 'eglot)

(define-derived-mode plenum-mode prog-mode "Plenum"
  "Major mode for Plenum HVAC design files (`*.plenum')."
  (setq-local comment-start "# ")
  (setq-local comment-start-skip "#+[ \t]*")
  (modify-syntax-entry ?# "<" plenum-mode-syntax-table)
  (modify-syntax-entry ?\n ">" plenum-mode-syntax-table)
  (modify-syntax-entry ?_ "_" plenum-mode-syntax-table)
  (modify-syntax-entry ?- "_" plenum-mode-syntax-table)
  (setq-local indent-tabs-mode nil)
  (setq-local tab-width 2))

(add-to-list 'auto-mode-alist '("\\.plenum\\'" . plenum-mode))
(add-to-list 'eglot-server-programs '(plenum-mode . ("plenum" "lsp")))
(add-hook 'plenum-mode-hook #'eglot-ensure)

(provide 'plenum-eglot)
;;; plenum-eglot.el ends here
