"""samples stage."""
