"""The package's version and the cautions every result carries.

Kept apart from ``estimator/__init__.py`` so that modules inside the package can
import them without importing the package's front door (no import cycle).
"""

__version__ = "0.1.0"

#: The cautions every result carries.
CAUTIONS = (
    "This is a screening estimate, not a measurement.",
    "Measure the real atmosphere with calibrated direct-reading instruments before "
    "anyone enters or opens a space.",
    "Follow local codes, permits, confined-space and hot-work rules, and qualified "
    "industrial-hygiene and process-safety practice.",
)
