//! Every diagnostic code in one table: per code its stable string (`P0101`…),
//! title, one-line description, default severity (and any other severity it may
//! be raised with, and when), and the explanation and example that
//! docs/diagnostics.md shows. The page is generated from this table (tests/docs.rs;
//! regenerate with `PARAX_BLESS=1 cargo test -p parax-tests --test docs`). Codes
//! are stable: a code once published keeps its meaning.

use crate::diagnostic::Severity;
use serde::{Serialize, Serializer};
use std::fmt;

/// One entry of the code table.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub struct CodeInfo {
    /// The code.
    pub code: Code,
    /// Short title.
    pub title: &'static str,
    /// What it means, in a sentence or two (SARIF's rule description).
    pub description: &'static str,
    /// The severity it is raised with, unless one of `also` applies.
    pub severity: Severity,
    /// When `severity` applies, where `also` names other cases (`for an unknown
    /// name`); may be empty.
    pub severity_when: &'static str,
    /// Other severities it is raised with, each with when (`for a system without
    /// a lens`); every severity a diagnostic of this code may carry is
    /// `severity` or one of these.
    pub also: &'static [(Severity, &'static str)],
    /// The explanation on the reference page (Markdown).
    pub about: &'static str,
    /// The example and what the hint or fix offers, on the reference page
    /// (Markdown; may be empty).
    pub example: &'static str,
}

impl Code {
    /// The code as written: `P0201`.
    pub fn as_str(self) -> &'static str {
        CODE_STRS[self as usize]
    }

    /// The table entry of this code.
    pub fn info(self) -> &'static CodeInfo {
        &ALL[self as usize]
    }

    /// Position of the code in [`ALL`] (the SARIF rule index).
    pub fn index(self) -> usize {
        self as usize
    }

    /// Short title, as `## P0201 missing unit` shows it.
    pub fn title(self) -> &'static str {
        self.info().title
    }

    /// The severity the code is raised with unless its table says otherwise.
    pub fn default_severity(self) -> Severity {
        self.info().severity
    }

    /// Whether a diagnostic of this code may carry `severity` (its default or
    /// one of the others its table entry names).
    pub fn allows(self, severity: Severity) -> bool {
        let info = self.info();
        info.severity == severity || info.also.iter().any(|(s, _)| *s == severity)
    }

    /// The code written `s` (`"P0201"`), if there is one.
    pub fn parse(s: &str) -> Option<Code> {
        CODE_STRS.iter().position(|c| *c == s).map(|i| ALL[i].code)
    }

    /// The code of a syntax error of `parax-syntax` (whose codes are strings,
    /// since that crate knows no diagnostics table); a test keeps the two in
    /// agreement, and an unknown one reads as [`UNEXPECTED`].
    pub fn of_syntax(code: &str) -> Code {
        Code::parse(code).unwrap_or(UNEXPECTED)
    }
}

impl fmt::Display for Code {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.as_str())
    }
}

impl Serialize for Code {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.serialize_str(self.as_str())
    }
}

impl PartialEq<str> for Code {
    fn eq(&self, other: &str) -> bool {
        self.as_str() == other
    }
}

impl PartialEq<&str> for Code {
    fn eq(&self, other: &&str) -> bool {
        self.as_str() == *other
    }
}

impl PartialEq<String> for Code {
    fn eq(&self, other: &String) -> bool {
        self.as_str() == other
    }
}

impl From<Code> for String {
    fn from(c: Code) -> String {
        c.as_str().to_owned()
    }
}

macro_rules! codes {
    ($($variant:ident / $name:ident = $code:literal, $sev:ident $($dwhen:literal)? $(or $alt:ident $when:literal)*,
        $title:literal, $desc:literal, about $about:literal, example $example:literal;)*) => {
        /// A diagnostic code; its table entry is [`Code::info`].
        #[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
        pub enum Code {
            $(#[doc = concat!("`", $code, "` ", $title)] $variant,)*
        }
        $(#[doc = concat!("`", $code, "` ", $title)] pub const $name: Code = Code::$variant;)*
        /// The code strings, in the order of [`ALL`].
        const CODE_STRS: &[&str] = &[$($code),*];
        /// Every code with its table entry, in code order.
        pub const ALL: &[CodeInfo] = &[$(CodeInfo {
            code: Code::$variant,
            title: $title,
            description: $desc,
            severity: Severity::$sev,
            severity_when: concat!("" $(, $dwhen)?),
            also: &[$((Severity::$alt, $when)),*],
            about: $about,
            example: $example,
        }),*];
    };
}

codes! {
    Unexpected / UNEXPECTED = "P0001", Error,
        "unreadable line",
        "The grammar cannot read this line: a character or token that no value can start with.",
        about r#"The grammar cannot read this line: it holds a character or token that no value
can start with (a `;`, a `$`, a no-break space, a byte-order mark at the start of
the file). Only this line is affected; every other line is still read."#,
        example r#"```
eye right
  add +1.50 ; +1.75
```

The message names the unexpected text, here the `;`. The hint recalls what a
line may hold: a keyword, then numbers with units, quoted text, dates, words, `/`,
`x` before an axis, `@` or `,`, and a comment after `#`. There is no automatic
fix."#;
    UnknownBlock / UNKNOWN_BLOCK = "P0002", Error,
        "unknown block",
        "A line at column 0 must open a block (case, eye, frame, spectacle-lens, contact-lens, system, model-eye).",
        about r#"A line at column 0 must open a block, with one of the block kinds `case`, `eye`,
`frame`, `spectacle-lens`, `contact-lens`, `system` or `model-eye`. This line
starts at column 0 with something else."#,
        example r#"```
eys right
  refraction -2.25 / -0.50 x 95 @ 12 mm
```

When the first word is close to a block kind, the hint asks "did you mean `eye`?"
and the fix replaces the word. When it is not (often a statement that lost its
indentation, such as `refraction -2.25` at column 0), the hint lists the block
kinds and reminds that statements are indented. The indented lines below the
unreadable line are not evaluated and not reported again."#;
    OutsideBlock / OUTSIDE_BLOCK = "P0003", Error,
        "statement outside a block",
        "An indented statement stands before the first block header.",
        about r#"An indented statement stands before the first block header, so it belongs to no
block."#,
        example r#"```
  date 2026-04-17
case "Harbour Lane demo 027"
```

The hint suggests putting the statement under a block header (such as
`eye right` or `case "…"`), or removing its indentation if the line was meant to
open a block. There is no automatic fix."#;
    UnterminatedString / UNTERMINATED_STRING = "P0004", Error,
        "unterminated text",
        "A quoted text has no closing quote on its line.",
        about r#"A quoted text has no closing quote on its line. Text cannot continue on the next
line."#,
        example r#"```
case "Harbour Lane demo 027"
  note "asked for a second pair for the workshop
```

The diagnostic covers the text from its opening quote to the end of the line. The
hint asks to end the text with `"` before the end of the line. A double quote
inside a text is written `\"`."#;
    TooLarge / TOO_LARGE = "P0005", Error,
        "file too large",
        "The file is 4 GiB or larger; parax reads files under 4 GiB (byte positions are 32-bit) and reads nothing of this one.",
        about r#"The file is 4 GiB or larger. parax keeps byte positions as 32-bit numbers (a
large case file holds millions of them), so it reads files under 4 GiB and reads
nothing of a larger one: `parax check` and the other commands report the file
and its size and go on with the other files; `parax fmt` leaves it unchanged."#,
        example r#"The hint asks to split the case file into smaller files. There is no automatic
fix."#;
    UnknownKeyword / UNKNOWN_KEYWORD = "P0101", Error,
        "unknown keyword",
        "The block does not accept this keyword; the hint names the closest one it does.",
        about r#"The block does not accept this keyword. The statement is skipped and the rest of
the block is read."#,
        example r#"```
eye right
  refracton -2.25 / -0.50 x 95 @ 12 mm
```

When a keyword of the block is close, the hint asks "did you mean
`refraction`?" and the fix replaces the keyword. When the keyword belongs to
another kind of block (`vertex 12 mm` written in an `eye` block), the hint names
that block (`` `vertex` belongs in a `frame` block ``). Otherwise the hint lists
every keyword the block takes."#;
    BadValues / BAD_VALUES = "P0102", Error,
        "values do not fit",
        "The values after the keyword do not have the shape the keyword takes (see docs/notation.md).",
        about r#"The values after the keyword do not have the shape the keyword takes: a value is
missing, is of the wrong kind, or is left over at the end, or a date is not a
calendar date. Each keyword's form is in the tables of
[notation.md](notation.md). One statement gets at most one such diagnostic."#,
        example r#"```
eye right
  refraction -2.25 / -0.50 95 @ 12 mm
  keratometry 7.81 mm x 95, 7.64 mm
```

In the first line the axis sign is missing before `95`; in the second, the second
reading lacks `x` and its meridian. The hint gives the form the keyword takes,
for example `` `refraction` takes: SPHERE [/ CYLINDER x AXIS] [@ VERTEX mm] ``.
Where the value is one word from a fixed list and the written word is close to
one of them, the hint asks "did you mean …?" and the fix replaces it."#;
    Duplicate / DUPLICATE = "P0103", Warning,
        "repeated statement",
        "A keyword that may appear once per block appears again; the later one is ignored.",
        about r#"A keyword that may appear only once per block appears again. The later statement
is ignored; the first one counts."#,
        example r#"```
eye right
  add +1.50
  add +1.75
```

The hint suggests keeping one, or recording a later visit as a block of its own
(`eye right 2026-09-30`). There is no automatic fix, since only the author knows
which line is right."#;
    BadHeader / BAD_HEADER = "P0104", Error,
        "incomplete block header",
        "The block header lacks its side or name, or has one that is not allowed.",
        about r#"The block header lacks the side or the name its kind requires, or has one that is
not allowed. `eye`, `spectacle-lens` and `contact-lens` take `right` or `left`;
`system` and `model-eye` take a name in quotes; `case` and `frame` may take a
title or name in quotes; an `eye` header may end with a date."#,
        example r#"```
system
  lens A +5.00 D
```

The hint gives the form the header takes (`system "NAME"`). Where a side is
misspelt (`eye rihgt`), the hint asks "did you mean `right`?" and the fix
replaces the word."#;
    NotEvaluated / NOT_EVALUATED = "P0105", Info,
        "not evaluated yet",
        "The statement is valid notation, but this version of parax does not compute anything from it yet.",
        about r#"The statement is valid notation, but this version of parax computes nothing from
it yet. Every block kind is now evaluated, so this version no longer reports the
code; the code keeps its meaning. The keywords that are read but not yet used
are marked "no" in the "Evaluated" column of [notation.md](notation.md)."#,
        example "";
    MissingUnit / MISSING_UNIT = "P0201", Error,
        "missing unit",
        "A physical quantity is written without its unit; the fix adds the usual one.",
        about r#"A physical quantity is written without its unit where the trade writes one.
Bare numbers are accepted only for refraction sphere and cylinder, axes and
meridians, the reading addition, refractive indices and the base curve of a
spectacle lens (see "Units and bare numbers" in [notation.md](notation.md))."#,
        example r#"```
frame "metal full-rim"
  vertex 12
```

The hint says that every physical quantity carries its unit and names the usual
one. The fix adds it after the number: `vertex 12` becomes `vertex 12 mm`."#;
    WrongUnit / WRONG_UNIT = "P0202", Error,
        "wrong unit",
        "The unit does not measure the quantity the keyword takes (a length where a power is needed, say).",
        about r#"The unit does not measure the quantity the keyword takes (a length where a power
is needed, say), or is a spelling the notation does not know (`%`), or a unit is
written on a plain number such as a refractive index."#,
        example r#"```
eye right
  add +1.50 mm
  keratometric-index 1.3375 D
```

For the first line, the message says that `mm` measures a length while the
reading addition is a power; the fix replaces the unit with the usual one (`D`).
For the second, the message says that a refractive index has no unit; the fix
removes the unit."#;
    Implausible / IMPLAUSIBLE = "P0203", Warning,
        "implausible value",
        "The value is outside the range met in practice; the message names the range. Often a unit slip.",
        about r#"The value is outside the range met in practice for its quantity; the message
names the range. This is often a unit slip or a slipped decimal point. The ranges
are listed per keyword in [notation.md](notation.md)."#,
        example r#"```
eye right
  axial-length 23.6 cm
  keratometry 78.1 mm x 95, 7.64 mm x 5
```

For the first line, `23.6 mm` is plausible: the hint asks "did you mean
23.6 mm?" and the fix replaces the unit. For the second, no other unit makes
78.1 plausible but a shifted decimal point does: the hint asks "did you mean
7.81 mm?", with no automatic fix. The value is still used as written."#;
    BadAxis / BAD_AXIS = "P0204", Error "for an axis above 180 or below 0" or Info "for an axis of 0, which is read as 180",
        "axis out of range",
        "Axes are written 1 to 180 degrees (ISO 8429); 0 is written 180.",
        about r#"Axes and meridians are written from 1 to 180 degrees (ISO 8429); 0 is written
180."#,
        example r#"```
eye right
  refraction -2.25 / -0.50 x 275 @ 12 mm
eye left
  refraction -1.75 / -0.75 x 0 @ 12 mm
```

For an axis between 181 and 360, the hint gives the same meridian within range
and the fix writes it (`x 275` becomes `x 95`). For an axis of 0, the fix writes
180."#;
    RefractiveSurgery / REFRACTIVE_SURGERY = "P0301", Warning,
        "keratometry after refractive surgery",
        "Keratometric corneal power is not valid after corneal refractive surgery.",
        about r#"Keratometric corneal power is not valid after corneal refractive surgery: the
keratometric index assumes a relation between the front and back corneal
surfaces that surgery changes. The eye block records a refractive-surgery history
and a keratometry reading."#,
        example r#"The diagnostic carries a clinical caution.

```
eye left
  refractive-surgery "myopic laser surgery, 2019"
  keratometry 7.95 mm x 10, 7.88 mm x 100
```

The diagnostic stands on the keratometry line. The hint repeats the recorded
history and advises a method validated after surgery; the keratometric values the
tools show carry the same caution. There is no fix: the values are still
computed, with the caution."#;
    VertexUnknown / VERTEX_UNKNOWN = "P0302", Warning,
        "vertex distance not recorded",
        "The refraction is strong enough that the vertex distance matters, but it is not recorded.",
        about r#"The refraction is strong enough that the vertex distance matters (a principal
meridian above 4.00 D in magnitude), but it is not recorded, so no value at the
corneal plane or at another vertex distance can be computed."#,
        example r#"The diagnostic carries a clinical caution.

```
eye right
  refraction -6.50 / -0.75 x 15
```

The hint asks to add `@ VERTEX mm` with the vertex distance at which the
refraction was measured (`refraction -6.50 / -0.75 x 15 @ 12 mm`)."#;
    VertexMatters / VERTEX_MATTERS = "P0303", Info,
        "vertex compensation matters",
        "The power at the new vertex distance differs by at least 0.25 D from the power as measured.",
        about r#"The power at the new vertex distance (the corneal plane, or a frame's vertex
distance) differs from the power as measured by enough to change the prescription
in 0.25 D steps: a principal meridian is above 4.00 D in magnitude and changes by
0.125 D or more."#,
        example r#"The diagnostic carries a clinical caution.

```
eye right
  refraction -6.50 / -0.75 x 15 @ 12 mm
```

The message gives the compensated power rounded to 0.25 D steps and the largest
change in a principal meridian. The hint notes that above about 4 D the vertex
distance changes the effective power. Nothing needs fixing; the note is there to
be read."#;
    ExpectMismatch / EXPECT_MISMATCH = "P0401", Error,
        "recorded result differs",
        "An `expect` line records a value that the computed value does not match within tolerance.",
        about r#"An `expect` line records a value that the computed value does not match within
tolerance (the default tolerance is half a step of the last written digit; see
"Recorded results" in [notation.md](notation.md)). This is how a case under
version control fails its check when a measurement changes and the recorded
result was not updated."#,
        example r#"```
system "two-lens bench check"
  object 40 cm before A
  lens A +5.00 D
  gap 20 cm
  lens B +10.00 D
  expect image 7.1 cm after B
```

The computed image is 6.67 cm after `B`. The message gives the computed value
next to the recorded one and says which part differs and by how much. The hint
asks to update the recorded result if an input changed, and to check the inputs
otherwise; the fix replaces the recorded value with the computed one as displayed
(`6.67 cm after B`). Apply it only once the new value is known to be right."#;
    ExpectUnknown / EXPECT_UNKNOWN = "P0402", Error,
        "unknown expected value",
        "An `expect` line names a value the block does not compute.",
        about r#"An `expect` line names a value that the block does not compute: the name is not
the last part of any key of this kind of block."#,
        example r#"```
eye right
  refraction -5.25 / -1.50 x 170 @ 13 mm
  expect spherical-equivalnet -6.00
```

When a name the block computes is close, the hint asks "did you mean
`spherical-equivalent`?" and the fix replaces the name; otherwise the hint lists
the values the block computes. The names are listed under "Derived values and
their keys" in [notation.md](notation.md). The value itself is not checked until
the name is known."#;
    ExpectUnavailable / EXPECT_UNAVAILABLE = "P0403", Error,
        "expected value not computed",
        "An `expect` line names a value that could not be computed from this block's inputs.",
        about r#"An `expect` line names a value that could not be computed from this block's
inputs (a corneal-plane value of a refraction with no recorded vertex distance,
say), so the recorded result is not checked."#,
        example r#"```
eye right
  refraction -5.25 / -1.50 x 170
  expect corneal-plane -4.91 / -1.29 x 170
```

The refraction has no recorded vertex distance, so no corneal-plane value
exists: the hint asks to record the inputs the value needs, or to remove the
line."#;
    SystemLayout / SYSTEM_LAYOUT = "P0501", Error or Warning "for a system without a lens",
        "system layout",
        "A lens system refers to an unknown lens, or its object or elements are out of order.",
        about r#"A lens system refers to an unknown lens, or its object or elements are out of
order: a gap before the first lens, an `object` line measured to a lens other
than the first, an unknown or repeated lens label, or a system without a lens."#,
        example r#"```
system "two-lens bench check"
  object 40 cm before B
  lens A +5.00 D
  gap 20 cm
  lens B +10.00 D
```

The object distance is measured to the first lens, `A`: the fix replaces the
label (`measure from A`). A gap before the first lens gets the hint to remove it;
a system without a lens gets the hint to add `lens LABEL POWER D` lines."#;
    TiltChangesPower / TILT_CHANGES_POWER = "P0601", Info,
        "tilt changes the power",
        "The lens as worn in this frame's tilt differs by 0.12 D or more in some meridian from the power ordered; the compensated power is the one to consider ordering.",
        about r#"The lens as worn in the frame's pantoscopic tilt and face form (Martin's formula
for spheres, its power-matrix form for spherocylinders) differs by 0.12 D or more
in some meridian from the power ordered."#,
        example r#"```
frame
  pantoscopic-tilt 10 deg
spectacle-lens right
  power -5.50 / -0.75 x 180
```

The hint points to the `compensated` value: the power that gives the prescription
as worn. The caution says that ordering values are aids."#;
    VerticalImbalance / VERTICAL_IMBALANCE = "P0602", Warning,
        "vertical prism imbalance",
        "The vertical prism difference between the eyes at the reading point exceeds about 1Δ; above about 1.5Δ slab-off may be worth considering.",
        about r#"The vertical prism difference between the eyes at the reading point (Prentice's
rule with each lens's power matrix, the `reading-drop` below the optical centres)
exceeds about 1Δ; above about 1.5Δ the message adds that slab-off may be worth
considering."#,
        example r#"```
frame
  reading-drop 10 mm
spectacle-lens right
  power -5.50 / -0.75 x 180
spectacle-lens left
  power -2.25
```

The hint lists the usual options (a higher reading position, separate reading
glasses, contact lenses, slab-off), as common practice."#;
    HorizontalPrism / HORIZONTAL_PRISM = "P0603", Warning,
        "horizontal prism",
        "The net horizontal prism from decentration exceeds about 3Δ.",
        about r#"The net horizontal prism of the pair at the distance pupils, from the difference
between the frame's `centre-distance` and the eyes' `pd`, exceeds about 3Δ."#,
        example r#"```
frame
  centre-distance 72 mm
```

The hint asks to check the centre distance against the pupillary distances."#;
    ThinLens / THIN_LENS = "P0604", Warning,
        "below material minimum",
        "A recorded thickness is below the usual minimum for the material (minus centre, or plus edge).",
        about r#"A recorded `centre-thickness` of a minus lens, or `edge-thickness` of a plus lens,
is below the usual minimum for the material: minus centre 2.0 mm for index below
1.55, 1.5 mm above; plus edge 1.0 mm (common practice)."#,
        example r#"```
spectacle-lens right
  power -4.00
  index 1.5
  centre-thickness 1.2 mm
```

The hint says the minimums are common practice and to check with the laboratory."#;
    OutOfTolerance / OUT_OF_TOLERANCE = "P0605", Warning,
        "lens out of tolerance",
        "The measured lens differs from the order (power, add or prism) by more than ANSI Z80.1-2015 allows for that component; the message shows the allowed band.",
        about r#"A `measured` focimeter reading differs from the ordered `power` by more than ANSI
Z80.1-2015 allows for a component (sphere in the meridian of highest power,
cylinder, axis by cylinder power), a `measured-add` differs from the `add`
ordered by more than ±0.12 D (±0.18 D above 4.00 D), or a `measured-prism`
differs from the prism ordered by more than 0.33Δ. The message shows the measured value and the
allowed band."#,
        example r#"```
spectacle-lens left
  power -2.25
  measured -2.50
```

The hint says to re-measure and return the lens if the reading is confirmed."#;
    ResidualAstigmatism / RESIDUAL_ASTIGMATISM = "P0606", Info,
        "residual astigmatism",
        "Under a spherical rigid lens the residual astigmatism is 0.75 D or more; a toric design may be needed.",
        about r#"Under a spherical rigid contact lens, the residual astigmatism (refractive
cylinder at the corneal plane minus corneal cylinder, by power vectors) is 0.75 D
or more."#,
        example r#"```
contact-lens right
  kind rigid
  base-curve 7.80 mm
```

The hint suggests that a front-toric or bitoric design may be needed."#;
    Anisometropia / ANISOMETROPIA = "P0607", Info,
        "anisometropia",
        "The eyes differ by 2.00 D or more in spherical equivalent or a principal meridian; prism imbalance and aniseikonia deserve attention.",
        about r#"The two eyes of one visit differ by 2.00 D or more in spherical equivalent or in
the power of the horizontal or vertical meridian. Reported once, on the right eye."#,
        example r#"```
eye right
  refraction -5.50 / -0.75 x 180 @ 12 mm
eye left
  refraction -2.25 @ 12 mm
```

The hint points to the prism imbalance at the reading point and the aniseikonia
estimate of the spectacle lenses."#;
    RefractionChange / REFRACTION_CHANGE = "P0608", Info,
        "refraction change between visits",
        "The refraction changed by 0.50 D or more per year (blur strength of the change, per year) between two dated visits.",
        about r#"Between two dated visits of the same eye, the blur strength of the change of
power vectors, per year, is 0.50 D or more."#,
        example r#"```
eye right 2025-03-10
  refraction -2.50 / -1.25 x 180 @ 12 mm
eye right 2026-03-12
  refraction -3.00 / -1.50 x 180 @ 12 mm
```

The hint says that a change this fast deserves a clinical explanation."#;
    InputsIncomplete / INPUTS_INCOMPLETE = "P0609", Warning or Error "for a surface that does not exist",
        "inputs incomplete",
        "A contact-lens or model-eye block lacks an input that its values need (a refraction with its vertex distance, keratometry, a schematic eye to start from, a surface that exists); the message names it.",
        about r#"A `contact-lens` or `model-eye` block lacks an input its values need: a
refraction of the same eye with its vertex distance, keratometry and a base curve
for a rigid lens, a `from` line, or a surface override names a surface the
schematic eye does not have (an error in that case)."#,
        example r#"```
model-eye "study eye"
  axial-length 24 mm
```

The hint names what to add (here `from gullstrand`, `from le-grand` or `from
emsley`). A surface override beyond the schematic eye's surfaces is an error:

```
model-eye "reduced study eye"
  from emsley
  surface 2 radius 6 mm
```

The message says how many surfaces the eye has (the reduced eye has one)."#;
    IolCaution / IOL_CAUTION = "P0610", Info or Warning "after refractive surgery or with an undefined SRK/T corneal height",
        "intraocular lens power",
        "IOL powers were computed: biometry, constants and the choice of lens belong to the surgeon; a warning when refractive surgery is recorded, since neither formula is valid after it without adjustment, or when SRK/T's corneal height is undefined for the biometry.",
        about r#"Intraocular lens powers were computed for this eye (SRK/T, or the thin-lens
vergence formula with an effective lens position). An info note that the values
are aids for the surgeon; a warning when `refractive-surgery` is recorded, since
neither formula is valid after corneal refractive surgery without a validated
adjustment, and a warning when SRK/T's corneal height `r − √(r² − W²/4)` is
undefined because the computed corneal width `W` exceeds twice the corneal radius
(a long eye with a steep cornea, e.g. 31 mm with K 48 D): the SRK/T values are then
shown with `H = r`, outside the published formula."#,
        example r#"```
eye right
  axial-length 23.5 mm
  keratometry 44.00 D @ 180, 44.00 D @ 90
  iol-constant 118.4
```

The hint and caution say that biometry, lens constants and the choice of lens
belong to the surgeon. With a refractive-surgery history the note becomes a
warning:

```
eye right
  refractive-surgery "myopic laser surgery, 2019"
  axial-length 23.5 mm
  keratometry 44.00 D @ 180, 44.00 D @ 90
  iol-constant 118.4
```"#;
    BlankTooSmall / BLANK_TOO_SMALL = "P0611", Warning,
        "blank too small",
        "The recorded blank diameter is smaller than the minimum blank size for the frame shape: effective diameter plus twice the decentration of the optical centre.",
        about r#"The recorded `blank-diameter` is smaller than the minimum blank size the frame
shape needs: the effective diameter plus twice the decentration of the optical
centre from the boxed centre (common practice [CP]; laboratories often add about
2 mm for edging). The message gives both sizes."#,
        example r#"```
eye right
  pd 32 mm
frame
  centre-distance 64 mm
  boxed-lens-size 52 mm x 38 mm
  distance-between-lenses 18 mm
  effective-diameter 56 mm
spectacle-lens right
  power -4.00
  blank-diameter 60 mm
```

The hint suggests a larger blank or a check of the frame measurements."#;
    Material / MATERIAL = "P0612", Info "for a material not in the table" or Warning "for a recorded index that does not match the material named",
        "lens material",
        "The material is not in the table of common materials (record its index), or the recorded index does not match the material named.",
        about r#"The `material` of a spectacle lens is not in the table of common materials
(docs/notation.md, the `spectacle-lens` block), so record its `index`; or the
recorded `index` differs by more than 0.01 from the index of the material named
(the recorded index is used)."#,
        example r#"```
spectacle-lens right
  power -3.00
  material "1.67"
  index 1.5
```"#;
    MountedImbalance / MOUNTED_IMBALANCE = "P0613", Warning,
        "mounted pair out of tolerance",
        "The prism imbalance of the received pair at the pupils (from the measured powers and the centre distance against the PDs) exceeds ANSI Z80.1-2015's mounted-pair tolerance; the message shows the band.",
        about r#"The received pair, mounted, puts more unwanted prism before the eyes than ANSI
Z80.1-2015 allows: vertical imbalance over 0.33Δ (lenses up to 3.375 D in the
vertical meridian) or horizontal imbalance over 0.67Δ (up to 2.75 D in the
horizontal meridian; above that, a centre distance more than 2.5 mm from the
sum of the PDs, a figure quoted from memory [M]). The prism is found by
Prentice's rule from the measured powers at the frame's `centre-distance`
against each eye's `pd`, plus any measured prism beyond the prism ordered. The
message shows the allowed band."#,
        example r#"```
eye right
  pd 32 mm
eye left
  pd 32 mm
frame
  centre-distance 68 mm
spectacle-lens right
  power -2.00
  measured -2.00
spectacle-lens left
  power -2.00
  measured -2.00
```"#;
    ContactPowerDiffers / CONTACT_POWER_DIFFERS = "P0614", Warning,
        "contact lens power differs",
        "The contact lens power ordered differs by 0.25 D or more in some meridian from the power computed from the refraction (and tear lens).",
        about r#"The contact lens `power` ordered differs by 0.25 D or more in some meridian from
the power computed from the refraction at the corneal plane (a soft lens: the
spherical equivalent or the toric suggestion, unrounded; a rigid lens: the power
after the tear lens). The derived value `power-difference` gives the size."#,
        example r#"```
eye right
  refraction -5.00 @ 12 mm
contact-lens right
  kind soft
  power -5.00
```

The hint asks to check the refraction, its vertex distance and the base curve."#;
    ContactDiameter / CONTACT_DIAMETER = "P0615", Info,
        "unusual contact lens diameter",
        "The total diameter is outside the usual range for the lens type (soft 13.0 to 15.0 mm, rigid corneal 8.0 to 10.5 mm); a plausibility check only.",
        about r#"The total `diameter` is outside the usual range for the lens type: soft 13.0 to
15.0 mm, rigid corneal 8.0 to 10.5 mm (common practice [CP]). A plausibility
check only: scleral and other special designs lie outside and are not judged."#,
        example r#"```
contact-lens left
  kind soft
  diameter 9.6 mm
```"#;
}
