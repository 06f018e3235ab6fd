"""Settings shared by every test."""

import os

# The suite never reads or writes the user's cache of validated profiles (deckload.io.profile_cache):
# a test's result must not depend on what an earlier run left in ~/.local/share/deckload.  The
# cache's own tests (tests/test_profile_cache.py) turn it on with a data folder of their own.
os.environ["DECKLOAD_NO_CACHE"] = "1"
