package report

import "strings"

// style writes the style sheet: a calm page for the screen, and for print
// the page size, margins, running header and footer, and the rules that
// keep a cell, a table row or a picture on one page.
func (d *doc) style(title string) {
	m := d.res.Meta
	size := "A4"
	if d.opt.Paper == Letter {
		size = "letter"
	}
	rev := ""
	if m.Revision != "" {
		rev = "Revision " + m.Revision
	}
	left := title
	if m.Project != "" {
		left += "\n" + m.Project
	}
	d.w("@page { size: ", size, "; margin: 20mm 16mm 18mm 20mm;\n",
		"  @top-left { content: ", cssString(left), "; white-space: pre-wrap; width: 80%; font: 8pt/1.3 ", fontStack, "; color: #333; vertical-align: bottom; padding-bottom: 3mm; }\n",
		"  @top-right { content: ", cssString(rev), "; width: 20%; font: 600 8pt/1.3 ", fontStack, "; color: #333; vertical-align: bottom; padding-bottom: 3mm; text-align: right; }\n",
		"  @bottom-left { content: ", cssString("Sheaf calculation · "+baseName(d.s.Name())+" · SHA-256 "+d.hash[:12]), "; width: 75%; font: 7.5pt/1.2 ", fontStack, "; color: #555; vertical-align: top; padding-top: 3mm; }\n",
		"  @bottom-right { content: \"Page \" counter(page) \" of \" counter(pages); width: 25%; font: 7.5pt/1.2 ", fontStack, "; color: #555; vertical-align: top; padding-top: 3mm; text-align: right; }\n",
		"}\n")
	d.w(css)
}

const fontStack = `"DejaVu Sans", "Liberation Sans", Arial, sans-serif`

func baseName(p string) string {
	if i := strings.LastIndexAny(p, `/\`); i >= 0 {
		return p[i+1:]
	}
	return p
}

// css is the fixed part of the style sheet. Colours are a slate and teal
// of our own; a verdict is always written as a word too, so the page reads
// the same in black and white.
const css = `:root { --ink: #1d2428; --mute: #5b6670; --rule: #c9d1d6; --band: #eef2f4; --teal: #176b6b; --pass: #2f7d4a; --fail: #b3261e; --warn: #8a5a00; }
* { box-sizing: border-box; }
html { background: #dfe4e7; }
body { margin: 0; color: var(--ink); font: 10pt/1.45 ` + fontStack + `; }
main { background: #fff; max-width: 186mm; margin: 8mm auto; padding: 14mm 14mm 18mm; box-shadow: 0 1px 6px rgba(0,0,0,.18); }
math { font-size: 1.08em; }
h1 { font-size: 17pt; line-height: 1.2; margin: 1mm 0 4mm; }
h2 { font-size: 12.5pt; margin: 7mm 0 3mm; padding-bottom: 1mm; border-bottom: 1.5pt solid var(--teal); break-after: avoid; }
h2 .no, h3 .no { display: inline-block; min-width: 9mm; color: var(--teal); }
h3 { font-size: 11pt; margin: 5mm 0 2mm; break-after: avoid; }
h4 { font-size: 10pt; margin: 4mm 0 1.5mm; color: var(--teal); break-after: avoid; }
.kicker { text-transform: uppercase; letter-spacing: .12em; font-size: 8pt; color: var(--teal); font-weight: 600; }
.titleblock { border: 1pt solid var(--ink); padding: 4mm 5mm; break-inside: avoid; }
.titleblock table { border-collapse: collapse; width: 100%; }
.titleblock th { text-align: left; font-weight: 600; width: 30mm; padding: .6mm 3mm .6mm 0; vertical-align: top; color: var(--mute); font-size: 9pt; }
.titleblock td { padding: .6mm 0; vertical-align: top; }
.titleblock table.files { margin-top: 2mm; border-top: .5pt solid var(--rule); font-size: 8.5pt; }
.titleblock table.files th { font-size: 8.5pt; }
.hash, .file { font-family: "DejaVu Sans Mono", "Liberation Mono", monospace; font-size: 7.5pt; overflow-wrap: anywhere; }
.caution { margin: 4mm 0; padding: 2.5mm 4mm; border-left: 3pt solid var(--warn); background: #fbf6ea; font-size: 9pt; break-inside: avoid; }
.problems { border: 1pt solid var(--fail); padding: 1mm 4mm 2mm; margin: 4mm 0; }
.problems code { font-size: 8.5pt; white-space: pre-wrap; }
.verdict { font-weight: 600; margin: 1mm 0 2mm; }
.verdict.pass { color: var(--pass); } .verdict.fail, .verdict.unknown { color: var(--fail); }
table.checks { width: 100%; border-collapse: collapse; font-size: 9pt; }
table.checks th { text-align: left; font-weight: 600; border-bottom: 1pt solid var(--ink); padding: 1mm 1.5mm; font-size: 8.5pt; }
table.checks td { border-bottom: .5pt solid var(--rule); padding: 1.2mm 1.5mm; vertical-align: top; }
table.checks tr.governing td { background: var(--band); font-weight: 600; }
table.checks .desc { font-weight: 400; color: var(--mute); font-size: 8pt; }
table.checks td.ref { font-size: 7.5pt; color: var(--mute); width: 30mm; }
.gov { display: inline-block; font-size: 6.5pt; text-transform: uppercase; letter-spacing: .06em; border: .5pt solid var(--teal); color: var(--teal); padding: 0 1mm; border-radius: 1mm; vertical-align: 1px; }
td.num { text-align: right; white-space: nowrap; font-variant-numeric: tabular-nums; }
.v { font-weight: 700; white-space: nowrap; } .v.pass { color: var(--pass); } .v.fail, .v.unknown { color: var(--fail); }
.utilbar { white-space: nowrap; display: inline-flex; align-items: center; gap: 1.5mm; }
svg.bar { width: 24mm; height: 2.7mm; }
svg.bar .track { fill: var(--band); } svg.bar .limit { stroke: var(--ink); stroke-width: 1.2; }
svg.bar.pass .fill { fill: var(--pass); } svg.bar.fail .fill { fill: var(--fail); } svg.bar.unknown .fill { fill: var(--fail); }
.pct { font-variant-numeric: tabular-nums; min-width: 12mm; display: inline-block; text-align: right; }
p.comment { margin: 1.5mm 0 2.5mm; max-width: 150mm; }
pre.comment { font: 8.5pt/1.4 "DejaVu Sans Mono", "Liberation Mono", monospace; background: var(--band); padding: 2mm 3mm; margin: 2mm 0 3mm; white-space: pre-wrap; break-inside: avoid; }
.cell { display: grid; grid-template-columns: minmax(0, 1fr) 36mm; column-gap: 4mm; padding: 1.6mm 0 1.4mm; border-bottom: .4pt solid var(--rule); break-inside: avoid; }
.cell:has(figure), .cell:has(table.data) { break-inside: auto; }
.cell > .eq { grid-column: 1; display: flex; flex-wrap: wrap; align-items: baseline; column-gap: .25em; row-gap: 1mm; }
.cell > .ref { grid-column: 2; grid-row: 1 / span 3; font-size: 7.5pt; line-height: 1.3; color: var(--mute); border-left: 1.5pt solid var(--teal); padding-left: 2mm; align-self: start; overflow-wrap: anywhere; }
.cell > .desc { grid-column: 1; font-size: 8.5pt; color: var(--mute); }
.cell > table, .cell > figure, .cell > .list { grid-column: 1 / span 2; justify-self: start; }
.part { white-space: nowrap; }
.result { font-weight: 700; }
.u { font-style: normal; }
.unknown { color: var(--fail); font-weight: 600; }
.checkname { font-weight: 700; color: var(--teal); margin-right: .5em; white-space: nowrap; }
.cell.check { background: linear-gradient(90deg, var(--band), #fff 70%); padding-left: 2mm; }
.checkres { margin-left: auto; white-space: nowrap; font-size: 9pt; }
.kindnote { font-size: 8pt; color: var(--mute); margin-left: 1em; }
table.fields { border-collapse: collapse; font-size: 8.5pt; margin: 1mm 0 .5mm; }
table.fields caption { caption-side: top; text-align: left; font-size: 7.5pt; color: var(--mute); }
table.fields th { text-align: right; font-weight: 400; padding: .3mm 1.5mm .3mm 3mm; }
table.fields td { padding: .3mm 4mm .3mm 0; white-space: nowrap; }
.rtype { font-style: italic; }
table.data { border-collapse: collapse; font-size: 8.5pt; margin: 1mm 0; }
table.data th { border-bottom: 1pt solid var(--ink); padding: .6mm 3mm; font-weight: 400; }
table.data td { border-bottom: .4pt solid var(--rule); padding: .4mm 3mm; }
table.data tr, table.checks tr, table.overrides tr, .signoff tr { break-inside: avoid; }
thead { display: table-header-group; }
table.overrides { border-collapse: collapse; font-size: 9pt; margin: 1mm 0 3mm; width: 100%; }
table.overrides caption { text-align: left; font-size: 8pt; color: var(--mute); }
table.overrides th { text-align: left; border-bottom: 1pt solid var(--ink); padding: .6mm 2mm; font-weight: 600; font-size: 8.5pt; }
table.overrides td { border-bottom: .4pt solid var(--rule); padding: .6mm 2mm; }
.combos table { border-collapse: collapse; font-size: 8.5pt; margin: 1mm 0 3mm; width: 100%; }
.combos th { text-align: left; border-bottom: 1pt solid var(--ink); padding: .6mm 2mm; font-weight: 600; font-size: 8pt; }
.combos td { border-bottom: .4pt solid var(--rule); padding: .6mm 2mm; vertical-align: top; }
.combos th.num, .combos td.num { text-align: right; white-space: nowrap; }
.combos td.clause { white-space: nowrap; }
.combos .term { white-space: nowrap; }
.combos thead th.num { white-space: normal; }
.combos td.num .gov { display: block; width: fit-content; margin: .4mm 0 0 auto; }
.combos td.governs { font-weight: 600; background: var(--band); }
.combos td.fail { color: var(--fail); font-weight: 600; }
.combos tr { break-inside: avoid; }
table.checks .combo { font-weight: 400; color: var(--teal); font-size: 7.5pt; }
.kindnote.combo { display: block; margin-left: 0; }
section.use { border-left: 2pt solid var(--band); padding-left: 3mm; margin-left: -3mm; }
.usedesc { margin: 0 0 1mm; } .usedesc .ref { color: var(--mute); font-size: 8pt; }
figure { margin: 2mm 0; break-inside: avoid; }
figcaption { font-size: 8pt; color: var(--mute); margin-top: 1mm; }
svg.plot { display: block; width: 100%; height: auto; max-width: 150mm; }
svg.plot .frame { fill: none; stroke: var(--rule); }
svg.plot .zero { stroke: var(--ink); stroke-width: 1; }
svg.plot .area { fill: #cfe3e3; } svg.plot.u .area { fill: #e4dfcf; } svg.plot.sigma .area { fill: #dcd6e8; } svg.plot.neps .area { fill: #e6e6e6; }
svg.plot .curve { fill: none; stroke: var(--teal); stroke-width: 1.6; }
svg.plot .extreme { fill: var(--fail); }
svg.plot .ref { stroke: var(--fail); stroke-width: 1; stroke-dasharray: 5 3; }
svg.plot .design { fill: none; stroke: var(--ink); stroke-width: 1.8; }
svg.plot .support { fill: none; stroke: var(--ink); stroke-width: 1.4; }
svg.plot .load { fill: none; stroke: var(--fail); stroke-width: 1.6; }
figure.bar.vertical .plots { display: flex; gap: 2mm; }
figure.bar.vertical svg.plot { width: 33%; max-width: 58mm; }
svg.plot text { font-family: ` + fontStack + `; }
svg.plot .tick { font-size: 10px; fill: var(--mute); } svg.plot .axis { font-size: 11px; fill: var(--ink); } svg.plot .label { font-size: 11px; font-weight: 600; fill: var(--ink); }
figure.sectionfig { display: flex; align-items: flex-end; gap: 4mm; }
figure.sectionfig figcaption { max-width: 80mm; }
svg.section .reg { stroke: var(--ink); stroke-width: 1; }
svg.section .p0 { fill: #9fb4bf; } svg.section .p1 { fill: #e3dccb; } svg.section .p2 { fill: #c9b8d6; } svg.section .p3 { fill: #bcd3b4; }
svg.section .hole { fill: #fff; stroke: var(--ink); stroke-width: 1; }
svg.section .centroid { fill: none; stroke: var(--fail); stroke-width: 1.2; }
svg.section .dims { fill: none; stroke: var(--mute); stroke-width: .8; }
svg.section text { font-family: ` + fontStack + `; fill: var(--ink); stroke: none; }
.list { font-size: 9pt; color: var(--ink); }
.signoff { break-inside: avoid; margin-top: 8mm; }
.signoff table { width: 100%; border-collapse: collapse; }
.signoff th, .signoff td { border: .6pt solid var(--ink); padding: 2mm 3mm; text-align: left; }
.signoff tbody td { height: 13mm; } .signoff tbody th { width: 24mm; }
.small { font-size: 8pt; color: var(--mute); }
.end { margin-top: 6mm; font-size: 8pt; color: var(--mute); border-top: .5pt solid var(--rule); padding-top: 2mm; }
.liveerr { border: 1.5pt solid var(--fail); background: #fff4f3; padding: 2mm 4mm; margin: 0 0 4mm; }
.liveerr pre { font-size: 8.5pt; white-space: pre-wrap; margin: 1mm 0; }
a { color: inherit; text-decoration: none; }
@media print {
  html { background: none; }
  main { max-width: none; margin: 0; padding: 0; box-shadow: none; }
  body { font-size: 9.5pt; }
  .titleblock { break-after: avoid; }
  section.summary { break-inside: auto; }
}
`
