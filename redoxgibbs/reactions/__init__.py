"""reactions layer of redoxgibbs."""
