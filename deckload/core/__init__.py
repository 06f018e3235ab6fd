"""The pure computation: numpy and the standard library only.

Nothing in this package reads or writes files, reads the clock, or imports textual
or rich; ``tests/test_core_purity.py`` enforces it.
"""
