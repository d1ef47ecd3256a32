"""Joints to EN 1993-1-8: fasteners (bolts, welds, plates, spacing), the cover-plate splice, end connections."""
