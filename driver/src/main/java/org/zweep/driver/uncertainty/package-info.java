/**
 * Measurement uncertainty of an impedance: standard uncertainties of R and X with their
 * correlation, propagated to every derived parameter by the law of propagation of uncertainty
 * (JCGM 100:2008) and by a seeded Monte Carlo propagation (JCGM 101:2008), and a meter's stated
 * accuracy in the generic data-sheet form turned into such an uncertainty.
 */
package org.zweep.driver.uncertainty;
