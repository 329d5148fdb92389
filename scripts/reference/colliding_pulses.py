#!/usr/bin/env python3
"""Stokes energy gain of validation case V5 (docs/validation.md), from the independent integrator in
characteristics.py: a 2 W pump from z = 0 and a 50 mW Stokes pulse from z = L, both Gaussian amplitudes with
T = 0.3 ns centred at 1.5 ns, colliding in the lossless chip guide; 12 ns run. Also prints the photon balance
(Manley-Rowe) residual of the reference itself.

Run: python3 scripts/reference/colliding_pulses.py   (about half a minute)
"""
from characteristics import RATIO, energy_j, gaussian, integrate, richardson
import numpy as np

T_RMS = 0.3e-9


def gain(cells):
    def pump(t):
        return gaussian(2.0, 1.5e-9, T_RMS, t)

    def stokes(t):
        return gaussian(0.05, 1.5e-9, T_RMS, t)

    p_out, s_out, dt = integrate(cells, 12e-9, pump, stokes)
    t = np.arange(len(p_out)) * dt
    p_in, s_in = energy_j(pump(t), dt), energy_j(stokes(t), dt)
    p_o, s_o = energy_j(p_out, dt), energy_j(s_out, dt)
    residual = abs((p_in - p_o) - RATIO * (s_o - s_in)) / (p_in + RATIO * s_in)
    print(f"cells {cells:4d}  photon balance residual {residual:.1e}")
    return s_o / s_in


if __name__ == "__main__":
    grid = [100, 200, 400]
    richardson(grid, [gain(c) for c in grid], "Stokes energy gain")
