"""Validates a notebook file against the nbformat schema, refusing any silent repair.

Run as: python3 -W error validate_notebook.py NOTEBOOK.ipynb
nbformat's read() and validate() quietly add missing cell ids and rename duplicate ones, warning only;
with every warning an error, a notebook passes only when it is valid as written.
"""
import json
import sys
import warnings

import nbformat

warnings.simplefilter("error")

path = sys.argv[1]
with open(path, encoding="utf-8") as handle:
    raw = json.load(handle)
nbformat.validate(raw)
notebook = nbformat.read(path, as_version=nbformat.NO_CONVERT)
nbformat.validate(notebook)
ids = [cell["id"] for cell in raw["cells"]]
if len(ids) != len(set(ids)):
    raise SystemExit("duplicate cell ids")
print(f"valid nbformat {raw['nbformat']}.{raw['nbformat_minor']}: {len(raw['cells'])} cells")
