"""The command line: argument parsing (:mod:`deckload.cli.main.main`) and one module per sub-command.

Each sub-command reads its files through :mod:`deckload.io`, computes with :mod:`deckload.core`
and prints; :mod:`deckload.cli.main.boundary` is the one error boundary of every entry point."""
