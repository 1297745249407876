#!/usr/bin/env python3
"""A random rough surface as a nappe height map (matrix format, heights in nm).

The surface is a periodic, stationary Gaussian random field with a Gaussian autocorrelation
C(r) = h² exp(−r²/ξ²) (RMS height h, correlation length ξ): white noise filtered in Fourier space
by the square root of the power spectral density, which is the Fourier transform of C
(Wiener–Khinchin theorem): PSD(q) = πξ²h² exp(−q²ξ²/4). The field is then scaled to RMS h exactly.
The file holds n × n nodes with spacing Δ; the field repeats with period n·Δ along x and y, so it
tiles a periodic cell of that size (height map Extension = periodic).

Usage: make_rough_surface.py OUT.txt --nodes 250 --spacing 4 --rms 1.0 --correlation 30 --seed 7
(spacing, rms and correlation in nm). Needs numpy.
"""
import argparse
import sys

import numpy as np


def rough_surface(nodes, spacing, rms, correlation, seed):
    rng = np.random.default_rng(seed)
    noise = rng.standard_normal((nodes, nodes))
    q = 2 * np.pi * np.fft.fftfreq(nodes, d=spacing)
    qx, qy = np.meshgrid(q, q, indexing="xy")
    filter_ = np.exp(-(qx ** 2 + qy ** 2) * correlation ** 2 / 8)  # √PSD
    field = np.real(np.fft.ifft2(np.fft.fft2(noise) * filter_))
    field -= field.mean()
    return field * (rms / np.sqrt(np.mean(field ** 2)))


def main(argv=None):
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("out")
    p.add_argument("--nodes", type=int, required=True)
    p.add_argument("--spacing", type=float, required=True, help="node spacing [nm]")
    p.add_argument("--rms", type=float, required=True, help="RMS height [nm]")
    p.add_argument("--correlation", type=float, required=True, help="correlation length ξ [nm]")
    p.add_argument("--seed", type=int, default=7)
    a = p.parse_args(argv)
    z = rough_surface(a.nodes, a.spacing, a.rms, a.correlation, a.seed)
    header = (f"# Random rough surface (Gaussian correlation): RMS height {a.rms:g} nm, correlation length "
              f"{a.correlation:g} nm, {a.nodes} x {a.nodes} nodes at {a.spacing:g} nm (period {a.nodes * a.spacing:g} nm),"
              f" seed {a.seed}; made by scripts/make_rough_surface.py. Heights in nm, row j = y_j.")
    np.savetxt(a.out, z, fmt="%.4f", header=header[2:], comments="# ")
    return 0


if __name__ == "__main__":
    sys.exit(main())
