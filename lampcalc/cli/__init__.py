"""The ``lampcalc`` command line: a thin layer over the library, one module per command.

Only click is imported at start-up; each command imports what it needs, so that
``lampcalc --help`` answers at once. Bad input ends a command with one line on stderr
and exit status 2, never a traceback.
"""

import click

from .cct import cct
from .check import check
from .compare import compare
from .demo import demo
from .lot import lot
from .planck import planck
from .plot import plot
from .rate import rate


@click.group(context_settings={"help_option_names": ["-h", "--help"]})
@click.version_option(package_name="lampcalc")
def cli():
    """Rate lamp spectra: chromaticity, CCT/Duv, rendering, efficacy, claims, lots, comparisons.

    Start with `lampcalc demo`, or `lampcalc rate FILE...` on your own spectra.
    """


for _command in (planck, cct, rate, check, lot, compare, plot, demo):
    cli.add_command(_command)


def main(argv=None):
    """Entry point of the ``lampcalc`` console script: SIGINT and SIGTERM end it cleanly."""
    from . import interrupts

    interrupts.install()
    try:
        cli.main(args=argv, prog_name="lampcalc")
    except interrupts.Interrupted as interruption:
        click.echo(f"lampcalc: interrupted ({interruption}); no output was changed", err=True)
        interrupts.end_by(interruption)
