"""The constructions family's input side: its schema, its project-file reader and its hooks
for the family registry (:mod:`heatledger.families`). The engine is
:mod:`heatledger.constructions`."""
