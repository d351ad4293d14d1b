package org.zweep.simulator.bench;

import org.apache.commons.math3.complex.Complex;
import org.zweep.simulator.netlist.Netlist;

/** A device described by a netlist: linear, so level and bias do not change it. */
record NetlistDevice(Netlist netlist) implements Device {

    /** Below this frequency the netlist's impedance stands for its DC resistance. */
    private static final double DC_PROBE_HZ = 1e-6;

    @Override
    public Complex impedance(double frequencyHz, OperatingPoint op, Wiring wiring) {
        return netlist.impedance(frequencyHz);
    }

    @Override
    public double dcResistanceOhm() {
        Complex z = netlist.impedance(DC_PROBE_HZ);
        return Math.abs(z.getImaginary()) > Math.abs(z.getReal()) ? Double.POSITIVE_INFINITY
                : z.getReal();
    }
}
