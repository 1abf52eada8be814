"""Write the invented demo profiles of sample_sections/ (reproducible from exact dimensions).

Run: python scripts/make_samples.py [OUT_DIR]   (default: sample_sections/)
All profiles are our own inventions for demonstration; dimensions in millimetres.
"""

from __future__ import annotations

import sys
from pathlib import Path

import numpy as np

ARC_SEGMENTS_PER_TURN = 96


def arc(cx, cy, r, a0, a1, turn=ARC_SEGMENTS_PER_TURN):
    """Points on an arc from angle a0 to a1 (degrees), both ends included."""
    n = max(2, int(np.ceil(abs(a1 - a0) / 360.0 * turn)))
    t = np.radians(np.linspace(a0, a1, n + 1))
    return np.column_stack([cx + r * np.cos(t), cy + r * np.sin(t)])


def rounded_rectangle(w, h, r, cx=0.0, cy=0.0):
    """Counter-clockwise rounded rectangle centred on (cx, cy)."""
    x, y = w / 2 - r, h / 2 - r
    return np.vstack([arc(cx + x, cy - y, r, -90, 0), arc(cx + x, cy + y, r, 0, 90),
                      arc(cx - x, cy + y, r, 90, 180), arc(cx - x, cy - y, r, 180, 270)])


def write(path: Path, title: str, loops, materials=None) -> None:
    lines = [f"# {title}", "# invented demo profile (warpwise sample); dimensions in mm", "units: mm"]
    for k, loop in enumerate(loops):
        lines.append("")
        if materials:
            lines.append(f"material: {materials[k]}")
        lines += [f"{x:.6f}, {y:.6f}" for x, y in loop]
    path.write_text("\n".join(lines) + "\n")


def main(out: Path) -> None:
    out.mkdir(parents=True, exist_ok=True)
    # hollow oval handrail: 42 x 32 outer, 2.5 wall, corner radius 10 outside
    write(out / "handrail_hollow.txt", "hollow handrail 42 x 32 x 2.5",
          [rounded_rectangle(42, 32, 10), rounded_rectangle(37, 27, 7.5)[::-1]])
    # solid key bar 12 x 8 with 0.6 x 45 deg chamfers
    c, b, h = 0.6, 12.0, 8.0
    key = [(c, 0), (b - c, 0), (b, c), (b, h - c), (b - c, h), (c, h), (0, h - c), (0, c)]
    write(out / "key_bar_12x8.txt", "solid key bar 12 x 8, chamfer 0.6", [key])
    # thick channel 80 deep, 40 wide, web 6, flanges 8, root radius 5 (inside corners)
    H, B, tw, tf, r = 80.0, 40.0, 6.0, 8.0, 5.0
    pts = [(0, 0), (B, 0), (B, tf)]
    pts += list(arc(tw + r, tf + r, r, 270, 180))
    pts += list(arc(tw + r, H - tf - r, r, 180, 90))
    pts += [(B, H - tf), (B, H), (0, H)]
    write(out / "channel_thick_80x40.txt", "thick channel 80 x 40 x 6/8, root radius 5", [pts])


if __name__ == "__main__":
    main(Path(sys.argv[1]) if len(sys.argv) > 1 else Path(__file__).resolve().parents[1] / "sample_sections")
