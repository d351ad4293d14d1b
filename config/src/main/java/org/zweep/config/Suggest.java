package org.zweep.config;

import java.util.Collection;
import java.util.Optional;

/** "Did you mean" suggestions for mistyped keys and names. */
public final class Suggest {
    private Suggest() {
    }

    /**
     * {@code " (did you mean 'x'?)"} for the closest candidate within a small edit distance of
     * {@code word}, or the empty string when none is close.
     */
    public static String didYouMean(String word, Collection<String> candidates) {
        return nearest(word, candidates).map(best -> " (did you mean '" + best + "'?)").orElse("");
    }

    /**
     * The candidate closest to {@code word} (ignoring case) when it is near enough to be a typo of
     * it: at most one edit per three letters of {@code word} (at least one, at most three), and
     * {@code word} at least three letters long; the first of equally close ones.
     */
    public static Optional<String> nearest(String word, Collection<String> candidates) {
        if (word.length() < 3) {
            return Optional.empty();
        }
        String best = null;
        int bestDistance = Integer.MAX_VALUE;
        for (String c : candidates) {
            int d = distance(word.toLowerCase(java.util.Locale.ROOT), c.toLowerCase(java.util.Locale.ROOT));
            if (d < bestDistance) {
                best = c;
                bestDistance = d;
            }
        }
        int allowed = Math.max(1, Math.min(3, word.length() / 3));
        return best != null && bestDistance <= allowed ? Optional.of(best) : Optional.empty();
    }

    /** Optimal string alignment distance: insertions, deletions, substitutions and adjacent swaps. */
    public static int distance(String a, String b) {
        int[][] d = new int[a.length() + 1][b.length() + 1];
        for (int i = 0; i <= a.length(); i++) {
            d[i][0] = i;
        }
        for (int j = 0; j <= b.length(); j++) {
            d[0][j] = j;
        }
        for (int i = 1; i <= a.length(); i++) {
            for (int j = 1; j <= b.length(); j++) {
                int cost = a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1;
                d[i][j] = Math.min(Math.min(d[i - 1][j] + 1, d[i][j - 1] + 1), d[i - 1][j - 1] + cost);
                if (i > 1 && j > 1 && a.charAt(i - 1) == b.charAt(j - 2) && a.charAt(i - 2) == b.charAt(j - 1)) {
                    d[i][j] = Math.min(d[i][j], d[i - 2][j - 2] + 1);
                }
            }
        }
        return d[a.length()][b.length()];
    }
}
