"""Rewrite the demo models and the tool's IDS: ``python -m ifccheck.samples [DIR]``."""

import sys
from pathlib import Path

from ifccheck.samples.scenario import write_requirements, write_samples

if __name__ == "__main__":
    target = Path(sys.argv[1]) if len(sys.argv) > 1 else Path(__file__).parents[2] / "sample_models"
    for path in [*write_samples(target), write_requirements(target)]:
        print(path)
