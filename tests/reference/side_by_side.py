"""Springline's solver against openseespy, timed in-process on the same exported models.

For each panel count, the demo design is changed to that count and its frame model and
truss idealisation are exported with `springline model` (the neutral model format). Each
model is then
  - solved by Springline in its own process: `springline solve --time N` solves a fresh
    copy of the model N times after reading it (validation, numbering, assembly, banded
    LDL^T, every load case with iterative refinement, member forces and reactions, the
    equilibrium check) and prints the median per solve;
  - built and solved by openseespy in this process, N times: the domain built from the
    model already read (nodes, elements, supports, the load pattern), a linear static
    analysis (banded general solver, reverse Cuthill-McKee numbering) and every node's
    reaction read back; the median per analysis.
The reactions of the two must agree (relative to the largest) before a time is printed,
so both solved the same model.

Usage (from the repository root, after `cargo build --release -p springline-cli`):

    python3 -m venv /tmp/opsvenv
    /tmp/opsvenv/bin/pip install -r tests/reference/requirements-speed.txt
    /tmp/opsvenv/bin/python tests/reference/side_by_side.py

openseespy's Linux build needs the BLAS and LAPACK shared libraries (Debian: libblas3,
liblapack3). Both are timed on the same machine in one run; read the ratio, not the
absolute times, on a shared machine.
"""

import argparse
import json
import math
import pathlib
import statistics
import subprocess
import sys
import tempfile
import time

ROOT = pathlib.Path(__file__).resolve().parents[2]


def run(args, **kw):
    return subprocess.run(args, check=True, capture_output=True, text=True, **kw)


def exported_models(springline, panels, tmp):
    """The demo at `panels` panels: its frame model and truss idealisation (neutral JSON)."""
    design = json.loads(run([springline, "demo"]).stdout)
    design["panels"] = panels
    path = tmp / f"demo-{panels}.json"
    path.write_text(json.dumps(design))
    models = {}
    for kind, flags in (("frame", []), ("truss", ["--truss"])):
        text = run([springline, "model", *flags, str(path)]).stdout
        models[kind] = (text, json.loads(text))
    return models


def springline_solve(springline, model_text, repeats, tmp):
    """Springline's reactions of the first load case and its median time per solve (s)."""
    path = tmp / "model.json"
    path.write_text(model_text)
    done = run([springline, "solve", "--time", str(repeats), str(path)])
    out = json.loads(done.stdout)
    median_us = None
    for line in done.stderr.splitlines():
        if line.startswith("solve time over"):
            median_us = float(line.split("median ")[1].split(" us")[0])
    if median_us is None:
        sys.exit(f"springline solve --time printed no time: {done.stderr}")
    case = out["solution"]["cases"][0]
    reactions = {r["node"]: (r["fx"], r["fy"], r["mz"]) for r in case["reactions"]}
    return reactions, median_us * 1e-6, out["solution"]["free_dofs"]


def local_components(direction, w, c, s, projected):
    """A uniform member load's (axial, transverse) intensity per metre of member, local axes
    (x from start to end, y 90 degrees anticlockwise of x), from Springline's directions."""
    if direction == "local_x":
        return w, 0.0
    if direction == "local_y":
        return 0.0, w
    if direction == "global_y":
        scale = abs(c) if projected else 1.0
        return w * s * scale, w * c * scale
    if direction == "global_x":
        scale = abs(s) if projected else 1.0
        return w * c * scale, -w * s * scale
    raise ValueError(f"load direction {direction} not handled")


def opensees_solve(ops, model, case_index=0):
    """Builds `model` in openseespy, solves load case `case_index` and returns the
    reactions of the supported nodes (kN, kNm; Springline's node indices)."""
    ops.wipe()
    ops.model("basic", "-ndm", 2, "-ndf", 3)
    nodes = model["nodes"]
    for i, n in enumerate(nodes):
        ops.node(i + 1, n["x"], n["y"])
    ops.geomTransf("Linear", 1)
    rotates = [False] * len(nodes)
    materials = {}
    for k, m in enumerate(model["members"]):
        pinned = m["kind"] == "truss" or (m["release_start"] and m["release_end"])
        if pinned:
            tag = materials.get(m["e"])
            if tag is None:
                tag = materials[m["e"]] = len(materials) + 1
                ops.uniaxialMaterial("Elastic", tag, m["e"])
            ops.element("Truss", k + 1, m["start"] + 1, m["end"] + 1, m["a"], tag)
        else:
            code = 1 if m["release_start"] else (2 if m["release_end"] else 0)
            extra = ["-release", code] if code else []
            ops.element("elasticBeamColumn", k + 1, m["start"] + 1, m["end"] + 1, m["a"], m["e"], m["i"], 1, *extra)
            if not m["release_start"]:
                rotates[m["start"]] = True
            if not m["release_end"]:
                rotates[m["end"]] = True
    held = {s["node"]: s for s in model["supports"]}
    for i in range(len(nodes)):
        s = held.get(i)
        x, y, rz = (s["x"], s["y"], s["rz"]) if s else (False, False, False)
        # a node where every member is pinned has no rotational stiffness: held
        rz = rz or not rotates[i]
        if x or y or rz:
            ops.fix(i + 1, int(x), int(y), int(rz))
    case = model["load_cases"][case_index]
    ops.timeSeries("Constant", 1)
    ops.pattern("Plain", 1, 1)
    for load in case["nodal"]:
        ops.load(load["node"] + 1, load["fx"], load["fy"], load["mz"])
    for load in case["member"]:
        m = model["members"][load["member"]]
        a, b = nodes[m["start"]], nodes[m["end"]]
        length = math.hypot(b["x"] - a["x"], b["y"] - a["y"])
        c, s = (b["x"] - a["x"]) / length, (b["y"] - a["y"]) / length
        if load["type"] != "uniform":
            raise ValueError("point member loads are not in the demo's models")
        wx, wy = local_components(load["direction"], load["w"], c, s, load.get("projected", False))
        if m["kind"] == "truss" or (m["release_start"] and m["release_end"]):
            # a pin-ended member carries its load to its ends as a simple beam: half each
            gx, gy = (wx * c - wy * s) * length / 2, (wx * s + wy * c) * length / 2
            ops.load(m["start"] + 1, gx, gy, 0.0)
            ops.load(m["end"] + 1, gx, gy, 0.0)
            continue
        ops.eleLoad("-ele", load["member"] + 1, "-type", "-beamUniform", wy, wx)
    if case["temperature"] or case["prescribed"]:
        raise ValueError("temperature and prescribed displacements are not in the demo's models")
    ops.system("BandGeneral")
    ops.numberer("RCM")
    ops.constraints("Plain")
    ops.integrator("LoadControl", 1.0)
    ops.algorithm("Linear")
    ops.analysis("Static")
    if ops.analyze(1) != 0:
        raise RuntimeError("openseespy could not solve the model")
    ops.reactions()
    return {i: tuple(ops.nodeReaction(i + 1)) for i in held}


def agreement(ours, theirs):
    """The largest difference of the reactions over the largest reaction force."""
    scale = max(abs(v) for r in ours.values() for v in r[:2])
    diff = max(abs(a - b) for n, r in ours.items() for a, b in zip(r, theirs[n]))
    return diff / scale


def main():
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--springline", default=str(ROOT / "target/release/springline"))
    parser.add_argument("--panels", default="8,16,32,64")
    parser.add_argument("--repeats", type=int, default=300, help="openseespy analyses per model")
    parser.add_argument("--springline-repeats", type=int, default=3000, help="springline solves per model")
    args = parser.parse_args()
    import importlib.metadata

    import openseespy.opensees as ops

    version = importlib.metadata.version("openseespy")
    print(f"openseespy {version} (Python {sys.version.split()[0]}) against {args.springline}")
    print(f"{'model':>6} {'panels':>6} {'dofs':>5} {'openseespy ms':>14} {'springline us':>14} {'ratio':>7} {'agree':>8}")
    with tempfile.TemporaryDirectory() as tmp:
        tmp = pathlib.Path(tmp)
        for panels in (int(p) for p in args.panels.split(",")):
            for kind, (text, model) in exported_models(args.springline, panels, tmp).items():
                ours, t_ours, dofs = springline_solve(args.springline, text, args.springline_repeats, tmp)
                theirs = opensees_solve(ops, model)
                error = agreement(ours, theirs)
                if error > 1e-6:
                    sys.exit(f"{kind} {panels}: the reactions differ by {error:.1e} of the largest; not the same model")
                times = []
                for _ in range(args.repeats):
                    t0 = time.perf_counter()
                    opensees_solve(ops, model)
                    times.append(time.perf_counter() - t0)
                t_theirs = statistics.median(times)
                print(
                    f"{kind:>6} {panels:>6} {dofs:>5} {t_theirs * 1e3:>14.3f} {t_ours * 1e6:>14.1f} "
                    f"{t_theirs / t_ours:>6.1f}x {error:>8.0e}"
                )
    ops.wipe()


if __name__ == "__main__":
    main()
