"""Properties every correct linear beam solution has, over random beams (hypothesis)."""
import numpy as np
from hypothesis import given, settings, strategies as st

from calcsheet_plugins.beam.solver import LineLoad, Model, MomentLoad, PointLoad, extremes, solve


@st.composite
def beams(draw):
    n = draw(st.integers(1, 4))
    spans = [draw(st.floats(1.0, 8.0)) for _ in range(n)]
    supports = [draw(st.sampled_from(["pinned", "roller", "fixed"])) for _ in range(n + 1)]
    if n >= 2 and draw(st.booleans()):
        supports[draw(st.sampled_from([0, n]))] = "free"
    EI = [draw(st.floats(1e6, 5e7)) for _ in range(n)]
    return Model(spans, supports, EI)


@st.composite
def load_sets(draw, L):
    out = []
    for _ in range(draw(st.integers(1, 4))):
        kind = draw(st.sampled_from(["P", "M", "w"]))
        if kind == "P":
            out.append(PointLoad(draw(st.floats(0, L)), draw(st.floats(-5e4, 5e4))))
        elif kind == "M":
            out.append(MomentLoad(draw(st.floats(0, L)), draw(st.floats(-5e4, 5e4))))
        else:
            a = draw(st.floats(0, L))
            b = draw(st.floats(a, L))
            out.append(LineLoad(a, b, draw(st.floats(-2e4, 2e4)), draw(st.floats(-2e4, 2e4))))
    return out


def resultants(loads):
    F = Mo = 0.0  # downward total, clockwise moment about x = 0
    for ld in loads:
        if isinstance(ld, PointLoad):
            F += ld.P
            Mo += ld.P * ld.x
        elif isinstance(ld, MomentLoad):
            Mo += ld.M
        else:
            F += ld.total
            Mo += ld.total * ld.centroid
    return F, Mo


@settings(max_examples=40, deadline=None, database=None)
@given(data=st.data())
def test_reactions_balance_the_loads(data):
    m = data.draw(beams())
    loads = data.draw(load_sets(m.length))
    s = solve(m, loads)
    F, Mo = resultants(loads)
    X = m.nodes
    scale = 1.0 + sum(abs(v) for v in resultants([type(l)(*[abs(a) if isinstance(a, float) else a for a in vars(l).values()]) for l in loads]))
    assert abs(s.reactions.sum() - F) <= 1e-8 * scale  # ΣF_y = 0
    # ΣM about x = 0: reactions anticlockwise (R·x) and support couples balance the loads' clockwise moment
    assert abs((s.reactions * X).sum() + s.reaction_moments.sum() - Mo) <= 1e-8 * scale * (1 + m.length)


@settings(max_examples=30, deadline=None, database=None)
@given(data=st.data())
def test_superposition(data):
    m = data.draw(beams())
    A = data.draw(load_sets(m.length))
    B = data.draw(load_sets(m.length))
    sa, sb, sab = solve(m, A), solve(m, B), solve(m, A + B)
    xs = np.linspace(0, m.length, 41)
    for what in ("V", "M", "delta"):
        ref = sa.at(what, xs) + sb.at(what, xs)
        tol = 1e-7 * (1 + np.max(np.abs(sa.at(what, xs))) + np.max(np.abs(sb.at(what, xs))))
        # at an exact load point the side chosen may differ; compare away from them
        got = sab.at(what, xs)
        bad = np.abs(got - ref) > tol
        pts = {round(l.x, 9) for l in A + B if not isinstance(l, LineLoad)}
        assert all(round(v, 9) in pts for v in xs[bad])


@settings(max_examples=30, deadline=None, database=None)
@given(data=st.data())
def test_maxwell_betti_reciprocity(data):
    m = data.draw(beams())
    x1 = data.draw(st.floats(0, m.length))
    x2 = data.draw(st.floats(0, m.length))
    d21 = solve(m, [PointLoad(x1, 1e4)]).at("delta", x2)[0]
    d12 = solve(m, [PointLoad(x2, 1e4)]).at("delta", x1)[0]
    scale = max(abs(d21), abs(d12)) + 1e4 * m.length**3 / min(m.EI)  # PL^3/EI sets the size
    assert abs(d21 - d12) <= 1e-8 * scale  # δ at 2 due to P at 1 = δ at 1 due to P at 2


@settings(max_examples=30, deadline=None, database=None)
@given(data=st.data())
def test_splitting_a_span_changes_nothing(data):
    m = data.draw(beams())
    loads = data.draw(load_sets(m.length))
    k = data.draw(st.integers(0, len(m.spans) - 1))
    f = data.draw(st.floats(0.1, 0.9))
    spans = list(m.spans)
    spans[k: k + 1] = [spans[k] * f, spans[k] * (1 - f)]
    supports = list(m.supports)
    supports.insert(k + 1, "free")  # a node with no restraint: just another element boundary
    EI = list(m.EI)
    EI.insert(k, EI[k])
    s1 = solve(m, loads)
    s2 = solve(Model(spans, supports, EI), loads)
    R2 = np.delete(s2.reactions, k + 1)
    assert np.allclose(s1.reactions, R2, rtol=1e-7, atol=1e-6 * (1 + np.abs(s1.reactions).max()))
    xs = np.linspace(0, m.length, 37)
    d1, d2 = s1.at("delta", xs), s2.at("delta", xs)
    assert np.allclose(d1, d2, rtol=1e-7, atol=1e-9 * (1 + np.abs(d1).max()))
    M1, M2 = extremes(s1, "M"), extremes(s2, "M")
    assert abs(M1[0].value - M2[0].value) <= 1e-7 * (1 + abs(M1[0].value) + abs(M1[1].value))
