"""Printed views of a result: the condition report (HTML and text), the verdict in words, the
audit findings located in their file, and printing from the loading screen."""
