"""framing stage."""
