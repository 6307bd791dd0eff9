"""Comparing two revisions of a line list's results: lines added, removed, and what changed, with why.

Each side is a JSON results document (``boresize size --json`` or ``--output x.json``) or a line list
that is sized first. Lines are matched by tag (a repeated tag without cases by its occurrence). A
line has changed when its size (NPS and schedule), its status, its governing case, or the status of
a criterion at the selected size differs; the reason names the inputs that changed and, for a size
change, why the old size no longer serves (or why a smaller one now does).

Every line's changed inputs are listed too, old -> new, field by field (``case/field`` for a case's row),
also where the size held: a line whose flow rose 25 % but kept its size is counted apart ("size held, inputs
changed"), never among the unchanged. The inputs are the line list's cells as given (the document's
``input``); a document without them is compared on its resolved values (fluid, flow, pressure, ...).
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import asdict, dataclass, field
from typing import Any, Literal

__all__ = ["Change", "Diff", "InputChange", "compare", "render_diff"]

ChangeKind = Literal["size", "status", "governing-case", "verdict"]
Entry = Mapping[str, Any]


@dataclass(frozen=True)
class Change:
    """One difference of one line: what (``kind``), from ``old`` to ``new``, and why (``reason``)."""

    tag: str
    kind: ChangeKind
    old: str | None
    new: str | None
    reason: str


@dataclass(frozen=True)
class InputChange:
    """One input of one line that changed: ``field`` (``case/field`` for a case's row), ``old`` -> ``new``
    (``None`` where the other revision has no such cell)."""

    tag: str
    field: str
    old: str | None
    new: str | None

    def text(self) -> str:
        return f"{self.field} {self.old or '(none)'} -> {self.new or '(none)'}"


@dataclass
class Diff:
    """Lines added and removed (tags), the changes of the lines present in both, in the new order, and every
    changed input of those lines (``inputs``); ``held`` names the lines whose size held though inputs changed."""

    added: list[str] = field(default_factory=list)
    removed: list[str] = field(default_factory=list)
    changes: list[Change] = field(default_factory=list)
    unchanged: int = 0
    inputs: list[InputChange] = field(default_factory=list)
    held: list[str] = field(default_factory=list)

    def tags(self, kind: ChangeKind) -> list[str]:
        """Tags of the lines with a change of ``kind`` (e.g. ``"size"``), in order."""
        return list(dict.fromkeys(c.tag for c in self.changes if c.kind == kind))

    @property
    def empty(self) -> bool:
        return not (self.added or self.removed or self.changes or self.inputs)

    def input_tags(self) -> list[str]:
        """Tags of the lines with a changed input, in order."""
        return list(dict.fromkeys(c.tag for c in self.inputs))

    def to_dict(self) -> dict[str, Any]:
        return {"added": self.added, "removed": self.removed, "unchanged": self.unchanged,
                "size_changed": self.tags("size"), "size_held_inputs_changed": self.held,
                "changes": [asdict(c) for c in self.changes],
                "inputs_changed": [{"tag": tag, "size_held": tag in self.held,
                                    "inputs": [{"field": c.field, "old": c.old, "new": c.new}
                                               for c in self.inputs if c.tag == tag]}
                                   for tag in self.input_tags()]}


def _keyed(lines: Sequence[Entry]) -> dict[tuple[str, int], Entry]:
    seen: dict[str, int] = {}
    keyed = {}
    for entry in lines:
        tag = str(entry.get("tag"))
        seen[tag] = seen.get(tag, 0) + 1
        keyed[(tag, seen[tag])] = entry
    return keyed


def _size(entry: Entry) -> str | None:
    return f"NPS {entry['nps']} Sch {entry.get('schedule')}" if entry.get("nps") else None


#: resolved values compared when a document carries no input cells (an older or hand-made document)
RESOLVED = ("fluid", "sizing_mass_flow_kg_h", "pressure_bar_abs", "temperature_c", "length_m", "service",
            "pipe_class", "design_margin", "roughness_mm", "phase")


def _cells(source: Any, prefix: str) -> dict[str, str]:
    if not isinstance(source, Mapping):
        return {}
    return {f"{prefix}{k}": "" if v is None else str(v) for k, v in source.items() if k not in ("tag", "case")}


def _inputs(entry: Entry) -> dict[str, str]:
    """Input cells by ``case/field`` (the line's own row, or each case's row); the resolved values if none."""
    cells = _cells(entry.get("input"), "")
    cases = entry.get("cases")
    for case in cases if isinstance(cases, list) else ():
        if isinstance(case, Mapping):
            cells.update(_cells(case.get("input"), f"{case.get('case') or '?'}/"))
    return cells


def input_changes(tag: str, old: Entry, new: Entry) -> list[InputChange]:
    """The inputs of one line that differ between two revisions, in the order of the fields."""
    a, b = _inputs(old), _inputs(new)
    if not a and not b:
        a, b = ({k: str(e[k]) for k in RESOLVED if e.get(k) is not None} for e in (old, new))
    return [InputChange(tag, k, a.get(k) or None, b.get(k) or None) for k in dict.fromkeys([*a, *b])
            if a.get(k, "") != b.get(k, "")]


def _input_text(moved: Sequence[InputChange]) -> str:
    return "; ".join(c.text() for c in moved) if moved else "no input changed (criteria or software changed)"


def _why_size(old: Entry, new: Entry) -> str:
    """Why the selected size moved: the old size's standing in the new revision, and what controls now."""
    was = old.get("nps")
    rated = {c.get("nps"): c for c in new.get("candidates") or ()}
    if was in rated and rated[was].get("failing"):
        because = f"NPS {was} now fails {', '.join(rated[was]['failing'])}"
    elif was in rated:
        because = f"NPS {was} still passes; a smaller size now passes too"
    else:
        because = f"NPS {was} not rated in the new revision"
    return f"{because}; now controlled by {_controlling(new)}"


def _controlling(entry: Entry) -> str:
    """The controlling criterion with its own utilisation at the size (the highest over the cases, and the case
    that has it), or why none controls."""
    name = entry.get("controlling")
    if not name:
        return "no criterion (the smallest size)" if entry.get("status") == "pass" else "(none)"
    shown = [v.get("utilisation") for e in (entry.get("cases") or [entry]) for v in e.get("verdicts") or ()
             if v.get("criterion") == name and isinstance(v.get("utilisation"), (int, float))]
    case = (entry.get("governing") or {}).get(name) or entry.get("case")
    return f"{name}{f' {max(shown):.0%}' if shown else ''}{f' in case {case}' if case else ''}"


def _verdicts(entry: Entry) -> dict[str, str]:
    return {str(v.get("criterion")): str(v.get("status")) for v in entry.get("verdicts") or ()}


def _line_changes(tag: str, old: Entry, new: Entry, moved: Sequence[InputChange]) -> list[Change]:
    inputs = _input_text(moved)
    changes = []
    if _size(old) != _size(new):
        changes.append(Change(tag, "size", _size(old), _size(new), f"{inputs}; {_why_size(old, new)}"))
    if old.get("status") != new.get("status"):
        detail = new.get("error") or f"controlling {new.get('controlling')}"
        changes.append(Change(tag, "status", old.get("status"), new.get("status"), f"{inputs}; {detail}"))
    if (old.get("cases") or new.get("cases")) and old.get("case") != new.get("case"):
        changes.append(Change(tag, "governing-case", old.get("case"), new.get("case"), inputs))
    a, b = _verdicts(old), _verdicts(new)
    flipped = [f"{c} {a.get(c, '-')} -> {b.get(c, '-')}" for c in dict.fromkeys([*a, *b]) if a.get(c) != b.get(c)]
    if flipped and _size(old) == _size(new):
        changes.append(Change(tag, "verdict", None, None, f"{'; '.join(flipped)} ({inputs})"))
    return changes


def compare(old: Mapping[str, Any], new: Mapping[str, Any]) -> Diff:
    """Compare two results documents (each ``{"lines": [...]}`` as ``boresize size --json`` writes)."""
    before, after = _keyed(old.get("lines", [])), _keyed(new.get("lines", []))
    diff = Diff(added=[k[0] for k in after if k not in before], removed=[k[0] for k in before if k not in after])
    for key, entry in after.items():
        if key in before:
            shown = key[0] if key[1] == 1 else f"{key[0]} (#{key[1]})"  # a repeated tag: its occurrence
            moved = input_changes(shown, before[key], entry)
            found = _line_changes(key[0], before[key], entry, moved)
            diff.changes += found
            diff.inputs += moved
            if moved and _size(before[key]) == _size(entry):
                diff.held.append(shown)
            diff.unchanged += not (found or moved)
    return diff


def render_diff(diff: Diff, old_name: str, new_name: str) -> str:
    """The diff as text for the terminal."""
    out = [f"boresize diff: {old_name} -> {new_name}"]
    if diff.added:
        out.append(f"added ({len(diff.added)}): {', '.join(diff.added)}")
    if diff.removed:
        out.append(f"removed ({len(diff.removed)}): {', '.join(diff.removed)}")
    titles = {"size": "size changed", "status": "status changed", "governing-case": "governing case changed",
              "verdict": "verdict changed"}
    for kind, title in titles.items():
        found = [c for c in diff.changes if c.kind == kind]
        if found:
            out.append(f"{title} ({len(found)}):")
            for c in found:
                move = f"{c.old} -> {c.new}: " if c.old is not None or c.new is not None else ""
                out.append(f"  {c.tag}: {move}{c.reason}")
    tags = diff.input_tags()
    if tags:
        out.append(f"inputs changed ({len(tags)}):")
        for tag in tags:
            held = " (size held)" if tag in diff.held else ""
            out.append(f"  {tag}{held}: {_input_text([c for c in diff.inputs if c.tag == tag])}")
    out.append(f"{len(diff.held)} line(s) kept their size though inputs changed"
               + (f": {', '.join(diff.held)}" if diff.held else ""))
    out.append(f"{diff.unchanged} line(s) unchanged (no input, size, status or verdict changed)"
               + ("; no differences" if diff.empty else ""))
    return "\n".join(out) + "\n"
