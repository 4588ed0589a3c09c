#!/usr/bin/python3
"""Reads an .xlsx workbook with openpyxl (Debian python3-openpyxl), independently of the tool that
wrote it, and prints it as JSON: for each sheet its frozen cell, and each row's cells as
[value, number_format, type] with dates as YYYY-MM-DD. Used by test_cli_daily.cpp."""
import datetime
import json
import sys

import openpyxl


def cell(c):
    v = c.value
    if isinstance(v, datetime.datetime):
        v = v.date().isoformat()
    elif isinstance(v, datetime.date):
        v = v.isoformat()
    return [v, c.number_format, type(c.value).__name__]


def main(path):
    book = openpyxl.load_workbook(path)
    out = {}
    for sheet in book.worksheets:
        out[sheet.title] = {
            "freeze_panes": sheet.freeze_panes,
            "rows": [[cell(c) for c in row] for row in sheet.iter_rows()],
        }
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main(sys.argv[1])
