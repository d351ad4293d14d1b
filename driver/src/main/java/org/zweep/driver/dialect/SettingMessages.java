package org.zweep.driver.dialect;

import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import org.zweep.driver.meter.Bias;
import org.zweep.driver.meter.Drive;
import org.zweep.driver.meter.ImpedanceRange;
import org.zweep.driver.meter.MeasuredQuantity;
import org.zweep.driver.meter.MeasurementSetting;
import org.zweep.driver.meter.SourceMode;

/**
 * What to send to bring a meter to a setting: the dialect's command for each part that differs
 * from what the meter is known to hold. Pure bookkeeping, no I/O; not thread-safe.
 */
final class SettingMessages {
    private final Dialect dialect;
    private KnownState known = new KnownState();
    private boolean setupDone;

    SettingMessages(Dialect dialect) {
        this.dialect = dialect;
    }

    /** Units to send and the state the meter holds once they are sent. */
    record Pending(List<String> units, KnownState next) {
    }

    /** After a reset: nothing is known and the setup is due again. */
    void reset() {
        known = new KnownState();
        setupDone = false;
    }

    /** After a failure: nothing is known, so the next setting is sent in full. */
    void forget() {
        known = new KnownState();
    }

    /** The meter was asked what its bias sources hold. */
    void biasHeld(boolean voltageOn, boolean currentOn, double volts, double amperes) {
        known.biasOn.put(SourceMode.VOLTAGE, voltageOn);
        known.biasOn.put(SourceMode.CURRENT, currentOn);
        known.biasValue.put(SourceMode.VOLTAGE, volts);
        known.biasValue.put(SourceMode.CURRENT, amperes);
    }

    /** Every bias source was switched off. */
    void biasOff() {
        for (SourceMode mode : SourceMode.values()) {
            known.biasOn.put(mode, false);
        }
    }

    /**
     * The program message units that bring the meter from what it holds to {@code s}: bias
     * switched off first and on last; with a non-empty {@code sweep}, the list commands too
     * (frequency then not sent). Nothing is remembered until {@link #sent}.
     */
    Pending plan(MeasurementSetting s, List<MeasurementSetting> sweep) {
        KnownState next = known.copy();
        List<String> units = new ArrayList<>();
        boolean list = !sweep.isEmpty();
        if (!setupDone) {
            dialect.command(Command.SETUP).ifPresent(t -> units.add(t.render()));
        }
        for (SourceMode mode : SourceMode.values()) {
            Command off = BiasCommands.of(mode).off;
            if (!biasOn(s, mode) && dialect.has(off) && !Boolean.FALSE.equals(next.biasOn.get(mode))) {
                add(units, render(off));
                next.biasOn.put(mode, false);
            }
        }
        if (!list && !Boolean.FALSE.equals(next.listMode)) {
            dialect.command(Command.LIST_MODE_OFF).ifPresent(t -> add(units, t.render()));
            next.listMode = false;
        }
        if (dialect.capabilities().voltageRatio() && next.quantity != s.quantity()) {
            add(units, render(s.quantity() == MeasuredQuantity.IMPEDANCE
                    ? Command.FUNCTION_IMPEDANCE : Command.FUNCTION_VOLTAGE_RATIO));
            next.quantity = s.quantity();
        }
        if (!list && !same(next.frequencyHz, s.frequencyHz())) {
            add(units, render(Command.FREQUENCY, "frequency", s.frequencyHz()));
            next.frequencyHz = s.frequencyHz();
        }
        if (!s.drive().equals(next.drive)) {
            Command c = s.drive().mode() == SourceMode.VOLTAGE ? Command.DRIVE_VOLTAGE : Command.DRIVE_CURRENT;
            add(units, render(c, "level", s.drive().levelRms()));
            next.drive = s.drive();
        }
        if (dialect.has(Command.AVERAGING) && !Integer.valueOf(s.averagingCount()).equals(next.averaging)) {
            add(units, dialect.command(Command.AVERAGING).orElseThrow().render(Map.of("count", s.averagingCount())));
            next.averaging = s.averagingCount();
        }
        if (dialect.has(Command.INTEGRATION_TIME) && !same(next.integrationTimeS, s.integrationTimeS())) {
            add(units, render(Command.INTEGRATION_TIME, "seconds", s.integrationTimeS()));
            next.integrationTimeS = s.integrationTimeS();
        }
        if (dialect.has(Command.RANGE_AUTO) && !s.range().equals(next.range)) {
            add(units, s.range().auto() ? render(Command.RANGE_AUTO)
                    : render(Command.RANGE_HOLD, "ohms", s.range().upperOhm()));
            next.range = s.range();
        }
        if (list) {
            addListUnits(units, sweep, next);
        }
        if (s.bias().on()) {
            SourceMode mode = s.bias().mode();
            BiasCommands c = BiasCommands.of(mode);
            if (!same(next.biasValue.get(mode), s.bias().value())) {
                add(units, render(c.value, "bias", s.bias().value()));
                next.biasValue.put(mode, s.bias().value());
            }
            if (!Boolean.TRUE.equals(next.biasOn.get(mode))) {
                add(units, render(c.on));
                next.biasOn.put(mode, true);
            }
        }
        if (list) {
            forgetListed(next, s.drive().mode());
        }
        return new Pending(units, next);
    }

    /** Remembers what {@code p} told the meter, once it was sent without error. */
    void sent(Pending p) {
        known = p.next();
        setupDone = true;
    }

    private void addListUnits(List<String> units, List<MeasurementSetting> sweep, KnownState next) {
        add(units, dialect.command(Command.LIST_FREQUENCY).orElseThrow().render(
                Map.of("frequencies", sweep.stream().map(MeasurementSetting::frequencyHz).toList())));
        List<Double> levels = sweep.stream().map(x -> x.drive().levelRms()).toList();
        List<Double> biases = sweep.stream().map(x -> x.bias().value()).toList();
        Command levelList = sweep.get(0).drive().mode() == SourceMode.VOLTAGE
                ? Command.LIST_VOLTAGE : Command.LIST_CURRENT;
        dialect.command(levelList).ifPresent(t -> add(units, t.render(Map.of("levels", levels))));
        Bias bias = sweep.get(0).bias();
        if (bias.on()) {
            dialect.command(BiasCommands.of(bias.mode()).list)
                    .ifPresent(t -> add(units, t.render(Map.of("biases", biases))));
        }
        dialect.command(Command.LIST_MODE_ON).ifPresent(t -> add(units, t.render()));
        next.listMode = true;
    }

    /** After a sweep the meter's single-point values of what was listed are not trusted. */
    private void forgetListed(KnownState next, SourceMode driveMode) {
        next.frequencyHz = null;
        if (dialect.has(driveMode == SourceMode.VOLTAGE ? Command.LIST_VOLTAGE : Command.LIST_CURRENT)) {
            next.drive = null;
        }
        for (SourceMode mode : SourceMode.values()) {
            if (dialect.has(BiasCommands.of(mode).list)) {
                next.biasValue.remove(mode);
            }
        }
    }

    /** Whether {@code settings} can be one list sweep: they differ only in what the dialect can list. */
    boolean sweepable(List<MeasurementSetting> settings) {
        if (settings.size() < 2 || !dialect.capabilities().listSweep()) {
            return false;
        }
        MeasurementSetting first = listKey(settings.get(0));
        return settings.stream().allMatch(s -> listKey(s).equals(first));
    }

    /** The setting with every field the dialect can list blanked out. */
    private MeasurementSetting listKey(MeasurementSetting s) {
        MeasurementSetting k = s.withFrequencyHz(0);
        Command levelList = s.drive().mode() == SourceMode.VOLTAGE ? Command.LIST_VOLTAGE : Command.LIST_CURRENT;
        if (dialect.has(levelList)) {
            k = k.withDrive(new Drive(s.drive().mode(), 0));
        }
        if (!s.bias().on() || dialect.has(BiasCommands.of(s.bias().mode()).list)) {
            k = k.withBias(new Bias(s.bias().mode(), 0, s.bias().on()));
        }
        return k;
    }

    private static boolean biasOn(MeasurementSetting s, SourceMode mode) {
        return s.bias().on() && s.bias().mode() == mode;
    }

    /** The dialect commands of one bias source. */
    private record BiasCommands(Command value, Command on, Command off, Command list) {
        static final BiasCommands VOLTAGE = new BiasCommands(Command.BIAS_VOLTAGE, Command.BIAS_VOLTAGE_ON,
                Command.BIAS_VOLTAGE_OFF, Command.LIST_BIAS_VOLTAGE);
        static final BiasCommands CURRENT = new BiasCommands(Command.BIAS_CURRENT, Command.BIAS_CURRENT_ON,
                Command.BIAS_CURRENT_OFF, Command.LIST_BIAS_CURRENT);

        static BiasCommands of(SourceMode mode) {
            return mode == SourceMode.VOLTAGE ? VOLTAGE : CURRENT;
        }
    }

    private static void add(List<String> units, String unit) {
        if (units.isEmpty() || !units.get(units.size() - 1).equals(unit)) {
            units.add(unit);
        }
    }

    private static boolean same(Double known, double wanted) {
        return known != null && known == wanted;
    }

    private String render(Command c) {
        return dialect.command(c).orElseThrow(() -> new IllegalStateException(c.key())).render();
    }

    private String render(Command c, String placeholder, double value) {
        return dialect.command(c).orElseThrow(() -> new IllegalStateException(c.key())).render(Map.of(placeholder, value));
    }

    /** What this object last told the meter; {@code null} means unknown (send it). */
    static final class KnownState {
        Boolean listMode;
        MeasuredQuantity quantity;
        Double frequencyHz;
        Drive drive;
        final Map<SourceMode, Double> biasValue = new EnumMap<>(SourceMode.class);
        final Map<SourceMode, Boolean> biasOn = new EnumMap<>(SourceMode.class);
        Integer averaging;
        Double integrationTimeS;
        ImpedanceRange range;

        KnownState copy() {
            KnownState k = new KnownState();
            k.listMode = listMode;
            k.quantity = quantity;
            k.frequencyHz = frequencyHz;
            k.drive = drive;
            k.biasValue.putAll(biasValue);
            k.biasOn.putAll(biasOn);
            k.averaging = averaging;
            k.integrationTimeS = integrationTimeS;
            k.range = range;
            return k;
        }
    }
}
