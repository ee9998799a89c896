"""Reference values for thick systems and schematic eyes from SymPy's
sympy.physics.optics ray-transfer matrices (a general-purpose library from PyPI).

Prints one JSON object; tests/sympy_crosscheck.rs compares parax-optics with it.
SymPy's matrices act on (height, angle) with real (not reduced) angles, so the
equivalent power is -n' * C and the back focal distance -A / C: a different route
from parax's reduced-angle matrices.
"""

import json

from sympy import Rational, nsimplify
from sympy.physics.optics import CurvedRefraction, FreeSpace, ThinLens


def system(surfaces, n0=1):
    """surfaces: (radius mm, index after, distance to next mm); returns the matrix
    from the first surface to the last (no final distance) and the last index."""
    m = None
    n = n0
    for i, (r, n2, d) in enumerate(surfaces):
        step = CurvedRefraction(nsimplify(r) / 1000, n, nsimplify(n2))
        m = step if m is None else step * m
        n = nsimplify(n2)
        if i + 1 < len(surfaces):
            m = FreeSpace(nsimplify(d) / 1000) * m
    return m, n


def summary(surfaces):
    m, n_img = system(surfaces)
    a, c = m[0, 0], m[1, 0]
    power = -n_img * c
    back_focal = -a / c
    inner = sum(nsimplify(d) for (_, _, d) in surfaces[:-1]) / 1000
    # Refraction implied by the axial length: matrix to the retina, then the
    # far-point vergence K with y_retina = (A - B*K) y = 0 (object space n = 1).
    full = FreeSpace(nsimplify(surfaces[-1][2]) / 1000) * m
    k = full[0, 0] / full[0, 1]
    return {
        "power": float(power),
        "back_focal_from_cornea_mm": float((inner + back_focal) * 1000),
        "ocular_refraction": float(k),
    }


GULLSTRAND = [
    (7.7, 1.376, 0.5),
    (6.8, 1.336, 3.1),
    (10.0, 1.386, 0.546),
    (7.911, 1.406, 2.419),
    (-5.76, 1.386, 0.635),
    (-6.0, 1.336, 17.185),
]
LE_GRAND = [
    (7.8, 1.3771, 0.55),
    (6.5, 1.3374, 3.05),
    (10.2, 1.42, 4.0),
    (-6.0, 1.336, 16.5966),
]
LONG_REDUCED = [(Rational(50, 9), Rational(4, 3), 24)]

# Two thin lenses +5 D and +2 D, 10 cm apart, in air (CAPABILITIES §4).
two = ThinLens(Rational(1, 2)) * FreeSpace(Rational(1, 10)) * ThinLens(Rational(1, 5))

out = {
    "gullstrand": summary(GULLSTRAND),
    "le_grand": summary(LE_GRAND),
    "reduced_24mm": summary(LONG_REDUCED),
    "two_lens": {
        "power": float(-two[1, 0]),
        "back_vertex_power": float(-two[1, 0] / two[0, 0]),
    },
}
print(json.dumps(out))
