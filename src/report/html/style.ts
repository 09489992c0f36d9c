// The page's style sheet: one column of stacked charts under the map and the g-g diagram, a readout that
// stays in view while the pointer moves, print-friendly.

export const PAGE_STYLE = `
:root { color-scheme: light; --ink: #1d1d1f; --muted: #5b5b60; --line: #d9d9de; --paper: #ffffff; --wash: #f4f4f6; }
* { box-sizing: border-box; }
body { margin: 0; font: 14px/1.45 system-ui, 'Segoe UI', Helvetica, Arial, sans-serif; color: var(--ink); background: var(--wash); }
header, main, footer { max-width: 1180px; margin: 0 auto; padding: 0 20px; }
header { padding-top: 18px; }
h1 { font-size: 22px; margin: 0 0 2px; }
h2 { font-size: 16px; margin: 0 0 8px; }
.subtitle { color: var(--muted); margin: 0 0 12px; }
.summary { display: flex; flex-wrap: wrap; gap: 10px; margin-bottom: 14px; }
.tile { background: var(--paper); border: 1px solid var(--line); border-radius: 8px; padding: 7px 12px; min-width: 118px; }
.tile-label { font-size: 12px; color: var(--muted); }
.tile-value { font-size: 20px; font-weight: 650; font-variant-numeric: tabular-nums; }
.tile-note { font-size: 11px; color: var(--muted); }
.panel { background: var(--paper); border: 1px solid var(--line); border-radius: 8px; padding: 10px; margin-bottom: 14px; }
.overview { display: grid; grid-template-columns: 1fr 1fr; gap: 14px; }
@media (max-width: 900px) { .overview { grid-template-columns: 1fr; } }
svg.chart { display: block; width: 100%; height: auto; }
.controls { position: sticky; top: 0; z-index: 2; background: rgba(244, 244, 246, 0.96); border-bottom: 1px solid var(--line); padding: 6px 0; margin-bottom: 10px; }
.controls-inner { display: flex; flex-wrap: wrap; gap: 6px 18px; align-items: center; }
.readout { width: auto; font-size: 12.5px; }
.readout th, .readout td { border: 0; padding: 0 7px; }
.readout td { font-weight: 600; min-width: 64px; }
.readout th { font-weight: 500; }
.who-r { color: #0072B2; }
.who-d { color: #D55E00; }
.who-o { color: #000000; }
button { font: inherit; cursor: pointer; border: 1px solid #8a8a90; background: var(--paper); border-radius: 6px; padding: 3px 10px; }
button:disabled { cursor: default; color: #9a9aa0; border-color: var(--line); }
#zoom-label { font-weight: 600; }
.stack .chart + .chart { margin-top: 4px; }
svg.chart[data-chart="corner-legend"] { width: 560px; max-width: 100%; }
.budget-panel svg.chart, .car-panel svg.chart { max-width: 640px; margin: 0 auto; }
.multiples { display: grid; grid-template-columns: repeat(auto-fill, minmax(330px, 1fr)); gap: 8px; }
.multiple { border: 1px solid var(--line); border-radius: 6px; padding: 4px; }
.lap-trace:hover path { stroke-width: 3; }
.lap-row.best td { font-weight: 650; background: #fdf1e8; }
td.state, td.verdict { text-align: left; white-space: normal; }
.best-lap-heading { margin: 18px 0 10px; }
.chart-pair { display: grid; grid-template-columns: 1fr 1fr; gap: 10px; align-items: start; }
@media (max-width: 900px) { .chart-pair { grid-template-columns: 1fr; } }
.hover-area { cursor: crosshair; }
.corner-mark:hover circle, .corner-mark:focus circle { fill: #fff2cc; }
table { border-collapse: collapse; width: 100%; font-variant-numeric: tabular-nums; font-size: 13px; }
th, td { padding: 4px 6px; border-bottom: 1px solid var(--line); text-align: right; white-space: nowrap; }
th { font-weight: 600; color: var(--muted); font-size: 11.5px; white-space: normal; vertical-align: bottom; }
th:first-child, td:first-child { text-align: left; }
.table-wrap { overflow-x: auto; }
.corner-row { cursor: pointer; }
td.corner-id { white-space: normal; text-align: left; max-width: 240px; overflow-wrap: anywhere; }
.corner-row:hover, .corner-row:focus { background: #fff6dd; outline: none; }
.badge { display: inline-block; min-width: 22px; text-align: center; border: 1.2px solid #111; border-radius: 11px; font-size: 11px; font-weight: 650; padding: 0 4px; }
.strong { font-weight: 650; }
.hint { color: var(--muted); margin: 0 0 6px; font-size: 12px; }
.finding-list { margin: 0; padding-left: 22px; }
.finding-list li { margin: 4px 0; }
.stake { display: inline-block; min-width: 62px; font-weight: 650; font-variant-numeric: tabular-nums; }
.corner-link { padding: 0 8px; margin-right: 8px; font-size: 12px; }
.whole-lap { display: inline-block; margin-right: 8px; font-size: 12px; color: var(--muted); }
.notes { color: var(--muted); font-size: 12px; }
footer { padding: 4px 20px 24px; color: var(--muted); font-size: 12px; }
.caution { border-left: 4px solid #E69F00; background: #fff8e6; color: var(--ink); padding: 8px 12px; border-radius: 4px; font-size: 13px; }
@media print { .controls { position: static; } body { background: #fff; } }
`;
