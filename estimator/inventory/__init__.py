"""Whole-inventory screening: the equilibrium headspace of every tank and drum of a site.

One row per container, all rows in one call. Rows are grouped by liquid (the same
substance, or the same mixture composition) and each group's vapour pressures are
evaluated for all its temperatures in one numpy call, so thousands of rows take a
fraction of a second. A row with bad data is reported, with the line of the file it
came from and the column at fault, and skipped; every other row is still computed.

Input table
-----------
Column names are matched without regard to case; surrounding spaces are ignored,
and inner spaces, hyphens and brackets count as underscores ("Temperature (C)" is
``temperature_c``). Columns ullage does not know are kept and passed through; one
that looks like a misspelling of a known column gets a warning with a suggestion.

===========================  =========================================================
column                       content
===========================  =========================================================
``container``  (required)    Identifier of the tank or drum (text, passed through).
``liquid``     (required)    A substance name, synonym or CAS number ("toluene",
                             "MEK", "108-88-3"), or a mixture written as names with
                             percentages: "toluene 60%, o-xylene 40%" (components
                             separated by commas, semicolons or "+"; "60% toluene,
                             40% o-xylene" also works).
``basis``                    Basis of a mixture's percentages: mole, mass or volume.
                             Blank means mass, as safety data sheets give mass %.
``temperature_<unit>``       Liquid temperature; the unit is in the header, one of
                             ``_C``, ``_F``, ``_K`` (also ``_degC``, ``(°C)``...).
                             Cells hold plain numbers; a cell may repeat the header's
                             unit ("38 °C" under ``temperature_C``) but never
                             another one.
``temperature``              Without a unit in the header, every cell gives its own
                             ("38 °C", "100 degF", "311 K"); a cell without one is
                             refused for its row, naming the column. The same holds
                             for ``pressure`` ("95 kPa") and ``elevation`` ("1200 ft").
``temperature_low_<unit>``   Optional range instead of, or beside, the temperature.
``temperature_high_<unit>``  The worst case uses the high end.
``fill_percent``             Liquid level, 0-100 % (checked, passed through; the
                             equilibrium concentration does not depend on it).
``pressure_<unit>``          Absolute pressure of the vapour space for that row;
                             ``_Pa``, ``_kPa``, ``_bar`` or ``_psia``.
``elevation_<unit>``         Site elevation for that row (``_m`` or ``_ft``): the
                             barometric pressure of the standard atmosphere.
``twa_ppm``, ``stel_ppm``,   Exposure limits for that row, in ppm by volume. A limit
``ceiling_ppm``              is only used with a ``limit_source`` saying where it
``limit_source``             comes from; without one it is rejected for that row.
===========================  =========================================================

Per row, the liquid temperature is the ``temperature`` cell, or the low end of the
range when only a range is given (the high end if only that is given). The worst
case is the high end of the range, or the liquid temperature when there is none.
A row's exposure limits apply to the total vapour of its liquid (for a mixture,
enter the limit meant for the mixture, for instance its lowest component limit).
A cell holding a formula (text beginning with "=") is never evaluated: in a column
the screening reads it makes the row an error; elsewhere it is a caution. Files are
CSV in UTF-8, UTF-16 or UTF-32 (`read_inventory`) or .xlsx workbooks, at most
`MAX_FILE_BYTES` unless a larger limit is given (the command line's ``--max-size``,
`LOCAL_FILE_BYTES` by default). `write_inventory_csv` writes the table with the
cautions as leading "#" comment lines; `inventory_summary_text` is the terminal
summary.

Output columns
--------------
All input columns come first, unchanged, then (names in `OUTPUT_COLUMNS`):

- ``source_line``: the row's line in the file, the header being line 1 (for a
  table passed in directly, its position + 2, as if it had been saved to a file).
- ``status``: "ok", "warning" (computed, with cautions in ``reason``) or "error"
  (not computed; ``reason`` says why).
- ``reason``: every problem, as "line N, column 'name': what is wrong".
- ``liquid_temperature_k``, ``worst_case_temperature_k``, ``vapor_space_pressure_pa``.
- ``headspace_ppm``: total vapour at the liquid temperature [ppm by volume].
- ``worst_case_ppm``, ``worst_case_mg_per_m3`` (at the worst-case temperature and the
  vapour-space pressure), ``worst_case_percent_lfl`` (Le Chatelier for mixtures),
  ``worst_case_flammability`` (none, lean, flammable, rich) and
  ``worst_case_oxygen_percent`` (20.9 % air displaced by the vapour).
- ``twa_ratio``, ``stel_ratio``, ``ceiling_ratio``: worst-case ppm over each limit.
- ``vapor_hazard_ratio``: ppm at the liquid temperature over the lowest accepted
  limit of the row (Popendorf 1984).
- ``concern``: the largest of (a) worst-case ppm over the lowest accepted limit,
  (b) worst-case %LFL over the LFL alarm level, (c) the oxygen the vapour displaces
  (20.9 % minus the worst-case oxygen) over that at the low-oxygen alarm. Each term
  is 1 at its limit or alarm, so a concern of 1 or more means that at least one
  limit or alarm is reached in the worst case. ``concern_driver`` names the largest
  term; ``concern_rank`` is 1 for the highest concern. Error rows have none.
- ``vapor_pressure_method`` (per component for mixtures) and
  ``vapor_pressure_uncertainty`` (the largest stated relative uncertainty, 95 %
  coverage, of the methods used).

The equilibrium headspace is the worst case for a closed space after long
standing; it is a screening estimate, and the real atmosphere must be measured.

References
----------
Raoult's law and Le Chatelier's rule as in `estimator.headspace`. Vapour hazard
ratio: Popendorf, W. (1984), Am. Ind. Hyg. Assoc. J. 45(10), 719-726. Default
alarm levels: US OSHA 29 CFR 1910.146(b), hazardous atmosphere.

The package holds one idea per module: `reading` (files), `columns` (known
columns and headers), `cells` (cell parsing), `liquids` (liquid texts), `core`
(the array core), `screening` (`screen_inventory`), `summary` (results and the
terminal summary) and `writing` (CSV output). Every public name is importable
from `estimator.inventory`.
"""

from __future__ import annotations

from .columns import (
    BASIS_WORDS,
    CELL_KINDS,
    ColumnRoles,
    ELEVATION_FACTORS,
    FLAMMABILITY_CODES,
    KNOWN_COLUMNS,
    LIMIT_KINDS,
    LIMIT_LABELS,
    LOCAL_FILE_BYTES,
    MAX_FILE_BYTES,
    MAX_ROWS,
    OUTPUT_COLUMNS,
    PRESSURE_FACTORS,
    PRESSURE_LABELS,
    PROBLEMS,
    READ_CHUNK_ROWS,
    TEMPERATURE_BASES,
    TEMPERATURE_SCALES,
    TEMPERATURE_WORDS,
    UNIT_IN_CELL,
    check_duplicate_headers,
    normalise_header,
    resolve_columns,
    resolve_roles,
)
from .liquids import (
    LiquidBounds,
    liquid_bounds,
    parse_liquid,
    resolve_liquids,
    temperature_problems,
)
from .core import (
    HeadspaceArrays,
    LiquidArrays,
    evaluate_liquid,
    group_order,
    headspace_arrays,
    rows_by_code,
)
from .reading import (
    read_inventory,
)
from .cells import (
    blank_cells,
    is_formula,
    is_text_column,
    number_cells,
    same_text,
    text_cells,
    unit_cells,
)
from .summary import (
    CONCERN_BANDS,
    InventoryScreening,
    InventorySummary,
    concern_counts,
    inventory_summary_text,
    sorted_by_concern,
)
from .screening import (
    screen_inventory,
)
from .writing import (
    write_inventory_csv,
)

__all__ = [
    "screen_inventory",
    "read_inventory",
    "write_inventory_csv",
    "sorted_by_concern",
    "inventory_summary_text",
    "concern_counts",
    "CONCERN_BANDS",
    "headspace_arrays",
    "parse_liquid",
    "HeadspaceArrays",
    "InventoryScreening",
    "InventorySummary",
    "OUTPUT_COLUMNS",
    "MAX_FILE_BYTES",
    "LOCAL_FILE_BYTES",
    "MAX_ROWS",
    "PROBLEMS",
    "FLAMMABILITY_CODES",
]
