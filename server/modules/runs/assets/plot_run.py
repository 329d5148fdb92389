#!/usr/bin/env python3
"""Plot a downloaded Sonoweave run: port powers against time and the space-time maps.

Unpack the ZIP, then in its folder:

    pip install numpy matplotlib
    python3 plot_run.py                 # writes run_traces.svg, run_maps.png; --format pdf|svg|png
    python3 plot_run.py --check         # only reads every array and checks it against manifest.json

Every array is described in manifest.json (name, file, dtype, shape, units, description). Complex arrays hold
optical envelopes A in sqrt(W): |A|^2 is power in W. Maps are [time rows, z columns].
"""
import argparse
import json
import os
import sys

import numpy as np


def load_arrays(folder):
    with open(os.path.join(folder, "manifest.json"), encoding="utf-8") as f:
        manifest = json.load(f)
    arrays = {}
    for entry in manifest["arrays"]:
        data = np.load(os.path.join(folder, entry["file"]))
        if list(data.shape) != list(entry["shape"]):
            raise ValueError(f"{entry['file']}: shape {data.shape} differs from the manifest's {entry['shape']}")
        arrays[entry["name"]] = (data, entry)
    return manifest, arrays


def port_traces(arrays):
    """Every complex trace on the time axis: (name, power in W, description)."""
    n_time = arrays["time_ns"][0].shape[0] if "time_ns" in arrays else None
    out = []
    for name, (data, entry) in arrays.items():
        if entry["dtype"] == "c16" and data.ndim == 1 and data.shape[0] == n_time:
            out.append((name, np.abs(data) ** 2, entry["description"]))
    return out


def plot(folder, fmt):
    import matplotlib

    matplotlib.use("Agg")
    import matplotlib.pyplot as plt

    manifest, arrays = load_arrays(folder)
    time_ns = arrays["time_ns"][0]
    traces = port_traces(arrays)
    fig, ax = plt.subplots(figsize=(9, 5))
    for name, power_w, description in traces:
        if power_w.max() > 0:
            ax.plot(time_ns, power_w, label=description)
    ax.set_xlabel("time (ns)")
    ax.set_ylabel("power (W)")
    if any(p.max() > 0 for _, p, _ in traces):
        ax.set_yscale("log")
    ax.legend(fontsize="small")
    ax.set_title("Port traces")
    fig.tight_layout()
    traces_file = os.path.join(folder, f"run_traces.{fmt}")
    fig.savefig(traces_file)

    maps = [(n, d, e) for n, (d, e) in arrays.items() if n.startswith("map_") and d.ndim == 2]
    if maps and "map_time_ns" in arrays and "map_z_m" in arrays:
        t = arrays["map_time_ns"][0]
        z = arrays["map_z_m"][0]
        fig, axes = plt.subplots(1, len(maps), figsize=(5 * len(maps), 4.5), squeeze=False)
        for ax, (name, data, entry) in zip(axes[0], maps):
            mesh = ax.pcolormesh(z, t, data, shading="nearest")
            fig.colorbar(mesh, ax=ax, label=entry["units"])
            ax.set_xlabel("z (m)")
            ax.set_ylabel("time (ns)")
            ax.set_title(entry["description"].split(",")[0], fontsize="small")
        fig.tight_layout()
        maps_file = os.path.join(folder, f"run_maps.{'png' if fmt == 'svg' else fmt}")
        fig.savefig(maps_file, dpi=150)
        print(f"wrote {traces_file} and {maps_file}")
    else:
        print(f"wrote {traces_file}")


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("folder", nargs="?", default=os.path.dirname(os.path.abspath(__file__)))
    parser.add_argument("--format", choices=["svg", "pdf", "png"], default="svg")
    parser.add_argument("--check", action="store_true", help="read and check every array, plot nothing")
    args = parser.parse_args()
    if args.check:
        manifest, arrays = load_arrays(args.folder)
        traces = port_traces(arrays)
        print(f"{len(arrays)} arrays match manifest.json; {len(traces)} port traces; status {manifest['status']}")
        return 0
    plot(args.folder, args.format)
    return 0


if __name__ == "__main__":
    sys.exit(main())
