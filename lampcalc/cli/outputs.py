"""The files a command writes: checked before the work, written together after it.

Before any spectrum is read, every output path is checked (its folder is created, a file
can be made in it, no two outputs and no input share a path), so that nothing is computed
and then lost. After the work the outputs of one run (JSON, CSV, XLSX, PDF) are written to
temporary files and renamed together: all new, or all as they were.
"""

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
    from ..io.atomic import replaced_together
    from ..io.workbook import write_workbook
    from ..rating.wide_columns import ratings_sheets
    from ..report.caution import CAUTION

    if not outputs:
        return
    table = verdicts or ratings
    try:
        with replaced_together(outputs.values()) as tmp:
            for kind, path in outputs.items():
                if kind in ("json", "csv"):
                    with open(tmp[path], "w", encoding="utf-8", newline="") as handle:
                        handle.write(table.to_json() if kind == "json" else table.to_csv())
                elif kind == "xlsx":
                    sheets = ratings_sheets(ratings)
                    if verdicts is not None:
                        header, rows = verdicts.table()
                        sheets.append(("checks", header, rows))
                    sheets.append(("notes", ["note"], [[CAUTION], ["Keys and units: docs/output-fields.md"]]))
                    write_workbook(tmp[path], sheets)
                else:
                    write_report_file(tmp[path], ratings, verdicts, shown_as=path, **(report_options or {}))
    except OSError as err:
        raise Failure(f"cannot write the outputs ({err.strerror or err}: {err.filename or ''}); none was changed") from None
    for kind, path in outputs.items():
        if kind != "report":
            click.echo(f"wrote {path}", err=True)
