package org.zweep.simulator.netlist;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.zweep.simulator.SimulatorInputException;

class NetlistTest {

    private static String error(String netlist) {
        return assertThrows(SimulatorInputException.class,
                () -> Netlist.parse(netlist, "dut.cir")).getMessage();
    }

    @Test
    void seriesRlcMatchesTheWorkedExample() {
        // ESR 20 mΩ + ESL 1 nH + C 100 nF: Z = ESR + j(ωESL − 1/(ωC)), computed; ngspice-39 AC analysis of the
        // same deck (V1 in 0 AC 1, z = v(in)/(-i(V1))) prints the same Im Z at 100 kHz, 1 MHz, 10 MHz to 7 digits
        Netlist n = Netlist.parse("R1 hi a 20m\nL1 a b 1n\nC1 b lo 100n\n", "dut.cir");
        Complex z100k = n.impedance(100e3);
        assertEquals(0.02, z100k.getReal(), 1e-12);
        assertEquals(-15.91486599, z100k.getImaginary(), 1e-8);
        assertEquals(-1.585266246, n.impedance(1e6).getImaginary(), 1e-9);
        assertEquals(-0.09632309002, n.impedance(10e6).getImaginary(), 1e-10);
        assertEquals(0.6124030364, n.impedance(100e6).getImaginary(), 1e-9);
        assertEquals(0, n.impedance(15.9154943e6).getImaginary(), 1e-8); // SRF
    }

    @Test
    void parallelTankMatchesTheNgspiceExample() {
        // R1 10 Ω + L1 1 mH, C1 100 nF across: 10.079026 + j6.244509 Ω at 1 kHz, computed, and ngspice-39's AC
        // analysis of that deck (1 A AC source, Z = V(in)) writes 1.0079026e+01 6.2445091e+00
        Netlist n = Netlist.parse("R1 hi mid 10\nL1 mid lo 1m\nC1 hi 0 100n\n", "dut.cir");
        Complex z = n.impedance(1e3);
        assertEquals(10.079026, z.getReal(), 1e-6);
        assertEquals(6.244509, z.getImaginary(), 1e-6);
    }

    @Test
    void isolatedShortedSecondaryGivesTheShortCircuitInductance() {
        // L1 = 10 mH, L2 = 0.625 mH, k = 0.99: short-circuit inductance L1(1 − k²) = 199.0 µH, computed
        Netlist n = Netlist.parse("L1 hi lo 10m\nL2 s1 s2 0.625m\nR2 s1 s2 0\nK1 L1 L2 0.99\n",
                "t.cir");
        double w = 2 * Math.PI * 1e3;
        assertEquals(199.0e-6, n.impedance(1e3).getImaginary() / w, 1e-12);
    }

    @Test
    void commentsContinuationsSeparatorsAndEndAreAccepted() {
        Netlist n = Netlist.parse("* a divider\nR1 hi\n+ mid 1k ; R2 mid lo\n+ 1k\n\n.end\n"
                + "this is after .end", "dut.cir");
        assertEquals(2000, n.impedance(1e3).getReal(), 1e-9); // Ohm's law, series resistors
        assertEquals(2, n.elementCount());
    }

    @Test
    void syntaxErrorNamesLineAndColumn() {
        assertEquals("dut.cir:2:13: R2: expected 'R<name> <node> <node> <value>', found 5 fields",
                error("R1 hi a 1k\nR2 a lo 1k  7\n"));
        assertEquals("dut.cir:1:7: R1: expected 'R<name> <node> <node> <value>', found 3 fields",
                error("R1 hi lo\n"));
    }

    @Test
    void badValueNamesLineAndColumn() {
        assertEquals("dut.cir:2:9: C1: bad value: '4k7' has characters after the number that are"
                + " neither a scale suffix nor unit letters", error("R1 hi a 1\nC1 a lo 4k7\n"));
        assertEquals("dut.cir:1:10: R1: value must be 0 (a wire) or greater, not -5",
                error("R1 hi lo -5"));
        assertEquals("dut.cir:1:10: C1: capacitance must be greater than 0, not 0",
                error("C1 hi lo 0"));
        assertEquals("dut.cir:3:10: K1: coupling must be greater than 0 and at most 1, not 1.2",
                error("L1 hi lo 1m\nL2 hi lo 1m\nK1 L1 L2 1.2"));
    }

    @Test
    void unsupportedElementsAndDirectivesAreRejected() {
        assertEquals("dut.cir:2:1: unsupported element 'V1': a device netlist has only R, L, C"
                + " and K elements", error("R1 hi lo 1\nV1 hi lo 1\n"));
        assertEquals("dut.cir:1:1: directive '.ac' is not allowed in a device netlist (only"
                + " element lines R, L, C, K and .end)", error(".ac dec 10 1 1meg\n"));
    }

    @Test
    void floatingNodeIsReportedWithItsLine() {
        assertEquals("dut.cir:2:1: node 'x' is floating: no connection to hi or lo",
                error("R1 hi lo 10\nR2 x y 5\nR3 x y 5\n"));
    }

    @Test
    void danglingElementIsReportedWithItsLine() {
        assertEquals("dut.cir:2:7: R2 is dangling: node 'b' connects to nothing else",
                error("R1 hi lo 10\nR2 hi b 5\n"));
    }

    @Test
    void shortAcrossTheTerminalsIsReported() {
        assertEquals("dut.cir:3:1: R3 shorts the terminals: hi and lo are joined by zero-value"
                + " elements", error("C1 hi lo 1n\nL1 hi a 0\nR3 a lo 0\n"));
    }

    @Test
    void loopOfWiresIsReported() {
        assertEquals("dut.cir:3:1: R3 closes a loop of zero-value elements",
                error("R1 hi a 1\nR2 a b 0\nR3 a b 0\nR4 b lo 1\n"));
    }

    @Test
    void openCircuitBetweenTheTerminalsIsReported() {
        assertEquals("dut.cir:3: hi and lo are not connected: the netlist is an open circuit",
                error("R1 hi a 1\nR2 a hi 1\nR3 lo b 1\nR4 b lo 1\n"));
    }

    @Test
    void missingTerminalAndDuplicateNamesAreReported() {
        assertEquals("dut.cir:1: no element connects to terminal 'lo'",
                error("R1 hi a 1\nR2 a hi 1\n"));
        assertEquals("dut.cir:2:1: element r1 is already defined on line 1",
                error("R1 hi lo 1\nr1 hi lo 2\n"));
    }

    @Test
    void couplingMustNameTwoInductors() {
        assertEquals("dut.cir:3:7: K1 couples 'r2', which is not an inductor of this netlist",
                error("L1 hi lo 1m\nR2 hi lo 1\nK1 L1 R2 0.5\n"));
    }

    @Test
    void lineNumbersCountFromTheGivenFirstLineAndIndent() {
        SimulatorInputException e = assertThrows(SimulatorInputException.class,
                () -> Netlist.parse("R1 hi lo 1\nR2 hi lo x\n", "bench.yaml", 12, 4));
        assertEquals("bench.yaml:13:14: R2: bad value: 'x' is not a number", e.getMessage());
    }
}
