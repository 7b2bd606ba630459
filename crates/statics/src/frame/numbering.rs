//! Which node freedoms enter the equations, and in which order.
//!
//! Nodes are ordered by reverse Cuthill-McKee so the stiffness matrix keeps a narrow band
//! whatever the input numbering (George & Liu, Computer Solution of Large Sparse Positive
//! Definite Systems, ch. 4); within a node the freedoms run x, y, rotation. A rotation
//! enters only where some member is rigidly connected; restrained freedoms are not
//! unknowns.

use crate::frame::model::{Dof, Model};

/// How a node freedom enters the equations.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) enum Equation {
    /// An unknown: its index among the free freedoms.
    Free(usize),
    /// Held by a support (its displacement is zero or prescribed).
    Restrained,
    /// Not a freedom at all: the rotation of a node where every member is pinned.
    Absent,
}

/// Numbering of the freedoms of a model.
pub(crate) struct Numbering {
    /// Per node, how each of its freedoms (x, y, rotation) enters the equations.
    pub(crate) equations: Vec<[Equation; 3]>,
    /// Per free freedom (equation index), the node and freedom it belongs to.
    pub(crate) free: Vec<(usize, Dof)>,
}

/// The freedoms of a node, in their order within it.
const NODE_DOFS: [Dof; 3] = [Dof::X, Dof::Y, Dof::Rz];

impl Numbering {
    /// How the six local freedoms of member `member` (start x, y, rotation, end x, y,
    /// rotation) enter the equations.
    pub(crate) fn member_equations(&self, model: &Model, member: usize) -> [Equation; 6] {
        let m = &model.members[member];
        let a = self.equations[m.start];
        let b = self.equations[m.end];
        [a[0], a[1], a[2], b[0], b[1], b[2]]
    }
}

/// Which nodes have a rotation freedom: those where at least one member is rigidly
/// connected (a frame member not released at that end).
pub(crate) fn rotation_active(model: &Model) -> Vec<bool> {
    let mut rot = vec![false; model.nodes.len()];
    for m in &model.members {
        if !m.pinned_at_start() && m.start < rot.len() {
            rot[m.start] = true;
        }
        if !m.pinned_at_end() && m.end < rot.len() {
            rot[m.end] = true;
        }
    }
    rot
}

/// Reverse Cuthill-McKee order of the nodes (keeps the band narrow whatever the input
/// numbering; George & Liu, Computer Solution of Large Sparse Positive Definite Systems).
/// The model must be valid (every member's nodes exist).
pub(crate) fn node_order(model: &Model) -> Vec<usize> {
    let nn = model.nodes.len();
    let mut adj = vec![Vec::new(); nn];
    for m in &model.members {
        adj[m.start].push(m.end);
        adj[m.end].push(m.start);
    }
    for a in &mut adj {
        a.sort_unstable();
        a.dedup();
    }
    let mut visited = vec![false; nn];
    let mut order = Vec::with_capacity(nn);
    while order.len() < nn {
        // start each component at a node of least degree (ties: lowest x, then index)
        let start = (0..nn)
            .filter(|&i| !visited[i])
            .min_by(|&a, &b| {
                adj[a].len().cmp(&adj[b].len()).then(
                    model.nodes[a].x.partial_cmp(&model.nodes[b].x).unwrap_or(std::cmp::Ordering::Equal),
                )
            })
            .unwrap_or(0);
        visited[start] = true;
        let mut queue = std::collections::VecDeque::from([start]);
        while let Some(v) = queue.pop_front() {
            order.push(v);
            let mut next: Vec<usize> = adj[v].iter().copied().filter(|&w| !visited[w]).collect();
            crate::order::sort_by_key(&mut next, |&w| adj[w].len());
            for w in next {
                visited[w] = true;
                queue.push_back(w);
            }
        }
    }
    order.reverse();
    order
}

/// Numbers the free freedoms of a valid model node by node in reverse Cuthill-McKee
/// order.
pub(crate) fn number(model: &Model) -> Numbering {
    let nn = model.nodes.len();
    let rot = rotation_active(model);
    let mut restrained = vec![[false; 3]; nn];
    for s in &model.supports {
        restrained[s.node] = [s.x, s.y, s.rz];
    }
    let mut equations = vec![[Equation::Absent; 3]; nn];
    let mut free = Vec::new();
    for node in node_order(model) {
        for (k, dof) in NODE_DOFS.iter().enumerate() {
            if k == 2 && !rot[node] {
                continue;
            }
            equations[node][k] = if restrained[node][k] {
                Equation::Restrained
            } else {
                free.push((node, *dof));
                Equation::Free(free.len() - 1)
            };
        }
    }
    Numbering { equations, free }
}
