import pytest

from redoxgibbs.species.database import default_database


@pytest.fixture(scope="session")
def db():
    return default_database()
