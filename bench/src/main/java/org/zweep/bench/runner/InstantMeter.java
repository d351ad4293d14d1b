package org.zweep.bench.runner;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.Set;
import org.zweep.driver.MeterException;
import org.zweep.driver.impedance.Impedance;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.Meter;
import org.zweep.driver.meter.MeterCapabilities;
import org.zweep.driver.meter.MeterIdentity;
import org.zweep.driver.meter.Interval;
import org.zweep.driver.meter.Reading;
import org.zweep.driver.meter.ReadingStatus;
import org.zweep.runner.engine.MeterLink;

/** A meter that answers at once (no wire, no physics): what is left of a run's time is the runner's. */
final class InstantMeter implements Meter, MeterLink {
    private final int maxListPoints;
    private MeasurementSetting current = MeasurementSetting.at(1000);

    InstantMeter(int maxListPoints) {
        this.maxListPoints = maxListPoints;
    }

    @Override
    public MeterIdentity identify() {
        return new MeterIdentity("bench", "instant", "0", "1");
    }

    @Override
    public void reset() {
    }

    @Override
    public MeterCapabilities capabilities() {
        return new MeterCapabilities(new Interval(1, 1e9), new Interval(0, 10), new Interval(0, 1), new Interval(-100, 100),
                new Interval(-10, 10), maxListPoints, Set.of(), false);
    }

    @Override
    public void apply(MeasurementSetting setting) {
        current = setting;
    }

    @Override
    public Reading measure() {
        return reading(current);
    }

    private static Reading reading(MeasurementSetting s) {
        return new Reading(s, 0.01, -1.0 / (2 * Math.PI * s.frequencyHz() * 100e-9), ReadingStatus.OK, Instant.now());
    }

    @Override
    public List<Reading> measureList(List<MeasurementSetting> settings) {
        List<Reading> out = new ArrayList<>(settings.size());
        for (MeasurementSetting s : settings) {
            out.add(reading(s));
        }
        return out;
    }

    @Override
    public void acquireCorrection(CorrectionStandard standard) {
    }

    @Override
    public void setLoadStandard(Impedance known) {
    }

    @Override
    public void setCorrectionEnabled(boolean enabled) {
    }

    @Override
    public void biasOff() {
    }

    @Override
    public boolean safeShutdown() {
        return true;
    }

    @Override
    public String address() {
        return "instant:";
    }

    @Override
    public Meter meter() {
        return this;
    }

    @Override
    public Meter reconnect() {
        return this;
    }

    @Override
    public boolean isLinkFailure(MeterException e) {
        return false;
    }

    @Override
    public boolean timed() {
        return false;
    }

    @Override
    public void close() {
    }
}
