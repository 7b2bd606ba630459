#!/usr/bin/env python3
"""Writes the cross-check models in Springline's neutral JSON format (serde of
`springline_statics::Model`) to tests/reference/models/.

Plain Python (no third-party packages). The models are committed; re-running this
script rewrites them byte for byte the same, after which run_reference.py must be
re-run (the expected files record the SHA-256 of the model bytes).

Units: m, kN, kN/m, kN/m2 (E), m2 (A), m4 (I). Axes x right, y up, anticlockwise
moments positive. Geometry is chosen so that every coordinate is a short binary
fraction (exact in the JSON text and in f64). All names are invented.
"""

import json
import os

E_STEEL = 2.1e8  # kN/m2
ALPHA_STEEL = 1.2e-5  # 1/K (unused by these load cases)

HERE = os.path.dirname(os.path.abspath(__file__))
OUT = os.path.join(HERE, "models")


def node(name, x, y):
    return {"name": name, "x": float(x), "y": float(y)}


def member(name, group, kind, start, end, a, i=0.0, release_start=False, release_end=False):
    return {
        "name": name,
        "group": group,
        "kind": kind,
        "start": start,
        "end": end,
        "e": E_STEEL,
        "a": a,
        "i": i,
        "alpha": ALPHA_STEEL,
        "release_start": release_start,
        "release_end": release_end,
    }


def support(n, x, y, rz):
    return {"node": n, "x": x, "y": y, "rz": rz}


def nodal(n, fx=0.0, fy=0.0, mz=0.0):
    return {"node": n, "fx": float(fx), "fy": float(fy), "mz": float(mz)}


def uniform(m, w, direction, projected=False):
    return {"type": "uniform", "member": m, "w": float(w), "direction": direction, "projected": projected}


def point(m, p, a, direction):
    return {"type": "point", "member": m, "p": float(p), "a": float(a), "direction": direction}


def case(name, nodal_loads=(), member_loads=()):
    return {"name": name, "nodal": list(nodal_loads), "member": list(member_loads), "temperature": [], "prescribed": []}


def parabola(x, span, rise):
    return 4.0 * rise * x * (span - x) / (span * span)


def braced_truss():
    """(a) Braced deck-arch truss: parabolic rib chord, deck chord, posts, one diagonal
    per panel, all pin-ended bars; pinned springings; 8 panels of 8 m, span 64 m,
    rise 12 m, deck at 15 m. One degree of indeterminacy (the thrust)."""
    span, rise, deck_y, n = 64.0, 12.0, 15.0, 8
    dx = span / n
    nodes = [node(f"R{i}", i * dx, parabola(i * dx, span, rise)) for i in range(n + 1)]
    nodes += [node(f"D{i}", i * dx, deck_y) for i in range(n + 1)]
    rib = lambda i: i
    deck = lambda i: n + 1 + i
    members = []
    for i in range(n):
        members.append(member(f"rib{i}", "rib", "truss", rib(i), rib(i + 1), 0.060))
    for i in range(n):
        members.append(member(f"deck{i}", "deck", "truss", deck(i), deck(i + 1), 0.030))
    for i in range(n + 1):
        members.append(member(f"post{i}", "post", "truss", rib(i), deck(i), 0.012))
    for i in range(n):
        if i < n // 2:
            members.append(member(f"diag{i}", "diagonal", "truss", deck(i), rib(i + 1), 0.008))
        else:
            members.append(member(f"diag{i}", "diagonal", "truss", rib(i), deck(i + 1), 0.008))
    supports = [support(rib(0), True, True, False), support(rib(n), True, True, False)]
    panel = [-200.0 if i in (0, n) else -400.0 for i in range(n + 1)]
    lc1 = case("deck panel loads", [nodal(deck(i), fy=panel[i]) for i in range(n + 1)])
    doubled = list(panel)
    doubled[3] *= 2.0
    lc2 = case("panel D3 doubled", [nodal(deck(i), fy=doubled[i]) for i in range(n + 1)])
    return {
        "title": "Braced deck-arch truss, 8 panels, span 64 m (invented cross-check model)",
        "nodes": nodes,
        "members": members,
        "supports": supports,
        "load_cases": [lc1, lc2],
    }


def frame_deck_arch():
    """(b) Frame deck arch: two-hinged frame rib (pinned springings), continuous frame deck
    pinned at its left end and on a roller at its right end, pin-ended posts (three as
    truss members, four as frame members released at both ends, one of them drawn top
    down); span 64 m, rise 12 m, deck at 15 m, 8 panels."""
    span, rise, deck_y, n = 64.0, 12.0, 15.0, 8
    dx = span / n
    nodes = [node(f"S{i}", i * dx, parabola(i * dx, span, rise)) for i in range(n + 1)]
    nodes += [node(f"G{i}", i * dx, deck_y) for i in range(n + 1)]
    rib = lambda i: i
    deck = lambda i: n + 1 + i
    members = []
    for i in range(n):
        members.append(member(f"rib{i}", "rib", "frame", rib(i), rib(i + 1), 0.045, 0.0065))
    for i in range(n):
        members.append(member(f"deck{i}", "deck", "frame", deck(i), deck(i + 1), 0.040, 0.012))
    first_post = len(members)
    for i in range(1, n):
        if i <= 3:
            members.append(member(f"post{i}", "post", "truss", rib(i), deck(i), 0.010))
        elif i < n - 1:
            members.append(member(f"post{i}", "post", "frame", rib(i), deck(i), 0.010, 2.0e-4, True, True))
        else:
            # drawn from the deck down to the rib
            members.append(member(f"post{i}", "post", "frame", deck(i), rib(i), 0.010, 2.0e-4, True, True))
    post = lambda i: first_post + i - 1
    supports = [
        support(rib(0), True, True, False),
        support(rib(n), True, True, False),
        support(deck(0), True, True, False),
        support(deck(n), False, True, False),
    ]
    deck_member = lambda i: n + i
    dead = case(
        "dead",
        member_loads=[uniform(deck_member(i), -45.0, "global_y") for i in range(n)]
        + [uniform(i, -12.0, "global_y") for i in range(n)],
    )
    live = case(
        "live and wind",
        nodal_loads=[nodal(deck(n), fx=-60.0)],
        member_loads=[uniform(deck_member(i), -27.0, "global_y") for i in range(n // 2)]
        + [
            point(deck_member(5), -450.0, 3.0, "global_y"),
            point(post(2), 20.0, 1.0, "global_x"),
            point(post(5), 15.0, 2.0, "global_x"),
            point(post(7), 12.0, 1.0, "global_x"),
        ],
    )
    return {
        "title": "Frame deck arch, two-hinged rib, pin-ended posts, 8 panels (invented cross-check model)",
        "nodes": nodes,
        "members": members,
        "supports": supports,
        "load_cases": [dead, live],
    }


def bare_rib():
    """(c) Bare parabolic frame rib with fixed springings: span 48 m, rise 10 m, 16
    segments."""
    span, rise, n = 48.0, 10.0, 16
    dx = span / n
    nodes = [node(f"K{i}", i * dx, parabola(i * dx, span, rise)) for i in range(n + 1)]
    members = [member(f"seg{i}", "rib", "frame", i, i + 1, 0.050, 0.008) for i in range(n)]
    supports = [support(0, True, True, True), support(n, True, True, True)]
    lc1 = case("nodal gravity", [nodal(i, fy=-150.0) for i in range(1, n)])
    lc2 = case(
        "left-half UDL",
        member_loads=[uniform(i, -40.0, "global_y", projected=True) for i in range(n // 2)],
    )
    lc3 = case(
        "mixed directions",
        nodal_loads=[nodal(n // 2, fx=50.0), nodal(4, mz=200.0), nodal(12, fx=-20.0, fy=-80.0, mz=-75.0)],
        member_loads=[uniform(i, -10.0, "local_y") for i in range(4)]
        + [
            uniform(12, 5.0, "local_x"),
            uniform(13, 8.0, "global_x", projected=True),
            uniform(14, -6.0, "global_x"),
            point(9, -120.0, 1.25, "global_y"),
            point(10, 30.0, 2.0, "local_y"),
            point(11, -25.0, 0.5, "local_x"),
        ],
    )
    return {
        "title": "Bare parabolic rib, fixed springings, 16 segments (invented cross-check model)",
        "nodes": nodes,
        "members": members,
        "supports": supports,
        "load_cases": [lc1, lc2, lc3],
    }


def portal_hinge():
    """(d) Pitched portal frame, pinned bases, moment hinge at the apex (release at the
    start of the right rafter): a three-pinned portal. Left column drawn top down, right
    column bottom up."""
    nodes = [
        node("base L", 0.0, 0.0),
        node("eaves L", 0.0, 6.0),
        node("rafter L mid", 4.0, 7.0),
        node("apex", 8.0, 8.0),
        node("rafter R mid", 12.0, 7.0),
        node("eaves R", 16.0, 6.0),
        node("base R", 16.0, 0.0),
    ]
    col_a, col_i = 0.0159, 4.5e-4
    raf_a, raf_i = 0.0116, 2.3e-4
    members = [
        member("column L", "column", "frame", 1, 0, col_a, col_i),
        member("rafter L1", "rafter", "frame", 1, 2, raf_a, raf_i),
        member("rafter L2", "rafter", "frame", 2, 3, raf_a, raf_i),
        member("rafter R1", "rafter", "frame", 3, 4, raf_a, raf_i, release_start=True),
        member("rafter R2", "rafter", "frame", 4, 5, raf_a, raf_i),
        member("column R", "column", "frame", 6, 5, col_a, col_i),
    ]
    supports = [support(0, True, True, False), support(6, True, True, False)]
    lc1 = case(
        "sway and roof",
        nodal_loads=[nodal(1, fx=40.0)],
        member_loads=[uniform(k, -15.0, "global_y", projected=True) for k in (1, 2, 3, 4)],
    )
    lc2 = case(
        "wind and point",
        nodal_loads=[nodal(3, fy=-30.0)],
        member_loads=[
            uniform(0, 6.0, "local_y"),
            uniform(5, 3.0, "global_x"),
            uniform(2, -9.0, "global_y"),
            point(4, -60.0, 2.0, "global_y"),
        ],
    )
    return {
        "title": "Pitched portal frame, pinned bases, apex hinge (invented cross-check model)",
        "nodes": nodes,
        "members": members,
        "supports": supports,
        "load_cases": [lc1, lc2],
    }


MODELS = {
    "braced_truss": braced_truss,
    "frame_deck_arch": frame_deck_arch,
    "bare_rib": bare_rib,
    "portal_hinge": portal_hinge,
}


def main():
    os.makedirs(OUT, exist_ok=True)
    for name, build in MODELS.items():
        path = os.path.join(OUT, name + ".json")
        with open(path, "w", encoding="utf-8", newline="\n") as fh:
            json.dump(build(), fh, indent=1)
            fh.write("\n")
        print("wrote", os.path.relpath(path))


if __name__ == "__main__":
    main()
