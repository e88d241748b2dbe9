"""Physical constants and conventions of the trade, each with its unit and source."""

#: Molar gas constant. [J/(mol K)] CODATA 2018 (exact since the 2019 SI redefinition).
GAS_CONSTANT = 8.314462618

#: Standard atmosphere. [Pa] ISO 2533:1975 / US Standard Atmosphere 1976.
STANDARD_ATMOSPHERE = 101325.0

#: Zero of the Celsius scale. [K] SI definition.
ZERO_CELSIUS = 273.15

#: Reference temperature of the occupational-hygiene ppm <-> mg/m3 convention. [K]
HYGIENE_REFERENCE_TEMPERATURE = 298.15

#: Molar volume used by the occupational-hygiene convention at 25 degC and 1 atm.
#: [m3/mol] 24.45 L/mol, common practice (e.g. the ppm/mg/m3 conversion note of
#: the ACGIH TLV booklet and US OSHA). The ideal-gas value R*298.15/101325 is
#: 24.465 L/mol; the convention rounds it.
HYGIENE_MOLAR_VOLUME = 24.45e-3

#: Oxygen in fresh air. [volume fraction] 20.9 %, the figure oxygen meters are
#: set to in fresh air (common practice); dry air holds 20.946 % (US Standard
#: Atmosphere 1976).
OXYGEN_IN_AIR = 0.209

#: Molar mass of dry air. [kg/mol] US Standard Atmosphere 1976.
MOLAR_MASS_AIR = 0.0289644

#: Standard acceleration of gravity. [m/s2] CGPM 1901, ISO 80000-3.
STANDARD_GRAVITY = 9.80665
