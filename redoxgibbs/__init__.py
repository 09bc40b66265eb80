"""redoxgibbs: energy available to chemotrophic life from the chemistry of natural fluids.

``import redoxgibbs as rg`` gives the main entry points:

- samples and speciation: :func:`read_samples`, :func:`speciate` (a :class:`SpeciationResult`);
- standard states and reactions: :func:`standard_properties`, :class:`Reaction`,
  :func:`reaction_properties`, :func:`catalog`, :func:`resolve_reactions`, :func:`enumerate_reactions`;
- the evaluation pipeline: :func:`evaluate` (an :class:`Evaluation`), :func:`insitu_energetics`,
  supply and cell models :class:`Supply`, :class:`CellRequirement`, :class:`PowerUnits`;
- bodies, mixing, profiles, sweeps: :class:`Body`, :func:`mixing_energetics`, :func:`depth_profile`,
  :class:`SweepSpec`, :class:`Distribution`, :func:`run_sweep`, :func:`load_results`;
- from energy to life: :func:`habitability_envelope`, :class:`Limits`, :class:`Target`,
  :func:`solve_input`, :func:`feasibility_map`;
- scenarios: :func:`load_scenario`, :func:`run_assessment`, :func:`write_outputs`.

Results are screening estimates of thermodynamic potential, not evidence of life.
"""

from importlib.metadata import PackageNotFoundError, version

from .bodies.body import Body
from .energetics.catalog import NamedReaction, catalog, enumerate_reactions, resolve_reactions
from .energetics.insitu import InsituEnergetics, insitu_energetics
from .energetics.power import CellRequirement, PowerUnits, Supply
from .errors import InputError, OutOfValidityError, RedoxGibbsError
from .habitability.envelope import Limits, habitability_envelope
from .interfaces.assess import Assessment, run_assessment
from .interfaces.report import write_outputs
from .interfaces.scenario import Scenario, load_scenario
from .pipeline.evaluate import Evaluation, evaluate
from .pipeline.mixing import mixing_energetics
from .pipeline.profile import depth_profile
from .pipeline.thresholds import Target, feasibility_map, solve_input
from .reactions.reaction import Reaction, reaction_properties
from .speciation.samples import SampleSet, read_samples
from .speciation.solver import SpeciationResult, speciate
from .species.database import default_database
from .species.properties import StandardProperties, standard_properties
from .sweeps.runner import Distribution, SweepSpec, load_results, run_sweep

try:
    __version__ = version("redoxgibbs")
except PackageNotFoundError:  # pragma: no cover - running from a source tree that was never installed
    __version__ = "unknown"

__all__ = [
    "Assessment", "Body", "CellRequirement", "Distribution", "Evaluation", "InputError", "InsituEnergetics",
    "Limits", "NamedReaction", "OutOfValidityError", "PowerUnits", "Reaction", "RedoxGibbsError", "SampleSet",
    "Scenario", "SpeciationResult", "StandardProperties", "Supply", "SweepSpec", "Target", "__version__",
    "catalog", "default_database", "depth_profile", "enumerate_reactions", "evaluate", "feasibility_map",
    "habitability_envelope", "insitu_energetics", "load_results", "load_scenario", "mixing_energetics",
    "reaction_properties", "read_samples", "resolve_reactions", "run_assessment", "run_sweep", "solve_input",
    "speciate", "standard_properties", "write_outputs",
]
