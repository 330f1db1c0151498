"""What a run keeps of its ratings while they stream past: counts, a few rows, flags, names.

A run of a million lamps writes every rating to its files as the chunks come; the terminal
shows only the first and last lamps (:data:`SHOWN`), the words of every flag raised, and a
note on names that two spectra carry. :class:`RunTally` gathers exactly that, in memory
that grows by about 8 bytes and the compressed text of a name and a source per lamp.
"""

import zlib

import numpy as np

from .ratings import Ratings
from .streaming import join_ratings, take_ratings
from .wide_columns import FlagLamps

#: Lamps shown in the terminal: all when there are at most this many, else the first and last half.
SHOWN = 40
_SEPARATOR = "\x00"


class RunTally:
    """Counts, first and last rows, flags and lamp names of the ratings of a run, chunk by chunk."""

    def __init__(self):
        self.count = 0
        self.head = None  # the first SHOWN lamps
        self.tail = None  # the last SHOWN // 2 lamps
        self.flags = FlagLamps()
        self._hashes, self._names = [], []

    def add(self, ratings):
        """Take note of one chunk of ratings (in order)."""
        n = len(ratings)
        if n == 0:
            return
        ratings = Ratings(ratings.columns)  # the terminal shows columns: no spectra, no draws kept
        if self.count < SHOWN:
            head = take_ratings(ratings, 0, SHOWN - self.count)
            self.head = head if self.head is None else join_ratings([self.head, head])
        tail = ratings if self.tail is None else join_ratings([self.tail, ratings])
        self.tail = take_ratings(tail, max(len(tail) - SHOWN // 2, 0), len(tail))
        self.count += n
        names, sources = ratings["name"], ratings["source"]
        self.flags.add(names, ratings["flags"])
        self._hashes.append(np.array([hash(name.casefold()) for name in names], dtype=np.int64))
        joined = (_SEPARATOR.join(names), _SEPARATOR.join(sources))
        if all(text.count(_SEPARATOR) == n - 1 for text in joined):  # sources repeat their path: zlib packs them
            self._names.append(tuple(zlib.compress(text.encode("utf-8", "surrogatepass"), 1) for text in joined))
        else:
            self._names.append((tuple(names), tuple(sources)))

    @property
    def all_shown(self):
        """True when the terminal table holds every lamp of the run."""
        return self.count <= SHOWN

    def shown(self):
        """``(first, last)`` ratings for the terminal: all lamps and None, or the first and last halves."""
        if self.all_shown:
            return self.head, None
        return take_ratings(self.head, 0, SHOWN // 2), self.tail

    def repeated_names(self):
        """``{"name": [...], "source": [...]}`` of every lamp whose name (ignoring case) another lamp has too."""
        if not self._hashes:
            return {"name": [], "source": []}
        hashes = np.concatenate(self._hashes)
        _, inverse, counts = np.unique(hashes, return_inverse=True, return_counts=True)
        repeated = counts[inverse] > 1
        names, sources, start = [], [], 0
        for chunk_hashes, (chunk_names, chunk_sources) in zip(self._hashes, self._names):
            picked = np.flatnonzero(repeated[start : start + chunk_hashes.size])
            start += chunk_hashes.size
            if picked.size:
                if isinstance(chunk_names, bytes):
                    chunk_names, chunk_sources = (zlib.decompress(text).decode("utf-8", "surrogatepass").split(_SEPARATOR)
                                                  for text in (chunk_names, chunk_sources))
                names += [chunk_names[i] for i in picked]
                sources += [chunk_sources[i] for i in picked]
        return {"name": names, "source": sources}
