package org.zweep.simulator.scpi;

import java.util.ArrayDeque;
import java.util.Deque;

/**
 * The SCPI error/event queue (SCPI-1999 Vol 2 §21.8.1): first in, first out; when full, the most
 * recent entry is replaced by {@code -350,"Queue overflow"} and later errors are dropped until an
 * entry is read. Not thread-safe: {@link StatusModel} guards it.
 */
final class ErrorQueue {
    /** Description plus device-dependent information is at most 255 characters (SCPI-1999 §21.8). */
    static final int MAX_TEXT = 255;

    /** One queue entry. */
    record Entry(int code, String text) {
        /** The entry as SYSTem:ERRor? sends it: {@code -222,"Data out of range"}. */
        String formatted() {
            return code + ",\"" + text.replace("\"", "\"\"") + "\"";
        }
    }

    private final int depth;
    private final Deque<Entry> entries = new ArrayDeque<>();

    ErrorQueue(int depth) {
        if (depth < 2) {
            throw new IllegalArgumentException("error queue depth must be at least 2, got " + depth);
        }
        this.depth = depth;
    }

    /** Adds an entry; returns {@code false} if the queue was full (an overflow). */
    boolean push(int code, String text) {
        String t = text.length() > MAX_TEXT ? text.substring(0, MAX_TEXT) : text;
        if (entries.size() < depth) {
            entries.addLast(new Entry(code, t));
            return true;
        }
        if (entries.peekLast().code() != StandardError.QUEUE_OVERFLOW.code()) {
            entries.pollLast();
            entries.addLast(new Entry(StandardError.QUEUE_OVERFLOW.code(), StandardError.QUEUE_OVERFLOW.text()));
        }
        return false;
    }

    /** Removes and returns the oldest entry, or {@code 0,"No error"} when empty. */
    Entry next() {
        Entry e = entries.pollFirst();
        return e != null ? e : new Entry(0, StandardError.NO_ERROR.text());
    }

    int count() {
        return entries.size();
    }

    boolean isEmpty() {
        return entries.isEmpty();
    }

    void clear() {
        entries.clear();
    }
}
