"""timber: member design to EN 1995-1-1 (Eurocode 5) and the NDS 2018 (ASD), with its factors as data.

Sheet syntax::

    j = timber_design.ec5_beam(grade="C24", b=75 mm, h=225 mm, L=3.6 m, M_d=M, V_d=V,
                        service_class=2, duration="medium-term", F_c_90_d=R, l_b=50 mm,
                        w_G=w_g, w_Q=w_q, psi_2=0.3, limit_inst=300, limit_fin=250)
    check j.U_bending <= 1
    p = timber_design.ec5_column(grade="GL24h", b=140 mm, h=140 mm, L=3 m, N_d=N, M_y_d=M)
    s = timber_design.ec5_strengths(grade="C16", h=250 mm, service_class=2, duration="medium-term")

    jn = timber_design.nds_beam(species="Douglas Fir-Larch", grade="No.2", size="2x10", L=14 ft, M=M, V=V,
                         load_duration="10 years", repetitive="yes", w_LT=w_D, w_ST=w_L, ...)
    pn = timber_design.nds_column(species="Douglas Fir-Larch", grade="No.2", size="4x6", L=9 ft, P=P)

Data (with standard, edition and table in each file): en338_2009.toml, en14080_2013.toml, ec5_factors.toml,
nds2018_values.toml, nds2018_factors.toml. See docs/plugins/timber.md for every clause covered.
"""
from calcsheet.plugin import Namespace

# The standards and editions this plugin implements; the package's design-basis block reads them.
STANDARDS = (
    "EN 1995-1-1:2004+AC:2006+A1:2008",
    "EN 338:2009 (strength classes)",
    "EN 14080:2013 (glulam strength classes)",
    "ANSI/AWC NDS-2018 (ASD) and NDS Supplement 2018",
)
namespace = Namespace("timber_design", version="0.1.0",
                      doc="Timber members to EN 1995-1-1 and the NDS 2018 (ASD): factors and classes as data",
                      standards=STANDARDS)

from . import ec5 as _ec5  # noqa: E402,F401  (registers the functions)
from . import nds as _nds  # noqa: E402,F401
