#!/usr/bin/env node
// Writes plenum.tmLanguage.json from src/plenum.tmLanguage.js.
// `node build.js --check` writes nothing and exits 1 when the JSON is stale.
'use strict';

const fs = require('node:fs');
const path = require('node:path');

const target = path.join(__dirname, 'plenum.tmLanguage.json');

/** The JSON text of the grammar, as committed. */
function build() {
  return `${JSON.stringify(require('./src/plenum.tmLanguage.js'), null, 2)}\n`;
}

module.exports = { build, target };

if (require.main === module) {
  const text = build();
  if (process.argv.includes('--check')) {
    const current = fs.existsSync(target) ? fs.readFileSync(target, 'utf8') : '';
    if (current !== text) {
      console.error('plenum.tmLanguage.json is stale: run `node build.js` in grammar/textmate');
      process.exit(1);
    }
  } else {
    fs.writeFileSync(target, text);
  }
}
