#!/usr/bin/python3
"""Reference Gauss-Laguerre rules for package phononmode's depth average.

Writes the nodes and weights of the n-point Gauss-Laguerre rules
(weight e^-x on [0, inf)) that the package uses, from SciPy's
scipy.special.roots_laguerre, to laguerre_reference.json.

Run with Debian's interpreter (python3-scipy):
    /usr/bin/python3 make_laguerre_reference.py
"""
import json

import scipy
from scipy.special import roots_laguerre

rules = {}
for n in (4, 8, 16, 32, 48):
    x, w = roots_laguerre(n)
    rules[str(n)] = {"x": [float(v) for v in x], "w": [float(v) for v in w]}
with open("laguerre_reference.json", "w") as fh:
    json.dump({"generator": "scipy %s scipy.special.roots_laguerre" % scipy.__version__,
               "rules": rules}, fh, indent=1)
