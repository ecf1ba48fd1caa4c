"""service stage."""
