//! The one error type of the statics crate, and the typed places a problem is about.
//!
//! Every problem names where it is (`Location`): a field of the design the user edits
//! (`Field`, a typed path such as `deck.level`), a node, member or load case of an
//! analysis model, or a part of the generated structure. A problem that several inputs
//! cause lists every design field it involves (`Problem::fields`), so a screen can show
//! the message beside each of them.

use crate::frame::model::Dof;
use serde::{Serialize, Serializer};
use std::fmt;
use thiserror::Error;

/// A member group of the design (its section and material), per rib line.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum GroupName {
    /// The rib.
    Rib,
    /// The deck girder (over the arch and the approach spans).
    Deck,
    /// Spandrel and end posts.
    Posts,
    /// Approach piers.
    Piers,
    /// Bracing diagonals.
    Bracing,
}

impl GroupName {
    /// Every group, in the order the design lists them.
    pub const ALL: [GroupName; 5] =
        [GroupName::Rib, GroupName::Deck, GroupName::Posts, GroupName::Piers, GroupName::Bracing];

    /// The name in a design file (`rib`, `deck`, `posts`, `piers`, `bracing`).
    pub fn key(self) -> &'static str {
        match self {
            GroupName::Rib => "rib",
            GroupName::Deck => "deck",
            GroupName::Posts => "posts",
            GroupName::Piers => "piers",
            GroupName::Bracing => "bracing",
        }
    }

    /// The group's name in words, as the Sections panel heads it (lower case): `rib`,
    /// `deck`, `posts`, `piers`, `bracing`.
    pub fn label(self) -> &'static str {
        // the panel's headings are the file keys, capitalised
        self.key()
    }
}

/// One property of a member group's section.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum SectionProperty {
    /// Young's modulus E.
    E,
    /// Area A.
    A,
    /// Second moment of area I.
    I,
    /// Section depth.
    Depth,
    /// Unit weight of the material.
    UnitWeight,
}

impl SectionProperty {
    /// The name in a design file (`e`, `a`, `i`, `depth`, `unit_weight`).
    pub fn key(self) -> &'static str {
        match self {
            SectionProperty::E => "e",
            SectionProperty::A => "a",
            SectionProperty::I => "i",
            SectionProperty::Depth => "depth",
            SectionProperty::UnitWeight => "unit_weight",
        }
    }

    /// The property's name as the Sections panel labels it: `E`, `A`, `I`, `depth`,
    /// `weight`.
    pub fn label(self) -> &'static str {
        match self {
            SectionProperty::E => "E",
            SectionProperty::A => "A",
            SectionProperty::I => "I",
            SectionProperty::Depth => "depth",
            SectionProperty::UnitWeight => "weight",
        }
    }
}

/// A field of the design a user edits: a typed path, written as in a design file
/// (`deck.level`, `valley[3]`, `groups.rib.e`).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Field {
    /// The design format version.
    Version,
    /// The ground profile as a whole.
    Valley,
    /// One ground point (0-based index).
    ValleyPoint(usize),
    /// Deck level.
    DeckLevel,
    /// x of the left abutment seat.
    LeftSeatX,
    /// x of the right abutment seat.
    RightSeatX,
    /// Deck width.
    DeckWidth,
    /// Number of ribs.
    Ribs,
    /// Deck dead load.
    DeadLoad,
    /// Surfacing load.
    Surfacing,
    /// Greatest depth of ground below the deck axis at an abutment seat.
    AbutmentHeight,
    /// Level of the left springing.
    SpringingLeftLevel,
    /// Level of the right springing.
    SpringingRightLevel,
    /// Number of arch panels.
    Panels,
    /// The crown given by its rise.
    CrownRise,
    /// The crown given by its level.
    CrownLevel,
    /// Shortest spandrel post.
    MinPostLength,
    /// Rib system.
    RibSystem,
    /// Bracing.
    Bracing,
    /// What the form is found for (panel loads or as built).
    FormBasis,
    /// Number of left approach piers.
    ApproachPiersLeft,
    /// Number of right approach piers.
    ApproachPiersRight,
    /// One property of a member group.
    Section(GroupName, SectionProperty),
    /// Form-finding tolerance.
    FormTolerance,
    /// Form-finding iteration limit.
    FormMaxIterations,
    /// Carriageway width.
    CarriagewayWidth,
    /// Rib positions across the deck.
    RibPositions,
    /// The traffic load model's values.
    LoadModel,
    /// The combinations of permanent actions and traffic.
    Combinations,
    /// The temperature actions (ranges, deck-rib difference, thermal coefficient).
    Temperature,
    /// The springing movement (spread, settlements).
    SpringingMovement,
    /// The live-load deflection limit.
    DeflectionLimit,
    /// How a member group is sized (family, material, buckling length factor; the rib's
    /// out-of-plane length).
    Sizing(GroupName),
    /// The deck's cross-section (slab, cross-girders, which deck weight counts).
    DeckCrossSection,
    /// The unit rates of the cost index.
    UnitRates,
    /// The ground and thrust-block inputs.
    Foundation,
}

impl Field {
    /// The field's path as written in a design file and in serialised problems
    /// (`deck.level`, `valley[3]` with a 0-based index, `groups.rib.e`). Stable: files,
    /// JSON output and tests match on it. Source: the design file format of this crate.
    pub fn path(&self) -> String {
        let path = match self {
            Field::Version => "version",
            Field::Valley => "valley",
            Field::ValleyPoint(i) => return format!("valley[{i}]"),
            Field::DeckLevel => "deck.level",
            Field::LeftSeatX => "deck.left_seat_x",
            Field::RightSeatX => "deck.right_seat_x",
            Field::DeckWidth => "deck.width",
            Field::Ribs => "deck.ribs",
            Field::DeadLoad => "deck.dead_load",
            Field::Surfacing => "deck.surfacing",
            Field::AbutmentHeight => "deck.abutment_height",
            Field::SpringingLeftLevel => "springing_left_level",
            Field::SpringingRightLevel => "springing_right_level",
            Field::Panels => "panels",
            Field::CrownRise => "crown.rise",
            Field::CrownLevel => "crown.level",
            Field::MinPostLength => "min_post_length",
            Field::RibSystem => "rib_system",
            Field::Bracing => "bracing",
            Field::FormBasis => "form.basis",
            Field::ApproachPiersLeft => "approach_piers_left",
            Field::ApproachPiersRight => "approach_piers_right",
            Field::Section(g, p) => return format!("groups.{}.{}", g.key(), p.key()),
            Field::FormTolerance => "form.tolerance",
            Field::FormMaxIterations => "form.max_iterations",
            Field::CarriagewayWidth => "traffic.carriageway_width",
            Field::RibPositions => "traffic.rib_positions",
            Field::LoadModel => "traffic.load_model",
            Field::Combinations => "traffic.combinations",
            Field::Temperature => "actions.temperature",
            Field::SpringingMovement => "actions.springing",
            Field::DeflectionLimit => "actions.deflection_limit",
            Field::Sizing(g) => return format!("sizing.{}", g.key()),
            Field::DeckCrossSection => "sizing.deck_section",
            Field::UnitRates => "sizing.rates",
            Field::Foundation => "sizing.foundation",
        };
        path.to_string()
    }

    /// The field's name in words, as the app's panels label it (lower case, to read inside
    /// a sentence): `deck level`, `left springing level`, `ground point 4` (1-based, as
    /// the Ground panel numbers its points), `rib section: E`. Fields no panel shows get a
    /// plain description (`abutment height`, `form-finding tolerance`). For people only:
    /// match on `path()` or on the `Field` itself, never on this text.
    pub fn label(&self) -> String {
        let label = match self {
            Field::Version => "design format version",
            Field::Valley => "ground",
            Field::ValleyPoint(i) => return format!("ground point {}", i.saturating_add(1)),
            Field::DeckLevel => "deck level",
            Field::LeftSeatX => "left seat x",
            Field::RightSeatX => "right seat x",
            Field::DeckWidth => "deck width",
            Field::Ribs => "ribs",
            Field::DeadLoad => "deck dead load",
            Field::Surfacing => "surfacing",
            Field::AbutmentHeight => "abutment height",
            Field::SpringingLeftLevel => "left springing level",
            Field::SpringingRightLevel => "right springing level",
            Field::Panels => "arch panels",
            Field::CrownRise => "rise",
            Field::CrownLevel => "crown level",
            Field::MinPostLength => "shortest post",
            Field::RibSystem => "rib",
            Field::Bracing => "spandrel bracing",
            Field::FormBasis => "form found for",
            Field::ApproachPiersLeft => "approach piers, left",
            Field::ApproachPiersRight => "approach piers, right",
            Field::Section(g, p) => return format!("{} section: {}", g.label(), p.label()),
            Field::FormTolerance => "form-finding tolerance",
            Field::FormMaxIterations => "form-finding iteration limit",
            Field::CarriagewayWidth => "carriageway width",
            Field::RibPositions => "rib positions",
            Field::LoadModel => "traffic load model",
            Field::Combinations => "combinations",
            Field::Temperature => "temperature",
            Field::SpringingMovement => "springing movement",
            Field::DeflectionLimit => "deflection limit",
            Field::Sizing(g) => return format!("{} sizing", g.label()),
            Field::DeckCrossSection => "deck cross-section",
            Field::UnitRates => "unit rates",
            Field::Foundation => "foundations",
        };
        label.to_string()
    }
}

/// The field's name in words (`label()`); the path of a file is `path()`.
impl fmt::Display for Field {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.label())
    }
}

/// A field serialises as its path (`"deck.level"`), so JSON output and files stay stable.
impl Serialize for Field {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.serialize_str(&self.path())
    }
}

/// Where a problem is.
#[derive(Debug, Clone, PartialEq)]
pub enum Location {
    /// A field of the design.
    Field(Field),
    /// A node of an analysis model.
    Node {
        /// 0-based index.
        index: usize,
        /// Its display name.
        name: String,
    },
    /// A member of an analysis model.
    Member {
        /// 0-based index.
        index: usize,
        /// Its display name.
        name: String,
    },
    /// A load case of an analysis model, by name.
    LoadCase(String),
    /// Another part of a model or of the generated structure, in words (for example
    /// `rib between x = 30.000 m and 41.000 m` or `supports`).
    Part(String),
}

impl Location {
    /// Where the problem is, as written in serialised problems: a design field's path
    /// (`deck.level`), otherwise the same words as `Display` (`node C`, `member r1`,
    /// `load case 'wind'`, a part in words). Match on this (or on the `Location` itself),
    /// not on the display text.
    pub fn path(&self) -> String {
        match self {
            Location::Field(field) => field.path(),
            other => other.to_string(),
        }
    }
}

/// Where the problem is, in words: a design field by its panel label (`deck level`), a
/// node, member or load case by its name, a part as described.
impl fmt::Display for Location {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Location::Field(field) => field.fmt(f),
            Location::Node { name, .. } => write!(f, "node {name}"),
            Location::Member { name, .. } => write!(f, "member {name}"),
            Location::LoadCase(name) => write!(f, "load case '{name}'"),
            Location::Part(what) => f.write_str(what),
        }
    }
}

/// A location serialises as its path (`"deck.level"`, `"node C"`), so JSON output stays
/// stable whatever the display wording.
impl Serialize for Location {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.serialize_str(&self.path())
    }
}

impl From<Field> for Location {
    fn from(field: Field) -> Location {
        Location::Field(field)
    }
}

impl From<&str> for Location {
    fn from(what: &str) -> Location {
        Location::Part(what.to_string())
    }
}

impl From<String> for Location {
    fn from(what: String) -> Location {
        Location::Part(what)
    }
}

/// One problem found in a model or design, with where it is and what to do.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Problem {
    /// What the problem is about.
    pub location: Location,
    /// Every design field the problem involves (the field of `location` first, when it is
    /// one): changing any of them may mend it. Empty for problems of an analysis model.
    #[serde(skip_serializing_if = "Vec::is_empty")]
    pub fields: Vec<Field>,
    /// What is wrong and how to fix it.
    pub message: String,
}

impl Problem {
    /// A problem at `location` (a design field is also listed in `fields`).
    pub fn new(location: impl Into<Location>, message: impl Into<String>) -> Problem {
        let location = location.into();
        let fields = match location {
            Location::Field(f) => vec![f],
            _ => Vec::new(),
        };
        Problem { location, fields, message: message.into() }
    }

    /// The same problem, also involving `more` design fields.
    pub fn involving(mut self, more: impl IntoIterator<Item = Field>) -> Problem {
        for f in more {
            if !self.fields.contains(&f) {
                self.fields.push(f);
            }
        }
        self
    }

    /// True when the problem involves design field `field`.
    pub fn involves(&self, field: Field) -> bool {
        self.fields.contains(&field)
    }
}

impl fmt::Display for Problem {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}: {}", self.location, self.message)
    }
}

/// What an iteration that did not converge was doing.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Iteration {
    /// Form finding: shape -> loads -> shape.
    FormFinding,
    /// Form finding on the "as built" basis: shape -> frame analysis -> loads -> shape.
    AsBuiltForm,
    /// The subspace iteration for the critical load factors of linear buckling.
    Buckling,
    /// The subspace iteration for the natural frequencies.
    Vibration,
}

impl fmt::Display for Iteration {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            Iteration::FormFinding => "form finding",
            Iteration::AsBuiltForm => "form finding on the as-built basis",
            Iteration::Buckling => "the search for the critical load factors",
            Iteration::Vibration => "the search for the natural frequencies",
        })
    }
}

/// Everything that can go wrong in the engine, with what the user can do about it.
#[derive(Debug, Clone, PartialEq, Error, Serialize)]
pub enum StaticsError {
    /// The input has problems; every problem found is listed. Reads `"the design has a
    /// problem: <label>: <message>"` or `"the design has 3 problems: ...; ..."`.
    #[error("{}", describe_problems(.0))]
    Invalid(Vec<Problem>),
    /// The structure can move without resistance (a mechanism), so it has no unique
    /// static solution.
    #[error(
        "the structure is a mechanism: node {node_label} can move {} without resistance; \
         add a support, a brace or remove a hinge there",
        .direction.describe()
    )]
    Mechanism {
        /// Index of a node that moves in the mechanism.
        node: usize,
        /// Its display name.
        node_label: String,
        /// The direction in which it moves most.
        direction: Dof,
        /// The mechanism mode found: displacement per free freedom (unit largest
        /// component), as (node, dof, value) triples.
        mode: Vec<(usize, Dof, f64)>,
    },
    /// An iteration did not converge.
    #[error("{what} did not converge in {iterations} iterations (last change {last_change:.3e}); {hint}")]
    NoConvergence {
        /// What was iterated.
        what: Iteration,
        /// Iterations used.
        iterations: usize,
        /// Size of the last change.
        last_change: f64,
        /// What to try.
        hint: String,
    },
    /// A load case has no critical load factor: no member it compresses can move
    /// sideways (every member in tension, or the compressed ones held along their
    /// length), so no multiple of it buckles the structure.
    #[error(
        "load case '{case}' compresses no member that can move sideways, so it has no critical load \
         factor: nothing buckles under it; check that its loads push the way they should (gravity is \
         negative y) or choose a case that compresses the arch"
    )]
    NoCompression {
        /// The load case's name.
        case: String,
    },
    /// A load case gives no mass to any freedom that can move, so the structure has no
    /// natural frequency to find.
    #[error(
        "load case '{case}' puts no weight on any node that can move, so there is no mass to vibrate; \
         choose the case with the structure's own weight (downward loads, kN)"
    )]
    NoMass {
        /// The load case's name.
        case: String,
    },
    /// A number of the model is beyond what floating point arithmetic can carry (for
    /// example E times A overflows): the model is not a mechanism, its numbers are out
    /// of range.
    #[error("{location}: {message}")]
    OutOfRange {
        /// Where the number is.
        location: Location,
        /// What is too large or too small, and what to do.
        message: String,
    },
    /// A permalink could not be opened; the kind says why.
    #[error("cannot read link: {0}")]
    Link(LinkError),
    /// A design file could not be read; the kind says why.
    #[error("cannot read design file: {0}")]
    DesignFile(DesignFileError),
}

/// The design format versions a reader takes, oldest to newest (both included).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub struct VersionRange {
    /// Oldest version read (older ones are updated step by step when read).
    pub oldest: u32,
    /// Newest version read: the one this engine writes.
    pub newest: u32,
}

impl fmt::Display for VersionRange {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if self.oldest == self.newest {
            write!(f, "{}", self.oldest)
        } else {
            write!(f, "{} to {}", self.oldest, self.newest)
        }
    }
}

/// Why a permalink could not be opened. Each message says what the user can do; it reads
/// after "cannot read link: ".
#[derive(Debug, Clone, PartialEq, Error, Serialize)]
pub enum LinkError {
    /// Longer than the reader looks at (refused before any work).
    #[error(
        "it is {length} characters long; links longer than {limit} are refused \
         (a design link is usually under 2,000)"
    )]
    TooLong {
        /// Length of the input, bytes.
        length: usize,
        /// Longest input read, bytes.
        limit: usize,
    },
    /// Nothing after the `#` (or nothing at all).
    #[error(
        "it holds no design: a design link ends in '#s', a format number, a dot and then \
         letters, digits, '-' and '_'; copy the whole link"
    )]
    Empty,
    /// Text that is not a Springline link.
    #[error(
        "it is not a Springline design link: after the '#' it should start with a format tag \
         ('s', a number and a dot)"
    )]
    NotALink,
    /// A link format this reader does not know (a newer one).
    #[error(
        "it uses link format '{tag}', which this version of Springline does not know \
         (it reads {}); open it with a newer version",
        .readable.join(", ")
    )]
    UnknownFormat {
        /// The format tag of the link.
        tag: String,
        /// The tags this reader knows.
        readable: &'static [&'static str],
    },
    /// A character outside base64url in the data.
    #[error(
        "character {position} of its data ('{character}') is not allowed there (only letters, \
         digits, '-' and '_'); was the link changed when copied?"
    )]
    BadCharacter {
        /// 1-based position in the data (after the format tag and its dot), in characters.
        position: usize,
        /// The character found.
        character: char,
    },
    /// The data stops before the compressed design ends.
    #[error("its data is cut short; copy the whole link")]
    CutShort,
    /// The data ends where no link can end (its length, or the spare bits of its last
    /// character): a cut, or characters added or changed at the end.
    #[error(
        "its data ends where no link can end: it was cut short or characters were added at \
         the end; copy the whole link"
    )]
    BrokenEnd,
    /// The checksum of the inflated design does not match.
    #[error("its data is damaged (checksum mismatch); copy the link again")]
    ChecksumMismatch,
    /// The compressed stream is not valid deflate.
    #[error("its data is damaged (not a valid compressed stream); copy the link again")]
    DamagedStream,
    /// Inflating would pass the cap (a deflate bomb, or not a design).
    #[error("it would expand beyond {limit} bytes, far more than any design needs; refused")]
    TooLargeInflated {
        /// Largest inflated payload accepted, bytes.
        limit: usize,
    },
    /// Data after the end of the compressed stream.
    #[error("it has extra data after the design; copy the link again without additions")]
    TrailingData,
    /// The inflated bytes are not a design of the link's format.
    #[error("its design data is damaged ({detail})")]
    DamagedDesign {
        /// What the binary reader found.
        detail: String,
    },
    /// Bytes left over after the design.
    #[error("its design data has {count} unexpected bytes at the end")]
    ExtraDesignBytes {
        /// How many.
        count: usize,
    },
    /// One tagged section of the design is damaged (unreadable, repeated, out of order or
    /// with bytes left over).
    #[error("its section {tag} is damaged ({detail}); copy the link again")]
    DamagedSection {
        /// The section's tag.
        tag: u32,
        /// What is wrong with it.
        detail: String,
    },
    /// A count too large for a usize of this machine (32-bit targets).
    #[error("its {what} ({value}) is too large for this machine")]
    TooLargeCount {
        /// Which count.
        what: &'static str,
        /// Its value.
        value: u64,
    },
    /// A section this reader does not know: a later version of Springline wrote it.
    #[error(
        "it was made by a newer version of Springline (it holds section {tag}, which this \
         one does not know); open it with a newer version"
    )]
    NewerSection {
        /// The section's tag.
        tag: u32,
    },
    /// A design format newer than this reader.
    #[error(
        "it was made by a newer version of Springline (design format {version}; this one \
         reads {readable}); open it with a newer version"
    )]
    NewerVersion {
        /// The design format version in the link.
        version: u64,
        /// The versions this reader takes.
        readable: VersionRange,
    },
    /// The design it holds fails validation; every problem is listed.
    #[error("the design it holds is not valid ({})", join(.0))]
    Invalid(Vec<Problem>),
    /// The design it holds cannot be used for another reason (for example form finding
    /// does not converge).
    #[error("the design it holds cannot be used: {0}")]
    Unusable(Box<StaticsError>),
    /// A comparison link where one design was expected.
    #[error(
        "it is a link to a comparison of design options, not to one design; open it in the \
         app, where it shows the options side by side"
    )]
    ComparisonNotDesign,
    /// A comparison holding no option, or more than the comparison shows.
    #[error("it holds {count} design options; a comparison holds 1 to {limit}")]
    OptionCount {
        /// How many options it holds.
        count: usize,
        /// Most options compared.
        limit: usize,
    },
    /// The comparison's open option is not one of its options.
    #[error("it opens option {open} of {count}, which it does not hold; copy the link again")]
    OpenOutOfRange {
        /// The 1-based option it names.
        open: usize,
        /// How many options it holds.
        count: usize,
    },
    /// An option's name is empty, too long or holds control characters.
    #[error("the name of option {index} {problem}")]
    OptionName {
        /// 1-based option number.
        index: usize,
        /// What is wrong with the name.
        problem: String,
    },
    /// One option's design cannot be opened.
    #[error("option {index} ('{name}'): {source}")]
    OptionDesign {
        /// 1-based option number.
        index: usize,
        /// The option's name.
        name: String,
        /// Why its design cannot be opened.
        source: Box<LinkError>,
    },
}

/// Why a design file could not be read. Each message says what the user can do; it
/// reads after "cannot read design file: ".
#[derive(Debug, Clone, PartialEq, Error, Serialize)]
pub enum DesignFileError {
    /// Not JSON at all (or cut short); the position is where the JSON reader stopped.
    #[error("it is not valid JSON at line {line}, column {column}: {detail}")]
    Malformed {
        /// 1-based line.
        line: usize,
        /// 1-based column.
        column: usize,
        /// What the JSON reader found.
        detail: String,
    },
    /// JSON without a usable `version` (not an object, no `version`, or not a whole
    /// number).
    #[error(
        "it has no design format version: a design file is a JSON object whose \"version\" \
         is a whole number (this version of Springline reads {readable})"
    )]
    NoVersion {
        /// The versions this reader takes.
        readable: VersionRange,
    },
    /// A design format newer than this reader.
    #[error(
        "it was made by a newer version of Springline (format {version}; this one reads \
         {readable}); open it with a newer version"
    )]
    NewerVersion {
        /// The version in the file.
        version: u64,
        /// The versions this reader takes.
        readable: VersionRange,
    },
    /// A version below the oldest one ever written.
    #[error(
        "its design format version {version} was never written by Springline (this one reads \
         {readable}); check the \"version\" field"
    )]
    UnknownVersion {
        /// The version in the file.
        version: u64,
        /// The versions this reader takes.
        readable: VersionRange,
    },
    /// Valid JSON of a known version that is not a design of that version (a field
    /// missing, of the wrong type, an unknown variant ...).
    #[error(
        "it is not a design of format {version}{}: {detail}",
        .at.map(|(line, column)| format!(" (line {line}, column {column})")).unwrap_or_default()
    )]
    NotADesign {
        /// The version the file declares.
        version: u64,
        /// 1-based line and column, when known (a file of an older version is read after
        /// it was updated, so its positions are lost).
        at: Option<(usize, usize)>,
        /// What is wrong.
        detail: String,
    },
}

impl From<LinkError> for StaticsError {
    fn from(kind: LinkError) -> StaticsError {
        StaticsError::Link(kind)
    }
}

impl From<DesignFileError> for StaticsError {
    fn from(kind: DesignFileError) -> StaticsError {
        StaticsError::DesignFile(kind)
    }
}

/// "the design has a problem: ..." or "the design has N problems: ...", each problem as
/// `"<label>: <message>"`, joined by "; ". Problems only of an analysis model (its nodes,
/// members and load cases, as the frame solver reports them) are "the model"'s.
fn describe_problems(problems: &[Problem]) -> String {
    let of_a_model = !problems.is_empty()
        && problems.iter().all(|p| {
            matches!(p.location, Location::Node { .. } | Location::Member { .. } | Location::LoadCase(_))
        });
    let whose = if of_a_model { "model" } else { "design" };
    match problems.len() {
        0 => format!("the {whose} has a problem that was not described"),
        1 => format!("the {whose} has a problem: {}", join(problems)),
        n => format!("the {whose} has {}: {}", counted(n, "problem", "problems"), join(problems)),
    }
}

/// A count with its noun for a message, singular or plural as English wants it:
/// `counted(1, "node", "nodes")` is "1 node", `counted(3, ...)` "3 nodes"; a `one` that
/// starts with "a " or "an " stands for the number ("a node"). Messages never write "node(s)".
pub fn counted(count: usize, one: &str, many: &str) -> String {
    if count == 1 {
        if one.starts_with("a ") || one.starts_with("an ") {
            one.to_string()
        } else {
            format!("1 {one}")
        }
    } else {
        format!("{count} {many}")
    }
}

fn join(problems: &[Problem]) -> String {
    problems.iter().map(|p| p.to_string()).collect::<Vec<_>>().join("; ")
}

impl StaticsError {
    /// Shorthand for a list of one problem.
    pub fn invalid(location: impl Into<Location>, message: impl Into<String>) -> Self {
        StaticsError::Invalid(vec![Problem::new(location, message)])
    }

    /// The problems of an `Invalid` error (empty for other kinds).
    pub fn problems(&self) -> &[Problem] {
        match self {
            StaticsError::Invalid(p) => p,
            _ => &[],
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // Check values: the paths are the design file format of this crate; the labels are
    // the field names of the app's panels (crates/app/src/components/controls.rs).

    #[test]
    fn field_paths_read_as_in_a_design_file() {
        assert_eq!(Field::DeckLevel.path(), "deck.level");
        assert_eq!(Field::ValleyPoint(3).path(), "valley[3]");
        assert_eq!(Field::Section(GroupName::Rib, SectionProperty::E).path(), "groups.rib.e");
        assert_eq!(Field::SpringingLeftLevel.path(), "springing_left_level");
        assert_eq!(Field::FormMaxIterations.path(), "form.max_iterations");
        let p = Problem::new(Field::SpringingLeftLevel, "above the deck").involving([Field::DeckLevel]);
        assert_eq!(p.fields, vec![Field::SpringingLeftLevel, Field::DeckLevel]);
        assert!(p.involves(Field::DeckLevel) && !p.involves(Field::Panels));
        assert_eq!(p.location.path(), "springing_left_level");
        let json = serde_json::to_string(&p).expect("serialises");
        assert!(json.contains(r#""location":"springing_left_level""#), "{json}");
        assert!(json.contains(r#""fields":["springing_left_level","deck.level"]"#), "{json}");
    }

    #[test]
    fn fields_read_as_the_panels_name_them() {
        assert_eq!(Field::DeckLevel.label(), "deck level");
        assert_eq!(Field::SpringingLeftLevel.to_string(), "left springing level");
        assert_eq!(Field::SpringingRightLevel.to_string(), "right springing level");
        // 0-based in the file, 1-based as the Ground panel numbers the points
        assert_eq!(Field::ValleyPoint(2).to_string(), "ground point 3");
        assert_eq!(Field::Section(GroupName::Rib, SectionProperty::E).to_string(), "rib section: E");
        assert_eq!(
            Field::Section(GroupName::Posts, SectionProperty::UnitWeight).to_string(),
            "posts section: weight"
        );
        assert_eq!(Field::CrownRise.to_string(), "rise");
        assert_eq!(Field::MinPostLength.to_string(), "shortest post");
        assert_eq!(Field::Bracing.to_string(), "spandrel bracing");
        assert_eq!(Location::from(Field::Panels).to_string(), "arch panels");
        // no label is a code name
        let every = [
            Field::Version,
            Field::Valley,
            Field::ValleyPoint(0),
            Field::DeckLevel,
            Field::LeftSeatX,
            Field::RightSeatX,
            Field::DeckWidth,
            Field::Ribs,
            Field::DeadLoad,
            Field::Surfacing,
            Field::AbutmentHeight,
            Field::SpringingLeftLevel,
            Field::SpringingRightLevel,
            Field::Panels,
            Field::CrownRise,
            Field::CrownLevel,
            Field::MinPostLength,
            Field::RibSystem,
            Field::Bracing,
            Field::FormBasis,
            Field::ApproachPiersLeft,
            Field::ApproachPiersRight,
            Field::FormTolerance,
            Field::FormMaxIterations,
        ];
        let sections = GroupName::ALL.iter().flat_map(|&g| {
            [
                SectionProperty::E,
                SectionProperty::A,
                SectionProperty::I,
                SectionProperty::Depth,
                SectionProperty::UnitWeight,
            ]
            .map(|p| Field::Section(g, p))
        });
        for field in every.into_iter().chain(sections) {
            let label = field.label();
            assert!(!label.contains('_') && !label.contains('.') && !label.contains('['), "{label}");
        }
    }

    #[test]
    fn a_problem_reads_label_then_message_and_keeps_the_path_in_json() {
        let p = Problem::new(Field::SpringingLeftLevel, "above the deck");
        assert_eq!(p.to_string(), "left springing level: above the deck");
        let part = Problem::new("supports", "none given");
        assert_eq!(part.to_string(), "supports: none given");
        assert_eq!(part.location.path(), "supports");
        let out = StaticsError::OutOfRange { location: Field::DeckWidth.into(), message: "too large".into() };
        assert_eq!(out.to_string(), "deck width: too large");
        let json = serde_json::to_string(&out).expect("serialises");
        assert!(json.contains(r#""location":"deck.width""#), "{json}");
    }

    #[test]
    fn counts_read_singular_or_plural() {
        assert_eq!(counted(1, "node", "nodes"), "1 node");
        assert_eq!(counted(1, "a node", "nodes"), "a node");
        assert_eq!(counted(0, "a node", "nodes"), "0 nodes");
        assert_eq!(counted(3, "zero-force member", "zero-force members"), "3 zero-force members");
    }

    #[test]
    fn an_invalid_design_counts_its_problems_in_words() {
        let one = StaticsError::invalid(Field::DeckLevel, "must be a number");
        assert_eq!(one.to_string(), "the design has a problem: deck level: must be a number");
        let three = StaticsError::Invalid(vec![
            Problem::new(Field::DeckLevel, "must be a number"),
            Problem::new(Field::ValleyPoint(0), "is not to the left of point 2"),
            Problem::new(Field::Section(GroupName::Deck, SectionProperty::I), "must be positive"),
        ]);
        assert_eq!(
            three.to_string(),
            "the design has 3 problems: deck level: must be a number; \
             ground point 1: is not to the left of point 2; deck section: I: must be positive"
        );
        let json = serde_json::to_string(&three).expect("serialises");
        assert!(
            json.contains(r#""location":"valley[0]""#) && json.contains(r#""location":"groups.deck.i""#),
            "{json}"
        );
        let model = StaticsError::Invalid(vec![
            Problem::new(Location::Node { index: 2, name: "C".into() }, "x is not finite"),
            Problem::new(Location::LoadCase("wind".into()), "no loads"),
        ]);
        assert_eq!(
            model.to_string(),
            "the model has 2 problems: node C: x is not finite; load case 'wind': no loads"
        );
    }
}
