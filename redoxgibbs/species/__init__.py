"""species layer of redoxgibbs."""
