"""One component set loaded into thermo: constants, correlations, a cubic EOS, a flasher, and the
property methods of each phase. Used by :mod:`boresize.properties.thermo`; thermo is imported here,
inside :func:`load_package`, never at module import.

Methods (each named in the state's model text):

* phase split: the chosen cubic EOS with binary interaction parameters kij from thermo's "ChemSep PR"
  table (zero where the table has none), thermo's ``FlashVL`` for mixtures; for one component, the
  vapour-pressure correlation of thermo decides liquid or gas (more exact than a cubic EOS's own).
* gas density and speed of sound: the EOS. Gas viscosity: the dilute-gas viscosity from thermo's
  pure-gas correlations mixed by Herning & Zipperer, plus the dense-fluid term of Lorentz, Bray & Clarke
  (J. Pet. Technol. 16 (1964) 1171, doi:10.2118/915-PA) at the EOS molar volume, which corrects for
  pressure (thermo's default gas viscosity ignores it: -8 % for methane at 50 bar, -20 % at 100 bar).
  Measured against CoolProp: methane and natural gases within 1.5 % to 100 bar, air 1.5 %, steam and
  ammonia about +5 %, hydrogen/methane +7 %, dense CO2 at 40 degC and 100 bar -9 %.
* liquid density: the saturated volume from pure-liquid correlations (VDI Heat Atlas or Perry's, see
  :data:`PREFERRED_METHODS`) mixed by Amagat's law when every component is below 0.95 of its critical
  temperature (COSTALD misses polar liquids: methanol +8 %, ethylene glycol +13 %), else COSTALD with
  Hankinson-Thomson mixing (dissolved gases); then the Thomson-Brobst-Hankinson compressed-liquid
  correction (:func:`~boresize.properties.mixing.costald_liquid_volume`). Above 0.95 of the COSTALD
  pseudo-critical temperature: the EOS liquid root. Amagat's law ignores the excess volume (about
  -2 % for water/methanol).
* liquid viscosity: pure-liquid correlations (same preference) with Lucas' pressure correction, mixed
  by logarithmic molar (Arrhenius) mixing, which under-predicts strongly non-ideal mixtures such as
  water/alcohols; above 0.95 Tcm, Lorentz-Bray-Clarke.
"""

from __future__ import annotations

import functools
import importlib.metadata
import math
from collections.abc import Sequence
from dataclasses import dataclass
from typing import Any

from boresize.errors import PropertyError
from boresize.properties.mixing import costald_liquid_volume, mass_fractions, molar_mass

__all__ = ["EOS_CLASSES", "EOS_TITLES", "PhaseResult", "Split", "ThermoPackage", "load_package", "thermo_version",
           "versions"]

#: EOS id -> thermo mixture class name.
EOS_CLASSES: dict[str, str] = {
    "PR": "PRMIX", "PR78": "PR78MIX", "SRK": "SRKMIX", "TWU-PR": "TWUPRMIX",
    "PR-TRANSLATED": "PRMIXTranslatedConsistent", "SRK-TRANSLATED": "SRKMIXTranslatedConsistent",
}
#: EOS id -> title for reports.
EOS_TITLES: dict[str, str] = {
    "PR": "Peng-Robinson (1976)", "PR78": "Peng-Robinson (1978)", "SRK": "Soave-Redlich-Kwong (1972)",
    "TWU-PR": "Peng-Robinson with Twu (1995) alpha",
    "PR-TRANSLATED": "volume-translated Peng-Robinson (Le Guennec et al. 2016)",
    "SRK-TRANSLATED": "volume-translated Soave-Redlich-Kwong (Le Guennec et al. 2016)",
}
_KIJ_TABLE = "ChemSep PR"


@dataclass(frozen=True)
class PhaseResult:
    """Properties of one phase: density [kg/m3], viscosity [Pa s], molar mass [kg/mol], methods used,
    speed of sound [m/s] (gas phases, from the EOS)."""

    density: float
    viscosity: float
    molar_mass: float
    method: str
    speed_of_sound: float | None = None


@dataclass(frozen=True)
class Split:
    """A flash result: thermo's phase label ("V", "L", "VL"), molar vapour fraction [-], phase compositions."""

    label: str
    vapour_fraction: float
    gas_zs: tuple[float, ...]
    liquid_zs: tuple[float, ...]


@functools.lru_cache(maxsize=1)
def thermo_version() -> str:
    """thermo's version from the installed distribution (no import; cached: the lookup costs ~0.5 ms)."""
    return importlib.metadata.version("thermo")


@functools.lru_cache(maxsize=1)
def versions() -> str:
    """"thermo X + chemicals Y" from the installed distributions (no import)."""
    return f"thermo {importlib.metadata.version('thermo')} + chemicals {importlib.metadata.version('chemicals')}"


class ThermoPackage:
    """Constants, correlations, EOS phases and flasher of one component set (CAS numbers) and one EOS."""

    def __init__(self, cas: tuple[str, ...], eos: str) -> None:
        import thermo
        from thermo import CEOSGas, CEOSLiquid, ChemicalConstantsPackage, FlashVL
        from thermo.interaction_parameters import IPDB

        constants, correlations = ChemicalConstantsPackage.from_IDs(list(cas))
        self.names: tuple[str, ...] = tuple(constants.names)
        _check_constants(constants, self.names)
        self.constants, self.correlations = constants, correlations
        self.molar_masses = tuple(m / 1000.0 for m in constants.MWs)
        self.tcs, self.pcs = tuple(constants.Tcs), tuple(constants.Pcs)
        self.vcs, self.omegas = tuple(constants.Vcs), tuple(constants.omegas)
        for group in (correlations.VolumeLiquids, correlations.VaporPressures, correlations.ViscosityLiquids,
                      correlations.ViscosityGases):
            for correlation in group:
                _prefer_published(correlation)
        for viscosity in correlations.ViscosityLiquids:  # Lucas (published), not a CoolProp call per state
            viscosity.method_P = "LUCAS" if "LUCAS" in viscosity.all_methods_P else "NEGLECT_P"
        kijs = IPDB.get_ip_asymmetric_matrix(_KIJ_TABLE, constants.CASs, "kij")
        kwargs = {"Tcs": constants.Tcs, "Pcs": constants.Pcs, "omegas": constants.omegas, "kijs": kijs}
        eos_class = getattr(thermo, EOS_CLASSES[eos])
        self.gas_phase = CEOSGas(eos_class, kwargs, HeatCapacityGases=correlations.HeatCapacityGases)
        self.liquid_phase = CEOSLiquid(eos_class, kwargs, HeatCapacityGases=correlations.HeatCapacityGases)
        self.flasher: Any = None
        if len(cas) > 1:
            self.flasher = FlashVL(constants, correlations, gas=self.gas_phase, liquid=self.liquid_phase)

    # -- phase split and saturation ------------------------------------------------------------
    def flash(self, temperature: float, pressure: float, zs: Sequence[float]) -> Split:
        """Phase split of a mixture at (temperature [K], pressure [Pa abs]); raises thermo's errors."""
        result = self.flasher.flash(T=temperature, P=pressure, zs=list(zs))
        label = str(result.phase)
        gas = tuple(result.gas.zs) if result.gas is not None else ()
        liquid = tuple(result.liquid0.zs) if result.liquids else ()
        return Split(label, float(result.VF), gas, liquid)

    def saturation_pressure(self, temperature: float, zs: Sequence[float], vapour_fraction: float) -> float | None:
        """Bubble (vapour_fraction 0) or dew (1) pressure [Pa abs] at ``temperature`` [K], None if none found."""
        try:
            pressure = float(self.flasher.flash(T=temperature, VF=vapour_fraction, zs=list(zs)).P)
        except Exception:  # thermo signals "no saturation point" with assorted exceptions
            return None
        return pressure if pressure > 0.0 else None

    def vapour_pressure(self, temperature: float) -> float | None:
        """Vapour pressure of a pure component at ``temperature`` [K] [Pa abs], None above Tc or out of range."""
        if not temperature < self.tcs[0]:
            return None
        value = self.correlations.VaporPressures[0].T_dependent_property(temperature)
        return float(value) if value else None

    # -- properties of one phase ---------------------------------------------------------------
    def gas(self, temperature: float, pressure: float, zs: Sequence[float]) -> PhaseResult:
        """Gas (or dense supercritical) phase: EOS density and speed of sound, Lorentz-Bray-Clarke viscosity.

        Speed of sound c^2 = -(V^2/M) (Cp/Cv) (dP/dV)_T from the EOS with thermo's ideal-gas heat capacities.
        """
        phase = self.gas_phase.to(T=temperature, P=pressure, zs=list(zs))
        volume = float(phase.V())
        result = self._dense(temperature, pressure, zs, volume, "gas: EOS density; viscosity: dilute-gas correlations "
                             "(Herning-Zipperer mixing) plus the Lorentz-Bray-Clarke dense-fluid term")
        square = -volume * volume / result.molar_mass * phase.Cp() / phase.Cv() * phase.dP_dV()
        sound = math.sqrt(square) if square > 0.0 and math.isfinite(square) else None
        return PhaseResult(result.density, result.viscosity, result.molar_mass, result.method, sound)

    def liquid(self, temperature: float, pressure: float, zs: Sequence[float], bubble: float | None) -> PhaseResult:
        """Liquid phase: COSTALD density and correlation viscosity, or the EOS near the critical point.

        :param bubble: vapour or bubble pressure of this liquid at ``temperature`` [Pa abs], if known
        """
        saturated = self._amagat_volume(temperature, zs)
        volume = costald_liquid_volume(temperature, pressure, bubble, zs, self.tcs, self.vcs, self.omegas, saturated)
        if volume is None:
            eos_volume = float(self.liquid_phase.to(T=temperature, P=pressure, zs=list(zs)).V())
            return self._dense(temperature, pressure, zs, eos_volume,
                               "liquid above 0.95 of its pseudo-critical temperature: EOS density, "
                               "Lorentz-Bray-Clarke viscosity")
        mean = molar_mass(zs, self.molar_masses)
        viscosity = self._liquid_viscosity(temperature, pressure, zs)
        density_method = ("saturated volumes from pure-liquid correlations" + (" (Amagat mixing)" if len(zs) > 1 else "")
                          if saturated is not None else "COSTALD (Hankinson-Thomson)")
        method = (f"liquid: density {density_method} with the Thomson-Brobst-Hankinson compressed-liquid correction, "
                  "viscosity from pure-liquid correlations with Lucas pressure correction"
                  + (", log-molar mixing" if len(zs) > 1 else ""))
        return PhaseResult(mean / volume, viscosity, mean, method)

    def _amagat_volume(self, temperature: float, zs: Sequence[float]) -> float | None:
        """Saturated liquid molar volume [m3/mol] by Amagat's law (ideal mixing) of the pure-liquid
        correlations, or None when a component is above its critical temperature [K] or uncovered."""
        total = 0.0
        for z, tc, correlation in zip(zs, self.tcs, self.correlations.VolumeLiquids):
            if z == 0.0:
                continue
            value = correlation.T_dependent_property(temperature) if temperature < 0.95 * tc else None
            if not value:
                return None
            total += z * float(value)
        return total

    def _liquid_viscosity(self, temperature: float, pressure: float, zs: Sequence[float]) -> float:
        if len(zs) == 1:
            value = self.correlations.ViscosityLiquids[0](temperature, pressure)
        else:
            ws = mass_fractions(zs, self.molar_masses)
            value = self.correlations.ViscosityLiquidMixture.mixture_property(temperature, pressure, list(zs), list(ws))
        if value is None:
            raise PropertyError(f"thermo: no liquid viscosity correlation of {', '.join(self.names)} covers "
                                f"{temperature - 273.15:.4g} degC")
        return float(value)

    def _dense(self, temperature: float, pressure: float, zs: Sequence[float], volume: float, method: str) -> PhaseResult:
        """Density from ``volume`` [m3/mol]; viscosity = dilute-gas viscosity + the Lorentz-Bray-Clarke
        dense-fluid term at that volume. The dilute part is Herning-Zipperer mixing of thermo's pure-gas
        correlations (LBC's own Stiel-Thodos estimate misses steam by -16 %), or Stiel-Thodos if one lacks."""
        from chemicals.viscosity import Herning_Zipperer, Lorentz_Bray_Clarke, Stiel_Thodos

        mean = molar_mass(zs, self.molar_masses)
        grams = [m * 1000.0 for m in self.molar_masses]
        total = Lorentz_Bray_Clarke(temperature, pressure, volume, list(zs), grams, list(self.tcs),
                                    list(self.pcs), list(self.vcs))
        estimate = Herning_Zipperer(list(zs), [Stiel_Thodos(temperature, tc, pc, mw) for tc, pc, mw
                                               in zip(self.tcs, self.pcs, grams)], grams)
        pures = [correlation.T_dependent_property(temperature) for correlation in self.correlations.ViscosityGases]
        dilute = Herning_Zipperer(list(zs), pures, grams) if all(pures) else estimate
        return PhaseResult(mean / volume, float(total - estimate + dilute), mean, method)


#: Published correlations preferred over thermo's defaults (which are often fits to CoolProp or
#: REFPROP), so that a check against CoolProp compares independent sources: VDI Heat Atlas (PPDS
#: equations), then Perry's Chemical Engineers' Handbook 8th ed. (DIPPR equations).
PREFERRED_METHODS = ("VDI_PPDS", "DIPPR_PERRY_8E")


def _prefer_published(correlation: Any) -> None:
    """Switch a thermo correlation to the first of :data:`PREFERRED_METHODS` it has, if any."""
    for method in PREFERRED_METHODS:
        if method in correlation.all_methods:
            correlation.method = method
            return


def _check_constants(constants: Any, names: Sequence[str]) -> None:
    """PropertyError naming a component whose Tc, Pc, Vc, omega or molar mass the databases lack."""
    for label, values in (("critical temperature", constants.Tcs), ("critical pressure", constants.Pcs),
                          ("critical volume", constants.Vcs), ("acentric factor", constants.omegas),
                          ("molar mass", constants.MWs)):
        missing = [name for name, value in zip(names, values) if value is None]
        if missing:
            raise PropertyError(f"thermo: the chemicals database has no {label} for {', '.join(missing)}; "
                                f"the equation of state cannot be set up")


@functools.lru_cache(maxsize=64)
def load_package(cas: tuple[str, ...], eos: str) -> ThermoPackage:
    """The package of ``cas`` with ``eos``, built once per process (the first costs ~4 s: databases)."""
    return ThermoPackage(cas, eos)
