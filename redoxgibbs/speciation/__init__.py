"""Sample tables and speciation."""
