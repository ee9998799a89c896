/**
 * Tree-sitter grammar for the parax notation, version 1.
 *
 * The reference is grammar/parax.pest (authoritative for syntax) and
 * docs/notation.md. A file is a sequence of lines: a block header at column 0,
 * an indented statement, or a comment-only / blank line. White space is explicit
 * (no `extras`) because indentation decides between a header and a statement.
 *
 * Like the pest grammar, this one knows the block kinds and the shape of values
 * (numbers with units, text, dates, words, the axis sign, separators), not which
 * keywords a block accepts: that is the evaluator's business. Lines are kept flat
 * (no block nodes); grouping into blocks, folding and the outline come from the
 * language server.
 *
 * Where tree-sitter's longest-match lexing differs from pest's ordered choice,
 * the tokens below are shaped so that both read the same text the same way:
 * `x10` is the axis sign and 10 (a word cannot start with `x` followed by a
 * digit), `12 mmHg` is a number and the word `mmHg`, `12 mm` a quantity.
 * Known differences, on malformed values only, come from pest's look-ahead
 * (`!word_char`), which tokens here cannot express: a date glued to a digit or
 * letter (`2026-11-180`), and `°`, `%` or `×` glued to one (`0%2`, `×x`).
 * tests/agreement.rs checks everything else on generated files.
 */

// Characters that may follow the first character of a word (pest: word_char).
const WORD_REST = /[\p{L}0-9_.'\-]*/;

module.exports = grammar({
  name: 'parax',

  // Indentation is meaning: no implicit white space.
  extras: _ => [],

  // Units and block kinds are read as a whole word first and only then compared
  // with the fixed spellings, as pest's `!word_char` guards do: `mmHg` is a word,
  // not the unit `mm` and `Hg`; `eyeball` at column 0 is not the block kind `eye`.
  word: $ => $.word,

  // After a number, white space may lead to its unit or to the next value;
  // after a value, white space may lead to another value or end the line.
  conflicts: $ => [[$.quantity], [$._values]],

  rules: {
    // Comment and blank lines may come first; a statement needs a block header
    // above it (pest reports one before the first header, P0003).
    source_file: $ => seq(
      repeat(seq(optional($._trivia), $._newline)),
      optional(choice(
        $._trivia,
        seq($.header, repeat(seq($._newline, optional($._line)))),
      )),
    ),

    _line: $ => choice($.header, $.statement, $._trivia),

    // A line break: `\n`, `\r\n` or a lone `\r`, as in pest and the Language
    // Server Protocol; every other separator is an ordinary character.
    _newline: _ => /\r?\n|\r/,

    // Spaces and tabs.
    _ws: _ => /[ \t]+/,

    // A blank or comment-only line, at any indentation.
    _trivia: $ => choice(seq($._ws, optional($.comment)), $.comment),

    /** A block header at column 0: `eye right 2026-04-17`. */
    header: $ => seq(
      $.block_kind,
      optional($._values),
      optional($._ws),
      optional($.comment),
    ),

    /** An indented statement: `  refraction -4.50 / -1.25 x 10 @ 12 mm`. */
    statement: $ => seq(
      alias($._ws, $.indent),
      $.keyword,
      optional($._values),
      optional($._ws),
      optional($.comment),
    ),

    // To the line break.
    comment: _ => token(seq('#', /[^\r\n]*/)),

    block_kind: _ => choice(
      'case', 'eye', 'frame', 'spectacle-lens', 'contact-lens', 'system', 'model-eye',
    ),

    keyword: _ => /[A-Za-z][A-Za-z0-9_\-]*/,

    // The first value follows white space; between values it is optional.
    _values: $ => seq($._ws, $._value, repeat(seq(optional($._ws), $._value))),

    _value: $ => choice($.date, $.quantity, $.string, $.axis_sign, $.symbol, $.word),

    date: _ => /[0-9]{4}-[0-9]{2}-[0-9]{2}/,

    /** A number with an optional unit, with or without white space between. */
    // White space after a number may lead to its unit or to the next value; the
    // parser keeps both readings until the next token, and the unit wins where both
    // parse (`7.70 mm × 170`), as in pest, which tries the unit first.
    quantity: $ => choice(
      $.number,
      prec.dynamic(1, seq($.number, optional($._ws), $.unit)),
    ),

    // `−` (U+2212) is accepted as a minus sign.
    number: _ => /[+\-\u2212]?([0-9]+(\.[0-9]*)?|\.[0-9]+)/,

    // Spellings that are also words (`mm`, `D`, `Δ`) are found through `word`.
    unit: _ => choice('mm', 'cm', 'm', 'deg', 'DS', 'DC', 'D', 'prism', 'y', '°', 'Δ', '%'),

    // No line feed can stand inside, so every carriage return inside is a lone
    // one, which pest reads as text (and as the character after a backslash).
    string: _ => /"([^"\\\r\n]|\\[^\r\n])*"/,

    /** The axis sign of a cylinder, `x` or `×`, written before the axis. */
    axis_sign: _ => choice('x', '×'),

    symbol: _ => choice('/', ',', '@', '±', '+/-'),

    // A letter or `_`, then word characters. A word starting with `x` needs an
    // ASCII letter, `_` or `-` next, otherwise the `x` is the axis sign (pest:
    // axis_sign = ("x" | "×") ~ !(ASCII_ALPHA | "_" | "-")).
    word: _ => token(choice(
      seq(/[\p{L}_&&[^x]]/, WORD_REST),
      seq('x', /[A-Za-z_\-]/, WORD_REST),
    )),
  },
});
