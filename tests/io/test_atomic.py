"""Files replaced together: all new or all as they were, no temporary file left. Internal checks."""

import pytest

from lampcalc.io.atomic import replaced_together


def test_all_new(tmp_path):
    paths = [tmp_path / "a.json", tmp_path / "b.csv"]
    paths[0].write_text("old")
    with replaced_together(paths) as tmp:
        for p in paths:
            with open(tmp[p], "w") as handle:
                handle.write(f"new {p.name}")
    assert [p.read_text() for p in paths] == ["new a.json", "new b.csv"]
    assert sorted(p.name for p in tmp_path.iterdir()) == ["a.json", "b.csv"]


def test_all_old_after_a_failure_or_an_interruption(tmp_path):
    paths = [tmp_path / "a.json", tmp_path / "b.csv"]
    for p in paths:
        p.write_text("old")
    for failure in (RuntimeError("report failed"), KeyboardInterrupt()):
        with pytest.raises(type(failure)):
            with replaced_together(paths) as tmp:
                with open(tmp[paths[0]], "w") as handle:
                    handle.write("new")
                raise failure
        assert [p.read_text() for p in paths] == ["old", "old"]
        assert sorted(p.name for p in tmp_path.iterdir()) == ["a.json", "b.csv"]
