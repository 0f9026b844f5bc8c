"""Stands in for a drawing script that fails (LENTUS_SCRIPTS points here in a test)."""
import sys

sys.stderr.write("draw_case.py: failing on purpose for a test\n")
sys.exit(3)
