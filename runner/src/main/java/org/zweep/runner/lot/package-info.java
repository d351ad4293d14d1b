/**
 * Lots: many parts measured one after another with one sequence, each part an ordinary run folder
 * inside the lot folder ({@code lot.json}, {@code NNN-SERIAL/}), summed up in {@code lot.csv} and
 * {@code lot.html}, and compared lot against lot.
 */
package org.zweep.runner.lot;
