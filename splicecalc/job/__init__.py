"""The job: validated input model of a beam design, TOML job files, canonical serialisation."""

from .loader import dumps_toml, job_from_dict, load_job, loads_job, save_job, write_text_atomic
from .model import BeamSpec, COMBINATIONS, FAMILIES, Job, LOAD_LEVELS, Project

__all__ = ["BeamSpec", "COMBINATIONS", "FAMILIES", "Job", "LOAD_LEVELS", "Project", "dumps_toml",
           "job_from_dict", "load_job", "loads_job", "save_job", "write_text_atomic"]
