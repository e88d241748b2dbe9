"""Scenario texts shared by several test files (as constants, for parametrize lists;
tests/conftest.py hands them out as fixtures too)."""

#: The smallest valid scenario: one pure liquid (toluene) in one tank at 25 degC.
MINIMAL_TANK_TOML = '''
[scenario]
title = "t"

[[liquid]]
name = "solvent"
substance = "toluene"

[[tank]]
name = "A"
liquid = "solvent"
temperature = "25 degC"
'''
