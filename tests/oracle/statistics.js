// Independent statistics oracle for the C# analysis tests (tests/BatchReconcile.Analysis.Tests).
// Reads {"cases": [{"a": [...], "b": [...], "confidence": 0.95, "baselineStart": 0, "baselineCount": 20}]}
// on stdin and writes one result object per case to stdout.
//
// Means and sample standard deviations come from two npm packages (simple-statistics 7.12.1 and jstat
// 1.9.6, versions pinned in package-lock.json). jstat's Student t functions (studentt.cdf, studentt.inv)
// stop their incomplete-beta continued fraction at about 3e-7 relative, too coarse for a 1e-9 comparison,
// so the t tail used here is computed by a different method from the C# one: the tail written as an
// integral over an angle, P(T > s) = ∫_0^φ sin^(ν-1)(u) du / (2 ∫_0^(π/2) sin^(ν-1)(u) du) with
// φ = atan(√ν / s) (substituting x = √ν cot u in the t density), integrated by tanh-sinh quadrature
// (Takahasi and Mori 1974), which copes with the u^(ν-1) end-point behaviour when ν < 2. Quantiles solve
// that tail by Newton's method started from jstat's studentt.inv. jstat's raw values are reported too,
// and the C# test holds them to a looser tolerance.
'use strict';
function load(name) {
  try {
    return require(name);
  } catch (error) {
    process.stderr.write(`npm package ${name} is not installed (${error.code}): run \`npm ci --prefix tests/oracle\` from the repository root\n`);
    process.exit(1);
  }
}

// Loaded once stdin has been read, so that a missing package is reported rather than a broken pipe.
let ss;
let jStat;

// ∫_0^c f(u, c - u) du by tanh-sinh quadrature; each level halves the step and adds the new nodes.
function tanhSinh(f, c) {
  const half = c / 2;
  let h = 0.5;
  let sum = 0;
  let previous = NaN;
  for (let level = 0; level < 12; level++) {
    const first = level === 0 ? 0 : 1;
    const stride = level === 0 ? 1 : 2;
    for (let k = first; k * h <= 4.5; k += stride) {
      for (const ts of k === 0 ? [0] : [k * h, -k * h]) {
        const v = (Math.PI / 2) * Math.sinh(ts);
        // u = c / (1 + e^(-2v)) and c - u = c / (1 + e^(2v)): neither end loses digits.
        const u = c / (1 + Math.exp(-2 * v));
        const rest = c / (1 + Math.exp(2 * v));
        const cv = Math.cosh(v);
        const w = half * (Math.PI / 2) * Math.cosh(ts) / (cv * cv);
        if (u > 0 && rest > 0 && w > 0) sum += w * f(u, rest);
      }
    }
    const estimate = sum * h;
    if (level > 2 && Math.abs(estimate - previous) <= 1e-15 * Math.abs(estimate)) return estimate;
    previous = estimate;
    h /= 2;
  }
  return previous;
}

// 2 ∫_0^(π/2) sin^(ν-1)(u) du = B(ν/2, 1/2), with sin(u) = cos(π/2 - u) taken from the exact remainder.
function whole(nu) {
  return 2 * tanhSinh((u, rest) => Math.exp((nu - 1) * Math.log(u < Math.PI / 4 ? Math.sin(u) : Math.cos(rest))),
    Math.PI / 2);
}

// ln P(T > s) for s >= 0.
function logTail(s, nu) {
  const phi = Math.atan2(Math.sqrt(nu), s);
  const lnSinPhi = Math.log(Math.sin(phi));
  // Scale the integrand by sin(phi)^(nu-1) so it is at most about 1 on [0, phi].
  const part = tanhSinh((u) => Math.exp((nu - 1) * (Math.log(Math.sin(u)) - lnSinPhi)), phi);
  return Math.log(part) + (nu - 1) * lnSinPhi - Math.log(whole(nu));
}

function tail(s, nu) {
  return s >= 0 ? Math.exp(logTail(s, nu)) : 1 - Math.exp(logTail(-s, nu));
}

// Density by the same normalisation: f(s) = (1 + s²/ν)^(-(ν+1)/2) / (√ν · 2 ∫_0^(π/2) sin^(ν-1)).
function logDensity(s, nu) {
  return -(nu + 1) / 2 * Math.log1p((s * s) / nu) - 0.5 * Math.log(nu) - Math.log(whole(nu));
}

// t with P(T <= t) = p, p > 0.5 here (upper quantiles only are needed).
function quantile(p, nu) {
  const q = 1 - p;
  const lnQ = Math.log(q);
  let s = jStat.studentt.inv(p, nu);
  for (let i = 0; i < 50; i++) {
    const lt = logTail(s, nu);
    const slope = -Math.exp(logDensity(s, nu) - lt);
    const next = s - (lt - lnQ) / slope;
    if (Math.abs(next - s) <= 1e-15 * Math.abs(next)) return next;
    s = next;
  }
  return s;
}

function welch(a, b, confidence) {
  const ma = ss.mean(a), mb = ss.mean(b);
  const va = ss.sampleVariance(a), vb = ss.sampleVariance(b);
  if (va === 0 && vb === 0) return null;
  const ua = va / a.length, ub = vb / b.length;
  const se = Math.sqrt(ua + ub);
  const df = (ua + ub) ** 2 / (ua * ua / (a.length - 1) + ub * ub / (b.length - 1));
  const diff = mb - ma;
  const t = diff / se;
  const p = Math.min(1, 2 * Math.exp(logTail(Math.abs(t), df)));
  const tq = quantile((1 + confidence) / 2, df);
  return {
    difference: diff, standardError: se, t, df, p, low: diff - tq * se, high: diff + tq * se,
    pJstat: 2 * (1 - jStat.studentt.cdf(Math.abs(t), df)),
  };
}

function individuals(values, start, count) {
  const base = values.slice(start, start + count);
  const ranges = base.slice(1).map((v, i) => Math.abs(v - base[i]));
  const mean = ss.mean(base);
  const mrBar = ss.mean(ranges);
  const sigma = mrBar / 1.128;
  return { mean, mrBar, sigma, ucl: mean + 3 * sigma, lcl: mean - 3 * sigma, mrUcl: 3.267 * mrBar };
}

function main() {
  let input = '';
  process.stdin.setEncoding('utf8');
  process.stdin.on('data', (chunk) => { input += chunk; });
  process.stdin.on('end', () => run(input));
}

function run(input) {
  ss = load('simple-statistics');
  ({ jStat } = load('jstat'));
  const { cases } = JSON.parse(input);
  const results = cases.map((c) => {
    const n = c.a.length;
    const sd = ss.sampleStandardDeviation(c.a);
    const tq = quantile((1 + c.confidence) / 2, n - 1);
    const mean = ss.mean(c.a);
    return {
      mean,
      meanJstat: jStat.mean(c.a),
      sd,
      sdJstat: jStat.stdev(c.a, true),
      tQuantile: tq,
      tQuantileJstat: jStat.studentt.inv((1 + c.confidence) / 2, n - 1),
      low: mean - tq * sd / Math.sqrt(n),
      high: mean + tq * sd / Math.sqrt(n),
      welch: welch(c.a, c.b, c.confidence),
      chart: individuals(c.a, c.baselineStart, c.baselineCount),
    };
  });
  process.stdout.write(JSON.stringify(results));
}

if (require.main === module) main();
else {
  ss = load('simple-statistics');
  ({ jStat } = load('jstat'));
}
module.exports = { tail, quantile };
