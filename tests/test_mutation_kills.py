"""Reference checks written to kill mutants that survived the mutation run (DEVELOPERS.md,
"Mutation testing"); each names its source beside the check."""
