"""Pages generated from the code at build time: the scenario-file reference (from the typed schema),
the verification ledger (from the species data and the tests that check them) and the known
departures (the contributor guide's section, so that users read the same list)."""

import re
from pathlib import Path

from redoxgibbs.interfaces.schema import schema_reference
from redoxgibbs.species.ledger import ledger_words, verification_ledger


def _escape(text):
    return str(text).replace("*", r"\*").replace("|", r"\|").replace("_", r"\_").replace("`", "'")


def scenario_reference():
    """The schema's own reference (the lines ``redoxgibbs scenario-keys`` prints), as a page."""
    lines = ["Scenario-file reference", "=======================", "",
             "Every key a scenario (TOML) file may hold, generated from the schema the program enforces "
             "(``redoxgibbs/interfaces/schema.py``); ``redoxgibbs scenario-keys`` prints the same list. A "
             "scenario with an unknown key, a value of the wrong type or out of range is refused, naming the key.",
             ""]
    return "\n".join(lines + [line.replace("`", "``").replace("*", r"\*").replace("|", r"\|")
                              for line in schema_reference()]) + "\n"


def ledger_page():
    frame = verification_ledger()
    lines = ["Verification ledger", "===================", "",
             "For every species: its data source, whether its values were recalled from memory, and the "
             "outside checks its data pass (the project's tests against published tables, standards and "
             "reference libraries), up to which temperature. Generated from ``species_data/verification.csv`` "
             "(``redoxgibbs ledger`` prints it too).", ""]
    for row, memory, reach in zip(frame.itertuples(), *ledger_words(frame)):
        lines += [f"**{_escape(row.species)}** ({row.model}; {memory}; {reach})", "",
                  f"    Source: {_escape(row.source)}", "", f"    Checks: {_escape(row.outside_checks)}", ""]
    return "\n".join(lines) + "\n"


def known_departures_page():
    """The 'Known departures' section of DEVELOPERS.md (its bullets are reStructuredText too, once
    inline code takes double backquotes)."""
    text = (Path(__file__).resolve().parents[1] / "DEVELOPERS.md").read_text()
    section = text.split("### Known departures (from the tests)", 1)[1].split("\n#", 1)[0]
    body = re.sub(r"`([^`]+)`", r"``\1``", section.replace("*", r"\*"))
    lines = ["Known departures", "================", "",
             "Where the data or models depart from outside references, as measured by the tests (each "
             "a strict expected failure or a stated tolerance there). Results in these ranges carry flags.", ""]
    return "\n".join(lines) + "\n" + body.strip("\n") + "\n"


def write_all(folder):
    folder = Path(folder)
    folder.mkdir(exist_ok=True)
    for name, text in (("scenario_reference.rst", scenario_reference()), ("ledger.rst", ledger_page()),
                       ("known_departures.rst", known_departures_page())):
        path = folder / name
        if not path.exists() or path.read_text() != text:
            path.write_text(text)


__all__ = ["write_all"]
