#!/usr/bin/env python3
"""Draws the add-in icons assets/icon-16.png, icon-32.png and icon-80.png (the sizes the manifest names).

The design: a teal rounded square holding a rising scatter of white dots, a white fitted line, and one orange
diamond: the panel's mark for a flagged point. Pure standard library (zlib + struct), 4x4 supersampling for
smooth edges. Run from the repository root:  python3 scripts/make-icons.py
"""
import math
import struct
import zlib

TEAL = (15, 107, 115)
WHITE = (255, 255, 255)
ORANGE = (217, 97, 28)
EDGE = (92, 34, 8)

# Shapes in unit coordinates (0..1, y downwards).
DOTS = [(0.27, 0.70), (0.40, 0.60), (0.50, 0.50), (0.62, 0.45), (0.36, 0.45), (0.70, 0.32)]
LINE = ((0.20, 0.76), (0.80, 0.28))
DIAMOND = (0.70, 0.68)


def rounded_square(u, v, radius=0.2):
    cx = min(max(u, radius), 1 - radius)
    cy = min(max(v, radius), 1 - radius)
    return (u - cx) ** 2 + (v - cy) ** 2 <= radius ** 2 and 0 <= u <= 1 and 0 <= v <= 1


def near_segment(u, v, a, b, half_width):
    ax, ay = a
    bx, by = b
    dx, dy = bx - ax, by - ay
    t = max(0.0, min(1.0, ((u - ax) * dx + (v - ay) * dy) / (dx * dx + dy * dy)))
    px, py = ax + t * dx, ay + t * dy
    return (u - px) ** 2 + (v - py) ** 2 <= half_width ** 2


def colour_at(u, v, size):
    if not rounded_square(u, v):
        return None
    # Small icons get relatively bigger marks so they stay visible.
    scale = 1.0 if size >= 32 else 1.35
    dot_r = 0.055 * scale
    du, dv = u - DIAMOND[0], v - DIAMOND[1]
    d = abs(du) + abs(dv)
    if d <= 0.11 * scale:
        return EDGE if d > 0.11 * scale - (0.03 if size >= 32 else 0.045) else ORANGE
    if near_segment(u, v, LINE[0], LINE[1], 0.022 * scale):
        return WHITE
    for (x, y) in DOTS:
        if (u - x) ** 2 + (v - y) ** 2 <= dot_r ** 2:
            return WHITE
    return TEAL


def render(size, samples=4):
    rows = []
    for j in range(size):
        row = bytearray()
        for i in range(size):
            acc = [0, 0, 0, 0]
            for sj in range(samples):
                for si in range(samples):
                    u = (i + (si + 0.5) / samples) / size
                    v = (j + (sj + 0.5) / samples) / size
                    c = colour_at(u, v, size)
                    if c is not None:
                        acc[0] += c[0]
                        acc[1] += c[1]
                        acc[2] += c[2]
                        acc[3] += 255
            n = samples * samples
            alpha = acc[3] / n
            if alpha > 0:
                covered = acc[3] / 255
                row += bytes([round(acc[0] / covered), round(acc[1] / covered), round(acc[2] / covered), round(alpha)])
            else:
                row += bytes([0, 0, 0, 0])
        rows.append(bytes(row))
    return rows


def png(size, rows):
    def chunk(kind, data):
        body = kind + data
        return struct.pack('>I', len(data)) + body + struct.pack('>I', zlib.crc32(body) & 0xFFFFFFFF)

    raw = b''.join(b'\x00' + r for r in rows)  # filter type 0 on every scanline
    header = struct.pack('>IIBBBBB', size, size, 8, 6, 0, 0, 0)  # 8-bit RGBA
    return b'\x89PNG\r\n\x1a\n' + chunk(b'IHDR', header) + chunk(b'IDAT', zlib.compress(raw, 9)) + chunk(b'IEND', b'')


if __name__ == '__main__':
    for size in (16, 32, 80):
        with open(f'assets/icon-{size}.png', 'wb') as f:
            f.write(png(size, render(size)))
        print(f'assets/icon-{size}.png')
