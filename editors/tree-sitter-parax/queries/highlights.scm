; Highlighting for parax case files, with the capture names of the tree-sitter
; CLI and Neovim. Helix uses its own names: ../helix/queries/parax/highlights.scm.

(comment) @comment
(block_kind) @keyword
(keyword) @property
(string) @string
(date) @string.special
(number) @number
(unit) @type.builtin
(axis_sign) @operator
(symbol) @punctuation.delimiter
(word) @constant
