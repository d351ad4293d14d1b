package org.zweep.driver.dialect;

import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.function.Function;
import java.util.stream.Collectors;

/** Every key of a dialect's {@code [commands]} section, with the placeholders its template must hold. */
enum Command {
    SETUP("setup"),
    IDENTIFY("identify"),
    RESET("reset"),
    ERROR_QUERY("error-query"),
    SYNC("sync"),
    MEASURE("measure"),
    FUNCTION_IMPEDANCE("function-impedance"),
    FUNCTION_VOLTAGE_RATIO("function-voltage-ratio"),
    FREQUENCY("frequency", Placeholder.number("frequency", "Hz")),
    DRIVE_VOLTAGE("drive-voltage", Placeholder.number("level", "V")),
    DRIVE_CURRENT("drive-current", Placeholder.number("level", "A")),
    BIAS_VOLTAGE("bias-voltage", Placeholder.number("bias", "V")),
    BIAS_VOLTAGE_ON("bias-voltage-on"),
    BIAS_VOLTAGE_OFF("bias-voltage-off"),
    BIAS_CURRENT("bias-current", Placeholder.number("bias", "A")),
    BIAS_CURRENT_ON("bias-current-on"),
    BIAS_CURRENT_OFF("bias-current-off"),
    BIAS_OFF("bias-off"),
    BIAS_VOLTAGE_QUERY("bias-voltage-query"),
    BIAS_VOLTAGE_STATE_QUERY("bias-voltage-state-query"),
    BIAS_CURRENT_QUERY("bias-current-query"),
    BIAS_CURRENT_STATE_QUERY("bias-current-state-query"),
    AVERAGING("averaging", Placeholder.count("count")),
    INTEGRATION_TIME("integration-time", Placeholder.number("seconds", "s")),
    RANGE_AUTO("range-auto"),
    RANGE_HOLD("range-hold", Placeholder.number("ohms", "ohm")),
    LIST_FREQUENCY("list-frequency", Placeholder.numbers("frequencies", "Hz")),
    LIST_VOLTAGE("list-voltage", Placeholder.numbers("levels", "V")),
    LIST_CURRENT("list-current", Placeholder.numbers("levels", "A")),
    LIST_BIAS_VOLTAGE("list-bias-voltage", Placeholder.numbers("biases", "V")),
    LIST_BIAS_CURRENT("list-bias-current", Placeholder.numbers("biases", "A")),
    LIST_MODE_ON("list-mode-on"),
    LIST_MODE_OFF("list-mode-off"),
    LIST_MEASURE("list-measure"),
    MEASURE_AGAIN("measure-again"),
    LIST_FORMAT("list-format"),
    POINT_FORMAT("point-format"),
    CORRECTION_OPEN("correction-open"),
    CORRECTION_SHORT("correction-short"),
    CORRECTION_LOAD("correction-load"),
    CORRECTION_OPEN_LIST("correction-open-list", Placeholder.numbers("frequencies", "Hz")),
    CORRECTION_SHORT_LIST("correction-short-list", Placeholder.numbers("frequencies", "Hz")),
    CORRECTION_LOAD_LIST("correction-load-list", Placeholder.numbers("frequencies", "Hz")),
    CORRECTION_ON("correction-on"),
    CORRECTION_OFF("correction-off"),
    LOAD_STANDARD("load-standard", Placeholder.number("resistance", "ohm"), Placeholder.number("reactance", "ohm")),
    LIMIT_FREQUENCY_MIN("limit-frequency-min"),
    LIMIT_FREQUENCY_MAX("limit-frequency-max"),
    LIMIT_VOLTAGE_LEVEL_MIN("limit-voltage-level-min"),
    LIMIT_VOLTAGE_LEVEL_MAX("limit-voltage-level-max"),
    LIMIT_CURRENT_LEVEL_MIN("limit-current-level-min"),
    LIMIT_CURRENT_LEVEL_MAX("limit-current-level-max"),
    LIMIT_BIAS_VOLTAGE_MIN("limit-bias-voltage-min"),
    LIMIT_BIAS_VOLTAGE_MAX("limit-bias-voltage-max"),
    LIMIT_BIAS_CURRENT_MIN("limit-bias-current-min"),
    LIMIT_BIAS_CURRENT_MAX("limit-bias-current-max");

    private static final Map<String, Command> BY_KEY =
            Arrays.stream(values()).collect(Collectors.toUnmodifiableMap(c -> c.key, Function.identity()));

    private final String key;
    private final List<Placeholder> placeholders;

    Command(String key, Placeholder... placeholders) {
        this.key = key;
        this.placeholders = List.of(placeholders);
    }

    /** The key as written in a dialect file. */
    String key() {
        return key;
    }

    /** The placeholders the template must hold, each exactly once or more; no others are allowed. */
    List<Placeholder> placeholders() {
        return placeholders;
    }

    /** The command that acquires {@code s} at the frequency set now. */
    static Command acquiring(org.zweep.driver.meter.CorrectionStandard s) {
        return switch (s) {
            case OPEN -> CORRECTION_OPEN;
            case SHORT -> CORRECTION_SHORT;
            case LOAD -> CORRECTION_LOAD;
        };
    }

    /** The command that acquires {@code s} at each frequency of a list, in one message. */
    static Command acquiringList(org.zweep.driver.meter.CorrectionStandard s) {
        return switch (s) {
            case OPEN -> CORRECTION_OPEN_LIST;
            case SHORT -> CORRECTION_SHORT_LIST;
            case LOAD -> CORRECTION_LOAD_LIST;
        };
    }

    static Optional<Command> byKey(String key) {
        return Optional.ofNullable(BY_KEY.get(key));
    }
}
