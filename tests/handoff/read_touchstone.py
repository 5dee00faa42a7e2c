"""Reads Touchstone files with scikit-rf, for tests/handoff/touchstone.test.ts.

Usage: read_touchstone.py FILE [FILE ...]; prints {"files": [{"f": [...], "z0": [...], "s": [[[[re, im], ...] per column] per row]}]}
with s[i][j] the list of S(i+1)(j+1) over frequency, as scikit-rf's own Touchstone reader gives them.
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


def network(path):
    with contextlib.redirect_stdout(io.StringIO()):
        ntw = skrf.Network(path)
    n = ntw.s.shape[1]
    s = [[[[float(v.real), float(v.imag)] for v in ntw.s[:, i, j]] for j in range(n)] for i in range(n)]
    return {"f": [float(x) for x in ntw.f], "z0": [float(numpy.real(x)) for x in ntw.z0[0]], "s": s}


print(json.dumps({"files": [network(p) for p in sys.argv[1:]]}))
