"""Materials: steel grades (EN 10025-2) and the national-annex partial factors."""

from .partial_factors import EN_RECOMMENDED, UK_NA, NationalAnnex
from .steel import DENSITY_kg_per_m3, E_MPa, G_MPa, GRADES, Steel, normalise_grade, steel, steel_strength

__all__ = ["EN_RECOMMENDED", "UK_NA", "NationalAnnex", "DENSITY_kg_per_m3", "E_MPa", "G_MPa",
           "GRADES", "Steel", "normalise_grade", "steel", "steel_strength"]
