"""Evaporation from liquid pools: mass-transfer equations, pool geometry, depletion.

Rates are in kg/s, fluxes in kg/(m2 s), areas in m2, speeds in m/s, temperatures
in K and pressures in Pa. Each published equation is its own function; the
substance-level functions (`evaporation_rate`, `pool_depletion`, `mixture_pool`)
combine them with the vapour pressure of `estimator.vapor`.

Two model families are offered, chosen by keyword:

- ``"mackay-matsugu"``: the Mackay & Matsugu (1973) mass-transfer coefficient,
  with the Schmidt number from Sutherland's air viscosity and Fuller's
  diffusion coefficient;
- ``"epa-rmp"``: Equation D-1 of the US EPA Risk Management Program guidance
  for offsite consequence analysis (1999, revised 2009).

Limits of validity, stated once here and repeated in the warnings of results:

- The pool is at a known, uniform temperature (ambient by default); evaporative
  cooling is an optional refinement in `pool_temperature_balance`.
- The pool is below its boiling point. A pool at or above its boiling point is
  a boiling pool or a flashing release, driven by heat input rather than mass
  transfer, and is refused.
- Condensation from air that is richer in the vapour than the pool surface is
  not modelled: the driving force is clipped at zero.
- Mass-transfer correlations fitted outdoors tend to under-predict evaporation
  at the low air speeds found indoors (Lennert, Nielsen & Breum 1997, Ann.
  Occup. Hyg. 41, 625).
- Wide-boiling mixtures such as fuels and crude oils evaporate in a way that
  a few-component Raoult's-law pool does not capture (their evaporation is
  often limited by diffusion inside the liquid and follows empirical
  time laws; Fingas 2004, J. Hazard. Mater. 107, 27).
- The dilute-vapour film theory behind both models under-predicts when the
  vapour pressure is a large fraction of the ambient pressure.

The package holds one idea per module: `air` (air properties, diffusivity),
`mass_transfer` (Mackay–Matsugu, EPA RMP, `evaporation_rate`), `pool` (pool
geometry and depletion), `mixture` (mixture rates and weathering) and `heat` (the
pool heat balance). Every public name is importable from `estimator.evaporation`.
"""

from __future__ import annotations

from .air import (
    FULLER_COEFFICIENT,
    GRAMS_PER_KILOGRAM,
    air_density,
    air_diffusivity,
    air_dynamic_viscosity,
    air_kinematic_viscosity,
    fuller_diffusivity,
    schmidt_number,
)
from .mass_transfer import (
    EPA_RMP_COEFFICIENT,
    EPA_RMP_GAS_CONSTANT,
    EPA_RMP_WIND_EXPONENT,
    EvaporationEstimate,
    EvaporationSolverError,
    HIGH_VOLATILITY_RATIO,
    LOW_AIR_SPEED,
    MACKAY_MATSUGU_COEFFICIENT,
    MACKAY_MATSUGU_COEFFICIENT_SI,
    MACKAY_MATSUGU_DIAMETER_EXPONENT,
    MACKAY_MATSUGU_SCHMIDT_EXPONENT,
    MACKAY_MATSUGU_WIND_EXPONENT,
    MODELS,
    MODEL_NAMES,
    ModelComparison,
    boiling_check,
    check_model,
    check_wind_speed,
    compare_models,
    epa_rmp_rate,
    evaporation_estimate,
    evaporation_flux,
    evaporation_rate,
    low_air_speed_note,
    mackay_matsugu_coefficient,
    pool_mass_transfer,
    prepare_pool,
    validity_notes,
)
from .pool import (
    DEPLETED_FRACTION,
    PoolDepletion,
    check_times,
    pool_area,
    pool_depletion,
    pool_diameter,
    spill_pool_area,
)
from .mixture import (
    MixturePool,
    StepBudget,
    activity_function,
    bubble_check,
    component_conductances,
    mixture_components,
    mixture_evaporation_rates,
    mixture_inputs,
    mixture_pool,
    per_component,
)
from .heat import (
    GROUND_TYPES,
    PoolTemperatureHistory,
    chilton_colburn_heat_transfer_coefficient,
    pool_temperature_balance,
    semi_infinite_ground_flux,
)

__all__ = [
    "MODELS",
    "MODEL_NAMES",
    "GROUND_TYPES",
    "DEPLETED_FRACTION",
    "fuller_diffusivity",
    "air_dynamic_viscosity",
    "air_density",
    "air_kinematic_viscosity",
    "schmidt_number",
    "mackay_matsugu_coefficient",
    "evaporation_flux",
    "epa_rmp_rate",
    "pool_area",
    "pool_diameter",
    "spill_pool_area",
    "chilton_colburn_heat_transfer_coefficient",
    "semi_infinite_ground_flux",
    "air_diffusivity",
    "evaporation_estimate",
    "evaporation_rate",
    "compare_models",
    "pool_depletion",
    "mixture_evaporation_rates",
    "mixture_pool",
    "pool_temperature_balance",
    "EvaporationEstimate",
    "ModelComparison",
    "PoolDepletion",
    "MixturePool",
    "PoolTemperatureHistory",
    "EvaporationSolverError",
]
