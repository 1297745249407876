#!/usr/bin/env python3
"""Maps of the electronic estimates carried by a nappe strained-lattice file.

Usage:
    python3 scripts/plot_electronics.py LATTICE.xyz [--out DIR]

Reads the extended XYZ file that nappe-solve writes with Electronics/Lattice export (per-atom columns strain_xx,
strain_yy, strain_xy and, where the material has the constants, pseudo_magnetic_field_K_T, deformation_potential_eV,
gap_shift_meV) and writes, each as
.png and .svg, next to the file (or into DIR), named <file stem>_<map>:

    areal_strain     tr(strain) in %
    pseudo_field     pseudo-magnetic field of valley K in T (valley K' has the opposite sign)
    potential        scalar deformation potential in eV
    gap_shift        optical band-gap shift in meV

over the in-plane atom positions (nm). Prints each file it wrote, one per line. Files are written under a temporary
name in the output directory and renamed when complete. Bad input: a message naming the file on stderr, exit status
2, and no figure written. Cannot write: exit status 1.

Needs numpy and matplotlib (Debian: python3-numpy, python3-matplotlib). If another python3 (e.g. pyenv) comes first
on PATH, run the script with /usr/bin/python3.
"""

import argparse
import os
import re
import sys

import nappe_plotting as npl
from nappe_plotting import InputError, np, plt
import matplotlib.tri as mtri

FOOTER = "First-order continuum estimates, not band structures — confirm with electronic-structure calculations " \
         "and measurement."

# map name: (column or None for the areal strain, title, unit, colormap, symmetric colour range)
MAPS = {
    "areal_strain": (None, "areal strain tr ε", "%", "viridis", False),
    "pseudo_field": ("pseudo_magnetic_field_K_T", "pseudo-magnetic field B, valley K (K′: −B)", "T", "RdBu_r", True),
    "potential": ("deformation_potential_eV", "deformation potential V = g tr ε", "eV", "viridis", False),
    "gap_shift": ("gap_shift_meV", "optical gap shift (trace model)", "meV", "magma", False),
}


def read_extended_xyz(path):
    """Returns (info dict, dict of per-atom arrays) of an extended XYZ file with R and S columns."""
    try:
        with open(path, encoding="utf-8") as f:
            count_line = f.readline()
            comment = f.readline()
            rows = [f.readline().split() for _ in range(int(count_line))]
    except (OSError, ValueError) as error:
        raise InputError(f"{path}: cannot read an extended XYZ file ({error})")
    fields = dict(re.findall(r'(\w+)=("[^"]*"|\S+)', comment))
    info = {k: v.strip('"') for k, v in fields.items()}
    if "Properties" not in info:
        raise InputError(f"{path}: line 2 has no Properties=… (not an extended XYZ file)")
    spec = info["Properties"].split(":")
    columns, position = {}, 0
    for name, kind, width in zip(spec[0::3], spec[1::3], spec[2::3]):
        width = int(width)
        if kind == "R":
            try:
                values = np.array([[float(r[position + k]) for k in range(width)] for r in rows])
            except (IndexError, ValueError):
                raise InputError(f"{path}: column '{name}' is not numeric on every atom line")
            columns[name] = values[:, 0] if width == 1 else values
        position += width
    if "pos" not in columns or "strain_xx" not in columns:
        raise InputError(f"{path}: expected columns pos, strain_xx, strain_yy (a nappe strained-lattice file)")
    return info, columns


def unique_plane_points(columns):
    """Indices of atoms with distinct in-plane positions (the two chalcogens of a 1H site share one)."""
    xy = np.round(columns["pos"][:, :2], 4)
    _, first = np.unique(xy, axis=0, return_index=True)
    return np.sort(first)


def draw(info, columns, name, out_dir, stem):
    column, title, unit, cmap, symmetric = MAPS[name]
    keep = unique_plane_points(columns)
    if column is None:
        values = 100 * (columns["strain_xx"] + columns["strain_yy"])
    elif column in columns:
        values = columns[column]
    else:
        return []
    x, y, v = columns["pos"][keep, 0] / 10, columns["pos"][keep, 1] / 10, values[keep]  # Å → nm
    fig, ax = plt.subplots(figsize=(7.0, 6.0))
    levels = 41
    if symmetric:
        top = max(abs(v.min()), abs(v.max()), 1e-30)
        levels = np.linspace(-top, top, 41)
    shading = ax.tricontourf(mtri.Triangulation(x, y), v, levels=levels, cmap=cmap)
    fig.colorbar(shading, ax=ax, label=f"{title} [{unit}]")
    ax.set_aspect("equal")
    ax.set_xlabel("x [nm]")
    ax.set_ylabel("y [nm]")
    material = info.get("material", "monolayer")
    ax.set_title(f"{material}, zigzag at {float(info.get('zigzag_angle_deg', 0)):.1f}° from x\n"
                 f"{title}: {v.min():.4g} to {v.max():.4g} {unit}", fontsize=10)
    fig.text(0.5, 0.01, FOOTER, ha="center", va="bottom", fontsize=7, style="italic", color="0.3")
    fig.tight_layout(rect=(0, 0.03, 1, 1))
    try:
        return npl.save_atomically(fig, out_dir, f"{stem}_{name}")
    finally:
        plt.close(fig)


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("lattice", help="extended XYZ file written by nappe (…_lattice.xyz)")
    parser.add_argument("--out", help="directory for the maps (default: the file's directory)")
    args = parser.parse_args(argv)
    try:
        info, columns = read_extended_xyz(args.lattice)
    except InputError as error:
        sys.stderr.write(f"plot_electronics: {error}\n")
        return 2
    out_dir = args.out or os.path.dirname(os.path.abspath(args.lattice))
    stem = os.path.splitext(os.path.basename(args.lattice))[0]
    try:
        os.makedirs(out_dir, exist_ok=True)
        for name in MAPS:
            for path in draw(info, columns, name, out_dir, stem):
                print(path)
    except OSError as error:
        sys.stderr.write(f"plot_electronics: cannot write into {out_dir}: {error}\n")
        return 1
    return 0


if __name__ == "__main__":
    sys.exit(main())
