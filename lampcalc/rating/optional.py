"""Optional packages (pandas, dask): imported when a function needs them, or a message naming the extra."""

import importlib


def optional_import(module, extra, needed_by):
    """``module`` imported, or an ImportError saying that ``needed_by`` needs it and which extra installs it.

    Examples
    --------
    >>> optional_import("json", "none", "this example").__name__
    'json'
    """
    try:
        return importlib.import_module(module)
    except ImportError:
        raise ImportError(f"{needed_by} needs {module.split('.')[0]}: pip install 'lampcalc[{extra}]'") from None
