"""Evidence: observation kinds, the project file, the engine and the planner (pure)."""

from workbench.evidence.engine import Solution, TrailStep, is_consistent, solve
from workbench.evidence.observations import OBSERVATION_TYPES, FieldSpec, Observation, observation_from_dict
from workbench.evidence.outcomes import fits, predict
from workbench.evidence.project import Project, Unknown, dumps_project, load_project, project_from_dict, save_project

__all__ = [
    "FieldSpec",
    "OBSERVATION_TYPES",
    "Observation",
    "Project",
    "Solution",
    "TrailStep",
    "Unknown",
    "dumps_project",
    "fits",
    "is_consistent",
    "load_project",
    "observation_from_dict",
    "predict",
    "project_from_dict",
    "save_project",
    "solve",
]
