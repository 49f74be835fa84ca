"""The companion that explains a problem: ``HL_MESSAGE``.

Where a function shows a problem as an Excel error value (``#VALUE!``, on the Office.js
hosts, so that ``IFERROR`` catches it), ``=HL_MESSAGE("HL_UVALUE", B6:G12)`` with the same
arguments gives its one-line text, such as ``HL_UVALUE: layers row 3 thickness_mm must be
greater than 0 mm; got -5``, or says there is no problem. It works in every host.
"""

from __future__ import annotations

from .registry import MESSAGE_FUNCTION, message_of, udf

__all__ = [MESSAGE_FUNCTION]

_VALUE = "The same cell, range or value as argument {} of the function named; blank when "\
         "the function takes fewer. [-]"
_ARGS = {"function_name": "Name of the function, in quotes (\"HL_UVALUE\"). [-]",
         **{f"value_{i}": _VALUE.format(i) for i in range(1, 15)}}


@udf("messages", returns="the text of the problem, or that there is none",
     args=_ARGS, ranges=tuple(f"value_{i}" for i in range(1, 15)))
def HL_MESSAGE(function_name, value_1=None, value_2=None, value_3=None, value_4=None,
               value_5=None, value_6=None, value_7=None, value_8=None, value_9=None,
               value_10=None, value_11=None, value_12=None, value_13=None, value_14=None):
    """The one-line text of the problem a heatledger function has with these arguments (an
    error value such as #VALUE! shows that there is one), or that there is none. [-]"""
    return message_of(function_name, [value_1, value_2, value_3, value_4, value_5, value_6,
                                 value_7, value_8, value_9, value_10, value_11, value_12,
                                 value_13, value_14])
