#!/usr/bin/env python3
"""A second meter for zweep's tests: the Quillfen TQ-7, a made-up bench impedance meter.

It is written apart from zweep's simulator and shares no code with zweep (Python standard
library only), so that zweep talking to it is a check of zweep's "any meter by a file" promise,
not of one piece of code agreeing with itself. It differs from the simulator on purpose:

  - its own command words, none of them SCPI: TONE, SWING, LIFT, TAKE?, NULL, JIG, FAULT?, WHO?;
  - replies in polar form: "|Z|,phase" in ohms and degrees;
  - no integration-time and no averaging setting;
  - several commands may be joined with ';' in one message, and each query of such a message is
    answered on its own line (not ';'-joined);
  - its correction is a spot correction: NULL OPEN / NULL SHORT acquire the standard at the
    frequency set at that moment and store it under that frequency; a measurement at a frequency
    with no stored data is corrected with the nearest stored frequency's data (silently wrong, as
    such meters are when used carelessly); NULLSPAN OPEN|SHORT F1,F2,... acquires the standard at
    each listed frequency (Hz) in one message, at most 256 of them, and leaves TONE where it was;
  - HEARD? TEXT answers how many messages it has received with a command starting with TEXT
    (case and spacing ignored), so that a test can count what zweep sent;
  - a motorised fixture: JIG PART | JIG OPEN | JIG SHORT switches what the test port sees;
  - a voltage bias LIFT 0..10 V, switched with LIFT ON / LIFT OFF.

The device is a capacitor with series R 0.1 ohm, L 2 nH, C 10 nF; the fixture adds 30 mohm and
15 nH in series and 3 pF across the device (Zm = Zs + 1 / (Yo + 1 / Zdut)).

Usage: quillfen_meter.py [--port N] [--seed S] [--point-ms MS] [--noise REL]
Listens on 127.0.0.1 (port 0 picks a free one) and prints "port N" on its first output line.
One connection at a time is served; state persists across connections like a real meter's.
Stops on SIGTERM or SIGINT.
"""

import argparse
import cmath
import math
import random
import socket
import sys
import threading
import time

IDENTITY = "Quillfen Works,TQ-7,0042,2.1"
F_MIN, F_MAX = 20.0, 100e6
SWING_MIN, SWING_MAX = 0.01, 1.0
LIFT_MIN, LIFT_MAX = 0.0, 10.0
Z_MAX = 1e8  # beyond this |Z| the meter reports overload

R_DUT, L_DUT, C_DUT = 0.1, 2e-9, 10e-9
Z_SERIES_R, Z_SERIES_L, Y_OPEN_C = 0.030, 15e-9, 3e-12


class Meter:
    def __init__(self, seed, point_ms, noise):
        self.rng = random.Random(seed)
        self.point_s = point_ms / 1000.0
        self.noise = noise
        self.lock = threading.Lock()
        self.nulls = {"OPEN": {}, "SHORT": {}}
        self.reset()
        self.jig = "PART"
        self.bias_history = []
        self.messages = []  # every message received, its commands normalised (upper case, single spaces)

    def reset(self):
        self.tone = 1000.0
        self.swing = 0.5
        self.lift = 0.0
        self.lift_on = False
        self.null_on = False
        self.errors = []

    # --- physics ---------------------------------------------------------
    def z_device(self, f):
        w = 2 * math.pi * f
        return complex(R_DUT, w * L_DUT - 1.0 / (w * C_DUT))

    def z_raw(self, f):
        """What the meter sees at its port with the jig in its present position."""
        w = 2 * math.pi * f
        zs = complex(Z_SERIES_R, w * Z_SERIES_L)
        yo = complex(0.0, w * Y_OPEN_C)
        if self.jig == "SHORT":
            return zs
        if self.jig == "OPEN":
            return zs + 1.0 / yo
        return zs + 1.0 / (yo + 1.0 / self.z_device(f))

    def noisy(self, z):
        mag = abs(z) * (1.0 + self.rng.gauss(0.0, self.noise))
        ph = cmath.phase(z) + self.rng.gauss(0.0, self.noise)
        return cmath.rect(mag, ph)

    def nearest(self, table, f):
        if not table:
            return None
        key = min(table, key=lambda k: abs(math.log(k / f)))
        return table[key]

    def take(self):
        time.sleep(self.point_s)
        zm = self.noisy(self.z_raw(self.tone))
        if self.null_on:
            zo = self.nearest(self.nulls["OPEN"], self.tone)
            zs = self.nearest(self.nulls["SHORT"], self.tone)
            if zo is not None and zs is not None:
                zm = (zm - zs) / (1.0 - (zm - zs) / (zo - zs))
        if abs(zm) > Z_MAX:
            return "9.9E37,0"
        return "%.9e,%.9e" % (abs(zm), math.degrees(cmath.phase(zm)))

    # --- commands --------------------------------------------------------
    def error(self, code, text):
        if len(self.errors) < 16:
            self.errors.append((code, text))

    def number(self, arg, lo, hi, what):
        try:
            v = float(arg)
        except (TypeError, ValueError):
            self.error(21, "%s wants a number" % what)
            return None
        if not (lo <= v <= hi):
            self.error(22, "%s %g out of %g..%g" % (what, v, lo, hi))
            return None
        return v

    def record_bias(self):
        self.bias_history.append((time.monotonic(), self.lift if self.lift_on else 0.0))

    def execute(self, unit):
        """Runs one command; returns its reply line or None."""
        word, _, arg = unit.strip().partition(" ")
        word = word.upper()
        arg = arg.strip()
        if word == "WHO?":
            return IDENTITY
        if word == "CLEAR":
            self.reset()
            self.record_bias()
            return None
        if word == "FAULT?":
            if not self.errors:
                return '0,"none"'
            code, text = self.errors.pop(0)
            return '%d,"%s"' % (code, text)
        if word == "TONE":
            v = self.number(arg, F_MIN, F_MAX, "TONE")
            if v is not None:
                self.tone = v
            return None
        if word == "TONE?":
            return "%.9e" % self.tone
        if word == "SWING":
            v = self.number(arg, SWING_MIN, SWING_MAX, "SWING")
            if v is not None:
                self.swing = v
            return None
        if word == "SWING?":
            return "%.9e" % self.swing
        if word == "LIFT":
            if arg.upper() in ("ON", "OFF"):
                self.lift_on = arg.upper() == "ON"
            else:
                v = self.number(arg, LIFT_MIN, LIFT_MAX, "LIFT")
                if v is not None:
                    self.lift = v
            self.record_bias()
            return None
        if word == "LIFT?":
            return "%.9e,%d" % (self.lift, 1 if self.lift_on else 0)
        if word == "TAKE?":
            return self.take()
        if word == "NULL":
            a = arg.upper()
            if a in ("OPEN", "SHORT"):
                time.sleep(self.point_s * 4)
                self.nulls[a][self.tone] = self.noisy(self.z_raw(self.tone))
            elif a in ("ON", "OFF"):
                self.null_on = a == "ON"
            elif a == "CLEAR":
                self.nulls = {"OPEN": {}, "SHORT": {}}
            else:
                self.error(23, "NULL wants OPEN, SHORT, ON, OFF or CLEAR")
            return None
        if word == "NULLSPAN":
            which, _, freqs = arg.partition(" ")
            which = which.upper()
            values = [self.number(f, F_MIN, F_MAX, "NULLSPAN") for f in freqs.split(",")] if freqs.strip() else []
            if which not in ("OPEN", "SHORT") or not values:
                self.error(25, "NULLSPAN wants OPEN or SHORT and a list of frequencies")
            elif len(values) > 256:
                self.error(26, "NULLSPAN takes at most 256 frequencies")
            elif None not in values:
                tone = self.tone
                for f in values:
                    time.sleep(self.point_s * 4)
                    self.tone = f
                    self.nulls[which][f] = self.noisy(self.z_raw(f))
                self.tone = tone
            return None
        if word == "HEARD?":
            want = " ".join(arg.upper().split())
            return "%d" % sum(1 for m in self.messages if any(u.startswith(want) for u in m))
        if word == "NULL?":
            return "%d,%d,%d" % (1 if self.null_on else 0, len(self.nulls["OPEN"]), len(self.nulls["SHORT"]))
        if word == "JIG":
            a = arg.upper()
            if a in ("PART", "OPEN", "SHORT"):
                self.jig = a
            else:
                self.error(24, "JIG wants PART, OPEN or SHORT")
            return None
        if word == "JIG?":
            return self.jig
        if word == "HISTORY?":
            return ";".join("%.6f,%.6g" % p for p in self.bias_history[-1000:]) or "none"
        self.error(12, "unknown word %s" % word[:20])
        return None

    def message(self, text):
        out = []
        with self.lock:
            self.messages.append([" ".join(u.upper().split()) for u in text.split(";")])
            for unit in text.split(";"):
                if unit.strip():
                    reply = self.execute(unit)
                    if reply is not None:
                        out.append(reply + "\n")
        return "".join(out)


def serve(conn, meter):
    buf = b""
    with conn:
        while True:
            try:
                data = conn.recv(65536)
            except OSError:
                return
            if not data:
                return
            buf += data
            while b"\n" in buf:
                line, buf = buf.split(b"\n", 1)
                reply = meter.message(line.decode("ascii", "replace").rstrip("\r"))
                if reply:
                    try:
                        conn.sendall(reply.encode("ascii"))
                    except OSError:
                        return
            if len(buf) > 1 << 20:
                meter.error(30, "message too long")
                buf = b""


def main():
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--port", type=int, default=0)
    p.add_argument("--seed", type=int, default=1)
    p.add_argument("--point-ms", type=float, default=5.0)
    p.add_argument("--noise", type=float, default=2e-5, help="relative noise on |Z| and phase (rad)")
    args = p.parse_args()
    meter = Meter(args.seed, args.point_ms, args.noise)
    srv = socket.socket(socket.AF_INET, socket.SOCK_STREAM)
    srv.setsockopt(socket.SOL_SOCKET, socket.SO_REUSEADDR, 1)
    srv.bind(("127.0.0.1", args.port))
    srv.listen(4)
    print("port %d" % srv.getsockname()[1], flush=True)
    try:
        while True:
            conn, _ = srv.accept()
            conn.setsockopt(socket.IPPROTO_TCP, socket.TCP_NODELAY, 1)
            serve(conn, meter)
    except KeyboardInterrupt:
        pass


if __name__ == "__main__":
    import signal

    signal.signal(signal.SIGTERM, lambda *_: sys.exit(0))
    main()
