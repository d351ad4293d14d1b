package org.zweep.runner.analysis;

import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Where the measured value sits against the nominal: deviation, IEC 60062 letter class and the
 * nearest IEC 60063 preferred values.
 *
 * @param measured the measured main value (F, H or Ω)
 * @param source where it comes from, for people (e.g. {@code fit of step sweep (1 V, bias 0 V)})
 * @param nominal the nominal value; NaN when the manifest has none
 * @param unit {@code F}, {@code H} or {@code Ω}
 * @param deviationPercent (measured − nominal)/nominal in %; NaN without a nominal
 * @param letter the tightest IEC 60062 letter holding the value, or null
 * @param withinTolerance whether the measured value lies within the part's stated tolerance (the
 *     value alone, without its uncertainty); null when none is stated
 * @param nearest the nearest value in each of E6, E12, E24, E48, E96
 * @param versusChecks why a check on the part's value comes to another decision than
 *     {@code tolerance}, or empty when none does (the run's verdict is always the checks')
 * @param measuredU the standard uncertainty of {@code measured} (a weighted fit's sigma, or the
 *     point's u); NaN when unknown
 * @param tolerance the decision on the measured value against the stated tolerance, by the rule
 *     the checks on the part's value use (the sequence's rule; simple without checks); null
 *     when no tolerance is stated
 */
public record Bins(double measured, String source, double nominal, String unit, double deviationPercent,
        String letter, Boolean withinTolerance, Map<String, Double> nearest, String versusChecks, double measuredU,
        org.zweep.runner.conformance.Conformance tolerance) {
    public Bins {
        nearest = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(nearest));
    }
}
