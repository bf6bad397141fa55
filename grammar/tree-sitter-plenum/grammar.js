/**
 * @file Plenum design files (`*.plenum`): a tree-sitter grammar.
 * @license MIT OR Apache-2.0
 *
 * This is a transcription of the normative grammar, `grammar/plenum.ebnf`, with
 * the Rust lexer (`crates/plenum-syntax/src/lexer.rs`) as the ground truth for the
 * lexical details. It accepts exactly the files that grammar accepts:
 *
 * - Newlines are tokens, not trivia: they end items. A newline does not end an
 *   item right after `,` `+` `-` `*` `/` `·` `=` `{` `(` `;` `to` `with` `like`,
 *   nor anywhere inside parentheses; everywhere else a newline that cannot end
 *   an item is a syntax error, as it is for the Rust parser. The grammar says
 *   so by allowing `_nls` (one or more newlines) at exactly those places, and
 *   by a second copy of the expression rules for the inside of parentheses
 *   (`_p_*`, aliased to the same node names), where every atom may be followed
 *   by newlines.
 * - A unit is a single token scanned by the external scanner (`src/scanner.c`):
 *   it follows a number on the same line, is written without spaces, and is
 *   never started by `db`, `wb`, `dp` or a keyword. Those rules need maximal
 *   munch on each unit word and exact word comparisons, which a regular
 *   expression in this grammar cannot express.
 */

/* eslint-disable no-undef */

// Operators of `expression` and `term`, with their binding power (plenum.ebnf
// section 2: `+ -` bind looser than `* / ·`, both left-associative).
const BINARY_OPERATORS = [
  ['+', 1],
  ['-', 1],
  ['*', 2],
  ['/', 2],
  ['·', 2],
];

/**
 * The binary expressions over operands `operand`.
 * @param {GrammarSymbols<string>} $
 * @param {RuleOrLiteral} operand
 * @returns {ChoiceRule}
 */
function binary($, operand) {
  return choice(
    ...BINARY_OPERATORS.map(([operator, precedence]) =>
      prec.left(
        precedence,
        seq(
          field('left', operand),
          field('operator', operator),
          optional($._nls),
          field('right', operand),
        ),
      ),
    ),
  );
}

/**
 * A list of `item` separated by `separator`, with an optional leading and
 * trailing separator; possibly empty.
 * @param {RuleOrLiteral} item
 * @param {RuleOrLiteral} separator
 * @returns {SeqRule}
 */
function separated(item, separator) {
  return seq(
    optional(separator),
    optional(seq(item, repeat(seq(separator, item)), optional(separator))),
  );
}

module.exports = grammar({
  name: 'plenum',

  externals: $ => [
    $.unit,
    // Never valid in the grammar: when the parser asks for it, it is
    // recovering from an error and the scanner should not produce a unit.
    $._error_sentinel,
  ],

  // Whitespace as the Rust lexer skips it (plenum.ebnf, heading comment).
  // The line feed is not here: it is the `_newline` token.
  extras: $ => [/[ \t\f\r\uFEFF]/, $.comment],

  word: $ => $.identifier,

  // plenum.ebnf: keywords are "reserved: not identifiers". Without this,
  // tree-sitter would take a keyword as an identifier wherever the keyword
  // itself is not expected (`zone to {}`, `1 ft/to`).
  reserved: {
    global: $ => ['use', 'let', 'like', 'to', 'with', $.none],
  },

  // Keys are aliased terminals, inlined so that the parser never has to decide
  // between "key" and "block kind" before it sees a `{` (or its absence).
  inline: $ => [$._key, $._continuing_key, $._element, $._primary, $._p_primary],

  rules: {
    // file = [ separator ] , { top-item , item-end } ;
    source_file: $ => separated($._item, $._separator),

    // separator = ( newline | ";" ) , { newline | ";" } ;
    _separator: $ => repeat1(choice($._newline, ';')),

    _newline: _ => '\n',

    // Newlines that cannot end an item: after `,`, an operator, `=`, `to`,
    // `with`, `like`, and inside parentheses.
    _nls: $ => repeat1($._newline),

    // top-item = use | let | block ;
    _item: $ => choice($.use_declaration, $.let_declaration, $.block),

    // use = "use" , string ;
    use_declaration: $ => seq('use', field('path', $.string)),

    // let = "let" , identifier , "=" , value ;
    let_declaration: $ => seq(
      'let',
      field('name', $.identifier),
      '=',
      optional($._nls),
      field('value', $.value),
    ),

    // block = block-kind , [ identifier ] , [ string ] , [ "like" , identifier ] ,
    //         "{" , [ separator ] , { entry , item-end } , "}" ;
    block: $ => seq(
      field('kind', $.identifier),
      optional(field('name', $.identifier)),
      optional(field('label', $.string)),
      optional(seq('like', optional($._nls), field('parent', $.identifier))),
      '{',
      separated($._entry, $._separator),
      '}',
    ),

    // entry = property | block ;
    _entry: $ => choice($.property, $.block),

    // property = key , value ;   key = identifier | keyword ;
    property: $ => choice(
      seq(field('key', $._key), field('value', $.value)),
      seq(field('key', $._continuing_key), optional($._nls), field('value', $.value)),
    ),

    _key: $ => choice(
      alias($.identifier, $.key),
      alias('use', $.key),
      alias('let', $.key),
      alias($.none, $.key),
    ),

    // The keywords after which a newline does not end the item, even as keys.
    _continuing_key: $ => choice(
      alias('to', $.key),
      alias('with', $.key),
      alias('like', $.key),
    ),

    // value = element , { "," , element } , { with-clause } ;
    value: $ => seq($._elements, repeat($.with_clause)),

    _elements: $ => seq(
      $._element,
      repeat(seq(',', optional($._nls), $._element)),
    ),

    // with-clause = "with" , key , element , { "," , element } ;
    with_clause: $ => seq(
      'with',
      optional($._nls),
      choice(
        field('key', $._key),
        seq(field('key', $._continuing_key), optional($._nls)),
      ),
      field('value', alias($._elements, $.value)),
    ),

    // element = expression , [ qualifier ] , [ "to" , expression , [ qualifier ] ] ;
    _element: $ => choice($._expression, $.qualified_expression, $.range),

    qualified_expression: $ => seq(
      field('expression', $._expression),
      // qualifier = identifier ;   (db wb dp: air-state parts)
      field('qualifier', alias($.identifier, $.qualifier)),
    ),

    range: $ => seq(
      field('start', choice($._expression, $.qualified_expression)),
      'to',
      optional($._nls),
      field('end', choice($._expression, $.qualified_expression)),
    ),

    // expression = term , { ( "+" | "-" ) , term } ;
    // term       = factor , { ( "*" | "/" | "·" ) , factor } ;
    // factor     = { "-" | "+" } , atom ;
    _expression: $ => choice($.binary_expression, $.unary_expression, $._primary),

    binary_expression: $ => binary($, $._expression),

    unary_expression: $ => seq(
      field('operator', choice('-', '+')),
      optional($._nls),
      field('operand', choice($.unary_expression, $._primary)),
    ),

    // atom = quantity | identifier | "none" | "(" , expression , ")" ;
    _primary: $ => choice($.quantity, $.identifier, $.none, $.parenthesized_expression),

    parenthesized_expression: $ => seq(
      '(',
      optional($._nls),
      $._p_expression,
      ')',
    ),

    // Inside parentheses no newline ends anything: the same expressions, with
    // newlines allowed after every atom too.
    _p_expression: $ => choice(
      alias($._p_binary_expression, $.binary_expression),
      alias($._p_unary_expression, $.unary_expression),
      $._p_primary,
    ),

    _p_binary_expression: $ => binary($, $._p_expression),

    _p_unary_expression: $ => seq(
      field('operator', choice('-', '+')),
      optional($._nls),
      field('operand', choice(alias($._p_unary_expression, $.unary_expression), $._p_primary)),
    ),

    _p_primary: $ => seq($._primary, optional($._nls)),

    // quantity = number , [ unit ] ;   (the unit comes from the external scanner)
    quantity: $ => seq($.number, optional($.unit)),

    // number = ( digits , [ "." , digits ] | "." , digits ) ,
    //          [ ( "e" | "E" ) , [ "+" | "-" ] , digits ] ;
    number: _ => /([0-9][0-9_]*(\.[0-9][0-9_]*)?|\.[0-9][0-9_]*)([eE][+-]?[0-9][0-9_]*)?/,

    none: _ => 'none',

    // identifier = ( letter | "_" ) , { letter | digit | "_" | "-" } ;
    identifier: _ => /[A-Za-z_][A-Za-z0-9_-]*/,

    // string = '"' , { ? any character except '"', "\" and line feed ? | "\" , ( '"' | "\" ) } , '"' ;
    string: $ => seq(
      '"',
      repeat(choice($.string_content, $.escape_sequence)),
      token.immediate('"'),
    ),

    // Precedence over `comment`, so that `#` inside a string is text.
    string_content: _ => token.immediate(prec(1, /[^"\\\n]+/)),

    escape_sequence: _ => token.immediate(seq('\\', /["\\]/)),

    // comment = "#" , { ? any character except line feed ? } ;
    comment: _ => token(seq('#', /[^\n]*/)),
  },
});
