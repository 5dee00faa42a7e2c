"""Reference chains computed with scikit-rf, for tests/rf/reference-skrf.test.ts.

Reads JSON on stdin: {"cases": [{"freqs": [...], "z0": 50, "load": LOAD, "elements": [ELEMENT, ...]}]}
with LOAD and ELEMENT as in the Matchloom design file (lumped, line, stubs, transformer; impedance
and rlc loads), and prints {"results": [{"zin": [[re, im]...], "s11": ..., "s21": ..., "s12": ...,
"s22": ...}]} computed by scikit-rf's own element models (inductor, capacitor, resistor, shunt_*,
DefinedGammaZ0.line, shunt_delay_open/short) and its cascade (**) and renormalize. Only the
conventions (how a design element maps to those models) are written here.
"""
import contextlib
import io
import json
import sys

import numpy
numpy.complex = complex
numpy.float = float
numpy.int = int
with contextlib.redirect_stdout(io.StringIO()):  # scikit-rf prints a note when matplotlib is missing
    import skrf
    from skrf.media import DefinedGammaZ0

C0 = 299792458.0


def series_y(m, y):
    """A series element of admittance y (array): two-port y-matrix [[y, -y], [-y, y]] as scikit-rf builds its capacitor."""
    ntw = m.match(nports=2)
    ym = numpy.zeros(ntw.s.shape, dtype=complex)
    ym[:, 0, 0] = y
    ym[:, 1, 1] = y
    ym[:, 0, 1] = -y
    ym[:, 1, 0] = -y
    ntw.y = ym
    return ntw


def line_media(freq, e):
    f = freq.f
    alpha = e.get("lossDbPerM", 0.0) * numpy.log(10) / 20.0
    length = e["length"]
    if "degrees" in length:
        meters = length["degrees"] / 360.0 * C0 / length["atHz"]
        vf = 1.0
    else:
        meters = length["meters"]
        vf = length["velocityFactor"]
    beta = 2 * numpy.pi * f / (vf * C0)
    media = DefinedGammaZ0(freq, z0=e["z0"], Z0=e["z0"], gamma=alpha + 1j * beta)
    return media, meters


def element_network(freq, m, z0, e):
    w = freq.w
    k = e["kind"]
    q = e.get("q")
    if k == "series-l":
        n = m.inductor(e["value"])
        return m.resistor(w * e["value"] / q) ** n if q else n
    if k == "series-c":
        if q:
            return series_y(m, w * e["value"] / q + 1j * w * e["value"])
        return m.capacitor(e["value"])
    if k == "series-r":
        return m.resistor(e["value"])
    if k == "shunt-l":
        if q:
            return m.shunt(m.resistor(w * e["value"] / q) ** m.inductor(e["value"]) ** m.short())
        return m.shunt_inductor(e["value"])
    if k == "shunt-c":
        if q:
            return m.shunt(series_y(m, w * e["value"] / q + 1j * w * e["value"]) ** m.short())
        return m.shunt_capacitor(e["value"])
    if k == "shunt-r":
        return m.shunt(m.resistor(e["value"]) ** m.short())
    if k in ("line", "open-stub", "short-stub"):
        media, meters = line_media(freq, e)
        if k == "line":
            ntw = media.line(meters, "m")
        elif k == "open-stub":
            ntw = media.shunt_delay_open(meters, "m")
        else:
            ntw = media.shunt_delay_short(meters, "m")
        ntw.renormalize(z0)
        return ntw
    if k == "transformer":
        # Ideal n:1 transformer between two z0 ports (port 1 sees n^2 times port 2's impedance).
        n = e["ratio"]
        ntw = m.match(nports=2)
        s = numpy.zeros(ntw.s.shape, dtype=complex)
        s[:, 0, 0] = (n * n - 1) / (n * n + 1)
        s[:, 1, 1] = -(n * n - 1) / (n * n + 1)
        s[:, 0, 1] = 2 * n / (n * n + 1)
        s[:, 1, 0] = 2 * n / (n * n + 1)
        ntw.s = s
        return ntw
    raise ValueError("unsupported kind " + k)


def load_impedance(freq, load):
    w = freq.w
    if load["kind"] == "impedance":
        return numpy.full(len(w), complex(*load["ohms"]))
    if load["kind"] == "rlc":
        r, l, c = load["r"], load.get("l"), load.get("c")
        if load["topology"] == "series":
            z = r + 0j * w
            if l is not None:
                z = z + 1j * w * l
            if c is not None:
                z = z + 1 / (1j * w * c)
            return z
        y = 1 / r + 0j * w
        if l is not None:
            y = y + 1 / (1j * w * l)
        if c is not None:
            y = y + 1j * w * c
        return 1 / y
    raise ValueError("unsupported load " + load["kind"])


def pairs(a):
    return [[float(v.real), float(v.imag)] for v in a]


def run_case(case):
    freq = skrf.Frequency.from_f(numpy.array(case["freqs"], dtype=float), unit="hz")
    z0 = float(case["z0"])
    m = DefinedGammaZ0(freq, z0=z0, Z0=z0)
    chain = m.thru()
    # The design lists elements load -> port; scikit-rf cascades port -> load.
    for e in reversed(case["elements"]):
        chain = chain ** element_network(freq, m, z0, e)
    zl = load_impedance(freq, case["load"])
    gl = (zl - z0) / (zl + z0)
    load = skrf.Network(frequency=freq, s=gl.reshape(-1, 1, 1), z0=z0)
    zin = (chain ** load).z[:, 0, 0]
    if "sZ0" in case:  # S of the chain on another reference (to write Touchstone data on it)
        chain.renormalize(float(case["sZ0"]))
    s = chain.s
    return {"zin": pairs(zin), "s11": pairs(s[:, 0, 0]), "s12": pairs(s[:, 0, 1]), "s21": pairs(s[:, 1, 0]), "s22": pairs(s[:, 1, 1])}


def main():
    cases = json.load(sys.stdin)["cases"]
    json.dump({"results": [run_case(c) for c in cases]}, sys.stdout)


if __name__ == "__main__":
    main()
