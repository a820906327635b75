// Independent element-weight oracle for the C# periodic-table tests.
// Writes a JSON object to stdout: element symbol -> the average atomic mass the npm package
// chemical-elements (cheminfo; exact version in package-lock.json) carries for that element.
// The package computes that mass from one representative isotopic composition, so it is not the
// CIAAW standard atomic weight itself; the C# test knows which elements differ and why.
'use strict';
const { elements } = require('chemical-elements');

const weights = {};
for (const element of elements) {
  if (Number.isFinite(element.mass)) weights[element.symbol] = element.mass;
}
process.stdout.write(JSON.stringify(weights));
