"""Runs every code cell of a notebook with nbclient in the notebook's own folder and saves the result.

Run as: python3 execute_notebook.py NOTEBOOK.ipynb EXECUTED.ipynb
Exits non-zero (nbclient raises CellExecutionError) when a cell fails.
"""
import os
import sys

import nbformat
from nbclient import NotebookClient

source, target = sys.argv[1], sys.argv[2]
notebook = nbformat.read(source, as_version=4)
client = NotebookClient(notebook, timeout=180, kernel_name="python3",
                        resources={"metadata": {"path": os.path.dirname(os.path.abspath(source))}})
client.execute()
nbformat.write(notebook, target)
print(f"executed {sum(1 for c in notebook.cells if c.cell_type == 'code')} code cells")
