"""ullage: screening estimates of vapour hazards from a liquid's temperature up.

Saturated vapour pressure, equilibrium headspace, evaporation from spills and the
air concentration people breathe, compared with limits the user enters. Every
result is a screening estimate: measure with calibrated instruments before entry
and follow local codes, permits and qualified industrial-hygiene and
process-safety practice.

The stable API takes and returns SI units (K, Pa, kg, m, s, mol) as floats or
numpy arrays.
"""

from ._meta import CAUTIONS, __version__
from .errors import (
    ExtrapolationWarning,
    InputError,
    OutOfRangeError,
    UllageError,
    UllageWarning,
    UnknownSubstanceError,
)
from .substances import Substance, all_substances, lookup_cas, substance, user_substance
from .vapor import (
    clausius_clapeyron,
    fit_clausius_clapeyron,
    vapor_pressure,
    vapor_pressure_estimate,
)
from .mixtures import Liquid, liquid
from .headspace import boiling_temperature, headspace, temperature_for_concentration
from .evaporation import evaporation_rate
from .indoor import well_mixed_room
from .sds import read_sds
from .scenario import load_scenario, loads_scenario
from .screening import run_scenario

__all__ = [
    "__version__",
    "CAUTIONS",
    "Substance",
    "substance",
    "all_substances",
    "user_substance",
    "lookup_cas",
    "vapor_pressure",
    "vapor_pressure_estimate",
    "clausius_clapeyron",
    "fit_clausius_clapeyron",
    "Liquid",
    "liquid",
    "headspace",
    "temperature_for_concentration",
    "boiling_temperature",
    "evaporation_rate",
    "well_mixed_room",
    "read_sds",
    "load_scenario",
    "loads_scenario",
    "run_scenario",
    "UllageError",
    "InputError",
    "OutOfRangeError",
    "UnknownSubstanceError",
    "UllageWarning",
    "ExtrapolationWarning",
]
