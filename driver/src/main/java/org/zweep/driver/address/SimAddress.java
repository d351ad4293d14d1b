package org.zweep.driver.address;

/**
 * The built-in simulator in the same process (opened by the provider in the runner module).
 *
 * @param text the address as written
 * @param bench the bench name or file the simulator loads; empty for its default bench
 */
public record SimAddress(String text, String bench) implements Address {

    @Override
    public String scheme() {
        return "sim";
    }

    @Override
    public String toString() {
        return text;
    }
}
