"""A small scenario shared by tests: one invented pool (an inline fluid), one catalog reaction and
one flow-through supply. Tests add sections to it or change its lines."""

POOL_SCENARIO = """title = "invented pool"
activity_model = "bdot"
[[sites]]
name = "pool"
[sites.fluid]
"T [degC]" = 30
"P [bar]" = 1
pH = 7.0
"Na+ [mmol/kg]" = 10
"Cl- [mmol/kg]" = 10
"HCO3- [mmol/kg]" = 2
"H2(aq) [umol/kg]" = 20
"O2(aq) [umol/kg]" = 100
[reactions]
catalog = ["aerobic hydrogen oxidation"]
[[supply]]
kind = "flow-through"
flux_kg_per_s = 1.0
volume_m3 = 100.0
"""
