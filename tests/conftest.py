"""Shared fixtures: one plugin host and one sizer per test session (CoolProp loads once)."""

from __future__ import annotations

import pytest

from boresize.sizing.engine import Sizer
from boresize.plugins import PluginHost


@pytest.fixture(scope="session")
def host() -> PluginHost:
    # Built-ins only, so that a plugin installed on the developer's machine cannot change results.
    return PluginHost.load(load_entry_points=False)


@pytest.fixture(scope="session")
def sizer(host: PluginHost) -> Sizer:
    return Sizer(host)
