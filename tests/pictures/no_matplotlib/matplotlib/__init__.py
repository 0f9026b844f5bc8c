# Stands in for a Python without matplotlib: put this folder first on PYTHONPATH.
raise ImportError("matplotlib is hidden for a test of the picture step")
