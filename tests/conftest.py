import sys
from pathlib import Path

import pytest

from redoxgibbs.species.database import default_database

# the tests mirror the package's folders; their shared reference values (reference_equations.py,
# scenarios.py) live here, beside this file
sys.path.insert(0, str(Path(__file__).resolve().parent))


@pytest.fixture(scope="session")
def db():
    return default_database()
