package org.zweep.runner.results;

import com.fasterxml.jackson.annotation.JsonInclude;
import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.JsonSerializer;
import com.fasterxml.jackson.databind.ObjectReader;
import com.fasterxml.jackson.databind.ObjectWriter;
import com.fasterxml.jackson.databind.PropertyNamingStrategies;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.SerializerProvider;
import com.fasterxml.jackson.databind.json.JsonMapper;
import com.fasterxml.jackson.databind.module.SimpleModule;
import java.io.IOException;

/**
 * The one JSON configuration of every document zweep writes and reads about a run
 * ({@code run.json}, {@code analysis.json}, the JSON export, the compensation sidecar): Jackson
 * databind on records, field names in snake_case ({@code frequencyHz} → {@code frequency_hz}),
 * indented, every field written (null included), a number that is not finite (NaN, ±∞) written
 * as {@code null}, unknown fields ignored when reading. The writer and reader are immutable and
 * thread-safe.
 */
public final class Json {
    private static final JsonMapper MAPPER = JsonMapper.builder()
            .propertyNamingStrategy(PropertyNamingStrategies.SNAKE_CASE)
            .serializationInclusion(JsonInclude.Include.ALWAYS)
            .enable(SerializationFeature.INDENT_OUTPUT)
            .disable(DeserializationFeature.FAIL_ON_UNKNOWN_PROPERTIES)
            .addModule(new SimpleModule("zweep-non-finite-as-null")
                    .addSerializer(Double.class, new NonFiniteAsNull())
                    .addSerializer(Double.TYPE, new NonFiniteAsNull()))
            .build();
    private static final ObjectWriter WRITER = MAPPER.writer();
    private static final ObjectWriter LINE = MAPPER.writer().without(SerializationFeature.INDENT_OUTPUT);
    private static final ObjectReader READER = MAPPER.reader();

    private Json() {
    }

    /**
     * Builds the serializers and deserializers of {@code types} into the mapper's caches, so that a
     * later first write or read of them does not wait for Jackson's introspection of the records
     * (see {@code cli.StartUp}, which calls this on a background thread). A failure here is left for
     * the write itself to report.
     */
    public static void prepare(Class<?>... types) {
        for (Class<?> type : types) {
            // a writer and a reader for a type fetch its serializer and deserializer at once
            // (EAGER_SERIALIZER_FETCH, EAGER_DESERIALIZER_FETCH)
            MAPPER.writerFor(type);
            MAPPER.readerFor(type);
        }
    }

    /** The writer: snake_case, indented, non-finite numbers as null. */
    public static ObjectWriter writer() {
        return WRITER;
    }

    /** The reader: snake_case, unknown fields ignored. */
    public static ObjectReader reader() {
        return READER;
    }

    /** {@code value} as JSON text with a final line break. */
    public static String text(Object value) {
        return write(WRITER, value) + "\n";
    }

    /**
     * {@code value} as JSON on one line, without a line break (an event in a {@code .jsonl} file, a
     * one-line answer such as {@code zweep ping --json}); otherwise as {@link #text}.
     */
    public static String line(Object value) {
        return write(LINE, value);
    }

    private static String write(ObjectWriter writer, Object value) {
        try {
            return writer.writeValueAsString(value);
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException("cannot write " + value.getClass().getSimpleName() + " as JSON: "
                    + e.getOriginalMessage(), e);
        }
    }

    /** Parses one JSON document as a tree. */
    public static JsonNode readTree(String text) throws IOException {
        return READER.readTree(text);
    }

    /** {@code value} as a JSON tree (as {@link #writer()} would write it). */
    public static JsonNode tree(Object value) {
        return MAPPER.valueToTree(value);
    }

    /** Writes a double, or null when it is NaN or infinite (JSON has no such numbers). */
    private static final class NonFiniteAsNull extends JsonSerializer<Double> {
        @Override
        public void serialize(Double value, JsonGenerator g, SerializerProvider provider) throws IOException {
            if (Double.isFinite(value)) {
                g.writeNumber(value);
            } else {
                g.writeNull();
            }
        }
    }
}
