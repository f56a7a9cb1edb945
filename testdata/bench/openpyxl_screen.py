#!/usr/bin/python3
"""The comparison script of the scale benchmarks (BenchmarkScaleScript in
report/audit): what a short spreadsheet script costs for the same survey.

It reads every sheet of a survey workbook with openpyxl (read-only, values),
takes the Objects rows, computes one number per row (the stored energy
C V^2 / 2 of the rows that give a capacitance and a surface potential) and
writes a small result workbook: one row per station with its object count and
largest energy. It is not an assessment; it is the least a script does that
reads the whole survey and writes a result.

Usage: openpyxl_screen.py SURVEY.xlsx RESULT.xlsx
Needs Debian's python3-openpyxl. CI does not run it.
"""
import sys

import openpyxl


def main(survey, result):
    wb = openpyxl.load_workbook(survey, read_only=True, data_only=True)
    stations = {}
    for ws in wb.worksheets:
        ws.reset_dimensions()  # read every row whatever the dimension says
        rows = ws.iter_rows(values_only=True)
        header = next(rows, None)
        if ws.title != "Objects" or header is None:
            for _ in rows:
                pass
            continue
        col = {h: i for i, h in enumerate(header) if h}
        ist, ic, iv = col["Station"], col["Capacitance [pF]"], col["Surface potential [kV]"]
        for r in rows:
            st = r[ist] if ist < len(r) else None
            c = r[ic] if ic < len(r) else None
            v = r[iv] if iv < len(r) else None
            e = 0.0
            if isinstance(c, (int, float)) and isinstance(v, (int, float)):
                e = 0.5 * c * 1e-12 * (v * 1e3) ** 2 * 1e3  # mJ
            n, worst = stations.get(st, (0, 0.0))
            stations[st] = (n + 1, max(worst, e))
    wb.close()
    out = openpyxl.Workbook(write_only=True)
    ws = out.create_sheet("Stations")
    ws.append(["Station", "Objects", "Largest stored energy [mJ]"])
    for st in sorted(stations, key=str):
        n, worst = stations[st]
        ws.append([st, n, worst])
    out.save(result)


if __name__ == "__main__":
    main(sys.argv[1], sys.argv[2])
