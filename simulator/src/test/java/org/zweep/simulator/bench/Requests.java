package org.zweep.simulator.bench;

/** Point requests for tests: 1 V, no bias, one average, 10 ms, automatic range. */
final class Requests {

    private Requests() {
    }

    static PointRequest at(double frequencyHz) {
        return new PointRequest(false, frequencyHz, SourceKind.VOLTAGE, 1.0, SourceKind.VOLTAGE, 0,
                false, 1, 0.01, Double.NaN, 1);
    }

    static PointRequest voltage(double frequencyHz, double levelVrms) {
        return new PointRequest(false, frequencyHz, SourceKind.VOLTAGE, levelVrms,
                SourceKind.VOLTAGE, 0, false, 1, 0.01, Double.NaN, 1);
    }

    static PointRequest current(double frequencyHz, double levelArms) {
        return new PointRequest(false, frequencyHz, SourceKind.CURRENT, levelArms,
                SourceKind.VOLTAGE, 0, false, 1, 0.01, Double.NaN, 1);
    }

    static PointRequest biased(double frequencyHz, double levelVrms, SourceKind bias,
            double biasValue) {
        return new PointRequest(false, frequencyHz, SourceKind.VOLTAGE, levelVrms, bias, biasValue,
                true, 1, 0.01, Double.NaN, 1);
    }

    static PointRequest ratio(double frequencyHz) {
        return new PointRequest(true, frequencyHz, SourceKind.VOLTAGE, 1.0, SourceKind.VOLTAGE, 0,
                false, 1, 0.01, Double.NaN, 1);
    }

    static PointRequest keyed(double frequencyHz, long key, double apertureS, int averages) {
        return new PointRequest(false, frequencyHz, SourceKind.VOLTAGE, 1.0, SourceKind.VOLTAGE, 0,
                false, averages, apertureS, Double.NaN, key);
    }

    static PointRequest held(double frequencyHz, double rangeOhm) {
        return new PointRequest(false, frequencyHz, SourceKind.VOLTAGE, 1.0, SourceKind.VOLTAGE, 0,
                false, 1, 0.01, rangeOhm, 1);
    }

    /** A bench from bench-file text (no netlist files). */
    static SimulatedBench bench(String yaml) {
        return new SimulatedBench(BenchSpec.parse(yaml, "test.bench.yaml", null));
    }

    /** A noiseless bench with an ideal fixture and {@code device} (YAML lines under device:). */
    static SimulatedBench ideal(String device) {
        return new SimulatedBench(BenchSpec.parse("device:\n" + device, "test.bench.yaml", null)
                .ideal());
    }
}
