"""Equilibrated flux reconstruction (Raviart-Thomas RT2 on vertex patches)."""
