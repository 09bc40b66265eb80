"""Energy budgets: catalog, in-situ Gibbs energies, energy densities, power and cells."""
