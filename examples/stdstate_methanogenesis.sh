#!/usr/bin/env bash
# Standard-state energetics of hydrogenotrophic methanogenesis from 2 to 350 degC along the
# usual pressure convention (1.01325 bar to 100 degC, liquid-vapour saturation above).
redoxgibbs stdstate "CO2(aq) + 4 H2(aq) = CH4(aq) + 2 H2O(l)" --temperature 2,25,50,100,150,200,250,300,350 --pressure psat
