"""The Jinja2 template of the HTML report (kept in Python so that it ships inside the package).

Autoescaping is on: every user string (tags, fluids, case names, notes, error messages) is escaped.
Only the plot, an SVG that boresize draws itself, is inserted as markup.
"""

from __future__ import annotations

__all__ = ["TEMPLATE"]

TEMPLATE = r"""<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<title>boresize line sizing report{% if title %} - {{ title }}{% endif %}</title>
<style>
body { font-family: "DejaVu Sans", Arial, sans-serif; font-size: 13px; margin: 24px; color: #222; }
h1 { font-size: 20px; } h2 { font-size: 16px; margin-top: 28px; border-bottom: 1px solid #999; }
h3 { font-size: 14px; margin-bottom: 4px; }
table { border-collapse: collapse; margin: 6px 0 12px 0; }
th, td { border: 1px solid #bbb; padding: 2px 6px; text-align: left; vertical-align: top; }
th { background: #eee; } td.num { text-align: right; font-variant-numeric: tabular-nums; }
.pass { background: #d4f4d4; } .fail { background: #f9d0d0; } .error { background: #f6e3b0; }
.warn { background: #fff3b0; } .not-applicable { background: #eeeeee; color: #666; }
tr.selected td { font-weight: bold; } tr.differs td { background: #eef4fb; font-weight: bold; }
.caution { border: 2px solid #c0392b; padding: 8px; background: #fff6f5; }
.plot svg { max-width: 100%; height: auto; }
.line { page-break-inside: avoid; }
.small { color: #555; font-size: 11px; }
table.document th { width: 8em; } td.tag { white-space: nowrap; } td.eq { font-family: "DejaVu Serif", "Times New Roman", serif; white-space: nowrap; }
.pair { display: flex; flex-wrap: wrap; gap: 0 12px; align-items: flex-start; }
.print-head { display: none; }
/* Printed (A4): each line record starts a page headed by the document block in one row, no table is split,
   the plot and type are smaller, so that a line takes one or two pages. */
@page { size: A4; margin: 10mm 9mm 11mm 9mm; }
@media print {
  body { margin: 0; font-size: 8px; }
  h1 { font-size: 14px; margin: 0 0 4px 0; } h2 { font-size: 11px; margin: 6px 0 3px 0; } h3 { font-size: 9.5px; margin: 4px 0 2px 0; }
  p { margin: 3px 0; } th, td { padding: 0 3px; }
  table { margin: 2px 0 5px 0; break-inside: avoid; page-break-inside: avoid; }
  tr { break-inside: avoid; page-break-inside: avoid; }
  .line { break-before: page; page-break-before: always; break-inside: auto; page-break-inside: auto; }
  .line h2 { margin-top: 0; }
  .plot svg { width: 150mm; max-width: 100%; height: auto; }
  .plot, h2, h3 { break-inside: avoid; page-break-inside: avoid; break-after: avoid; page-break-after: avoid; }
  .print-head { display: block; font-size: 7.5px; color: #444; border-bottom: 1px solid #999; margin: 0 0 3px 0; }
  .caution { padding: 3px 5px; } a { color: inherit; text-decoration: none; }
  td.eq { white-space: normal; } .small { font-size: 7px; }
  .pair > table { max-width: 93mm; } .records-head { display: none; }
  #traceability { break-before: page; page-break-before: always; }
}
</style>
</head>
<body>
<h1>Line sizing report{% if title %}: {{ title }}{% endif %}</h1>
{% if document %}
<table class="document" id="document">
{% for name, value in document %}<tr><th>{{ name }}</th><td>{{ value }}</td></tr>{% endfor %}
</table>
{% endif %}
<p class="caution"><strong>Caution.</strong> {{ caution }}</p>
<p>{{ summary }}</p>
{% if left_out %}<p class="caution" id="left-out"><strong>Left out.</strong> {{ left_out }}.</p>{% endif %}

<h2 id="summary">Summary</h2>
<table>
<tr><th>Tag</th><th>Cases</th><th>Status</th><th>Mode</th><th>Service</th><th>Fluid</th><th>Sizing flow [kg/h]</th>
<th>P in [bar abs]</th><th>T [degC]</th><th>NPS</th><th>Sch</th>
<th>v [m/s]</th><th>Total dP [kPa]</th><th>dP [kPa/100 m]</th><th>Controlling</th><th>Utilisation</th><th>Governing case</th></tr>
{% for line in lines %}
<tr><td class="tag">{% if line.record %}<a href="#line-{{ line.number }}">{{ line.tag }}</a>{% else %}{{ line.tag }}{% endif %}</td><td class="num">{{ line.case_count }}</td>
<td class="{{ line.status }}">{{ line.status }}</td><td>{{ line.mode }}</td><td>{{ line.service }}</td>
<td>{{ line.fluid }}</td><td class="num">{{ line.flow }}</td><td class="num">{{ line.pressure }}</td>
<td class="num">{{ line.temperature }}</td>
<td>{{ line.nps }}</td><td>{{ line.schedule }}</td><td class="num">{{ line.velocity }}</td><td class="num">{{ line.total }}</td>
<td class="num">{{ line.drop }}</td><td>{{ line.controlling }}</td><td class="num">{{ line.utilisation }}</td>
<td>{{ line.case }}</td></tr>
{% endfor %}
</table>

<h2 class="records-head">Calculation records</h2>
{% if left_out %}<p class="caution"><strong>Left out.</strong> {{ left_out }}.</p>{% endif %}
{% for line in lines if line.record %}
<div class="line" id="line-{{ line.number }}">
<div class="print-head">{% if title %}{{ title }}{% else %}line sizing report{% endif %}{% for name, value in document if name in ("unit", "date", "prepared", "checked", "approved") and value %} &middot; {{ name }} {{ value }}{% endfor %} &middot; line {{ line.number }} of {{ lines | length }}</div>
<h2>{{ line.tag }} <span class="{{ line.status }}">&nbsp;{{ line.status }}&nbsp;</span></h2>
{% if line.error %}<p class="error">{{ line.error }}</p>{% endif %}
{% if line.nps %}<p>Selected: NPS {{ line.nps }} Sch {{ line.schedule }} ({{ line.mode }});
controlling criterion: {{ line.controlling }}{% if line.case %}; governing case: {{ line.case }}{% endif %}.</p>{% endif %}
{% if line.governing %}
<table><tr><th>Criterion</th><th>Governing case</th></tr>
{% for criterion, case in line.governing %}<tr><td>{{ criterion }}</td><td>{{ case }}</td></tr>{% endfor %}
</table>
{% endif %}
{% if line.plot %}<div class="plot">{{ line.plot | safe }}</div>{% endif %}
{% if line.side %}
<table class="cases"><tr><th>Cases side by side</th><th>Unit</th>{% for name in line.side.names %}<th>{{ name }}</th>{% endfor %}</tr>
{% for row in line.side.rows %}
{% if loop.first or row.section != loop.previtem.section %}<tr><th colspan="{{ 2 + line.side.names | length }}">{{ row.section }}</th></tr>{% endif %}
<tr{% if row.differs %} class="differs"{% endif %}><td>{{ row.name }}</td><td>{{ row.unit }}</td>{% for value in row["values"] %}<td{% if row.section != "input (as given)" %} class="num"{% endif %}>{{ value }}</td>{% endfor %}</tr>
{% endfor %}
</table>
{% endif %}
{% for case in line.cases %}
{% if line.cases | length > 1 %}<h3>Case {{ case.name }} <span class="{{ case.status }}">&nbsp;{{ case.status }}&nbsp;</span></h3>{% endif %}
{% if case.error %}<p class="error">{{ case.error }}</p>{% endif %}
<div class="pair">
{% if case.given %}
<table><tr><th>Input (as given{% if case.differs_from is not none %}; what differs from case {{ case.differs_from }}{% endif %})</th><th>Value</th>{% if case.given | map(attribute=2) | select | list %}<th>Default unit of the column</th>{% endif %}</tr>
{% for name, value, unit in case.given %}<tr><td>{{ name }}</td><td>{{ value }}</td>{% if case.given | map(attribute=2) | select | list %}<td>{{ unit }}</td>{% endif %}</tr>{% endfor %}
</table>
{% endif %}
{% if case.used %}
<table><tr><th>As used{% if case.differs_from is not none %} (what differs from case {{ case.differs_from }}){% endif %}</th><th>Value</th><th>Unit</th></tr>
{% for name, value, unit in case.used %}<tr><td>{{ name }}</td><td class="num">{{ value }}</td><td>{{ unit }}</td></tr>{% endfor %}
</table>
{% endif %}
</div>
{% if case.two_phase %}
<table class="two-phase"><tr><th>Two-phase flow (selected size)</th><th>Value</th><th>Unit or source</th></tr>
{% for name, value, unit in case.two_phase %}<tr><td>{{ name }}</td><td class="num">{{ value }}</td><td>{{ unit }}</td></tr>{% endfor %}
</table>
<p class="caution small"><strong>Two-phase caution.</strong> {{ two_phase_caution }}</p>
{% endif %}
{% if case.candidates %}
<table><tr><th>NPS</th><th>Sch</th><th>ID [mm]</th><th>v [m/s]</th><th>dP [kPa/100 m]</th><th>Re</th><th>f</th>
<th>Regime</th><th>Worst criterion</th><th>Utilisation</th><th>Result</th></tr>
{% for c in case.candidates %}
<tr class="{{ 'selected' if c.selected else '' }}"><td>{{ c.nps }}{% if c.selected %} (selected){% endif %}</td>
<td>{{ c.schedule }}</td><td class="num">{{ c.id }}</td><td class="num">{{ c.velocity }}</td><td class="num">{{ c.drop }}</td>
<td class="num">{{ c.reynolds }}</td><td class="num">{{ c.friction }}</td><td>{{ c.regime }}</td><td>{{ c.worst }}</td>
<td class="num">{{ c.utilisation }}</td><td class="{{ c.result }}">{{ c.result }}</td></tr>
{% endfor %}
</table>
{% endif %}
<div class="pair">
{% if case.totals %}
<table class="totals"><tr><th>Hydraulics at the selected size</th><th>Value</th><th>Unit</th></tr>
{% for name, value, unit in case.totals %}<tr><td>{{ name }}</td><td{% if unit %} class="num"{% endif %}>{{ value }}</td><td>{{ unit }}</td></tr>{% endfor %}
</table>
{% endif %}
{% if case.fittings %}
<table class="fittings"><tr><th>Fitting</th><th>Count</th><th>K each</th><th>L_eq each [m]</th><th>K from</th></tr>
{% for f in case.fittings %}<tr><td>{{ f.kind }}</td><td class="num">{{ f.count }}</td><td class="num">{{ f.k }}</td>
<td class="num">{{ f.leq }}</td><td>{{ f.source }}</td></tr>{% endfor %}
</table>
{% endif %}
</div>
{% if case.equations %}
<table class="equations"><tr><th>Quantity</th><th>Equation</th><th>With the numbers (SI)</th><th>Result</th></tr>
{% for name, eq, numbers, result in case.equations %}<tr><td>{{ name }}</td><td class="eq">{{ eq }}</td>
<td class="eq">{{ numbers }}</td><td class="num">{{ result }}</td></tr>{% endfor %}
</table>
{% endif %}
{% if case.verdicts %}
<table><tr><th>Criterion</th><th>Status</th><th>Value</th><th>Limit</th><th>Unit</th><th>Utilisation</th><th>Reason</th><th>Source</th></tr>
{% for v in case.verdicts %}
<tr><td>{{ v.criterion }}</td><td class="{{ v.status }}">{{ v.status }}</td><td class="num">{{ v.value }}</td>
<td class="num">{{ v.limit }}</td><td>{{ v.unit }}</td><td class="num">{{ v.utilisation }}</td><td>{{ v.reason }}</td>
<td class="small">{{ v.source }}</td></tr>
{% endfor %}
</table>
{% endif %}
{% endfor %}
{% if line.notes %}<ul>{% for note in line.notes %}<li>{{ note }}</li>{% endfor %}</ul>{% endif %}
</div>
{% endfor %}

<h2>Cautions</h2>
<ul>
<li>{{ caution }}</li>
{% for note in cautions %}<li>{{ note }}</li>{% endfor %}
</ul>

<h2 id="traceability">Traceability</h2>
<table>
{% for name, value in trace %}<tr><th>{{ name }}</th><td>{{ value }}</td></tr>{% endfor %}
</table>
</body>
</html>
"""
