"""Generator of the demo models in sample_models/ (an invented scenario) and of the IDS
the tool writes."""

from ifccheck.samples.scenario import SAMPLES, write_requirements, write_samples

__all__ = ["SAMPLES", "write_requirements", "write_samples"]
