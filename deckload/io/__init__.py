"""Files in and out: vessel profiles, geometry files, conditions, CSV tables, the TOML toolkit,
atomic writes and where things are kept.  Everything that reads or writes a file on the way
to the validated model lives here; :mod:`deckload.core` never touches a file."""
