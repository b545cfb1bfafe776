"""The reduction of `benches/reduce.rs` written with vectorised numpy, as a peer to compare with.

It repeats the arithmetic of `gw_reduce::reduction::reduce` on the same log and inputs: each
channel converted to mV/V, its zero (mean of the first window) taken off, its span corrected,
turned into displayed strain, wanted load and the reading predicted from the applied loads;
each rosette's three strains mapped to (εx, εy, γxy) and reduced to principal strains, angle,
maximum shear and principal stresses, measured and predicted; each part's loads recovered with
its recovery matrix. It times that (best of 5, time.perf_counter) and checks its results against
the values the Rust reduction gave at a few samples, so both do the same work.

Not part of the project's build or CI; numpy is needed only to run it (`pip install numpy`).

Run, from the workspace root:

    GW_REDUCE_PEER_DIR=/tmp/gw_reduce_peer cargo bench -p gw-reduce --bench reduce
    python3 crates/reduce/benches/peers/reduce_peer.py /tmp/gw_reduce_peer

The bench writes `log.f64` (time, then every column, little-endian f64), `inputs.json` and
`expected.json` into that directory when GW_REDUCE_PEER_DIR is set.
"""

import json
import sys
import time
from pathlib import Path

import numpy as np


def load(directory):
    inputs = json.loads((directory / "inputs.json").read_text())
    expected = json.loads((directory / "expected.json").read_text())
    n = inputs["samples"]
    data = np.fromfile(directory / "log.f64", dtype="<f8")
    data = data.reshape(inputs["columns"] + 1, n)
    time_s = data[0]
    columns = list(data[1:])
    return inputs, expected, time_s, columns


def principal(emap, strains, youngs_modulus_pa, poisson_ratio):
    ex = emap[0][0] * strains[0] + emap[0][1] * strains[1] + emap[0][2] * strains[2]
    ey = emap[1][0] * strains[0] + emap[1][1] * strains[1] + emap[1][2] * strains[2]
    gxy = emap[2][0] * strains[0] + emap[2][1] * strains[1] + emap[2][2] * strains[2]
    mean = 0.5 * (ex + ey)
    half_diff = 0.5 * (ex - ey)
    radius = np.sqrt(half_diff * half_diff + 0.25 * gxy * gxy)
    angle = 0.5 * np.arctan2(0.5 * gxy, half_diff)
    angle = np.where(angle <= -np.pi / 2, angle + np.pi, angle)
    e1 = mean + radius
    e2 = mean - radius
    k = youngs_modulus_pa / (1.0 - poisson_ratio * poisson_ratio)
    return {
        "strain_1": e1,
        "strain_2": e2,
        "angle_rad": angle,
        "max_shear_strain": e1 - e2,
        "stress_1_pa": k * (e1 + poisson_ratio * e2),
        "stress_2_pa": k * (e2 + poisson_ratio * e1),
    }


def reduce(inputs, time_s, columns):
    times = time_s.copy()
    applied = [columns[a["column"]].copy() for a in inputs["applied"]]
    t0 = time_s[0]
    window = int(np.count_nonzero(time_s - t0 <= inputs["zero_window_s"]))
    window = min(max(window, 1), len(time_s))
    channels = []
    for ch in inputs["channels"]:
        raw = columns[ch["column"]] * ch["unit_factor"]
        zero = raw[:window].sum() / window
        mv_per_v = (raw - zero) * ch["span_factor"]
        strain = mv_per_v * ch["strain_per_mv_per_v"]
        per_load = ch["load_per_mv_per_v"]
        load_series = None if per_load is None else mv_per_v * per_load
        predicted = None
        if ch["predicted"] is not None:
            predicted = np.zeros(len(raw))
            for p in ch["predicted"]:
                predicted += p["mv_per_v_per_unit"] * applied[p["applied"]]
        channels.append(
            {
                "raw_mv_per_v": raw,
                "zero_mv_per_v": zero,
                "mv_per_v": mv_per_v,
                "strain": strain,
                "load": load_series,
                "predicted_mv_per_v": predicted,
            }
        )
    rosettes = []
    for r in inputs["rosettes"]:
        chs = [channels[i] for i in r["channels"]]
        specs = [inputs["channels"][i] for i in r["channels"]]
        e, nu = r["youngs_modulus_pa"], r["poisson_ratio"]
        measured = principal(r["map"], [c["strain"] for c in chs], e, nu)
        predicted = None
        if all(c["predicted_mv_per_v"] is not None for c in chs):
            # Each grid's strain per mV/V folded into the map's columns, as the Rust does.
            per = [s["strain_per_mv_per_v"] for s in specs]
            scaled = [[row[u] * per[u] for u in range(3)] for row in r["map"]]
            predicted = principal(scaled, [c["predicted_mv_per_v"] for c in chs], e, nu)
        rosettes.append({"measured": measured, "predicted": predicted})
    recovered = []
    for m in inputs["recovered"]:
        strains = np.stack([channels[i]["strain"] for i in m["channels"]])
        recovered.append(np.asarray(m["recovery"]) @ strains)
    return {
        "time_s": times,
        "applied": applied,
        "channels": channels,
        "rosettes": rosettes,
        "recovered": recovered,
    }


def close(name, got, want):
    got = np.asarray(got, dtype=float)
    want = np.asarray(want, dtype=float)
    scale = max(float(np.max(np.abs(want))), 1e-300)
    if not np.allclose(got, want, rtol=1e-9, atol=1e-12 * scale):
        raise SystemExit(f"{name}: numpy {got} differs from the Rust reduction {want}")


def check(result, expected):
    at = expected["samples"]
    for k, (got, want) in enumerate(zip(result["channels"], expected["channels"], strict=True)):
        close(f"channel {k} zero", got["zero_mv_per_v"], want["zero_mv_per_v"])
        for key in ("mv_per_v", "strain", "load", "predicted_mv_per_v"):
            if (got[key] is None) != (want[key] is None):
                raise SystemExit(f"channel {k} {key}: present in one reduction only")
            if got[key] is not None:
                close(f"channel {k} {key}", got[key][at], want[key])
    for k, (got, want) in enumerate(zip(result["rosettes"], expected["rosettes"], strict=True)):
        for side in ("measured", "predicted"):
            if (got[side] is None) != (want[side] is None):
                raise SystemExit(f"rosette {k} {side}: present in one reduction only")
            if got[side] is not None:
                for key, series in got[side].items():
                    close(f"rosette {k} {side} {key}", series[at], want[side][key])
    for k, (got, want) in enumerate(zip(result["recovered"], expected["recovered"], strict=True)):
        for row, (g, w) in enumerate(zip(got, want, strict=True)):
            close(f"recovered part {k} component {row}", g[at], w)


def main():
    if len(sys.argv) != 2:
        raise SystemExit("usage: reduce_peer.py <directory written by the reduce bench>")
    inputs, expected, time_s, columns = load(Path(sys.argv[1]))
    result = reduce(inputs, time_s, columns)
    check(result, expected)
    del result
    seconds = []
    for _ in range(5):
        start = time.perf_counter()
        result = reduce(inputs, time_s, columns)
        seconds.append(time.perf_counter() - start)
        del result
    print(
        f"numpy {np.__version__} peer reduce, {inputs['samples']} samples x "
        f"{len(inputs['channels'])} channels, {len(inputs['rosettes'])} rosettes, "
        f"{len(inputs['recovered'])} recoveries: best of 5 {min(seconds):.3f} s "
        f"(all: {', '.join(f'{s:.3f}' for s in seconds)}); matches the Rust reduction at "
        f"samples {expected['samples']}"
    )


if __name__ == "__main__":
    main()
