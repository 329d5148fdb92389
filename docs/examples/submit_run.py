#!/usr/bin/env python3
"""Submit a simulation run with an API token, follow it, download its ZIP and read an array with numpy.

    pip install requests numpy
    export SONOWEAVE_URL=http://127.0.0.1:3001      # where the app is served
    export SONOWEAVE_TOKEN=swt_...                  # from the API tokens page (shown once)
    python3 docs/examples/submit_run.py             # optional: --group <id> --out run.zip --summary summary.json

The run is a Stokes seed amplified by a counter-propagating Gaussian pump in a 5 cm rib waveguide (invented
example values). The API is described at /api/openapi.json and on the API page of the app.
"""
import argparse
import io
import json
import os
import sys
import uuid
import zipfile

import numpy as np
import requests

FINAL_STATES = {"succeeded", "failed", "cancelled"}

# Units are in the field names (lengthM, fwhmNs, peakPowerW); fields left out take their documented defaults.
CONFIG = {
    "waveguide": {
        "name": "Example rib, 5 cm",
        "lengthM": 0.05,
        "groupIndex": 2.4,
        "effectiveAreaUm2": 1.2,
        "gainCoefficientMPerW": 2.5e-10,
        "brillouinShiftGHz": 7.6,
        "linewidthMHz": 40,
        "wavelengthNm": 1550,
    },
    "channels": [
        {
            "pump": {"pulses": [{"shape": "gaussian", "peakPowerW": 0.8, "centreNs": 3.0, "fwhmNs": 0.5}], "backgroundPowerW": 0},
            "stokes": {"pulses": [], "backgroundPowerW": 0.001},
        }
    ],
    "windowNs": 8,
    "grid": {"timeStepPs": 5, "mapRows": 32, "mapCols": 32},
}


def api_error(res):
    """The message of the API's error envelope: {"error": {"code", "message", "fields": [{"path", "message"}]}}."""
    try:
        err = res.json()["error"]
    except (ValueError, KeyError):
        return f"HTTP {res.status_code}"
    fields = "; ".join(f"{f['path']}: {f['message']}" for f in err.get("fields", []))
    return f"{err['message']} ({err['code']})" + (f" — {fields}" if fields else "")


def check(res, *ok):
    if res.status_code not in ok:
        sys.exit(f"{res.request.method} {res.url} answered {res.status_code}: {api_error(res)}")
    return res


def pick_group(session, base):
    """The first group in which the token's owner may submit runs."""
    me = check(session.get(f"{base}/api/me"), 200).json()
    for m in me["memberships"]:
        if m["role"] in ("editor", "owner"):
            return m["groupId"]
    sys.exit("The token's account is not an editor of any group; ask a group owner to invite you.")


def sse_events(res):
    """(id, event, data) of a text/event-stream answer; comment lines (pings) are skipped."""
    event_id, event, data = None, "message", []
    for line in res.iter_lines(decode_unicode=True):
        if line == "":
            if data:
                yield event_id, event, json.loads("\n".join(data))
            event, data = "message", []
        elif line.startswith(":"):
            continue
        else:
            field, _, value = line.partition(":")
            value = value[1:] if value.startswith(" ") else value
            if field == "id":
                event_id = value
            elif field == "event":
                event = value
            elif field == "data":
                data.append(value)


def follow(session, base, run_id):
    """Follows the run's events until a final state; reconnects after the last event id if the stream drops."""
    last_id = None
    for _ in range(20):
        headers = {"Accept": "text/event-stream", **({"Last-Event-ID": last_id} if last_id else {})}
        with session.get(f"{base}/api/runs/{run_id}/events", headers=headers, stream=True, timeout=(10, 120)) as res:
            if res.status_code == 204:  # finished, nothing new since last_id
                break
            check(res, 200)
            try:
                for event_id, event, data in sse_events(res):
                    last_id = event_id or last_id
                    if event == "progress":
                        print(f"  progress {data['fraction'] * 100:5.1f} %")
                    elif event == "status":
                        print(f"  status {data['status']}")
                        if data["status"] in FINAL_STATES:
                            return data["status"]
            except requests.exceptions.RequestException as e:
                print(f"  stream interrupted ({e.__class__.__name__}); reconnecting")
    # The stream ended without a final status (or kept dropping): ask for the run itself.
    return check(session.get(f"{base}/api/runs/{run_id}"), 200).json()["status"]


def main():
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--url", default=os.environ.get("SONOWEAVE_URL", "http://127.0.0.1:3001"))
    p.add_argument("--group", default=os.environ.get("SONOWEAVE_GROUP"), help="group id (default: your first group as editor)")
    p.add_argument("--out", help="also save the ZIP here")
    p.add_argument("--summary", help="write what was read as JSON here")
    args = p.parse_args()
    token = os.environ.get("SONOWEAVE_TOKEN")
    if not token:
        sys.exit("Set SONOWEAVE_TOKEN to an API token (API tokens page of the app).")
    base = args.url.rstrip("/")

    session = requests.Session()
    session.headers["Authorization"] = f"Bearer {token}"
    group_id = args.group or pick_group(session, base)

    # The Idempotency-Key makes a retried POST return the first run instead of queueing a second one.
    body = {"groupId": group_id, "title": "Stokes amplifier from a script", "notes": "docs/examples/submit_run.py", "config": CONFIG}
    run = check(session.post(f"{base}/api/runs", json=body, headers={"Idempotency-Key": str(uuid.uuid4())}), 202).json()
    print(f"run {run['id']} queued")

    status = follow(session, base, run["id"])
    if status != "succeeded":
        detail = check(session.get(f"{base}/api/runs/{run['id']}"), 200).json()
        sys.exit(f"run {status}: {detail.get('error') or 'no reason given'}")

    archive = check(session.get(f"{base}/api/runs/{run['id']}/download"), 200).content
    if args.out:
        with open(args.out, "wb") as f:
            f.write(archive)
    with zipfile.ZipFile(io.BytesIO(archive)) as z:
        manifest = json.loads(z.read("manifest.json"))
        time_ns = np.load(io.BytesIO(z.read("time_ns.npy")))
        stokes_out = np.load(io.BytesIO(z.read("ch1_stokes_out.npy")))  # complex envelope, sqrt(W)
    power_w = np.abs(stokes_out) ** 2
    peak = int(np.argmax(power_w))
    print(f"{len(manifest['arrays'])} arrays; Stokes output peaks at {power_w[peak] * 1e3:.3f} mW at t = {time_ns[peak]:.3f} ns")

    if args.summary:
        with open(args.summary, "w") as f:
            json.dump(
                {
                    "runId": run["id"],
                    "status": status,
                    "arrays": [a["name"] for a in manifest["arrays"]],
                    "stokesOutDtype": str(stokes_out.dtype),
                    "stokesOutShape": list(stokes_out.shape),
                    "stokesOutPeakPowerW": float(power_w[peak]),
                    "stokesOutPeakTimeNs": float(time_ns[peak]),
                    "stokesOutFirst": [float(stokes_out[0].real), float(stokes_out[0].imag)],
                },
                f,
            )


if __name__ == "__main__":
    main()
