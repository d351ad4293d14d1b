package org.zweep.simulator.scpi;

/**
 * The SCPI-1999 standard error and event numbers the simulator reports, with their texts exactly
 * as SCPI-1999 Vol 2 §21.8.3 and §21.8.9–21.8.12 write them.
 */
public enum StandardError {
    NO_ERROR(0, "No error"),
    COMMAND_ERROR(-100, "Command error"),
    INVALID_CHARACTER(-101, "Invalid character"),
    SYNTAX_ERROR(-102, "Syntax error"),
    INVALID_SEPARATOR(-103, "Invalid separator"),
    DATA_TYPE_ERROR(-104, "Data type error"),
    PARAMETER_NOT_ALLOWED(-108, "Parameter not allowed"),
    MISSING_PARAMETER(-109, "Missing parameter"),
    HEADER_SEPARATOR_ERROR(-111, "Header separator error"),
    PROGRAM_MNEMONIC_TOO_LONG(-112, "Program mnemonic too long"),
    UNDEFINED_HEADER(-113, "Undefined header"),
    HEADER_SUFFIX_OUT_OF_RANGE(-114, "Header suffix out of range"),
    NUMERIC_DATA_ERROR(-120, "Numeric data error"),
    INVALID_CHARACTER_IN_NUMBER(-121, "Invalid character in number"),
    EXPONENT_TOO_LARGE(-123, "Exponent too large"),
    TOO_MANY_DIGITS(-124, "Too many digits"),
    INVALID_SUFFIX(-131, "Invalid suffix"),
    SUFFIX_TOO_LONG(-134, "Suffix too long"),
    SUFFIX_NOT_ALLOWED(-138, "Suffix not allowed"),
    CHARACTER_DATA_TOO_LONG(-144, "Character data too long"),
    INVALID_STRING_DATA(-151, "Invalid string data"),
    INVALID_BLOCK_DATA(-161, "Invalid block data"),
    EXPRESSION_DATA_NOT_ALLOWED(-178, "Expression data not allowed"),
    EXECUTION_ERROR(-200, "Execution error"),
    TRIGGER_IGNORED(-211, "Trigger ignored"),
    INIT_IGNORED(-213, "Init ignored"),
    TRIGGER_DEADLOCK(-214, "Trigger deadlock"),
    SETTINGS_CONFLICT(-221, "Settings conflict"),
    DATA_OUT_OF_RANGE(-222, "Data out of range"),
    TOO_MUCH_DATA(-223, "Too much data"),
    ILLEGAL_PARAMETER_VALUE(-224, "Illegal parameter value"),
    LISTS_NOT_SAME_LENGTH(-226, "Lists not same length"),
    DATA_CORRUPT_OR_STALE(-230, "Data corrupt or stale"),
    FILE_NAME_NOT_FOUND(-256, "File name not found"),
    DEVICE_SPECIFIC_ERROR(-300, "Device-specific error"),
    QUEUE_OVERFLOW(-350, "Queue overflow"),
    INPUT_BUFFER_OVERRUN(-363, "Input buffer overrun"),
    QUERY_ERROR(-400, "Query error"),
    QUERY_INTERRUPTED(-410, "Query INTERRUPTED"),
    QUERY_UNTERMINATED(-420, "Query UNTERMINATED"),
    QUERY_DEADLOCKED(-430, "Query DEADLOCKED");

    private final int code;
    private final String text;

    StandardError(int code, String text) {
        this.code = code;
        this.text = text;
    }

    /** The error number, e.g. {@code -222}. */
    public int code() {
        return code;
    }

    /** The standard description, e.g. {@code Data out of range}. */
    public String text() {
        return text;
    }

    /** The standard error with number {@code code}, or {@code null} if it is not one of ours. */
    public static StandardError of(int code) {
        for (StandardError e : values()) {
            if (e.code == code) {
                return e;
            }
        }
        return null;
    }
}
