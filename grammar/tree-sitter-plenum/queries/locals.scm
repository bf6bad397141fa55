; Names in a design file are global: blocks and `let` values are visible in the
; whole file (and in files that `use` it), so the file is the only scope.
(source_file) @local.scope

(block
  name: (identifier) @local.definition)

(let_declaration
  name: (identifier) @local.definition)

; Names used as values, and the parent of a `like`.
(block
  parent: (identifier) @local.reference)

(value
  (identifier) @local.reference)

(binary_expression
  [
    left: (identifier)
    right: (identifier)
  ] @local.reference)

(unary_expression
  operand: (identifier) @local.reference)

(parenthesized_expression
  (identifier) @local.reference)

(qualified_expression
  expression: (identifier) @local.reference)

(range
  [
    start: (identifier)
    end: (identifier)
  ] @local.reference)
