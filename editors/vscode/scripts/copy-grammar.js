// Copy the TextMate grammar from grammar/textmate/ (its one source, kept by
// the grammar's owners) into the extension at build time.
const fs = require("fs");
const path = require("path");

const source = path.join(__dirname, "..", "..", "..", "grammar", "textmate", "plenum.tmLanguage.json");
const target = path.join(__dirname, "..", "syntaxes", "plenum.tmLanguage.json");

if (!fs.existsSync(source)) {
  console.error(`copy-grammar: ${source} not found`);
  process.exit(1);
}
const grammar = JSON.parse(fs.readFileSync(source, "utf8"));
if (grammar.scopeName !== "source.plenum") {
  console.error(`copy-grammar: expected scopeName source.plenum, found ${grammar.scopeName}`);
  process.exit(1);
}
fs.mkdirSync(path.dirname(target), { recursive: true });
fs.copyFileSync(source, target);
console.log(`copy-grammar: ${path.relative(process.cwd(), target)}`);
