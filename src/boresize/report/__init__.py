"""Human-readable output: the line table and the listings of criteria and pipes."""
