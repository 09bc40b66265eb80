"""The evaluation pipeline: samples -> speciation -> energetics -> power and cells, one path for every command."""
