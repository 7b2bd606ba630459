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
}

impl fmt::Display for Field {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let path = match self {
            Field::Version => "version",
            Field::Valley => "valley",
            Field::ValleyPoint(i) => return write!(f, "valley[{i}]"),
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
            Field::ApproachPiersLeft => "approach_piers_left",
            Field::ApproachPiersRight => "approach_piers_right",
            Field::Section(g, p) => return write!(f, "groups.{}.{}", g.key(), p.key()),
            Field::FormTolerance => "form.tolerance",
            Field::FormMaxIterations => "form.max_iterations",
        };
        f.write_str(path)
    }
}

impl Serialize for Field {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.collect_str(self)
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

impl Serialize for Location {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.collect_str(self)
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
}

impl fmt::Display for Iteration {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            Iteration::FormFinding => "form finding",
        })
    }
}

/// Everything that can go wrong in the engine, with what the user can do about it.
#[derive(Debug, Clone, PartialEq, Error, Serialize)]
pub enum StaticsError {
    /// The input has problems; every problem found is listed.
    #[error("{} problem(s) in the input: {}", .0.len(), join(.0))]
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
    /// A permalink or file could not be read.
    #[error("cannot read {what}: {reason}")]
    Unreadable {
        /// What was being read.
        what: String,
        /// Why it failed.
        reason: String,
    },
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

    #[test]
    fn field_paths_read_as_in_a_design_file() {
        assert_eq!(Field::DeckLevel.to_string(), "deck.level");
        assert_eq!(Field::ValleyPoint(3).to_string(), "valley[3]");
        assert_eq!(Field::Section(GroupName::Rib, SectionProperty::E).to_string(), "groups.rib.e");
        let p = Problem::new(Field::SpringingLeftLevel, "above the deck").involving([Field::DeckLevel]);
        assert_eq!(p.fields, vec![Field::SpringingLeftLevel, Field::DeckLevel]);
        assert!(p.involves(Field::DeckLevel) && !p.involves(Field::Panels));
        assert_eq!(p.to_string(), "springing_left_level: above the deck");
        let json = serde_json::to_string(&p).expect("serialises");
        assert!(json.contains(r#""location":"springing_left_level""#), "{json}");
    }
}
