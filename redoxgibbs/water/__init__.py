"""water layer of redoxgibbs."""
