package org.zweep.simulator.bench;

/** Point requests for tests, from {@link PointRequest#at}'s defaults: 1 V, no bias, one average, 10 ms, automatic range. */
final class Requests {

    private Requests() {
    }

    static PointRequest at(double frequencyHz) {
        return PointRequest.at(frequencyHz).build();
    }

    static PointRequest voltage(double frequencyHz, double levelVrms) {
        return PointRequest.at(frequencyHz).drive(SourceKind.VOLTAGE, levelVrms).build();
    }

    static PointRequest current(double frequencyHz, double levelArms) {
        return PointRequest.at(frequencyHz).drive(SourceKind.CURRENT, levelArms).build();
    }

    static PointRequest biased(double frequencyHz, double levelVrms, SourceKind bias,
            double biasValue) {
        return PointRequest.at(frequencyHz).drive(SourceKind.VOLTAGE, levelVrms).bias(bias, biasValue, true).build();
    }

    static PointRequest ratio(double frequencyHz) {
        return PointRequest.at(frequencyHz).voltageRatio(true).build();
    }

    static PointRequest keyed(double frequencyHz, long key, double apertureS, int averages) {
        return PointRequest.at(frequencyHz).averages(averages).apertureS(apertureS).noiseKey(key).build();
    }

    static PointRequest held(double frequencyHz, double rangeOhm) {
        return PointRequest.at(frequencyHz).rangeUpperOhm(rangeOhm).build();
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
