#!/usr/bin/env python3
"""The hand-written script zweep is measured against: a frequency sweep over pyvisa with the
pyvisa-py backend, on zweep's simulator over raw TCP, doing the work zweep run does per point
(send the setting, trigger and read, derive |Z|, theta, Cs, D, append the row to a CSV file and
make it durable with fsync before the next trigger: per point, or per list of up to LIST points).

Usage: pyvisa_sweep.py HOST PORT OUT.csv POINTS START_HZ STOP_HZ APERTURE_S LIST
  LIST 0 measures point by point; otherwise lists of up to LIST frequencies (:SOUR:LIST:FREQ).
Frequencies are linear from START_HZ to STOP_HZ, both ends included, like a zweep sweep of
{start, stop, points}.
"""

import math
import os
import sys

import pyvisa


def rows(freqs, values):
    out = []
    for f, (r, x) in zip(freqs, values):
        mag = math.hypot(r, x)
        theta = math.degrees(math.atan2(x, r))
        cs = -1.0 / (2 * math.pi * f * x) if x != 0 else float("nan")
        d = abs(r / x) if x != 0 else float("nan")
        out.append("%.9g,%.12g,%.12g,%.9g,%.9g,%.9g,%.9g\n" % (f, r, x, mag, theta, cs, d))
    return "".join(out)


def pairs(reply):
    v = [float(t) for t in reply.split(",")]
    return list(zip(v[0::2], v[1::2]))


def main():
    host, port, out, n, start, stop, aperture, listn = sys.argv[1:9]
    n, listn = int(n), int(listn)
    start, stop, aperture = float(start), float(stop), float(aperture)
    freqs = [start + (stop - start) * i / (n - 1) for i in range(n)] if n > 1 else [start]
    rm = pyvisa.ResourceManager("@py")
    inst = rm.open_resource("TCPIP::%s::%s::SOCKET" % (host, port), read_termination="\n",
                            write_termination="\n", timeout=60000)
    inst.write("*RST;*CLS;:FORM ASC;:TRIG:SOUR IMM")
    inst.write(':SENS:FUNC "IMPedance";:SOUR:VOLT 0.5;:SENS:IMP:APER %g;:SENS:AVER:COUN 1' % aperture)
    with open(out, "w") as f:
        f.write("frequency_hz,r_ohm,x_ohm,z_ohm,theta_deg,cs_f,d\n")
        f.flush()
        os.fsync(f.fileno())
        if listn == 0:
            for fr in freqs:
                r, x = pairs(inst.query(":SOUR:FREQ %.9g;:READ?" % fr))[0]
                f.write(rows([fr], [(r, x)]))
                f.flush()
                os.fsync(f.fileno())
        else:
            inst.write(":SOUR:FREQ:MODE LIST")
            for i in range(0, n, listn):
                chunk = freqs[i:i + listn]
                inst.write(":SOUR:LIST:FREQ " + ",".join("%.9g" % c for c in chunk))
                values = pairs(inst.query(":READ?"))
                if len(values) != len(chunk):
                    sys.exit("list of %d frequencies gave %d readings" % (len(chunk), len(values)))
                f.write(rows(chunk, values))
                f.flush()
                os.fsync(f.fileno())
    err = inst.query(":SYST:ERR?")
    if not err.startswith("0") and not err.startswith("+0"):
        sys.exit("meter error: " + err)
    inst.close()


if __name__ == "__main__":
    main()
