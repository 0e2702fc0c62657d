"""Published section tables: loading, forgiving designation matching, and each family's geometric model.

Data files live in ``catalogue/`` with their source, edition and licence in their header lines. A row is read
into a ``Row`` holding the table's own values converted to millimetres (and kg/m), plus the dimensions its
geometric model needs.
"""
from __future__ import annotations

import csv
import difflib
import re
from dataclasses import dataclass, field
from functools import lru_cache
from pathlib import Path

HERE = Path(__file__).parent / "catalogue"
IN = 25.4
LB_FT = 0.45359237 / 0.3048  # kg/m per lb/ft

AISC_SOURCE = "AISC Shapes Database v16.0 (American Institute of Steel Construction)"
EN_I_SOURCE = "European I and H sections, dimensions to EN 10365:2017 (values as tabulated by eurocodepy 2026.1.1)"
EN_HOLLOW_SOURCE = "EN 10210-2:2019 hot-finished hollow sections (values as tabulated by eurocodepy 2026.1.1)"
UPN_SOURCE = ("European taper-flange channels UPN, dimensions to DIN 1026-1:2009 (as tabulated by "
              "structuralcodes 0.7.2, fib)")

# family -> (file, kind of geometric model)
AISC_FILES = {"W": ("W", "I"), "M": ("M", "I"), "S": ("S", "I-tapered"), "HP": ("HP", "I"), "C": ("C", "C-tapered"),
              "MC": ("MC", "C"), "L": ("L", "L"), "WT": ("WT", "T"), "HSS": ("HSS_rect", "box-aisc"),
              "HSS_R": ("HSS_round", "tube"), "PIPE": ("Pipe", "tube"), "MT": ("MT", "T"), "ST": ("ST", "T-tapered"),
              "2L": ("2L", "2L")}


# S shapes, ST tees and C channels: inner flange faces slope 2 in 12 (16-2/3 %), t_f the average thickness, at the
# middle of the outstand (AISC Manual, 16th ed., Part 1; # from memory; C12X20.7's 0.723/0.280 in at root/tip in the
# 1923 Carnegie pocket companion agrees). MC slopes vary by size and are not tabulated: each MC row's slope is derived
# from its own values (aisc_v16_derived.csv); an MC without a derived row would keep parallel flanges (model "C").
AISC_FLANGE_SLOPE = 2 / 12
# S, C and MC toe radii (not tabulated): half the root radius, the proportion of taper-flange channels to DIN 1026-1
# (en_upn.csv: r2 = r1/2; # common practice); see tools/derive_aisc_profiles.py
AISC_TOE_RATIO = 0.5
# UPN (DIN 1026-1): 8 % for h <= 300 mm, t_f at b/2 from the back of the web; 5 % above, t_f at the middle of the
# outstand (# from memory; the same rule as structuralcodes 0.7.2 builds)
UPN_SLOPES = ((300.0, 0.08, "half"), (float("inf"), 0.05, "outstand"))
STEEL_DENSITY = 7850.0  # kg/m³, the density product standards use for nominal masses (# from memory, EN 10279)


@dataclass
class Entry:
    designation: str  # as printed
    family: str
    model: str  # "I", "T", "L", "box-aisc", "box-en", "tube", "I-tapered", "C-tapered", "T-tapered", "2L"
    source: str
    file: str
    dims: dict[str, float] = field(default_factory=dict)  # mm: h, b, t_f, t_w, r, t, k
    values: dict[str, float] = field(default_factory=dict)  # field name -> value in the field's unit (mm…, kg/m)
    raw: dict[str, str] = field(default_factory=dict)  # the table row as printed, with its units
    units: dict[str, str] = field(default_factory=dict)
    derived: dict[str, str] = field(default_factory=dict)  # values not in the table, computed here: name -> how
    derived_profile: dict | None = None  # radii (and slope) derived from the table's values (aisc_v16_derived.csv)


def key(text: str) -> str:
    """The matching key: upper case, no spaces, '-', '/', '.', ',' and '_' all alike, '×' as 'X'."""
    t = text.upper().replace("×", "X").replace("*", "X")
    t = re.sub(r"\s+", " ", t.strip())
    m = re.fullmatch(r"HE ?(\d+) ?([ABM])|HE ?([ABM]) ?(\d+)", t)
    if m:
        num, letter = (m.group(1), m.group(2)) if m.group(1) else (m.group(4), m.group(3))
        return f"HE{letter}{num}"
    t = t.replace(" ", "")
    t = re.sub(r"[-/.,_]", "_", t)
    return t


def _fraction_name(token: str) -> str:
    parts = token.split("_")
    if len(parts) == 3:
        return f"{parts[0]}-{parts[1]}/{parts[2]}"
    if len(parts) == 2:
        return f"{parts[0]}/{parts[1]}"
    return token


def _aisc_name(raw: str, family: str) -> str:
    if family == "2L":
        m = re.fullmatch(r"DBL_(L[\d_]+X[\d_]+X[\d_]+)(?:X([\d_]+))?(LLBB|SLBB)?", raw)
        name = "2" + _aisc_name(m.group(1), "L")
        return name + (f"X{_fraction_name(m.group(2))}" if m.group(2) else "") + (m.group(3) or "")
    if family in ("HSS", "L", "PIPE"):
        if family == "PIPE":
            m = re.fullmatch(r"Pipe([\d_]+)(STD|XS|XXS)", raw)
            return f"Pipe{_fraction_name(m.group(1))}{m.group(2)}" if m else raw
        return "X".join(_fraction_name(t) for t in raw.split("X"))
    return raw.replace("_", ".")


def _rows(path: Path):
    with path.open(encoding="utf-8") as fh:
        lines = [ln for ln in fh if not ln.startswith("#")]
    return list(csv.DictReader(lines))


def _num(v: str) -> float | None:
    v = (v or "").strip()
    if not v or v in ("–", "-", "—"):
        return None
    return float(v)


def _aisc_entries():
    out = []
    for family, (fname, model) in AISC_FILES.items():
        path = HERE / f"aisc_v16_{fname}.csv"
        for row in _rows(path):
            raw = row["shape"]
            if family == "HSS" and raw.count("X") != 2:
                continue
            e = Entry(_aisc_name(raw, family), family, model, AISC_SOURCE, path.name, raw=dict(row))
            g = {k: _num(v) for k, v in row.items() if k != "shape"}
            vals, dims = e.values, e.dims
            def put(name, col, f=1.0):
                if g.get(col) is not None:
                    vals[name] = g[col] * f
            put("A", "area", IN**2)
            put("I_x", "Ix", IN**4)
            put("I_y", "Iy", IN**4)
            put("S_x", "Sx", IN**3)
            put("S_y", "Sy", IN**3)
            put("Z_x", "Zx", IN**3)
            put("Z_y", "Zy", IN**3)
            put("r_x", "rx", IN)
            put("r_y", "ry", IN)
            put("J", "J", IN**4)
            put("r_o", "ro", IN)  # polar radius of gyration about the shear centre (C, MC, L, WT)
            put("I_2", "Iz", IN**4)  # angles: the minor principal axis
            put("r_min", "rz", IN)
            put("C_w", "Cw", IN**6)
            put("r_ts", "rts", IN)
            put("h_o", "ho", IN)
            put("mass", "weight", LB_FT)
            if model in ("I", "I-tapered", "C-tapered", "C", "T", "T-tapered"):
                put("d", "d", IN)
                put("b_f", "bf", IN)
                put("t_f", "tf", IN)
                put("t_w", "tw", IN)
                put("k", "k", IN)
                dims.update(h=g["d"] * IN, b=g["bf"] * IN, t_f=g["tf"] * IN, t_w=g["tw"] * IN)
                if model.endswith("tapered"):
                    # k_des reaches the fillet's toe on the web: past the flange's root thickness (the taper adds
                    # slope·outstand/2 to t_f there) by the fillet's tangent length
                    o = (g["bf"] - g["tw"]) / (1 if model == "C-tapered" else 2)
                    dims.update(slope=AISC_FLANGE_SLOPE)
                    dims["r"] = _root_radius(g["k"] * IN, (g["tf"] + AISC_FLANGE_SLOPE * o / 2) * IN,
                                             AISC_FLANGE_SLOPE)
                elif g.get("k") is not None:
                    dims["r"] = max(g["k"] - g["tf"], 0.0) * IN  # k_des = t_f + r
                fit = derived_profiles().get(raw)
                if fit is not None:  # radii (and an MC's slope) derived from the table's own values
                    dims.update(r=fit["r"] * IN, r_toe=fit["r_toe"] * IN)
                    if family == "MC":  # S and C keep their exact 2-in-12 slope
                        e.model = "C-tapered"
                        dims["slope"] = fit["slope"]
                    if family == "M":
                        dims.pop("r_toe")
                    e.derived_profile = fit
            elif model == "2L":
                put("d", "d", IN)
                put("b_f", "b", IN)
                put("t", "t", IN)
                dims.update(h=g["d"] * IN, b=g["b"] * IN, t=g["t"] * IN, gap=_gap(raw) * IN, single=_single(raw))
            elif model == "L":
                # the file's 'b' column is the leg along y (I_x = 69.7 in⁴ of L8X4X1 belongs to its 8 in leg
                # upright), its 'd' column the leg along x
                put("d", "b", IN)
                put("b_f", "d", IN)
                put("t", "t", IN)
                put("k", "k", IN)
                dims.update(h=g["b"] * IN, b=g["d"] * IN, t=g["t"] * IN, r=max(g["k"] - g["t"], 0.0) * IN)
            elif model == "box-aisc":
                put("d", "Ht", IN)
                put("b_f", "B", IN)
                put("t", "tdes", IN)
                dims.update(h=g["Ht"] * IN, b=g["B"] * IN, t=g["tdes"] * IN)
            elif model == "tube":
                put("d", "OD", IN)
                put("t", "tdes", IN)
                dims.update(d=g["OD"] * IN, t=g["tdes"] * IN)
            out.append(e)
    parents = {(e.family, e.raw["bf"], e.raw["tf"], e.raw["tw"], e.raw["k"]): e for e in out if e.family in ("S", "M")}
    for e in out:
        if e.family in ("ST", "MT"):  # a tee cut from an S or M shape takes its parent's derived radii
            p = parents.get((e.family[0], e.raw["bf"], e.raw["tf"], e.raw["tw"], e.raw["k"]))
            if p is not None and abs(float(p.raw["weight"]) - 2 * float(e.raw["weight"])) < 0.1:  # half of it (rounded)
                e.dims["r"] = p.dims["r"]
                if "r_toe" in p.dims:
                    e.dims["r_toe"] = p.dims["r_toe"]
                e.derived_profile = dict(p.derived_profile, parent=p.designation)
    singles = {e.raw["shape"]: e for e in out if e.family == "L"}
    for e in out:
        if e.family == "2L":  # the root radius of the single angle's row (the double-angle table has no k)
            L = singles[e.dims.pop("single")]
            e.dims["r"] = L.dims["r"]
    return out


@lru_cache(maxsize=1)
def derived_profiles() -> dict[str, dict]:
    """Root and toe radii (and the MC slopes) that the AISC table does not give, derived from its own A, I_x, I_y and
    x̄ by tools/derive_aisc_profiles.py (method in that file and in the data file's header): shape -> values (in)."""
    out = {}
    for row in _rows(HERE / "aisc_v16_derived.csv"):
        out[row["shape"]] = {"slope": float(row["slope"]), "r": float(row["r"]), "r_toe": float(row["r_toe"]),
                             "r_k": float(row["r_k"]), "fitted": row["fitted"].split(), "fit": float(row["fit"])}
    return out


def _root_radius(k, t_root, slope):
    from .fillets import root_radius_from_k

    return root_radius_from_k(k, t_root, slope)


def _gap(raw: str) -> float:
    """The back-to-back spacing of a double angle, in inches, from its name (DBL_L6X4X1_2X3_8LLBB: 3/8)."""
    parts = re.sub(r"(LLBB|SLBB)$", "", raw).split("X")
    if len(parts) < 4:
        return 0.0
    nums = [float(n) for n in parts[3].split("_")]
    return nums[0] / nums[1] if len(nums) == 2 else nums[0] + nums[1] / nums[2] if len(nums) == 3 else nums[0]


def _single(raw: str) -> str:
    return "X".join(re.sub(r"(LLBB|SLBB)$", "", raw)[4:].split("X")[:3])


def _upn_entries():
    out = []
    path = HERE / "en_upn.csv"
    for row in _rows(path):
        g = {k: float(v) for k, v in row.items() if k != "section"}
        name = "UPN " + row["section"][3:]
        e = Entry(name, "UPN", "C-tapered", UPN_SOURCE, path.name, raw=dict(row))
        slope, at = next((s, a) for hmax, s, a in UPN_SLOPES if g["h"] <= hmax)
        u = g["b"] / 2 if at == "half" else (g["b"] - g["t_w"]) / 2
        e.dims.update(h=g["h"], b=g["b"], t_f=g["t_f"], t_w=g["t_w"], r=g["r1"], r_toe=g["r2"], slope=slope, u=u)
        e.values.update(d=g["h"], b_f=g["b"], t_f=g["t_f"], t_w=g["t_w"], r=g["r1"])
        # the nominal mass, so a UPN can be ranked by weight (--from UPN): ρ·A of the model's own parts table
        from .fillets import tapered_channel_rows
        from .properties import tabular

        d = e.dims
        A = tabular(tapered_channel_rows(d["h"], d["b"], d["t_f"], d["t_w"], d["r"], slope, d["r_toe"], u)[0]).A
        e.values["mass"] = STEEL_DENSITY * A * 1e-6
        e.derived["mass"] = "ρ·A of the geometric model, steel at 7850 kg/m³"
        out.append(e)
    return out


def _en_entries():
    out = []
    cm = {"A": 1e2, "A_vz": 1e2, "A_vy": 1e2, "I_y": 1e4, "I_z": 1e4, "i_y": 10, "i_z": 10, "W_el_y": 1e3,
          "W_el_z": 1e3, "W_pl_y": 1e3, "W_pl_z": 1e3, "I_t": 1e4, "I_w": 1e6}
    ours = {"A": "A", "A_vz": "A_vz", "A_vy": "A_vy", "I_y": "I_x", "I_z": "I_y", "i_y": "r_x", "i_z": "r_y",
            "W_el_y": "S_x", "W_el_z": "S_y", "W_pl_y": "Z_x", "W_pl_z": "Z_y", "I_t": "J", "I_w": "C_w"}
    for fname, source, model in (("en_i_sections.csv", EN_I_SOURCE, "I"), ("en10210_rhs.csv", EN_HOLLOW_SOURCE, "box-en"),
                                 ("en10210_shs.csv", EN_HOLLOW_SOURCE, "box-en"),
                                 ("en10210_chs.csv", EN_HOLLOW_SOURCE, "tube")):
        path = HERE / fname
        for row in _rows(path):
            raw = row["section"]
            g = {k: _num(v) for k, v in row.items() if k != "section"}
            if model == "I":
                m = re.fullmatch(r"(IPE|HE[ABM])(\d+)", raw)
                name = f"IPE {m.group(2)}" if m.group(1) == "IPE" else f"HE {m.group(2)} {m.group(1)[2]}"
                family = m.group(1)
            else:
                family = raw[:3]
                name = family + " " + raw[3:].replace("_", ".").replace("x", "x")
            e = Entry(name, family, model, source, fname, raw=dict(row))
            vals, dims = e.values, e.dims
            if model == "tube":
                for col, f, mine in (("A", 1e2, "A"), ("I", 1e4, "I_x"), ("I", 1e4, "I_y"), ("i", 10, "r_x"),
                                     ("i", 10, "r_y"), ("W_el", 1e3, "S_x"), ("W_el", 1e3, "S_y"),
                                     ("W_pl", 1e3, "Z_x"), ("W_pl", 1e3, "Z_y")):
                    vals[mine] = g[col] * f
                vals["mass"] = g["mass"]
                vals["d"] = g["d"]
                vals["t"] = g["t"]
                dims.update(d=g["d"], t=g["t"])
            else:
                for col, mine in ours.items():
                    if g.get(col) not in (None, 0.0):
                        vals[mine] = g[col] * cm[col]
                vals["mass"] = g["mass"]
                if model == "I":
                    vals.update(d=g["h"], b_f=g["b"], t_f=g["t_f"], t_w=g["t_w"], r=g["r"])
                    dims.update(h=g["h"], b=g["b"], t_f=g["t_f"], t_w=g["t_w"], r=g["r"])
                else:
                    vals.update(d=g["h"], b_f=g["b"], t=g["t_f"])
                    dims.update(h=g["h"], b=g["b"], t=g["t_f"])
            out.append(e)
    return out


@lru_cache(maxsize=1)
def entries() -> dict[str, Entry]:
    """Every catalogue row by its matching key (read once; the files are read-only package data)."""
    table: dict[str, Entry] = {}
    for e in _aisc_entries() + _en_entries() + _upn_entries():
        table.setdefault(key(e.designation), e)
    return table


CF_SOURCE = ("EN 10219-2:2019 cold-formed hollow section of the designation's size; corner radii by the "
             "standard's rule (no table shipped)")
_CF = re.compile(r"CF(RHS|SHS)(\d+(?:_\d+)?)X(\d+(?:_\d+)?)X(\d+(?:_\d+)?)")


def lookup(designation: str) -> Entry | None:
    k = key(designation)
    return entries().get(k) or _cold_formed(k)


def _cold_formed(k: str) -> Entry | None:
    """A cold-formed hollow section (EN 10219-2) of any size named ``CFRHS HxBxT`` or ``CFSHS BxBxT``: the
    product standard's corner rule makes the model; there is no table to compare with."""
    m = _CF.fullmatch(k)
    if not m:
        return None
    h, b, t = (float(g.replace("_", ".")) for g in m.group(2, 3, 4))
    if m.group(1) == "SHS" and h != b:
        return None
    name = f"CF{m.group(1)} {h:g}x{b:g}x{t:g}"
    e = Entry(name, "CF" + m.group(1), "box-cf", CF_SOURCE, "corner_radii.toml")
    e.dims.update(h=h, b=b, t=t)
    e.values.update(d=h, b_f=b, t=t)
    return e


def nearest(designation: str, n: int = 5) -> list[str]:
    table = entries()
    k = key(designation)
    close = difflib.get_close_matches(k, list(table), n=n, cutoff=0.5)
    return [table[c].designation for c in close]


# ---------------------------------------------------------------- product-standard corner radii (as data)

def hollow_radii(standard: str, t: float) -> tuple[float, float]:
    """(outside, inside) corner radius for calculating properties (mm), per the product standard's rule in
    catalogue/corner_radii.toml (AISC, EN 10210-2 hot-finished, EN 10219-2 cold-formed)."""
    for rule in radii_rules()[standard]:
        limit = float(rule["t_max"])
        if t <= limit:
            return rule["ro"] * t, rule["ri"] * t
    raise ValueError(standard)  # pragma: no cover (the last rule has no limit)


@lru_cache(maxsize=1)
def radii_rules() -> dict:
    import tomllib

    with (HERE / "corner_radii.toml").open("rb") as fh:
        return {k: v["rules"] for k, v in tomllib.load(fh).items()}
