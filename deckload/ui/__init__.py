"""The loading screen: a keyboard-driven textual app over the stability engine.

Plain logic (input parsing, the edit session with undo, text formatting) lives in
modules that do not import textual, so it is tested without the UI:
:mod:`.entry`, :mod:`.session`, :mod:`.views`, :mod:`.gzplot`, :mod:`.commands`.
"""
