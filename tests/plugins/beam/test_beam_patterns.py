"""Skip (pattern) loading of continuous beams: which arrangements of a variable load are tried.

EN 1992-1-1 5.1.3(1)P (from memory): alternate spans carrying the variable load give the largest span moments,
any two adjacent spans the largest hogging moment at the support between them; ASCE/SEI 7-22 4.3.3 asks for
the same partial loading. So a line of n spans is loaded on every span, on the odd and on the even spans, and
on each pair of adjacent spans — each arrangement once, spans named left to right.
"""
import pytest

from calcsheet_plugins.beam.model import span_patterns


@pytest.mark.parametrize("n, expected", [
    (1, [(1,)]),
    (2, [(1, 2), (1,), (2,)]),  # the adjacent pair (1, 2) is all spans: listed once
    (3, [(1, 2, 3), (1, 3), (2,), (1, 2), (2, 3)]),
    (4, [(1, 2, 3, 4), (1, 3), (2, 4), (1, 2), (2, 3), (3, 4)]),
])
def test_every_span_alternate_spans_and_each_adjacent_pair(n, expected):
    got = span_patterns(n)
    assert [spans for _, spans in got] == expected
    assert [label for label, _ in got] == ["spans " + ", ".join(map(str, s)) for s in expected]


def test_every_arrangement_names_real_spans_left_to_right_once():
    for n in range(1, 9):
        spans = [s for _, s in span_patterns(n)]
        assert len(set(spans)) == len(spans)
        for s in spans:
            assert list(s) == sorted(s) and all(1 <= k <= n for k in s)
        # each support between two spans has its adjacent pair
        assert all((k, k + 1) in spans or (k, k + 1) == tuple(range(1, n + 1)) for k in range(1, n))
