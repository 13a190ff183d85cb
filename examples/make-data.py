#!/usr/bin/env python3
# make-data.py: writes the invented measured data of the examples (fixed seed, so the files
# and the figures in README.md stay the same):
#   mould-profile.csv  a turned mould for a small bowl, measured at 121 points from the pole
#                      on its axis (r = 0, top) down its side to the flange, header r,z
#   fairing.stl        a small fairing exported as binary STL (4800 triangles), with
#                      fairing-patch.csv, a loop round its top (u,v = x,y)
#   panel-scan.csv     a scanned 300 x 200 mm dished panel on a 5 mm grid, heights with
#                      0.02 mm of measurement noise, header x,y,z
# Run from this folder: python3 make-data.py
import math
import random

rng = random.Random(20261202)

with open("mould-profile.csv", "w") as f:
    f.write("# bowl mould: spherical crown R = 120 mm to 60 degrees, measured with a CMM\n")
    f.write("r,z\n")
    n = 121
    for i in range(n):
        th = (math.pi / 3) * i / (n - 1)
        r = 0.0 if i == 0 else 120.0 * math.sin(th)
        z = 120.0 * math.cos(th)
        f.write("%.6f,%.6f\n" % (r, z))

with open("panel-scan.csv", "w") as f:
    f.write("# dished panel, laser scan resampled to a 5 mm grid, noise about 0.02 mm\n")
    f.write("x,y,z\n")
    for j in range(41):
        for i in range(61):
            x = -150.0 + 5.0 * i
            y = -100.0 + 5.0 * j
            z = 0.0008 * x * x + 0.0012 * y * y - 0.000002 * x * x * y
            f.write("%.1f,%.1f,%.4f\n" % (x, y, z + rng.gauss(0.0, 0.02)))

# A small fairing as a CAD program exports it: a binary STL (80-byte header, triangle count,
# per triangle the facet normal and three corners as little-endian float32, a 2-byte
# attribute). The fairing: a smooth hump 30 mm high over a 300 x 160 mm footprint, 60 x 40
# quads split into two triangles each.
import struct


def fairing_z(x, y):
    return 30.0 * math.exp(-((x / 110.0) ** 2 + (y / 55.0) ** 2))


with open("fairing.stl", "wb") as f:
    nx, ny = 60, 40
    f.write(b"driftframe example fairing".ljust(80, b" "))
    f.write(struct.pack("<I", 2 * nx * ny))
    for i in range(nx):
        for j in range(ny):
            q = [(-150 + 300.0 * (i + a) / nx, -80 + 160.0 * (j + b) / ny)
                 for a, b in ((0, 0), (1, 0), (1, 1), (0, 1))]
            for tri in ((0, 1, 2), (0, 2, 3)):
                p = [(q[k][0], q[k][1], fairing_z(*q[k])) for k in tri]
                u = [p[1][d] - p[0][d] for d in range(3)]
                w = [p[2][d] - p[0][d] for d in range(3)]
                n = (u[1] * w[2] - u[2] * w[1], u[2] * w[0] - u[0] * w[2], u[0] * w[1] - u[1] * w[0])
                ln = math.sqrt(sum(c * c for c in n))
                f.write(struct.pack("<3f", *(c / ln for c in n)))
                for c in p:
                    f.write(struct.pack("<3f", *c))
                f.write(b"\0\0")

with open("fairing-patch.csv", "w") as f:
    # A loop round the top of the hump, an ellipse 80 x 40 mm, anticlockwise seen from above.
    f.write("u,v\n")
    for k in range(48):
        a = 2 * math.pi * k / 48
        f.write(f"{80 * math.cos(a):.6f},{40 * math.sin(a):.6f}\n")
