"""Session settings shared by tests/ and notebooks/ (pytest reads this file before theirs)."""

from __future__ import annotations

import atexit
import os
import shutil
import tempfile

# Outcome tables computed by the tests, and by the notebook kernels they start, go to a throw-away cache,
# not the user's cache folder. The folder is removed when the test process ends; the handler is registered
# before workbench is imported, so it runs after the tables' own save at exit (last in, first out). A
# STEREOSIEVE_CACHE_DIR set beforehand is the caller's folder: it is used as it is and kept.
if "STEREOSIEVE_CACHE_DIR" not in os.environ:
    _CACHE = tempfile.mkdtemp(prefix="stereosieve-cache-")
    os.environ["STEREOSIEVE_CACHE_DIR"] = _CACHE
    atexit.register(shutil.rmtree, _CACHE, ignore_errors=True)
