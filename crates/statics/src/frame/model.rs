//! The analysis model: nodes, members, supports and load cases of a plane frame or truss.
//!
//! This is also Springline's neutral model file format (JSON through serde), read by
//! `springline solve` and written by `springline model`. Units throughout: m, kN, kN/m,
//! kN/m2 (E), m2 (A), m4 (I), 1/K (alpha), K (temperature change), rad (rotations).
//! Axes: x to the right, y up; a positive moment or rotation is anticlockwise.

use crate::error::Location;
use serde::{Deserialize, Serialize};

/// A complete plane model with its load cases.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize, Default)]
pub struct Model {
    /// Free text naming the model (shown in reports).
    #[serde(default)]
    pub title: String,
    /// Joints, referred to by their index (0-based) in this list.
    pub nodes: Vec<Node>,
    /// Members, referred to by their index (0-based) in this list.
    pub members: Vec<Member>,
    /// Restrained joints; a node may appear at most once.
    #[serde(default)]
    pub supports: Vec<Support>,
    /// Load cases, each solved with the same factorisation of the stiffness matrix.
    #[serde(default)]
    pub load_cases: Vec<LoadCase>,
}

/// A joint of the model at (x, y) in m.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Node {
    /// Name used in messages and reports; the index is used when empty.
    #[serde(default)]
    pub name: String,
    /// Horizontal position, m, positive to the right.
    pub x: f64,
    /// Vertical position, m, positive up.
    pub y: f64,
}

/// How a member carries load.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum MemberKind {
    /// Euler-Bernoulli beam-column: axial force, shear and bending (E, A, I).
    Frame,
    /// Pin-ended bar: axial force only from joint displacements (E, A). Loads along a
    /// truss member are carried to its ends as simple-span reactions.
    Truss,
}

/// A straight prismatic member between two nodes. Local x runs from `start` to `end`.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Member {
    /// Name used in messages and reports; the index is used when empty.
    #[serde(default)]
    pub name: String,
    /// Member group (for example "rib", "deck", "post"), used for reports and sizing.
    #[serde(default)]
    pub group: String,
    /// Frame or truss.
    pub kind: MemberKind,
    /// Index of the start node.
    pub start: usize,
    /// Index of the end node.
    pub end: usize,
    /// Young's modulus, kN/m2.
    pub e: f64,
    /// Cross-section area, m2.
    pub a: f64,
    /// Second moment of area about the bending axis, m4 (ignored for truss members).
    #[serde(default)]
    pub i: f64,
    /// Coefficient of thermal expansion, 1/K (only used by temperature loads).
    #[serde(default)]
    pub alpha: f64,
    /// Moment release (hinge) at the start: the member's end moment there is zero.
    #[serde(default)]
    pub release_start: bool,
    /// Moment release (hinge) at the end: the member's end moment there is zero.
    #[serde(default)]
    pub release_end: bool,
}

impl Member {
    /// True when the member transmits no moment at its start node.
    pub fn pinned_at_start(&self) -> bool {
        self.kind == MemberKind::Truss || self.release_start
    }
    /// True when the member transmits no moment at its end node.
    pub fn pinned_at_end(&self) -> bool {
        self.kind == MemberKind::Truss || self.release_end
    }
}

/// A restrained node. `x`, `y` restrain translation, `rz` restrains rotation.
///
/// A pinned support is `x, y`; fixed is `x, y, rz`; a roller that moves along x is `y`
/// alone, one that moves along y is `x` alone. A rotation restraint at a node where no
/// member is rigidly connected has nothing to hold and is ignored.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
pub struct Support {
    /// Index of the supported node.
    pub node: usize,
    /// Horizontal translation restrained.
    #[serde(default)]
    pub x: bool,
    /// Vertical translation restrained.
    #[serde(default)]
    pub y: bool,
    /// Rotation restrained.
    #[serde(default)]
    pub rz: bool,
}

impl Support {
    /// Pinned support: both translations held, rotation free.
    pub fn pinned(node: usize) -> Self {
        Support { node, x: true, y: true, rz: false }
    }
    /// Fixed support: translations and rotation held.
    pub fn fixed(node: usize) -> Self {
        Support { node, x: true, y: true, rz: true }
    }
    /// Roller moving along x: only the vertical translation is held.
    pub fn roller_along_x(node: usize) -> Self {
        Support { node, x: false, y: true, rz: false }
    }
    /// Roller moving along y: only the horizontal translation is held.
    pub fn roller_along_y(node: usize) -> Self {
        Support { node, x: true, y: false, rz: false }
    }
}

/// A degree of freedom of a node.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Dof {
    /// Horizontal translation, m (force: kN, positive to the right).
    X,
    /// Vertical translation, m (force: kN, positive up).
    Y,
    /// Rotation, rad (moment: kNm, positive anticlockwise).
    Rz,
}

impl Dof {
    /// The index of this freedom within a node (x = 0, y = 1, rz = 2).
    pub fn index(self) -> usize {
        match self {
            Dof::X => 0,
            Dof::Y => 1,
            Dof::Rz => 2,
        }
    }
    /// Words for messages.
    pub fn describe(self) -> &'static str {
        match self {
            Dof::X => "horizontally (x)",
            Dof::Y => "vertically (y)",
            Dof::Rz => "in rotation",
        }
    }
}

/// One load case: loads applied together and solved together.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize, Default)]
pub struct LoadCase {
    /// Name of the load case (for example "dead").
    pub name: String,
    /// Forces and moments at nodes.
    #[serde(default)]
    pub nodal: Vec<NodalLoad>,
    /// Distributed and concentrated loads along members.
    #[serde(default)]
    pub member: Vec<MemberLoad>,
    /// Uniform temperature changes of members.
    #[serde(default)]
    pub temperature: Vec<TemperatureLoad>,
    /// Imposed displacements of restrained freedoms (settlement, spread of springings).
    #[serde(default)]
    pub prescribed: Vec<PrescribedDisplacement>,
}

/// A force and moment applied at a node: kN, kN, kNm (global axes, anticlockwise moment).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct NodalLoad {
    /// Index of the loaded node.
    pub node: usize,
    /// Horizontal force, kN, positive to the right.
    #[serde(default)]
    pub fx: f64,
    /// Vertical force, kN, positive up (gravity loads are negative).
    #[serde(default)]
    pub fy: f64,
    /// Moment, kNm, positive anticlockwise.
    #[serde(default)]
    pub mz: f64,
}

/// Direction of a member load.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum LoadDirection {
    /// Along the member, positive from start to end.
    LocalX,
    /// Perpendicular to the member, positive to the left looking from start to end.
    LocalY,
    /// Global x, positive to the right.
    GlobalX,
    /// Global y, positive up (gravity is negative).
    GlobalY,
}

/// A load along a member.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "type", rename_all = "snake_case")]
pub enum MemberLoad {
    /// Uniform load over the whole member, kN/m.
    Uniform {
        /// Index of the loaded member.
        member: usize,
        /// Intensity, kN/m, signed along `direction`.
        w: f64,
        /// Direction of the load.
        direction: LoadDirection,
        /// For global directions: `w` is per metre of the projection normal to the load
        /// (per horizontal metre for `global_y`), not per metre of member length.
        #[serde(default)]
        projected: bool,
    },
    /// Concentrated force at distance `a` (m) from the start node, along the member.
    Point {
        /// Index of the loaded member.
        member: usize,
        /// Force, kN, signed along `direction`.
        p: f64,
        /// Distance from the start node along the member, m (0 <= a <= length).
        a: f64,
        /// Direction of the load.
        direction: LoadDirection,
    },
}

impl MemberLoad {
    /// Index of the loaded member.
    pub fn member(&self) -> usize {
        match *self {
            MemberLoad::Uniform { member, .. } | MemberLoad::Point { member, .. } => member,
        }
    }
}

/// A uniform temperature change of a member, K (positive warms and lengthens it by
/// `alpha * delta_t` per metre).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct TemperatureLoad {
    /// Index of the member.
    pub member: usize,
    /// Temperature change, K.
    pub delta_t: f64,
}

/// An imposed displacement of a restrained freedom: m for x and y, rad for rz.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct PrescribedDisplacement {
    /// Index of the node; it must have a support restraining `dof`.
    pub node: usize,
    /// The restrained freedom that is moved.
    pub dof: Dof,
    /// The imposed value, m or rad, along the positive axis.
    pub value: f64,
}

impl Model {
    /// The display name of node `index`: its name, or `#index` when it has none.
    pub fn node_label(&self, index: usize) -> String {
        match self.nodes.get(index) {
            Some(n) if !n.name.is_empty() => n.name.clone(),
            _ => format!("#{index}"),
        }
    }
    /// The display name of member `index`: its name, or `#index` when it has none.
    pub fn member_label(&self, index: usize) -> String {
        match self.members.get(index) {
            Some(m) if !m.name.is_empty() => m.name.clone(),
            _ => format!("#{index}"),
        }
    }
    /// Where node `index` is, for problems about it: its index and display name.
    pub fn node_location(&self, index: usize) -> Location {
        Location::Node { index, name: self.node_label(index) }
    }
    /// Where member `index` is, for problems about it: its index and display name.
    pub fn member_location(&self, index: usize) -> Location {
        Location::Member { index, name: self.member_label(index) }
    }
    /// Length of member `index` in m (0 if the member or its nodes are missing).
    pub fn member_length(&self, index: usize) -> f64 {
        let Some(m) = self.members.get(index) else { return 0.0 };
        match (self.nodes.get(m.start), self.nodes.get(m.end)) {
            (Some(a), Some(b)) => (b.x - a.x).hypot(b.y - a.y),
            _ => 0.0,
        }
    }
    /// The start and end nodes of `member` (a member of this model or one like it), or
    /// `None` when either index names no node.
    pub fn ends(&self, member: &Member) -> Option<(&Node, &Node)> {
        self.nodes.get(member.start).zip(self.nodes.get(member.end))
    }
    /// Adds a node and returns its index.
    pub fn add_node(&mut self, name: impl Into<String>, x: f64, y: f64) -> usize {
        self.nodes.push(Node { name: name.into(), x, y });
        self.nodes.len() - 1
    }
    /// Adds a member and returns its index.
    pub fn add_member(&mut self, member: Member) -> usize {
        self.members.push(member);
        self.members.len() - 1
    }
    /// The model reflected about the vertical line x = `axis_x`: node x becomes
    /// 2 axis_x - x; members keep their nodes (so local axes reverse their horizontal
    /// sense); horizontal forces and all moments change sign.
    pub fn mirrored(&self, axis_x: f64) -> Model {
        let mut m = self.clone();
        for n in &mut m.nodes {
            n.x = 2.0 * axis_x - n.x;
        }
        for lc in &mut m.load_cases {
            for l in &mut lc.nodal {
                l.fx = -l.fx;
                l.mz = -l.mz;
            }
            for ml in &mut lc.member {
                match ml {
                    MemberLoad::Uniform { w, direction, .. } => {
                        if matches!(direction, LoadDirection::GlobalX | LoadDirection::LocalY) {
                            *w = -*w;
                        }
                    }
                    MemberLoad::Point { p, direction, .. } => {
                        if matches!(direction, LoadDirection::GlobalX | LoadDirection::LocalY) {
                            *p = -*p;
                        }
                    }
                }
            }
            for pd in &mut lc.prescribed {
                if matches!(pd.dof, Dof::X | Dof::Rz) {
                    pd.value = -pd.value;
                }
            }
        }
        m
    }
}

/// Convenience constructor of a frame member.
pub fn frame(name: &str, group: &str, start: usize, end: usize, e: f64, a: f64, i: f64) -> Member {
    Member {
        name: name.to_string(),
        group: group.to_string(),
        kind: MemberKind::Frame,
        start,
        end,
        e,
        a,
        i,
        alpha: 0.0,
        release_start: false,
        release_end: false,
    }
}

/// Convenience constructor of a truss member.
pub fn truss(name: &str, group: &str, start: usize, end: usize, e: f64, a: f64) -> Member {
    Member {
        name: name.to_string(),
        group: group.to_string(),
        kind: MemberKind::Truss,
        start,
        end,
        e,
        a,
        i: 0.0,
        alpha: 0.0,
        release_start: false,
        release_end: false,
    }
}
