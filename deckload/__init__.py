"""deckload: loading and intact-stability calculations for a ship's officer.

It supports, and never replaces, the approved stability booklet, the master's
judgement and the rules of the flag State and classification society.
"""

__version__ = "0.1.0"
