"""Sphinx configuration of the redoxgibbs documentation (built with warnings as errors in CI)."""

import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))
sys.path.insert(0, str(Path(__file__).resolve().parent))

import generated  # noqa: E402  (writes the scenario reference and the verification ledger)

import redoxgibbs  # noqa: E402

project = "redoxgibbs"
author = "the redoxgibbs developers"
copyright = "the redoxgibbs developers"
release = version = redoxgibbs.__version__
extensions = ["sphinx.ext.autodoc", "sphinx.ext.autosummary", "sphinx.ext.mathjax", "numpydoc"]
autosummary_generate = True
numpydoc_show_class_members = False
numpydoc_validation_checks = set()
autodoc_default_options = {"members": True, "undoc-members": False}
autodoc_typehints = "none"
exclude_patterns = ["_build"]
html_theme = "alabaster"
html_static_path = []
suppress_warnings = []
nitpicky = False

generated.write_all(Path(__file__).resolve().parent / "_generated")
