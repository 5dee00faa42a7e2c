"""Benchmark counterpart of tests/bench/engine.bench.ts: the same chain analysed by a plain numpy
ABCD cascade (per-element (n, 2, 2) matrices multiplied with @) and by scikit-rf (its element
models, ** cascade, termination). Reads {"chain": {"load", "elements", "z0"}, "startHz", "stopHz",
"runs": [{"points": n, "numpyReps": k, "skrfReps": k}]} on stdin; prints median wall times in ms.
"""
import json
import sys
import time

import numpy as np

from skrf_chain import C0, element_network, load_impedance, skrf, DefinedGammaZ0  # scikit-rf with the numpy aliases


def line_constants(e, f):
    alpha = e.get("lossDbPerM", 0.0) * np.log(10) / 20.0
    length = e["length"]
    if "degrees" in length:
        meters = length["degrees"] / 360.0 * C0 / length["atHz"]
        beta_l = np.deg2rad(length["degrees"]) * f / length["atHz"]
    else:
        meters = length["meters"]
        beta_l = 2 * np.pi * f * meters / (length["velocityFactor"] * C0)
    return alpha * meters + 1j * beta_l


def element_abcd(e, f, w):
    n = len(f)
    m = np.zeros((n, 2, 2), dtype=complex)
    k = e["kind"]
    q = e.get("q")
    if k in ("series-l", "series-c", "series-r"):
        if k == "series-l":
            z = 1j * w * e["value"] + (w * e["value"] / q if q else 0)
        elif k == "series-c":
            z = 1 / (1j * w * e["value"] + (w * e["value"] / q if q else 0))
        else:
            z = e["value"]
        m[:, 0, 0] = 1
        m[:, 0, 1] = z
        m[:, 1, 1] = 1
    elif k in ("shunt-l", "shunt-c", "shunt-r"):
        if k == "shunt-l":
            y = 1 / (1j * w * e["value"] + (w * e["value"] / q if q else 0))
        elif k == "shunt-c":
            y = 1j * w * e["value"] + (w * e["value"] / q if q else 0)
        else:
            y = 1 / e["value"]
        m[:, 0, 0] = 1
        m[:, 1, 0] = y
        m[:, 1, 1] = 1
    elif k == "line":
        gl = line_constants(e, f)
        ch, sh = np.cosh(gl), np.sinh(gl)
        m[:, 0, 0] = ch
        m[:, 0, 1] = e["z0"] * sh
        m[:, 1, 0] = sh / e["z0"]
        m[:, 1, 1] = ch
    elif k in ("open-stub", "short-stub"):
        t = np.tanh(line_constants(e, f))
        y = t / e["z0"] if k == "open-stub" else 1 / (e["z0"] * t)
        m[:, 0, 0] = 1
        m[:, 1, 0] = y
        m[:, 1, 1] = 1
    elif k == "transformer":
        m[:, 0, 0] = e["ratio"]
        m[:, 1, 1] = 1 / e["ratio"]
    else:
        raise ValueError(k)
    return m


def numpy_analyze(f, chain):
    z0 = chain["z0"]
    w = 2 * np.pi * f
    t = np.zeros((len(f), 2, 2), dtype=complex)
    t[:, 0, 0] = 1
    t[:, 1, 1] = 1
    for e in chain["elements"]:  # load -> port: T = M_k ... M_0
        t = element_abcd(e, f, w) @ t
    a, b, c, d = t[:, 0, 0], t[:, 0, 1], t[:, 1, 0], t[:, 1, 1]
    zl = load_impedance_np(chain["load"], w)
    zin = (a * zl + b) / (c * zl + d)
    g = (zin - z0) / (zin + z0)
    mag = np.abs(g)
    vswr = (1 + mag) / (1 - mag)
    rl = -20 * np.log10(mag)
    ml = -10 * np.log10(1 - mag ** 2)
    p = 4 * zl.real * z0 / np.abs((a * zl + b) + z0 * (c * zl + d)) ** 2
    delta = a + b / z0 + c * z0 + d
    s11 = (a + b / z0 - c * z0 - d) / delta
    s12 = 2 * (a * d - b * c) / delta
    s21 = 2 / delta
    s22 = (-a + b / z0 - c * z0 + d) / delta
    return zin, g, vswr, rl, ml, p, s11, s12, s21, s22


def load_impedance_np(load, w):
    class F:
        pass
    fake = F()
    fake.w = w
    return load_impedance(fake, load)


def skrf_analyze(f, chain):
    z0 = chain["z0"]
    freq = skrf.Frequency.from_f(f, unit="hz")
    m = DefinedGammaZ0(freq, z0=z0, Z0=z0)
    ntw = m.thru()
    for e in reversed(chain["elements"]):
        ntw = ntw ** element_network(freq, m, z0, e)
    zl = load_impedance(freq, chain["load"])
    load = skrf.Network(frequency=freq, s=((zl - z0) / (zl + z0)).reshape(-1, 1, 1), z0=z0)
    term = ntw ** load
    return term.z[:, 0, 0], term.s[:, 0, 0], ntw.s


def median_ms(fn, reps):
    times = []
    fn()
    for _ in range(reps):
        t0 = time.perf_counter()
        fn()
        times.append((time.perf_counter() - t0) * 1000)
    times.sort()
    return times[len(times) // 2]


def main():
    job = json.load(sys.stdin)
    chain = job["chain"]
    out = {"numpy": {}, "skrf": {}}
    for run in job["runs"]:
        f = np.linspace(job["startHz"], job["stopHz"], run["points"])
        key = str(run["points"])
        out["numpy"][key] = median_ms(lambda: numpy_analyze(f, chain), run["numpyReps"])
        zin = numpy_analyze(f, chain)[0]
        out.setdefault("zinSample", {})[key] = [[float(zin[i].real), float(zin[i].imag)] for i in (0, len(f) // 2, len(f) - 1)]
        if run.get("skrfReps", 0) > 0:
            out["skrf"][key] = median_ms(lambda: skrf_analyze(f, chain), run["skrfReps"])
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
