"""Activity models."""
