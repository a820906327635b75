// Independent molar-mass oracle for the C# formula tests.
// Reads a JSON array of formulas on stdin and writes a JSON array of the same length to stdout:
// the average molar mass mf-parser computes for each formula, or null where it cannot read it.
// Feed it only plain notation: mf-parser reads '[...]' as isotope notation and a '.' after a count
// as a decimal point, so hydrates must be written with parentheses, e.g. CuSO4(H2O)5.
'use strict';
const { MF } = require('mf-parser');

let input = '';
process.stdin.setEncoding('utf8');
process.stdin.on('data', (chunk) => { input += chunk; });
process.stdin.on('end', () => {
  const formulas = JSON.parse(input);
  const masses = formulas.map((formula) => {
    try {
      const mass = new MF(formula).getInfo().mass;
      return Number.isFinite(mass) ? mass : null;
    } catch {
      return null;
    }
  });
  process.stdout.write(JSON.stringify(masses));
});
