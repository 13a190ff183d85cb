#!/usr/bin/env python3
# make-data.py: writes the invented measured data of the examples (fixed seed, so the files
# and the figures in README.md stay the same):
#   mould-profile.csv  a turned mould for a small bowl, measured at 121 points from the pole
#                      on its axis (r = 0, top) down its side to the flange, header r,z
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
