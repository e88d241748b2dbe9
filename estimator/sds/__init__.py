"""Safety data sheets: read the composition (section 3, or 2 on older sheets) and the
physical properties (section 9), build the liquid, and screen over the ranges.

A sheet gives each ingredient as a range ("40 - 60 %", ">= 50 - < 70", "< 1 %"),
withholds some as trade secrets, and states a few properties of the product. This
module reads all of that from text, a ``.txt`` file or a ``.pdf`` with a text
layer (`read_sds`), keeps every share it cannot identify, and says in its notes
every assumption and every line it could not read. The reading builds the
`estimator.mixtures.Liquid` used everywhere else, at the normalised midpoints or
at the composition within the ranges that gives the highest headspace hazard,
and checks the sheet's own vapour pressure and flash point against the model.

The layout follows the 16 sections of the GHS (UN, *Globally Harmonized System of
Classification and Labelling of Chemicals*, Annex 4), US OSHA 29 CFR 1910.1200
Appendix D and EU REACH Annex II; older sheets put the composition in section 2.

The package holds one idea per module: `text` (files, PDF text, cleaning, section
headings), `values` (numbers, ranges, bases and temperatures in a line), `cas`
(check digit, `resolve_cas`, isomer mixtures), `composition` (ingredient lines and
unidentified shares), `properties` (section 9), `model` (the midpoint and worst-case
liquids, the linear programme), `cross_check` (the sheet's vapour pressure and
flash point against the model), `reading` (`SdsReading`, `read_sds`) and `scenario`
(a scenario's ``[[liquid]]`` from a sheet or its ranges, `sheet_path`). Every public
name is importable from `estimator.sds`.
"""

from __future__ import annotations

from .text import (
    clean_text,
    composition_lines,
    find_sections,
    MAX_SDS_BYTES,
    product_name,
    sheet_text,
)
from .values import (
    basis_of,
    find_range,
    NO_VALUE,
    NUMBER,
    read_number,
    read_temperatures,
    strip_noise,
)
from .cas import (
    cas_checksum_ok,
    CAS_NUMBER,
    ISOMER_MIXTURES,
    resolve_cas,
)
from .composition import (
    read_composition,
    resolve_ingredients,
    SdsIngredient,
)
from .properties import (
    read_properties,
    WATER_DENSITY_20C,
)
from .model import (
    dissolved_solid,
    inert_substance,
    POINTS,
    SdsComposition,
    SheetModel,
    SOLID_ABOVE,
)
from .cross_check import (
    check_flash_point,
    check_vapor_pressure,
    FLASH_POINT_TOLERANCE,
    SdsCheck,
)
from .reading import (
    read_sds,
    SdsReading,
)
from .scenario import (
    reading_from_ranges,
    SCENARIO_KEYS,
    scenario_liquid,
    sheet_path,
)

__all__ = [
    "read_sds",
    "resolve_cas",
    "SdsReading",
    "SdsIngredient",
    "SdsComposition",
    "SdsCheck",
    "inert_substance",
    "ISOMER_MIXTURES",
    "MAX_SDS_BYTES",
    "FLASH_POINT_TOLERANCE",
    "WATER_DENSITY_20C",
    "POINTS",
    "reading_from_ranges",
    "scenario_liquid",
    "sheet_path",
]
