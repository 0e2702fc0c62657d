"""steel_design.shape: a section record from a catalogue's published properties (a W-shape, HSS, IPE, HEA …).

Why: design examples print the properties they use; a check run on those exact
numbers does not depend on any catalogue, and a sheet can use a section that is
not in one.
"""
from __future__ import annotations

from calcsheet.plugin import Field, Param

from . import namespace
from .common import FORMS, PARTIAL_FORMS, REFUSED_FORMS

_PROPS = [
    ("A", "[length]**2", "gross area"),
    ("d", "[length]", "overall depth (EN 1993: h)"),
    ("b_f", "[length]", "flange width (EN 1993: b)"),
    ("t_f", "[length]", "flange thickness"),
    ("t_w", "[length]", "web thickness"),
    ("r", "[length]", "root radius (rolled I)"),
    ("k_des", "[length]", "design distance from the outer face of the flange to the web toe of the fillet"),
    ("h_w", "[length]", "clear web depth between flanges (AISC h: less the fillets)"),
    ("I_x", "[length]**4", "second moment of area, major axis (EN 1993: I_y)"),
    ("I_y", "[length]**4", "second moment of area, minor axis (EN 1993: I_z)"),
    ("S_x", "[length]**3", "elastic section modulus, major axis (EN 1993: W_el,y)"),
    ("Z_x", "[length]**3", "plastic section modulus, major axis (EN 1993: W_pl,y)"),
    ("S_y", "[length]**3", "elastic section modulus, minor axis (EN 1993: W_el,z)"),
    ("Z_y", "[length]**3", "plastic section modulus, minor axis (EN 1993: W_pl,z)"),
    ("r_x", "[length]", "radius of gyration, major axis (EN 1993: i_y)"),
    ("r_y", "[length]", "radius of gyration, minor axis (EN 1993: i_z)"),
    ("J", "[length]**4", "torsional constant (EN 1993: I_t)"),
    ("C_w", "[length]**6", "warping constant (EN 1993: I_w)"),
    ("h_o", "[length]", "distance between flange centroids"),
    ("r_ts", "[length]", "effective radius of gyration for LTB (AISC F2-7)"),
    ("H", "[length]", "HSS overall height (depth, in the plane of major-axis bending)"),
    ("B", "[length]", "HSS overall width"),
    ("t", "[length]", "HSS design wall thickness"),
    ("D", "[length]", "round HSS / pipe outside diameter"),
    ("S_x_top", "[length]**3", "singly symmetric I: elastic modulus to the top fibre"),
    ("S_x_bot", "[length]**3", "singly symmetric I: elastic modulus to the bottom fibre"),
    ("y_top", "[length]", "singly symmetric I: the centroid to the top fibre"),
    ("y_bot", "[length]", "singly symmetric I: the centroid to the bottom fibre (default d − y_top)"),
    ("y_c", "[length]", "singly symmetric I: the centroid, measured upwards (same origin as y_p)"),
    ("y_p", "[length]", "singly symmetric I: the plastic neutral axis, measured upwards (same origin as y_c)"),
    ("r_i", "[length]", "double angles: least radius of gyration of one angle (its r_z), for E6"),
    ("b_f_bot", "[length]", "singly symmetric I: bottom flange width (b_f, t_f are the top flange's)"),
    ("t_f_bot", "[length]", "singly symmetric I: bottom flange thickness"),
    ("x_0", "[length]", "shear centre from the centroid along x (channels: behind the web, negative)"),
    ("y_0", "[length]", "shear centre from the centroid along y (tees: towards the flange)"),
    ("y_bar", "[length]", "tees: the outer face of the flange to the centroid (AISC ȳ)"),
    ("I_1", "[length]**4", "angles: major principal second moment (AISC I_w)"),
    ("I_2", "[length]**4", "angles: minor principal second moment (AISC I_z)"),
    ("theta_p", "[angle]", "angles: angle from the x axis to the major principal axis"),
]

PARAMS = [Param("name", kind="text", doc="designation, as printed (e.g. \"W18X50\")"),
          Param("form", kind="text", choices=FORMS + tuple(PARTIAL_FORMS) + tuple(REFUSED_FORMS),
                doc="I (I/H, W), C (channel), T (tee), L (single angle), 2L (double angles, back to back: compression "
                    "only), "
                    "RHS (rectangular/square HSS), "
                    "CHS (round)"),
          Param("fabrication", kind="text", choices=("rolled", "welded", "hot-finished", "cold-formed"),
                doc="how the section is made (buckling curves, G2.1(a))", default="rolled")]
PARAMS += [Param(n, dim, doc, default=None) for n, dim, doc in _PROPS]
FIELDS = [Field("name", kind="text", doc="designation"),
          Field("shape", kind="text", doc="form: I, C, T, L, RHS or CHS"),
          Field("fabrication", kind="text", doc="rolled, welded, hot-finished or cold-formed")]
FIELDS += [Field(n, dim, doc, optional=True) for n, dim, doc in _PROPS]


def shape(work, name, form, fabrication="rolled", **props):
    """A section record holding a catalogue's published properties, for the steel checks."""
    given = {k: v for k, v in props.items() if v is not None}
    if not given:
        work.fail("give the section's published properties (A=…, I_x=…, …)")
    for k, v in given.items():
        if v.magnitude <= 0 and k not in ("x_0", "y_0", "theta_p"):
            work.fail(f"{k} must be greater than zero", param=k)
    rows = [[k, dict((n, d) for n, _, d in _PROPS)[k], v] for k, v in given.items()]
    work.table(f"{name}: published properties ({form}, {fabrication})", ["Symbol", "Property", "Value"], rows)
    return {"name": name, "shape": form, "fabrication": fabrication, **given}


# the signature must list every declared parameter (the contract is checked at registration)
def _signature():
    import inspect

    params = [inspect.Parameter("work", inspect.Parameter.POSITIONAL_OR_KEYWORD),
              inspect.Parameter("name", inspect.Parameter.KEYWORD_ONLY),
              inspect.Parameter("form", inspect.Parameter.KEYWORD_ONLY),
              inspect.Parameter("fabrication", inspect.Parameter.KEYWORD_ONLY, default="rolled")]
    params += [inspect.Parameter(n, inspect.Parameter.KEYWORD_ONLY, default=None) for n, _, _ in _PROPS]
    return inspect.Signature(params)


shape.__signature__ = _signature()
# a section of its own fields (name, form, the given properties): a record type of the section family
namespace.function("shape", params=PARAMS, fields=FIELDS, returns="steel_design.shape", family="section",
                   standards=())(shape)
