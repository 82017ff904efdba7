"""Bundled material catalogs (TOML data files only; no code).

The package exists so that the catalogs install beside ``physics`` and ``optimizer`` and the
bundled demo sweep can find them from any working folder.
"""
