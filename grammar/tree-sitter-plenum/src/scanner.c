/*
 * External scanner of tree-sitter-plenum: the `unit` token.
 *
 * A unit follows a number (plenum.ebnf, `quantity = number , [ unit ]`). The
 * parser asks for one only right after a number; this scanner then reproduces
 * the Rust lexer's unit merging (crates/plenum-syntax/src/lexer.rs, `scan_unit`):
 *
 *   unit       = unit-atom , { unit-op , ( unit-atom | unit-group )
 *                            | "^" , [ "-" ] , number } ;
 *   unit-group = "(" , unit , ")" ;
 *   unit-op    = "/" | "*" | "·" ;
 *
 * - Spaces, tabs, form feeds, carriage returns and U+FEFF may stand between
 *   the number and the unit; a line feed may not. Nothing may stand inside the
 *   unit: a space ends it, so `20 ft * 120 ft` is a product of two lengths.
 * - Each unit word is the longest of an identifier, a super-word (`ft²`) and a
 *   dotted word (`in.wg`), as the Rust lexer's tokens are.
 * - A word spelled exactly like a keyword (`use let like to with none`) is never
 *   part of a unit; the qualifiers `db`, `wb`, `dp` never start one.
 * - When a continuation fails (`Btu/(h` with no `)`, `ft/2`, `ft/to`), the unit
 *   is what came before it. The scanner cannot step back, so it marks the end of
 *   every complete unit it passes (only outside groups) and returns the last.
 *
 * The scanner keeps no state between tokens.
 */

#include "tree_sitter/parser.h"

#include <stdbool.h>
#include <stddef.h>
#include <stdint.h>
#include <string.h>

enum TokenType {
  UNIT,
  ERROR_SENTINEL,
};

#define DEGREE_SIGN 0x00B0
#define SUPERSCRIPT_TWO 0x00B2
#define SUPERSCRIPT_THREE 0x00B3
#define MIDDLE_DOT 0x00B7
#define BYTE_ORDER_MARK 0xFEFF

void *tree_sitter_plenum_external_scanner_create(void) { return NULL; }

void tree_sitter_plenum_external_scanner_destroy(void *payload) { (void)payload; }

unsigned tree_sitter_plenum_external_scanner_serialize(void *payload, char *buffer) {
  (void)payload;
  (void)buffer;
  return 0;
}

void tree_sitter_plenum_external_scanner_deserialize(void *payload, const char *buffer,
                                                     unsigned length) {
  (void)payload;
  (void)buffer;
  (void)length;
}

static bool is_letter(int32_t c) { return (c >= 'A' && c <= 'Z') || (c >= 'a' && c <= 'z'); }

static bool is_digit(int32_t c) { return c >= '0' && c <= '9'; }

typedef struct {
  TSLexer *lexer;
  /* Unit groups open at the current position. */
  unsigned depth;
  /* A complete unit ends at the marked position. */
  bool marked;
} Scan;

typedef struct {
  /* Something was scanned where a unit word or a power was expected. */
  bool found;
  /* It may stand in a unit here (not a keyword; not a qualifier first). */
  bool valid;
  /* The scan stopped right after it: it did not run past its end. */
  bool complete;
} Piece;

static void advance(Scan *s) { s->lexer->advance(s->lexer, false); }

/* The unit may end here: mark it, unless inside a group not yet closed. */
static void mark(Scan *s) {
  if (s->depth == 0) {
    s->lexer->mark_end(s->lexer);
    s->marked = true;
  }
}

static bool word_is(const char *text, size_t len, const char *word) {
  return len == strlen(word) && memcmp(text, word, len) == 0;
}

/* A word that may not stand in a unit: a keyword, or (first) a qualifier. */
static bool reserved(const char *text, size_t len, bool first) {
  static const char *const keywords[] = {"use", "let", "like", "to", "with", "none"};
  static const char *const qualifiers[] = {"db", "wb", "dp"};
  for (size_t i = 0; i < sizeof keywords / sizeof keywords[0]; i++) {
    if (word_is(text, len, keywords[i])) return true;
  }
  if (first) {
    for (size_t i = 0; i < sizeof qualifiers / sizeof qualifiers[0]; i++) {
      if (word_is(text, len, qualifiers[i])) return true;
    }
  }
  return false;
}

/*
 * unit-atom = identifier | degree-word | percent-word | dotted-word | super-word
 *
 * The three word shapes run side by side, one character at a time, and the
 * longest wins. The only place where all of them can stop matching and then
 * match again is the `.` of a dotted word; when no letter follows it, the word
 * ended before the `.` and the scan has run one character too far (`complete`
 * is false). The word before the `.` is marked first, when it is valid.
 */
static Piece scan_atom(Scan *s, bool first) {
  TSLexer *lexer = s->lexer;
  Piece piece = {false, false, true};
  int32_t c = lexer->lookahead;

  if (c == DEGREE_SIGN || c == '%') {
    advance(s);
    while (is_letter(lexer->lookahead)) advance(s);
    piece.found = piece.valid = true;
    mark(s);
    return piece;
  }
  if (!is_letter(c) && c != '_') return piece;

  enum { DOTTED_DEAD, DOTTED_WORD, DOTTED_DOT, DOTTED_SEGMENT };
  /* The first characters, enough to compare with the reserved words. */
  char text[8];
  size_t len = 0;
  bool ident = true;      /* [A-Za-z_][A-Za-z0-9_-]* so far */
  bool super_run = true;  /* [A-Za-z_][A-Za-z0-9_]* so far, before the ² or ³ */
  bool super_done = false;
  int dotted = is_letter(c) ? DOTTED_WORD : DOTTED_DEAD;
  bool gap_valid = false;

  text[len++] = (char)c;
  advance(s);
  piece.found = true;

  for (;;) {
    c = lexer->lookahead;
    bool ident_next = ident && (is_letter(c) || is_digit(c) || c == '_' || c == '-');
    bool super_run_next = super_run && (is_letter(c) || is_digit(c) || c == '_');
    bool super_done_next = super_run && (c == SUPERSCRIPT_TWO || c == SUPERSCRIPT_THREE);
    int dotted_next = DOTTED_DEAD;
    switch (dotted) {
      case DOTTED_WORD:
        dotted_next = is_letter(c) ? DOTTED_WORD : c == '.' ? DOTTED_DOT : DOTTED_DEAD;
        break;
      case DOTTED_DOT:
        dotted_next = is_letter(c) ? DOTTED_SEGMENT : DOTTED_DEAD;
        break;
      case DOTTED_SEGMENT:
        dotted_next = is_letter(c) ? DOTTED_SEGMENT : c == '.' ? DOTTED_DOT : DOTTED_DEAD;
        break;
      default:
        break;
    }
    if (!ident_next && !super_run_next && !super_done_next && dotted_next == DOTTED_DEAD) break;

    bool accepting = ident || super_done || dotted == DOTTED_SEGMENT;
    bool accepting_next = ident_next || super_done_next || dotted_next == DOTTED_SEGMENT;
    if (accepting && !accepting_next) {
      /* A `.` that may or may not start another dotted segment. */
      gap_valid = ident ? !reserved(text, len, first) : true;
      if (gap_valid) mark(s);
    }

    if (len < sizeof text) text[len] = (char)c;
    len++;
    advance(s);
    ident = ident_next;
    super_run = super_run_next;
    super_done = super_done_next;
    dotted = dotted_next;
  }

  if (ident || super_done || dotted == DOTTED_SEGMENT) {
    /* A super-word or a dotted word is never reserved. */
    piece.valid = ident ? !reserved(text, len, first) : true;
    if (piece.valid) mark(s);
  } else {
    piece.complete = false;
    piece.valid = gap_valid;
  }
  return piece;
}

static void skip_digits(Scan *s) {
  while (is_digit(s->lexer->lookahead) || s->lexer->lookahead == '_') advance(s);
}

/*
 * The number after `^` (and an optional `-`), as the `number` token:
 * ( digits , [ "." , digits ] | "." , digits ) , [ ( "e" | "E" ) , [ "+" | "-" ] , digits ]
 */
static Piece scan_power(Scan *s) {
  TSLexer *lexer = s->lexer;
  Piece piece = {false, false, true};

  if (is_digit(lexer->lookahead)) {
    skip_digits(s);
    if (lexer->lookahead == '.') {
      mark(s);
      advance(s);
      if (!is_digit(lexer->lookahead)) {
        piece.found = piece.valid = true;
        piece.complete = false;
        return piece;
      }
      skip_digits(s);
    }
  } else if (lexer->lookahead == '.') {
    advance(s);
    if (!is_digit(lexer->lookahead)) return piece;
    skip_digits(s);
  } else {
    return piece;
  }
  piece.found = piece.valid = true;

  if (lexer->lookahead == 'e' || lexer->lookahead == 'E') {
    mark(s);
    advance(s);
    if (lexer->lookahead == '+' || lexer->lookahead == '-') advance(s);
    if (!is_digit(lexer->lookahead)) {
      piece.complete = false;
      return piece;
    }
    skip_digits(s);
  }
  mark(s);
  return piece;
}

bool tree_sitter_plenum_external_scanner_scan(void *payload, TSLexer *lexer,
                                              const bool *valid_symbols) {
  (void)payload;
  if (valid_symbols[ERROR_SENTINEL] || !valid_symbols[UNIT]) return false;

  while (lexer->lookahead == ' ' || lexer->lookahead == '\t' || lexer->lookahead == '\f' ||
         lexer->lookahead == '\r' || lexer->lookahead == BYTE_ORDER_MARK) {
    lexer->advance(lexer, true);
  }

  Scan s = {lexer, 0, false};
  Piece piece = scan_atom(&s, true);
  if (piece.found && piece.valid && piece.complete) {
    for (;;) {
      int32_t c = lexer->lookahead;
      if (c == '/' || c == '*' || c == MIDDLE_DOT) {
        advance(&s);
        if (lexer->lookahead == '(') {
          advance(&s);
          s.depth++;
        }
        piece = scan_atom(&s, false);
        if (!piece.found || !piece.valid || !piece.complete) break;
      } else if (c == '^') {
        advance(&s);
        if (lexer->lookahead == '-') advance(&s);
        piece = scan_power(&s);
        if (!piece.found || !piece.complete) break;
      } else if (c == ')' && s.depth > 0) {
        advance(&s);
        s.depth--;
        mark(&s);
      } else {
        break;
      }
    }
  }

  if (s.marked) lexer->result_symbol = UNIT;
  return s.marked;
}
