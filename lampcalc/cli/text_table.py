"""Plain-text tables for the terminal."""


def format_table(headers, rows, align=None):
    """Columns padded to their widest cell; ``align`` is a string of ``l``/``r`` per column.

    Examples
    --------
    >>> print(format_table(["lamp", "x"], [["a", "0.31"], ["bb", "0.4"]], "lr"))
    lamp     x
    ----  ----
    a     0.31
    bb     0.4
    """
    rows = [[str(c) for c in row] for row in rows]
    align = align or "l" * len(headers)
    widths = [max(len(str(h)), *(len(r[i]) for r in rows)) if rows else len(str(h)) for i, h in enumerate(headers)]

    def line(cells):
        return "  ".join(c.ljust(w) if a == "l" else c.rjust(w) for c, w, a in zip(cells, widths, align)).rstrip()

    return "\n".join([line([str(h) for h in headers]), line(["-" * w for w in widths]), *(line(r) for r in rows)])
