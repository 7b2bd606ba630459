#!/usr/bin/env python3
"""Solves every model in tests/reference/models/ with an independent general-purpose
finite element library from PyPI (PyNiteFEA, a 3D frame library; version pinned in
requirements.txt) and writes tests/reference/expected/<model>.json, which the Rust
test tests/tests/reference_library.rs compares with springline_statics::solve.

Each expected file holds the SHA-256 of the exact model file bytes the library was run
on, the library name and version, and per load case every reaction and every member's
end forces, converted to Springline's sign convention (below).

How each plane model is built in the 3D library
------------------------------------------------
* Nodes at (x, y, 0). Every node is restrained out of plane (DZ, RX, RY), so only the
  plane freedoms DX, DY, RZ remain.
* Supports: DX / DY / RZ restrained as in the model's support (x / y / rz).
* A node at which no member is rigidly connected (every member there is a truss member
  or released at that end) has no rotational stiffness; the library would find its RZ
  singular, so RZ is restrained there. Nothing can act on that restraint (all members
  there transmit no moment and no nodal moment is applied), and the script asserts that
  its reaction is negligible. Springline instead omits that freedom.
* Members: same E, A; Iz = I (the in-plane bending inertia; about local z, which the
  library keeps normal to the X-Y plane for these members). Truss members, and frame
  members released at both ends, get a nominal Iz and are released in Rz at both ends:
  axial stiffness only, exactly like Springline's truss element (their Iz then only
  enters the condensed fixed-end actions, which do not depend on it). Frame members with release_start / release_end get Rz
  released at that end. Out-of-plane properties (Iy, J, G) are nominal; they carry
  nothing because the out-of-plane freedoms are restrained at every node.
* Loads: nodal FX, FY, MZ as given. Member loads are converted to GLOBAL components
  per metre of member length (uniform) or in kN (point), and applied with the
  library's global directions 'FX' / 'FY', which it resolves into its own member axes:
    - global_y, w:  (0, w) per metre; with projected = true, w * |cos(theta)| per metre
      of member length (w per horizontal metre);
    - global_x, w:  (w, 0); projected: w * |sin(theta)| per metre of member length;
    - local_x, w:   w * (c, s);      local_y, w: w * (-s, c)
  where (c, s) = (cos, sin) of the angle from global x to the member (start -> end) and
  Springline's local y is 90 degrees anticlockwise from its local x. Point loads alike,
  at the same distance a from the start node.

Converting the library's results to Springline's convention
-----------------------------------------------------------
The library's local axes depend on the member's orientation (for example a vertical
member drawn upwards gets local y = -X, and a member drawn right to left keeps local y
up, which makes its local z point into the page). To stay independent of those rules we
take its GLOBAL member end-force vector, `Member3D.F(combo)` = T^-1 (k d + fer): the
forces and moments the nodes apply to the member, global axes, 12 components
[FX, FY, FZ, MX, MY, MZ] at i then at j. We rotate the in-plane part into Springline's
local axes (x from start to end, y 90 degrees anticlockwise from x):
    f_x = FX c + FY s,   f_y = -FX s + FY c,   m = MZ (global Z is out of the page,
    so MZ is the anticlockwise moment in both programs)
giving (f1x, f1y, m1) at the start and (f2x, f2y, m2) at the end, the actions of the
nodes on the member. Equilibrium of a cut piece of the member then gives the internal
forces of Springline's convention (N tension positive; M positive when the fibre on the
right looking start -> end, the local -y side, is in tension; V = dM/ds):
    start:  N = -f1x,  V =  f1y,  M = -m1
    end:    N =  f2x,  V = -f2y,  M =  m2
(Derivation: the piece [0, s] carries the start action and, on its cut face, N along
+x, shear -V along y and the anticlockwise moment M; moment equilibrium about the cut
gives M(s) = -m1 + f1y s + (loads), so M(0) = -m1 and V = dM/ds = f1y at the start. The
piece [s, L] receives -N, +V, -M on its cut face; at s -> L this gives N = f2x,
V = -f2y, M = m2.)
Reactions: the library's node reactions RxnFX, RxnFY, RxnMZ are the forces and moment
the support applies to the structure in global axes, which is Springline's convention
(x right, y up, anticlockwise). A reaction component that Springline's support does not
restrain is reported as exactly 0 (Springline does the same).

Before writing anything the script checks this conversion on small cases with closed-
form answers (propped cantilever drawn both ways and vertically, a bar in tension); it
stops if any disagrees.

Usage (see README.md):  python tests/reference/run_reference.py
"""

import hashlib
import json
import math
import os
import sys
from importlib.metadata import version as dist_version

from Pynite import FEModel3D

LIBRARY = "PyNiteFEA"
HERE = os.path.dirname(os.path.abspath(__file__))
MODELS_DIR = os.path.join(HERE, "models")
EXPECTED_DIR = os.path.join(HERE, "expected")

NOMINAL_TRUSS_I = 1.0e-4  # m4; any positive value: both end rotations are released
NOMINAL_IY = 1.0e-3  # m4, out of plane, carries nothing (restrained)
NOMINAL_J = 1.0e-3  # m4, torsion, carries nothing (restrained)
POISSON = 0.3


def member_geometry(model, k):
    m = model["members"][k]
    a, b = model["nodes"][m["start"]], model["nodes"][m["end"]]
    dx, dy = b["x"] - a["x"], b["y"] - a["y"]
    length = math.hypot(dx, dy)
    return length, dx / length, dy / length


def pinned_at_start(m):
    return m["kind"] == "truss" or m.get("release_start", False)


def pinned_at_end(m):
    return m["kind"] == "truss" or m.get("release_end", False)


def rotation_active(model):
    """Nodes with at least one member rigidly connected (Springline's rotation freedom)."""
    rot = [False] * len(model["nodes"])
    for m in model["members"]:
        if not pinned_at_start(m):
            rot[m["start"]] = True
        if not pinned_at_end(m):
            rot[m["end"]] = True
    return rot


def global_member_load(load, length, c, s):
    """Global (gx, gy) of a member load: per metre of member length for 'uniform', kN for
    'point'."""
    d = load["direction"]
    val = load["w"] if load["type"] == "uniform" else load["p"]
    projected = load["type"] == "uniform" and load.get("projected", False)
    if d == "global_x":
        return (val * (abs(s) if projected else 1.0), 0.0)
    if d == "global_y":
        return (0.0, val * (abs(c) if projected else 1.0))
    if d == "local_x":
        return (val * c, val * s)
    if d == "local_y":
        return (-val * s, val * c)
    raise ValueError(f"unknown load direction {d}")


def node_name(i):
    return f"N{i}"


def member_name(k):
    return f"M{k}"


def build(model):
    fe = FEModel3D()
    for i, n in enumerate(model["nodes"]):
        fe.add_node(node_name(i), n["x"], n["y"], 0.0)
    sections = {}
    for k, m in enumerate(model["members"]):
        mat = f"mat{k}"
        fe.add_material(mat, m["e"], m["e"] / (2.0 * (1.0 + POISSON)), POISSON, 0.0)
        iz = NOMINAL_TRUSS_I if (pinned_at_start(m) and pinned_at_end(m)) else m["i"]
        sec = f"sec{k}"
        fe.add_section(sec, m["a"], NOMINAL_IY, iz, NOMINAL_J)
        sections[k] = sec
        fe.add_member(member_name(k), node_name(m["start"]), node_name(m["end"]), mat, sec)
        if pinned_at_start(m) or pinned_at_end(m):
            fe.def_releases(member_name(k), Rzi=pinned_at_start(m), Rzj=pinned_at_end(m))
    rot = rotation_active(model)
    sup = {s["node"]: s for s in model.get("supports", [])}
    for i in range(len(model["nodes"])):
        s = sup.get(i, {})
        fe.def_support(
            node_name(i),
            support_DX=bool(s.get("x", False)),
            support_DY=bool(s.get("y", False)),
            support_DZ=True,
            support_RX=True,
            support_RY=True,
            # restrain RZ where no member holds it (see module doc)
            support_RZ=bool(s.get("rz", False)) or not rot[i],
        )
    for ci, lc in enumerate(model["load_cases"]):
        cname = f"LC{ci}"
        for l in lc.get("nodal", []):
            for comp, key in (("FX", "fx"), ("FY", "fy"), ("MZ", "mz")):
                if l.get(key, 0.0) != 0.0:
                    fe.add_node_load(node_name(l["node"]), comp, l[key], case=cname)
        for l in lc.get("member", []):
            k = l["member"]
            length, c, s = member_geometry(model, k)
            gx, gy = global_member_load(l, length, c, s)
            for comp, val in (("FX", gx), ("FY", gy)):
                if val == 0.0:
                    continue
                if l["type"] == "uniform":
                    fe.add_member_dist_load(member_name(k), comp, val, val, case=cname)
                else:
                    fe.add_member_pt_load(member_name(k), comp, val, l["a"], case=cname)
        if lc.get("temperature") or lc.get("prescribed"):
            raise ValueError("temperature loads and prescribed displacements are not cross-checked here")
        fe.add_load_combo(cname, {cname: 1.0})
    return fe


def member_end_forces(fe, model, k, combo):
    pm = fe.members[member_name(k)]
    subs = list(pm.sub_members.values())
    if len(subs) != 1:
        raise RuntimeError(f"member {k} was split by the library at an intermediate node")
    F = subs[0].F(combo)[:, 0]
    _, c, s = member_geometry(model, k)
    f1x = F[0] * c + F[1] * s
    f1y = -F[0] * s + F[1] * c
    m1 = F[5]
    f2x = F[6] * c + F[7] * s
    f2y = -F[6] * s + F[7] * c
    m2 = F[11]
    return {
        "member": k,
        "n_start": -f1x,
        "v_start": f1y,
        "m_start": -m1,
        "n_end": f2x,
        "v_end": -f2y,
        "m_end": m2,
    }


def solve(model):
    fe = build(model)
    fe.analyze_linear(check_stability=True, check_statics=False)
    rot = rotation_active(model)
    sup = {s["node"]: s for s in model.get("supports", [])}
    cases = []
    for ci, lc in enumerate(model["load_cases"]):
        combo = f"LC{ci}"
        members = [member_end_forces(fe, model, k, combo) for k in range(len(model["members"]))]
        scale = max(
            [abs(v) for mf in members for key, v in mf.items() if key != "member"] + [1.0]
        )
        reactions = []
        for i in range(len(model["nodes"])):
            nd = fe.nodes[node_name(i)]
            spurious = [nd.RxnFZ[combo], nd.RxnMX[combo], nd.RxnMY[combo]]
            if i not in sup or not sup[i].get("rz", False) or not rot[i]:
                spurious.append(nd.RxnMZ[combo])
            if i not in sup:
                spurious += [nd.RxnFX[combo], nd.RxnFY[combo]]
            worst = max(abs(v) for v in spurious)
            if worst > 1e-9 * scale:
                raise RuntimeError(f"node {i}: auxiliary restraint carries {worst} (case {lc['name']})")
        for s_ in model.get("supports", []):
            i = s_["node"]
            nd = fe.nodes[node_name(i)]
            reactions.append({
                "node": i,
                "fx": nd.RxnFX[combo] if s_.get("x", False) else 0.0,
                "fy": nd.RxnFY[combo] if s_.get("y", False) else 0.0,
                "mz": nd.RxnMZ[combo] if (s_.get("rz", False) and rot[i]) else 0.0,
            })
        cases.append({"name": lc["name"], "reactions": reactions, "members": members})
    return cases


def close(a, b, tol=1e-9):
    return abs(a - b) <= tol * max(1.0, abs(b))


def self_check():
    """Conversion checks against closed-form answers; raises on any disagreement."""
    w, L = 10.0, 6.0
    e, a, i = 2.1e8, 0.01, 1e-4

    def beam(x0, y0, x1, y1, fixed_node):
        return {
            "nodes": [{"x": x0, "y": y0}, {"x": x1, "y": y1}],
            "members": [{"kind": "frame", "start": 0, "end": 1, "e": e, "a": a, "i": i}],
            "supports": [
                {"node": fixed_node, "x": True, "y": True, "rz": True},
                {"node": 1 - fixed_node, "x": False, "y": True, "rz": False}
                if y0 == y1 else {"node": 1 - fixed_node, "x": True, "y": False, "rz": False},
            ],
            "load_cases": [{"name": "q", "member": [
                {"type": "uniform", "member": 0, "w": -w, "direction": "local_y"}]}],
        }

    # Propped cantilever, fixed at the start, drawn left to right, load towards local -y
    # (downwards): M_start = -w L^2 / 8 (hogging), V_start = 5 w L / 8, M_end = 0,
    # V_end = -3 w L / 8; reaction at the fixed end fy = 5 w L / 8, mz = +w L^2 / 8.
    r = solve(beam(0.0, 0.0, L, 0.0, 0))[0]
    m = r["members"][0]
    checks = [
        (m["m_start"], -w * L * L / 8), (m["v_start"], 5 * w * L / 8),
        (m["m_end"], 0.0), (m["v_end"], -3 * w * L / 8), (m["n_start"], 0.0),
        (r["reactions"][0]["fy"], 5 * w * L / 8), (r["reactions"][0]["mz"], w * L * L / 8),
        (r["reactions"][1]["fy"], 3 * w * L / 8),
    ]
    # The same beam drawn right to left (start at x = L, fixed there), same load towards
    # its local -y, which now points up: the internal forces in member terms are the same.
    r = solve(beam(L, 0.0, 0.0, 0.0, 0))[0]
    m = r["members"][0]
    checks += [
        (m["m_start"], -w * L * L / 8), (m["v_start"], 5 * w * L / 8), (m["v_end"], -3 * w * L / 8),
        (r["reactions"][0]["fy"], -5 * w * L / 8), (r["reactions"][0]["mz"], w * L * L / 8),
    ]
    # Drawn upwards (vertical, fixed at the bottom), local -y is +x: reaction fx = -5wL/8.
    r = solve(beam(0.0, 0.0, 0.0, L, 0))[0]
    m = r["members"][0]
    checks += [
        (m["m_start"], -w * L * L / 8), (m["v_start"], 5 * w * L / 8), (m["m_end"], 0.0),
        (r["reactions"][0]["fx"], -5 * w * L / 8), (r["reactions"][0]["mz"], w * L * L / 8),
    ]
    # Bar pulled by 100 kN at its free end: N = +100 at both ends.
    bar = {
        "nodes": [{"x": 0.0, "y": 0.0}, {"x": 3.0, "y": 4.0}],
        "members": [{"kind": "truss", "start": 0, "end": 1, "e": e, "a": a}],
        "supports": [{"node": 0, "x": True, "y": True}, {"node": 1, "x": False, "y": False, "rz": False}],
        "load_cases": [{"name": "pull", "nodal": [{"node": 1, "fx": 60.0, "fy": 80.0}]}],
    }
    bar["supports"] = bar["supports"][:1]
    # a lone bar is a mechanism sideways; add a second bar to make a stable two-bar truss
    bar["nodes"].append({"x": 6.0, "y": 0.0})
    bar["members"].append({"kind": "truss", "start": 2, "end": 1, "e": e, "a": a})
    bar["supports"].append({"node": 2, "x": True, "y": True})
    # node 1 at (3, 4), bars from (0,0) and (6,0), load (60, 80) along bar 0: a joint
    # resolution gives N0 = +100 - ... solve by hand: unit vectors u0 = (0.6, 0.8) (from
    # node 0 to node 1), u1 = (-0.6, 0.8) (from node 2 to node 1); N0 u0 + N1 u1 = (60, 80)
    # -> 0.6 (N0 - N1) = 60, 0.8 (N0 + N1) = 80 -> N0 = 100, N1 = 0.
    r = solve(bar)[0]
    checks += [(r["members"][0]["n_start"], 100.0), (r["members"][0]["n_end"], 100.0),
               (r["members"][1]["n_start"], 0.0), (r["reactions"][0]["fx"], -60.0),
               (r["reactions"][0]["fy"], -80.0)]
    bad = [(k, got, want) for k, (got, want) in enumerate(checks) if not close(got, want)]
    if bad:
        raise SystemExit(f"convention self-check failed (index, got, expected): {bad}")
    print(f"convention self-check: {len(checks)} closed-form values agree")


def main():
    lib_version = dist_version(LIBRARY)
    self_check()
    os.makedirs(EXPECTED_DIR, exist_ok=True)
    names = sorted(f for f in os.listdir(MODELS_DIR) if f.endswith(".json"))
    if not names:
        raise SystemExit("no models found")
    for fname in names:
        path = os.path.join(MODELS_DIR, fname)
        with open(path, "rb") as fh:
            raw = fh.read()
        model = json.loads(raw.decode("utf-8"))
        cases = solve(model)
        out = {
            "model_file": fname,
            "model_sha256": hashlib.sha256(raw).hexdigest(),
            "library": {"name": LIBRARY, "version": lib_version},
            "convention": "Springline: N tension +, M + when the right-hand fibre (start->end) is in "
            "tension, V = dM/ds; reactions global x right, y up, anticlockwise +",
            "cases": cases,
        }
        dest = os.path.join(EXPECTED_DIR, fname)
        with open(dest, "w", encoding="utf-8", newline="\n") as fh:
            json.dump(out, fh, indent=1)
            fh.write("\n")
        print(f"{fname}: {len(cases)} load case(s), {len(model['members'])} members -> expected/{fname}")


if __name__ == "__main__":
    sys.exit(main())
