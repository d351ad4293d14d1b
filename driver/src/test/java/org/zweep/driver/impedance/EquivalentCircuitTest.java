package org.zweep.driver.impedance;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

/** The rule of thumb of {@link EquivalentCircuit}: common practice, no source. */
class EquivalentCircuitTest {

    @Test
    void lowImpedanceChoosesSeriesWhateverThePart() {
        Impedance bigCapacitor = Impedance.fromCsEsr(1e3, 100e-6, 0.01); // |Z| ≈ 1.6 Ω
        assertEquals(EquivalentCircuit.SERIES, EquivalentCircuit.AUTO.resolve(bigCapacitor, PartKind.CAPACITOR));
    }

    @Test
    void highImpedanceChoosesParallelWhateverThePart() {
        Impedance bigInductor = Impedance.fromLsRs(1e3, 10.0, 5.0); // |Z| ≈ 63 kΩ
        assertEquals(EquivalentCircuit.PARALLEL, EquivalentCircuit.AUTO.resolve(bigInductor, PartKind.INDUCTOR));
    }

    @Test
    void middleRangeFollowsPartKindThenSignOfReactance() {
        Impedance capacitive = Impedance.fromCsEsr(1e3, 1e-6, 0.1); // |Z| ≈ 159 Ω
        Impedance inductive = Impedance.fromLsRs(1e3, 10e-3, 1.0); // |Z| ≈ 63 Ω
        assertEquals(EquivalentCircuit.PARALLEL, EquivalentCircuit.AUTO.resolve(capacitive, null));
        assertEquals(EquivalentCircuit.SERIES, EquivalentCircuit.AUTO.resolve(inductive, null));
        assertEquals(EquivalentCircuit.SERIES, EquivalentCircuit.AUTO.resolve(capacitive, PartKind.INDUCTOR));
        assertEquals(EquivalentCircuit.PARALLEL, EquivalentCircuit.AUTO.resolve(inductive, PartKind.CAPACITOR));
        assertEquals(EquivalentCircuit.PARALLEL, EquivalentCircuit.AUTO.resolve(capacitive, PartKind.RESISTOR));
        assertEquals(EquivalentCircuit.SERIES, EquivalentCircuit.AUTO.resolve(inductive, PartKind.RESISTOR));
        assertEquals(EquivalentCircuit.SERIES, EquivalentCircuit.AUTO.resolve(capacitive, PartKind.TRANSFORMER));
    }

    @Test
    void explicitChoiceOverridesTheRule() {
        Impedance low = new Impedance(1e3, 1.0, 1.0);
        assertEquals(EquivalentCircuit.PARALLEL, EquivalentCircuit.PARALLEL.resolve(low, null));
        assertEquals(EquivalentCircuit.SERIES, EquivalentCircuit.SERIES.resolve(new Impedance(1e3, 1e6, 0),
                PartKind.CAPACITOR));
    }
}
