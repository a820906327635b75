#!/usr/bin/env python3
"""Benchmark peer for issue 12: a short script doing the job of `batchreconcile ingest FOLDER` on the
same files, to compare throughput with (bench/README.md). It is NOT a second implementation: nothing
depends on it, it is not maintained beyond the benchmark, and its figures are not checked against the
program's. Standard library only, written from docs/export-format.md and docs/computation.md.

Per file: SHA-256, parse and check every row (columns, recipe/version/step/material codes from
config/processes, entries, units, numbers, assays, UTC offsets), reconcile each step of each batch
(limiting reactant from the balanced equation and molar masses, theoretical and actual kg, yield,
equivalents, mass in/out, vented estimate, gap, closure; flags yield-low/-high/-over-theory,
balance-gap/-surplus, reactant-missing, equivalents-out-of-range), then in ONE transaction with
synchronous=FULL insert the file, its rows, step figures and flags, and move the file to the archive
(a bad file: nothing stored, moved to quarantine with a report). Left out: solutions (`composition`),
revisions, the audit chain, production days, loss ladder, digests.

usage: reconcile.py FOLDER --processes config/processes --data DIR   (DIR/peer.db, DIR/archive, DIR/quarantine)
"""
import csv, hashlib, io, json, math, os, re, sqlite3, sys

WEIGHTS = {"H": 1.008, "C": 12.011, "N": 14.007, "O": 15.999, "Na": 22.990, "S": 32.06, "Cl": 35.45, "Pd": 106.42}
UNITS = {"kg": 1.0, "g": 1e-3, "mg": 1e-6, "t": 1e3, "lb": 0.45359237}
ENTRIES = {"charge", "product", "waste", "recovered", "sample", "analysis"}
NUMBER = re.compile(r"^[+-]?(\d+\.?\d*|\.\d+)$")
OFFSET = re.compile(r"^\d{4}-\d\d-\d\dT\d\d:\d\d(:\d\d)?(\.\d+)?(Z|[+-]\d\d:\d\d)$")
REL_U, ABS_U, K, ABS_TOL = 0.001, 0.05, 2.0, 1e-9   # config/appsettings.json, Reconciliation section

def molar_mass(formula):
    total = 0.0
    for part in formula.split("·"):                       # hydrates and salts: C4H10N2·2HCl
        m = re.match(r"^(\d*)(.*)$", part)
        mult, body = int(m.group(1) or 1), m.group(2)
        if re.sub(r"([A-Z][a-z]?)(\d*)", "", body):
            raise ValueError("formula not understood: " + formula)
        total += mult * sum(WEIGHTS[el] * int(n or 1) for el, n in re.findall(r"([A-Z][a-z]?)(\d*)", body))
    return total

def side(text):
    return [(float(m.group(1) or 1), m.group(2).upper()) for m in (re.match(r"^\s*(\d*\.?\d*)\s*(\S+)\s*$", t) for t in text.split("+"))]

def load(folder):
    materials, recipes = {}, {}
    for name in sorted(os.listdir(folder)):
        with open(os.path.join(folder, name), encoding="utf-8") as f:
            d = json.load(f)
        for m in d["materials"]:
            materials[m["code"].upper()] = {"M": molar_mass(m["formula"]), "vented": m.get("vented", False)}
        for r in d["recipes"]:
            recipes.setdefault(r["code"].upper(), {})[r["version"]] = r
    for versions in recipes.values():
        for r in versions.values():
            for s in r["steps"]:
                left, right = s["reaction"].split("->")
                s["left"], s["right"] = side(left), side(right)
    return materials, recipes

def check(path, data, materials, recipes):
    """Returns (rows, errors); a row is a dict with the parsed numbers added."""
    errors, rows = [], []
    text = data.decode("utf-8-sig")                       # UnicodeDecodeError: refused by the caller
    reader = csv.reader(io.StringIO(text, newline=""))
    header = [h.strip().lower() for h in next(reader, [])]
    for need in ("batch", "recipe", "step", "entry"):
        if need not in header:
            errors.append(f"line 1: required column '{need}' missing")
    if errors:
        return rows, errors
    for line, fields in enumerate(reader, start=2):
        if not fields:
            continue
        if len(fields) != len(header):
            errors.append(f"line {line}: {len(fields)} fields, header has {len(header)}"); continue
        r = {h: v.strip() for h, v in zip(header, fields)}
        bad = lambda col, why: errors.append(f"line {line}, column {col}: '{r.get(col, '')[:80]}' {why}")
        versions = recipes.get(r["recipe"].upper())
        if versions is None:
            bad("recipe", "is not a known recipe"); continue
        v = r.get("recipe_version", "")
        if v and (not v.isdigit() or int(v) not in versions):
            bad("recipe_version", "is not a version of the recipe"); continue
        r["version"] = int(v) if v else max(versions)   # simplification: newest, no effective-date lookup
        step = next((s for s in versions[r["version"]]["steps"] if s["code"].upper() == r["step"].upper()), None)
        if step is None:
            bad("step", "is not a step of the recipe"); continue
        r["def"], entry, mat = step, r["entry"].lower(), r.get("material", "").upper()
        r["entry"], r["material"] = entry, mat
        if entry not in ENTRIES:
            bad("entry", "is not an entry kind")
        if mat and mat not in materials:
            bad("material", "is not a known material")
        if not mat and entry in ("charge", "product", "recovered", "analysis"):
            bad("material", "is required for this entry")
        q, unit, assay = r.get("quantity", ""), r.get("unit", "").lower(), r.get("assay_pct", "")
        if entry == "analysis":
            if q or unit:
                bad("quantity", "must be empty on an analysis row")
        elif not NUMBER.match(q) or float(q) < 0:
            bad("quantity", "is not a number >= 0 with a '.' decimal point")
        elif unit not in UNITS:
            bad("unit", "is not one of kg, g, mg, t, lb")
        else:
            r["kg"] = float(q) * UNITS[unit]
            if r["kg"] > 1e6:
                bad("quantity", "is over 1,000 t")
        if assay and (not NUMBER.match(assay) or not 0 < float(assay) <= 100):
            bad("assay_pct", "is not in (0, 100]")
        r["assay"] = float(assay) if assay and NUMBER.match(assay) else None
        if r.get("recorded_at") and not OFFSET.match(r["recorded_at"]):
            bad("recorded_at", "is not an ISO 8601 time with a UTC offset")
        r["line"] = line
        rows.append(r)
    if not rows and not errors:
        errors.append("no data rows")
    return rows, errors

def reconcile(step, rows, materials):
    """The figures and flags of one step (docs/computation.md)."""
    pure = lambda r, default: r.get("kg", 0.0) * (r["assay"] if r["assay"] is not None else default) / 100
    charges = [r for r in rows if r["entry"] == "charge"]
    moles = {c: sum(pure(r, 100) for r in charges if r["material"] == c) / materials[c]["M"] for _, c in step["left"]}
    nu_p = next(nu for nu, c in step["right"] if c == step["product"].upper())
    m_p = materials[step["product"].upper()]["M"]
    m_act = sum(pure(r, 100) for r in rows if r["entry"] == "product" and r["material"] == step["product"].upper())
    m_in = sum(r["kg"] for r in charges)
    m_out = sum(r["kg"] for r in rows if r["entry"] in ("product", "waste", "recovered", "sample"))
    u = math.sqrt(sum((REL_U * r["kg"]) ** 2 + ABS_U ** 2 for r in rows if "kg" in r))
    vent_per_xi = sum(nu * materials[c]["M"] for nu, c in step["right"] if materials[c]["vented"])
    f, limiting, xi = {"m_act": m_act, "m_in": m_in, "m_out": m_out}, None, None
    missing = [c for c, n in moles.items() if n == 0]
    flags = [("reactant-missing", None, None, f"reactant {c} was not charged") for c in missing]
    if not missing:
        limiting = min(step["left"], key=lambda p: moles[p[1]] / p[0])[1]     # min() keeps the first on a tie
        xi = moles[limiting] / next(nu for nu, c in step["left"] if c == limiting)
        f["theoretical"] = xi * nu_p * m_p
        f["yield"] = y = 100 * m_act / f["theoretical"]
        lo, hi = step["yieldPct"]["min"], step["yieldPct"]["max"]
        if y > 100 * (1 + ABS_TOL):
            flags.append(("yield-over-theory", y, 100.0, "yield above theoretical: check drying, assay and weighings"))
        elif y > hi * (1 + ABS_TOL):
            flags.append(("yield-high", y, hi, "yield above the recipe's range"))
        elif y < lo * (1 - ABS_TOL):
            flags.append(("yield-low", y, lo, "yield below the recipe's range: look for product in the liquors"))
        for c, rng in step.get("equivalents", {}).items():
            eq = moles.get(c.upper(), sum(pure(r, 100) for r in charges if r["material"] == c.upper()) / materials[c.upper()]["M"]) / moles[limiting]
            if eq < rng["min"] * (1 - ABS_TOL) or eq > rng["max"] * (1 + ABS_TOL):
                flags.append(("equivalents-out-of-range", eq, rng["min"] if eq < rng["min"] else rng["max"], f"{c} charged at {eq:.2f} equiv"))
    xi_act = m_act / (nu_p * m_p)
    f["vented"] = vented = xi_act * vent_per_xi
    vent_range = max(0.0, (xi or xi_act) - xi_act) * vent_per_xi
    f["gap"] = gap = m_in - m_out - vented
    f["closure"] = 100 * (m_out + vented) / m_in if m_in else None
    tol = step["balanceTolerancePct"] / 100 * m_in
    if gap - vent_range > max(tol, K * u):
        flags.append(("balance-gap", gap - vent_range, max(tol, K * u), f"{gap:.1f} kg not accounted for"))
    elif -gap > max(tol, K * u):
        flags.append(("balance-surplus", gap, -max(tol, K * u), f"outputs exceed inputs by {-gap:.1f} kg"))
    return limiting, f, flags

SCHEMA = """
CREATE TABLE IF NOT EXISTS file (id INTEGER PRIMARY KEY, name TEXT, sha256 TEXT UNIQUE, rows INTEGER);
CREATE TABLE IF NOT EXISTS row (file INTEGER, line INTEGER, batch TEXT, recipe TEXT, version INTEGER, step TEXT,
  entry TEXT, material TEXT, stream TEXT, kg REAL, assay REAL, lot TEXT, recorded_at TEXT);
CREATE TABLE IF NOT EXISTS step (id INTEGER PRIMARY KEY, file INTEGER, batch TEXT, recipe TEXT, version INTEGER,
  step TEXT, limiting TEXT, theoretical_kg REAL, actual_kg REAL, yield_pct REAL, in_kg REAL, out_kg REAL,
  vented_kg REAL, gap_kg REAL, closure_pct REAL, UNIQUE (batch, step));
CREATE TABLE IF NOT EXISTS flag (step INTEGER, code TEXT, measured REAL, lim REAL, message TEXT);
"""

def ingest(path, db, materials, recipes, archive, quarantine):
    with open(path, "rb") as f:
        data = f.read()
    sha = hashlib.sha256(data).hexdigest()
    name = os.path.basename(path)
    if db.execute("SELECT 1 FROM file WHERE sha256 = ?", (sha,)).fetchone():
        os.replace(path, os.path.join(archive, name)); return "duplicate"
    try:
        rows, errors = check(path, data, materials, recipes)
    except UnicodeDecodeError as e:
        rows, errors = [], [f"not UTF-8 at byte {e.start}"]
    if errors:
        with open(os.path.join(quarantine, name + ".report.txt"), "w", encoding="utf-8") as f:
            f.write("\n".join(errors) + "\n")
        os.replace(path, os.path.join(quarantine, name)); return "quarantined"
    with db:                                              # one transaction per file
        fid = db.execute("INSERT INTO file (name, sha256, rows) VALUES (?, ?, ?)", (name, sha, len(rows))).lastrowid
        db.executemany("INSERT INTO row VALUES (?,?,?,?,?,?,?,?,?,?,?,?,?)", [
            (fid, r["line"], r["batch"], r["recipe"], r["version"], r["step"], r["entry"], r["material"],
             r.get("stream", ""), r.get("kg"), r["assay"], r.get("lot", ""), r.get("recorded_at", "")) for r in rows])
        steps = {}
        for r in rows:
            steps.setdefault((r["batch"], r["recipe"], r["version"], r["def"]["code"]), (r["def"], []))[1].append(r)
        for (batch, recipe, version, code), (step, srows) in steps.items():
            limiting, f, flags = reconcile(step, srows, materials)
            sid = db.execute("INSERT OR REPLACE INTO step VALUES (NULL,?,?,?,?,?,?,?,?,?,?,?,?,?,?)", (
                fid, batch, recipe, version, code, limiting, f.get("theoretical"), f["m_act"], f.get("yield"),
                f["m_in"], f["m_out"], f["vented"], f["gap"], f["closure"])).lastrowid
            db.executemany("INSERT INTO flag VALUES (?,?,?,?,?)", [(sid,) + fl for fl in flags])
    os.replace(path, os.path.join(archive, name))         # after the commit, as the program does
    return "stored"

def main(argv):
    folder, opts = argv[0], dict(zip(argv[1::2], argv[2::2]))
    materials, recipes = load(opts["--processes"])
    data = opts["--data"]
    archive, quarantine = os.path.join(data, "archive"), os.path.join(data, "quarantine")
    os.makedirs(archive, exist_ok=True); os.makedirs(quarantine, exist_ok=True)
    db = sqlite3.connect(os.path.join(data, "peer.db"), isolation_level=None)
    db.execute("PRAGMA journal_mode = WAL"); db.execute("PRAGMA synchronous = FULL")
    db.executescript(SCHEMA)
    db.isolation_level = ""                               # `with db:` opens and commits a transaction
    counts = {}
    for name in sorted(os.listdir(folder)):
        if name.startswith(".") or name.endswith((".part", ".tmp")):
            continue
        outcome = ingest(os.path.join(folder, name), db, materials, recipes, archive, quarantine)
        counts[outcome] = counts.get(outcome, 0) + 1
    print(", ".join(f"{n} {k}" for k, n in sorted(counts.items())))
    return 3 if counts.get("quarantined") else 0

if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
