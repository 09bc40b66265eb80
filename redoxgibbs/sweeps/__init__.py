"""Parameter sweeps and Monte Carlo uncertainty, in chunks streamed to Parquet."""
