; Highlighting for parax case files in Helix (Helix's capture names). The same
; patterns as editors/tree-sitter-parax/queries/highlights.scm.

(comment) @comment
(block_kind) @keyword
(keyword) @variable.other.member
(string) @string
(date) @string.special
(number) @constant.numeric
(unit) @type.builtin
(axis_sign) @operator
(symbol) @punctuation.delimiter
(word) @constant
