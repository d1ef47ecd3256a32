"""The splicecalc command line."""
