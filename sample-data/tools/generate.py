#!/usr/bin/env python3
"""Generate the demo batch-record exports of Kestrel Bay Fine Chemicals, Building 3 (invented plant).

Standard library only, deterministic: the same run writes the same bytes.

    python3 sample-data/tools/generate.py            # write sample-data/inbox/*.csv and history/*.csv, update README, print report
    python3 sample-data/tools/generate.py --check    # write nothing; exit 1 if any committed file differs

The scenario is data (SCHEDULE, the per-batch dicts below). Each batch is built from a simple plant
model (charges, conversion, yield, product left in liquors, unweighed losses such as vented gas,
solvent vapour and hold-up); the waste streams close the balance. Every quantity is rounded to what
the export prints *before* anything downstream uses it, and the report is then computed from the
rows as written, the way the reconciliation spec describes it, so the printed expectations are the
figures the engine should reproduce. The script asserts that the flags it computes are the flags the
scenario intends for each batch.

The data are invented for the demo. Hazards (hydrogenation, HCl, vented isobutylene and CO2,
toluene and ethanol) are handled by site procedures; these figures support, not replace, qualified review.
"""

from __future__ import annotations

import math
import os
import random
import re
import sys
from dataclasses import dataclass, field
from datetime import datetime, timedelta, timezone

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)  # sample-data/
INBOX = os.path.join(ROOT, "inbox")
HISTORY = os.path.join(ROOT, "history")
README = os.path.join(ROOT, "README.md")

# --------------------------------------------------------------------------------------------------
# Chemistry data
# --------------------------------------------------------------------------------------------------

# Standard atomic weights, CIAAW 2021, abridged (IUPAC Periodic Table of the Elements, 2022),
# conventional single values for elements published as intervals.
ATOMIC_WEIGHT = {"H": 1.008, "C": 12.011, "N": 14.007, "O": 15.999, "Na": 22.990,
                 "S": 32.06, "Cl": 35.45, "Pd": 106.42}

# Formulas as in config/processes/*.json; adducts written out (C6H15N·HCl = C6H16ClN).
FORMULA = {
    # BZC-410
    "NBA": "C7H5NO4", "ETOH": "C2H6O", "H2SO4": "H2SO4", "ENB": "C9H9NO4", "WATER": "H2O",
    "NAHCO3": "NaHCO3", "H2": "H2", "PDC": "Pd", "BZC": "C9H11NO2",
    # PPZ-220
    "BOCPZ": "C9H18N2O2", "HCL": "HCl", "IPA": "C3H8O", "PPZ2HCL": "C4H12Cl2N2",
    "CO2": "CO2", "IBE": "C4H8",
    # NBB-150
    "BZCL": "C7H5ClO", "BNA": "C7H9N", "TEA": "C6H15N", "TOL": "C7H8", "NBB": "C14H13NO",
    "TEAHCL": "C6H16ClN", "PW": "H2O",
}


def molar_mass(formula: str) -> float:
    total = 0.0
    for el, count in re.findall(r"([A-Z][a-z]?)(\d*)", formula):
        total += ATOMIC_WEIGHT[el] * (int(count) if count else 1)
    return total


M = {code: molar_mass(f) for code, f in FORMULA.items()}


@dataclass(frozen=True)
class Step:
    recipe: str
    code: str
    reactants: dict          # code -> coefficient
    product: str
    nu_product: int
    vented: dict             # code -> coefficient (species leaving as gas, never weighed)
    yield_min: float
    yield_max: float
    tolerance_pct: float
    equivalents: dict        # code -> (min, max)


# The recipes as config/processes/*.json defines them.
RECIPES = {
    "BZC-410": [
        Step("BZC-410", "S1", {"NBA": 1, "ETOH": 1}, "ENB", 1, {}, 85, 96, 2.0, {"ETOH": (8.0, 14.0)}),
        Step("BZC-410", "S2", {"ENB": 1, "H2": 3}, "BZC", 1, {}, 88, 98, 2.0, {"H2": (3.0, 3.6)}),
    ],
    "PPZ-220": [
        Step("PPZ-220", "S1", {"BOCPZ": 1, "HCL": 2}, "PPZ2HCL", 1, {"CO2": 1, "IBE": 1}, 90, 99, 1.5,
             {"HCL": (2.0, 3.0)}),
    ],
    "NBB-150": [
        Step("NBB-150", "S1", {"BZCL": 1, "BNA": 1, "TEA": 1}, "NBB", 1, {}, 86, 97, 2.0,
             {"BNA": (1.0, 1.15), "TEA": (1.05, 1.4)}),
    ],
}

# Version 2 of BZC-410 (config/processes/benzocaine.json, effectiveFrom 2026-10-26): less ethanol in the
# esterification (about 8.6 instead of about 10 equivalents) and the sulfuric acid charge given a range.
BZC_V2_FROM = "2026-10-26"
RECIPES_V2 = {
    "BZC-410": [
        Step("BZC-410", "S1", {"NBA": 1, "ETOH": 1}, "ENB", 1, {}, 85, 96, 2.0,
             {"ETOH": (7.5, 10.0), "H2SO4": (0.08, 0.12)}),
        RECIPES["BZC-410"][1],
    ],
}


def recipe_steps(recipe: str, version: int) -> list:
    return RECIPES_V2[recipe] if version == 2 else RECIPES[recipe]


# Site balance settings (config/appsettings.json).
U_REL, U_ABS, K_COVER, PIW_MAX = 0.001, 0.05, 2.0, 2.0

UNIT_KG = {"kg": 1.0, "g": 1e-3, "mg": 1e-6, "t": 1e3, "lb": 0.45359237}
CET = timezone(timedelta(hours=1))  # Europe/Berlin in November: UTC+01:00
CEST = timezone(timedelta(hours=2))  # Europe/Berlin in summer time, until 2026-10-25 03:00 local
DAY_START_H = 6


def at(text: str) -> datetime:
    """'2026-11-23 06:40' local plant time (summer time before 2026-10-25 03:00, as Europe/Berlin)."""
    local = datetime.strptime(text, "%Y-%m-%d %H:%M")
    return local.replace(tzinfo=CEST if local < datetime(2026, 10, 25, 3, 0) else CET)


def fmt(x: float, dec: int) -> str:
    s = f"{x:.{dec}f}"
    return "0" if s.strip("-0.") == "" and dec == 0 else s


# --------------------------------------------------------------------------------------------------
# Rows
# --------------------------------------------------------------------------------------------------

@dataclass
class Row:
    batch: str
    recipe: str
    step: str
    entry: str
    material: str = ""
    stream: str = ""
    quantity: str = ""
    unit: str = ""
    assay_pct: str = ""
    lot: str = ""
    recorded_at: str = ""
    extra: dict = field(default_factory=dict)
    version: str = "1"

    @property
    def kg(self) -> float:
        return float(self.quantity) * UNIT_KG[self.unit] if self.quantity else 0.0

    @property
    def assay(self) -> float | None:
        return float(self.assay_pct) if self.assay_pct else None


class StepWriter:
    """Adds rows of one step; every quantity is rounded as printed and the rounded value returned."""

    def __init__(self, batch: str, recipe: str, step: str, t0: datetime, version: int = 1):
        self.batch, self.recipe, self.step, self.t0, self.version = batch, recipe, step, t0, str(version)
        self.rows: list[Row] = []

    def _time(self, h: float) -> str:
        t = self.t0 + timedelta(minutes=round(h * 60))
        return at(t.strftime("%Y-%m-%d %H:%M")).isoformat()

    def add(self, entry, material="", kg=None, dec=1, unit="kg", assay=None, assay_dec=1, lot="",
            stream="", h=0.0, qty_text=None) -> float:
        if entry == "analysis":
            q = ""
        elif qty_text is not None:
            q = qty_text
        else:
            q = fmt(kg / UNIT_KG[unit], dec)
        a = "" if assay is None else (assay if isinstance(assay, str) else fmt(assay, assay_dec))
        row = Row(self.batch, self.recipe, self.step, entry, material, stream, q,
                  unit if q else "", a, lot, self._time(h), version=self.version)
        self.rows.append(row)
        return row.kg

    def analysis(self, stream, material, pct, h, dec=2):
        self.add("analysis", material, assay=pct, assay_dec=dec, stream=stream, h=h)


def fill_drums(total: float, drum: float, dec: int = 1) -> list[float]:
    """Product filled evenly into as few drums of at most `drum` kg as it needs, rounded as printed."""
    total = round(total, dec)
    count = max(1, math.ceil(total / drum))
    each = round(total / count, dec)
    return [each] * (count - 1) + [round(total - each * (count - 1), dec)]


def split_drums(total: float, drum: float, dec: int = 1) -> list[float]:
    """Full drums of `drum` kg and a last part-drum, rounded as printed, summing to the rounded total."""
    total = round(total, dec)
    parts = []
    while total - drum > drum * 0.15:
        parts.append(drum)
        total = round(total - drum, dec)
    parts.append(total)
    return parts


# --------------------------------------------------------------------------------------------------
# Plant models
# --------------------------------------------------------------------------------------------------

def build_bzc(b: dict) -> tuple[list[Row], dict]:
    """BZC-410: S1 Fischer esterification NBA + EtOH -> ENB + H2O (H2SO4 cat.), quench in water,
    filtration, bicarbonate and water washes, drying. S2 ENB + 3 H2 -> BZC + 2 H2O over Pd/C in
    ethanol, catalyst filtration, ethanol distilled off for reuse, crystallisation from water."""
    bid = b["id"]
    notes = {}
    s1 = StepWriter(bid, "BZC-410", "S1", at(b["s1_start"]), b["version"])
    nba = s1.add("charge", "NBA", b["nba_kg"], assay=b["nba_assay"], lot=b["nba_lot"], h=0.0)
    n_nba = nba * b["nba_assay"] / 100 / M["NBA"]
    etoh = s1.add("charge", "ETOH", b["etoh_eq"] * n_nba * M["ETOH"] / (b["etoh_assay"] / 100),
                  assay=b["etoh_assay"], lot=b["etoh_lot"], h=0.3)
    h2so4 = s1.add("charge", "H2SO4", b["h2so4_eq"] * n_nba * M["H2SO4"] / 0.98, dec=1, assay=98.0,
                   lot=b["h2so4_lot"], h=0.8)
    quench = s1.add("charge", "WATER", round(3.6 * nba, -1), h=9.5)
    if b.get("nahco3_lb"):
        bicarb = s1.add("charge", "NAHCO3", None, unit="lb", qty_text=fmt(b["nahco3_lb"], 1), assay=99.5,
                        lot=b["nahco3_lot"], h=11.0)
    else:
        bicarb = s1.add("charge", "NAHCO3", b["nahco3_kg"], assay=99.5, lot=b["nahco3_lot"], h=11.0)
    wash_w = s1.add("charge", "WATER", round(1.6 * nba, -1), h=11.05)
    m_in = nba + etoh + h2so4 + quench + bicarb + wash_w
    theo = n_nba * M["ENB"]
    unreacted = (1 - b["s1_conv"]) * n_nba  # kmol NBA left (equilibrium)
    n_bicarb = bicarb * 0.995 / M["NAHCO3"]
    # Bicarbonate wash neutralises unreacted acid and catalyst acid held in the cake: CO2 leaves unweighed.
    co2 = M["CO2"] * min(0.95 * n_bicarb, unreacted + 0.1 * 2 * b["h2so4_eq"] * n_nba)
    evap = 0.008 * b["lossf"] * etoh  # ethanol vapour to the vent condenser / scrubber during quench and filtration
    holdup = 0.001 * b["lossf"] * m_in
    enb_pure = b["s1_yield"] / 100 * theo
    drums = fill_drums(enb_pure / (b["enb_assay"] / 100), 160.0)
    prod = 0.0
    enb_lots = []
    for i, d in enumerate(drums, 1):
        lot = f"ENB-{bid[-4:]}-{i}"
        enb_lots.append((lot, d))
        prod += s1.add("product", "ENB", d, assay=b["enb_assay"], lot=lot, h=14.45 + 0.05 * i)
    sample = s1.add("sample", "ENB", 0.200, dec=3, h=14.6)
    waste = m_in - prod - sample - co2 - evap - holdup - b.get("s1_spill", 0)
    wash_liq = round(wash_w + bicarb * 0.45 + 0.25 * unreacted * M["NBA"], 1)
    ml = round(waste - wash_liq, 1)
    s1.add("waste", "", ml, stream="mother liquor", h=10.8)
    s1.add("waste", "", wash_liq, stream="wash liquor", h=11.6)
    s1.analysis("mother liquor", "ENB", 100 * b["s1_ml_loss"] / 100 * theo / ml, h=12.5)
    s1.analysis("mother liquor", "NBA", 100 * 0.75 * unreacted * M["NBA"] / ml, h=12.5)
    s1.analysis("wash liquor", "ENB", 100 * 0.2 / 100 * theo / wash_liq, h=12.6)
    notes["S1"] = {"unweighed": {"CO2 from bicarbonate wash": co2, "ethanol vapour": evap, "hold-up": holdup}}

    rows = s1.rows
    if b.get("s2_missing"):
        return rows, notes

    s2 = StepWriter(bid, "BZC-410", "S2", at(b["s2_start"]), b["version"])
    enb_in = 0.0
    for i, (lot, d) in enumerate(enb_lots):
        enb_in += s2.add("charge", "ENB", d, assay=b["enb_assay"], lot=lot, h=0.0 + 0.1 * i)
    n_enb = enb_in * b["enb_assay"] / 100 / M["ENB"]
    etoh2 = s2.add("charge", "ETOH", round(4.0 * enb_in, -1), assay=99.5 if not b.get("etoh2_lot", "").startswith("ETOH-R") else 95.8,
                   lot=b["etoh2_lot"], h=0.3)
    pdc = s2.add("charge", "PDC", 0.03 * enb_in, dec=2, lot=b["pdc_lot"], h=0.6)
    h2 = round(b["h2_eq"] * n_enb * M["H2"], 2)  # hydrogen taken up, from the flow totaliser
    if not b.get("drop_h2_row"):
        s2.add("charge", "H2", h2, dec=2, lot=b["h2_lot"], h=4.5)
    cryst_w = s2.add("charge", "WATER", round(2.2 * enb_in, -1), h=8.8)
    wash2 = s2.add("charge", "WATER", round(0.5 * enb_in, -1), h=11.0)
    m_in2_true = enb_in + etoh2 + pdc + h2 + cryst_w + wash2
    theo2 = n_enb * M["BZC"]
    conv2 = b["s2_conv"]
    h2_excess = h2 - 3 * conv2 * n_enb * M["H2"]
    evap2 = 0.003 * b["lossf"] * etoh2
    holdup2 = 0.001 * b["lossf"] * m_in2_true
    bzc_pure = b["s2_yield"] / 100 * theo2
    prod2 = 0.0
    for i, d in enumerate(fill_drums(bzc_pure / (b["bzc_assay"] / 100), 120.0), 1):
        prod2 += s2.add("product", "BZC", d, assay=b["bzc_assay"], lot=f"BZC-{bid[-4:]}-{i}", h=13.75 + 0.05 * i)
    sample2 = s2.add("sample", "BZC", 0.250, unit="g", dec=0, h=13.9)
    cat_waste = s2.add("waste", "", pdc + 0.9 * pdc, stream="spent catalyst", h=5.3)
    rec = s2.add("recovered", "ETOH", 0.86 * etoh2 * 0.995 / 0.955, assay=95.5, lot=b["etoh_rec_lot"], h=8.5)
    ml2 = m_in2_true - prod2 - sample2 - cat_waste - rec - h2_excess - evap2 - holdup2
    ml2 = s2.add("waste", "", ml2, stream="mother liquor", h=11.2)
    s2.analysis("mother liquor", "BZC", 100 * b["s2_ml_loss"] / 100 * theo2 / ml2, h=12.0)
    s2.analysis("mother liquor", "ENB", 100 * (1 - conv2) * n_enb * M["ENB"] / ml2, h=12.0)
    notes["S2"] = {"unweighed": {"excess H2 vented": h2_excess, "ethanol vapour": evap2, "hold-up": holdup2},
                   "h2_charged_kg": h2}
    return rows + s2.rows, notes


def build_ppz(b: dict) -> tuple[list[Row], dict]:
    """PPZ-220: BOCPZ + 2 HCl -> PPZ·2HCl + CO2 + isobutylene, HCl dosed as a solution in propan-2-ol
    (gas evolution controlled by the dosing rate), filtration, IPA wash, drying."""
    bid = b["id"]
    s = StepWriter(bid, "PPZ-220", "S1", at(b["start"]))
    boc = s.add("charge", "BOCPZ", b["boc_kg"], assay=b["boc_assay"], lot=b["boc_lot"], h=0.0)
    n = boc * b["boc_assay"] / 100 / M["BOCPZ"]
    ipa = s.add("charge", "IPA", round(2.0 * boc, -1), assay=99.8, lot=b["ipa_lot"], h=0.3)
    hcl = s.add("charge", "HCL", b["hcl_eq"] * n * M["HCL"] / (b["hcl_assay"] / 100), assay=b["hcl_assay"],
                lot=b["hcl_lot"], h=0.8)
    ipa_w = s.add("charge", "IPA", round(0.6 * boc, -1), assay=99.8, lot=b["ipa_lot"], h=6.5)
    m_in = boc + ipa + hcl + ipa_w
    theo = n * M["PPZ2HCL"]
    conv = b["conv"]
    vent = conv * n * (M["CO2"] + M["IBE"])
    scrub = 0.0025 * b["lossf"] * m_in  # HCl and IPA carried with the off-gas to the scrubber
    dry_pure = b["yld"] / 100 * theo
    wet_ipa = 0.12 * dry_pure  # IPA on the filtered cake
    if b.get("wet_product_pct"):
        gross = dry_pure / (1 - b["wet_product_pct"] / 100)
        assay = None
    else:
        gross = dry_pure / (b["ppz_assay"] / 100)
        assay = b["ppz_assay"]
    drums = fill_drums(gross, 125.0)
    prod = 0.0
    for i, d in enumerate(drums, 1):
        prod += s.add("product", "PPZ2HCL", d, assay=assay, lot=f"PPZ-{bid[-4:]}-{i}", h=10.5 + 0.02 * i)
    sample = s.add("sample", "PPZ2HCL", 0.150, dec=3, h=10.6)
    left_in_product = gross - dry_pure if assay is None else 0.0
    cond = s.add("waste", "", wet_ipa - left_in_product, stream="dryer condensate", h=10.8)
    ml_stream = "mother liquor, incl. IPA wash"
    ml = m_in - prod - sample - cond - vent - scrub
    ml = s.add("waste", "", ml, stream=ml_stream, h=6.8)
    s.analysis(ml_stream, "PPZ2HCL", 100 * b["ml_loss"] / 100 * theo / ml, h=7.5)
    s.analysis(ml_stream, "HCL", 100 * (b["hcl_eq"] - 2 * conv) * n * M["HCL"] / ml, h=7.5)
    notes = {"S1": {"unweighed": {"CO2 + isobutylene vented (at conversion)": vent, "to scrubber": scrub}}}
    return s.rows, notes


def build_nbb(b: dict) -> tuple[list[Row], dict]:
    """NBB-150: BZCL + BNA + TEA -> NBB + Et3N·HCl in toluene (benzoyl chloride dosed at 5-15 °C),
    water washes take out the salt, toluene partly distilled, crystallisation, filtration, toluene wash,
    drying; mother liquor and washes distilled, the toluene recovered in drums, the residue to waste."""
    bid = b["id"]
    s = StepWriter(bid, "NBB-150", "S1", at(b["start"]))
    bzcl_kg = b["bzcl_kg"]
    n = bzcl_kg * b["bzcl_assay"] / 100 / M["BZCL"]  # limiting reactant (design)
    tol_r = s.add("charge", "TOL", round(2.8 * bzcl_kg, -1), assay=99.3, lot=b["tol_r_lot"], h=0.0)
    tol_f = s.add("charge", "TOL", round(2.0 * bzcl_kg, -1), assay=99.8, lot=b["tol_lot"], h=0.1)
    bna = s.add("charge", "BNA", b["bna_eq"] * n * M["BNA"] / (b["bna_assay"] / 100), assay=b["bna_assay"],
                lot=b["bna_lot"], h=0.4)
    tea = s.add("charge", "TEA", b["tea_eq"] * n * M["TEA"] / (b["tea_assay"] / 100), assay=b["tea_assay"],
                lot=b["tea_lot"], h=0.6)
    bzcl = s.add("charge", "BZCL", bzcl_kg, assay=b["bzcl_assay"], lot=b["bzcl_lot"], h=1.0)
    pw1 = s.add("charge", "PW", round(2.4 * bzcl_kg, -1), h=3.3)
    pw2 = s.add("charge", "PW", round(1.0 * bzcl_kg, -1), h=4.3)
    tol_w = s.add("charge", "TOL", round(0.6 * bzcl_kg, -1), assay=99.8, lot=b["tol_lot"], h=7.6)
    m_in = tol_r + tol_f + bna + tea + bzcl + pw1 + pw2 + tol_w
    n = bzcl * b["bzcl_assay"] / 100 / M["BZCL"]
    theo = n * M["NBB"]
    conv = b["conv"]
    salt = conv * n * M["TEAHCL"]
    tea_free = tea * b["tea_assay"] / 100 / M["TEA"] - conv * n
    bna_left = bna * b["bna_assay"] / 100 / M["BNA"] - conv * n
    # Short of base, benzylamine takes the HCl that triethylamine cannot (it ends in the aqueous layer as its salt).
    aq1 = pw1 + salt + 0.6 * max(tea_free, 0) * M["TEA"] + 0.004 * (tol_r + tol_f)
    aq1 = s.add("waste", "", aq1 - b.get("spill_kg", 0), stream="aqueous layer", h=3.9)
    aq2 = s.add("waste", "", pw2 + 0.4 * max(tea_free, 0) * M["TEA"], stream="water wash", h=4.8)
    s.analysis("aqueous layer", "TEAHCL", 100 * salt / (aq1 + b.get("spill_kg", 0)), h=5.0, dec=1)
    nbb_pure = b["yld"] / 100 * theo
    prod = 0.0
    for i, d in enumerate(fill_drums(nbb_pure / (b["nbb_assay"] / 100), 125.0), 1):
        prod += s.add("product", "NBB", d, assay=b["nbb_assay"], lot=f"NBB-{bid[-4:]}-{i}", h=9.6 + 0.02 * i)
    sample = s.add("sample", "NBB", 0.150, dec=3, h=9.7)
    in_residue = b["res_loss"] / 100 * theo
    residue = s.add("waste", "", in_residue + max(bna_left, 0) * M["BNA"] + 0.01 * bzcl_kg + 12.0 + b.get("res_extra", 0),
                    stream="distillation residue", h=9.9)
    s.analysis("distillation residue", "NBB", 100 * in_residue / residue, h=10.2, dec=1)
    evap = 0.004 * b["lossf"] * (tol_r + tol_f + tol_w)
    holdup = 0.001 * b["lossf"] * m_in
    rec_total = m_in - aq1 - b.get("spill_kg", 0) - aq2 - prod - sample - residue - evap - holdup
    drums = split_drums(rec_total, 172.0)
    rec_rows = []
    for i, d in enumerate(drums):
        lot = f"TOL-R-2611-{b['drum0'] + i:03d}"
        s.add("recovered", "TOL", d, assay=99.3, lot=lot, h=6.5 + 0.7 * i)
        rec_rows.append(s.rows[-1])
    if b.get("double_drum"):
        # The same drum booked twice (the export lists it again a few minutes later).
        dup = rec_rows[b["double_drum"]]
        again = (datetime.fromisoformat(dup.recorded_at) + timedelta(minutes=25)).isoformat()
        s.rows.append(Row(**{**dup.__dict__, "extra": {}, "recorded_at": again}))
    notes = {"S1": {"unweighed": {"toluene vapour": evap, "hold-up": holdup, "spill": b.get("spill_kg", 0)}}}
    rows = s.rows
    if b.get("operator"):
        for r in rows:
            r.extra["operator"] = b["operator"]
    return rows, notes


BUILDERS = {"BZC-410": build_bzc, "PPZ-220": build_ppz, "NBB-150": build_nbb}

# --------------------------------------------------------------------------------------------------
# The scenario
# --------------------------------------------------------------------------------------------------

BZC_COMMON = dict(version=1, h2so4_eq=0.10, nba_assay=99.6, etoh_assay=99.8, s1_conv=0.955, s1_yield=92.4, enb_assay=99.4,
                  s2_conv=0.998, s2_yield=94.2, bzc_assay=99.6,
                  nahco3_kg=20.0, h2so4_lot="SA-2610-044", pdc_lot="PDC-2609-007", h2_lot="H2-BUNDLE-2611-04")

PPZ_COMMON = dict(boc_assay=99.4, hcl_assay=17.6, conv=0.997, ppz_assay=99.5,
                  boc_lot="BOCPZ-2610-031", hcl_lot="HCLIPA-2611-008", ipa_lot="IPA-2611-012")

NBB_COMMON = dict(bzcl_assay=99.5, bna_assay=99.4, tea_assay=99.6, conv=0.995,
                  nbb_assay=99.6, bzcl_lot="BZCL-2611-003", bna_lot="BNA-2610-019",
                  tea_lot="TEA-2611-006", tol_lot="TOL-2611-010")


def spread(bid: str, salt: int, lo: float, hi: float, dec: int = 2) -> float:
    """A fixed, batch-specific value in [lo, hi] so that clean batches do not all look alike (deterministic)."""
    k = int(bid[-4:])
    f = ((k * 7919 + salt * 104729) % 1000) / 999
    return round(lo + f * (hi - lo), dec)


def bzc(**kw):
    bid = kw["id"]
    varied = dict(etoh_eq=spread(bid, 1, 9.4, 11.2), h2_eq=spread(bid, 2, 3.06, 3.22),
                  s1_ml_loss=spread(bid, 3, 0.9, 1.3), s2_ml_loss=spread(bid, 4, 0.9, 1.4),
                  lossf=spread(bid, 5, 0.7, 1.4))
    if kw.get("version") == 2:
        # Version 2: less ethanol (the ester crystallises from a less ethanolic quench, so less stays in the mother
        # liquor) and the acid charge held to 0.10 equivalents within 0.08-0.12.
        varied.update(etoh_eq=spread(bid, 1, 8.2, 9.0), s1_ml_loss=spread(bid, 3, 0.55, 0.85),
                      h2so4_eq=spread(bid, 6, 0.095, 0.105, 3))
    return {"recipe": "BZC-410", **BZC_COMMON, **varied, **kw}


def ppz(**kw):
    bid = kw["id"]
    varied = dict(hcl_eq=spread(bid, 1, 2.35, 2.65), ml_loss=spread(bid, 3, 0.6, 1.1), lossf=spread(bid, 5, 0.7, 1.4))
    return {"recipe": "PPZ-220", **PPZ_COMMON, **varied, **kw}


def nbb(**kw):
    bid = kw["id"]
    varied = dict(bna_eq=spread(bid, 1, 1.03, 1.09), tea_eq=spread(bid, 2, 1.15, 1.32),
                  res_loss=spread(bid, 3, 0.7, 1.4), lossf=spread(bid, 5, 0.7, 1.4))
    return {"recipe": "NBB-150", **NBB_COMMON, **varied, **kw}


# expect: {step: [flag codes]} for the revision the file carries; steps not named have no flags.
BATCHES = {b["id"]: b for b in [
    # ---- BZC-410 (R-301 esterification, R-302 hydrogenation) ----
    bzc(id="KB3-BZ-0411", version=2, nba_kg=250.4, nba_lot="NBA-2610-017", etoh_lot="ETOH-2611-004",
        nahco3_lot="SBC-2610-022", etoh2_lot="ETOH-2611-004", etoh_rec_lot="ETOH-R-2611-021",
        s1_start="2026-11-22 06:50", s2_start="2026-11-23 07:20", expect={}),
    bzc(id="KB3-BZ-0412", version=2, nba_kg=240.2, nba_lot="NBA-2610-017", etoh_lot="ETOH-2611-004", nahco3_kg=None,
        nahco3_lb=44.0, nahco3_lot="SBC-US-50LB-0913", etoh2_lot="ETOH-R-2611-021", etoh_rec_lot="ETOH-R-2611-022",
        s1_yield=93.1, s2_yield=93.6, h2_eq=3.15,
        s1_start="2026-11-23 06:40", s2_start="2026-11-24 07:10", expect={}),
    bzc(id="KB3-BZ-0413", version=2, nba_kg=255.0, nba_lot="NBA-2610-017", etoh_lot="ETOH-R-2611-019", etoh_assay=94.2,
        nahco3_kg=40.0, nahco3_lot="SBC-2610-022", etoh2_lot="ETOH-2611-009", etoh_rec_lot="ETOH-R-2611-023",
        s1_conv=0.835, s1_yield=80.2, s1_ml_loss=1.2, s2_yield=94.8,
        s1_start="2026-11-24 06:45", s2_start="2026-11-25 07:15", expect={"S1": ["yield-low"]}),
    bzc(id="KB3-BZ-0414", version=2, nba_kg=245.1, nba_lot="NBA-2611-002", etoh_lot="ETOH-2611-009",
        nahco3_lot="SBC-2610-022", etoh2_lot="ETOH-R-2611-022", etoh_rec_lot="ETOH-R-2611-024",
        s1_yield=91.8, s2_yield=93.9, h2_eq=3.10, drop_h2_row=True,
        s1_start="2026-11-25 06:40", s2_start="2026-11-26 07:05", expect={"S2": ["reactant-missing"]}),
    bzc(id="KB3-BZ-0415", version=2, nba_kg=260.3, nba_lot="NBA-2611-002", etoh_lot="ETOH-2611-009",
        nahco3_lot="SBC-2611-005", etoh2_lot="ETOH-R-2611-023", etoh_rec_lot="ETOH-R-2611-025",
        s1_yield=92.9, s2_yield=94.6, h2_eq=3.08,
        s1_start="2026-11-26 06:50", s2_start="2026-11-27 07:10", expect={}),
    bzc(id="KB3-BZ-0416", version=2, nba_kg=250.0, nba_lot="NBA-2611-002", etoh_lot="ETOH-2611-009",
        nahco3_lot="SBC-2611-005", etoh2_lot="", etoh_rec_lot="", s1_yield=92.0, s2_missing=True,
        s1_start="2026-11-27 06:45", s2_start="2026-11-28 07:10", expect={"S2": ["step-missing"]}),

    # ---- PPZ-220 (R-303) ----
    ppz(id="KB3-PZ-0227", boc_kg=180.6, start="2026-11-22 23:10", expect={}, yld=95.1),
    ppz(id="KB3-PZ-0228", boc_kg=220.3, start="2026-11-23 14:30", hcl_eq=2.45, expect={}, yld=94.6),
    ppz(id="KB3-PZ-0229", boc_kg=200.1, start="2026-11-24 02:00", hcl_assay=17.4, expect={}, yld=95.8),
    ppz(id="KB3-PZ-0230", boc_kg=300.2, start="2026-11-24 13:20", hcl_eq=2.55, boc_lot="BOCPZ-2611-004",
        expect={}, yld=95.0),
    ppz(id="KB3-PZ-0231", boc_kg=210.4, start="2026-11-25 07:00", boc_lot="BOCPZ-2611-004",
        wet_product_pct=8.5, expect={"S1": ["yield-over-theory"]}, yld=95.4),
    ppz(id="KB3-PZ-0232", boc_kg=190.2, start="2026-11-25 18:30", boc_lot="BOCPZ-2611-004", hcl_assay=18.1,
        hcl_lot="HCLIPA-2611-011", expect={}, yld=94.9),
    ppz(id="KB3-PZ-0233", boc_kg=240.5, start="2026-11-26 06:30", boc_lot="BOCPZ-2611-004", hcl_assay=18.1,
        hcl_lot="HCLIPA-2611-011", hcl_eq=2.4, expect={}, yld=95.3),
    ppz(id="KB3-PZ-0234", boc_kg=200.4, start="2026-11-26 18:40", boc_lot="BOCPZ-2611-004", hcl_assay=18.1,
        hcl_lot="HCLIPA-2611-011", expect={}, yld=96.0),
    ppz(id="KB3-PZ-0235", boc_kg=230.0, start="2026-11-27 07:00", boc_lot="BOCPZ-2611-009", hcl_assay=17.9,
        hcl_lot="HCLIPA-2611-014", ipa_lot="IPA-2611-020", expect={}, yld=95.5),

    # ---- NBB-150 (R-304, R-305) ----
    nbb(id="KB3-NB-0158", bzcl_kg=185.2, start="2026-11-23 06:40", tol_r_lot="TOL-R-2611-011", drum0=31,
        expect={}, yld=92.6),
    nbb(id="KB3-NB-0159", bzcl_kg=160.4, start="2026-11-23 19:30", tol_r_lot="TOL-R-2611-012", drum0=37,
        expect={}, yld=93.4),
    nbb(id="KB3-NB-0160", bzcl_kg=175.1, start="2026-11-24 06:50", tol_r_lot="TOL-R-2611-013", drum0=42,
        bna_eq=1.08, tea_eq=1.01, tea_lot="TEA-2611-014",
        expect={"S1": ["equivalents-out-of-range"]}, yld=90.3),
    nbb(id="KB3-NB-0161", bzcl_kg=190.3, start="2026-11-24 08:10", tol_r_lot="TOL-R-2611-014", drum0=47,
        tea_lot="TEA-2611-014", operator="S. Okafor", expect={}, yld=92.1),
    nbb(id="KB3-NB-0162", bzcl_kg=150.6, start="2026-11-24 19:30", tol_r_lot="TOL-R-2611-015", drum0=53,
        tea_lot="TEA-2611-014", operator="M. Lindqvist", expect={}, yld=93.0),
    nbb(id="KB3-NB-0163", bzcl_kg=200.5, start="2026-11-25 06:45", tol_r_lot="TOL-R-2611-016", drum0=57,
        tea_lot="TEA-2611-014", spill_kg=78.0, expect={"S1": ["balance-gap"]}, yld=92.2),
    nbb(id="KB3-NB-0164", bzcl_kg=180.2, start="2026-11-25 08:00", tol_r_lot="TOL-R-2611-017", drum0=63,
        tea_lot="TEA-2611-014", bzcl_lot="BZCL-2611-008", expect={}, yld=91.7),
    nbb(id="KB3-NB-0165", bzcl_kg=170.4, start="2026-11-26 06:40", tol_r_lot="TOL-R-2611-018", drum0=68,
        bzcl_lot="BZCL-2611-008", res_loss=4.3, res_extra=8.0, expect={"S1": ["product-in-waste"]}, yld=88.4),
    nbb(id="KB3-NB-0166", bzcl_kg=195.0, start="2026-11-26 07:50", tol_r_lot="TOL-R-2611-019", drum0=73,
        bzcl_lot="BZCL-2611-008", expect={}, yld=92.8),
    nbb(id="KB3-NB-0167", bzcl_kg=165.3, start="2026-11-27 06:35", tol_r_lot="TOL-R-2611-020", drum0=79,
        bzcl_lot="BZCL-2611-008", res_loss=0.3, expect={"S1": ["yield-high"]}, yld=98.4),
    nbb(id="KB3-NB-0168", bzcl_kg=185.0, start="2026-11-27 07:40", tol_r_lot="TOL-R-2611-021", drum0=84,
        bzcl_lot="BZCL-2611-008", double_drum=2, expect={"S1": ["balance-surplus"]}, yld=92.5),
    nbb(id="KB3-NB-0169", bzcl_kg=210.2, start="2026-11-27 17:10", tol_r_lot="TOL-R-2611-022", drum0=90,
        bzcl_lot="BZCL-2611-008", tea_lot="TEA-2611-021", expect={}, yld=93.1),
]}

# --------------------------------------------------------------------------------------------------
# The history: BZC-410 batches before the week (sample-data/history/), one a day in R-301 (S1) and R-302 (S2)
# --------------------------------------------------------------------------------------------------

HISTORY_V1 = range(364, 384)      # KB3-BZ-0364..0383: S1 2026-10-05..10-24, recipe version 1
HISTORY_V2 = range(384, 411)      # KB3-BZ-0384..0410: S1 2026-10-26..11-21, recipe version 2
# 2026-10-25: R-301 maintenance stop (no S1), version 2 takes effect the next day.
ETHANOL_RUN = range(402, 411)     # nine v2 batches on ethanol lot ETOH-2611-001 (99.5 %): S1 a little lower
HISTORY_SEED = 4102


def history_yields() -> dict[int, tuple[float, float]]:
    """S1 and S2 yields per history batch: v1 S1 about 90.9 %, v2 about 92.8 % (the run on the wetter ethanol lot
    about 92.1 %), S2 about 94.1 % in both versions; deterministic scatter (random.Random, fixed seed)."""
    rng = random.Random(HISTORY_SEED)
    out = {}
    for n in list(HISTORY_V1) + list(HISTORY_V2):
        if n in ETHANOL_RUN:
            s1 = min(92.10 + rng.gauss(0, 0.12), 92.40)
        elif n >= 384:
            s1 = 92.80 + rng.gauss(0, 0.35)
        else:
            s1 = 90.90 + rng.gauss(0, 0.45)
        s2 = 94.10 + rng.gauss(0, 0.35)
        out[n] = (round(s1, 1), round(s2, 1))
    return out


def history_batches() -> list[dict]:
    yields = history_yields()
    batches = []
    for n in list(HISTORY_V1) + list(HISTORY_V2):
        bid = f"KB3-BZ-{n:04d}"
        v2 = n >= 384
        day = datetime(2026, 10, 5) + timedelta(days=(n - 364) + (1 if v2 else 0))
        s2_day = day + timedelta(days=1)
        nba_lot = ["NBA-2609-021", "NBA-2610-004", "NBA-2610-011", "NBA-2610-017"][min((n - 364) // 12, 3)]
        if n in ETHANOL_RUN:
            etoh_lot, etoh_assay = "ETOH-2611-001", 99.5
            run = dict(s1_conv=0.947)
        else:
            etoh_lot, etoh_assay = ("ETOH-2610-007" if n < 380 else "ETOH-2610-015"), 99.8
            run = {}
        rec_seq = (n - 390) if s2_day.month == 11 else (n - 363)
        rec_lot = f"ETOH-R-{s2_day:%y%m}-{rec_seq:03d}"
        prev_rec = batches[-1]["etoh_rec_lot"] if batches else ""
        s1_yield, s2_yield = yields[n]
        batches.append(bzc(
            id=bid, version=2 if v2 else 1, nba_kg=round(238 + (n * 37 % 25), 1), nba_lot=nba_lot,
            etoh_lot=etoh_lot, etoh_assay=etoh_assay,
            nahco3_lot="SBC-2609-030" if n < 390 else "SBC-2610-022",
            etoh2_lot=prev_rec if n % 2 == 0 and prev_rec else "ETOH-2610-015", **run,
            etoh_rec_lot=rec_lot, s1_yield=s1_yield, s2_yield=s2_yield,
            s1_start=f"{day:%Y-%m-%d} 06:45", s2_start=f"{s2_day:%Y-%m-%d} 07:10", history=True, expect={}))
    return batches


for _b in history_batches():
    BATCHES[_b["id"]] = _b

# Variants of a batch as first exported (before a correction).
VARIANTS = {
    # Drum 2 keyed as 12.7 instead of its real weight: re-exported after QA queried the low yield.
    ("KB3-PZ-0230", "first"): {"miskey": (1, None), "expect": {"S1": ["yield-low", "balance-gap"]}},
}


@dataclass
class ExportFile:
    arrival: str                      # local arrival time, also the name's prefix
    label: str
    batches: list                     # batch ids, or (batch id, variant) tuples
    crlf: bool = False
    bom: bool = False
    columns: list | None = None       # header order (names as written); default COLUMNS
    omit: tuple = ()                  # optional columns left out
    duplicate_of: str | None = None   # label of an earlier file whose bytes are copied
    malformed: str | None = None      # "decimal-comma", "semicolon", "bad-values"
    note: str = ""

    @property
    def name(self) -> str:
        return at(self.arrival).strftime("%Y-%m-%dT%H%M") + "_" + self.label + ".csv"


COLUMNS = ["batch", "recipe", "recipe_version", "step", "entry", "material", "stream", "quantity", "unit",
           "assay_pct", "lot", "recorded_at"]
UPPER_REORDERED = ["RECORDED_AT", "BATCH", "STEP", "RECIPE", "ENTRY", "MATERIAL", "QUANTITY", "UNIT",
                   "ASSAY_PCT", "LOT", "STREAM", "RECIPE_VERSION"]

SCHEDULE = [
    ExportFile("2026-11-23 10:12", "KB3-PZ-0227", ["KB3-PZ-0227"], crlf=True),
    ExportFile("2026-11-23 17:05", "KB3-NB-0158", ["KB3-NB-0158"], omit=("recipe_version",)),
    ExportFile("2026-11-23 21:35", "KB3-BZ-0411", ["KB3-BZ-0411"]),
    ExportFile("2026-11-24 05:58", "KB3-shift-C-export", ["KB3-PZ-0228", "KB3-NB-0159"]),
    ExportFile("2026-11-24 13:01", "KB3-PZ-0229", ["KB3-PZ-0229"], crlf=True),
    ExportFile("2026-11-24 17:12", "KB3-NB-0160", ["KB3-NB-0160"]),
    ExportFile("2026-11-24 21:25", "KB3-BZ-0412", ["KB3-BZ-0412"]),
    ExportFile("2026-11-25 00:25", "KB3-PZ-0230", [("KB3-PZ-0230", "first")], crlf=True),
    ExportFile("2026-11-25 05:52", "KB3-shift-C-export", ["KB3-NB-0161", "KB3-NB-0162"], malformed="bad-values"),
    ExportFile("2026-11-25 08:15", "KB3-PZ-0229-resend", [], crlf=True, duplicate_of="2026-11-24T1301_KB3-PZ-0229.csv"),
    ExportFile("2026-11-25 09:40", "KB3-PZ-0230", ["KB3-PZ-0230"], crlf=True),
    ExportFile("2026-11-25 10:20", "KB3-shift-C-export-corrected", ["KB3-NB-0161", "KB3-NB-0162"]),
    ExportFile("2026-11-25 17:50", "KB3-NB-0163", ["KB3-NB-0163"]),
    ExportFile("2026-11-25 18:05", "KB3-PZ-0231", ["KB3-PZ-0231"], crlf=True),
    ExportFile("2026-11-25 18:20", "KB3-NB-0164", ["KB3-NB-0164"]),
    ExportFile("2026-11-25 21:30", "KB3-BZ-0413", ["KB3-BZ-0413"]),
    ExportFile("2026-11-26 05:40", "KB3-PZ-0232", ["KB3-PZ-0232"], crlf=True),
    ExportFile("2026-11-26 16:58", "KB3-NB-0165", ["KB3-NB-0165"]),
    ExportFile("2026-11-26 17:35", "KB3-PZ-0233", ["KB3-PZ-0233"], crlf=True, malformed="decimal-comma"),
    ExportFile("2026-11-26 18:05", "KB3-NB-0166", ["KB3-NB-0166"], malformed="semicolon"),
    ExportFile("2026-11-26 18:50", "KB3-NB-0166-reexport", ["KB3-NB-0166"]),
    ExportFile("2026-11-26 19:05", "KB3-PZ-0233-reexport", ["KB3-PZ-0233"], crlf=True),
    ExportFile("2026-11-26 21:20", "KB3-BZ-0414", ["KB3-BZ-0414"]),
    ExportFile("2026-11-27 05:45", "KB3-PZ-0234", ["KB3-PZ-0234"], crlf=True),
    ExportFile("2026-11-27 16:52", "KB3-NB-0167", ["KB3-NB-0167"]),
    ExportFile("2026-11-27 21:25", "KB3-BZ-0415", ["KB3-BZ-0415"], bom=True),
    ExportFile("2026-11-27 22:05", "KB3-shift-B-export", ["KB3-PZ-0235", "KB3-NB-0168", "KB3-BZ-0416"]),
    ExportFile("2026-11-28 04:25", "KB3-NB-0169", ["KB3-NB-0169"], columns=UPPER_REORDERED),
]

# One file per history batch, exported when its S2 record was closed (after the last output row).
HISTORY_SCHEDULE = [
    ExportFile(f"{datetime.strptime(b['s2_start'], '%Y-%m-%d %H:%M').date()} 21:30", b["id"], [b["id"]])
    for b in BATCHES.values() if b.get("history")
]

# --------------------------------------------------------------------------------------------------
# Building and writing
# --------------------------------------------------------------------------------------------------

_built: dict = {}


def batch_rows(key) -> tuple[list[Row], dict, dict]:
    """Rows, model notes and expected flags of a batch (or of a variant of it)."""
    bid, variant = (key, None) if isinstance(key, str) else key
    if (bid, variant) in _built:
        return _built[(bid, variant)]
    b = dict(BATCHES[bid])
    expect = b["expect"]
    if variant:
        v = dict(VARIANTS[(bid, variant)])
        expect = v.pop("expect")
        b.update(v)
    rows, notes = BUILDERS[b["recipe"]](b)
    rows.sort(key=lambda r: (r.step, r.recorded_at))  # the export lists each step in time order
    if b.get("miskey"):
        # Drop the last digit before the decimal point: a realistic slip when keying a drum weight.
        prods = [r for r in rows if r.entry == "product"]
        real = prods[b["miskey"][0]].quantity
        whole, frac = real.split(".")
        prods[b["miskey"][0]].quantity = whole[:-1] + "." + frac
        notes["miskey"] = (real, prods[b["miskey"][0]].quantity)
    _built[(bid, variant)] = (rows, notes, expect)
    return rows, notes, expect


def csv_field(text: str, delim: str) -> str:
    if any(c in text for c in (delim, '"', "\n", "\r")):
        return '"' + text.replace('"', '""') + '"'
    return text


def render(f: ExportFile, written: dict) -> bytes:
    if f.duplicate_of:
        return written[f.duplicate_of]
    delim = ";" if f.malformed == "semicolon" else ","
    cols = list(f.columns or COLUMNS)
    cols = [c for c in cols if c.lower() not in f.omit]
    rows: list[Row] = []
    for key in f.batches:
        rows.extend(batch_rows(key)[0])
    extra_cols = sorted({k for r in rows for k in r.extra})
    cols += extra_cols
    lines = [delim.join(cols)]
    for r in rows:
        vals = []
        for c in cols:
            key = c.lower()
            if key in r.extra:
                v = r.extra[key]
            elif key == "recipe_version":
                v = r.version
            else:
                v = getattr(r, key)
            vals.append(v)
        lines.append(vals)
    out = [lines[0]]
    for vals in lines[1:]:
        out.append(delim.join(csv_field(v, delim) for v in vals))
    nl = "\r\n" if f.crlf else "\n"
    text = nl.join(out) + nl
    data = text.encode("utf-8")
    return (b"\xef\xbb\xbf" + data) if f.bom else data


def prepare_malformed() -> None:
    """Malformed exports are built from copies of the good rows, then spoiled (see README)."""
    for f in SCHEDULE:
        if f.malformed in ("decimal-comma", "bad-values"):
            keys = list(f.batches)
            spoiled_keys = []
            for k in keys:
                rows, notes, expect = batch_rows(k)
                copies = [Row(**{**r.__dict__, "extra": dict(r.extra)}) for r in rows]
                if f.malformed == "decimal-comma":
                    # The export PC ran with a German number format: every decimal point became a comma.
                    for r in copies:
                        r.quantity = r.quantity.replace(".", ",")
                        r.assay_pct = r.assay_pct.replace(".", ",")
                elif k == "KB3-NB-0162":
                    # Three keying faults in one batch: a drum code typed as the material, a unit typo,
                    # an assay without its decimal point. KB3-NB-0161 in the same file is correct.
                    for r in copies:
                        r.extra.pop("operator", None)
                    rec = next(r for r in copies if r.entry == "charge" and r.material == "TOL")
                    rec.material = "TOL-R"
                    pw = next(r for r in copies if r.entry == "charge" and r.material == "PW")
                    pw.unit = "kgs"
                    bna = next(r for r in copies if r.material == "BNA")
                    bna.assay_pct = bna.assay_pct.replace(".", "")
                else:
                    for r in copies:
                        r.extra.pop("operator", None)
                vkey = (k, "malformed:" + f.name)
                _built[vkey] = (copies, notes, None)
                spoiled_keys.append(vkey)
            f.batches = spoiled_keys


# --------------------------------------------------------------------------------------------------
# Reconciliation of the rows as written (reconciliation spec), to print the expectations
# --------------------------------------------------------------------------------------------------

def u_row(m: float) -> float:
    return math.sqrt((U_REL * m) ** 2 + U_ABS ** 2)


def reconcile_step(st: Step, rows: list[Row]) -> dict:
    res = {"step": st.code, "rows": len(rows)}
    if not rows:
        res["flags"] = [("step-missing", "no rows")]
        return res
    charges = [r for r in rows if r.entry == "charge"]
    outputs = [r for r in rows if r.entry in ("product", "waste", "recovered", "sample")]
    n = {}
    for r in charges:
        n[r.material] = n.get(r.material, 0.0) + r.kg * (r.assay if r.assay is not None else 100) / 100 / M[r.material]
    missing = [c for c in st.reactants if c not in n]
    flags = [("reactant-missing", c) for c in missing]
    m_in = sum(r.kg for r in charges)
    m_out = sum(r.kg for r in outputs)
    act = sum(r.kg * (r.assay if r.assay is not None else 100) / 100
              for r in rows if r.entry == "product" and r.material == st.product)
    vent_per_xi = sum(nu * M[g] for g, nu in st.vented.items())
    xi_act = act / (st.nu_product * M[st.product])
    v_act = xi_act * vent_per_xi
    res.update(m_in=m_in, m_out=m_out, act=act, vent_act=v_act)
    theo = None
    if not missing:
        lim = min(st.reactants, key=lambda c: n[c] / st.reactants[c])
        xi_max = n[lim] / st.reactants[lim]
        theo = xi_max * st.nu_product * M[st.product]
        y = 100 * act / theo
        v_max = xi_max * vent_per_xi
        res.update(limiting=lim, theo=theo, yield_pct=y, vent_max=v_max,
                   equivalents={c: n.get(c, 0.0) / n[lim] for c in st.equivalents})
        if y < st.yield_min:
            flags.append(("yield-low", f"{y:.1f} % < {st.yield_min:g} %"))
        elif y > 100:
            flags.append(("yield-over-theory", f"{y:.1f} % > 100 %"))
        elif y > st.yield_max:
            flags.append(("yield-high", f"{y:.1f} % > {st.yield_max:g} %"))
        for c, (lo, hi) in st.equivalents.items():
            e = res["equivalents"][c]
            if e < lo or e > hi:
                flags.append(("equivalents-out-of-range", f"{c} {e:.2f} equiv, allowed {lo:g}-{hi:g}"))
    else:
        v_max = None
    gap = m_in - m_out - v_act
    vmax_ = max(v_act, v_max) if v_max is not None else v_act
    vmin_ = min(v_act, v_max) if v_max is not None else v_act
    loss_dec = m_in - m_out - vmax_
    surplus_dec = m_out + vmin_ - m_in
    # u_c as the engine computes it: product rows enter the vented estimate too (sensitivity coefficient).
    var = sum(u_row(r.kg) ** 2 for r in charges)
    ppm = vent_per_xi / (st.nu_product * M[st.product])
    for r in outputs:
        c = 1.0
        if r.entry == "product" and r.material == st.product:
            c += (r.assay if r.assay is not None else 100) / 100 * ppm
        var += (c * u_row(r.kg)) ** 2
    u2 = K_COVER * math.sqrt(var)
    tol = st.tolerance_pct * m_in / 100
    res.update(gap=gap, gap_pct=100 * gap / m_in, closure=100 * (m_out + v_act) / m_in, u2=u2, tol=tol,
               loss_dec=loss_dec, surplus_dec=surplus_dec)
    if loss_dec > tol and loss_dec > u2:
        flags.append(("balance-gap", f"{loss_dec:.1f} kg > {tol:.1f} kg tolerance and > 2u {u2:.1f} kg"))
    if surplus_dec > tol and surplus_dec > u2:
        flags.append(("balance-surplus", f"{surplus_dec:.1f} kg > {tol:.1f} kg tolerance and > 2u {u2:.1f} kg"))
    # Product in waste: waste rows naming the product with an assay, else the analysis of their stream.
    share = {}
    for r in rows:
        if r.entry == "analysis" and r.material == st.product:
            share.setdefault(r.stream.strip().upper(), []).append(r.assay)
    piw = 0.0
    for r in rows:
        if r.entry != "waste":
            continue
        if r.material == st.product and r.assay is not None:
            piw += r.kg * r.assay / 100
        elif r.stream.strip().upper() in share:
            vals = share[r.stream.strip().upper()]
            piw += r.kg * sum(vals) / len(vals) / 100
    res["piw_kg"] = piw
    if theo and not missing:
        res["piw_pct"] = 100 * piw / theo
        if res["piw_pct"] > PIW_MAX:
            flags.append(("product-in-waste", f"{res['piw_pct']:.1f} % of theoretical > {PIW_MAX:g} %"))
    res["flags"] = flags
    return res


def production_day(rows: list[Row]) -> str | None:
    times = [datetime.fromisoformat(r.recorded_at) for r in rows
             if r.entry in ("product", "waste", "recovered", "sample") and r.recorded_at]
    if not times:
        return None
    last = max(times)
    return (last - timedelta(hours=DAY_START_H)).date().isoformat()


# --------------------------------------------------------------------------------------------------
# Main
# --------------------------------------------------------------------------------------------------

def build_all() -> dict[str, bytes]:
    prepare_malformed()
    written: dict[str, bytes] = {}
    for f in SCHEDULE:
        written[f.name] = render(f, written)
    late = []
    for f in SCHEDULE:
        for key in f.batches:
            last = max(datetime.fromisoformat(r.recorded_at) for r in batch_rows(key)[0])
            if last >= at(f.arrival):
                late.append(f"{f.name}: row recorded at {last.isoformat()} after the file arrived")
    assert not late, "\n".join(late)
    names = [f.name for f in SCHEDULE]
    assert names == sorted(names), "file names must sort in arrival order"
    assert len(set(names)) == len(names)
    return written


def build_history() -> dict[str, bytes]:
    written: dict[str, bytes] = {}
    for f in HISTORY_SCHEDULE:
        written[f.name] = render(f, written)
        last = max(datetime.fromisoformat(r.recorded_at) for r in batch_rows(f.batches[0])[0])
        assert last < at(f.arrival), f"{f.name}: row recorded at {last.isoformat()} after the file arrived"
    names = [f.name for f in HISTORY_SCHEDULE]
    assert names == sorted(names) and len(set(names)) == len(names)
    assert max(names) < min(f.name for f in SCHEDULE), "the history comes before the week"
    return written


def step_series(keys) -> list[dict]:
    """Per BZC-410 batch (current revision) in production order (production day, last output, batch id): version,
    day and the S1/S2 yields the reconciliation computes from the rows as written."""
    points = []
    for key in keys:
        rows, _, _ = batch_rows(key)
        bid = key if isinstance(key, str) else key[0]
        b = BATCHES[bid]
        if b["recipe"] != "BZC-410":
            continue
        outs = [datetime.fromisoformat(r.recorded_at) for r in rows if r.entry in ("product", "waste", "recovered", "sample")]
        p = {"batch": bid, "version": b["version"], "day": production_day(rows), "last": max(outs)}
        for st in recipe_steps("BZC-410", b["version"]):
            r = reconcile_step(st, [x for x in rows if x.step == st.code])
            p[st.code] = r.get("yield_pct")
            p[st.code + "_flags"] = [c for c, _ in r.get("flags", [])]
        points.append(p)
    return sorted(points, key=lambda p: (p["day"], p["last"], p["batch"]))


def imr(values: list[float], baseline: int = 20) -> dict:
    """I-MR limits from the first `baseline` values (d2 = 1.128 for n = 2, NIST/SEMATECH e-Handbook 6.3.2) and
    the runs of 9 or more on one side of the centre line (Nelson rule 2)."""
    base = values[:baseline]
    centre = sum(base) / len(base)
    mrbar = sum(abs(a - b) for a, b in zip(base[1:], base)) / (len(base) - 1)
    sigma = mrbar / 1.128
    runs, start = [], 0
    side = lambda v: (v > centre) - (v < centre)
    for i in range(1, len(values) + 1):
        if i == len(values) or side(values[i]) != side(values[start]) or side(values[i]) == 0:
            if i - start >= 9 and side(values[start]) != 0:
                runs.append((start, i - 1, "above" if side(values[start]) > 0 else "below"))
            start = i
    beyond = [i for i, v in enumerate(values) if abs(v - centre) > 3 * sigma]
    return {"centre": centre, "sigma": sigma, "ucl": centre + 3 * sigma, "lcl": centre - 3 * sigma, "runs": runs, "beyond": beyond}


def welch(a: list[float], b: list[float]) -> dict:
    ma, mb = sum(a) / len(a), sum(b) / len(b)
    va = sum((x - ma) ** 2 for x in a) / (len(a) - 1)
    vb = sum((x - mb) ** 2 for x in b) / (len(b) - 1)
    se = math.sqrt(va / len(a) + vb / len(b))
    df = (va / len(a) + vb / len(b)) ** 2 / ((va / len(a)) ** 2 / (len(a) - 1) + (vb / len(b)) ** 2 / (len(b) - 1))
    return {"na": len(a), "nb": len(b), "ma": ma, "mb": mb, "sa": math.sqrt(va), "sb": math.sqrt(vb),
            "diff": mb - ma, "t": (mb - ma) / se, "df": df}


def history_report() -> tuple[list[str], list[str]]:
    """README lines for the history and what a trend and a comparison of BZC-410 should show; console lines."""
    hist = step_series([f.batches[0] for f in HISTORY_SCHEDULE])
    week = step_series([k for f in SCHEDULE if not f.malformed and not f.duplicate_of for k in f.batches])
    problems = [f"{p['batch']} {c}: {p[c + '_flags']}" for p in hist for c in ("S1", "S2") if p[c + "_flags"]]
    assert not problems, "history batches must be clean: " + "; ".join(problems)
    allp = hist + week
    lines = [f"| batch | version | production day | S1 yield % | S2 yield % |", "|---|---|---|---|---|"]
    for p in hist:
        lines.append(f"| {p['batch']} | v{p['version']} | {p['day']} | {p['S1']:.1f} | {p['S2']:.1f} |")
    lines.append("")
    v1 = [p for p in allp if p["version"] == 1]
    v2 = [p for p in allp if p["version"] == 2]
    lines.append(f"{len(hist)} history batches: {sum(1 for p in hist if p['version'] == 1)} of version 1 "
                 f"(production days {v1[0]['day']} to {v1[-1]['day']}), {sum(1 for p in hist if p['version'] == 2)} of version 2 "
                 f"({hist[-1]['day'] if False else [p for p in hist if p['version'] == 2][0]['day']} to {hist[-1]['day']}); "
                 f"none raises a flag. With the week, version 2 has {len(v2)} batches ({len([p for p in v2 if p['S2'] is not None])} with an S2 yield).")
    lines.append("")
    v2s1 = [p["S1"] for p in v2 if p["S1"] is not None]
    c = imr(v2s1)
    names = [p["batch"] for p in v2 if p["S1"] is not None]
    lines.append(f"- **Trend of S1, version 2** (baseline the first 20 batches): centre {c['centre']:.2f} %, sigma "
                 f"{c['sigma']:.3f} (moving range / 1.128), limits {c['lcl']:.2f} to {c['ucl']:.2f} %.")
    for a, b, side in c["runs"]:
        lines.append(f"  Run of {b - a + 1} batches {side} the centre line, {names[a]} to {names[b]} (Nelson rule 2 "
                     f"from the 9th), every one inside the master-record limits 85-96 % (no flag).")
        assert all(85 <= v2s1[i] <= 96 for i in range(a, b + 1))
    assert [(names[a], side) for a, b, side in c["runs"]] == [("KB3-BZ-0402", "below")], c["runs"]
    for i in c["beyond"]:
        lines.append(f"  Beyond the 3-sigma limits (rule 1): {names[i]} at {v2s1[i]:.1f} %.")
    allS1 = [p["S1"] for p in allp if p["S1"] is not None]
    ca = imr(allS1)
    names_a = [p["batch"] for p in allp if p["S1"] is not None]
    lines.append(f"- **Trend of S1, both versions** (baseline the first 20 batches, all version 1): centre {ca['centre']:.2f} %, "
                 f"limits {ca['lcl']:.2f} to {ca['ucl']:.2f} %; the change to version 2 shows as "
                 + ", ".join(f"{b - a + 1} in a row {side} ({names_a[a]} to {names_a[b]})" for a, b, side in ca["runs"]) + ".")
    for code in ("S1", "S2"):
        w = welch([p[code] for p in v1 if p[code] is not None], [p[code] for p in v2 if p[code] is not None])
        lines.append(f"- **Compare {code}, v1 against v2**: v1 n = {w['na']}, mean {w['ma']:.2f} % (s {w['sa']:.2f}); "
                     f"v2 n = {w['nb']}, mean {w['mb']:.2f} % (s {w['sb']:.2f}); difference {w['diff']:+.2f} points, "
                     f"Welch t = {w['t']:.2f} on {w['df']:.1f} degrees of freedom.")
    out = [f"history: {len(hist)} batches, {len(v1)} v1, {len(v2)} v2 (incl. the week)"] + lines
    return lines, out


def fmt_flags(flags) -> str:
    return ", ".join(f"{c} ({d})" for c, d in flags) if flags else "no flags"


def report(written: dict[str, bytes]) -> tuple[str, list[str]]:
    """Console report and the README table rows."""
    out = []
    table = []
    stored: dict[str, int] = {}
    days: dict[str, str] = {}
    hashes = {}
    problems = []
    for f in SCHEDULE:
        data = written[f.name]
        if data in hashes:
            table.append(f"| `{f.name}` | (copy) | duplicate of `{hashes[data]}`: skipped, nothing stored |")
            out.append(f"== {f.name}: exact duplicate of {hashes[data]}")
            continue
        hashes[data] = f.name
        if f.malformed:
            ids = ", ".join(k if isinstance(k, str) else k[0] for k in f.batches)
            why = {"decimal-comma": "quarantined: decimal commas in `quantity` and `assay_pct` (every decimal value of the file)",
                   "semicolon": "quarantined: delimiter `;` (header does not split on `,`)",
                   "bad-values": "quarantined, both batches: KB3-NB-0162 has an unknown material `TOL-R`, unit `kgs`, "
                                 "`assay_pct` 994 (> 100); KB3-NB-0161 is correct but the file is atomic"}[f.malformed]
            table.append(f"| `{f.name}` | {ids} | {why} |")
            out.append(f"== {f.name}: MALFORMED ({f.malformed}) -> quarantine")
            continue
        out.append(f"== {f.name}" + (" [CRLF]" if f.crlf else "") + (" [BOM]" if f.bom else ""))
        for key in f.batches:
            rows, notes, expect = batch_rows(key)
            bid = key if isinstance(key, str) else key[0]
            stored[bid] = stored.get(bid, 0) + 1
            rev = stored[bid]
            b = BATCHES[bid]
            day = production_day(rows)
            cells = []
            got_all = {}
            for st in recipe_steps(b["recipe"], b.get("version", 1)):
                r = reconcile_step(st, [x for x in rows if x.step == st.code])
                got = [c for c, _ in r["flags"]]
                got_all[st.code] = got
                if sorted(got) != sorted(expect.get(st.code, [])):
                    problems.append(f"{bid} rev {rev} {st.code}: expected {expect.get(st.code, [])}, computed {got}")
                if r["rows"] == 0:
                    out.append(f"  {bid} rev {rev} {st.code}: NO ROWS -> step-missing")
                    cells.append(f"{st.code}: **step-missing** (no {st.code} rows in the export)")
                    continue
                eq = ", ".join(f"{c} {e:.2f}" for c, e in r.get("equivalents", {}).items())
                line = (f"  {bid} rev {rev} {st.code}: theo {r['theo']:.2f} kg" if "theo" in r
                        else f"  {bid} rev {rev} {st.code}: theo n/a (missing {','.join(c for c, _ in r['flags'] if c == 'reactant-missing')})")
                line += (f", actual {r['act']:.2f} kg" + (f", yield {r['yield_pct']:.2f} %" if "yield_pct" in r else "")
                         + (f", equiv [{eq}]" if eq else "")
                         + f"\n      m_in {r['m_in']:.2f}, m_out {r['m_out']:.2f}, vented {r['vent_act']:.2f}"
                         + (f" (max {r['vent_max']:.2f})" if r.get("vent_max") else "")
                         + f", gap {r['gap']:.2f} kg = {r['gap_pct']:.2f} %, closure {r['closure']:.2f} %"
                         + f", tol {r['tol']:.2f}, 2u {r['u2']:.2f}"
                         + (f", product in waste {r['piw_pct']:.2f} %" if "piw_pct" in r else "")
                         + f"\n      flags: {fmt_flags(r['flags'])}")
                for what, kg in notes.get(st.code, {}).get("unweighed", {}).items():
                    if kg:
                        line += f"\n      (model, unweighed: {what} {kg:.2f} kg)"
                out.append(line)
                y = f"yield {r['yield_pct']:.1f} %" if "yield_pct" in r else "yield not computed"
                figs = f"{y}, gap {r['gap_pct']:.2f} %"
                if "piw_pct" in r:
                    figs += f", in waste {r['piw_pct']:.1f} %"
                flagtxt = "; ".join(f"**{c}** {d}" for c, d in r["flags"]) or "no flags"
                if any(c == "reactant-missing" for c, _ in r["flags"]):
                    flagtxt = "**reactant-missing** (H2: no charge row); no yield/equivalents/product-in-waste flags"
                cells.append(f"{st.code}: {flagtxt} ({figs})")
            days[bid] = day
            what = "stored" if rev == 1 else f"revision {rev} (supersedes rev {rev - 1})"
            table.append(f"| `{f.name}` | {bid} rev {rev}, day {day} | {what}; " + "<br>".join(cells) + " |")
    out.append("")
    out.append(f"stored batches: {len(stored)}; revisions: {sum(v - 1 for v in stored.values())}")
    table.append("")
    table.append("Stored batches by production day (day of the last output row, day starting 06:00 local):")
    table.append("")
    for day in sorted(set(days.values())):
        ids = sorted(b for b, d in days.items() if d == day)
        out.append(f"day {day}: {len(ids)} batches: {', '.join(ids)}")
        table.append(f"- {day}: {len(ids)} batches: {', '.join(ids)}")
    if problems:
        out.append("MISMATCH between intended and computed flags:")
        out.extend("  " + p for p in problems)
    return "\n".join(out), table, problems


def replace_block(readme: str, start: str, end: str, block: str) -> str:
    return readme[:readme.index(start)] + block + readme[readme.index(end) + len(end):] if start in readme else readme


def main(argv: list[str]) -> int:
    check = "--check" in argv
    written = build_all()
    history = build_history()
    text, table, problems = report(written)
    print(text)
    hist_lines, hist_out = history_report()
    print("\n".join(hist_out))
    start, end = "<!-- expected:begin (generated by tools/generate.py) -->", "<!-- expected:end -->"
    block = "\n".join([start, "", "| file (arrival order) | batch, revision, production day | expected result |",
                       "|---|---|---|", *table, "", end])
    readme = open(README, encoding="utf-8").read() if os.path.exists(README) else ""
    new_readme = replace_block(readme, start, end, block)
    hstart, hend = "<!-- history:begin (generated by tools/generate.py) -->", "<!-- history:end -->"
    new_readme = replace_block(new_readme, hstart, hend, "\n".join([hstart, "", *hist_lines, "", hend]))
    differ = []
    folders = [(INBOX, written), (HISTORY, history)]
    for folder, files in folders:
        existing = sorted(os.listdir(folder)) if os.path.isdir(folder) else []
        for name in existing:
            if name not in files:
                differ.append(f"stray file {name}")
        for name, data in files.items():
            path = os.path.join(folder, name)
            if not os.path.exists(path) or open(path, "rb").read() != data:
                differ.append(name)
    if new_readme != readme:
        differ.append("README.md table")
    if check:
        for d in differ:
            print("differs:", d)
        print("check:", "OK, committed files are what the script writes" if not differ else "DIFFERENCES")
        return 1 if differ or problems else 0
    for folder, files in folders:
        os.makedirs(folder, exist_ok=True)
        for name in sorted(os.listdir(folder)):
            if name not in files:
                os.remove(os.path.join(folder, name))
        for name, data in files.items():
            with open(os.path.join(folder, name), "wb") as fh:
                fh.write(data)
    if new_readme != readme:
        with open(README, "w", encoding="utf-8", newline="\n") as fh:
            fh.write(new_readme)
    return 1 if problems else 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
