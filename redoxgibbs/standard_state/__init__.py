"""standard_state layer of redoxgibbs."""
