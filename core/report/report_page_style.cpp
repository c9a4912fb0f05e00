// The report page's style sheet: a calm single column for reading, a two-figure explorer,
// tables that survive printing (rows never split, headers repeated), and a print layout
// without the controls.
#include "report/report_html.h"

namespace barrow {

const char* reportPageStyle() {
  return R"CSS(
:root {
  --ink: #1c2328; --muted: #5d6872; --rule: #d8dde2; --paper: #fbfbf9; --panel: #ffffff;
  --a: #0072b2; --b: #d55e00; --good: #00795a; --bad: #b34700; --flat: #56b4e9; --focus: #009e73;
  --mono: ui-monospace, "DejaVu Sans Mono", Menlo, Consolas, monospace;
}
* { box-sizing: border-box; }
html { background: var(--paper); color: var(--ink); }
body { margin: 0 auto; max-width: 1180px; padding: 28px 32px 48px;
  font: 15px/1.5 system-ui, -apple-system, "Segoe UI", "DejaVu Sans", sans-serif; }
h1 { font-size: 28px; line-height: 1.2; margin: 2px 0 8px; letter-spacing: -0.01em; overflow-wrap: anywhere; }
h2 { font-size: 19px; margin: 36px 0 10px; padding-bottom: 4px; border-bottom: 2px solid var(--ink); }
code, pre, .n { font-family: var(--mono); font-size: 13px; }
.n { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
.kicker { margin: 0; text-transform: uppercase; letter-spacing: 0.12em; font-size: 12px; color: var(--muted); }
.lede { font-size: 16px; max-width: 78ch; margin: 0 0 10px; overflow-wrap: anywhere; }
.note { color: var(--muted); max-width: 90ch; }
.warn { color: var(--bad); }
.meta { display: flex; flex-wrap: wrap; gap: 4px 28px; margin: 0 0 12px; color: var(--muted); font-size: 13px; }
.meta div { display: flex; gap: 6px; } .meta dt { font-weight: 600; } .meta dd { margin: 0; }
table { border-collapse: collapse; width: 100%; background: var(--panel); }
th, td { padding: 5px 9px; border-bottom: 1px solid var(--rule); vertical-align: top; text-align: left; }
th { font-size: 12.5px; color: var(--muted); font-weight: 600;
  border-bottom: 1px solid var(--ink); }
td { overflow-wrap: anywhere; }
.files td:nth-child(2), .files td:nth-child(3) { max-width: 360px; }
.mark { display: inline-block; width: 10px; height: 10px; margin-right: 6px; vertical-align: -1px; }
.mark-a { background: var(--a); border-radius: 50%; }
.mark-b { width: 0; height: 0; border-left: 6px solid transparent; border-right: 6px solid transparent;
  border-bottom: 11px solid var(--b); }
.swatch { vertical-align: middle; margin-right: 7px; }
.toc { display: flex; flex-wrap: wrap; gap: 6px 18px; margin: 18px 0 0; padding: 8px 0;
  border-top: 1px solid var(--rule); border-bottom: 1px solid var(--rule); font-size: 14px; }
.toc a { color: var(--ink); text-decoration: none; border-bottom: 1px dotted var(--muted); }
.explorer { display: grid; grid-template-columns: minmax(0, 5fr) minmax(0, 7fr); gap: 18px; align-items: start; }
.fig { margin: 0; background: var(--panel); border: 1px solid var(--rule); border-radius: 6px; padding: 8px; }
.fig svg { display: block; width: 100%; height: auto; }
.fig figcaption { font-size: 12.5px; color: var(--muted); padding: 4px 4px 0; display: flex; flex-wrap: wrap; gap: 2px 14px; }
.legend-item { display: inline-flex; align-items: center; gap: 5px; white-space: nowrap; }
.curves svg { cursor: crosshair; }
.controls { display: flex; flex-wrap: wrap; align-items: center; gap: 10px 18px; margin: 14px 0 10px;
  padding: 10px 14px; background: var(--panel); border: 1px solid var(--rule); border-radius: 6px; }
.slider { display: flex; align-items: center; gap: 10px; flex: 1 1 380px; font-weight: 600; }
.slider input { flex: 1; accent-color: var(--a); }
#theta-out { font-family: var(--mono); min-width: 15ch; }
button { font: inherit; font-size: 13px; padding: 4px 12px; border: 1px solid var(--muted); border-radius: 4px;
  background: var(--panel); color: var(--ink); cursor: pointer; }
button:hover { background: #eef1f3; }
:focus-visible { outline: 3px solid var(--focus); outline-offset: 2px; }
.toggle { font-size: 14px; display: flex; align-items: center; gap: 6px; }
.readout td, .readout th { padding: 3px 9px; }
.readout tbody tr { cursor: pointer; }
.readout tbody tr.picked { background: #eef5fa; }
.readout .where { color: var(--muted); font-size: 12.5px; }
.status { font-family: var(--mono); font-size: 12px; padding: 0 6px; border-radius: 3px; background: #eef1f3; }
.s-ok { background: #e3f3ec; color: var(--good); } .s-infinite { background: #fdf0e6; color: var(--bad); }
.msg { font-size: 12.5px; color: var(--bad); }
td.settings { font-size: 12.5px; color: var(--muted); max-width: 420px; }
.findings { list-style: none; padding: 0; margin: 0; display: grid; grid-template-columns: 1fr 1fr; gap: 10px 22px; }
.findings li { padding: 8px 12px; background: var(--panel); border: 1px solid var(--rule); border-left-width: 4px;
  border-radius: 4px; break-inside: avoid; }
.findings p { margin: 4px 0 0; }
.findings li.v-ok { border-left-color: var(--good); } .findings li.v-jump { border-left-color: var(--bad); }
.findings li.v-flat { border-left-color: var(--flat); }
.f-head { display: flex; align-items: center; flex-wrap: wrap; gap: 6px; }
.f-facts { font-size: 12.5px; color: var(--muted); }
.chip { font-size: 11.5px; padding: 0 7px; border-radius: 9px; border: 1px solid currentColor; }
.chip.ok { color: var(--good); } .chip.bad { color: var(--bad); } .chip.flat { color: #2a7fb0; }
.cautions { padding-left: 20px; max-width: 92ch; } .cautions li { margin: 6px 0; }
pre.commands { background: #1f262c; color: #e8ecef; padding: 12px 14px; border-radius: 6px; overflow-x: auto;
  white-space: pre-wrap; word-break: break-all; line-height: 1.55; }
.saves { display: flex; gap: 10px; flex-wrap: wrap; }
footer { margin-top: 40px; padding-top: 10px; border-top: 1px solid var(--rule); color: var(--muted); font-size: 12.5px; }
@media screen { .print-only { display: none !important; } }
@media (max-width: 860px) { .explorer, .findings { grid-template-columns: 1fr; } body { padding: 16px; } }
@media print {
  @page { margin: 14mm 12mm; }
  html, body { background: #fff; }
  body { max-width: none; padding: 0; font-size: 11pt; }
  .controls, .toc, .saves, .screen-only { display: none !important; }
  h2 { break-after: avoid; margin-top: 18px; }
  .explorer { grid-template-columns: 5fr 7fr; break-inside: avoid; }
  .fig { border-color: #bbb; }
  table { break-inside: auto; }
  tr, .findings li, .cautions li { break-inside: avoid; page-break-inside: avoid; }
  thead { display: table-header-group; }
  pre.commands { background: #fff; color: #000; border: 1px solid #999; }
  .readout tbody tr.picked { background: none; }
}
)CSS";
}

}  // namespace barrow
