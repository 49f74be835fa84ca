"""heatledger_xl: heatledger in spreadsheet cells and in the open workbook, through xlwings.

Modules (importing this package imports none of them, so it stays light):

- :mod:`heatledger_xl.udfs` - the ``HL_`` spreadsheet functions of every family (point
  xlwings at this module);
- :mod:`heatledger_xl.registry` - the ``udf`` decorator and the registry every family uses;
- :mod:`heatledger_xl.cells` - single cell values (numbers, text, true/false) checked;
- :mod:`heatledger_xl.ranges`, :mod:`heatledger_xl.correction_ranges` - layer and
  correction tables given as ranges (the conventions are in their docstrings);
- :mod:`heatledger_xl.render_xlwings` - the calculation-sheet plan written into the open
  workbook;
- :mod:`heatledger_xl.macros` - the button macro writing a construction's calculation sheet;
- :mod:`heatledger_xl.workbook` - generator of the demo workbook in ``workbooks/``.
"""
