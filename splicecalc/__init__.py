"""splicecalc: Eurocode design of a new steel beam spliced on site and fixed to existing steel.

Layers (lower never imports upper):
core -> materials, sections -> actions, analysis -> members, joints -> design -> report, cli.
"""

__version__ = "0.1.0"
