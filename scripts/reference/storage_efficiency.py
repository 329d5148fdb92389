#!/usr/bin/env python3
"""Storage efficiency of validation case V7a (docs/validation.md), from the independent integrator in
characteristics.py.

Data 10 mW, write and read 10 W, Gaussian amplitudes with T = 0.1 ns; data and write centred at 1 ns, read at
3 ns; a 5.5 ns run. The retrieval efficiency is the energy of the read-out field (pump output with the read
pulse minus without it) in the window around the expected echo arrival t_read + L/v_g - (t_write - t_data),
+- 2 echo widths sqrt(3)*FWHM, over the launched data energy.

Run: python3 scripts/reference/storage_efficiency.py   (about ten seconds; prints 0.09389 extrapolated)
"""
import math
import numpy as np
from characteristics import LENGTH_M, VG, gaussian, integrate, richardson

T_RMS = 0.1e-9


def efficiency(cells):
    def data(t):
        return gaussian(0.01, 1e-9, T_RMS, t)

    def write_read(t):
        return gaussian(10.0, 1e-9, T_RMS, t) + gaussian(10.0, 3e-9, T_RMS, t)

    def write_only(t):
        return gaussian(10.0, 1e-9, T_RMS, t)

    with_read, _, dt = integrate(cells, 5.5e-9, data, write_read)
    without, _, _ = integrate(cells, 5.5e-9, data, write_only)
    t = np.arange(len(with_read)) * dt
    data_j = float(np.sum(np.abs(data(t)) ** 2) * dt)
    fwhm = 2 * math.sqrt(math.log(2)) * T_RMS
    arrival = 3e-9 + LENGTH_M / VG - (1e-9 - 1e-9)
    half = 2 * math.sqrt(3) * fwhm
    inside = (t >= arrival - half) & (t <= arrival + half)
    return float(np.sum(np.abs(with_read[inside] - without[inside]) ** 2) * dt / data_j)


if __name__ == "__main__":
    grid = [100, 200, 400]
    richardson(grid, [efficiency(c) for c in grid], "eta(2 ns)")
