"""Generator of the demo models in sample_models/ (an invented scenario)."""

from ifccheck.samples.scenario import SAMPLES, write_samples

__all__ = ["SAMPLES", "write_samples"]
