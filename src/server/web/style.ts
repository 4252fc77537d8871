// The supervisor pages' stylesheet, served as /supervisor/style.css (the CSP allows no inline styles). The print
// rules at the end lay out the inspection report on A4 with "page x of y" in the page margin.
export const SUPERVISOR_CSS = `
:root { color-scheme: light; font-family: system-ui, sans-serif; color: #1d2b36; background: #f4f6f8; }
body { margin: 0; }
header.site { background: #1d2b36; color: #fff; padding: 0.75rem 1.25rem; display: flex; gap: 1.5rem; align-items: center; }
header.site a { color: #fff; }
header.site form { margin-left: auto; }
main { padding: 1.25rem; max-width: 72rem; }
body.wide main { max-width: none; }
h1 { font-size: 1.4rem; }
table { border-collapse: collapse; width: 100%; background: #fff; }
th, td { text-align: left; padding: 0.5rem; border-bottom: 1px solid #d5dce3; vertical-align: top; }
caption { text-align: left; font-weight: 600; padding: 0.25rem 0; }
.kid { font-family: ui-monospace, monospace; font-size: 0.85rem; word-break: break-all; }
.muted { color: #56636e; font-size: 0.9rem; }
.badge { display: inline-block; padding: 0.1rem 0.4rem; border: 1px solid currentColor; border-radius: 0.25rem; font-size: 0.8rem; }
.revoked { color: #8a1c1c; }
.demo { color: #6b4e00; }
.panel { background: #fff; border: 1px solid #d5dce3; padding: 1rem; margin: 1rem 0; }
.code { font-family: ui-monospace, monospace; font-size: 2rem; letter-spacing: 0.15em; }
.qr { width: 14rem; height: 14rem; }
.error { color: #8a1c1c; font-weight: 600; }
.notice { color: #1d5a2c; font-weight: 600; }
label { display: block; margin: 0.5rem 0; }
input[type=text], input[type=password], input[type=search], input[type=date], select, textarea { font-size: 1rem; padding: 0.35rem; }
textarea { display: block; width: 100%; box-sizing: border-box; }
button { font-size: 1rem; padding: 0.35rem 0.8rem; }
form.inline { display: inline; }
.filters fieldset { border: 0; padding: 0; margin: 0 0 0.5rem; display: flex; flex-wrap: wrap; gap: 0.25rem 1.25rem; }
.filters legend { font-weight: 600; margin-bottom: 0.25rem; }
.filters label.flag { display: inline-flex; gap: 0.35rem; align-items: center; margin: 0.25rem 0; }
.filter-row { display: flex; flex-wrap: wrap; gap: 0.5rem 1rem; align-items: end; }
label.filter { margin: 0.25rem 0; }
label.filter select, label.filter input { display: block; }
.count { color: #56636e; }
.pages { display: flex; gap: 1rem; margin: 1rem 0; }
.verdict-below, .flagged, .sig-bad { color: #8a1c1c; font-weight: 600; }
.verdict-ok, .sig-ok { color: #1d5a2c; font-weight: 600; }
.verdict-open { color: #56636e; }
.row-below { background: #fdf0f0; }
.mismatch { color: #8a1c1c; background: #fff3cd; font-weight: 600; }
.mismatch-row { background: #fff3cd; }
.unreviewed { color: #0b4f8a; font-weight: 600; }
.outcome-accepted { color: #1d5a2c; }
.outcome-rework { color: #8a1c1c; }
.outcome-moreReadings { color: #0b4f8a; }
.mark { display: inline-block; margin-left: 0.35rem; font-size: 0.8rem; border: 1px dashed currentColor; padding: 0 0.3rem; }
.mark-unverified { color: #6b4e00; }
.mark-borderline { color: #0b4f8a; }
.status-superseded, .status-withdrawn, .status-leftOut { color: #6b4e00; font-weight: 600; }
tr.reading-superseded td, tr.reading-withdrawn td { color: #56636e; }
tr.reading-superseded td:nth-child(4), tr.reading-withdrawn td:nth-child(4) { text-decoration: line-through; }
.columns { display: grid; grid-template-columns: repeat(auto-fit, minmax(26rem, 1fr)); gap: 0 1rem; }
dl.facts { display: grid; grid-template-columns: repeat(auto-fill, minmax(16rem, 1fr)); gap: 0.25rem 1rem; margin: 0; }
dl.facts dt { font-size: 0.85rem; color: #56636e; }
dl.facts dd { margin: 0 0 0.4rem; }
.decisions blockquote { margin: 0.25rem 0 0.25rem 1rem; font-style: italic; }
.choice { display: flex; gap: 0.5rem; align-items: center; }
.caution { border: 2px solid #6b4e00; background: #fffbea; padding: 0.75rem 1rem; margin: 1rem 0; }
.caution h2 { margin-top: 0; font-size: 1.1rem; }
.caution-inline { background: #fffbea; border-left: 4px solid #6b4e00; padding: 0.5rem; }
.fat-below { color: #8a1c1c; }
/* Strip chart (server-rendered SVG): shape and ring carry the verdict as well as colour. */
figure.strip { margin: 0.5rem 0; overflow-x: auto; }
.strip-svg { max-width: 100%; height: auto; font-size: 12px; }
.strip-svg .lane-bg { fill: #f7f9fb; stroke: #d5dce3; }
.strip-svg .gridline { stroke: #e3e8ed; }
.strip-svg .tick, .strip-svg .axis-title { fill: #56636e; }
.strip-svg .lane-title { fill: #1d2b36; font-weight: 600; }
.strip-svg .axis { stroke: #56636e; }
.strip-svg .limit line, .strip-svg .limit-tick { stroke-width: 1.5; }
.strip-svg .limit text { font-size: 11px; }
.strip-svg .limit-B line, .strip-svg .limit-tick.limit-B { stroke: #1d5a2c; }
.strip-svg .limit-C line, .strip-svg .limit-tick.limit-C { stroke: #0b4f8a; stroke-dasharray: 6 3; }
.strip-svg .limit-D line, .strip-svg .limit-tick.limit-D { stroke: #6b4e00; stroke-dasharray: 2 3; }
.strip-svg .limit-B text { fill: #1d5a2c; } .strip-svg .limit-C text { fill: #0b4f8a; } .strip-svg .limit-D text { fill: #6b4e00; }
.strip-svg .pt-ok { fill: #1d5a2c; }
.strip-svg .pt-below { fill: #8a1c1c; }
.strip-svg .pt-ring { fill: none; stroke: #8a1c1c; stroke-width: 2; }
.strip-svg .pt-span { stroke: #56636e; stroke-width: 3; }
/* The inspection report. */
.report { background: #fff; padding: 1rem; margin-bottom: 2rem; }
.report h1 { font-size: 1.3rem; margin: 0 0 0.5rem; }
.report h2 { font-size: 1.05rem; margin: 1rem 0 0.4rem; border-bottom: 1px solid #1d2b36; }
.report table { font-size: 0.85rem; }
.report th, .report td { padding: 0.25rem 0.35rem; }
.report .source { color: #56636e; font-size: 0.75rem; font-weight: normal; }
.report-head { display: grid; grid-template-columns: minmax(0, 3fr) minmax(0, 2fr); gap: 1rem; }
.signatures { display: grid; grid-template-columns: 1fr 1fr; gap: 1rem; }
.signatures div { border-top: 1px solid #1d2b36; padding-top: 0.25rem; min-height: 3rem; }
.print-only { display: none; }
@page { size: A4; margin: 16mm 12mm 18mm;
  @bottom-left { content: "Beadbook inspection report"; font: 9pt system-ui, sans-serif; color: #56636e; }
  @bottom-right { content: "Page " counter(page) " of " counter(pages); font: 9pt system-ui, sans-serif; } }
@media print {
  :root { background: #fff; }
  header.site, .no-print, .links, .exports { display: none; }
  .print-only { display: block; }
  main { padding: 0; max-width: none; }
  .panel { border: 0; padding: 0; margin: 0.5rem 0; }
  .report { padding: 0; margin: 0; }
  .report + .report { break-before: page; }
  .report h2 { break-after: avoid; }
  tr, figure, .caution, .signatures { break-inside: avoid; }
  a { color: inherit; text-decoration: none; }
  .row-below, .mismatch-row { background: none; }
}
`;
