"""Reads the tables and charts of an isorisk committee pack, so the analysis can continue in pandas.

    from pack_tables import load, show, chart
    weights = load("weights")     # DataFrame indexed by asset, numbers as floats at full precision
    show(weights)                 # a copy formatted as the notebook shows it
    chart("frontier")             # displays charts/frontier.png

The tables are the CSV files in tables/, described by tables/schema.json (the columns, their headings and
how their numbers are shown). Numbers are decimals: 0.065 is 6.50 %.

Text cells that a spreadsheet would run as a formula (starting with =, +, -, @, a tab or a carriage
return, possibly after apostrophes) were written with one extra leading apostrophe; load() removes it, so
names read as they were given.

Illustrative model output, not investment advice: see the caution in the notebook and in every CSV file.
"""
import json
import os

import pandas as pd

HERE = os.path.dirname(os.path.abspath(__file__))
GUARDED = ("=", "+", "-", "@", "\t", "\r")

with open(os.path.join(HERE, "tables", "schema.json"), encoding="utf-8") as _handle:
    SCHEMA = json.load(_handle)

pd.set_option("display.max_colwidth", None)
pd.set_option("display.max_rows", 500)
pd.set_option("display.max_columns", 100)


def unguard(text):
    """Undoes the CSV formula guard of one text cell."""
    if text.startswith("'") and text[1:].lstrip("'")[:1] in GUARDED:
        return text[1:]
    return text


def load(name):
    """Reads table `name` (tables/NAME.csv): text columns as text, the others as floats; the first is the index."""
    columns = SCHEMA[name]["columns"]
    frame = pd.read_csv(os.path.join(HERE, "tables", name + ".csv"), dtype=str, keep_default_na=False,
                        comment="#")
    for column in columns:
        key = column["key"]
        if column["format"] == "text":
            frame[key] = frame[key].map(unguard)
        else:
            frame[key] = frame[key].replace("", "nan").astype(float)
    frame = frame.set_index(columns[0]["key"])
    frame.attrs["pack_table"] = name
    return frame


def _unsigned_zero(text):
    return text[1:] if text.startswith("-") and not any(d in text for d in "123456789") else text


FORMATS = {
    "percent": lambda v: _unsigned_zero(f"{v * 100:.2f}") + " %",
    "decimal": lambda v: _unsigned_zero(f"{v:.2f}"),
    "number": lambda v: f"{v:.6g}",
    "amount": lambda v: _unsigned_zero(f"{v:,.0f}"),
}


def show(frame):
    """A copy of a loaded table for reading: numbers formatted as in the pack, headings as in the pack."""
    name = frame.attrs.get("pack_table")
    if name not in SCHEMA:
        return frame
    shown = frame.copy()
    labels = {}
    for column in SCHEMA[name]["columns"]:
        key, kind = column["key"], column["format"]
        labels[key] = column["label"]
        if kind != "text" and key in shown.columns:
            shown[key] = shown[key].map(lambda v, f=FORMATS[kind]: "" if pd.isna(v) else f(v))
    shown.index.name = labels.get(shown.index.name, shown.index.name)
    return shown.rename(columns=labels)


def chart(name):
    """Displays charts/NAME.png."""
    from IPython.display import Image, display
    display(Image(filename=os.path.join(HERE, "charts", name + ".png")))
