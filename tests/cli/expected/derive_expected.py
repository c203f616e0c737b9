#!/usr/bin/python3
"""Derives the checked-in CLI expectations tests/cli/expected/<example>.json
independently of the hushgain engine.

Run with Debian's python (numpy and scipy from python3-numpy, python3-scipy):
    /usr/bin/python3 tests/cli/expected/derive_expected.py
The test suite reads the JSON files it writes; it never runs Python.

Two independent methods, neither shares code with the C++ engine:
  1. Closed forms, ideal op-amp at low frequency (REFERENCES.md section 6:
     noise gains of the plain and the T-network inverting stage; section 4:
     E_rms = e_w sqrt(fc ln(fH/fL) + (fH - fL)) for white + 1/f noise;
     section 12 style single-pole integrals for a feedback capacitor,
     integral of df / (1 + (f/fp)^2) = fp atan(f/fp)).
  2. A nodal analysis written here from the macro model of DESIGN.md
     (A(s) = A0/(1 + s/wp), e_n between the + pin and the ideal amplifier,
     Ccm on each pin, Cdiff between the pins, Rout in series with the
     output), one direct solve per noise source (not the adjoint the engine
     uses), integrated with scipy.integrate.quad in ln f to 1e-10.
The expectation for each figure comes from method 2; method 1's value is
written beside it with the relative difference, so the reader sees how far
the example is from the closed forms (finite GBW inside the band mostly),
and check_closed_form asserts that method 2 with an ideal op-amp
reproduces method 1 to 1e-8. The DC offsets come from method 2 at f = 0
(finite A0), which agrees with the section 6 closed forms to about NG/A0.

Temperature (both methods): device and resistor values are given at 25 C
and moved to the stage's temperature (at_temperature): a resistor with a
technology (devices/resistors/*.json, the stage's "resistors" block) by
R (1 + tc (T - 25 C)); |Vos| + |drift| |T - 25 C|; Ib and Ios by the
class's law, 2^((T - 25 C)/interval) or 1 + coefficient (T - 25 C); a
current noise that follows the bias current ("current_noise_temperature":
"with_bias_current", a FET input's gate shot noise sqrt(2 q Ib), Schottky
1918, REFERENCES.md section 2) times sqrt(k(T)); 4kT at T. A stage with a temperature range also gets its figures at both ends.
Excess noise (REFERENCES.md section 8): every resistor with a technology
carries e_ex(f) = 10^(NI/20) 1e-6 V_DC / sqrt(ln(10) f) in series, V_DC its
drop at the DC operating point, solved here (Network.dc_drops; method 1
uses the ideal op-amp's DC point, closed_form_drops).

A photodiode (transimpedance) stage: method 2 puts the photodiode's C_d and
R_sh (noisy) from the - input to ground, the average photocurrent's and
(under reverse bias only) the dark current's shot noise 2 q I (REFERENCES.md
section 2) into the - input;
method 1 is the section 7 model (A(s) = w_t / s) integrated here. A
feedback capacitor of "auto" (Butterworth) is found on method 2's own
closed-loop response: Q = |H(f_90)| / |H(f_ref)| at the -90 degree point
(the definition of src/analysis/frequency_response.h, SecondOrderQ, coded
here anew) equal to 1/sqrt 2, by brentq in ln C_f; it is compared with
section 7's exact C_f = sqrt(2 w_t R_f C - 1)/(w_t R_f), and the search
is checked to reproduce that closed form on section 7's own model.

A capacitive sensor (source.capacitive): method 2 drives the sensor's
node from the source's open-circuit voltage through C_s, puts R_leak
(noisy) from that node to ground and R_in (when given) from it to the -
input, else the node is the - input itself; method 1 is the ideal charge
amplifier (no R_in): every current into the virtual ground sees Z_f =
R/(1 + s C_f R), R = R_f or R_eq, and e_n the noise gain
(NG_0 + s R (C_s + C_f))/(1 + s R C_f), NG_0 = 1 + R2/R3 + R/R_leak (KCL at
the - input and the tee node), so |NG|^2 = K^2 + (NG_0^2 - K^2)/(1 +
(f/f_p)^2) with K = 1 + C_s/C_f (REFERENCES.md section 13). The charge
gain is the largest |gain| in the band (scanned, then bounded Brent in
ln f) over C_s, against the ideal 1/C_f.

A stage with a "chain" (a second gain stage, a filter, a converter): the
nodal analysis's output density times the second stage's gain^2 / (1 +
(f/f_p)^2) and the filter's |H|^2 (scipy.signal's analog Butterworth or
Bessel prototype, its own library; none of the engine's code), plus the
second stage's e_n^2 (1 + f_c/f) NG^2 and i_n^2 R_s^2 + 4kTR_s through the
same pole and filter, integrated in ln f from the band's low edge to 1e4
times the sample rate (everything above Nyquist folds into the samples);
then the converter's definitions: q = FS/2^N, q^2/12, its own noise from
the data sheet's SNR, SNR = 20 log10(FS / (2 sqrt 2) / n), ENOB = (SNR -
10 log10 1.5) / (20 log10 2) (IEEE 1241's (SINAD - 1.76)/6.02 with the
exact constants), noise-free bits log2(FS / (6.6 n)), effective resolution
log2(FS / n). Beside the analog rms, the white closed form: the output
density at the reference frequency times the gain through the ENBW of an
n-th order Butterworth, (pi/2n)/sin(pi/2n) f_c (REFERENCES.md section 3).
"""

import json
import math
import os
import re

import numpy as np
from scipy import integrate, optimize, signal

K_B = 1.380649e-23  # J/K, exact in the 2019 SI (REFERENCES.md section 1)
Q_E = 1.602176634e-19  # C, exact in the 2019 SI (REFERENCES.md section 1)
ZERO_C = 273.15

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.normpath(os.path.join(HERE, "..", "..", ".."))

PREFIX = {"f": 1e-15, "p": 1e-12, "n": 1e-9, "u": 1e-6, "\u00b5": 1e-6,
          "m": 1e-3, "k": 1e3, "M": 1e6, "G": 1e9, "T": 1e12}
UNITS = ["V/rtHz", "A/rtHz", "V/C", "Ohm", "Hz", "F", "V", "A"]


def quantity(value):
    """A value of an example or device file: a number, or text with an SI
    prefix and an optional unit symbol ("10k", "20 MHz", "120 dB", "-0.5%")."""
    if isinstance(value, (int, float)):
        return float(value)
    text = value.strip()
    if text.endswith("dB"):
        return 10 ** (float(text[:-2]) / 20)
    if text.endswith("%"):
        return float(text[:-1]) / 100
    if text.endswith("ppm"):
        return float(text[:-3]) * 1e-6
    m = re.match(r"^([-+0-9.eE]+)\s*(.*)$", text)
    number, rest = float(m.group(1)), m.group(2)
    for unit in UNITS:
        if rest.endswith(unit):
            rest = rest[: -len(unit)]
            break
    return number * (PREFIX[rest] if rest else 1.0)


def load_stage(path):
    with open(path) as f:
        doc = json.load(f)
    opamp = {}
    device = doc["opamp"].get("device")
    if device:
        with open(os.path.join(ROOT, "devices", "opamps", device + ".json")) as f:
            opamp.update(json.load(f)["parameters"])
    opamp.update(doc["opamp"].get("set", {}))
    p = {k: quantity(v) for k, v in opamp.items()
         if not isinstance(v, dict) and k != "current_noise_temperature"}
    p["i_n_follows_ib"] = (
        opamp.get("current_noise_temperature", "constant") == "with_bias_current")
    law = opamp.get("bias_current_temperature", {"law": "constant"})
    p["ib_law"] = (law["law"], quantity(law["interval_C"]) if law["law"] == "doubling"
                   else quantity(law["per_C"]) if law["law"] == "coefficient" else 0.0)
    st = doc["stage"]
    fb = st["feedback"]
    temp = doc.get("temperature_C", 25)
    if isinstance(temp, dict):
        nominal_c = quantity(temp.get("nominal", 25))
        t_range = (quantity(temp["min"]) + ZERO_C, quantity(temp["max"]) + ZERO_C)
    else:
        nominal_c, t_range = quantity(temp), None
    tia = st.get("topology") == "transimpedance"
    stage = {
        "topology": st.get("topology", "inverting"),
        "T": nominal_c + ZERO_C,
        "T_range": t_range,
        "specs": resistor_specs(doc.get("resistors")),
        "dc_input": quantity(doc.get("dc_input", 0)),
        "fL": quantity(doc["band_Hz"]["low"]),
        "fH": quantity(doc["band_Hz"]["high"]),
        "Rs": quantity(doc.get("source", {}).get("voltage", {}).get("resistance", 0)),
        "Rin": 0.0 if tia else quantity(st.get("input_resistor", 0)),
        "Cf": 0.0 if fb.get("capacitor") == "auto" else quantity(fb.get("capacitor", 0)),
        "Cf_target": fb.get("capacitor_target", "butterworth")
                     if fb.get("capacitor") == "auto" else None,
        "RL": quantity(st["load"]) if "load" in st else None,
        "op": p,
    }
    cap = doc.get("source", {}).get("capacitive")
    stage["Cs"] = quantity(cap["capacitance"]) if cap else 0.0
    stage["Rleak"] = quantity(cap.get("leakage_resistance", 0)) if cap else 0.0
    if "input_capacitor" in st or "c3" in fb.get("tee", {}):
        raise NotImplementedError("no coupling capacitors in this nodal model")
    if tia:
        pd = doc["source"]["photodiode"]
        stage["Cd"] = quantity(pd.get("capacitance", 0))
        stage["Rsh"] = quantity(pd.get("shunt_resistance", 0))
        # The dark current flows only under reverse bias (zero bias:
        # photovoltaic, no dark current); the average photocurrent is given,
        # or optical power times responsivity.
        reverse_bias = quantity(pd.get("reverse_bias", 0))
        stage["Idark"] = quantity(pd.get("dark_current", 0)) if reverse_bias > 0 else 0.0
        stage["Iph"] = (quantity(pd["photocurrent"]) if "photocurrent" in pd
                        else quantity(pd.get("optical_power", 0))
                        * quantity(pd.get("responsivity", 0)))
        stage["pd_interval"] = quantity(pd.get("doubling_interval_C", 10))
        if "series_resistance" in pd or "bias_noise" in pd:
            raise NotImplementedError("no R_s or bias supply in this nodal model")
    stage["fref"] = (quantity(doc["reference_frequency_Hz"])
                     if "reference_frequency_Hz" in doc
                     else math.sqrt(stage["fL"] * stage["fH"]))
    if "tee" in fb:
        stage["tee"] = tuple(quantity(fb["tee"][k]) for k in ("r1", "r2", "r3"))
    else:
        stage["Rf"] = quantity(fb["resistor"])
    plus = st.get("plus_resistor")
    stage["Rp_mode"] = plus
    stage["chain"] = doc.get("chain")
    return stage


def technology(name):
    """A resistor technology file of devices/resistors: (noise index dB,
    temperature coefficient 1/K)."""
    with open(os.path.join(ROOT, "devices", "resistors", name + ".json")) as f:
        doc = json.load(f)
    return {"name": name, "NI": quantity(doc["noise_index_dB"]),
            "tc": quantity(doc["temperature_coefficient_per_C"])}


def resistor_specs(block):
    """The stage file's "resistors" block: {"technology": default for the
    stage's own parts, "<R name>": {"technology": ...}}. Returns
    {"default": tech or None, "overrides": {name: tech}} (a tolerance does
    not enter a budget)."""
    specs = {"default": None, "overrides": {}}
    if not block:
        return specs
    if "technology" in block:
        specs["default"] = technology(block["technology"])
    for key, value in block.items():
        if isinstance(value, dict):
            specs["overrides"][key] = (technology(value["technology"])
                                       if "technology" in value
                                       else specs["default"])
    return specs


def spec_for(stage, name):
    """The technology of resistor `name`: its override, else the stage's
    default for its own parts; the source resistance and the photodiode's
    shunt are the sensor's, so only an override gives them one."""
    specs = stage["specs"]
    if name in specs["overrides"]:
        return specs["overrides"][name]
    if name in ("R_source", "R_sh"):
        return None
    return specs["default"]


def bias_factor(op, T):
    """k(T) of the class's bias-current law, 1 at 25 C: doubling every
    interval, or 1 + coefficient (T - 25 C), or constant."""
    law, value = op["ib_law"]
    dt = T - (25 + ZERO_C)
    if law == "doubling":
        return 2 ** (dt / value)
    if law == "coefficient":
        return 1 + value * dt
    return 1.0


def at_temperature(stage, T):
    """The stage with its 25 C values moved to T by the documented laws:
    R (1 + tc (T - 25 C)) for a resistor with a technology; |Vos| + |drift|
    |T - 25 C| (the drift's sign is unknown); Ib and Ios times the bias
    law's k(T); 4kT at T. An "auto" R_plus is fitted at 25 C (plus_resistor
    below) and then drifts like any resistor. A photodiode's dark current
    doubles and its R_sh halves every doubling interval (10 C unless the
    file says; common practice); the photocurrent stays as given."""
    s = dict(stage)
    s["T"] = T
    dt = T - (25 + ZERO_C)
    op = dict(stage["op"])
    op["offset_voltage"] = (abs(op["offset_voltage"])
                            + abs(op.get("offset_voltage_drift", 0.0)) * abs(dt))
    k = bias_factor(op, T)
    op["bias_current"] *= k
    op["offset_current"] *= k
    if op["i_n_follows_ib"]:
        op["current_noise"] *= math.sqrt(abs(k))
    s["op"] = op

    def moved(name, ohms):
        spec = spec_for(stage, name)
        return ohms * (1 + spec["tc"] * dt) if spec else ohms

    tia = stage["topology"] == "transimpedance"
    if not tia:
        s["Rs"] = moved("R_source", stage["Rs"])
        s["Rin"] = moved("R_in", stage["Rin"])
    else:
        d = 2 ** (dt / stage["pd_interval"])
        s["Idark"] = stage["Idark"] * d
        if stage["Rsh"]:
            s["Rsh"] = moved("R_sh", stage["Rsh"] / d)
    if "tee" in stage:
        s["tee"] = tuple(moved(n, r) for n, r in zip(("R1", "R2", "R3"), stage["tee"]))
    else:
        s["Rf"] = moved("R_f", stage["Rf"])
    if stage["Rp_mode"] == "auto":
        # A real part: fitted to the balance value at 25 C, then it drifts.
        s["Rp_mode"] = moved("R_plus", plus_resistor(stage))
    elif stage["Rp_mode"] not in (None, 0):
        s["Rp_mode"] = moved("R_plus", quantity(stage["Rp_mode"]))
    if stage["RL"]:
        s["RL"] = moved("R_load", stage["RL"])
    return s


def equivalent(stage):
    r1, r2, r3 = stage["tee"]
    return r1 + r2 + r1 * r2 / r3  # star-mesh, REFERENCES.md section 6


def plus_resistor(stage):
    """The value of R_plus: "auto" is the DC resistance seen by the - input,
    (Rs + Rin) || (feedback at DC, its far end at the output, grounded)."""
    mode = stage["Rp_mode"]
    if mode is None or mode == 0:
        return 0.0
    if mode == "auto" and stage["topology"] == "transimpedance":
        # R_f || R_sh: the DC resistance seen by the - input.
        fb = stage["Rf"]
        rsh = stage["Rsh"]
        return fb if rsh == 0 else rsh * fb / (rsh + fb)
    if mode == "auto" and stage.get("Cs", 0) > 0:
        raise NotImplementedError("no auto R_plus for a capacitive sensor here")
    if mode == "auto":
        if "tee" in stage:
            r1, r2, r3 = stage["tee"]
            fb = r1 + r2 * r3 / (r2 + r3)
        else:
            fb = stage["Rf"]
        a = stage["Rs"] + stage["Rin"]
        return a * fb / (a + fb)
    return quantity(mode)


# ---------------------------------------------------------------- method 2


class Network:
    """Nodal analysis of the inverting stage. Nodes: in (after R_source),
    n (- pin), t (tee node), o (output pin), p (+ pin), a (ideal amplifier
    output, when Rout > 0). The source's far end is a known voltage."""

    def __init__(self, stage):
        self.s = stage
        op = stage["op"]
        self.A0 = op["open_loop_gain"]
        self.wp = 2 * math.pi * op["gbw"] / self.A0
        self.Rout = op.get("output_resistance", 0.0)
        self.Ccm = op.get("input_capacitance_cm", 0.0)
        self.Cd = op.get("input_capacitance_diff", 0.0)
        self.Rp = plus_resistor(stage)
        self.tia = stage["topology"] == "transimpedance"
        self.cap = stage.get("Cs", 0) > 0
        # A capacitive sensor's node: "x" before R_in, else the - input.
        self.sensor = ("x" if stage["Rin"] > 0 else "n") if self.cap else None
        names = (["in"] if stage["Rs"] > 0 and not self.tia else []) + ["n", "o"]
        if self.sensor == "x":
            names.append("x")
        if "tee" in stage:
            names.append("t")
        if self.Rp > 0:
            names.append("p")
        if self.Rout > 0:
            names.append("a")
        self.idx = {name: i for i, name in enumerate(names)}
        self.N = len(names)
        # (name, node a, node b, ohms); None is ground, "src" the source.
        r = []
        if self.tia:
            # The photodiode: its shunt resistance (noisy) from - to ground.
            if stage["Rsh"] > 0:
                r.append(("R_sh", "n", None, stage["Rsh"]))
        elif self.cap:
            # The sensor: C_s from the source (in matrix), its leakage from
            # its node to ground, R_in (when given) on to the - input.
            if stage["Rleak"] > 0:
                r.append(("R_leak", self.sensor, None, stage["Rleak"]))
            if self.sensor == "x":
                r.append(("R_in", "x", "n", stage["Rin"]))
        elif stage["Rs"] > 0:
            r.append(("R_source", "src", "in", stage["Rs"]))
            r.append(("R_in", "in", "n", stage["Rin"]))
        else:
            r.append(("R_in", "src", "n", stage["Rin"]))
        if "tee" in stage:
            r1, r2, r3 = stage["tee"]
            r += [("R1", "n", "t", r1), ("R2", "t", "o", r2), ("R3", "t", None, r3)]
        else:
            r.append(("R_f", "n", "o", stage["Rf"]))
        if self.Rp > 0:
            r.append(("R_plus", "p", None, self.Rp))
        if stage["RL"]:
            r.append(("R_load", "o", None, stage["RL"]))
        self.resistors = r
        # Excess noise (REFERENCES.md section 8): a 1/f voltage in series
        # with each resistor that has a technology, from its DC drop;
        # name -> (node a, node b, ohms, K) with S_i(f) = K / (R^2 f) as a
        # current across the resistor.
        self.drops = self.dc_drops()
        self.excess = {}
        for name, a, b, ohms in r:
            spec = spec_for(stage, name)
            v = self.drops[name]
            if spec is None or v == 0:
                continue
            k = (10 ** (spec["NI"] / 20) * 1e-6 * v) ** 2 / math.log(10)
            self.excess[name + " excess"] = (a, b, ohms, k)

    def dc_drops(self):
        """The DC operating point the excess noise sees, solved here at f = 0
        (finite A0): the stage's DC input (volts at the source's far end, or
        amperes of photocurrent into the - input), +Vos at the e_n position,
        Ib+ = Ib + Ios/2 and Ib- = Ib - Ios/2 drawn out of the pin nodes
        (Ios taken positive), the dark current beside the photocurrent.
        Returns {resistor name: V(a) - V(b)}."""
        Y, src_col, amp_row = self.matrix(0.0)
        op = self.s["op"]
        dc = self.s["dc_input"]
        rhs = np.zeros(self.N, dtype=complex)
        if self.tia:
            if amp_row != self.idx["n"]:
                rhs[self.idx["n"]] += dc + self.s["Idark"] + self.s["Iph"]
        else:
            rhs += -src_col * dc
        rhs[amp_row] += op["offset_voltage"]
        ib_plus = op["bias_current"] + 0.5 * op["offset_current"]
        ib_minus = op["bias_current"] - 0.5 * op["offset_current"]
        if "p" in self.idx:
            rhs[self.idx["p"]] -= ib_plus
        rhs[self.idx["n"]] -= ib_minus
        x = np.linalg.solve(Y, rhs).real

        def v(node):
            if node is None:
                return 0.0
            if node == "src":
                return 0.0 if self.tia else dc
            return x[self.idx[node]]

        return {name: v(a) - v(b) for name, a, b, _ in self.resistors}

    def _index(self, node):
        if node is None or node == "src":
            return None
        return self.idx[node]

    def matrix(self, f):
        """Y(j w) and the row of the op-amp constraint."""
        w = 2 * math.pi * f
        Y = np.zeros((self.N, self.N), dtype=complex)
        src_col = np.zeros(self.N, dtype=complex)  # coefficients of V_src

        def admit(a, b, y):
            for x, sign_x in ((a, 1), (b, -1)):
                ix = self._index(x)
                if ix is None:
                    continue
                for z, sign_z in ((a, 1), (b, -1)):
                    iz = self._index(z)
                    if iz is None:
                        if z == "src":
                            src_col[ix] += sign_x * sign_z * y
                        continue
                    Y[ix, iz] += sign_x * sign_z * y

        for _, a, b, ohms in self.resistors:
            admit(a, b, 1 / ohms)
        if self.s["Cf"] > 0:
            admit("n", "o", 1j * w * self.s["Cf"])
        if self.tia:
            admit("n", None, 1j * w * self.s["Cd"])
        if self.cap:
            admit("src", self.sensor, 1j * w * self.s["Cs"])
        plus = "p" if "p" in self.idx else None
        admit("n", None, 1j * w * self.Ccm)
        if plus:
            admit(plus, None, 1j * w * self.Ccm)
        admit(plus, "n", 1j * w * self.Cd)
        drive = "a" if "a" in self.idx else "o"
        if drive == "a":
            admit("a", "o", 1 / self.Rout)
        # The driven node's KCL row becomes the amplifier's equation
        # (1/A0 + s/(A0 wp)) V_drive - V_+ + V_- = e_n.
        row = self.idx[drive]
        Y[row, :] = 0
        src_col[row] = 0
        Y[row, row] = 1 / self.A0 + 1j * w / (self.A0 * self.wp)
        if plus:
            Y[row, self.idx[plus]] = -1
        Y[row, self.idx["n"]] += 1
        return Y, src_col, row

    def transfers(self, f):
        """{source name: |H|^2 in V^2 per unit PSD}, and the signal gain."""
        Y, src_col, amp_row = self.matrix(f)
        o = self.idx["o"]
        out = {}
        cols, names = [], []

        def current_into(node):
            b = np.zeros(self.N, dtype=complex)
            i = self._index(node)
            if i is not None and i != amp_row:
                b[i] = 1
            return b

        for name, a, b_node, ohms in self.resistors:
            # The thermal noise current 4kT/R across the resistor.
            b = current_into(a) - current_into(b_node)
            cols.append(b)
            names.append((name, 4 * K_B * self.s["T"] / ohms))
        for name, (a, b_node, ohms, k) in self.excess.items():
            cols.append(current_into(a) - current_into(b_node))
            names.append((name, ("1/f", k / ohms ** 2)))
        b = np.zeros(self.N, dtype=complex)
        b[amp_row] = 1
        cols.append(b)
        names.append(("e_n", None))
        cols.append(current_into("n"))
        names.append(("i_n-", None))
        if "p" in self.idx:
            cols.append(current_into("p"))
            names.append(("i_n+", None))
        if self.tia and self.s["Idark"] > 0:
            # Schottky: the dark current's shot noise 2 q I (section 2).
            cols.append(current_into("n"))
            names.append(("shot", 2 * Q_E * self.s["Idark"]))
        if self.tia and self.s["Iph"] > 0:
            # Schottky: the average photocurrent's shot noise 2 q I_ph.
            cols.append(current_into("n"))
            names.append(("shot", 2 * Q_E * self.s["Iph"]))
        if self.tia:
            # Signal: the photocurrent into the - input (V/A).
            cols.append(current_into("n"))
        else:
            # Signal: V_src = 1 moves -src_col to the right-hand side.
            cols.append(-src_col)
        names.append(("signal", None))
        rhs = np.array(cols).T
        x = np.linalg.solve(Y, rhs)  # one direct solve per column
        for k, (name, psd) in enumerate(names):
            out[name] = (x[o, k], psd)
        return out

    def psd_total(self, f, only=None):
        """The output PSD at f: every source, or only the one named."""
        op = self.s["op"]
        ew, fcv = op["voltage_noise"], op.get("voltage_noise_corner", 0.0)
        iw, fci = op["current_noise"], op.get("current_noise_corner", 0.0)
        total = 0.0
        for name, (h, psd) in self.transfers(f).items():
            if name == "signal" or (only is not None and name != only):
                continue
            if name == "e_n":
                psd = ew * ew * (1 + fcv / f)
            elif name.startswith("i_n"):
                psd = iw * iw * (1 + fci / f)
            elif isinstance(psd, tuple):  # excess: K / (R^2 f)
                psd = psd[1] / f
            total += abs(h) ** 2 * psd
        return total

    def output_rms(self, only=None):
        fL, fH = self.s["fL"], self.s["fH"]
        # In u = ln f the integrand is S(f) f; split at every decade.
        edges = np.unique(np.concatenate((
            [math.log(fL), math.log(fH)],
            np.log(10.0 ** np.arange(math.ceil(math.log10(fL)),
                                     math.floor(math.log10(fH)) + 1)))))
        edges = edges[(edges >= math.log(fL)) & (edges <= math.log(fH))]
        total = 0.0
        for lo, hi in zip(edges[:-1], edges[1:]):
            v, _ = integrate.quad(lambda u: self.psd_total(math.exp(u), only) * math.exp(u),
                                  lo, hi, epsabs=0, epsrel=1e-11, limit=200)
            total += v
        return math.sqrt(total)

    def signal_gain(self, f):
        return abs(self.transfers(f)["signal"][0])

    def input_rms(self):
        """sqrt of the integral of S_out(f) / |signal gain(f)|^2 over the
        band: the noise an ideal source at the input would need to make
        the same output, frequency by frequency."""
        fL, fH = self.s["fL"], self.s["fH"]
        edges = np.unique(np.concatenate((
            [math.log(fL), math.log(fH)],
            np.log(10.0 ** np.arange(math.ceil(math.log10(fL)),
                                     math.floor(math.log10(fH)) + 1)))))
        edges = edges[(edges >= math.log(fL)) & (edges <= math.log(fH))]
        total = 0.0
        for lo, hi in zip(edges[:-1], edges[1:]):
            v, _ = integrate.quad(
                lambda u: self.psd_total(math.exp(u))
                / self.signal_gain(math.exp(u)) ** 2 * math.exp(u),
                lo, hi, epsabs=0, epsrel=1e-11, limit=200)
            total += v
        return math.sqrt(total)

    def offsets(self):
        """(vos term, ib term, ios term, worst case) at DC, finite A0:
        Vout = Vos NG - Ib (H+ + H-) - (Ios/2)(H+ - H-) (DESIGN.md bias
        convention Ib+- = Ib +- Ios/2, currents into the pins)."""
        t = self.transfers(1e-30)  # DC: the capacitors carry nothing
        op = self.s["op"]
        ng = abs(t["e_n"][0])
        hm = t["i_n-"][0].real
        hp = t["i_n+"][0].real if "i_n+" in t else 0.0
        vos = op["offset_voltage"] * ng
        ib = -op["bias_current"] * (hp + hm)
        ios = abs(0.5 * op["offset_current"] * (hp - hm))
        # A photodiode's dark current flows through the same DC transfer
        # as the photocurrent: I_dark times the DC transimpedance.
        dark = abs(self.s.get("Idark", 0.0) * t["signal"][0].real) if self.tia else 0.0
        return vos, ib, ios, vos + abs(ib) + ios + dark


# ------------------------------------- the automatic feedback capacitor


def response_q(stage, cf, f_ref=1e-3, f_max=None):
    """Q of the closed-loop signal response read as src/analysis/
    frequency_response.h defines it (SecondOrderQ): at the frequency f_90
    where the phase has turned by -90 degrees from its value at f_ref,
    Q = |H(f_90)| / |H(f_ref)|; exact for 1/(1 + s/(Q w0) + s^2/w0^2).
    Written here on this file's own nodal analysis: a scan at 50 points
    per decade with numpy's unwrap, then brentq on the turned phase.
    None when the phase never turns by 90 degrees below f_max."""
    s = dict(stage)
    s["Cf"] = cf
    net = Network(s)
    if f_max is None:
        f_max = 1e3 * s["op"]["gbw"]

    def h(f):
        return net.transfers(f)["signal"][0]

    h_ref = h(f_ref)
    fs = np.logspace(math.log10(f_ref), math.log10(f_max),
                     int(50 * math.log10(f_max / f_ref)) + 1)
    turned = np.unwrap(np.angle([h(f) / h_ref for f in fs]))
    below = np.nonzero(turned <= -math.pi / 2)[0]
    if len(below) == 0:
        return None
    k = below[0]
    base = turned[k - 1] - math.atan2((h(fs[k - 1]) / h_ref).imag,
                                     (h(fs[k - 1]) / h_ref).real)

    def excess(u):
        z = h(math.exp(u)) / h_ref
        return base + math.atan2(z.imag, z.real) + math.pi / 2

    u90 = optimize.brentq(excess, math.log(fs[k - 1]), math.log(fs[k]),
                          xtol=1e-14, rtol=1e-14)
    return abs(h(math.exp(u90))) / abs(h_ref)


def auto_capacitor(stage):
    """The C_f that makes response_q equal 1/sqrt 2 (a maximally flat,
    Butterworth, second-order response), by brentq in ln C_f; Q falls as
    C_f grows. Only the "butterworth" target is derived here."""
    assert stage["Cf_target"] == "butterworth", stage["Cf_target"]
    target = 1 / math.sqrt(2)

    def miss(u):
        q = response_q(stage, math.exp(u))
        return (q if q is not None else 0.0) - target

    return math.exp(optimize.brentq(miss, math.log(1e-15), math.log(1e-9),
                                    xtol=1e-12, rtol=1e-13))


def butterworth_closed_form(stage):
    """REFERENCES.md section 7, A(s) = w_t / s: exactly
    C_f = sqrt(2 w_t R_f C - 1) / (w_t R_f), with C the capacitance at the
    - input (C_d + C_cm + C_diff, the + input grounded); and the simpler
    sqrt(C / (pi R_f GBW)) the engine prints as its estimate."""
    wt = 2 * math.pi * stage["op"]["gbw"]
    rf = stage["Rf"]
    c = input_capacitance(stage)
    return (math.sqrt(2 * wt * rf * c - 1) / (wt * rf),
            math.sqrt(c / (math.pi * rf * stage["op"]["gbw"])))


def check_capacitor_method(stage):
    """The Q-based search must reproduce section 7's exact Butterworth C_f
    where section 7's model holds: R_out = 0, no load, no R_sh, A0 -> 1e9
    (then A(s) = w_t / s above 1 Hz). Fails loudly otherwise."""
    ideal = dict(stage)
    ideal["op"] = dict(stage["op"], output_resistance=0.0, open_loop_gain=1e9)
    ideal["RL"] = None
    ideal["Rsh"] = 0.0
    found = auto_capacitor(ideal)
    exact = butterworth_closed_form(ideal)[0]
    assert abs(found / exact - 1) < 1e-6, (found, exact)
    return found / exact - 1


def input_capacitance(stage):
    op = stage["op"]
    return (stage["Cd"] + op.get("input_capacitance_cm", 0.0)
            + op.get("input_capacitance_diff", 0.0))


# ---------------------------------------------------------------- method 1


def tia_closed_form(stage):
    """REFERENCES.md section 7 model, integrated here: an integrator op-amp
    A(s) = w_t / s with no output resistance, Y = sC + 1/R_sh at the -
    input (C = C_d + C_cm + C_diff), Z_f = R_f / (1 + s R_f C_f). The
    closed-loop transimpedance is Z = -Z_f / (1 + (1 + Z_f Y)/A); every
    current at the - input (R_f's 4kT/R_f, R_sh's 4kT/R_sh, i_n, the
    dark current's 2qI) reaches the output through Z, e_n through
    (1 + Z_f Y) / (1 + (1 + Z_f Y)/A). The load and the finite A0 are left
    out. Returns (output rms, input-referred rms, worst-case offset)."""
    T, fL, fH = stage["T"], stage["fL"], stage["fH"]
    op = stage["op"]
    ew, fcv = op["voltage_noise"], op.get("voltage_noise_corner", 0.0)
    iw, fci = op["current_noise"], op.get("current_noise_corner", 0.0)
    wt = 2 * math.pi * op["gbw"]
    rf, cf, rsh = stage["Rf"], stage["Cf"], stage["Rsh"]
    c = input_capacitance(stage)
    kt4 = 4 * K_B * T

    def parts(f):
        s = 2j * math.pi * f
        zf = rf / (1 + s * rf * cf)
        y = s * c + (1 / rsh if rsh else 0.0)
        a = wt / s
        ng = 1 + zf * y
        z = -zf / (1 + ng / a)
        return z, ng / (1 + ng / a)

    def psd(f):
        z, en_gain = parts(f)
        currents = kt4 / rf + (kt4 / rsh if rsh else 0.0) \
            + iw * iw * (1 + fci / f) + 2 * Q_E * (stage["Idark"] + stage["Iph"])
        return abs(z) ** 2 * currents + abs(en_gain) ** 2 * ew * ew * (1 + fcv / f)

    total = 0.0
    total_in = 0.0  # S_out / |Z|^2: the input-referred power
    edges = np.log(np.geomspace(fL, fH, 2 * int(math.ceil(math.log10(fH / fL))) + 1))
    for lo, hi in zip(edges[:-1], edges[1:]):
        v, _ = integrate.quad(lambda u: psd(math.exp(u)) * math.exp(u), lo, hi,
                              epsabs=0, epsrel=1e-11, limit=200)
        total += v
        v, _ = integrate.quad(
            lambda u: psd(math.exp(u)) / abs(parts(math.exp(u))[0]) ** 2
            * math.exp(u), lo, hi, epsabs=0, epsrel=1e-11, limit=200)
        total_in += v
    rms = math.sqrt(total)
    # DC, ideal op-amp: the - input is a virtual ground, so R_sh carries no
    # current and Z(0) = -R_f for every current into it (I_b-, I_os/2,
    # I_dark); V_os sees NG(0) = 1 + R_f / R_sh. The + input is grounded.
    ng0 = 1 + (rf / rsh if rsh else 0.0)
    worst = (op["offset_voltage"] * ng0 + abs(op["bias_current"]) * rf
             + 0.5 * op["offset_current"] * rf + stage["Idark"] * rf)
    return rms, math.sqrt(total_in), worst



def closed_form_drops(stage):
    """The DC drops of the excess-noise operating point (the stimuli of
    Network.dc_drops) with an ideal op-amp: V+ = -Ib+ R_plus, V- = V+ + Vos,
    the input current (V_dc - V-)/(R_source + R_in), Ib- drawn at the - input,
    the rest down the feedback (through R1 to the tee node, R3 to ground,
    R2 to the output)."""
    op = stage["op"]
    rp = plus_resistor(stage)
    ib_plus = op["bias_current"] + 0.5 * op["offset_current"]
    ib_minus = op["bias_current"] - 0.5 * op["offset_current"]
    v_plus = -ib_plus * rp
    v_minus = v_plus + op["offset_voltage"]
    i_in = (stage["dc_input"] - v_minus) / (stage["Rs"] + stage["Rin"])
    i_fb = i_in - ib_minus
    drops = {"R_source": i_in * stage["Rs"], "R_in": i_in * stage["Rin"],
             "R_plus": v_plus}
    if "tee" in stage:
        r1, r2, r3 = stage["tee"]
        v_t = v_minus - i_fb * r1
        i_2 = i_fb - v_t / r3
        drops.update({"R1": i_fb * r1, "R3": v_t, "R2": i_2 * r2})
        drops["R_load"] = v_t - i_2 * r2
    else:
        drops["R_f"] = i_fb * stage["Rf"]
        drops["R_load"] = v_minus - i_fb * stage["Rf"]
    return drops


def closed_form(stage):
    """Ideal op-amp, section 6 noise gains (R_source in series with R_in).
    Returns (output rms, input-referred rms, worst-case offset, {excess
    contributor: output rms}). A feedback capacitor C from the - input to
    the output is a single pole fp = 1/(2 pi R C) on every term that flows
    through the feedback, R = R_f, or R_eq for a T network: with an ideal
    op-amp the T network's transfers are exactly its DC gains over
    (1 + s C R_eq) (KCL at the - input and the tee node), and its noise
    gain is (NG_T + s C R_eq)/(1 + s C R_eq), the same form as the plain
    stage's, so |NG|^2 = 1 + (NG0^2 - 1)/(1 + (f/fp)^2). Excess noise
    (section 8) is a 1/f voltage in series with its resistor, with that
    resistor's thermal-noise gain, from the drops of closed_form_drops; the
    load reaches the output only through R_out, 0 here."""
    if stage["topology"] == "transimpedance":
        assert all(spec_for(stage, n) is None for n in ("R_f", "R_sh", "R_load")), \
            "no closed form for a photodiode stage's excess noise is written here"
        return tia_closed_form(stage) + ({},)
    if stage.get("Cs", 0) > 0:
        return charge_closed_form(stage) + ({},)
    T, fL, fH = stage["T"], stage["fL"], stage["fH"]
    op = stage["op"]
    ew, fcv = op["voltage_noise"], op.get("voltage_noise_corner", 0.0)
    iw, fci = op["current_noise"], op.get("current_noise_corner", 0.0)
    rin = stage["Rs"] + stage["Rin"]
    rp = plus_resistor(stage)
    kt4 = 4 * K_B * T

    if "tee" in stage:
        r1, r2, r3 = stage["tee"]
        rfb = equivalent(stage)
        ng0 = 1 + r2 / r3 + rfb / rin  # NG_T
        paths = [("R1", r1, 1 + r2 / r3), ("R2", r2, 1.0), ("R3", r3, r2 / r3)]
    else:
        rfb = stage["Rf"]
        ng0 = 1 + rfb / rin
        paths = [("R_f", rfb, 1.0)]
    gain = rfb / rin
    paths = [("R_source", stage["Rs"], gain), ("R_in", stage["Rin"], gain)] + paths
    paths = [(n, r, g, "pole") for n, r, g in paths if r > 0]
    if rp:
        paths.append(("R_plus", rp, ng0, "ng"))
    fp = 1 / (2 * math.pi * rfb * stage["Cf"]) if stage["Cf"] > 0 else None

    def pole(flicker, at_fp):
        """integral over the band of |1/(1 + j f/fp)|^2 df, or of that / f."""
        if at_fp is None:
            return math.log(fH / fL) if flicker else fH - fL
        if flicker:  # integral of 1/(f (1 + (f/fp)^2)) = ln f - ln(1 + (f/fp)^2)/2
            def g(f):
                return math.log(f) - 0.5 * math.log1p((f / at_fp) ** 2)
            return g(fH) - g(fL)
        return at_fp * (math.atan(fH / at_fp) - math.atan(fL / at_fp))

    def band(shape, white, flicker):
        """integral of |H/H(0)|^2 (white + flicker/f) over the band."""
        def part(flick):
            if shape == "pole":
                return pole(flick, fp)
            # |NG|^2 / NG0^2 = (1 + (NG0^2 - 1)|pole|^2) / NG0^2
            if fp is None:
                return pole(flick, None)
            return (pole(flick, None) + (ng0 ** 2 - 1) * pole(flick, fp)) / ng0 ** 2
        return white * part(False) + flicker * part(True)

    power = 0.0
    for name, ohms, g, shape in paths:
        power += kt4 * ohms * g ** 2 * band(shape, 1, 0)
    power += (ew * ng0) ** 2 * band("ng", 1, fcv)
    power += (iw * rfb) ** 2 * band("pole", 1, fci)
    if rp:
        power += (iw * rp * ng0) ** 2 * band("ng", 1, fci)
    drops = closed_form_drops(stage)
    excess = {}
    for name, ohms, g, shape in paths:
        spec = spec_for(stage, name)
        if spec is None or drops[name] == 0:
            continue
        k = (10 ** (spec["NI"] / 20) * 1e-6 * drops[name]) ** 2 / math.log(10)
        excess[name + " excess"] = math.sqrt(k * g ** 2 * band(shape, 0, 1))
        power += excess[name + " excess"] ** 2
    if fp:  # the input-referred figure divides by |gain(f_ref)|
        gain /= math.sqrt(1 + (stage["fref"] / fp) ** 2)
    vos = op["offset_voltage"] * ng0
    ib = op["bias_current"] * (rfb - rp * ng0)
    ios = 0.5 * op["offset_current"] * (rfb + rp * ng0)
    rms = math.sqrt(power)
    return rms, rms / gain, vos + abs(ib) + ios, excess


def charge_closed_form(stage):
    """The ideal charge amplifier (module docstring): output rms, the
    input-referred rms at the reference's gain, the worst-case offset. With
    R_in only the offset (C_s open at DC: R_in + R_leak is the input's DC
    path), the noise as None."""
    assert plus_resistor(stage) == 0 and stage["Cf"] > 0
    assert all(spec_for(stage, n) is None for n in ("R_f", "R1", "R2", "R3", "R_load")), \
        "no excess noise in the charge closed form"
    T, fL, fH = stage["T"], stage["fL"], stage["fH"]
    op = stage["op"]
    ew, fcv = op["voltage_noise"], op.get("voltage_noise_corner", 0.0)
    iw, fci = op["current_noise"], op.get("current_noise_corner", 0.0)
    kt4 = 4 * K_B * T
    if "tee" in stage:
        r1, r2, r3 = stage["tee"]
        rfb = equivalent(stage)
        ng0 = 1 + r2 / r3
        paths = [(r1, 1 + r2 / r3), (r2, 1.0), (r3, r2 / r3)]
    else:
        rfb = stage["Rf"]
        ng0 = 1.0
        paths = [(rfb, 1.0)]
    if stage["Rleak"] > 0:
        ng0 += rfb / (stage["Rleak"] + stage["Rin"])
        # A current 4kT/R_leak into the virtual ground: as a voltage in
        # series with R_leak, its gain to the output is R / R_leak.
        paths.append((stage["Rleak"], rfb / stage["Rleak"]))
    vos = op["offset_voltage"] * ng0
    ib = op["bias_current"] * rfb
    ios = 0.5 * op["offset_current"] * rfb
    if stage["Rin"] > 0:
        return None, None, vos + abs(ib) + ios
    fp = 1 / (2 * math.pi * rfb * stage["Cf"])
    k = 1 + stage["Cs"] / stage["Cf"]

    def white(at_fp):  # integral of 1/(1 + (f/fp)^2) df
        return at_fp * (math.atan(fH / at_fp) - math.atan(fL / at_fp))

    def flicker(at_fp):  # integral of 1/(f (1 + (f/fp)^2)) df
        def g(f):
            return math.log(f) - 0.5 * math.log1p((f / at_fp) ** 2)
        return g(fH) - g(fL)

    power = sum(kt4 * ohms * g ** 2 * white(fp) for ohms, g in paths)
    power += (iw * rfb) ** 2 * (white(fp) + fci * flicker(fp))
    ng_white = k * k * (fH - fL) + (ng0 ** 2 - k * k) * white(fp)
    ng_flicker = k * k * math.log(fH / fL) + (ng0 ** 2 - k * k) * flicker(fp)
    power += ew * ew * (ng_white + fcv * ng_flicker)
    x = stage["fref"] / fp
    gain = stage["Cs"] / stage["Cf"] * x / math.sqrt(1 + x * x)
    rms = math.sqrt(power)
    return rms, rms / gain, vos + abs(ib) + ios


def passband_gain(net):
    """The largest |gain| in the band (the passband of a stage that blocks
    DC, src/analysis/frequency_response.h's definition, coded here anew):
    a scan at 40 points a decade, then bounded Brent in ln f."""
    lo, hi = math.log(net.s["fL"]), math.log(net.s["fH"])
    grid = np.linspace(lo, hi, int(40 * (hi - lo) / math.log(10)) + 2)
    values = [net.signal_gain(math.exp(u)) for u in grid]
    i = int(np.argmax(values))
    a, b = grid[max(i - 1, 0)], grid[min(i + 1, len(grid) - 1)]
    if b <= a:
        return values[i]
    best = optimize.minimize_scalar(lambda u: -net.signal_gain(math.exp(u)),
                                    bounds=(a, b), method="bounded",
                                    options={"xatol": 1e-10})
    return max(values[i], -best.fun)


def check_closed_form(stage):
    """The closed forms must be the nodal analysis's limit for an ideal
    op-amp: A0 = 1e12 with its pole at 1 MHz, no R_out, no pin capacitance.
    Fails loudly otherwise; returns the largest relative gap."""
    ideal = dict(stage)
    ideal["op"] = dict(stage["op"], open_loop_gain=1e12, gbw=1e18,
                       output_resistance=0.0, input_capacitance_cm=0.0,
                       input_capacitance_diff=0.0)
    net = Network(ideal)
    cf = closed_form(ideal)
    gaps = [net.offsets()[3] / cf[2] - 1]
    if cf[0] is not None:
        gaps.append(net.output_rms() / cf[0] - 1)
    gaps += [net.output_rms(only=c) / cf[3][c] - 1 for c in cf[3]]
    worst = max(abs(g) for g in gaps)
    assert worst < 1e-8, gaps
    return worst


def tee_cost(stage, given):
    """The tee stage (at its temperature) against the plain stage built
    from the stage as given (25 C values, its own "auto" R_plus fitted to
    it) and then moved to the same temperature, with the same C_f."""
    plain = dict(given, Cf=stage["Cf"], Cf_target=None)
    plain.pop("tee")
    plain["Rf"] = equivalent(given)
    plain = at_temperature(plain, stage["T"])
    return Network(stage).output_rms() / Network(plain).output_rms(), plain


def filter_power(block):
    """|H(f)|^2 of a chain filter, from scipy.signal's analog prototypes
    (the cutoff is the -3 dB frequency: Bessel normalised by 'mag')."""
    if block is None or block["kind"] == "none":
        g = quantity(block.get("gain", 1)) if block else 1.0
        return lambda f: g * g
    g = quantity(block.get("gain", 1))
    wc = 2 * math.pi * quantity(block["cutoff"])
    n = int(block.get("order", 1))
    if block["kind"] == "butterworth":
        b, a = signal.butter(n, wc, analog=True)
    elif block["kind"] == "bessel":
        b, a = signal.bessel(n, wc, analog=True, norm="mag")
    else:  # single_pole
        b, a = [wc], [1, wc]

    def h2(f):
        _, h = signal.freqs(b, a, worN=[2 * math.pi * f])
        return g * g * abs(h[0]) ** 2
    return h2


def second_stage(block, T):
    """(|G2(f)|^2, its own output PSD S_2(f)) of a chain's second stage."""
    if block is None:
        return (lambda f: 1.0), (lambda f: 0.0)
    g = quantity(block["gain"])
    ng = quantity(block.get("noise_gain", abs(g)))
    bw = block.get("bandwidth")
    fp = (quantity(bw["gbw"]) / ng if isinstance(bw, dict)
          else quantity(bw) if bw is not None else None)
    pole = (lambda f: 1.0) if fp is None else (lambda f: 1 / (1 + (f / fp) ** 2))
    en = block.get("input_noise", {})
    ew, fce = quantity(en.get("density", 0)), quantity(en.get("corner", 0))
    cn = block.get("input_current_noise", {})
    iw, fci = quantity(cn.get("density", 0)), quantity(cn.get("corner", 0))
    rs = quantity(block.get("source_resistance", 0))
    return ((lambda f: g * g * pole(f)),
            (lambda f: (ew * ew * (1 + fce / f) * ng * ng
                        + (iw * iw * (1 + fci / f) * rs * rs
                           + 4 * K_B * T * rs) * g * g) * pole(f)))


def chain_figures(stage, net):
    """The chain's figures (module docstring), and the white closed form of
    its analog rms."""
    chain = stage["chain"]
    adc = chain["adc"]
    g2, s2 = second_stage(chain.get("second_stage"), stage["T"])
    h2 = filter_power(chain.get("filter"))
    e_f = quantity((chain.get("filter") or {}).get("noise", 0))

    def psd(f):
        h = h2(f)
        return net.psd_total(f) * g2(f) * h + s2(f) * h + e_f * e_f * h
    f_lo = stage["fL"]
    f_hi = 1e4 * quantity(adc["sample_rate"])
    edges = np.log(np.concatenate((
        [f_lo], 10.0 ** np.arange(math.floor(math.log10(f_lo)) + 1,
                                  math.floor(math.log10(f_hi)) + 1))))
    edges = np.unique(np.append(edges, math.log(f_hi)))
    power = 0.0
    for lo, hi in zip(edges[:-1], edges[1:]):
        v, _ = integrate.quad(lambda u: psd(math.exp(u)) * math.exp(u), lo, hi,
                              epsabs=0, epsrel=1e-11, limit=400)
        power += v
    analog = math.sqrt(power)
    bits, fs_v = int(adc["bits"]), quantity(adc["full_scale"])
    q = fs_v / 2 ** bits
    sine = fs_v / (2 * math.sqrt(2))
    if "snr_dB" in adc:
        n_adc = sine * 10 ** (-adc["snr_dB"] / 20)
        own = math.sqrt(max(0.0, n_adc ** 2 - q * q / 12))
    else:
        own = quantity(adc.get("input_noise_rms", 0))
    total = math.sqrt(power + own * own + q * q / 12)
    snr = 20 * math.log10(sine / total)
    figures = {
        "chain_analog_rms_V": analog,
        "chain_total_rms_V": total,
        "adc_snr_dB": snr,
        "adc_enob_bits": (snr - 10 * math.log10(1.5)) / (20 * math.log10(2)),
        "adc_noise_free_bits": math.log2(fs_v / (6.6 * total)),
        "adc_effective_resolution_bits": math.log2(fs_v / total),
    }
    closed = {}
    block = chain.get("filter")
    if block is not None and block["kind"] == "butterworth":
        n = int(block.get("order"))
        enbw = (math.pi / (2 * n)) / math.sin(math.pi / (2 * n)) * quantity(block["cutoff"])
        fref = stage["fref"]
        white = (net.psd_total(fref) * g2(fref) + s2(fref)) * quantity(block.get("gain", 1)) ** 2
        closed["chain_analog_rms_V"] = math.sqrt(white * enbw)
    return figures, closed


# Why each example does or does not sit in closed-form territory.
NOTES = {
    "accelerometer-charge-amp.json":
        "a 1.2 nF piezo accelerometer (10 pC/g) with 10 G leakage behind a "
        "1 k input resistor into 1 G || 1 nF: 1 mV/pC in the passband, the "
        "low corner 1/(2 pi R_f C_f) = 0.16 Hz. At DC C_s is open, so the "
        "noise gain is 1 + R_f/(R_in + R_leak) and the offset V_os NG + "
        "(I_b + I_os/2) R_f; with R_in there is no noise closed form here",
    "hydrophone-preamp.json":
        "at 15 C (laws as for the geophone): a 4.7 nF ceramic with 20 G "
        "leakage straight into the - input, C_f 100 pF (10 mV/pC, 4.7 mV/Pa "
        "at 0.47 pC/Pa) with a T network of 4.7 M, 4.7 M, 10 k (R_eq 2.2 G, "
        "the low corner 0.72 Hz) as the DC path. The T's price: the DC noise "
        "gain 1 + R2/R3 + R_eq/R_leak = 471 multiplies V_os, and R1's noise "
        "rides on 1 + R2/R3 through the pole 1/(2 pi R_eq C_f). Closed forms: "
        "the ideal charge amplifier (module docstring); the finite GBW moves "
        "the noise gain's plateau 1 + C_s/C_f little in this band",
    "large-area-receiver.json":
        "a large-area photodiode (470 pF) at zero bias, 25 C, 47 k "
        "transimpedance with 220 pF across it (its pole at 15.4 kHz, above "
        "the 10 kHz band); 20 uA "
        "of background photocurrent, whose shot noise 2 q I_ph (Schottky, "
        "REFERENCES.md section 2: 2.53 pA/rtHz) is most of the noise: "
        "4kT/R_f gives 0.59 pA/rtHz. Offset: V_os (1 + R_f/R_sh) + "
        "(I_b + I_os/2) R_f; the photocurrent's DC output (-0.94 V) is the "
        "signal's DC level, no offset",
    "geophone-preamp.json":
        "at 15 C: V_os = 300 uV + 3 uV/C x 10 C, I_b and I_os halved "
        "(doubling every 10 C), 4kT at 288.15 K; no resistors block, so no "
        "tempco and no excess noise. The closed-loop bandwidth (about 19 "
        "kHz, GBW / NG_T) is only 4x the band's 5 kHz edge, so the ideal "
        "closed forms are about 1 % high; the nodal analysis with the finite "
        "GBW is the expectation. Offset: the closed form is high by about "
        "NG_T/A0 = 1e-3",
    "load-cell-bridge.json":
        "at 25 C, where every temperature law is the identity. Closed-form "
        "territory: 0.1-10 Hz, far below GBW / NG; the closed "
        "forms carry the feedback capacitor's pole exactly and differ by "
        "about 1e-4 only through the finite GBW seen through that pole's "
        "phase (Re(NG/A) = |NG| f/GBW sin(phase of NG))",
    "pressure-bridge-outdoor.json":
        "a T network with a capacitor over -20/25/70 C, thin film with a "
        "thick-film R3 and R_plus, a -5 mV DC input. Nominal figures at 25 C "
        "(laws the identity); the _at_min/_at_max figures move the 25 C "
        "values to each end (R (1 + tc dT), |V_os| + |drift| |dT|, I_b and "
        "I_os x (1 - 0.3 %/C dT), 4kT at T, the auto R_plus rebalanced "
        "from the moved values, as budget/stage_at_temperature.h states; a "
        "thick-film part fixed at its 25 C balance value and moved by its "
        "own 100 ppm/C would leave an I_b term of +20 uV at -20 C and -15 uV "
        "at 70 C, +5e-4 on those worst cases). Excess noise: section 8's 1/f density from "
        "each resistor's DC drop (+V_os, I_b +- I_os/2 drawn at the pins, "
        "the DC input); each excess contributor is listed on its own, as "
        "together they are about 1e-4 of the output rms, under the total's "
        "tolerance. Closed forms (ideal op-amp, every feedback transfer over "
        "1 + s C R_eq, drops from the ideal DC point) are reproduced to "
        "2e-9 by the nodal analysis of an ideal op-amp (check_closed_form); "
        "against the real one they are about 1 % high, all of it the 1 MHz "
        "GBW seen through the feedback pole's phase (GBW / NG_T about 1 kHz, "
        "the pole at 320 Hz); the excess terms, weighted to low frequency, "
        "0.26 %. Offsets: high by about NG_T/A0 = 1.7e-4",
    "smoke-chamber-receiver.json":
        "a photodiode transimpedance stage at 40 C, zero bias (no dark "
        "current flows), with 2 nA of average photocurrent (its shot noise "
        "2 q I_ph joins the currents at the - input) and C_f chosen for a "
        "Butterworth response on the stage at 40 C; R_sh = 500 M at 25 C "
        "halves every 10 C (x 2^-1.5 at 40 C, common practice). Noise: the "
        "section 7 model (integrator op-amp, no R_out, no load, C = C_d + "
        "C_cm + C_diff) integrated here sits 5e-4 below the nodal analysis, "
        "which keeps A0, R_out and the load. C_f: the nodal response's "
        "Q = 1/sqrt 2 point is 0.47 % above section 7's exact "
        "sqrt(2 wt Rf C - 1)/(wt Rf); that is the op-amp's 100 ohm R_out, "
        "finite A0 and R_sh (without them check_capacitor_method below "
        "reproduces the closed form to 1e-6), so the closed form is the "
        "model's limit and the nodal value is the expectation. Offset: "
        "ideal-op-amp closed form V_os (1 + R_f/R_sh) + (I_b + I_os/2) R_f, "
        "1e-6 from the finite-A0 solve; V_os = 300 uV + 3 uV/C x 15 C, I_b "
        "and I_os x 2^1.5 (doubling every 10 C); the photocurrent is the "
        "signal's DC level, no offset",
    "turbidity-receiver.json":
        "a photodiode stage (50 pF, zero bias, 200 nA of scattered light "
        "whose shot noise is most of its noise) into a x4 second stage "
        "(10 MHz GBW, 10 nV/rtHz with a 100 Hz corner), a 4th-order "
        "Butterworth at 5 kHz and a 16-bit converter (5 V, 25 kS/s, 92 dB "
        "SNR). The chain's white closed form (the output density at 100 Hz "
        "times 4 through the Butterworth's ENBW) is 0.4 % above the nodal "
        "value: the front end's own pole at 37 kHz takes about 2 % of the "
        "power near the 5 kHz cutoff, the 1/f of both e_n and the stage's "
        "e_n x C rise give some of it back; what folds from above the "
        "12.5 kHz Nyquist is about 2e-4 of the power",
    "thermopile-stage.json":
        "a capacitor across a T network at 35 C (V_os + 0.2 uV/C x 10 C, "
        "I_b and I_os x 0.97; no resistors block). With an ideal op-amp "
        "every feedback transfer is its DC gain over 1 + s C R_eq and the "
        "noise gain (NG_T + s C R_eq)/(1 + s C R_eq); those closed forms "
        "are 1e-4 above the nodal analysis, which is the expectation",
}


NODAL = ("nodal analysis in derive_expected.py, direct solve per source, "
         "scipy quad to 1e-11")
NODAL_DC = "nodal analysis at DC (finite A0) in derive_expected.py"


def entry(value, method, closed=None):
    out = {"value": float("%.10g" % value), "method": method}
    if closed is not None:
        out["closed_form"] = float("%.10g" % closed)
        out["closed_form_rel_diff"] = float("%.3g" % (value / closed - 1))
    return out


def main():
    examples = sorted(f for f in os.listdir(os.path.join(ROOT, "examples"))
                      if f.endswith(".json"))
    for name in examples:
        given = load_stage(os.path.join(ROOT, "examples", name))
        # Every budget is of the stage moved from its 25 C values to its
        # (nominal) temperature.
        stage = at_temperature(given, given["T"])
        closed = {}
        cap = None
        if stage["Cf_target"]:
            cap = auto_capacitor(stage)
            print(name, "Q search on the section 7 model against its exact "
                  "C_f: %+.2g" % check_capacitor_method(stage))
            exact, estimate = butterworth_closed_form(stage)
            stage["Cf"] = cap
            closed["feedback_capacitor_F"] = exact
            print(name, "auto C_f %.6g F; section 7 exact %.6g F (%+.3g), "
                  "estimate sqrt(C/(pi Rf GBW)) %.6g F (%+.3g)"
                  % (cap, exact, cap / exact - 1, estimate, cap / estimate - 1))
        net = Network(stage)
        rms = net.output_rms()
        worst = net.offsets()[3]
        cf = closed_form(stage)
        if stage["topology"] != "transimpedance":
            print(name, "closed forms against the nodal analysis of an ideal "
                  "op-amp: %.2g" % check_closed_form(stage))
        figures = {
            "output_rms_V": rms,
            "input_referred_rms": net.input_rms(),
            "worst_case_V": worst,
        }
        if cap is not None:
            figures["feedback_capacitor_F"] = cap
        if stage["Cs"] > 0:
            # The charge figures: the passband gain and the input-referred
            # rms (volts at the sensor) per coulomb of the sensor.
            figures["charge_gain_V_per_C"] = passband_gain(net) / stage["Cs"]
            closed["charge_gain_V_per_C"] = 1 / stage["Cf"]
            figures["input_referred_charge_rms_C"] = (
                figures["input_referred_rms"] * stage["Cs"])
        if cf[0] is not None:
            closed["output_rms_V"] = cf[0]
            # The photodiode closed form integrates S_out / |Z(f)|^2 as the
            # engine does; the inverting one's rms / |gain| is not that
            # integral, so it is not written beside it.
            if stage["topology"] == "transimpedance":
                closed["input_referred_rms"] = cf[1]
        closed["worst_case_V"] = cf[2]
        if "tee" in stage:
            ratio, plain = tee_cost(stage, given)
            figures["noise_cost_ratio"] = ratio
            cp = closed_form(plain)
            closed["noise_cost_ratio"] = cf[0] / cp[0]
        if stage["chain"] is not None:
            chain, chain_closed = chain_figures(stage, net)
            figures.update(chain)
            closed.update(chain_closed)
        if stage["T_range"]:
            # The ends of the range: the 25 C stage moved to each end, the
            # feedback capacitor as at the nominal temperature.
            fixed = dict(given, Cf=stage["Cf"], Cf_target=None)
            for end, t_end in zip(("min", "max"), stage["T_range"]):
                corner = at_temperature(fixed, t_end)
                corner_net = Network(corner)
                corner_cf = closed_form(corner)
                figures["output_rms_V_at_" + end] = corner_net.output_rms()
                figures["worst_case_V_at_" + end] = corner_net.offsets()[3]
                closed["output_rms_V_at_" + end] = corner_cf[0]
                closed["worst_case_V_at_" + end] = corner_cf[2]
        out = {"example": "examples/" + name, "note": NOTES.get(name, ""),
               "temperature_C": round(stage["T"] - ZERO_C, 10),
               "figures": {}}
        for key, value in figures.items():
            method = NODAL
            if key.startswith("worst_case_V"):
                method = NODAL_DC
            if key == "charge_gain_V_per_C":
                method = ("the largest |gain| in the band of this file's "
                          "nodal analysis (scan, bounded Brent in ln f) over "
                          "C_s; closed_form is the ideal 1/C_f")
            if key == "input_referred_charge_rms_C":
                method = NODAL + "; times C_s"
            if key.startswith(("chain_", "adc_")):
                method = ("the chain on this file's nodal output density, "
                          "scipy.signal's analog filter, quad in ln f to "
                          "1e4 x the sample rate; the converter's "
                          "definitions (module docstring)")
            if key == "feedback_capacitor_F":
                method = ("Q = 1/sqrt 2 at the -90 degree point of "
                          "this file's nodal closed-loop response, "
                          "brentq in ln C_f; closed_form is "
                          "REFERENCES.md section 7's exact "
                          "sqrt(2 wt Rf C - 1)/(wt Rf)")
            out["figures"][key] = entry(value, method, closed.get(key))
        # Each resistor's excess noise on its own: in the total it may sit
        # far below the total's tolerance.
        if net.excess:
            out["contributors_output_rms_V"] = {
                c: entry(net.output_rms(only=c),
                         NODAL + "; 1/f density from REFERENCES.md section 8 "
                         "on this file's own DC solve of the resistor's drop"
                         + ("" if c in cf[3] else "; no closed form: with an "
                            "ideal op-amp (no R_out) it does not reach the "
                            "output"),
                         cf[3].get(c))
                for c in sorted(net.excess)}
        target = os.path.join(HERE, name)
        with open(target, "w") as f:
            json.dump(out, f, indent=2, sort_keys=True)
            f.write("\n")
        print(name, json.dumps(out["figures"], sort_keys=True))
        for c, e in out.get("contributors_output_rms_V", {}).items():
            print("   ", c, json.dumps(e, sort_keys=True))


if __name__ == "__main__":
    main()
