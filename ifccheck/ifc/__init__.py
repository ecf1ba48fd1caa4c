"""ifc stage."""
