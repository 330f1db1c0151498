"""The caution every result, report and page of the docs carries."""

CAUTION = (
    "Computed from the spectra supplied: not a photometric test report and not a photobiological safety "
    "assessment (IEC 62471). Local codes and licensed practice govern lighting design decisions."
)
