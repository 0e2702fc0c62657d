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

# Present only where they mean something (see docs/plugins/section.md); every section function declares them.
OPTIONAL = [
    ("d", "[length]", "mm", "overall depth"),
    ("b_f", "[length]", "mm", "flange width"),
    ("t_f", "[length]", "mm", "flange thickness"),
    ("t_w", "[length]", "mm", "web thickness"),
    ("t", "[length]", "mm", "wall or leg thickness (AISC HSS: the design wall)"),
    ("r", "[length]", "mm", "root radius"),
    ("k", "[length]", "mm", "AISC k_des: outer face of the flange to the web toe of the fillet"),
    ("h_o", "[length]", "mm", "distance between the flange centroids"),
    ("r_ts", "[length]", "mm", "effective radius of gyration for lateral-torsional buckling (AISC 360-16 F2-7)"),
    ("C_w", "[length]**6", "mm^6", "warping constant"),
    ("x_s", "[length]", "mm", "shear centre, x in the shape's coordinates"),
    ("y_s", "[length]", "mm", "shear centre, y in the shape's coordinates"),
    ("x_0", "[length]", "mm", "shear centre relative to the centroid, x"),
    ("y_0", "[length]", "mm", "shear centre relative to the centroid, y"),
    ("r_o", "[length]", "mm", "polar radius of gyration about the shear centre"),
    ("beta_x", "[length]", "mm", "monosymmetry property β_x"),
    ("A_m", "[length]**2", "mm^2", "area enclosed by the wall mid-line of a closed section (Bredt: q = T/(2·A_m))"),
    ("h", "[length]", "mm", "overall depth (European symbol)"),
    ("b", "[length]", "mm", "width (European symbol)"),
    ("I_z", "[length]**4", "mm^4", "second moment about the minor axis z-z (EN 1993 axes; = I_y here)"),
    ("W_el_y", "[length]**3", "mm^3", "elastic modulus about the major axis y-y (EN 1993; = S_x here)"),
    ("W_el_z", "[length]**3", "mm^3", "elastic modulus about the minor axis z-z (= S_y here)"),
    ("W_pl_y", "[length]**3", "mm^3", "plastic modulus about the major axis (= Z_x here)"),
    ("W_pl_z", "[length]**3", "mm^3", "plastic modulus about the minor axis (= Z_y here)"),
    ("i_y", "[length]", "mm", "radius of gyration about the major axis (= r_x here)"),
    ("i_z", "[length]", "mm", "radius of gyration about the minor axis (= r_y here)"),
    ("I_t", "[length]**4", "mm^4", "torsion constant (= J)"),
    ("I_w", "[length]**6", "mm^6", "warping constant (= C_w)"),
    ("A_vz", "[length]**2", "mm^2", "shear area, load parallel to the web (from the table)"),
    ("A_vy", "[length]**2", "mm^2", "shear area, load parallel to the flanges (from the table)"),
    ("E_ref", "[pressure]", "MPa", "reference elastic modulus of a transformed section"),
    ("n_max", None, "", "largest modular ratio E_i/E_ref among the parts of a transformed section"),
]
OPTIONAL_TEXT = [
    ("designation", "the catalogue designation (section.rolled only)"),
    ("source", "the table, edition and publisher of the values (section.rolled only)"),
]
ALIASES = {"h": "d", "b": "b_f", "I_z": "I_y", "W_el_y": "S_x", "W_el_z": "S_y", "W_pl_y": "Z_x", "W_pl_z": "Z_y",
           "i_y": "r_x", "i_z": "r_y", "I_t": "J", "I_w": "C_w"}
OPT_UNITS = {name: unit for name, _, unit, _ in OPTIONAL}

NAMES = [name for name, *_ in STANDARD]
UNITS = {name: unit for name, _, unit, _ in STANDARD}


def section_fields() -> list[Field]:
    absent = " (absent: this section function does not give it; see docs/plugins/section.md)"
    return [Field(n, dim, desc) for n, dim, _, desc in STANDARD] + [
        Field("shape", kind="text", doc="what the section is")
    ] + [Field(n, dim, desc + absent, kind=None if dim else "number", optional=True) for n, dim, _, desc in OPTIONAL
         ] + [Field(n, kind="text", doc=desc + absent, optional=True) for n, desc in OPTIONAL_TEXT]
