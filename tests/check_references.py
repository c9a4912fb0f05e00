#!/usr/bin/env python3
"""Fails when a citation in core/, tests/, app/ or ui/ does not resolve in tests/REFERENCES.md.

Checked: source tags ([P], [D], [CP], (mem) and any other [XY] tag), check keys
("REFERENCES 1b", "REFERENCES.md row 1b"), author-year citations ("Villani 2003",
"Feydy et al. 2019": the surname before the year and the year must share a line of the
file), and pointers to design notes kept outside the repository (the ../shared/ folder and its
design file), which a maintainer of this repository does not have: not allowed.
Usage: check_references.py <repository root>
"""
import pathlib
import re
import sys

root = pathlib.Path(sys.argv[1])
refs_path = root / "tests" / "REFERENCES.md"
refs = refs_path.read_text(encoding="utf-8")
ref_lines = refs.splitlines()

tags = set(re.findall(r"^- \*\*(\[[A-Z]{1,3}\]|\(mem\))\*\*", refs, re.M))
keys = set(re.findall(r"^- \*\*([0-9]+[a-z]?)\*\*", refs, re.M))

TAG = re.compile(r"(?<![A-Za-z0-9_\]\)])(\[[A-Z]{1,3}\]|\(mem\))")
KEY = re.compile(r"REFERENCES(?:\.md)?(?: row)? ([0-9]+[a-z]?)\b")
AUTHOR_YEAR = re.compile(r"([A-Z][A-Za-z'\u00C0-\u017F-]+)(?: et al\.)?,? ((?:19|20)[0-9]{2})\b")
OUTSIDE = re.compile(r"\.\./shared|/work/shared|DESIGN\.md")
COMMENT = {".h": "//", ".cpp": "//", ".py": "#", ".cmake": "#"}
# Capitalised words before a year that are not authors (units, months, standards handled
# as sources must be listed instead).
NOT_AUTHORS = {"Dec", "December", "Release", "Qt", "C", "Debian", "SciPy", "NumPy", "Python"}

problems = []
files = [p for d in ("core", "tests", "app", "ui") for p in (root / d).rglob("*")
         if p.suffix in COMMENT and p.name != "check_references.py"]
for path in sorted(files):
    rel = path.relative_to(root)
    for n, line in enumerate(path.read_text(encoding="utf-8", errors="replace").splitlines(), 1):
        mark = line.find(COMMENT[path.suffix])
        text = line[mark:] if mark >= 0 else ""
        where = f"{rel}:{n}"
        if OUTSIDE.search(line):
            problems.append(f"{where}: points outside the repository: {line.strip()}")
        for t in TAG.findall(text):
            if t not in tags:
                problems.append(f"{where}: tag {t} is not defined in tests/REFERENCES.md")
        for k in KEY.findall(line):
            if k not in keys:
                problems.append(f"{where}: REFERENCES {k} has no entry")
        for name, year in AUTHOR_YEAR.findall(text):
            if name in NOT_AUTHORS:
                continue
            if not any(name in l and year in l for l in ref_lines):
                problems.append(f"{where}: '{name} {year}' has no entry in tests/REFERENCES.md")

# The documents a maintainer reads beside the code may not point outside the repository
# either (the references file itself included).
docs = [root / "README.md", root / "DEVELOPERS.md"] + sorted((root / "tests").rglob("*.md")) + \
       sorted((root / "samples").rglob("*.md"))
for path in docs:
    if not path.is_file():
        continue
    for n, line in enumerate(path.read_text(encoding="utf-8", errors="replace").splitlines(), 1):
        if OUTSIDE.search(line):
            problems.append(f"{path.relative_to(root)}:{n}: points outside the repository: {line.strip()}")

if problems:
    print("\n".join(problems))
    print(f"{len(problems)} citation(s) do not resolve")
    sys.exit(1)
print(f"references_resolve: {len(files)} files checked, every citation resolves")
