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

# --- Unit factors for equations published in customary units -----------------

#: One bar. [Pa] Exact by definition (ISO 80000-4).
BAR = 1e5

#: International avoirdupois pound. [kg] Exact since the 1959 international yard
#: and pound agreement; NIST SP 811 (2008), Appendix B.
POUND_MASS = 0.45359237

#: International foot. [m] Exact since the 1959 agreement; NIST SP 811 (2008),
#: Appendix B.
FOOT = 0.3048

#: Conventional millimetre of mercury. [Pa] NIST SP 811 (2008), Appendix B
#: (133.322 387 415 Pa, from 13.5951 g/cm3 mercury under standard gravity).
MILLIMETRE_OF_MERCURY = 133.322387415

#: Pound-force per square inch. [Pa] Derived from the exact pound, foot and
#: standard gravity (NIST SP 811 (2008), Appendix B):
#: 0.45359237 kg x 9.80665 m/s2 / (0.3048 m / 12)^2.
POUND_FORCE_PER_SQUARE_INCH = POUND_MASS * STANDARD_GRAVITY / (FOOT / 12.0) ** 2

#: Pascals per pressure unit: the one table of pressure-unit factors (exact by
#: definition, or NIST SP 811 for mmHg and psi). Gauge or absolute is the
#: caller's business; "psi" here is pound-force per square inch.
PRESSURE_UNITS = {
    "Pa": 1.0,
    "hPa": 1e2,
    "kPa": 1e3,
    "MPa": 1e6,
    "bar": BAR,
    "mbar": BAR / 1e3,
    "atm": STANDARD_ATMOSPHERE,
    "mmHg": MILLIMETRE_OF_MERCURY,
    "torr": STANDARD_ATMOSPHERE / 760.0,
    "psi": POUND_FORCE_PER_SQUARE_INCH,
}

#: Seconds in one minute and in one hour. [s] SI definitions.
SECONDS_PER_MINUTE = 60.0
SECONDS_PER_HOUR = 3600.0

# --- Air and ground properties used by the pool-evaporation models -----------

#: Sutherland's law for the viscosity of air: reference viscosity, reference
#: temperature and Sutherland constant. [Pa s], [K], [K] White, Viscous Fluid
#: Flow, 3rd ed. (2006), Table 1-2 / Eq. 1-36 (from memory); within 0.5 % of
#: the Lemmon-Jacobsen air correlation between 250 and 350 K.
AIR_SUTHERLAND_VISCOSITY = 1.716e-5
AIR_SUTHERLAND_TEMPERATURE = 273.15
AIR_SUTHERLAND_CONSTANT = 110.4

#: Fuller diffusion volume of air. [-] Fuller, Ensley & Giddings (1969),
#: J. Phys. Chem. 73, 3679; Poling, Prausnitz & O'Connell, 5th ed., Table 11-1.
FULLER_VOLUME_AIR = 19.7

#: Specific heat capacity of air at constant pressure near room temperature.
#: [J/(kg K)] 1006 J/(kg K) at 20-25 degC (Incropera & DeWitt, Fundamentals of
#: Heat and Mass Transfer, Table A.4, from memory; CoolProp's air model gives
#: 1006.1-1006.3 between 293 and 298 K).
AIR_HEAT_CAPACITY = 1006.0

#: Prandtl number of air near room temperature. [-] 0.707 at 300 K (Incropera &
#: DeWitt, Table A.4, from memory; CoolProp's air model gives 0.707-0.708).
AIR_PRANDTL_NUMBER = 0.707

#: Screening depth of an undiked spill on flat ground. [m] US EPA, Risk Management
#: Program Guidance for Offsite Consequence Analysis, EPA 550-B-99-009 (1999,
#: revised 2009), Section 3.2 and Appendix D: the liquid is assumed to spread
#: instantaneously to a depth of one centimetre.
UNDIKED_SPILL_DEPTH = 0.01

#: Thermal conductivity and thermal diffusivity of concrete (stone mix) at 300 K.
#: [W/(m K)], [m2/s] 1.4 W/(m K); 2300 kg/m3 and 880 J/(kg K) give 6.92e-7 m2/s
#: (Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, Table A.3, from
#: memory).
CONCRETE_THERMAL_CONDUCTIVITY = 1.4
CONCRETE_THERMAL_DIFFUSIVITY = 1.4 / (2300.0 * 880.0)

#: Thermal conductivity and thermal diffusivity of soil at 300 K. [W/(m K)],
#: [m2/s] 0.52 W/(m K); 2050 kg/m3 and 1840 J/(kg K) give 1.38e-7 m2/s
#: (Incropera & DeWitt, Table A.3, from memory). Moist soil conducts more.
SOIL_THERMAL_CONDUCTIVITY = 0.52
SOIL_THERMAL_DIFFUSIVITY = 0.52 / (2050.0 * 1840.0)

#: Reference period of an 8-hour time-weighted average. [s] 8 h; US 29 CFR
#: 1910.1000(d)(1)(i) divides the shift's exposure sum by 8 h.
EIGHT_HOUR_SHIFT = 8.0 * 3600.0

#: Averaging period of a short-term exposure limit. [s] 15 min (ACGIH TLV booklet,
#: definition of the TLV-STEL; US 29 CFR 1910.1000 Table Z-1 footnotes).
SHORT_TERM_PERIOD = 15.0 * 60.0
