package org.zweep.bench.runner;

/** The smallest Java program: the start-up {@link SideBySide} sets {@code zweep --version} against. */
public final class HelloWorld {
    private HelloWorld() {
    }

    public static void main(String[] args) {
        System.out.println("hello, world");
    }
}
