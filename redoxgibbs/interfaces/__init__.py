"""interfaces layer of redoxgibbs."""
