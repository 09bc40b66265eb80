"""redoxgibbs: energy available to chemotrophic life from the chemistry of natural fluids."""
