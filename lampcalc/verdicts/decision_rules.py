"""Decision rules: a statement of conformity that takes the measurement uncertainty into account.

ILAC-G8:09/2019 (Guidelines on decision rules and statements of conformity), clause 4.2, gives
the rules lampcalc offers. With a tolerance limit TL (the claim) and a guard band w ≥ 0:

``simple`` (4.2.1, simple acceptance, w = 0)
    pass when the measured value meets the limit, fail when it does not. The risk is shared: a
    value right at the limit has up to a 50 % chance of being a false pass or a false fail.
``guarded`` (4.2.3, non-binary statement with a guard band, w = k·u)
    pass beyond the acceptance limit TL − w; conditional pass inside the guard band but within
    the limit, [TL − w, TL]; conditional fail beyond the limit by at most w, [TL, TL + w]; fail
    beyond TL + w. The guard band is k times the standard uncertainty u of the check's margin;
    k = 2 makes w the expanded uncertainty U of a 95 % interval for a normal distribution,
    ILAC-G8's w = U.

lampcalc states every claim as a *margin* (how far the measurement is on the right side of the
limit, negative when it fails, ``docs/claims.md``), so the rule compares the margin m with w:
m > w pass; 0 ≤ m ≤ w conditional pass; −w ≤ m < 0 conditional fail; m < −w fail. A margin
exactly at the limit (m = 0) counts as meeting it, as lampcalc's verdicts always have.
"""

import math
from dataclasses import dataclass

#: Decision rule -> how it is stated, with its clause.
RULES = {
    "simple": "simple acceptance, w = 0 (ILAC-G8:09/2019 4.2.1)",
    "guarded": "guarded acceptance, w = {k:g}·u (ILAC-G8:09/2019 4.2.3)",
}
#: Outcome -> what it means, in one sentence a client can read.
OUTCOMES = {
    "pass": "meets the claim by more than the guard band: conformity is shown",
    "conditional pass": "meets the claim, but by less than the guard band: conformity is not shown beyond doubt",
    "conditional fail": "misses the claim by no more than the guard band: non-conformity is not shown beyond doubt",
    "fail": "misses the claim by more than the guard band: non-conformity is shown",
}
#: The two outcomes of simple acceptance, which carry the shared risk.
SIMPLE_OUTCOMES = {
    "pass": "the measured value meets the claim; near the claim it may be a false pass (up to 50 % at the claim)",
    "fail": "the measured value misses the claim; near the claim it may be a false fail (up to 50 % at the claim)",
}


@dataclass(frozen=True)
class DecisionRule:
    """A decision rule of ILAC-G8:09/2019, clause 4.2.

    Parameters
    ----------
    name : {"simple", "guarded"}
    guard_band_k : float
        For ``"guarded"``: the guard band w is ``guard_band_k`` times the margin's standard
        uncertainty. Non-negative. Ignored by ``"simple"``.

    Raises
    ------
    ValueError
        For an unknown rule (the message lists the valid ones) or a negative or non-finite k.

    Examples
    --------
    >>> rule = DecisionRule("guarded", 2.0)
    >>> [rule.decide(m, 0.5) for m in (1.5, 0.4, -0.4, -1.5)]
    ['pass', 'conditional pass', 'conditional fail', 'fail']
    >>> DecisionRule("simple").decide(-0.4, 0.5)
    'fail'
    """

    name: str = "simple"
    guard_band_k: float = 2.0

    def __post_init__(self):
        if self.name not in RULES:
            raise ValueError(f"unknown decision rule {self.name!r}; choose one of {', '.join(RULES)}")
        if not (math.isfinite(self.guard_band_k) and self.guard_band_k >= 0):
            raise ValueError(f"the guard band factor must be a finite, non-negative number, got {self.guard_band_k!r}")

    def describe(self):
        """The rule in words, with its clause."""
        return RULES[self.name].format(k=self.guard_band_k)

    def explain(self, outcome):
        """What ``outcome`` means under this rule, in one sentence."""
        return (SIMPLE_OUTCOMES if self.name == "simple" else OUTCOMES)[outcome]

    def guard_band(self, u):
        """The guard band w for a margin of standard uncertainty ``u`` (NaN when u is unknown)."""
        if self.name == "simple":
            return 0.0
        return self.guard_band_k * u if u is not None and math.isfinite(u) else math.nan

    def decide(self, margin, u):
        """The outcome for a margin and its standard uncertainty; None when it cannot be decided.

        Parameters
        ----------
        margin : float or None
            How far the measurement is on the right side of the claim (negative: it misses it).
        u : float or None
            Standard uncertainty of the margin (not needed by ``"simple"``).

        Returns
        -------
        {"pass", "conditional pass", "conditional fail", "fail"} or None
        """
        if margin is None or not math.isfinite(margin):
            return None
        w = self.guard_band(u)
        if not math.isfinite(w):
            return None
        if margin > w or (w == 0 and margin == 0):
            return "pass"
        if margin >= 0:
            return "conditional pass"
        return "conditional fail" if margin >= -w else "fail"


def worst(outcomes):
    """The least favourable of several outcomes (a lamp's, from its checks); None if any is None.

    Examples
    --------
    >>> worst(["pass", "conditional fail", "conditional pass"])
    'conditional fail'
    """
    order = list(OUTCOMES)
    outcomes = list(outcomes)
    if not outcomes or any(o is None for o in outcomes):
        return None
    return max(outcomes, key=order.index)
