"""Downstream check: the equilibrium demo study (examples/equilibrium_demo.toml) run through the CLI and
read back with xarray (Debian python3-xarray) and scipy.constants.

Checks the equilibrium, experiment and attribution variables against definitions and outside values:
the Stefan-Boltzmann constant from scipy (CODATA), the hypsometric 6.5 K/km profile in the convective
region, linearity of the shortwave in the sunlight, the ordering of Kiehl & Trenberth (1997), and
1 vs 2 threads giving identical numbers.
"""
import os
import sys

import numpy as np
import scipy.constants as sc
import xarray as xr

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "support"))
from checks import Checks, parse_args, run_study  # noqa: E402

check = Checks("equilibrium_xarray")


def run(exe, study, out, threads):
    run_study(exe, study, out, threads)
    return os.path.join(out, "equilibrium_demo.nc")


def main():
    args = parse_args()
    study = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "..", "examples", "equilibrium_demo.toml")
    path1 = run(args.exe, study, os.path.join(args.workdir, "t1"), 1)
    path2 = run(args.exe, study, os.path.join(args.workdir, "t2"), 2)
    ds = xr.open_dataset(path1)
    experiments = [n.decode() if isinstance(n, bytes) else str(n) for n in ds["experiment_name"].values]
    check("experiment_name" in ds.coords and "doubled_co2" in experiments, f"experiment names {experiments}")
    check("equilibrium_method" in ds.attrs, "equilibrium_method attribute")

    # Equilibrium: the top of the atmosphere balances and radiative layers have no heating left
    # (the solver's criteria: 0.01 W m-2 and 1e-3 K/day).
    check(bool(np.all(np.abs(ds.absorbed_solar - ds.olr) <= 0.0101)), f"TOA imbalance {(ds.absorbed_solar - ds.olr).values}")
    heating = (ds.lw_heating_rate + ds.sw_heating_rate).values
    radiative = ds.convective_layer.values == 0
    check(np.max(np.abs(heating[radiative])) <= 1.01e-3, f"radiative-layer heating {np.max(np.abs(heating[radiative]))}")
    # Convective layers follow the 6.5 K/km hypsometric profile through the surface:
    # T = Ts (p/ps)^(R_d Gamma / g), R_d = R / M_d with R from scipy (CODATA), M_d = 28.9644 g/mol
    # (U.S. Standard Atmosphere 1976) and standard gravity from scipy.
    exponent = sc.R / 28.9644e-3 * 6.5e-3 / sc.g
    for c in range(ds.sizes["column"]):
        conv = ds.convective_layer.values[c] == 1
        ps = ds.pressure_level.values[c, -1]
        expected = ds.surface_temperature.values[c] * (ds.pressure_layer.values[c] / ps) ** exponent
        check(conv.sum() >= 3, f"column {c}: a convective region of {conv.sum()} layers")
        check(np.allclose(ds.temperature_layer.values[c][conv], expected[conv], rtol=0, atol=1e-6),
              f"column {c}: convective layers off the 6.5 K/km profile")

    # Attribution: G = sigma Ts^4 - OLR with sigma from scipy.constants (CODATA); overlap makes the
    # removal shares sum to less than G and the addition shares to more (Schmidt et al. 2010, JGR 115);
    # water vapour first and CO2 second (Kiehl & Trenberth 1997, BAMS 78).
    g = ds.greenhouse_effect.values
    check(np.allclose(g, sc.Stefan_Boltzmann * ds.surface_temperature.values ** 4 - ds.olr.values, rtol=1e-9, atol=1e-9),
          "greenhouse_effect = sigma Ts^4 - OLR")
    gases = [n.decode() if isinstance(n, bytes) else str(n) for n in ds["gas_name"].values]
    for c in range(ds.sizes["column"]):
        removal = ds.greenhouse_by_gas_removal.values[c]
        addition = ds.greenhouse_by_gas_addition.values[c]
        check(removal.sum() <= g[c] <= addition.sum(), f"column {c}: removal {removal.sum()} <= G {g[c]} <= addition {addition.sum()}")
        for shares in (removal, addition):
            order = [gases[i] for i in np.argsort(-shares)]
            check(order[:2] == ["h2o", "co2"], f"column {c}: order {order}")
        bands = ds.greenhouse_by_band_removal.values[c]
        check(abs(float(ds.band_lw.values[np.argmax(bands)]) - 667.5) < 50, "the CO2 15 um band carries the largest band share")

    # Experiments.
    e2x = experiments.index("doubled_co2")
    esun = experiments.index("one_percent_brighter_sun")
    # The shortwave is linear in the incoming sunlight, so 1 % more sunlight at fixed state adds exactly
    # 1 % of the absorbed solar at the top (linearity of radiative transfer).
    check(np.allclose(ds.forcing_toa_instantaneous.values[:, esun], 0.01 * ds.absorbed_solar.values, rtol=1e-9),
          "insolation forcing = 1 % of absorbed solar")
    # After the stratosphere adjusts, the forcing is the same at the tropopause and the top.
    check(bool(np.all(np.abs(ds.forcing_adjusted - ds.forcing_adjusted_toa) <= 0.02)), "adjusted forcing TOA vs tropopause")
    # The adjustment leaves the troposphere as it was.
    for c in range(ds.sizes["column"]):
        for e in range(len(experiments)):
            trop = ds.pressure_layer.values[c] > ds.tropopause_pressure.values[c, e]
            check(np.array_equal(ds.temperature_layer_adjusted.values[c, e][trop], ds.temperature_layer.values[c][trop]),
                  f"column {c} experiment {e}: troposphere changed by the adjustment")
    # Definitions of the derived numbers.
    dts = ds.surface_temperature_change.values
    check(np.allclose(dts, ds.surface_temperature_perturbed.values - ds.surface_temperature.values.reshape(-1, 1), atol=1e-9),
          "surface_temperature_change = perturbed - base")
    check(np.allclose(ds.warming_per_co2_doubling.values[:, e2x], dts[:, e2x]), "one doubling")
    check(bool(np.all(np.isnan(np.delete(ds.warming_per_co2_doubling.values, e2x, axis=1)))), "NaN for non-CO2 experiments")
    check(np.allclose(ds.climate_feedback_parameter.values, -ds.forcing_adjusted.values / dts, rtol=1e-9),
          "climate_feedback_parameter = -F_adj / dTs")
    terms = (ds.feedback_planck + ds.feedback_lapse_rate + ds.feedback_water_vapour + ds.feedback_stratospheric_temperature)
    check(np.allclose(ds.feedback_residual, ds.climate_feedback_parameter - terms, atol=1e-9), "feedback residual")
    # Physical ranges for doubled CO2 (tolerances explained in tests/climate/experiment_test.cpp):
    # adjusted forcing 1.0-1.35 x 5.35 ln 2 = 3.71 W m-2 (Myhre et al. 1998; clear sky forces more than
    # all sky); warming with fixed relative humidity near Manabe & Wetherald's (1967) 2.4 K (from memory);
    # Planck feedback near -3.2 (all sky, Soden & Held 2006) to -4 W m-2 K-1 (clear sky); positive
    # water-vapour feedback.
    f2x = ds.forcing_adjusted.values[:, e2x]
    check(bool(np.all((f2x > 3.71) & (f2x < 5.01))), f"2xCO2 adjusted forcing {f2x}")
    check(bool(np.all((dts[:, e2x] > 1.5) & (dts[:, e2x] < 3.5))), f"2xCO2 warming {dts[:, e2x]}")
    planck = ds.feedback_planck.values[:, e2x]
    check(bool(np.all((planck > -4.2) & (planck < -3.2))), f"Planck feedback {planck}")
    check(bool(np.all(ds.feedback_water_vapour.values[:, e2x] > 0.5)), "water-vapour feedback positive")
    check(bool(np.all(np.abs(ds.feedback_residual.values[:, e2x]) < 0.15 * np.abs(ds.climate_feedback_parameter.values[:, e2x]))),
          f"feedback residual {ds.feedback_residual.values[:, e2x]}")

    # Bit-identical numbers for 1 and 2 threads.
    check.identical(ds, xr.open_dataset(path2), "between 1 and 2 threads")
    return check.report()


if __name__ == "__main__":
    raise SystemExit(main())
