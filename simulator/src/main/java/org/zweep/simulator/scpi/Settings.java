package org.zweep.simulator.scpi;

import org.zweep.simulator.bench.MeterLimits;
import org.zweep.simulator.bench.SourceKind;

/** The meter's settings; guarded by the instrument's lock. The *RST values are {@link #defaults}. */
final class Settings {
    static final double DEFAULT_FREQUENCY_HZ = 1000;
    static final double DEFAULT_VOLTAGE_VRMS = 1.0;
    static final double DEFAULT_CURRENT_ARMS = 0.01;
    static final double DEFAULT_APERTURE_S = 0.1;
    static final double MIN_APERTURE_S = 1e-4;
    static final double MAX_APERTURE_S = 10;
    static final int MAX_AVERAGES = 1000;
    static final double DEFAULT_LOAD_OHM = 100;
    static final double MAX_LOAD_OHM = 1e9;

    double frequencyHz;
    SourceKind drive;
    double voltageVrms;
    double currentArms;
    double biasVoltageV;
    double biasCurrentA;
    boolean voltageBiasOn;
    boolean currentBiasOn;
    double[] listFrequencyHz = new double[0];
    double[] listVoltageVrms = new double[0];
    double[] listBiasVoltageV = new double[0];
    boolean listMode;
    int averages;
    double apertureS;
    boolean rangeAuto;
    double rangeOhm;
    boolean correctionOn;
    double loadResistanceOhm;
    double loadReactanceOhm;
    boolean voltageRatio;
    boolean triggerBus;
    boolean real64;
    boolean swapped;

    static Settings defaults(MeterLimits l) {
        Settings s = new Settings();
        s.frequencyHz = clamp(DEFAULT_FREQUENCY_HZ, l.minFrequencyHz(), l.maxFrequencyHz());
        s.drive = SourceKind.VOLTAGE;
        s.voltageVrms = clamp(DEFAULT_VOLTAGE_VRMS, l.minVoltageVrms(), l.maxVoltageVrms());
        s.currentArms = clamp(DEFAULT_CURRENT_ARMS, l.minCurrentArms(), l.maxCurrentArms());
        s.averages = 1;
        s.apertureS = DEFAULT_APERTURE_S;
        s.rangeAuto = true;
        double[] ranges = l.rangesOhm();
        s.rangeOhm = ranges[ranges.length - 1];
        s.loadResistanceOhm = DEFAULT_LOAD_OHM;
        return s;
    }

    static double clamp(double v, double min, double max) {
        return Math.max(min, Math.min(max, v));
    }
}
