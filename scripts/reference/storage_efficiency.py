#!/usr/bin/env python3
"""Independent reference for the storage efficiency of validation case V7a (docs/validation.md).

Written apart from the TypeScript solver and sharing no code with it: plain numpy, a different integrator.
It solves the lossless backward-SBS coupled-mode equations (docs/model.md; Agrawal, Nonlinear Fiber Optics,
ch. 9) in the form they take along the light's characteristics (dz = v_g dt):

    dA_p/dt = v_g i kappa_p A_s b          (pump, moving +z)
    dA_s/dt = v_g i kappa   A_p b*         (Stokes, moving -z)
    db/dt   = -(Gamma_B/2 - i Delta) b + i kappa A_p A_s*      (acoustic, at rest)

with Strang splitting: half a step of the local system at every node by classical fourth-order Runge-Kutta
(b is NOT frozen during the optical exchange), an exact shift of both waves by one cell, and another half
step. Facet nodes stand for half a cell (trapezoid weights), so the light interacts over exactly L. The
result is extrapolated in the step (Richardson, second order) from three grids.

Case (chip test waveguide): n_g = 2.44, L = 5 cm, G_B = 300 /(W m), nu_B = 7.7 GHz, Delta nu_B = 34 MHz,
1550 nm; data 10 mW, write and read 10 W, Gaussian amplitudes exp(-(t - t0)^2 / 2T^2) with T = 0.1 ns; data
and write centred at 1 ns, read at 3 ns; a 5.5 ns run. The retrieval efficiency is the energy of the
read-out field (pump output with the read pulse minus without it) in the window around the expected echo
arrival t_read + L/v_g - (t_write - t_data), +- 2 echo widths sqrt(3)*FWHM, over the launched data energy.

Run: python3 scripts/reference/storage_efficiency.py   (about ten seconds; prints 0.09389 extrapolated)
"""
import math
import numpy as np

C = 299_792_458.0
N_G, LENGTH_M, G_B = 2.44, 0.05, 300.0
NU_B, DNU_B, LAMBDA = 7.7e9, 34e6, 1550e-9
VG = C / N_G
GAMMA = 2 * math.pi * DNU_B
OMEGA_P = 2 * math.pi * C / LAMBDA
RATIO = OMEGA_P / (OMEGA_P - 2 * math.pi * NU_B)  # omega_p / omega_s at zero detuning
KAPPA = 0.5 * math.sqrt(G_B * GAMMA)
KAPPA_P = RATIO * KAPPA
T_RMS = 0.1e-9
WINDOW_S = 5.5e-9


def gaussian(peak_w, centre_s, t):
    return math.sqrt(peak_w) * np.exp(-((t - centre_s) ** 2) / (2 * T_RMS**2))


def run(cells, with_read):
    dt = LENGTH_M / (VG * cells)
    steps = int(round(WINDOW_S / dt))
    w = np.ones(cells + 1)
    w[0] = w[-1] = 0.5
    ap = np.zeros(cells + 1, complex)
    as_ = np.zeros(cells + 1, complex)
    b = np.zeros(cells + 1, complex)

    def rhs(p, s, q):
        return (w * VG * 1j * KAPPA_P * s * q, w * VG * 1j * KAPPA * p * np.conj(q), -(GAMMA / 2) * q + 1j * KAPPA * p * np.conj(s))

    def local(p, s, q, h):
        k1 = rhs(p, s, q)
        k2 = rhs(p + h / 2 * k1[0], s + h / 2 * k1[1], q + h / 2 * k1[2])
        k3 = rhs(p + h / 2 * k2[0], s + h / 2 * k2[1], q + h / 2 * k2[2])
        k4 = rhs(p + h * k3[0], s + h * k3[1], q + h * k3[2])
        return tuple(x + h / 6 * (a + 2 * c + 2 * d + e) for x, a, c, d, e in zip((p, s, q), k1, k2, k3, k4))

    def pump_in(t):
        return gaussian(0.01, 1e-9, t)

    def stokes_in(t):
        return gaussian(10.0, 1e-9, t) + (gaussian(10.0, 3e-9, t) if with_read else 0.0)

    ap[0], as_[-1] = pump_in(0.0), stokes_in(0.0)
    out = np.zeros(steps + 1, complex)
    data_j = 0.0
    for n in range(steps + 1):
        t = n * dt
        data_j += abs(pump_in(t)) ** 2 * dt
        ap, as_, b = local(ap, as_, b, dt / 2)
        out[n] = ap[-1]
        ap, as_, b = local(*shift(ap, as_, b, pump_in(t + dt), stokes_in(t + dt)), dt / 2)
    return out, dt, data_j


def shift(ap, as_, b, p_new, s_new):
    ap = np.concatenate(([p_new], ap[:-1]))
    as_ = np.concatenate((as_[1:], [s_new]))
    return ap, as_, b


def efficiency(cells):
    with_read, dt, data_j = run(cells, True)
    without, _, _ = run(cells, False)
    fwhm = 2 * math.sqrt(math.log(2)) * T_RMS
    arrival = 3e-9 + LENGTH_M / VG - (1e-9 - 1e-9)
    half = 2 * math.sqrt(3) * fwhm
    t = np.arange(len(with_read)) * dt
    inside = (t >= arrival - half) & (t <= arrival + half)
    return float(np.sum(np.abs(with_read[inside] - without[inside]) ** 2) * dt / data_j)


if __name__ == "__main__":
    grid = [100, 200, 400]
    etas = [efficiency(c) for c in grid]
    for c, e in zip(grid, etas):
        print(f"cells {c:4d}  eta(2 ns) = {e:.6f}")
    extrapolated = etas[-1] + (etas[-1] - etas[-2]) / 3
    ratio = (etas[0] - etas[1]) / (etas[1] - etas[2])
    print(f"convergence ratio {ratio:.2f} (4 for second order); Richardson-extrapolated eta(2 ns) = {extrapolated:.5f}")
