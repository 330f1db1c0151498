"""The files a command writes: checked before the work, written together after it.

Before any spectrum is read, every output path is checked (its folder is created, a file
can be made in it, no two outputs and no input share a path), so that nothing is computed
and then lost. After the work the outputs of one run (JSON, CSV, XLSX, PDF) are written to
temporary files and renamed together: all new, or all as they were.
"""

import contextlib
from pathlib import Path

import click

from .common import Failure, write_report_file

#: Output kinds in the order they are written, with their suffix (required for the binary forms).
KINDS = {"json": ".json", "csv": ".csv", "xlsx": ".xlsx", "report": ".pdf"}


def writable(path, option, suffix=None):
    """``path`` as a Path, its folder created and shown writable (a file is made there and removed).

    Raises
    ------
    Failure
        For a folder, a wrong suffix (when ``suffix`` is given), or a folder that cannot be
        made or written in.
    """
    import os
    import tempfile

    path = Path(path)
    if path.is_dir():
        raise Failure(f"{path}: is a folder; {option} needs a file name")
    if suffix and path.suffix.lower() != suffix:
        raise Failure(f"{path}: {option} writes a {suffix} file; give the name that suffix")
    try:
        path.parent.mkdir(parents=True, exist_ok=True)
        fd, probe = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".probe", dir=path.parent)
        os.close(fd)
        os.unlink(probe)
    except OSError as err:
        raise Failure(f"{path}: cannot write there ({err.strerror or err})") from None
    return path


def prepare_outputs(inputs=(), **paths):
    """``{kind: Path}`` of the outputs asked for, each checked writable; folders are created.

    Raises
    ------
    Failure
        For a path that is a folder, a folder that cannot be made or written in, a path
        given for two outputs, or an output that is also an input.
    """
    outputs, seen = {}, {}
    given = {Path(i).resolve() for i in inputs}
    for kind, path in paths.items():
        if not path:
            continue
        resolved = Path(path).resolve()
        if resolved in seen:
            raise Failure(f"{path}: given for both --{seen[resolved]} and --{kind}")
        seen[resolved] = kind
        if resolved in given:
            raise Failure(f"{path}: is one of the input files; choose another name for --{kind}")
        outputs[kind] = writable(path, f"--{kind}", KINDS[kind] if kind in ("xlsx", "report") else None)
    return outputs


def write_outputs(ratings, verdicts, outputs, report_options=None):
    """Write the outputs asked for (see :func:`prepare_outputs`) together.

    JSON and CSV hold the verdicts when claims were checked, else the ratings; the
    workbook holds the ratings, their flags and the verdicts; the report both
    (``report_options``: its ``report_info`` and ``paper``).
    """
    from ..rating.wide_columns import ratings_sheets

    table = verdicts or ratings

    def sheets():
        out = ratings_sheets(ratings)
        if verdicts is not None:
            header, rows = verdicts.table()
            out.append(("checks", header, rows))
        return out

    write_documents(outputs, json=table.to_json, csv=table.to_csv, sheets=sheets,
                    report=lambda: {"ratings": ratings, "verdicts": verdicts, **(report_options or {})})


def write_documents(outputs, *, json=None, csv=None, sheets=None, report=None):
    """Write the outputs of one run together: all new, or, on any error, all as they were.

    Each output is made by a function, called only when that output was asked for:
    ``json`` and ``csv`` give the text; ``sheets`` the workbook's sheets, ``[(title,
    header, rows), ...]`` (a sheet of notes with the caution follows them); ``report`` the
    keywords of :func:`~lampcalc.cli.common.write_report_file` (``ratings``, ``verdicts``,
    ``report_info``, ``paper``, and the report's data: ``lot``, ``angles``, ``comparison`` …).

    Raises
    ------
    Failure
        When a file cannot be written; none of the outputs is then changed.
    """
    from ..io.atomic import replaced_together
    from ..io.workbook import write_workbook
    from ..report.caution import CAUTION

    if not outputs:
        return
    try:
        with replaced_together(outputs.values()) as tmp:
            for kind, path in outputs.items():
                if kind in ("json", "csv"):
                    with open(tmp[path], "w", encoding="utf-8", newline="") as handle:
                        handle.write((json if kind == "json" else csv)())
                elif kind == "xlsx":
                    notes = ("notes", ["note"], [[CAUTION], ["Keys and units: docs/output-fields.md"]])
                    write_workbook(tmp[path], [*sheets(), notes])
                else:
                    write_report_file(tmp[path], shown_as=path, **report())
    except OSError as err:
        raise Failure(f"cannot write the outputs ({err.strerror or err}: {err.filename or ''}); none was changed") from None
    for kind, path in outputs.items():
        if kind != "report":
            click.echo(f"wrote {path}", err=True)


class _NoLamps(Exception):
    """No lamp was rated: the outputs stay as they were."""


class _Sink:
    """Writes each chunk of ratings to the temporary files of the outputs (JSON, CSV, workbook)."""

    def __init__(self, outputs, tmp, handles, report_options=None):
        from ..io.streamed_tables import JsonRows
        from ..io.workbook import WorkbookWriter
        from ..rating.wide_columns import FlagLamps

        self.outputs, self.tmp, self.count = outputs, tmp, 0
        self.json = JsonRows(handles["json"]) if "json" in handles else None
        self.csv = handles.get("csv")  # the open file, then its CsvRows once the header is known
        self.book = WorkbookWriter() if "xlsx" in outputs else None
        self.flags = FlagLamps()
        self.report = [] if "report" in outputs else None  # ratings with their spectra, for the report's pages
        self.report_options = report_options or {}

    def write(self, ratings):
        from ..io.streamed_tables import CsvRows
        from ..io.workbook import MAX_ROWS
        from ..rating.wide_columns import ratings_rows

        columns = ratings.output_columns()
        if self.json:
            self.json.write(columns)
        if self.csv is not None:
            if not isinstance(self.csv, CsvRows):
                self.csv = CsvRows(self.csv, list(columns))
            self.csv.write(columns)
        if self.book is not None:
            if self.count + len(ratings) >= MAX_ROWS:
                raise Failure(f"{self.outputs['xlsx']}: a workbook sheet holds {MAX_ROWS - 1:,} lamps at most; "
                              "write this many with --csv or --json")
            header, rows = ratings_rows(ratings)
            if self.count == 0:
                self.book.add_sheet("ratings", header)
            self.book.add_rows(rows)
            self.flags.add(ratings["name"], ratings["flags"])
        if self.report is not None:
            self.report.append(ratings)
        self.count += len(ratings)

    def finish(self):
        from ..rating.streaming import join_ratings
        from ..report.caution import CAUTION

        if self.json:
            self.json.finish()
        if self.book is not None:
            self.book.add_sheet("flags", ["flag", "meaning", "lamps"])
            self.book.add_rows(self.flags.rows())
            self.book.add_sheet("notes", ["note"])
            self.book.add_rows([[CAUTION], ["Keys and units: docs/output-fields.md"]])
            self.book.save(self.tmp[self.outputs["xlsx"]])
        if self.report is not None:
            path = self.outputs["report"]
            write_report_file(self.tmp[path], join_ratings(self.report), None, shown_as=path, **self.report_options)


@contextlib.contextmanager
def streamed_outputs(outputs, report_options=None):
    """A sink for chunks of ratings (``sink.write(ratings)``), written into the outputs as they come.

    The outputs are temporary files until the block ends; then they are renamed together
    (all new, or all as they were: :func:`~lampcalc.io.atomic.replaced_together`). When no
    lamp was written, or on any error or interruption, every output stays as it was.
    """
    from ..io.atomic import replaced_together

    try:
        with replaced_together(outputs.values()) as tmp, contextlib.ExitStack() as files:
            handles = {
                kind: files.enter_context(open(tmp[path], "w", encoding="utf-8", newline=""))
                for kind, path in outputs.items()
                if kind in ("json", "csv")
            }
            sink = _Sink(outputs, tmp, handles, report_options)
            yield sink
            if sink.count == 0:
                raise _NoLamps
            sink.finish()
    except _NoLamps:
        return
    except OSError as err:
        raise Failure(f"cannot write the outputs ({err.strerror or err}: {err.filename or ''}); none was changed") from None
    for kind, path in outputs.items():
        if kind != "report":
            click.echo(f"wrote {path}", err=True)
