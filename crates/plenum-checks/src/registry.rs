//! The code registry: every check, declared once, with its documentation.
//!
//! Each entry gives the check's kebab-case code (stable: other tools rely
//! on it), its default severity, a one-line summary and a documentation
//! block in five parts — what it checks, why it matters, an example that
//! triggers it, how to fix it, and where the rule comes from (a standard,
//! physics, the format's own rules, or *common practice*: a rule of thumb of
//! the trade with no single published source). `plenum explain CODE` prints
//! the block, the SARIF `rules[]` are built from it, and the language
//! server's hover on a code shows it.
//!
//! An example may hold several files: a line `# file: NAME` starts the next
//! one (the first, unnamed, is `design.plenum`). The registry's tests run
//! every example and require it to report its code.

use crate::diagnostic::Severity;

/// Which layer a check belongs to.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Group {
    /// The text does not follow the grammar (`plenum-syntax`).
    Syntax,
    /// Files, `use`, names, keys and units (`plenum-model`).
    Model,
    /// The coil chain has no answer for an air handler (`plenum-engine`).
    Engine,
    /// Plausibility, ventilation, humidity and sizing of the results.
    Result,
    /// The checker's own settings: `plenum.toml` and in-file suppressions.
    Settings,
}

impl Group {
    /// A short name.
    pub fn as_str(self) -> &'static str {
        match self {
            Group::Syntax => "syntax",
            Group::Model => "model",
            Group::Engine => "engine",
            Group::Result => "result",
            Group::Settings => "settings",
        }
    }
}

/// A check's documentation, in the five parts every check must have.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Doc {
    /// What it checks.
    pub what: &'static str,
    /// Why it matters.
    pub why: &'static str,
    /// A small design (or `plenum.toml`) that triggers it.
    pub example: &'static str,
    /// How to fix it.
    pub fix: &'static str,
    /// Where the rule comes from.
    pub source: &'static str,
}

/// One registered check.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Check {
    /// The stable kebab-case code.
    pub code: &'static str,
    /// The default severity.
    pub severity: Severity,
    /// One line saying what it reports.
    pub summary: &'static str,
    /// The layer it belongs to.
    pub group: Group,
    /// Whether a project may change its severity in `plenum.toml` and a
    /// design file may suppress it for one block. Checks that mean the
    /// design cannot be read or evaluated as written are not adjustable:
    /// CI must never pass a design that was not computed.
    pub adjustable: bool,
    /// The documentation block.
    pub doc: Doc,
}

impl Check {
    /// The documentation block as Markdown, as `plenum explain` prints it.
    pub fn explain(&self) -> String {
        let adjust = if self.adjustable {
            "Its severity can be set in `plenum.toml` and it can be suppressed for one block \
             with a reason (see `plenum explain unused-suppression`)."
        } else {
            "It cannot be switched off or suppressed: the design cannot be read or evaluated \
             as written."
        };
        format!(
            "# {code} ({severity}, {group})\n\n{summary}\n\n## What it checks\n\n{what}\n\n\
             ## Why it matters\n\n{why}\n\n## Example\n\n```plenum\n{example}\n```\n\n\
             ## How to fix it\n\n{fix}\n\n## Source\n\n{source}\n\n{adjust}\n",
            code = self.code,
            severity = self.severity,
            group = self.group.as_str(),
            summary = self.summary,
            what = self.doc.what,
            why = self.doc.why,
            example = self.doc.example.trim_end(),
            fix = self.doc.fix,
            source = self.doc.source,
        )
    }
}

/// The check registered under `code`.
pub fn lookup(code: &str) -> Option<&'static Check> {
    CHECKS.iter().find(|c| c.code == code)
}

/// The registered code nearest to `code` (a likely misspelling), if any.
pub fn suggest(code: &str) -> Option<&'static str> {
    plenum_model::keys::nearest(code, CHECKS.iter().map(|c| c.code))
}

const GRAMMAR: &str =
    "The Plenum design-file format: its normative grammar, `grammar/plenum.ebnf`.";
const LANGUAGE: &str =
    "The Plenum design-file format: the rules of the language (names, keys, files).";

/// Every check, in the order `plenum explain --list` prints them.
pub static CHECKS: &[Check] = &[
    // ---------------------------------------------------------------- syntax
    Check {
        code: "syntax-error",
        severity: Severity::Error,
        summary: "The text does not follow the grammar here.",
        group: Group::Syntax,
        adjustable: false,
        doc: Doc {
            what: "A token the parser did not expect: a missing value, a stray `=`, two values \
                   where one belongs. The parser skips to the end of the line and goes on, so \
                   every independent mistake in a file is reported at once.",
            why: "The item that holds the mistake is not read, so its value is missing from \
                  the design, and every figure computed from it would be wrong.",
            example: "zone office {\n  sensible = 12 kBtu/h\n}\n",
            fix: "Write the item as the grammar has it: `key value`, one per line or separated \
                  by `;`, without `=`.",
            source: GRAMMAR,
        },
    },
    Check {
        code: "invalid-character",
        severity: Severity::Error,
        summary: "A character that is not part of the format.",
        group: Group::Syntax,
        adjustable: false,
        doc: Doc {
            what: "A character that no token of the format starts with, such as `$` or a \
                   control character.",
            why: "The parser cannot read the item that holds it, so its value is lost.",
            example: "zone office {\n  area 1_000 ft² $\n}\n",
            fix: "Delete the character, or move text that is a note into a `#` comment.",
            source: GRAMMAR,
        },
    },
    Check {
        code: "invalid-utf8",
        severity: Severity::Error,
        summary: "The file is not valid UTF-8 text.",
        group: Group::Syntax,
        adjustable: false,
        doc: Doc {
            what: "A byte sequence that is not UTF-8, typically a file saved in Latin-1 or \
                   Windows-1252 (for example `é` written as the single byte E9). The file is read \
                   up to that byte.",
            why: "Design files are UTF-8 so that `°F`, `ft²` and names read the same on every \
                  machine; the rest of the file cannot be read.",
            example: "# The byte after `caf` is E9 (Latin-1 `é`):\nzone caf\u{FFFD} { sensible 1 kBtu/h }\n",
            fix: "Save the file as UTF-8 (most editors offer it under *Save with encoding*).",
            source: "The Plenum design-file format: files are UTF-8 (RFC 3629).",
        },
    },
    Check {
        code: "unterminated-string",
        severity: Severity::Error,
        summary: "A string without its closing quote.",
        group: Group::Syntax,
        adjustable: false,
        doc: Doc {
            what: "A `\"` that opens a label or a `use` path with no closing `\"` on its line.",
            why: "The rest of the line is taken as the string, so the block or `use` is not read \
                  as written.",
            example: "zone office \"Open office {\n  sensible 12 kBtu/h\n}\n",
            fix: "Close the string with `\"`; write a quote inside it as `\\\"`.",
            source: GRAMMAR,
        },
    },
    Check {
        code: "invalid-escape",
        severity: Severity::Error,
        summary: "A string escape other than `\\\"` and `\\\\`.",
        group: Group::Syntax,
        adjustable: false,
        doc: Doc {
            what: "A backslash in a string followed by anything but `\"` or `\\`.",
            why: "Strings have only those two escapes, so that labels and paths read the same \
                  everywhere; any other backslash is most likely a Windows path separator.",
            example: "use \"shared\\site.plenum\"\n",
            fix: "Write paths with `/`, and a backslash itself as `\\\\`.",
            source: GRAMMAR,
        },
    },
    Check {
        code: "number-out-of-range",
        severity: Severity::Error,
        summary: "A number too large to represent.",
        group: Group::Syntax,
        adjustable: false,
        doc: Doc {
            what: "A number literal beyond the range of a 64-bit floating-point value.",
            why: "No design quantity is that large; the number is almost certainly a typing \
                  slip, and it cannot be computed with.",
            example: "let x = 1e999 cfm\n",
            fix: "Correct the number.",
            source: "IEEE 754 double precision, the number type the model computes with.",
        },
    },
    Check {
        code: "nesting-too-deep",
        severity: Severity::Error,
        summary: "More nested braces or parentheses than the parser allows.",
        group: Group::Syntax,
        adjustable: false,
        doc: Doc {
            what: "Blocks or parentheses nested deeper than 64 levels.",
            why: "No design needs that depth; the limit keeps the parser and every tool built \
                  on it from running out of stack on a damaged or hostile file.",
            example: "let x = ((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((((1))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))))\n",
            fix: "Flatten the nesting; name parts of a long expression with `let`.",
            source: GRAMMAR,
        },
    },
    Check {
        code: "unclosed-block",
        severity: Severity::Error,
        summary: "A block whose closing `}` is missing.",
        group: Group::Syntax,
        adjustable: false,
        doc: Doc {
            what: "A `{` still open at the end of the file. One error names the innermost open \
                   block and points at its opening brace.",
            why: "Everything after the opening brace was read into that block, which is rarely \
                  what was meant.",
            example: "zone office {\n  sensible 12 kBtu/h\n",
            fix: "Add the missing `}`.",
            source: GRAMMAR,
        },
    },
    Check {
        code: "unmatched-delimiter",
        severity: Severity::Error,
        summary: "A `}` or `)` with no opener.",
        group: Group::Syntax,
        adjustable: false,
        doc: Doc {
            what: "A closing brace or parenthesis that closes nothing.",
            why: "It usually means a block was closed too early, so the keys after it are not \
                  in the block they were written for.",
            example: "zone office {\n  sensible 12 kBtu/h\n}\n}\n",
            fix: "Delete the extra delimiter, or add the opener it belongs to.",
            source: GRAMMAR,
        },
    },
    // ----------------------------------------------------------------- model
    Check {
        code: "unit-mismatch",
        severity: Severity::Error,
        summary: "A quantity of the wrong dimension for its key or operation.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "A key given a quantity of another dimension (an airflow for `sensible`, a \
                   length for `area`), or arithmetic that adds or compares quantities of \
                   different dimensions. Where one unit fixes it, a fix is offered.",
            why: "A value in the wrong dimension is a different physical quantity: computing \
                  with it would give an answer that only looks like one.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office {\n  area 1_000 ft\n  sensible 12 kBtu/h\n}\nahu a { serves office }\n",
            fix: "Write the value in a unit of the dimension the message names (`ft²` for an \
                  area, `Btu/h` or `kW` for a heat flow); where one unit fixes it, the fix \
                  offers it.",
            source: "NIST SP 811 (2008): the value of a quantity is a number times a unit, \
                     and only quantities of the same kind can be added or compared; the key \
                     table of the format gives each key its dimension.",
        },
    },
    Check {
        code: "unknown-unit",
        severity: Severity::Error,
        summary: "A unit symbol the unit table does not know.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "A unit symbol that is not in the unit table, with the nearest known symbol \
                   suggested (`kbtu` → `kBtu`).",
            why: "Without a known unit the number has no size; guessing would silently change \
                  the design.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kbtu/h }\nahu a { serves office }\n",
            fix: "Write a symbol from the unit table; symbols are case-sensitive (`kBtu/h`, \
                  `MBH`, `ton`, `cfm`, `L/s`, `°F`).",
            source: "NIST SP 811 (2008), appendix B (the conversion factors of the unit table).",
        },
    },
    Check {
        code: "missing-unit",
        severity: Severity::Error,
        summary: "A number without a unit where the key needs one.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "A bare number for a key that takes a dimensioned quantity.",
            why: "`38_500` could be Btu/h or W — a factor of 3.4. The format never assumes a \
                  unit.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 38_500 }\nahu a { serves office }\n",
            fix: "Write the unit after the number: `38_500 Btu/h`.",
            source: "NIST SP 811 (2008): the value of a quantity is a number and a unit.",
        },
    },
    Check {
        code: "invalid-arithmetic",
        severity: Severity::Error,
        summary: "Arithmetic with no physical meaning, such as adding two temperatures.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "Operations that the quantity algebra rejects: adding two absolute \
                   temperatures, dividing by zero, raising a dimensioned value to a \
                   non-integer power.",
            why: "75 °F + 75 °F is not 150 °F of anything; a temperature plus a temperature \
                  difference is.",
            example: "let t = 75 °F + 75 °F\n",
            fix: "Add a temperature difference (`3 °F` in a field that takes a difference, or \
                  `3 K`) to a temperature, or subtract two temperatures.",
            source: "NIST SP 811 (2008): a temperature and a temperature interval are \
                     distinct quantities (methods.md §6).",
        },
    },
    Check {
        code: "unknown-name",
        severity: Severity::Error,
        summary: "A name in `serves`, `like` or an expression that is not defined.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "A zone named in `serves`, a block named in `like` or a `let` name used in an \
                   expression that exists neither in this file nor in a file it `use`s. The \
                   nearest defined name is suggested.",
            why: "A zone that a unit serves but that does not exist adds no load: the unit \
                  would be sized for less than it serves.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h }\nahu a { serves ofice }\n",
            fix: "Correct the spelling, define the name, or `use` the file that defines it.",
            source: LANGUAGE,
        },
    },
    Check {
        code: "duplicate-name",
        severity: Severity::Error,
        summary: "Two definitions of the same name.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "Two zones, two air handlers or two `let`s with the same name, in one file or \
                   across the files of a design.",
            why: "A reference to the name would be ambiguous, and one of the two loads would \
                  silently be left out.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h }\nzone office { sensible 8 kBtu/h }\nahu a { serves office }\n",
            fix: "Rename one of them.",
            source: LANGUAGE,
        },
    },
    Check {
        code: "unknown-key",
        severity: Severity::Error,
        summary: "A key the block does not have.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "A key that the block kind does not define, with the nearest key suggested.",
            why: "A misspelt key is a value the engine never sees: `sensibel 12 kBtu/h` would \
                  leave the zone without its load.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h; peple 5 }\nahu a { serves office }\n",
            fix: "Correct the key; the keys of each block are listed in the language \
                  reference.",
            source: LANGUAGE,
        },
    },
    Check {
        code: "duplicate-key",
        severity: Severity::Error,
        summary: "The same key twice in one block.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "A key written twice in one block.",
            why: "Which value is meant is unclear; taking either would hide a revision that \
                  was half done.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office {\n  sensible 12 kBtu/h\n  sensible 14 kBtu/h\n}\nahu a { serves office }\n",
            fix: "Keep one of the two values.",
            source: LANGUAGE,
        },
    },
    Check {
        code: "missing-key",
        severity: Severity::Error,
        summary: "A required key is missing.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "A block without a key it needs: a zone without `sensible`, a site without \
                   `cooling`, an air handler without `serves`.",
            why: "The chain cannot be computed without these values, and the format has no \
                  defaults for them.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { area 1_000 ft² }\nahu a { serves office }\n",
            fix: "Add the key with its value from the load calculation or the design basis.",
            source: LANGUAGE,
        },
    },
    Check {
        code: "conflicting-keys",
        severity: Severity::Error,
        summary: "Two keys that exclude each other.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "Keys that say the same thing two ways, such as `supply_temp` and \
                   `supply_dt`, or a fan's `rise` together with its `power`.",
            why: "The two values may disagree, and which one governs would be a guess.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h }\nahu a {\n  serves office\n  supply_temp 55 °F\n  supply_dt 20 °F\n}\n",
            fix: "Keep one of them.",
            source: LANGUAGE,
        },
    },
    Check {
        code: "unknown-block",
        severity: Severity::Error,
        summary: "A block kind the format does not have, or one in the wrong place.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "A block whose kind is not one of `project`, `site`, `zone`, `ahu` (and \
                   `fan`, `coil` inside an `ahu`), or a block nested where it does not belong.",
            why: "Its contents are not read, so whatever it describes is missing from the \
                  design.",
            example: "site { cooling 94 °F db, 75 °F wb }\nroom office { sensible 12 kBtu/h }\n",
            fix: "Use one of the block kinds of the format, in its place.",
            source: LANGUAGE,
        },
    },
    Check {
        code: "invalid-value",
        severity: Severity::Error,
        summary: "A value of the wrong shape for its key.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "A value the key does not take: a keyword the key does not know, a list where \
                   one value belongs, an air state without a humidity.",
            why: "The key cannot be read, so the value the design meant is not used.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h }\nahu a {\n  serves office\n  fan { motor somewhere }\n}\n",
            fix: "Write one of the forms the message lists.",
            source: LANGUAGE,
        },
    },
    Check {
        code: "out-of-range",
        severity: Severity::Error,
        summary: "A value outside the range its key admits.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "A value that has the right unit but cannot be physical: a negative area, a \
                   diversity above 100 %, a wet bulb above the dry bulb, a relative humidity \
                   above 100 %.",
            why: "No psychrometric state or load matches such a value; the computation would \
                  have no meaning.",
            example: "site { cooling 94 °F db, 98 °F wb }\nzone office { sensible 12 kBtu/h }\nahu a { serves office }\n",
            fix: "Correct the value; the message gives the range.",
            source: "Physics (ASHRAE Handbook—Fundamentals 2017, ch. 1: the wet bulb of moist \
                     air is at most its dry bulb, RH at most 100 %), and the key table.",
        },
    },
    Check {
        code: "use-not-found",
        severity: Severity::Error,
        summary: "A `use`d file cannot be read.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "A `use \"path\"` whose file does not exist or is not UTF-8 text.",
            why: "Whatever that file defines — often the site or shared zones — is missing.",
            example: "use \"shared/site.plenum\"\nzone office { sensible 12 kBtu/h }\n",
            fix: "Correct the path (relative to the file that has the `use`), or add the file.",
            source: LANGUAGE,
        },
    },
    Check {
        code: "use-outside-project",
        severity: Severity::Error,
        summary: "A `use` path that leaves the project folder or is absolute.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "A `use` path that is absolute, or that climbs above the project root (the \
                   folder holding `plenum.toml`, else the repository root, else the file's \
                   own folder).",
            why: "A design must be complete in its repository, so that CI and a colleague \
                  compute the same thing from the same commit.",
            example: "use \"/etc/site.plenum\"\n",
            fix: "Move the shared file inside the project and `use` it by a relative path.",
            source: LANGUAGE,
        },
    },
    Check {
        code: "use-cycle",
        severity: Severity::Error,
        summary: "Files that `use` each other in a circle.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "A chain of `use`s that comes back to a file already being read.",
            why: "The files have no order in which they can be read; definitions would depend \
                  on themselves.",
            example: "use \"b.plenum\"\n# file: b.plenum\nuse \"design.plenum\"\n",
            fix: "Move what both files need into a third file that both `use`.",
            source: LANGUAGE,
        },
    },
    Check {
        code: "like-cycle",
        severity: Severity::Error,
        summary: "Blocks that inherit from each other in a circle.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "`like` chains that come back to the block they started from.",
            why: "The inherited keys would depend on themselves.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone a like b { sensible 1 kBtu/h }\nzone b like a { sensible 1 kBtu/h }\n",
            fix: "Break the chain: let one block state its keys itself.",
            source: LANGUAGE,
        },
    },
    Check {
        code: "let-cycle",
        severity: Severity::Error,
        summary: "`let` values defined in terms of each other in a circle.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "`let` definitions whose expressions refer back to themselves.",
            why: "The value has no definition.",
            example: "let a = b + 1 cfm\nlet b = a + 1 cfm\n",
            fix: "Define one of the values without the other.",
            source: LANGUAGE,
        },
    },
    Check {
        code: "missing-site",
        severity: Severity::Error,
        summary: "The design has no `site` block.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "A design (its root file and every file it uses) without a `site` block.",
            why: "The outdoor design state and the barometric pressure come from the site; the \
                  format has no default outdoor condition, so nothing can be computed.",
            example: "zone office { sensible 12 kBtu/h }\nahu a { serves office }\n",
            fix: "Add a `site` block with `cooling` (and `elevation` or `pressure`), or `use` \
                  the shared file that has it.",
            source: "The project's methods (methods.md §1): the cooling design outdoor state \
                     must be given.",
        },
    },
    Check {
        code: "unserved-zone",
        severity: Severity::Warning,
        summary: "A zone that no air handler serves.",
        group: Group::Model,
        adjustable: true,
        doc: Doc {
            what: "A zone named in no air handler's `serves`.",
            why: "Its load reaches no coil: if it is meant to be cooled, some unit is sized \
                  without it.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h }\nzone storage { sensible 1 kBtu/h }\nahu a { serves office }\n",
            fix: "Add the zone to the `serves` of the unit that cools it, or remove the zone.",
            source: LANGUAGE,
        },
    },
    Check {
        code: "zone-served-twice",
        severity: Severity::Error,
        summary: "A zone served by two air handlers, or named twice in one `serves`.",
        group: Group::Model,
        adjustable: false,
        doc: Doc {
            what: "A zone named in the `serves` of more than one air handler, or twice in the \
                   same list.",
            why: "Its load would be counted twice, oversizing the units, or it is unclear \
                  which unit carries it.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h }\nahu a { serves office }\nahu b { serves office }\n",
            fix: "Let one unit serve the zone; split the zone if two units really share it.",
            source: LANGUAGE,
        },
    },
    // ---------------------------------------------------------------- engine
    Check {
        code: "not-evaluated",
        severity: Severity::Info,
        summary: "An air handler was left out of the results because of an error elsewhere.",
        group: Group::Engine,
        adjustable: false,
        doc: Doc {
            what: "An air handler without results because the site, or one of its zones, \
                   cannot be used: a required value is missing or wrong, and that error is \
                   reported where it is. This note is an info beside that error; if no error \
                   explains it, it is itself an error.",
            why: "A unit without results has not been checked for capacity: the note keeps \
                  that from going unnoticed.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { area 1_000 ft² }\nahu a { serves office }\n",
            fix: "Fix the error it points to.",
            source: "The project's methods (methods.md §4): the chain needs the site's design \
                     state and every served zone's sensible load.",
        },
    },
    Check {
        code: "invalid-input",
        severity: Severity::Error,
        summary: "A number outside what the coil-load method accepts.",
        group: Group::Engine,
        adjustable: false,
        doc: Doc {
            what: "A value the method cannot compute with although its unit and range are \
                   right for the key: a zone sensible gain of zero (it sets the zone's \
                   airflow), or a number that is not finite.",
            why: "The equations of the chain divide by these values or need them positive; the \
                  air handler is left out rather than given a meaningless result.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 0 kBtu/h }\nahu a { serves office }\n",
            fix: "Correct the value; the message says what it must satisfy. A zone without \
                  a cooling load needs no supply air: leave it out of `serves`.",
            source: "The project's methods (methods.md §4 step 2: the zone airflow is \
                     q_s,z / (c_p ΔT)).",
        },
    },
    Check {
        code: "unknown-category",
        severity: Severity::Error,
        summary: "A zone's `use` is not a category of the ventilation table.",
        group: Group::Engine,
        adjustable: false,
        doc: Doc {
            what: "A ventilation category (`use`) that is not in the ASHRAE 62.1 table the \
                   engine carries; the nearest category is suggested.",
            why: "The zone's outdoor-air requirement is unknown, so the air handler's \
                  ventilation and coil load cannot be computed; the unit is left out.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { use ofice; sensible 12 kBtu/h }\nahu a { serves office }\n",
            fix: "Write one of the categories of the table (`plenum explain \
                  ventilation-shortfall` names the standard), or leave `use` out and give the \
                  unit's outdoor air directly.",
            source: "ANSI/ASHRAE Standard 62.1-2019, the table of minimum ventilation rates in \
                     breathing zones (the categories and rates are written from memory of the \
                     2016–2019 editions: check the edition in force).",
        },
    },
    Check {
        code: "supply-not-below-room",
        severity: Severity::Error,
        summary: "The supply air is not colder than a zone it serves.",
        group: Group::Engine,
        adjustable: false,
        doc: Doc {
            what: "A supply temperature at or above a served zone's indoor dry bulb.",
            why: "Air at or above room temperature removes no sensible heat: the zone's \
                  airflow m = q_s / (c_p ΔT) has no finite value.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h }\nahu a {\n  serves office\n  supply_temp 78 °F\n}\n",
            fix: "Lower the supply temperature below every served zone's indoor temperature \
                  (typically 18–20 °F below).",
            source: "Physics: the sensible heat balance of the room, ASHRAE \
                     Handbook—Fundamentals (2017), ch. 1.",
        },
    },
    Check {
        code: "outdoor-air-exceeds-supply",
        severity: Severity::Error,
        summary: "A recirculating unit would take more outdoor air than it supplies.",
        group: Group::Engine,
        adjustable: false,
        doc: Doc {
            what: "An outdoor-air fraction (by mass) above 1 for a unit that mixes return air.",
            why: "A unit cannot bring in more outdoor air than it moves; the mixing balance has \
                  no solution.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h }\nahu a {\n  serves office\n  outdoor_air 5_000 cfm\n}\n",
            fix: "Reduce the outdoor air, or declare the unit a dedicated outdoor-air unit \
                  (`outdoor_air 100 %`).",
            source: "Physics: conservation of mass at the mixing box (methods.md §4a).",
        },
    },
    Check {
        code: "coil-not-cooling",
        severity: Severity::Error,
        summary: "The air entering the coil is not warmer than the air leaving it.",
        group: Group::Engine,
        adjustable: false,
        doc: Doc {
            what: "A coil whose entering dry bulb is at or below its leaving dry bulb, as \
                   happens with a 100 % outdoor-air unit on a cool design day.",
            why: "The coil does no cooling: its line in the psychrometric chart has no slope \
                  and there is no coil load to size.",
            example: "site { cooling 50 °F db, 45 °F wb }\nzone office { sensible 12 kBtu/h }\nahu a {\n  serves office\n  supply_temp 55 °F\n  outdoor_air 100 %\n}\n",
            fix: "Check the outdoor design state and the supply temperature; a unit that must \
                  heat its outdoor air is outside what Plenum computes.",
            source: "Physics: the cooling-coil energy balance (ASHRAE Handbook—HVAC Systems and \
                     Equipment, cooling coils chapter; from memory).",
        },
    },
    Check {
        code: "no-solution",
        severity: Severity::Error,
        summary: "The coil chain found no solution for an air handler.",
        group: Group::Engine,
        adjustable: false,
        doc: Doc {
            what: "A dead end of the chain: the coil line never meets the saturation curve (no \
                   apparatus dew point); a dry coil on a unit without outdoor air, whose \
                   room moisture has nowhere to go (no steady state); an iteration that did \
                   not converge within its bound; or a computed number that was not finite.",
            why: "The engine never reports a figure it could not compute; the unit is left out \
                  with this error instead.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 20 kBtu/h; latent 0 kBtu/h; indoor 75 °F, 30 %rh }\nahu a {\n  serves office\n  supply_temp 50 °F\n  outdoor_air 5 %\n  coil { leaving_rh 20 % }\n}\n",
            fix: "Check the air states of the unit: a leaving-coil RH far below the usual \
                  85–95 %, or states far outside the design range, are the usual causes.",
            source: "The project's methods (methods.md §4 step 10: the apparatus dew point is \
                     where the coil line meets saturation).",
        },
    },
    Check {
        code: "invalid-air-state",
        severity: Severity::Error,
        summary: "An air state outside the psychrometric domain.",
        group: Group::Engine,
        adjustable: false,
        doc: Doc {
            what: "A state point the psychrometric equations reject: above saturation, or a \
                   temperature outside −148…392 °F.",
            why: "No moist-air property can be computed for it, so the chain stops.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h; indoor 75 °F, 0.05 lb/lb }\nahu a { serves office }\n",
            fix: "Correct the air state; the message names the state point.",
            source: "ASHRAE Handbook—Fundamentals (2017), ch. 1: the psychrometric equations \
                     and their range.",
        },
    },
    // ---------------------------------------------------------------- results
    Check {
        code: "undersized-coil",
        severity: Severity::Error,
        summary: "The rated coil capacity is below the required load.",
        group: Group::Result,
        adjustable: true,
        doc: Doc {
            what: "An air handler whose rated (selected) total capacity is below the coil's \
                   total load, or whose rated sensible capacity (when given) is below the \
                   sensible load. The message names the unit, the required and the rated \
                   capacity in tons and Btu/h, and the margin (rated / required − 1). With a \
                   dehumidification design state the coil must meet both cases: it is \
                   reported once, at the case with the worst margin, which it names.",
            why: "An undersized coil cannot hold the rooms at their design state on a design \
                  day: the rooms run warm and humid. This is the finding a CI job must fail on \
                  when a revision adds load.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { area 1_000 ft²; people 5; use office; sensible 30 kBtu/h; latent 3 kBtu/h }\nahu a {\n  serves office\n  coil { rated 2 ton }\n}\n",
            fix: "Select a larger coil (and update `rated`), or reduce the load it serves. If \
                  the shortfall is accepted (a unit being replaced), suppress it for the \
                  block with the reason written down.",
            source: "The project's methods (methods.md §4 step 11, capacity check): the coil \
                     load is its energy balance, ASHRAE Handbook—HVAC Systems and Equipment, \
                     cooling coils chapter (from memory).",
        },
    },
    Check {
        code: "oversized-coil",
        severity: Severity::Warning,
        summary: "The rated coil capacity is more than 25 % above the required load.",
        group: Group::Result,
        adjustable: true,
        doc: Doc {
            what: "An air handler whose rated total capacity is more than 25 % above the coil \
                   load of its governing design case (the larger total). The message gives the \
                   required and rated capacity and the margin.",
            why: "An oversized coil satisfies the thermostat in short cycles and removes too \
                  little moisture at part load: rooms run humid, and the equipment costs more \
                  than it needs to.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { area 1_000 ft²; people 5; use office; sensible 20 kBtu/h; latent 2 kBtu/h }\nahu a {\n  serves office\n  coil { rated 10 ton }\n}\n",
            fix: "Select a coil closer to the load. If the margin is deliberate (future load), \
                  suppress the check for the block with that reason.",
            source: "*Common practice* (the 25 % threshold is a rule of thumb of the trade; \
                     methods.md §4 step 11).",
        },
    },
    Check {
        code: "ventilation-shortfall",
        severity: Severity::Error,
        summary: "The outdoor air is below the ASHRAE 62.1 minimum.",
        group: Group::Result,
        adjustable: true,
        doc: Doc {
            what: "An air handler whose outdoor airflow is below the minimum of the ventilation \
                   rate procedure: V_bz = R_p P_z + R_a A_z per zone, V_oz = V_bz / E_z, and \
                   the single-zone, 100 % outdoor-air or multiple-zone system requirement.",
            why: "Too little outdoor air leaves the occupants with too little dilution of \
                  indoor contaminants; mechanical codes adopt this minimum.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { area 1_000 ft²; people 20; use office; sensible 12 kBtu/h }\nahu a {\n  serves office\n  outdoor_air 50 cfm\n}\n",
            fix: "Raise the outdoor air to at least the required figure, or let the engine \
                  compute it (`outdoor_air ventilation`).",
            source: "ANSI/ASHRAE Standard 62.1-2019, ventilation rate procedure (written from \
                     memory of the 2016–2019 editions; the mechanical code in force governs).",
        },
    },
    Check {
        code: "room-humidity",
        severity: Severity::Warning,
        summary: "A zone's resulting RH is outside 40–60 % (an error above 65 %).",
        group: Group::Result,
        adjustable: true,
        doc: Doc {
            what: "The relative humidity a zone reaches with its own airflow and latent load, at \
                   its dry bulb: a warning outside the 40–60 % comfort band, an error above \
                   65 %. With a dehumidification design state it is reported once, at the case \
                   with the higher humidity, which it names.",
            why: "Above 60 % rooms feel clammy; above 65 % the humidity limit of the \
                  ventilation standard is exceeded and mould growth becomes a risk; below 40 % \
                  rooms feel dry.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone gym { area 1_000 ft²; people 40; use office; sensible 10 kBtu/h; latent 20 kBtu/h }\nahu a { serves gym }\n",
            fix: "Lower the supply temperature or the leaving-coil RH (a colder, drier coil), \
                  reduce the latent load, or treat the outdoor air separately.",
            source: "*Common practice* for the 40–60 % band; ASHRAE 62.1 limits space RH to \
                     65 % at the dehumidification design condition (from memory; methods.md \
                     §5).",
        },
    },
    Check {
        code: "above-design-humidity",
        severity: Severity::Warning,
        summary: "A zone runs more humid than its indoor design state.",
        group: Group::Result,
        adjustable: true,
        doc: Doc {
            what: "A zone whose resulting humidity ratio is above the one of its indoor design \
                   state (by default 75 °F, 50 % RH), while its RH stays inside the comfort \
                   band (outside it, `room-humidity` reports it instead).",
            why: "The coil leaves the supply air too moist to hold the room at the state it was \
                  designed for; rooms with a tight humidity design (archives, labs) suffer \
                  first.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone meeting { area 700 ft²; people 36; use conference; sensible 14 kBtu/h; latent 7 kBtu/h }\nahu a { serves meeting }\n",
            fix: "Lower the leaving-coil state (supply temperature or `leaving_rh`), or relax \
                  the indoor design state if the result is acceptable.",
            source: "Physics: the moisture balance of the room, W_r = W_s + Q_l / (m h_g) \
                     (methods.md §4 step 6).",
        },
    },
    Check {
        code: "supply-dt-range",
        severity: Severity::Warning,
        summary: "A zone's supply ΔT is outside 10–25 °F.",
        group: Group::Result,
        adjustable: true,
        doc: Doc {
            what: "The difference between a served zone's indoor dry bulb and the supply \
                   temperature, outside 10–25 °F (5.6–13.9 K).",
            why: "A small ΔT needs a lot of air (big ducts and fan); a large one risks \
                  draughts, condensation on diffusers and a coil colder than chilled water \
                  can make.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h }\nahu a {\n  serves office\n  supply_temp 69 °F\n}\n",
            fix: "Choose a supply temperature 15–20 °F below the room (the default is 18 °F).",
            source: "*Common practice* (methods.md §5).",
        },
    },
    Check {
        code: "airflow-per-ton",
        severity: Severity::Warning,
        summary: "Supply airflow per ton of coil load outside 300–500 cfm/ton.",
        group: Group::Result,
        adjustable: true,
        doc: Doc {
            what: "The supply airflow divided by the coil load in tons, outside 300–500 cfm per \
                   ton (typical 350–450).",
            why: "Well below 300 cfm/ton the coil runs very cold and may freeze or over-dry; \
                  well above 500 it removes little moisture. Either often means a load or an \
                  airflow entered in the wrong unit.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h; latent 12 kBtu/h }\nahu a { serves office; outdoor_air 30 % }\n",
            fix: "Check the loads and the supply temperature; a high latent share or much \
                  outdoor air lowers the figure, a low one raises it.",
            source: "*Common practice* (methods.md §5).",
        },
    },
    Check {
        code: "leaving-rh",
        severity: Severity::Warning,
        summary: "The leaving-coil RH is below 85 %.",
        group: Group::Result,
        adjustable: true,
        doc: Doc {
            what: "A wet coil's leaving relative humidity below 85 %.",
            why: "Air leaving a wet cooling coil is close to saturation; a much lower figure \
                  assumes a drier supply than a coil delivers, so the room humidity comes out \
                  optimistic.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h; latent 2 kBtu/h }\nahu a {\n  serves office\n  coil { leaving_rh 75 % }\n}\n",
            fix: "Use 90–95 % (the default is 95 %) unless the coil's selection says otherwise.",
            source: "*Common practice* (methods.md §5).",
        },
    },
    Check {
        code: "coil-face-velocity",
        severity: Severity::Warning,
        summary: "The coil face velocity is above 500 fpm.",
        group: Group::Result,
        adjustable: true,
        doc: Doc {
            what: "Supply airflow divided by the coil's `face_area`, above 500 fpm (2.5 m/s).",
            why: "Above about 500 fpm condensate is carried off the fins into the unit and the \
                  duct.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 24 kBtu/h; latent 2 kBtu/h }\nahu a {\n  serves office\n  coil { face_area 1 ft² }\n}\n",
            fix: "Select a coil with a larger face area.",
            source: "*Common practice* (methods.md §5: condensate carry-over).",
        },
    },
    Check {
        code: "coil-cannot-dehumidify",
        severity: Severity::Error,
        summary: "The leaving-coil dew point is not below the room's.",
        group: Group::Result,
        adjustable: true,
        doc: Doc {
            what: "A wet coil whose leaving air is not drier (in humidity ratio, so in dew \
                   point) than the indoor design state of a zone it serves: above it, or equal \
                   to it while the zone has a latent load. The message names the zones.",
            why: "Supply air that is not drier than the room cannot take up the room's \
                  moisture: the latent load is not met.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h; latent 4 kBtu/h; indoor 75 °F, 35 %rh }\nahu a {\n  serves office\n  supply_temp 65 °F\n  outdoor_air 50 %\n}\n",
            fix: "Lower the leaving-coil state (supply temperature, `leaving_rh`), or raise the \
                  room's design humidity if it allows.",
            source: "Physics: moisture moves from the room to the supply air only when the \
                     supply's humidity ratio (dew point) is lower (methods.md §5). Checked \
                     here against the zones' design states from the engine's results.",
        },
    },
    Check {
        code: "dry-coil",
        severity: Severity::Info,
        summary: "The coil runs dry: nothing condenses.",
        group: Group::Result,
        adjustable: true,
        doc: Doc {
            what: "A coil whose leaving air would be more humid than the entering air at the \
                   leaving RH, so it only cools: the supply keeps the entering humidity ratio.",
            why: "A dry coil removes no moisture, so the rooms' latent load is carried by the \
                  outdoor air alone; worth knowing when the rooms have a latent load.",
            example: "site { cooling 94 °F db, 60 °F wb }\nzone office { sensible 12 kBtu/h; latent 0.5 kBtu/h }\nahu a { serves office; outdoor_air 100 % }\n",
            fix: "Nothing, if the room humidity that results is acceptable.",
            source: "Physics (methods.md §4 step 10).",
        },
    },
    Check {
        code: "ventilation-area-missing",
        severity: Severity::Warning,
        summary: "A zone with a ventilation category that needs an area has none.",
        group: Group::Result,
        adjustable: true,
        doc: Doc {
            what: "A zone whose 62.1 category has an area rate R_a but which has no `area`: \
                   0 ft² is used, so the area part of its outdoor air is missing.",
            why: "The outdoor-air requirement comes out too low.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { people 5; use office; sensible 12 kBtu/h }\nahu a { serves office }\n",
            fix: "Give the zone its floor area.",
            source: "ANSI/ASHRAE Standard 62.1-2019, ventilation rate procedure: \
                     V_bz = R_p P_z + R_a A_z (from memory).",
        },
    },
    Check {
        code: "ignored-value",
        severity: Severity::Warning,
        summary: "A value is given but not used.",
        group: Group::Result,
        adjustable: true,
        doc: Doc {
            what: "A value the engine does not use because another one governs: an `elevation` \
                   beside a `pressure` (the pressure is used), or a `motor_efficiency` for a \
                   motor outside the air stream (the whole shaft power reaches the air).",
            why: "The file says something that has no effect; if it was meant to, the design \
                  is not what it looks like.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h }\nahu a {\n  serves office\n  fan { power 1 hp; motor outside; motor_efficiency 90 % }\n}\n",
            fix: "Remove the value that is not used, or the one that overrides it.",
            source: "The project's methods (methods.md §1 and §4 step 4).",
        },
    },
    Check {
        code: "assumption",
        severity: Severity::Info,
        summary: "A default was used where the design gives no value.",
        group: Group::Result,
        adjustable: true,
        doc: Doc {
            what: "Every default the engine applied: the key that was not given, the value \
                   used, what it applies to, and where the default comes from (*common \
                   practice*, a project default, or ASHRAE 62.1).",
            why: "A default is a decision the designer did not write down; a reviewer should \
                  see each one.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h }\nahu a { serves office }\n",
            fix: "Write the value into the design if the default is not right, or switch the \
                  note off in `plenum.toml` (`\"assumption\" = \"off\"`).",
            source: "The defaults of the project's methods (methods.md §3–§4), each marked \
                     there as *common practice*, a project default or from ASHRAE 62.1.",
        },
    },
    // --------------------------------------------------------------- settings
    Check {
        code: "invalid-config",
        severity: Severity::Error,
        summary: "`plenum.toml` cannot be read, or a setting has a wrong value.",
        group: Group::Settings,
        adjustable: false,
        doc: Doc {
            what: "A `plenum.toml` that is not valid TOML, a `[checks]` that is not a table, or \
                   a severity other than `error`, `warning`, `info` or `off`, or a severity \
                   set for a check that cannot be adjusted.",
            why: "A setting that cannot be read is not applied; the checker says so rather than \
                  guess.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h }\nahu a { serves office }\n# file: plenum.toml\n[checks]\n\"oversized-coil\" = \"loud\"\n",
            fix: "Write `[checks]` with `\"code\" = \"error\"|\"warning\"|\"info\"|\"off\"` \
                  lines.",
            source: "TOML 1.0; the checker's settings.",
        },
    },
    Check {
        code: "unknown-code",
        severity: Severity::Error,
        summary: "A check code in `plenum.toml` or a suppression that is not registered.",
        group: Group::Settings,
        adjustable: false,
        doc: Doc {
            what: "A code that names no check, with the nearest registered code suggested.",
            why: "A misspelt code silently fails to change what it was meant to change.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h }\n# plenum: allow oversize-coil -- selected for the future east wing\nahu a { serves office }\n",
            fix: "Correct the code (`plenum explain --list` lists them).",
            source: "The checker's settings.",
        },
    },
    Check {
        code: "invalid-suppression",
        severity: Severity::Error,
        summary: "A `# plenum:` comment that is not a valid suppression.",
        group: Group::Settings,
        adjustable: false,
        doc: Doc {
            what: "A comment starting `# plenum:` that is not `allow CODE[, CODE…] -- REASON`, \
                   that is not on its own line directly above a block (only other comments \
                   may stand between), or that names a check which cannot be suppressed.",
            why: "A suppression that does not apply where it was meant to leaves the finding \
                  in place, or worse, seems to silence something it does not.",
            example: "site { cooling 94 °F db, 75 °F wb }\n# plenum: allow unit-mismatch -- the value is right\nzone office { area 1_000 ft; sensible 12 kBtu/h }\nahu a { serves office }\n",
            fix: "Write `# plenum: allow CODE -- REASON` on the line directly above the block; \
                  errors that mean the design cannot be read are fixed, not suppressed.",
            source: "The checker's settings.",
        },
    },
    Check {
        code: "suppression-without-reason",
        severity: Severity::Error,
        summary: "A suppression without a written reason.",
        group: Group::Settings,
        adjustable: false,
        doc: Doc {
            what: "`# plenum: allow CODE` with no `-- REASON` after the codes, or an empty \
                   reason. Such a suppression does not take effect.",
            why: "A silenced finding is an engineering decision; the reason is the record of \
                  it for the reviewer and for the next revision.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { area 1_000 ft²; people 5; use office; sensible 20 kBtu/h; latent 2 kBtu/h }\n# plenum: allow oversized-coil\nahu a {\n  serves office\n  coil { rated 10 ton }\n}\n",
            fix: "Add the reason: `# plenum: allow oversized-coil -- selected for the future \
                  east wing`.",
            source: "The checker's settings (*common practice* of code review: a waived \
                     finding carries its justification).",
        },
    },
    Check {
        code: "unused-suppression",
        severity: Severity::Warning,
        summary: "A suppression that silences nothing.",
        group: Group::Settings,
        adjustable: true,
        doc: Doc {
            what: "A `# plenum: allow CODE -- REASON` comment above a block in which no \
                   diagnostic with that code was found. The syntax: a comment line of its \
                   own, directly above the block it applies to (other comment lines may stand \
                   between), naming one or more codes separated by commas, then `--` and the \
                   reason. It silences those codes for diagnostics located inside that block \
                   (nested blocks included).",
            why: "A revision fixed the finding, or the code was never there: the stale comment \
                  would silently hide the finding if it came back.",
            example: "site { cooling 94 °F db, 75 °F wb }\nzone office { sensible 12 kBtu/h }\n# plenum: allow oversized-coil -- selected for the future east wing\nahu a { serves office }\n",
            fix: "Delete the comment (a fix is offered).",
            source: "The checker's settings.",
        },
    },
];

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn codes_are_unique_kebab_case() {
        let mut seen = std::collections::HashSet::new();
        for c in CHECKS {
            assert!(seen.insert(c.code), "{} registered twice", c.code);
            assert!(
                c.code
                    .chars()
                    .all(|ch| ch.is_ascii_lowercase() || ch.is_ascii_digit() || ch == '-')
                    && !c.code.starts_with('-')
                    && !c.code.ends_with('-')
                    && !c.code.contains("--"),
                "{} is not kebab-case",
                c.code
            );
        }
    }

    #[test]
    fn suggest_finds_misspellings() {
        assert_eq!(suggest("oversize-coil"), Some("oversized-coil"));
        assert_eq!(suggest("undersized-coils"), Some("undersized-coil"));
        assert_eq!(suggest("zzzzzzzzzzzzzzzzzz"), None);
    }
}
