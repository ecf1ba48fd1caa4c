"""loads stage."""
