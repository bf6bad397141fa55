; Highlighting for Plenum design files.
;
; Every capture below names a node that no other pattern captures, so the
; result does not depend on whether an editor lets the first or the last
; matching pattern win.

(comment) @comment

; Keywords. `use`, `let`, `to`, `with`, `like` and `none` written as keys are
; `key` nodes, captured as properties below, not as keywords.
[
  "use"
  "let"
  "like"
  "to"
  "with"
] @keyword

(none) @constant.builtin

; Blocks: `KIND [NAME] ["Label"] [like PARENT] { ... }`.
(block
  kind: (identifier) @type)

(block
  name: (identifier) @function)

(block
  parent: (identifier) @function)

; Definitions of named values.
(let_declaration
  name: (identifier) @constant)

; Keys of properties and of `with` clauses.
(key) @property

; Names used as values: zones served, categories, other named values.
(value
  (identifier) @variable)

(binary_expression
  left: (identifier) @variable)

(binary_expression
  right: (identifier) @variable)

(unary_expression
  operand: (identifier) @variable)

(parenthesized_expression
  (identifier) @variable)

(qualified_expression
  expression: (identifier) @variable)

(range
  start: (identifier) @variable)

(range
  end: (identifier) @variable)

; Air-state qualifiers (`db`, `wb`, `dp`) after a quantity.
(qualifier) @attribute

(number) @number

(unit) @type.builtin

(string) @string

(escape_sequence) @string.escape

[
  "+"
  "-"
  "*"
  "/"
  "·"
  "="
] @operator

[
  "{"
  "}"
  "("
  ")"
] @punctuation.bracket

[
  ","
  ";"
] @punctuation.delimiter
