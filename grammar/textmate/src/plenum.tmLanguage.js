// The source of plenum.tmLanguage.json: the TextMate grammar of Plenum design
// files, with its regular expressions built from named parts. Edit this file,
// then run `node build.js` (in grammar/textmate) to rewrite the JSON; the test
// fails when the committed JSON is not what this file builds.
//
// It follows grammar/plenum.ebnf and the Rust lexer (crates/plenum-syntax/src/
// lexer.rs). A TextMate grammar sees one line at a time, so the rules that span
// lines are approximations, described where they are made:
// - An item ends at the end of its line unless the line ends (before an optional
//   comment) with `,`, an operator, `=`, `to`, `with` or `like`, or a parenthesis
//   is open: `continuation` and `parens` carry the item over, so the first word of
//   the next line is not taken for a key.
// - A block header must be on one line with its `{` to be scoped as one; a header
//   broken after `like` is handled by `loose-block-parts`.
// - Units: the Rust lexer's unit merging, with unit groups nested at most two deep
//   (`W/(m^2·(K/s))`); deeper groups end the unit scope early.

'use strict';

const raw = String.raw;

// Characters of an identifier after its first.
const IDENT_CHAR = raw`A-Za-z0-9_\-`;
// Not preceded by a character that could begin or continue the same word. A
// digit does not count: a digit before a letter can only end a number, and the
// Rust lexer starts a new token after a number (`2to` is a number and `to`).
const NB = raw`(?<![A-Za-z_\-])`;
// Not followed by an identifier character: the word is whole (maximal munch).
const NA = raw`(?![${IDENT_CHAR}])`;
const IDENT = raw`[A-Za-z_][A-Za-z0-9_\-]*`;
const KEYWORD = raw`(?:use|let|like|to|with|none)`;
// Whitespace as the Rust lexer skips it; a line feed is never inside a line.
const WS = raw`[ \t\f\r\x{FEFF}]`;
const NUMBER = raw`(?:[0-9][0-9_]*(?:\.[0-9][0-9_]*)?|\.[0-9][0-9_]*)(?:[eE][+\-]?[0-9][0-9_]*)?`;

// Unit words, each the longest of the Rust lexer's tokens that could start here:
// a dotted word (`in.wg`), a super-word (`ft²`), then an identifier.
const DOTTED = raw`[A-Za-z]+(?:\.[A-Za-z]+)+`;
const SUPER = raw`[A-Za-z_][A-Za-z0-9_]*[²³]`;
const DEGREE = raw`°[A-Za-z]*`;
const PERCENT = raw`%[A-Za-z]*`;
/** A unit word; a keyword never is one, and db/wb/dp never start a unit. */
function unitAtom(first) {
  const reserved = first ? raw`(?:use|let|like|to|with|none|db|wb|dp)` : KEYWORD;
  return raw`(?:${DEGREE}|${PERCENT}|${DOTTED}|${SUPER}|(?!${reserved}${NA})${IDENT}${NA})`;
}
const ATOM = unitAtom(false);
const POWER = raw`\^-?${NUMBER}`;
const GROUP1 = raw`\(${ATOM}(?:[/*·]${ATOM}|${POWER})*\)`;
const GROUP2 = raw`\(${ATOM}(?:[/*·](?:${ATOM}|${GROUP1})|${POWER})*\)`;
const UNIT = raw`${unitAtom(true)}(?:[/*·](?:${ATOM}|${GROUP2})|${POWER})*`;

// Nothing but an optional comment up to the end of the line.
const EOL = raw`(?=${WS}*(?:#.*)?$)`;

/** `token` at the end of a line: the item goes on on the next line. */
function continuation(what, token, scope) {
  return {
    comment: `${what} at the end of a line: the item goes on, so the next line holds no key`,
    begin: token + EOL,
    beginCaptures: { 1: { name: scope } },
    end: raw`(?=[^\s#])`,
    patterns: [{ include: '#comment' }],
  };
}

module.exports = {
  $schema: 'https://raw.githubusercontent.com/martinring/tmlanguage/master/tmlanguage.json',
  name: 'Plenum',
  scopeName: 'source.plenum',
  fileTypes: ['plenum'],
  comment:
    'Plenum HVAC air-side design files. Generated from src/plenum.tmLanguage.js by build.js: edit that file. ' +
    'Follows grammar/plenum.ebnf; README.md beside this file lists the scopes.',
  patterns: [
    { include: '#comment' },
    { include: '#use' },
    { include: '#let' },
    { include: '#block' },
    { include: '#separator' },
    { include: '#loose-block-parts' },
    { include: '#invalid' },
  ],
  repository: {
    comment: {
      name: 'comment.line.number-sign.plenum',
      match: raw`(#).*$`,
      captures: { 1: { name: 'punctuation.definition.comment.plenum' } },
    },
    string: {
      name: 'string.quoted.double.plenum',
      begin: raw`"`,
      beginCaptures: { 0: { name: 'punctuation.definition.string.begin.plenum' } },
      // A string ends at its line's end in any case (an unterminated string).
      end: raw`(")|(?=$)`,
      endCaptures: { 1: { name: 'punctuation.definition.string.end.plenum' } },
      patterns: [
        { name: 'constant.character.escape.plenum', match: raw`\\["\\]` },
        { name: 'invalid.illegal.escape.plenum', match: raw`\\.?` },
      ],
    },
    separator: { name: 'punctuation.terminator.statement.plenum', match: ';' },
    use: {
      comment: 'use "path": include another file',
      match: raw`${NB}(use)${NA}`,
      captures: { 1: { name: 'keyword.control.plenum' } },
    },
    let: {
      comment: 'let NAME = VALUE, to the end of the item',
      begin: raw`${NB}(let)${NA}(?:${WS}+(?!${KEYWORD}${NA})(${IDENT})${NA})?`,
      beginCaptures: {
        1: { name: 'keyword.control.plenum' },
        2: { name: 'variable.other.constant.plenum' },
      },
      end: raw`(?=[;}])|$`,
      patterns: [{ include: '#value' }],
    },
    block: {
      comment: 'KIND [NAME] ["Label"] [like PARENT] { ENTRIES }, with the header on one line',
      begin:
        raw`(?:^|(?<=[{;]))(?:${WS}*)(${IDENT})${NA}` +
        raw`(?:${WS}+(?!${KEYWORD}${NA})(${IDENT})${NA})?` +
        raw`(?:${WS}*("(?:[^"\\]|\\.)*"))?` +
        raw`(?:${WS}*(?<![A-Za-z0-9_\-])(like)${NA}${WS}*(${IDENT})${NA})?` +
        raw`${WS}*(\{)`,
      beginCaptures: {
        1: { name: 'entity.name.type.block.plenum' },
        2: { name: 'entity.name.function.plenum' },
        3: { patterns: [{ include: '#string' }] },
        4: { name: 'keyword.control.plenum' },
        5: { name: 'entity.other.inherited-class.plenum' },
        6: { name: 'punctuation.section.block.begin.plenum' },
      },
      end: raw`\}`,
      endCaptures: { 0: { name: 'punctuation.section.block.end.plenum' } },
      patterns: [{ include: '#body' }],
    },
    body: {
      patterns: [
        { include: '#comment' },
        { include: '#block' },
        { include: '#property' },
        { include: '#separator' },
        { include: '#braces' },
        { include: '#invalid' },
      ],
    },
    braces: {
      comment: 'A block body whose header is not on one line with its brace',
      begin: raw`\{`,
      beginCaptures: { 0: { name: 'punctuation.section.block.begin.plenum' } },
      end: raw`\}`,
      endCaptures: { 0: { name: 'punctuation.section.block.end.plenum' } },
      patterns: [{ include: '#body' }],
    },
    'loose-block-parts': {
      comment: 'The parts of a block header that is split over lines (a line may end after like)',
      patterns: [
        { include: '#braces' },
        { include: '#string' },
        {
          comment: 'like at the end of a line: the parent is the first word of the next line',
          begin: NB + '(like)' + NA + EOL,
          beginCaptures: { 1: { name: 'keyword.control.plenum' } },
          end: raw`(${IDENT})${NA}|(?=[^\s#])`,
          endCaptures: { 1: { name: 'entity.other.inherited-class.plenum' } },
          patterns: [{ include: '#comment' }],
        },
        {
          match: raw`${NB}(like)${NA}(?:${WS}+(${IDENT})${NA})?`,
          captures: {
            1: { name: 'keyword.control.plenum' },
            2: { name: 'entity.other.inherited-class.plenum' },
          },
        },
        {
          match: raw`^${WS}*(?!${KEYWORD}${NA})(${IDENT})${NA}(?:${WS}+(?!${KEYWORD}${NA})(${IDENT})${NA})?`,
          captures: {
            1: { name: 'entity.name.type.block.plenum' },
            2: { name: 'entity.name.function.plenum' },
          },
        },
      ],
    },
    property: {
      comment:
        'KEY VALUE, from the start of an item to its end: a line end that no comma, ' +
        'operator or to/with/like carries over, a ; or a }',
      begin: raw`(?:^|(?<=[{;]))(?=${WS}*[A-Za-z_])`,
      end: raw`(?=[;}])|$`,
      patterns: [
        continuation('A key to, with or like', raw`\G${WS}*((?:like|to|with))${NA}`, 'variable.other.property.plenum'),
        {
          match: raw`\G${WS}*(${IDENT})${NA}`,
          captures: { 1: { name: 'variable.other.property.plenum' } },
        },
        { include: '#value' },
      ],
    },
    value: {
      patterns: [
        { include: '#comment' },
        { include: '#continuation' },
        { include: '#with-clause' },
        { include: '#quantity' },
        { include: '#parens' },
        { name: 'keyword.control.plenum', match: raw`${NB}(?:use|let|like|to|with)${NA}` },
        { name: 'constant.language.plenum', match: raw`${NB}none${NA}` },
        { name: 'storage.modifier.qualifier.plenum', match: raw`${NB}(?:db|wb|dp)${NA}` },
        { name: 'variable.other.plenum', match: NB + IDENT + NA },
        { name: 'keyword.operator.arithmetic.plenum', match: raw`[+\-*/·]` },
        { name: 'keyword.operator.assignment.plenum', match: raw`=` },
        { name: 'punctuation.separator.comma.plenum', match: raw`,` },
        { include: '#string' },
        { include: '#invalid' },
      ],
    },
    continuation: {
      patterns: [
        continuation('A comma', raw`(,)`, 'punctuation.separator.comma.plenum'),
        continuation('An operator', raw`([+\-*/·])`, 'keyword.operator.arithmetic.plenum'),
        continuation('An equals sign', raw`(=)`, 'keyword.operator.assignment.plenum'),
        {
          comment: 'with at the end of a line: its key is the first word of the next line',
          begin: NB + '(with)' + NA + EOL,
          beginCaptures: { 1: { name: 'keyword.control.plenum' } },
          end: raw`(${IDENT})${NA}|(?=[^\s#])`,
          endCaptures: { 1: { name: 'variable.other.property.plenum' } },
          patterns: [{ include: '#comment' }],
        },
        continuation('to or like', NB + '(to|like)' + NA, 'keyword.control.plenum'),
      ],
    },
    'with-clause': {
      patterns: [
        {
          comment: 'with KEY, the key being to, with or like at the end of a line: the value is on the next line',
          begin: raw`${NB}(with)${NA}${WS}+(to|with|like)${NA}` + EOL,
          beginCaptures: {
            1: { name: 'keyword.control.plenum' },
            2: { name: 'variable.other.property.plenum' },
          },
          end: raw`(?=[^\s#])`,
          patterns: [{ include: '#comment' }],
        },
        { include: '#with-key' },
      ],
    },
    'with-key': {
      match: raw`${NB}(with)${NA}${WS}+(${IDENT})${NA}`,
      captures: {
        1: { name: 'keyword.control.plenum' },
        2: { name: 'variable.other.property.plenum' },
      },
    },
    quantity: {
      comment: 'A number and the unit written right after it: spaces may stand between them, none inside the unit',
      match: raw`(${NUMBER})(?:${WS}*(${UNIT}))?`,
      captures: {
        1: { name: 'constant.numeric.plenum' },
        2: { name: 'keyword.other.unit.plenum' },
      },
    },
    parens: {
      comment: 'Inside parentheses a line end never ends the item',
      begin: raw`\(`,
      beginCaptures: { 0: { name: 'punctuation.section.parens.begin.plenum' } },
      end: raw`\)`,
      endCaptures: { 0: { name: 'punctuation.section.parens.end.plenum' } },
      patterns: [{ include: '#value' }],
    },
    invalid: {
      comment: 'A character that no token of the language contains',
      name: 'invalid.illegal.character.plenum',
      match: raw`[^\s\x{FEFF}A-Za-z0-9_\-+*/·=(){},;"#°%²³.^]`,
    },
  },
};
