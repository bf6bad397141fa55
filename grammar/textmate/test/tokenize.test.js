// Tokenizes Plenum designs with the TextMate grammar, through the same engine
// VS Code uses (vscode-textmate on vscode-oniguruma), and checks the scopes.
//
// Run with `node --test` from this folder (run.sh does `npm ci` first).

'use strict';

const assert = require('node:assert/strict');
const fs = require('node:fs');
const path = require('node:path');
const { test } = require('node:test');

const oniguruma = require('vscode-oniguruma');
const vsctm = require('vscode-textmate');

const ROOT = path.resolve(__dirname, '..', '..', '..');
const GRAMMAR = path.resolve(__dirname, '..', 'plenum.tmLanguage.json');
const FIXTURES = path.join(__dirname, 'fixtures');

async function loadGrammar() {
  const wasm = fs.readFileSync(require.resolve('vscode-oniguruma/release/onig.wasm'));
  await oniguruma.loadWASM(wasm.buffer.slice(wasm.byteOffset, wasm.byteOffset + wasm.byteLength));
  const registry = new vsctm.Registry({
    onigLib: Promise.resolve({
      createOnigScanner: (patterns) => new oniguruma.OnigScanner(patterns),
      createOnigString: (s) => new oniguruma.OnigString(s),
    }),
    loadGrammar: async (scopeName) => {
      if (scopeName !== 'source.plenum') return null;
      return vsctm.parseRawGrammar(fs.readFileSync(GRAMMAR, 'utf8'), GRAMMAR);
    },
  });
  const grammar = await registry.loadGrammar('source.plenum');
  assert.ok(grammar, 'the grammar loads');
  return grammar;
}

const grammarPromise = loadGrammar();

/** Every line of `text` as { text, tokens: [{ start, end, text, scopes }] }. */
async function tokenize(text) {
  const grammar = await grammarPromise;
  let stack = vsctm.INITIAL;
  return text.split(/\r?\n/).map((line) => {
    const result = grammar.tokenizeLine(line, stack);
    stack = result.ruleStack;
    return {
      text: line,
      tokens: result.tokens.map((t) => ({
        start: t.startIndex,
        end: Math.min(t.endIndex, line.length),
        text: line.slice(t.startIndex, t.endIndex),
        scopes: t.scopes,
      })),
    };
  });
}

/** The designs every check runs over: examples and the coil reference designs. */
function designFiles() {
  const out = [];
  const walk = (dir) => {
    for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
      const p = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(p);
      else if (entry.name.endsWith('.plenum')) out.push(p);
    }
  };
  walk(path.join(ROOT, 'examples'));
  walk(path.join(ROOT, 'tests', 'reference', 'coil', 'designs'));
  walk(FIXTURES);
  return out.sort();
}

const cache = new Map();
async function lines(file) {
  if (!cache.has(file)) cache.set(file, await tokenize(fs.readFileSync(file, 'utf8')));
  return cache.get(file);
}

const WORD = /[A-Za-z0-9_-]/;
const squeeze = (text) => text.trim().replace(/\s+/g, ' ');

/**
 * The index of the first line that `selector` picks: a RegExp tested on the
 * line, or a string that the line is (else contains), comparing with runs of
 * spaces squeezed to one. Checks on the examples use RegExps that name keys,
 * not values, so that they survive a re-layout (`plenum fmt`) or a new value.
 */
function findLine(all, selector) {
  if (selector instanceof RegExp) return all.findIndex((l) => selector.test(l.text));
  const wanted = squeeze(selector);
  const exact = all.findIndex((l) => squeeze(l.text) === wanted);
  return exact !== -1 ? exact : all.findIndex((l) => squeeze(l.text).includes(wanted));
}

/**
 * The `nth` occurrence (from 1) of `needle` in `text` as { col, len }, or null.
 * A string needle that starts with a letter does not count inside a longer
 * word (`none` in `by_none`); a RegExp needle counts its matches.
 */
function find(text, needle, nth) {
  let seen = 0;
  if (needle instanceof RegExp) {
    const re = new RegExp(needle.source, needle.flags.includes('g') ? needle.flags : `${needle.flags}g`);
    for (const m of text.matchAll(re)) {
      if (++seen === nth) return { col: m.index, len: m[0].length };
    }
    return null;
  }
  for (let col = text.indexOf(needle); col !== -1; col = text.indexOf(needle, col + 1)) {
    const before = text[col - 1];
    const after = text[col + needle.length];
    if (/[A-Za-z_]/.test(needle[0]) && before !== undefined && /[A-Za-z_-]/.test(before)) continue;
    if (/[A-Za-z_]/.test(needle[0]) && after !== undefined && WORD.test(after)) continue;
    if (++seen === nth) return { col, len: needle.length };
  }
  return null;
}

/**
 * Finds the `nth` occurrence (from 1) of `needle` on the line of `file` that
 * `selector` picks, and checks that exactly one token spans it and that the
 * token carries `scope` (or, with `covered`, that a token starts with it and
 * every token inside the span carries `scope`).
 */
async function expectScope(file, selector, needle, scope, { nth = 1, covered = false } = {}) {
  const all = await lines(file);
  const row = findLine(all, selector);
  assert.notEqual(row, -1, `${path.basename(file)}: no line matches ${selector}`);
  const line = all[row];
  const found = find(line.text, needle, nth);
  assert.ok(found, `${path.basename(file)}:${row + 1}: no occurrence ${nth} of ${needle}`);
  const { col } = found;
  const end = col + found.len;
  const where = `${path.basename(file)}:${row + 1}:${col + 1} ${JSON.stringify(line.text.slice(col, end))}`;
  const inside = line.tokens.filter((t) => t.start < end && t.end > col);
  const show = inside.map((t) => `${JSON.stringify(t.text)} ${t.scopes.join(' ')}`).join('\n    ');
  if (covered) {
    assert.ok(inside.length > 0 && inside[0].start === col,
      `${where}: no token starts with it:\n    ${show}`);
  } else {
    assert.equal(inside.length, 1, `${where}: expected one token, got:\n    ${show}`);
    assert.equal(inside[0].start, col, `${where}: the token starts elsewhere:\n    ${show}`);
    assert.equal(inside[0].end, end, `${where}: the token ends elsewhere:\n    ${show}`);
  }
  for (const t of inside) {
    assert.ok(t.scopes.includes(scope), `${where}: ${JSON.stringify(t.text)} lacks ${scope}:\n    ${show}`);
  }
}

/** Checks that no token inside `needle` carries `scope` (as in expectScope). */
async function expectNoScope(file, selector, needle, scope, { nth = 1 } = {}) {
  const all = await lines(file);
  const line = all[findLine(all, selector)];
  assert.ok(line, `no line matches ${selector}`);
  const found = find(line.text, needle, nth);
  assert.ok(found, `no occurrence ${nth} of ${needle}`);
  const end = found.col + found.len;
  for (const t of line.tokens.filter((t) => t.start < end && t.end > found.col)) {
    assert.ok(!t.scopes.includes(scope), `${JSON.stringify(t.text)} has ${scope}: ${t.scopes.join(' ')}`);
  }
}

const LIBRARY = path.join(ROOT, 'examples', 'library.plenum');
const SCHOOL = path.join(ROOT, 'examples', 'middle-school.plenum');
const CLINIC = path.join(ROOT, 'tests', 'reference', 'coil', 'designs', 'clinic_si.plenum');
const CONSTRUCTS = path.join(FIXTURES, 'constructs.plenum');

const COMMENT = 'comment.line.number-sign.plenum';
const KEYWORD = 'keyword.control.plenum';
const KIND = 'entity.name.type.block.plenum';
const NAME = 'entity.name.function.plenum';
const PARENT = 'entity.other.inherited-class.plenum';
const LET_NAME = 'variable.other.constant.plenum';
const KEY = 'variable.other.property.plenum';
const VARIABLE = 'variable.other.plenum';
const NUMBER = 'constant.numeric.plenum';
const UNIT = 'keyword.other.unit.plenum';
const STRING = 'string.quoted.double.plenum';
const ESCAPE = 'constant.character.escape.plenum';
const NONE = 'constant.language.plenum';
const QUALIFIER = 'storage.modifier.qualifier.plenum';
const ARITHMETIC = 'keyword.operator.arithmetic.plenum';
const ASSIGNMENT = 'keyword.operator.assignment.plenum';
const COMMA = 'punctuation.separator.comma.plenum';
const SEMICOLON = 'punctuation.terminator.statement.plenum';
const BLOCK_BEGIN = 'punctuation.section.block.begin.plenum';
const BLOCK_END = 'punctuation.section.block.end.plenum';
const PAREN_BEGIN = 'punctuation.section.parens.begin.plenum';

// A number as the examples write them, and a line that starts with `key`.
const NUM = /[0-9][0-9_]*(\.[0-9][0-9_]*)?/;
const key = (k) => new RegExp(`^\\s*${k}\\s`);

test('examples/library.plenum: comments, blocks, names, keys, numbers, units, strings', async () => {
  const f = LIBRARY;
  await expectScope(f, /^# Alder Creek Branch Library/, /#.*/, COMMENT, { covered: true });
  await expectScope(f, /^zone reading "Reading room" \{/, 'zone', KIND);
  await expectScope(f, /^zone reading "Reading room" \{/, 'reading', NAME);
  await expectScope(f, /^zone reading "Reading room" \{/, '"Reading room"', STRING, { covered: true });
  await expectScope(f, /^zone reading "Reading room" \{/, '{', BLOCK_BEGIN);
  await expectScope(f, /^project "/, 'project', KIND);
  await expectScope(f, /^}/, '}', BLOCK_END);
  await expectScope(f, /^\s*area\s+[0-9_.]+ ft²/, 'area', KEY);
  await expectScope(f, /^\s*area\s+[0-9_.]+ ft²/, NUM, NUMBER);
  await expectScope(f, /^\s*area\s+[0-9_.]+ ft²/, 'ft²', UNIT);
  await expectScope(f, key('use'), 'use', KEY);
  await expectNoScope(f, key('use'), 'use', KEYWORD);
  await expectScope(f, /^\s*use\s+library/, 'library', VARIABLE);
  await expectScope(f, key('cooling'), 'cooling', KEY);
  await expectScope(f, key('cooling'), NUM, NUMBER);
  await expectScope(f, key('cooling'), '°F', UNIT);
  await expectScope(f, key('cooling'), 'db', QUALIFIER);
  await expectScope(f, key('cooling'), 'wb', QUALIFIER);
  await expectScope(f, key('cooling'), ',', COMMA);
  await expectScope(f, key('cooling'), /#.*/, COMMENT, { covered: true });
  await expectScope(f, key('dehumid'), 'dp', QUALIFIER);
  await expectScope(f, /^let reading_area =/, 'let', KEYWORD);
  await expectScope(f, /^let reading_area =/, 'reading_area', LET_NAME);
  await expectScope(f, /^let reading_area =/, '=', ASSIGNMENT);
  await expectScope(f, /^let reading_area =/, '*', ARITHMETIC);
  await expectScope(f, /^let reading_area =/, 'ft', UNIT, { nth: 1 });
  await expectScope(f, /^let reading_area =/, 'ft', UNIT, { nth: 2 });
  await expectScope(f, /^let reading_lights =/, 'W/ft²', UNIT);
  await expectScope(f, /^let reading_lights =/, 'reading_area', VARIABLE);
  await expectScope(f, /^\s*sensible .* \+ reading_lights/, 'kBtu/h', UNIT);
  await expectScope(f, /^\s*sensible .* \+ reading_lights/, '+', ARITHMETIC);
  await expectScope(f, /^\s*sensible .* \+ reading_lights/, 'reading_lights', VARIABLE);
  await expectScope(f, key('indoor'), '%rh', UNIT);
  await expectScope(f, /^zone stacks "Stacks" like reading/, 'like', KEYWORD);
  await expectScope(f, /^zone stacks "Stacks" like reading/, 'reading', PARENT);
  await expectScope(f, /^zone stacks "Stacks" like reading/, /#.*/, COMMENT, { covered: true });
  await expectScope(f, /^\s*use\s+office/, 'office', VARIABLE);
  await expectScope(f, /^ahu ahu_1 "/, 'ahu', KIND);
  await expectScope(f, /^ahu ahu_1 "/, 'ahu_1', NAME);
  await expectScope(f, key('serves'), 'reading', VARIABLE);
  await expectScope(f, key('serves'), ',', COMMA);
  await expectScope(f, /^\s+fan \{/, 'fan', KIND);
  await expectScope(f, key('motor_efficiency'), '%', UNIT);
  await expectScope(f, /^\s*motor\s+in_airstream/, 'in_airstream', VARIABLE);
  await expectScope(f, key('chilled_water'), 'to', KEYWORD);
  await expectScope(f, key('chilled_water'), '°F', UNIT, { nth: 2 });
  await expectScope(f, key('rated'), 'ton', UNIT);
  await expectScope(f, /^\s*return_duct\s+none/, 'none', NONE);
  await expectScope(f, key('static'), 'in.wg', UNIT);
  await expectScope(f, key('static'), 'with', KEYWORD);
  await expectScope(f, key('static'), 'efficiency', KEY);
  await expectScope(f, /^\s*outdoor_air\s+[0-9_.]+ cfm\/person/, 'cfm/person', UNIT);
});

test('examples/middle-school.plenum: use is a keyword at the top and a key in a zone', async () => {
  const f = SCHOOL;
  await expectScope(f, /^use "/, 'use', KEYWORD);
  await expectScope(f, /^use "/, '"shared/harrow-site.plenum"', STRING, { covered: true });
  await expectScope(f, /^\s*use\s+classroom/, 'use', KEY);
  await expectScope(f, /^\s*use\s+classroom/, 'classroom', VARIABLE);
  await expectScope(f, /^zone class_102 "Classroom 102" like class_101/, 'class_102', NAME);
  await expectScope(f, /^zone class_102 "Classroom 102" like class_101/, 'class_101', PARENT);
  await expectScope(f, /^zone class_102 "Classroom 102" like class_101/, '{', BLOCK_BEGIN);
  await expectScope(f, /^\s*people\s+classroom_people/, 'classroom_people', VARIABLE);
  await expectScope(f, key('sensible'), 'sensible', KEY);
  await expectScope(f, key('sensible'), NUM, NUMBER);
  await expectScope(f, key('sensible'), 'kBtu/h', UNIT);
  await expectScope(f, key('power'), 'hp', UNIT);
  await expectScope(f, key('arrangement'), 'arrangement', KEY);
  await expectScope(f, key('outdoor_air'), 'ventilation', VARIABLE);
  await expectScope(f, /^# Classrooms and corridor/, /#.*/, COMMENT, { covered: true });
});

test('coil reference design in SI: SI units', async () => {
  const f = CLINIC;
  await expectScope(f, key('cooling'), '°C', UNIT);
  await expectScope(f, key('area'), 'm²', UNIT);
  await expectScope(f, key('outdoor_air'), 'L/s', UNIT);
  await expectScope(f, key('sensible'), 'kW', UNIT);
  await expectScope(f, /^zone consult_4 "/, /"[^"]*"/, STRING, { covered: true });
});

test('constructs: units end where the Rust lexer ends them', async () => {
  const f = CONSTRUCTS;
  await expectScope(f, 'density 1 Btu/(h·ft²)', 'Btu/(h·ft²)', UNIT);
  await expectScope(f, 'nested 1 W/(m^2·(K/s))', 'W/(m^2·(K/s))', UNIT);
  await expectScope(f, 'power 3 ft^2 + 2 m^-2', 'ft^2', UNIT);
  await expectScope(f, 'power 3 ft^2 + 2 m^-2', 'm^-2', UNIT);
  await expectScope(f, 'tight 1250ft', '1250', NUMBER);
  await expectScope(f, 'tight 1250ft', 'ft', UNIT);
  await expectScope(f, 'product 20 ft * 120 ft', '*', ARITHMETIC);
  await expectScope(f, 'half 10 ft/2', 'ft', UNIT);
  await expectScope(f, 'half 10 ft/2', '/', ARITHMETIC);
  await expectScope(f, 'half 10 ft/2', '2', NUMBER);
  await expectScope(f, 'bare 75 db', '75', NUMBER);
  await expectScope(f, 'bare 75 db', 'db', QUALIFIER);
  await expectScope(f, 'span 5 to 10', 'to', KEYWORD);
  await expectScope(f, 'by_none 1 ft/none', 'ft', UNIT);
  await expectScope(f, 'by_none 1 ft/none', 'none', NONE);
  await expectScope(f, 'hyphen 5 ft-lb', 'ft-lb', UNIT);
  await expectScope(f, 'exponent 1.2e3 cfm', '1.2e3', NUMBER);
  await expectScope(f, 'sign -4 °C', '-', ARITHMETIC);
  await expectScope(f, 'sign -4 °C', '°C', UNIT);
  await expectScope(f, 'label "say \\"hi\\"" {', '\\"', ESCAPE);
  await expectScope(f, 'label "say \\"hi\\"" {', 'label', KIND);
});

test('constructs: a line end after , or an operator does not end the item', async () => {
  const f = CONSTRUCTS;
  await expectScope(f, 'serves reading,', ',', COMMA);
  await expectScope(f, '         other_zone', 'other_zone', VARIABLE);
  await expectNoScope(f, '         other_zone', 'other_zone', KEY);
  await expectScope(f, '         # between', '# between', COMMENT, { covered: true });
  await expectScope(f, 'sum 1 +', '+', ARITHMETIC);
  await expectScope(f, '      2 kW', 'kW', UNIT);
  await expectScope(f, '      2 kW', '2', NUMBER);
  await expectScope(f, 'grouped (1', '(', PAREN_BEGIN);
  await expectScope(f, '    + x', 'x', VARIABLE);
  await expectScope(f, 'chilled 44 °F to', 'to', KEYWORD);
  await expectScope(f, '    56 °F', '°F', UNIT);
  await expectScope(f, 'static 2 in.wg with', 'with', KEYWORD);
  await expectScope(f, '    efficiency 60 %', 'efficiency', KEY);
  await expectScope(f, '    efficiency 60 %', '%', UNIT);
  await expectScope(f, '  to', 'to', KEY);
  await expectScope(f, '    3 ton', 'ton', UNIT);
  await expectScope(f, 'after_to 1', 'after_to', KEY);
  await expectScope(f, 'let continued =', '=', ASSIGNMENT);
  await expectScope(f, '  5 cfm', 'cfm', UNIT);
  await expectScope(f, 'zone next {}', 'zone', KIND);
  await expectScope(f, 'zone next {}', '}', BLOCK_END);
  await expectScope(f, 'zone workroom "Staff workroom" { area 640 ft²; people 6; use office }', '{', BLOCK_BEGIN);
  await expectScope(f, 'zone workroom "Staff workroom" { area 640 ft²; people 6; use office }', 'area', KEY);
  await expectScope(f, 'zone workroom "Staff workroom" { area 640 ft²; people 6; use office }', ';', SEMICOLON);
  await expectScope(f, 'zone workroom "Staff workroom" { area 640 ft²; people 6; use office }', 'people', KEY);
  await expectScope(f, 'zone workroom "Staff workroom" { area 640 ft²; people 6; use office }', 'use', KEY);
  await expectScope(f, 'zone workroom "Staff workroom" { area 640 ft²; people 6; use office }', 'office', VARIABLE);
  await expectScope(f, 'zone workroom "Staff workroom" { area 640 ft²; people 6; use office }', '}', BLOCK_END);
  await expectScope(f, 'fan { power 7.5 hp }; coil { rated 20 ton }', 'coil', KIND);
  await expectScope(f, 'fan { power 7.5 hp }; coil { rated 20 ton }', ';', SEMICOLON);
  await expectScope(f, 'fan { power 7.5 hp }; coil { rated 20 ton }', 'rated', KEY);
  await expectScope(f, 'let flow = 2_280 L/s; let big = 1.2e3 cfm', 'let', KEYWORD, { nth: 2 });
  await expectScope(f, 'let flow = 2_280 L/s; let big = 1.2e3 cfm', 'big', LET_NAME);
  await expectScope(f, 'let flow = 2_280 L/s; let big = 1.2e3 cfm', 'L/s', UNIT);
});

test('no design produces an invalid token, and every line is tokenized', async () => {
  const files = designFiles();
  assert.ok(files.length >= 12, `expected the example and reference designs, found ${files.length}`);
  for (const file of files) {
    const all = await lines(file);
    all.forEach((line, row) => {
      let at = 0;
      for (const t of line.tokens) {
        assert.equal(t.start, at, `${file}:${row + 1}: a gap in the tokens`);
        at = t.end;
        for (const s of t.scopes) {
          assert.ok(!s.startsWith('invalid'), `${file}:${row + 1}:${t.start + 1}: ${JSON.stringify(t.text)} is ${s}`);
        }
      }
    });
  }
});

test('every line comment is a comment, and every number in a value is numeric', async () => {
  for (const file of designFiles()) {
    const all = await lines(file);
    all.forEach((line, row) => {
      const hash = line.text.indexOf('#');
      const inString = hash >= 0 && (line.text.slice(0, hash).split('"').length - 1) % 2 === 1;
      if (hash >= 0 && !inString) {
        for (const t of line.tokens.filter((t) => t.start >= hash)) {
          assert.ok(t.scopes.includes(COMMENT), `${file}:${row + 1}: ${JSON.stringify(t.text)} is not a comment`);
        }
      }
      for (const t of line.tokens) {
        if (/^[0-9][0-9_]*(\.[0-9][0-9_]*)?$/.test(t.text) && !t.scopes.includes(COMMENT) && !t.scopes.includes(STRING)) {
          assert.ok(t.scopes.includes(NUMBER) || t.scopes.some((s) => s.startsWith('entity.name')),
            `${file}:${row + 1}: ${JSON.stringify(t.text)} is ${t.scopes.join(' ')}`);
        }
      }
    });
  }
});

test('the committed JSON is what src/plenum.tmLanguage.js builds', () => {
  const { build, target } = require('../build.js');
  assert.equal(fs.readFileSync(target, 'utf8'), build(), 'run `node build.js` in grammar/textmate');
});

test('every include resolves and every regular expression compiles', async () => {
  await grammarPromise; // oniguruma is loaded
  const json = JSON.parse(fs.readFileSync(GRAMMAR, 'utf8'));
  assert.equal(json.scopeName, 'source.plenum');
  let regexes = 0;
  const visit = (rule, where) => {
    if (Array.isArray(rule)) return rule.forEach((r, i) => visit(r, `${where}[${i}]`));
    if (rule === null || typeof rule !== 'object') return;
    if (typeof rule.include === 'string' && rule.include.startsWith('#')) {
      assert.ok(Object.hasOwn(json.repository, rule.include.slice(1)), `${where}: no rule ${rule.include}`);
    }
    for (const field of ['match', 'begin', 'end']) {
      if (typeof rule[field] === 'string') {
        assert.doesNotThrow(() => new oniguruma.OnigScanner([rule[field]]).dispose(), `${where}.${field} does not compile`);
        regexes++;
      }
    }
    for (const [k, v] of Object.entries(rule)) if (typeof v === 'object') visit(v, `${where}.${k}`);
  };
  visit(json, 'grammar');
  assert.ok(regexes > 30, `only ${regexes} regular expressions found`);
  // Every rule of the repository is used.
  const text = JSON.stringify(json);
  for (const name of Object.keys(json.repository)) {
    assert.ok(text.includes(`"#${name}"`), `rule ${name} is never included`);
  }
});
