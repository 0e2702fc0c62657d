"""The one standard field set every section function returns.

Defined once so the beam and column plugins can take any section record.
Each entry: (name, dimension, unit the core computes in, description).
"""
from __future__ import annotations

from calcsheet.plugin import Field

STANDARD = [
    ("A", "[length]**2", "mm^2", "area (transformed to the reference material)"),
    ("x_c", "[length]", "mm", "centroid, x from the section's origin"),
    ("y_c", "[length]", "mm", "centroid, y from the section's origin"),
    ("I_x", "[length]**4", "mm^4", "second moment about the centroidal x axis"),
    ("I_y", "[length]**4", "mm^4", "second moment about the centroidal y axis"),
    ("I_xy", "[length]**4", "mm^4", "product of area about the centroidal axes"),
    ("I_1", "[length]**4", "mm^4", "major principal second moment"),
    ("I_2", "[length]**4", "mm^4", "minor principal second moment"),
    ("theta_p", "[angle]", "rad", "angle from the x axis to the major principal axis, anticlockwise"),
    ("y_top", "[length]", "mm", "centroid to the top fibre"),
    ("y_bot", "[length]", "mm", "centroid to the bottom fibre"),
    ("x_left", "[length]", "mm", "centroid to the left fibre"),
    ("x_right", "[length]", "mm", "centroid to the right fibre"),
    ("S_x_top", "[length]**3", "mm^3", "elastic modulus, top fibre"),
    ("S_x_bot", "[length]**3", "mm^3", "elastic modulus, bottom fibre"),
    ("S_y_left", "[length]**3", "mm^3", "elastic modulus, left fibre"),
    ("S_y_right", "[length]**3", "mm^3", "elastic modulus, right fibre"),
    ("S_x", "[length]**3", "mm^3", "smaller elastic modulus about x"),
    ("S_y", "[length]**3", "mm^3", "smaller elastic modulus about y"),
    ("Z_x", "[length]**3", "mm^3", "plastic modulus about the horizontal plastic neutral axis"),
    ("Z_y", "[length]**3", "mm^3", "plastic modulus about the vertical plastic neutral axis"),
    ("y_p", "[length]", "mm", "height of the horizontal plastic neutral axis"),
    ("x_p", "[length]", "mm", "position of the vertical plastic neutral axis"),
    ("r_x", "[length]", "mm", "radius of gyration about x"),
    ("r_y", "[length]", "mm", "radius of gyration about y"),
    ("r_min", "[length]", "mm", "least radius of gyration (minor principal axis)"),
    ("Q_x", "[length]**3", "mm^3", "first moment of the area above the centroidal x axis (shear)"),
    ("t_x", "[length]", "mm", "material width cut by the centroidal x axis (transformed), for τ = V·Q_x/(I_x·t_x)"),
    ("Q_y", "[length]**3", "mm^3", "first moment of the area right of the centroidal y axis"),
    ("t_y", "[length]", "mm", "material width cut by the centroidal y axis"),
    ("J", "[length]**4", "mm^4", "torsion constant"),
    ("depth", "[length]", "mm", "overall depth"),
    ("width", "[length]", "mm", "overall width"),
    ("mass", "[mass]/[length]", "kg/m", "mass per length (0 kg/m when no density is given)"),
    ("I_x_ref", "[length]**4", "mm^4", "second moment about the axis y = y_ref (I_x when none named)"),
    ("I_y_ref", "[length]**4", "mm^4", "second moment about the axis x = x_ref (I_y when none named)"),
]

NAMES = [name for name, *_ in STANDARD]
UNITS = {name: unit for name, _, unit, _ in STANDARD}


def section_fields() -> list[Field]:
    return [Field(n, dim, desc) for n, dim, _, desc in STANDARD] + [
        Field("shape", kind="text", doc="what the section is (also the key to its outline for built_up)")
    ]
