"""ISO VG grades as data: the numbers the input stage and the fluid relations both read.

ISO 3448 mid-points at 40 degC, the typical 100 degC viscosity of each grade (viscosity index 100),
and the ASTM D341 constant. Data only, no relations: specgen/calc/fluid.py computes with them and
specgen/intake reads them to judge a spec's fluid block without importing the relations.
"""

from __future__ import annotations

# ISO 3448: grade -> mid-point kinematic viscosity at 40 degC in mm^2/s. The
# grade number is the mid-point rounded, which differs for VG 2 to VG 7.
ISO_VG_MIDPOINT_MM2S = {
    2: 2.2,
    3: 3.2,
    5: 4.6,
    7: 6.8,
    10: 10.0,
    15: 15.0,
    22: 22.0,
    32: 32.0,
    46: 46.0,
    68: 68.0,
    100: 100.0,
    150: 150.0,
    220: 220.0,
    320: 320.0,
    460: 460.0,
    680: 680.0,
    1000: 1000.0,
    1500: 1500.0,
}

ISO_VG_GRADES: tuple[int, ...] = tuple(ISO_VG_MIDPOINT_MM2S)
ISO_VG_TOLERANCE = 0.10  # ISO 3448: limits are mid-point +/- 10 %

# Kinematic viscosity at 100 degC (mm^2/s) that gives viscosity index 100 for
# an oil at the grade's 40 degC mid-point. Computed (not recalled) by solving
# the ISO 2909 / ASTM D2270 relation VI = 100 <=> nu_40 = H(nu_100), with H
# the standard's tabulated 40 degC viscosity of the VI-100 reference oil,
# interpolated linearly between its 0.1 mm^2/s rows, rounded to 0.01 mm^2/s.
# VG 2 to VG 5 have nu_100 below 2 mm^2/s, where ISO 2909 defines no VI.
TYPICAL_NU100_VI100_MM2S = {
    7: 2.08,
    10: 2.66,
    15: 3.41,
    22: 4.29,
    32: 5.36,
    46: 6.76,
    68: 8.73,
    100: 11.38,
    150: 15.02,
    220: 19.44,
    320: 24.95,
    460: 31.78,
    680: 41.14,
    1000: 52.77,
    1500: 68.33,
}

WALTHER_CONSTANT_MM2S = 0.7  # ASTM D341 simple form, adequate above about 2 mm^2/s

# Grades below 2 mm^2/s at 100 degC, where ISO 2909 defines no viscosity index: no typical value.
GRADES_WITHOUT_TYPICAL_100C = frozenset(ISO_VG_MIDPOINT_MM2S) - frozenset(TYPICAL_NU100_VI100_MM2S)
