"""Bundled demo inputs (package data): a design file and a sweep file of a fictional scenario."""
