"""Independent reference integrator for the validation cases of docs/validation.md.

Written apart from the TypeScript solver and sharing no code with it: plain numpy, a different integrator.
It solves the lossless backward-SBS coupled-mode equations (docs/model.md; Agrawal, Nonlinear Fiber Optics,
ch. 9) in the form they take along the light's characteristics (dz = v_g dt):

    dA_p/dt = v_g i kappa_p A_s b          (pump, moving +z)
    dA_s/dt = v_g i kappa   A_p b*         (Stokes, moving -z)
    db/dt   = -(Gamma_B/2 - i Delta) b + i kappa A_p A_s*      (acoustic, at rest)

with Strang splitting: half a step of the local system at every node by classical fourth-order Runge-Kutta
(b is NOT frozen during the optical exchange), an exact shift of both waves by one cell, and another half
step. Facet nodes stand for half a cell (trapezoid weights), so the light interacts over exactly L.

Waveguide: the chip test guide, n_g = 2.44, L = 5 cm, G_B = 300 /(W m), nu_B = 7.7 GHz, Delta nu_B = 34 MHz,
1550 nm, no loss.
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


def gaussian(peak_w, centre_s, rms_s, t):
    """Amplitude sqrt(P) exp(-(t - t0)^2 / 2T^2) in sqrt(W)."""
    return math.sqrt(peak_w) * np.exp(-((t - centre_s) ** 2) / (2 * rms_s**2))


def integrate(cells, window_s, pump_in, stokes_in):
    """Pump and Stokes outputs (complex sqrt(W) per step) and the step, for inputs given as functions of t."""
    dt = LENGTH_M / (VG * cells)
    steps = int(round(window_s / dt))
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

    ap[0], as_[-1] = pump_in(0.0), stokes_in(0.0)
    pump_out = np.zeros(steps + 1, complex)
    stokes_out = np.zeros(steps + 1, complex)
    for n in range(steps + 1):
        t = n * dt
        ap, as_, b = local(ap, as_, b, dt / 2)
        pump_out[n], stokes_out[n] = ap[-1], as_[0]
        ap = np.concatenate(([pump_in(t + dt)], ap[:-1]))
        as_ = np.concatenate((as_[1:], [stokes_in(t + dt)]))
        ap, as_, b = local(ap, as_, b, dt / 2)
    return pump_out, stokes_out, dt


def energy_j(a, dt):
    return float(np.sum(np.abs(a) ** 2) * dt)


def richardson(grid, values, label):
    """Prints each grid's value, the convergence ratio and the second-order extrapolation."""
    for c, v in zip(grid, values):
        print(f"cells {c:4d}  {label} = {v:.6f}")
    ratio = (values[0] - values[1]) / (values[1] - values[2]) if values[1] != values[2] else float("inf")
    print(f"convergence ratio {ratio:.2f} (4 for second order); extrapolated {label} = {values[-1] + (values[-1] - values[-2]) / 3:.5f}")
