#!/usr/bin/env python3
"""An independent VXI-11 client for zweep's simulator: pyvisa with the pyvisa-py backend, which
implements ONC RPC, XDR and the portmapper lookup itself (always on port 111).

Usage: pyvisa_vxi11_client.py RESOURCE
Prints one JSON object: the identification, the frequency read back, a bus-triggered reading,
the error queue entry after it and the status byte.
"""
import json
import sys

import pyvisa


def main():
    resource = sys.argv[1]
    rm = pyvisa.ResourceManager("@py")
    inst = rm.open_resource(resource, read_termination="\n", write_termination="\n")
    inst.timeout = 5000
    out = {"resource": resource, "interface": str(inst.interface_type)}
    out["idn"] = inst.query("*IDN?")
    inst.write(":SOUR:FREQ 1000")
    out["frequency"] = inst.query(":SOUR:FREQ?")
    inst.write(":TRIG:SOUR BUS;:INIT")
    inst.assert_trigger()  # VXI-11 device_trigger
    out["reading"] = inst.query(":FETC?")
    out["error"] = inst.query(":SYST:ERR?")
    out["stb"] = inst.read_stb()  # VXI-11 device_readstb
    inst.clear()  # VXI-11 device_clear
    out["after_clear"] = inst.query("*OPC?")
    inst.close()
    rm.close()
    print(json.dumps(out))


if __name__ == "__main__":
    main()
