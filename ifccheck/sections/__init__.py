"""sections stage."""
