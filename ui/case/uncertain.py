"""The uncertainty inputs: inputs a page can give as a range, the distributions
offered, the checks of a range as entered, and the [[uncertain]] tables and
[monte_carlo] settings written from them.

Each part of an uncertain input (its distribution, its low, most likely and high
values, ...) is an input of its own: the parts are added here to `QUANTITIES`
(those with a unit, converted when the unit system changes) and to `PLAIN`.
"""

from __future__ import annotations

from .defaults import PLAIN
from .units import QUANTITIES, key, round_shown, system, text, unchanged, unit_label


#: Distributions a page offers for an input given as a range, with their
#: parameters in the order of `estimator.uncertainty.DISTRIBUTION_KEYS`. "fixed"
#: uses the value entered above; "file" keeps a distribution of a loaded scenario
#: file that the page cannot edit, exactly as written.
DISTRIBUTIONS = {"fixed": (), "uniform": ("low", "high"), "triangular": ("low", "mode", "high"),
                 "lognormal": ("gm", "gsd"), "file": ()}
DISTRIBUTION_WORDS = {"fixed": "fixed (the value above)", "uniform": "uniform",
                      "triangular": "triangular", "lognormal": "lognormal",
                      "file": "as in the scenario file"}
PARAMETER_WORDS = {"low": "Low", "mode": "Most likely", "high": "High",
                   "gm": "Geometric mean", "gsd": "Geometric SD"}

#: Inputs a page can give as a range: study -> scenario input (a key of
#: `estimator.scenario.UNCERTAIN_INPUTS`) -> (input on the page, label, unit kind
#: of `UNITS` or None for a plain number, distributions offered).
UNCERTAIN = {
    "tank": {
        "temperature": ("tank.temperature", "Liquid temperature", "temperature",
                        ("fixed", "uniform", "triangular")),
    },
    "indoor": {
        "temperature": ("indoor.temperature", "Liquid and air temperature", "temperature",
                        ("fixed", "uniform", "triangular")),
        "mass": ("indoor.mass", "Spilled mass", "mass",
                 ("fixed", "uniform", "triangular", "lognormal")),
        "mixing_factor": ("room.mixing", "Mixing factor", None,
                          ("fixed", "uniform", "triangular")),
        "air_speed": ("room.air_speed", "Air speed over the pool", "air_speed",
                      ("fixed", "uniform", "triangular", "lognormal")),
    },
}

#: Samples drawn by default, and at most, on a page.
DEFAULT_SAMPLES = 5_000
MAX_SAMPLES = 50_000
#: Seed used unless the user or a loaded file gives another, so a run repeats.
DEFAULT_SEED = 1


def uncertain_name(study: str, field: str, part: str) -> str:
    """Input name of one part ("kind", "low", ..., "file") of an uncertain input."""
    return f"mc.{study}.{field}.{part}"


for _study, _fields in UNCERTAIN.items():
    for _field, (_page, _label, _kind, _options) in _fields.items():
        PLAIN[uncertain_name(_study, _field, "kind")] = "fixed"
        PLAIN[uncertain_name(_study, _field, "file")] = None
        PLAIN[uncertain_name(_study, _field, "gsd")] = None
        for _part in ("low", "mode", "high", "gm"):
            if _kind is None:
                PLAIN[uncertain_name(_study, _field, _part)] = None
            else:
                QUANTITIES[uncertain_name(_study, _field, _part)] = (_kind, None)
PLAIN["mc.samples"] = DEFAULT_SAMPLES
PLAIN["mc.seed"] = DEFAULT_SEED
PLAIN["mc.method"] = True


def written_distribution(spec) -> str:
    """A distribution of a scenario file the way it reads there."""
    if isinstance(spec, dict):
        return "{ " + ", ".join(f"{k} = {written_distribution(v)}" for k, v in spec.items()) + " }"
    if isinstance(spec, (list, tuple)):
        return "[" + ", ".join(written_distribution(v) for v in spec) + "]"
    return str(spec)


def uncertainty_unavailable(state, study: str) -> str | None:
    """Why the liquid on a page cannot be screened probabilistically, or None."""
    kind = state.get(key(f"{study}.kind"), "table")
    if study == "tank" and kind == "water":
        return ("Probabilistic screening is not available for water with dissolved "
                "solvents; it covers liquids and their mixtures.")
    if study == "indoor" and kind in ("mixture", "sds"):
        return ("Probabilistic screening of a spill covers one substance: a mixture's pool "
                "changes composition as it evaporates, which the sampled room model does not "
                "follow.")
    return None


def _parameter(state, study: str, field: str, part: str):
    value = state.get(key(uncertain_name(study, field, part)))
    return None if value is None else float(value)


def _parameter_text(state, study: str, field: str, part: str):
    kind = UNCERTAIN[study][field][2]
    if kind is None or part == "gsd":
        return _parameter(state, study, field, part)
    return text(state, uncertain_name(study, field, part))


def distribution_problem(state, study: str, field: str) -> str | None:
    """What is wrong with the range given for one input, in the units on screen, or None.

    Checks the shape of the distribution only (bounds in order, most likely value
    inside them, geometric SD above 1); physical bounds are the core's to check.
    """
    choice = state.get(key(uncertain_name(study, field, "kind")), "fixed")
    parts = DISTRIBUTIONS.get(choice, ())
    if choice == "file" and state.get(key(uncertain_name(study, field, "file"))) is None:
        return "no distribution from a file is held for this input; choose another"
    values = {part: _parameter(state, study, field, part) for part in parts}
    missing = [PARAMETER_WORDS[p].lower() for p, v in values.items() if v is None]
    if missing:
        return f"give the {' and '.join(missing)} value" + ("s" if len(missing) > 1 else "")
    kind = UNCERTAIN[study][field][2]
    unit = f" {unit_label(kind, system(state))}" if kind else ""

    def shown(value):
        return f"{value:g}{unit}"

    if choice in ("uniform", "triangular") and not values["low"] < values["high"]:
        return (f"the low end ({shown(values['low'])}) must be below the high end "
                f"({shown(values['high'])}); for a value known exactly choose fixed")
    if choice == "triangular" and not values["low"] <= values["mode"] <= values["high"]:
        return (f"the most likely value ({shown(values['mode'])}) must lie between the low "
                f"end ({shown(values['low'])}) and the high end ({shown(values['high'])})")
    if choice == "lognormal":
        if not values["gm"] > 0:
            return f"the geometric mean ({shown(values['gm'])}) must be above 0"
        if not values["gsd"] > 1:
            return (f"the geometric SD ({values['gsd']:g}) must be above 1 (1 means no "
                    "spread: choose fixed)")
    return None


def _base_item_name(state, study: str) -> str | None:
    base = state.get("case.base", {}) or {}
    if study == "tank":
        tanks = base.get("tank") or []
        return tanks[0].get("name") if tanks else None
    return next((s.get("name") for s in base.get("spill", []) or [] if s.get("room")), None)


def carried_uncertain(state, study: str) -> list[dict]:
    """[[uncertain]] tables of the loaded file for the item on a page, for inputs the
    page does not edit (such as a pool area or ventilation rate), as written."""
    base = state.get("case.base", {}) or {}
    name = str(_base_item_name(state, study) or "").strip().lower()
    if not name:
        return []
    return [dict(u) for u in base.get("uncertain", []) or []
            if str(u.get("item", "")).strip().lower() == name
            and u.get("input") not in UNCERTAIN[study]]


def uncertain_entries(state, study: str, item_name: str) -> tuple[list[dict], dict]:
    """[[uncertain]] tables for the inputs of one page given as ranges, and the
    problems of those that cannot be used (input -> message; each is left out)."""
    if study not in UNCERTAIN or uncertainty_unavailable(state, study):
        return [], {}
    entries, problems = [], {}
    for field in UNCERTAIN[study]:
        choice = state.get(key(uncertain_name(study, field, "kind")), "fixed")
        if choice == "fixed" or choice not in DISTRIBUTIONS:
            continue
        problem = distribution_problem(state, study, field)
        if problem:
            problems[field] = problem
            continue
        loaded = (state.get("case.base_uncertain", {}) or {}).get(f"{study}.{field}")
        if choice == "file":
            spec = state[key(uncertain_name(study, field, "file"))]
        elif loaded and loaded["choice"] == choice and all(
                _unchanged_part(state, study, field, part, value)
                for part, value in loaded["si"].items()):
            spec = loaded["written"]  # as the loaded file wrote it
        elif choice == "lognormal":
            spec = {"lognormal": {"gm": _parameter_text(state, study, field, "gm"),
                                  "gsd": _parameter(state, study, field, "gsd")}}
        else:
            spec = {choice: [_parameter_text(state, study, field, part)
                             for part in DISTRIBUTIONS[choice]]}
        entries.append({"item": item_name, "input": field, "distribution": spec})
    for entry in carried_uncertain(state, study):
        entries.append(dict(entry, item=item_name))
    return entries, problems


def _unchanged_part(state, study: str, field: str, part: str, value_si) -> bool:
    kind = UNCERTAIN[study][field][2]
    name = uncertain_name(study, field, part)
    shown = state.get(key(name))
    if shown is None or value_si is None:
        return False
    if kind is None or part == "gsd":
        return round_shown(float(value_si)) == float(shown)
    return unchanged(state, name, value_si)


def monte_carlo_table(state) -> dict:
    """The [monte_carlo] table of the settings on screen."""
    samples = state.get(key("mc.samples"))
    samples = DEFAULT_SAMPLES if samples is None else int(samples)
    seed = state.get(key("mc.seed"))
    return {"samples": max(100, min(samples, MAX_SAMPLES)),
            "seed": DEFAULT_SEED if seed is None else max(0, int(seed)),
            "method_uncertainty": bool(state.get(key("mc.method"), True))}
