"""Pages generated from the code at build time: the scenario-file reference (from the typed schema)
and the verification ledger (from the species data and the tests that check them)."""

from pathlib import Path

from redoxgibbs.interfaces.schema import SCENARIO, Key
from redoxgibbs.species.ledger import verification_ledger

_WORDS = {"str": "text", "number": "number", "integer": "whole number", "bool": "true or false",
          "strings": "list of text", "numbers": "list of numbers", "range": "[low, high]", "table": "table",
          "tables": "array of tables", "columns": "table of sample columns", "inputs": "table of inputs"}


def _escape(text):
    return str(text).replace("*", r"\*").replace("|", r"\|").replace("_", r"\_").replace("`", "'")


def _keys(keys, prefix, lines):
    for name, key in keys.items():
        extra = []
        if key.choices:
            extra.append("one of " + ", ".join(f"``{c}``" for c in key.choices))
        if key.required:
            extra.append("required")
        note = f" ({'; '.join(extra)})" if extra else ""
        lines.append(f"``{prefix}{name}``\n    {_WORDS[key.kind]}{note}: {_escape(key.doc)}\n")
        if key.keys:
            _keys(key.keys, f"{prefix}{name}.", lines)


def scenario_reference():
    lines = ["Scenario-file reference", "=======================", "",
             "Every key a scenario (TOML) file may hold, generated from the schema the program enforces "
             "(``redoxgibbs/interfaces/schema.py``); ``redoxgibbs scenario-keys`` prints the same list. A "
             "scenario with an unknown key, a value of the wrong type or out of range is refused, naming the key.",
             ""]
    _keys(SCENARIO, "", lines)
    return "\n".join(lines) + "\n"


def ledger_page():
    frame = verification_ledger()
    lines = ["Verification ledger", "===================", "",
             "For every species: its data source, whether its values were recalled from memory, and the "
             "outside checks its data pass (the project's tests against published tables, standards and "
             "reference libraries), up to which temperature. Generated from ``species_data/verification.csv`` "
             "(``redoxgibbs ledger`` prints it too).", ""]
    for row in frame.itertuples():
        memory = "recalled from memory" if row.entered_from_memory else "copied from an outside table"
        reach = "no outside check yet" if row.checked_to_T_C != row.checked_to_T_C else f"checked to {row.checked_to_T_C:g} C"
        lines += [f"**{_escape(row.species)}** ({row.model}; {memory}; {reach})", "",
                  f"    Source: {_escape(row.source)}", "", f"    Checks: {_escape(row.outside_checks)}", ""]
    return "\n".join(lines) + "\n"


def write_all(folder):
    folder = Path(folder)
    folder.mkdir(exist_ok=True)
    for name, text in (("scenario_reference.rst", scenario_reference()), ("ledger.rst", ledger_page())):
        path = folder / name
        if not path.exists() or path.read_text() != text:
            path.write_text(text)


__all__ = ["Key", "write_all"]
