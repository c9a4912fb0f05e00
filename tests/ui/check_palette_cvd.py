#!/usr/bin/env python3
"""The curve colours of ui/palette.cpp stay apart under simulated colour-vision deficiency.

For both schemes, each of the five curve colours is simulated as a protanope, a deuteranope
and a tritanope would see it (Machado, Oliveira & Fernandes 2009 model at severity 100, as
implemented by Debian's python3-colorspacious), and every pair must stay at least 10 apart in
CAM02-UCS (Luo, Cui & Li 2006) [CP: 10 is our margin; the full eight-colour Okabe & Ito 2008
set has its closest simulated pair at about 11]. Any two measures with the same dash pattern
have different colours, so this is the distance the eye has to work with [D].
It also checks the reason ui/palette.cpp gives for dropping Okabe-Ito orange, sky blue and
yellow: darkened just enough to reach 3:1 on white (WCAG 2.1), each comes closer than 10 to a
kept colour under some simulated deficiency.
Usage: check_palette_cvd.py <repository root>
"""
import itertools
import pathlib
import re
import sys

import numpy as np
from colorspacious import cspace_convert

root = pathlib.Path(sys.argv[1])
src = (root / "ui" / "palette.cpp").read_text(encoding="utf-8")


def colours(name):
    block = re.search(r"static const QColor " + name + r"\[kCurveColours\] = \{(.*?)\};", src, re.S)
    if not block:
        sys.exit(f"check_palette_cvd: no '{name}' curve colours found in ui/palette.cpp")
    found = [tuple(int(v) for v in m) for m in re.findall(r"QColor\((\d+), (\d+), (\d+)\)", block.group(1))]
    if len(found) != 5:
        sys.exit(f"check_palette_cvd: expected 5 {name} colours in ui/palette.cpp, found {len(found)}")
    return found


def seen(rgb, kind):
    x = np.array(rgb, dtype=float) / 255
    if kind is None:
        return x
    cvd = {"name": "sRGB1+CVD", "cvd_type": kind, "severity": 100}
    return np.clip(cspace_convert(x, cvd, "sRGB1"), 0, 1)


def distance(a, b):
    return float(np.linalg.norm(cspace_convert(a, "sRGB1", "CAM02-UCS") - cspace_convert(b, "sRGB1", "CAM02-UCS")))


def luminance(rgb):  # WCAG 2.1 relative luminance
    c = np.array(rgb, dtype=float) / 255
    lin = np.where(c <= 0.03928, c / 12.92, ((c + 0.055) / 1.055) ** 2.4)
    return float(0.2126 * lin[0] + 0.7152 * lin[1] + 0.0722 * lin[2])


def contrast_on_white(rgb):
    return 1.05 / (luminance(rgb) + 0.05)


def darkened_to_pass(rgb):
    f = 1.0
    while contrast_on_white(tuple(round(v * f) for v in rgb)) < 3.0:
        f -= 0.005
    return tuple(round(v * f) for v in rgb)


kinds = [None, "protanomaly", "deuteranomaly", "tritanomaly"]
problems = []
for scheme in ("light", "dark"):
    cs = colours(scheme)
    for kind in kinds:
        pairs = [(distance(seen(a, kind), seen(b, kind)), a, b) for a, b in itertools.combinations(cs, 2)]
        d, a, b = min(pairs)
        print(f"{scheme:5s} {kind or 'normal':13s} closest pair {a} / {b}: {d:.1f}")
        if d < 10:
            problems.append(f"{scheme}, {kind or 'normal vision'}: {a} and {b} only {d:.1f} apart")

kept = colours("light")
for dropped in ((230, 159, 0), (86, 180, 233), (240, 228, 66)):  # Okabe-Ito orange, sky blue, yellow
    dark = darkened_to_pass(dropped)
    d, near, kind = min((distance(seen(dark, k), seen(c, k)), c, k) for c in kept for k in kinds)
    print(f"dropped {dropped} darkened to {dark} ({contrast_on_white(dark):.2f}:1): {d:.1f} from {near} "
          f"({kind or 'normal'})")
    if d >= 10:
        problems.append(f"the reason for dropping {dropped} no longer holds ({d:.1f} from every kept colour)")

if problems:
    print("\n".join(problems))
    sys.exit(1)
print("check_palette_cvd: every pair of curve colours stays apart under each simulated deficiency")
