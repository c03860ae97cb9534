"""Reference timing for bench/grid.ts: the same smoothing and maps with NumPy/SciPy.

Reads the float32 cube and its sidecar, differentiates every pixel with scipy.signal.savgol_filter
(window 7 samples, order 3: the filter dotspec chose on the benchmark cubes at 512 points), takes
the mean spectrum, and makes five dI/dV maps (bias-window means), three energy-integrated maps and
the current map, each with its centre and RMS radius. No peak finding or assignment (the map
biases are fixed), so it does less than `dotspec grid`.

    python3 bench/grid_numpy.py CUBE.npy
"""
import json
import sys

import numpy as np
from scipy.signal import savgol_filter

path = sys.argv[1]
side = json.load(open(path[:-4] + ".json"))
cube = np.load(path)
ny, nx, nb = cube.shape
v0, dv, _ = side["biasV"]
bias = v0 + dv * np.arange(nb)
didv = savgol_filter(cube, 7, 3, deriv=1, delta=dv, axis=2)
mean = cube.mean(axis=(0, 1))
x = side["xNM"][0] + side["xNM"][1] * np.arange(nx)
y = side["yNM"][0] + side["yNM"][1] * np.arange(ny)
X, Y = np.meshgrid(x, y)


def shape(m):
    w = np.clip(m, 0, None)
    s = w.sum()
    cx, cy = (w * X).sum() / s, (w * Y).sum() / s
    return cx, cy, np.sqrt((w * ((X - cx) ** 2 + (Y - cy) ** 2)).sum() / s)


def idx(v):
    return int(np.argmin(np.abs(bias - v)))


for v in (-0.75, 0.625, 1.0625, 1.1875, 1.3):
    a, b = idx(v - 0.009), idx(v + 0.009)
    shape(didv[:, :, a : b + 1].mean(axis=2))
for lo, hi in ((-0.79, -0.71), (0.59, 0.66), (1.02, 1.23)):
    a, b = idx(lo), idx(hi)
    shape(np.trapezoid(didv[:, :, a : b + 1], dx=dv, axis=2))
shape(cube[:, :, idx(1.22) - 1 : idx(1.22) + 2].mean(axis=2))
