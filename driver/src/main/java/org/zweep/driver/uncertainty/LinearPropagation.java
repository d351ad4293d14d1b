package org.zweep.driver.uncertainty;

import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.RealMatrix;

/**
 * The law of propagation of uncertainty in matrix form for any number of inputs and outputs:
 * Σ_y = J Σ_x Jᵀ (JCGM 102:2011, 6.2.1.3). Stateless.
 */
public final class LinearPropagation {
    private LinearPropagation() {
    }

    /**
     * The covariance of the inputs from their standard uncertainties and correlation matrix.
     *
     * @param u standard uncertainties, one per input
     * @param r correlation coefficients, n×n, symmetric with ones on the diagonal
     */
    public static double[][] covariance(double[] u, double[][] r) {
        int n = u.length;
        double[][] c = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                c[i][j] = r[i][j] * u[i] * u[j];
            }
        }
        return c;
    }

    /**
     * Σ_y = J Σ_x Jᵀ.
     *
     * @param jacobian m×n sensitivity coefficients ∂y_i/∂x_j
     * @param inputCovariance n×n covariance of the inputs
     * @return the m×m covariance of the outputs
     */
    public static double[][] propagate(double[][] jacobian, double[][] inputCovariance) {
        RealMatrix j = new Array2DRowRealMatrix(jacobian, false);
        RealMatrix c = new Array2DRowRealMatrix(inputCovariance, false);
        return j.multiply(c).multiply(j.transpose()).getData();
    }
}
