"""An icy body's ocean column: pressure at depth under an ice shell, ocean volume and areas.

The ice shell (constant density) lies on a liquid ocean whose density is that of the fluid at its
own temperature and pressure. Pressure at a depth z below the ice-ocean interface follows the
hydrostatic equation with self-gravity of the shells above (a spherically symmetric body):

    dP/dz = rho(P) g(r),   g(r) = G [M - m(r)] / r^2,   dm/dz = 4 pi r^2 rho(P),   r = R - h_ice - z

where m(r) is the mass of ice and fluid above radius r (m = m_ice at the interface). It is
integrated by the classical fourth-order Runge-Kutta method over all samples at once. With
constant density it reduces to the closed form of :func:`pressure_uniform_density_Pa`, checked in
the tests; for a thin shell it reduces to P = rho g h.
"""

from dataclasses import dataclass

import numpy as np

from ..errors import InputError
from ..water.iapws95 import liquid_density_kg_m3

__all__ = ["G_NEWTON", "RK4_STEPS", "Body", "pressure_uniform_density_Pa"]

#: Newtonian constant of gravitation [m3 kg-1 s-2], CODATA 2018
G_NEWTON = 6.67430e-11
#: Runge-Kutta steps per column (the density changes by a few per cent over an ocean: the
#: integration error is below 1e-9 of the pressure, tests)
RK4_STEPS = 8


def pressure_uniform_density_Pa(M_kg, R_m, r_m, rho_kg_m3):
    """Hydrostatic pressure [Pa] at radius r below the surface R of a body of mass M whose outer
    shell (r to R) has uniform density rho, the mass below r taken as a point mass:

        P(r) = rho G [M' (1/r - 1/R) + (2 pi / 3) rho (R^2 - r^2)],   M' = M - (4 pi / 3) rho R^3

    (integral of rho g(r) dr with g(r) = G [M' + (4 pi / 3) rho r^3] / r^2).
    """
    Mp = M_kg - 4.0 * np.pi / 3.0 * rho_kg_m3 * R_m**3
    return rho_kg_m3 * G_NEWTON * (Mp * (1.0 / r_m - 1.0 / R_m) + 2.0 * np.pi / 3.0 * rho_kg_m3 * (R_m**2 - r_m**2))


@dataclass(frozen=True)
class Body:
    """A body with an ice shell over a liquid ocean (SI-named fields).

    ``radius_km`` and either ``mass_kg`` or ``surface_gravity_m_s2``; ``ice_shell_km`` and
    ``ice_density_kg_m3`` (constant over the shell); ``ocean_depth_km`` (the liquid layer's
    thickness); ``surface_pressure_bar`` (0 for an airless body).
    """

    name: str
    radius_km: float
    ice_shell_km: float
    ocean_depth_km: float
    mass_kg: float = np.nan
    surface_gravity_m_s2: float = np.nan
    ice_density_kg_m3: float = 920.0   # common practice for ice shells (ice Ih: 917 at 0 C, 1 bar)
    surface_pressure_bar: float = 0.0

    def __post_init__(self):
        given = [k for k in ("mass_kg", "surface_gravity_m_s2") if np.isfinite(getattr(self, k))]
        if len(given) != 1:
            raise InputError(f"body {self.name!r}: give either mass_kg or surface_gravity_m_s2 (one of them), "
                             f"not {' and '.join(given) or 'neither'}")
        for key in ("radius_km", "ice_density_kg_m3", given[0]):
            value = getattr(self, key)
            if not (np.isfinite(value) and value > 0):
                raise InputError(f"body {self.name!r}: {key} = {value!r} must be a number above 0")
        for key in ("ice_shell_km", "ocean_depth_km", "surface_pressure_bar"):
            value = getattr(self, key)
            if not (np.isfinite(value) and value >= 0):
                raise InputError(f"body {self.name!r}: {key} = {value!r} must be a number of 0 or more")
        if self.ice_shell_km + self.ocean_depth_km >= self.radius_km:
            raise InputError(f"body {self.name!r}: ice_shell_km + ocean_depth_km = "
                             f"{self.ice_shell_km + self.ocean_depth_km:g} km reaches the centre of a body of "
                             f"radius {self.radius_km:g} km; give a thinner shell or ocean")

    @property
    def mass(self):
        """Mass [kg] (from the surface gravity where that is given: M = g R^2 / G)."""
        if np.isfinite(self.mass_kg):
            return self.mass_kg
        return self.surface_gravity_m_s2 * (self.radius_km * 1e3) ** 2 / G_NEWTON

    @property
    def gravity(self):
        """Surface gravity [m/s2]."""
        return G_NEWTON * self.mass / (self.radius_km * 1e3) ** 2

    @property
    def interface_radius_m(self):
        """Radius of the ice-ocean interface [m]."""
        return (self.radius_km - self.ice_shell_km) * 1e3

    @property
    def ice_mass_kg(self):
        """Mass of the ice shell [kg] (uniform density)."""
        R, r = self.radius_km * 1e3, self.interface_radius_m
        return 4.0 * np.pi / 3.0 * self.ice_density_kg_m3 * (R**3 - r**3)

    def interface_pressure_bar(self):
        """Pressure at the ice-ocean interface [bar]: the surface pressure plus the ice column."""
        R, r = self.radius_km * 1e3, self.interface_radius_m
        return self.surface_pressure_bar + pressure_uniform_density_Pa(self.mass, R, r, self.ice_density_kg_m3) / 1e5

    def ocean_volume_m3(self):
        """Volume of the liquid ocean [m3]."""
        r_top = self.interface_radius_m
        r_bottom = r_top - self.ocean_depth_km * 1e3
        return 4.0 * np.pi / 3.0 * (r_top**3 - r_bottom**3)

    def surface_area_m2(self):
        """Surface area of the body [m2]."""
        return 4.0 * np.pi * (self.radius_km * 1e3) ** 2

    def seafloor_area_m2(self):
        """Area of the seafloor [m2]."""
        return 4.0 * np.pi * (self.interface_radius_m - self.ocean_depth_km * 1e3) ** 2

    def seafloor_pressure_bar(self, T_K):
        """Pressure at the seafloor [bar] under a column of pure liquid water at T_K [K] (IAPWS-95)."""
        T = float(T_K)
        return float(self.pressure_bar(np.array([self.ocean_depth_km]),
                                       lambda P_bar: liquid_density_kg_m3(np.full(P_bar.shape, T), P_bar * 1e5))[0])

    def depth_below_interface_km(self, depth_km=None, above_seafloor_km=None):
        """Depth below the ice-ocean interface [km] of a depth or a height above the seafloor,
        refusing positions outside the ocean (arrays; one of the two given)."""
        if above_seafloor_km is not None:
            depth_km = self.ocean_depth_km - np.asarray(above_seafloor_km, float)
        depth = np.asarray(depth_km, float)
        bad = ~np.isfinite(depth) | (depth < 0) | (depth > self.ocean_depth_km * (1 + 1e-12))
        if bad.any():
            raise InputError(f"body {self.name!r}: a position {depth[bad].ravel()[0]:g} km below the ice-ocean "
                             f"interface lies outside the ocean (0 to {self.ocean_depth_km:g} km); give a depth "
                             "within it")
        return depth

    def pressure_bar(self, depth_km, density_kg_m3):
        """Pressure [bar] at depths below the ice-ocean interface [km] (array, n).

        ``density_kg_m3(P_bar)`` gives each sample's fluid density at pressures P (array, n): each
        sample's fluid fills the column above it (a well-mixed ocean of that sample's composition
        and temperature).
        """
        z_end = self.depth_below_interface_km(depth_km) * 1e3
        R_top, M = self.interface_radius_m, self.mass

        def slope(z, P, m):
            rho = density_kg_m3(P / 1e5)
            r = R_top - z
            return rho * G_NEWTON * (M - m) / r**2, 4.0 * np.pi * r**2 * rho

        P = np.full(z_end.size, self.interface_pressure_bar() * 1e5)
        m = np.full(z_end.size, self.ice_mass_kg)
        h = z_end / RK4_STEPS
        z = np.zeros(z_end.size)
        for _ in range(RK4_STEPS):
            k1 = slope(z, P, m)
            k2 = slope(z + h / 2, P + h / 2 * k1[0], m + h / 2 * k1[1])
            k3 = slope(z + h / 2, P + h / 2 * k2[0], m + h / 2 * k2[1])
            k4 = slope(z + h, P + h * k3[0], m + h * k3[1])
            P = P + h / 6 * (k1[0] + 2 * k2[0] + 2 * k3[0] + k4[0])
            m = m + h / 6 * (k1[1] + 2 * k2[1] + 2 * k3[1] + k4[1])
            z = z + h
        return P / 1e5
