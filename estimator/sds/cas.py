"""CAS numbers: the check digit, the substance each one names (`resolve_cas`), and the
isomer mixtures a sheet may name with one number."""

from __future__ import annotations

import re
from types import MappingProxyType

from ..errors import InputError
from ..substances import Substance


CAS_NUMBER = re.compile(r"(?<![\d-])(\d{2,7}-\d{2}-\d)(?![\d-])")

#: Isomer-mixture CAS numbers -> default split (CAS of each part, mass share) and
#: where it comes from.
ISOMER_MIXTURES = MappingProxyType({
    "1330-20-7": (
        "xylene, mixed isomers",
        (("95-47-6", 0.20), ("108-38-3", 0.44), ("106-42-3", 0.20), ("100-41-4", 0.16)),
        "typical commercial mixed xylene: 44 % m-, 20 % o-, 20 % p-xylene and 16 % "
        "ethylbenzene (ATSDR Toxicological Profile for Xylene, 2007, chapter 4; from "
        "memory)"),
    "25551-13-7": (
        "trimethylbenzene, mixed isomers",
        (("95-63-6", 1 / 3), ("108-67-8", 1 / 3), ("526-73-8", 1 / 3)),
        "equal parts of 1,2,4-, 1,3,5- and 1,2,3-trimethylbenzene (a stated convention: "
        "sheets rarely give the split; ask the supplier)"),
    "25340-17-4": (
        "diethylbenzene, mixed isomers",
        (("135-01-3", 1 / 3), ("141-93-5", 1 / 3), ("105-05-5", 1 / 3)),
        "equal parts of o-, m- and p-diethylbenzene (a stated convention: sheets rarely "
        "give the split; ask the supplier)"),
})


def cas_checksum_ok(cas: str) -> bool:
    """Whether a CAS number's check digit is right (CAS registry rule)."""
    digits = cas.replace("-", "")
    body, check = digits[:-1], int(digits[-1])
    return sum((i + 1) * int(d) for i, d in enumerate(reversed(body))) % 10 == check


def resolve_cas(cas: str) -> Substance | None:
    """The substance of a CAS number: the bundled table, then any CAS through
    `estimator.substances.lookup_cas`; None if the property data do not know it."""
    from ..substances import lookup_cas, substance

    try:
        return substance(cas, "cas")
    except InputError:  # unknown to the table (UnknownSubstanceError) or refused
        pass
    try:
        return lookup_cas(cas)
    except InputError:
        return None
