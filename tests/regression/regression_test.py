#!/usr/bin/env python3
"""The comparison of tests/regression/regression.py can fail: a changed value, unit, missing or extra
number, a value near zero beyond the run's scale (label: regression)."""
import os
import sys
import unittest

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import regression  # noqa: E402

REFERENCE = {("", "pressure drop inlet to outlet"): ("Pa", 3193559.91421),
             ("", "mean pressure on outlet"): ("Pa", 7.86422310249e-12),
             ("", "flow rate out through wall"): ("m^2/s", 0.0),
             ("", "flow rate out through outlet"): ("m^2/s", 2.49999464367e-05),
             ("", "cavern radius"): ("m", None)}


def compare(computed):
    return regression.compare(computed, REFERENCE, 1e-10, 1e-10, {})[0]


class Compare(unittest.TestCase):
    def test_identical_numbers_pass(self):
        self.assertEqual(compare(dict(REFERENCE)), [])

    def test_round_off_passes(self):
        computed = dict(REFERENCE)
        computed[("", "pressure drop inlet to outlet")] = ("Pa", 3193559.91421 * (1. + 3e-11))
        computed[("", "mean pressure on outlet")] = ("Pa", -2e-7)           # 6e-14 of 3.2e6 Pa
        computed[("", "flow rate out through wall")] = ("m^2/s", 1e-17)   # 4e-13 of 2.5e-5 m^2/s
        self.assertEqual(compare(computed), [])

    def test_changed_value_fails(self):
        computed = dict(REFERENCE)
        computed[("", "pressure drop inlet to outlet")] = ("Pa", 3193559.91421 * (1. + 3e-10))
        self.assertIn("pressure drop inlet to outlet", compare(computed)[0])

    def test_near_zero_beyond_the_scale_fails(self):
        computed = dict(REFERENCE)
        computed[("", "flow rate out through wall")] = ("m^2/s", 1e-14)   # 4e-10 of the largest flow rate
        self.assertEqual(len(compare(computed)), 1)

    def test_unit_missing_extra_and_null_fail(self):
        computed = dict(REFERENCE)
        computed[("", "flow rate out through outlet")] = ("m^3/s", 2.49999464367e-05)
        del computed[("", "mean pressure on outlet")]
        computed[("", "maximum speed")] = ("m/s", 1.)
        computed[("", "cavern radius")] = ("m", 0.1)
        problems = compare(computed)
        self.assertEqual(len(problems), 4, problems)
        self.assertTrue(any(p.startswith("missing: mean pressure on outlet") for p in problems))
        self.assertTrue(any(p.startswith("extra: maximum speed") for p in problems))


if __name__ == "__main__":
    unittest.main()
