package org.zweep.simulator.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.nio.file.Path;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.zweep.simulator.SimulatorInputException;

/** A bench's {@code parts} section: each serial its own device, the keys it gives over the bench's device. */
class BenchPartsTest {
    static final String BENCH = """
            device:
              capacitor: {capacitance_f: 100.0e-9, esr_ohm: 0.025, tan_delta: 0.012}
            parts:
              A-1: {capacitance_f: 86.0e-9}
              A-2: {tan_delta: 0.031, esr_ohm: 0.05}
            """;

    @Test
    void aPartTakesItsOwnKeysAndTheBenchDevicesForTheRest() {
        BenchSpec spec = BenchSpec.parse(BENCH, "tray.bench.yaml", Path.of("."));
        assertEquals(Set.of("A-1", "A-2"), spec.partSerials());
        Capacitor a1 = (Capacitor) spec.forPart("A-1").device();
        assertEquals(86.0e-9, a1.capacitanceF());
        assertEquals(0.025, a1.esrOhm());
        assertEquals(0.012, a1.tanDelta());
        Capacitor a2 = (Capacitor) spec.forPart("A-2").device();
        assertEquals(100.0e-9, a2.capacitanceF());
        assertEquals(0.031, a2.tanDelta());
        assertEquals(0.05, a2.esrOhm());
        assertSame(spec, spec.forPart("B-9"), "a serial the file does not name is the bench's own device");
        assertEquals(spec.seed(), spec.forPart("A-1").withSeed(7).forPart("A-2").withSeed(spec.seed()).seed());
    }

    @Test
    void aPartsKeyTheDeviceDoesNotTakeIsRefusedWithItsPlace() {
        SimulatorInputException e = assertThrows(SimulatorInputException.class, () -> BenchSpec.parse(
                BENCH + "  A-3: {inductance_h: 1.0e-6}\n", "tray.bench.yaml", Path.of(".")));
        assertEquals("tray.bench.yaml:6:9: unknown key 'parts.A-3.inductance_h'; expected one of capacitance_f, esr_ohm,"
                + " esl_h, tan_delta, bias_half_voltage_v, bias_exponent, level_coefficient_per_vrms", e.getMessage());
    }

    @Test
    void aNetlistDeviceHasNoParts() {
        SimulatorInputException e = assertThrows(SimulatorInputException.class, () -> BenchSpec.parse("""
                device:
                  netlist: "R1 hi lo 100"
                parts:
                  A-1: {resistance_ohm: 90}
                """, "n.bench.yaml", Path.of(".")));
        assertEquals("n.bench.yaml:4:3: 'parts' varies a capacitor, inductor, resistor or transformer device, not a"
                + " netlist", e.getMessage());
    }
}
