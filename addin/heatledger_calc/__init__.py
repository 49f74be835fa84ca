"""heatledger_calc: the heatledger spreadsheet functions in LibreOffice Calc, as an extension.

The functions are those of :data:`heatledger_xl.registry.REGISTRY` (names, arguments,
descriptions), served in Calc by a thin Python component running in LibreOffice's own Python
through its UNO bridge. Everything the extension declares is generated from the registry when
it is built; nothing lists the functions by hand.

Modules (importing this package imports none of them):

- :mod:`heatledger_calc.extension` - the generated texts: the UNO interface (IDL), the
  function table the component serves, the function-wizard configuration (CalcAddIns.xcu),
  the component registration, the manifest and description.xml;
- :mod:`heatledger_calc.build` - finds LibreOffice and its tools, compiles the IDL to a type
  library with ``unoidl-write`` and writes the ``.oxt`` extension;
- :mod:`heatledger_calc.values` - Calc's argument values to the functions' Python values and
  the results back (used by the component inside LibreOffice);
- :mod:`heatledger_calc.install` - ``unopkg add``/``remove`` with actionable messages;
- :mod:`heatledger_calc.session` - a headless Calc with a throw-away profile, driven from
  another Python process (the tests use it).

The files in ``heatledger_calc/uno/`` are not modules of this package: they run inside
LibreOffice's Python (``component.py``, copied into the extension) or beside it
(``driver.py``), where ``uno`` can be imported.
"""

__all__: list[str] = []
