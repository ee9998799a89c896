//! Every diagnostic code, with a title and a description, in one table. Codes are
//! stable: a code once published keeps its meaning. docs/diagnostics.md is checked
//! against this table by a test.

/// One entry of the code table.
#[derive(Debug, Clone, Copy, PartialEq, Eq, serde::Serialize)]
pub struct CodeInfo {
    /// The code.
    pub code: &'static str,
    /// Short title.
    pub title: &'static str,
    /// What it means and what to do.
    pub description: &'static str,
}

macro_rules! codes {
    ($($name:ident = $code:literal, $title:literal, $desc:literal;)*) => {
        $(#[doc = $title] pub const $name: &str = $code;)*
        /// Every code with its title and description, in code order.
        pub const ALL: &[CodeInfo] = &[$(CodeInfo { code: $code, title: $title, description: $desc }),*];
    };
}

codes! {
    UNEXPECTED = "P0001", "unreadable line", "The grammar cannot read this line: a character or token that no value can start with.";
    UNKNOWN_BLOCK = "P0002", "unknown block", "A line at column 0 must open a block (case, eye, frame, spectacle-lens, contact-lens, system, model-eye).";
    OUTSIDE_BLOCK = "P0003", "statement outside a block", "An indented statement stands before the first block header.";
    UNTERMINATED_STRING = "P0004", "unterminated text", "A quoted text has no closing quote on its line.";
    TOO_LARGE = "P0005", "file too large", "The file is 4 GiB or larger; parax reads files under 4 GiB (byte positions are 32-bit) and reads nothing of this one.";
    UNKNOWN_KEYWORD = "P0101", "unknown keyword", "The block does not accept this keyword; the hint names the closest one it does.";
    BAD_VALUES = "P0102", "values do not fit", "The values after the keyword do not have the shape the keyword takes (see docs/notation.md).";
    DUPLICATE = "P0103", "repeated statement", "A keyword that may appear once per block appears again; the later one is ignored.";
    BAD_HEADER = "P0104", "incomplete block header", "The block header lacks its side or name, or has one that is not allowed.";
    NOT_EVALUATED = "P0105", "not evaluated yet", "The statement is valid notation, but this version of parax does not compute anything from it yet.";
    MISSING_UNIT = "P0201", "missing unit", "A physical quantity is written without its unit; the fix adds the usual one.";
    WRONG_UNIT = "P0202", "wrong unit", "The unit does not measure the quantity the keyword takes (a length where a power is needed, say).";
    IMPLAUSIBLE = "P0203", "implausible value", "The value is outside the range met in practice; the message names the range. Often a unit slip.";
    BAD_AXIS = "P0204", "axis out of range", "Axes are written 1 to 180 degrees (ISO 8429); 0 is written 180.";
    REFRACTIVE_SURGERY = "P0301", "keratometry after refractive surgery", "Keratometric corneal power is not valid after corneal refractive surgery.";
    VERTEX_UNKNOWN = "P0302", "vertex distance not recorded", "The refraction is strong enough that the vertex distance matters, but it is not recorded.";
    VERTEX_MATTERS = "P0303", "vertex compensation matters", "The power at the new vertex distance differs by at least 0.25 D from the power as measured.";
    EXPECT_MISMATCH = "P0401", "recorded result differs", "An `expect` line records a value that the computed value does not match within tolerance.";
    EXPECT_UNKNOWN = "P0402", "unknown expected value", "An `expect` line names a value the block does not compute.";
    EXPECT_UNAVAILABLE = "P0403", "expected value not computed", "An `expect` line names a value that could not be computed from this block's inputs.";
    SYSTEM_LAYOUT = "P0501", "system layout", "A lens system refers to an unknown lens, or its object or elements are out of order.";
    TILT_CHANGES_POWER = "P0601", "tilt changes the power", "The lens as worn in this frame's tilt differs by 0.12 D or more in some meridian from the power ordered; the compensated power is the one to consider ordering.";
    VERTICAL_IMBALANCE = "P0602", "vertical prism imbalance", "The vertical prism difference between the eyes at the reading point exceeds about 1Δ; above about 1.5Δ slab-off may be worth considering.";
    HORIZONTAL_PRISM = "P0603", "horizontal prism", "The net horizontal prism from decentration exceeds about 3Δ.";
    THIN_LENS = "P0604", "below material minimum", "A recorded thickness is below the usual minimum for the material (minus centre, or plus edge).";
    OUT_OF_TOLERANCE = "P0605", "lens out of tolerance", "The measured lens differs from the order (power, add or prism) by more than ANSI Z80.1-2015 allows for that component; the message shows the allowed band.";
    RESIDUAL_ASTIGMATISM = "P0606", "residual astigmatism", "Under a spherical rigid lens the residual astigmatism is 0.75 D or more; a toric design may be needed.";
    ANISOMETROPIA = "P0607", "anisometropia", "The eyes differ by 2.00 D or more in spherical equivalent or a principal meridian; prism imbalance and aniseikonia deserve attention.";
    REFRACTION_CHANGE = "P0608", "refraction change between visits", "The refraction changed by 0.50 D or more per year (blur strength of the change, per year) between two dated visits.";
    INPUTS_INCOMPLETE = "P0609", "inputs incomplete", "A contact-lens or model-eye block lacks an input that its values need (a refraction with its vertex distance, keratometry, a schematic eye to start from, a surface that exists); the message names it.";
    IOL_CAUTION = "P0610", "intraocular lens power", "IOL powers were computed: biometry, constants and the choice of lens belong to the surgeon; a warning when refractive surgery is recorded, since neither formula is valid after it without adjustment, or when SRK/T's corneal height is undefined for the biometry.";
    BLANK_TOO_SMALL = "P0611", "blank too small", "The recorded blank diameter is smaller than the minimum blank size for the frame shape: effective diameter plus twice the decentration of the optical centre.";
    MATERIAL = "P0612", "lens material", "The material is not in the table of common materials (record its index), or the recorded index does not match the material named.";
    MOUNTED_IMBALANCE = "P0613", "mounted pair out of tolerance", "The prism imbalance of the received pair at the pupils (from the measured powers and the centre distance against the PDs) exceeds ANSI Z80.1-2015's mounted-pair tolerance; the message shows the band.";
    CONTACT_POWER_DIFFERS = "P0614", "contact lens power differs", "The contact lens power ordered differs by 0.25 D or more in some meridian from the power computed from the refraction (and tear lens).";
    CONTACT_DIAMETER = "P0615", "unusual contact lens diameter", "The total diameter is outside the usual range for the lens type (soft 13.0 to 15.0 mm, rigid corneal 8.0 to 10.5 mm); a plausibility check only.";
}
