// Renders the stage report's chart specifications (Vega-Lite JSON) as SVG
// files, headless, with the same library the HTML report embeds.
//
//   node render-svg.js CHARTS.json OUTDIR
//
// CHARTS.json is an array of {"file": "<name>.svg", "spec": {...}}. Each file
// is written into OUTDIR; any failure exits non-zero naming the chart.
'use strict';
const fs = require('fs');
const path = require('path');
const vega = require('vega');
const vegaLite = require('vega-lite');

async function render(chart, outdir) {
  const compiled = vegaLite.compile(chart.spec).spec;
  const view = new vega.View(vega.parse(compiled), {renderer: 'none'});
  const svg = await view.toSVG();
  view.finalize();
  fs.writeFileSync(path.join(outdir, chart.file), svg);
}

async function main() {
  const [chartsFile, outdir] = process.argv.slice(2);
  if (!chartsFile || !outdir) {
    console.error('usage: node render-svg.js CHARTS.json OUTDIR');
    process.exit(2);
  }
  const charts = JSON.parse(fs.readFileSync(chartsFile, 'utf8'));
  for (const chart of charts) {
    try {
      await render(chart, outdir);
    } catch (error) {
      console.error(`${chart.file}: ${error.message}`);
      process.exit(1);
    }
  }
}

main();
