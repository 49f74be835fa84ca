"""The texts of the Calc extension, generated from the function registry.

One function table (:func:`function_table`) is read from
:data:`heatledger_xl.registry.REGISTRY`; every other text is written from that table:

- :func:`idl_text` - the UNO interface the component implements, one method per function.
  Calc decides from a method's UNO types how it passes arguments: a required argument is
  ``sequence< sequence< any > >`` (a cell, a constant, a range or an inline array, and the
  wizard marks it required), an optional one ``any`` (Calc treats only ``any`` arguments as
  optional, and passes nothing for one left out). A function whose result is a table returns
  ``sequence< sequence< any > >``, the others ``any`` (a number or a text);
- :func:`xcu_text` - ``CalcAddIns.xcu``: display name, description and category of each
  function and the display name and description of each argument, as the
  function wizard shows them;
- :func:`components_text`, :func:`manifest_text`, :func:`description_text` - the component
  registration (Python loader), the package manifest and the extension's identity.

Calc files every add-in function under its own "Add-In" category (its category list is
fixed); the registry's family of each function is recorded as the category display name.
"""

from __future__ import annotations

import re
from xml.sax.saxutils import escape, quoteattr

__all__ = [
    "EXTENSION_ID",
    "IMPLEMENTATION",
    "INTERFACE",
    "COMPONENT_FILE",
    "TABLE_FILE",
    "TYPES_FILE",
    "XCU_FILE",
    "CATEGORY",
    "function_table",
    "idl_name",
    "idl_text",
    "xcu_text",
    "components_text",
    "manifest_text",
    "description_text",
]

#: Identifier of the extension (``unopkg remove`` takes it).
EXTENSION_ID = "org.heatledger.calc"
#: UNO implementation and service name of the component.
IMPLEMENTATION = "org.heatledger.calc.Functions"
#: The UNO interface holding one method per function.
INTERFACE = "org.heatledger.calc.XFunctions"
#: File names inside the extension.
COMPONENT_FILE = "heatledger_component.py"
TABLE_FILE = "heatledger_functions.json"
TYPES_FILE = "heatledger_types.rdb"
XCU_FILE = "CalcAddIns.xcu"
COMPONENTS_FILE = "heatledger.components"
#: The function-wizard category (Calc's own name for add-in functions).
CATEGORY = "Add-In"

_ARRAY = "sequence< sequence< any > >"
#: Words UNO IDL reserves; an argument with such a name gets a trailing ``X`` in IDL.
_IDL_KEYWORDS = frozenset("""
    any attribute boolean bound byte case char const constants constrained double enum
    exception FALSE float get hyper in inout interface long maybeambiguous maybedefault
    maybevoid module needs observes oneway optional out property published raises readonly
    removable sequence service set short singleton string struct switch transient TRUE type
    typedef union unsigned void ellipsis default
""".split())
_IDENTIFIER = re.compile(r"^[A-Za-z][A-Za-z0-9_]*$")


def function_table(registry: dict | None = None) -> dict:
    """The function table every text of the extension is written from.

    Parameters
    ----------
    registry : dict, optional
        Name -> :class:`~heatledger_xl.registry.FunctionSpec`; default the full registry
        (imports every family's functions). [-]

    Returns
    -------
    dict
        ``{"interface", "implementation", "functions": [{"name", "family", "description",
        "returns", "spills", "args": [{"name", "idl", "doc", "optional", "is_range"}]}]}``,
        plain data (it is stored as JSON in the extension).
    """
    if registry is None:
        import heatledger_xl.udfs  # noqa: F401 - declares every family's functions
        from heatledger_xl.registry import REGISTRY as registry
    functions = []
    for name, spec in registry.items():
        if not _IDENTIFIER.match(name):
            raise ValueError(f"function name {name} cannot be a UNO method name")
        args = [{"name": a.name, "idl": idl_name(a.name), "doc": a.doc,
                 "optional": bool(a.optional), "is_range": bool(a.is_range)}
                for a in spec.args]
        if len({a["idl"] for a in args}) != len(args):
            raise ValueError(f"{name}: two arguments have the same IDL name "
                             f"{[a['idl'] for a in args]}")
        functions.append({"name": name, "family": spec.family,
                          "description": spec.description, "returns": spec.returns,
                          "spills": bool(spec.spills), "args": args})
    return {"interface": INTERFACE, "implementation": IMPLEMENTATION, "functions": functions}


def idl_name(name: str) -> str:
    """The IDL parameter name of an argument: camel case (UNO IDL refuses an identifier
    with an underscore unless it is all capitals), a reserved word with a trailing ``X``.

    Parameters
    ----------
    name : str
        The argument's name in the registry. [-]

    Examples
    --------
    >>> idl_name("layers"), idl_name("heat_flow"), idl_name("emissivity_1"), idl_name("type")
    ('layers', 'heatFlow', 'emissivity1', 'typeX')
    """
    if not _IDENTIFIER.match(name):
        raise ValueError(f"argument name {name} cannot be a UNO parameter name")
    head, *rest = name.split("_")
    out = head + "".join(part[:1].upper() + part[1:] for part in rest)
    return f"{out}X" if out in _IDL_KEYWORDS or out.upper() in _IDL_KEYWORDS else out


def idl_text(table: dict) -> str:
    """UNO IDL of the interface: one method per function of ``table``.

    Parameters
    ----------
    table : dict
        The function table (:func:`function_table`). [-]
    """
    *modules, interface = table["interface"].split(".")
    lines = ["// Generated by heatledger_calc.extension from the function registry.",
             "#include <com/sun/star/uno/XInterface.idl>", ""]
    lines.append(" ".join(f"module {m} {{" for m in modules))
    lines.append(f"interface {interface} : com::sun::star::uno::XInterface {{")
    for f in table["functions"]:
        params = ", ".join(f"[in] {'any' if a['optional'] else _ARRAY} {a['idl']}"
                           for a in f["args"])
        result = _ARRAY if f["spills"] else "any"
        lines.append(f"    {result} {f['name']}({params});")
    lines.append("};")
    lines.append(" ".join("};" for _ in modules))
    return "\n".join(lines) + "\n"


def _value(text: str) -> str:
    return f'<value xml:lang="en-US">{escape(text)}</value>'


def xcu_text(table: dict) -> str:
    """``CalcAddIns.xcu``: what the function wizard shows for every function of ``table``.

    Parameters
    ----------
    table : dict
        The function table (:func:`function_table`). [-]
    """
    out = ['<?xml version="1.0" encoding="UTF-8"?>',
           '<oor:component-data xmlns:oor="http://openoffice.org/2001/registry" '
           'xmlns:xs="http://www.w3.org/2001/XMLSchema" oor:name="CalcAddIns" '
           'oor:package="org.openoffice.Office">',
           '<node oor:name="AddInInfo">',
           f'<node oor:name={quoteattr(table["implementation"])} oor:op="replace">',
           '<node oor:name="AddInFunctions">']
    for f in table["functions"]:
        out.append(f'<node oor:name={quoteattr(f["name"])} oor:op="replace">')
        out.append(f'<prop oor:name="DisplayName">{_value(f["name"])}</prop>')
        out.append(f'<prop oor:name="Description">{_value(f["description"])}</prop>')
        out.append(f'<prop oor:name="Category"><value>{CATEGORY}</value></prop>')
        out.append('<prop oor:name="CategoryDisplayName">'
                   f'{_value("heatledger " + f["family"])}</prop>')
        out.append('<node oor:name="Parameters">')
        for a in f["args"]:
            out.append(f'<node oor:name={quoteattr(a["idl"])} oor:op="replace">')
            out.append(f'<prop oor:name="DisplayName">{_value(a["name"])}</prop>')
            out.append(f'<prop oor:name="Description">{_value(a["doc"])}</prop>')
            out.append("</node>")
        out.append("</node>")
        out.append("</node>")
    out += ["</node>", "</node>", "</node>", "</oor:component-data>"]
    return "\n".join(out) + "\n"


def components_text() -> str:
    """The component registration: the Python component and the services it provides."""
    return (
        '<?xml version="1.0" encoding="UTF-8"?>\n'
        '<components xmlns="http://openoffice.org/2010/uno-components">\n'
        f'  <component loader="com.sun.star.loader.Python" uri="{COMPONENT_FILE}">\n'
        f'    <implementation name="{IMPLEMENTATION}">\n'
        f'      <service name="{IMPLEMENTATION}"/>\n'
        '      <service name="com.sun.star.sheet.AddIn"/>\n'
        '    </implementation>\n'
        '  </component>\n'
        '</components>\n')


def manifest_text() -> str:
    """``META-INF/manifest.xml``: the type library, the component and the configuration."""
    entries = [(TYPES_FILE, "application/vnd.sun.star.uno-typelibrary;type=RDB"),
               (COMPONENTS_FILE, "application/vnd.sun.star.uno-components"),
               (XCU_FILE, "application/vnd.sun.star.configuration-data")]
    body = "".join(f' <manifest:file-entry manifest:full-path="{path}" '
                   f'manifest:media-type="{kind}"/>\n' for path, kind in entries)
    return ('<?xml version="1.0" encoding="UTF-8"?>\n'
            '<manifest:manifest xmlns:manifest="http://openoffice.org/2001/manifest">\n'
            f'{body}</manifest:manifest>\n')


def description_text(version: str) -> str:
    """``description.xml``: identifier, version and display name of the extension.

    Parameters
    ----------
    version : str
        The heatledger version the extension was built from. [-]
    """
    digits = ".".join(re.findall(r"\d+", version)[:3]) or "0"
    return (
        '<?xml version="1.0" encoding="UTF-8"?>\n'
        '<description xmlns="http://openoffice.org/extensions/description/2006" '
        'xmlns:dep="http://openoffice.org/extensions/description/2006" '
        'xmlns:xlink="http://www.w3.org/1999/xlink">\n'
        f'  <identifier value="{EXTENSION_ID}"/>\n'
        f'  <version value="{digits}"/>\n'
        '  <display-name><name lang="en">heatledger functions (U-values, heat loss, fins, '
        'moisture, thermal bridges)</name></display-name>\n'
        '  <platform value="all"/>\n'
        '  <dependencies><dep:OpenOffice.org-minimal-version value="4.1" '
        'dep:name="OpenOffice.org 4.1"/></dependencies>\n'
        '</description>\n')
