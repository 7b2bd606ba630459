"""Writes the fuzz targets' seed corpora (corpus/<target>/) from the project's own
fixtures: design links, comparison links, design files and neutral models. Run from the
fuzz folder: python3 seeds.py (the seeds are committed; rerun when fixtures change)."""
import base64
import json
import os
import random
import zlib
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
FIX = ROOT / "tests" / "fixtures"


def write(target, name, data):
    folder = Path("corpus") / target
    folder.mkdir(parents=True, exist_ok=True)
    (folder / name).write_bytes(data)


def inflated(link):
    """The raw bytes behind a link payload 'tag.data' (base64url, then zlib)."""
    data = link.split(".", 1)[1]
    return zlib.decompress(base64.urlsafe_b64decode(data + "=" * (-len(data) % 4)))


for path in sorted((FIX / "links").glob("*.link")):
    link = path.read_text().strip().lstrip("#")
    write("link", path.stem + ".text", b"\x02" + link.encode())
    tag = link.split(".", 1)[0]
    mode = b"\x00" if tag == "s1" else b"\x01"
    write("link", path.stem + ".raw", mode + inflated(link))

for path in sorted((FIX / "comparisons").glob("*.link")):
    link = path.read_text().strip().lstrip("#")
    write("comparison", path.stem + ".text", b"\x01" + link.encode())
    write("comparison", path.stem + ".raw", b"\x00" + inflated(link))
demo_link = (FIX / "links" / "v2-demo.link").read_text().strip().lstrip("#")
saved = {"kind": "springline-options", "version": 1,
         "options": [{"name": "Base", "link": demo_link}, {"name": "Cut", "link": demo_link[:80]}]}
write("comparison", "saved-options.json", b"\x02" + json.dumps(saved).encode())

for path in sorted((FIX / "designs").glob("*.json")):
    write("design_file", path.name, path.read_bytes())

for path in sorted((ROOT / "tests" / "reference" / "models").glob("*.json")):
    write("model", path.name, path.read_bytes())

rng = random.Random(7)
for k in range(16):
    write("pipeline", f"random-{k:02}", bytes(rng.randrange(256) for _ in range(48)))
write("pipeline", "zeros", bytes(48))
