package org.zweep.simulator.netlist;

/**
 * In-place solve of a dense complex linear system by LU decomposition with partial pivoting, on
 * split real and imaginary arrays (row-major, {@code n × n}) so that no objects are allocated.
 */
final class ComplexLu {

    private ComplexLu() {
    }

    /**
     * Solves {@code A·x = b}; {@code A} is destroyed and {@code x} is left in {@code b}.
     *
     * @return false if the matrix is singular (an exactly zero pivot or a result that is not finite)
     */
    static boolean solve(int n, double[] are, double[] aim, double[] bre, double[] bim) {
        for (int k = 0; k < n; k++) {
            int pivot = k;
            double best = are[k * n + k] * are[k * n + k] + aim[k * n + k] * aim[k * n + k];
            for (int i = k + 1; i < n; i++) {
                double m = are[i * n + k] * are[i * n + k] + aim[i * n + k] * aim[i * n + k];
                if (m > best) {
                    best = m;
                    pivot = i;
                }
            }
            if (best == 0) {
                return false;
            }
            if (pivot != k) {
                swapRows(n, are, k, pivot);
                swapRows(n, aim, k, pivot);
                swap(bre, k, pivot);
                swap(bim, k, pivot);
            }
            // 1 / pivot
            double pr = are[k * n + k] / best;
            double pi = -aim[k * n + k] / best;
            for (int i = k + 1; i < n; i++) {
                double xr = are[i * n + k];
                double xi = aim[i * n + k];
                if (xr == 0 && xi == 0) {
                    continue;
                }
                double fr = xr * pr - xi * pi;
                double fi = xr * pi + xi * pr;
                int ri = i * n;
                int rk = k * n;
                for (int j = k + 1; j < n; j++) {
                    double yr = are[rk + j];
                    double yi = aim[rk + j];
                    are[ri + j] -= fr * yr - fi * yi;
                    aim[ri + j] -= fr * yi + fi * yr;
                }
                double br = bre[k];
                double bi = bim[k];
                bre[i] -= fr * br - fi * bi;
                bim[i] -= fr * bi + fi * br;
            }
        }
        for (int k = n - 1; k >= 0; k--) {
            double sr = bre[k];
            double si = bim[k];
            int rk = k * n;
            for (int j = k + 1; j < n; j++) {
                double ar = are[rk + j];
                double ai = aim[rk + j];
                sr -= ar * bre[j] - ai * bim[j];
                si -= ar * bim[j] + ai * bre[j];
            }
            double dr = are[rk + k];
            double di = aim[rk + k];
            double d = dr * dr + di * di;
            bre[k] = (sr * dr + si * di) / d;
            bim[k] = (si * dr - sr * di) / d;
            if (!Double.isFinite(bre[k]) || !Double.isFinite(bim[k])) {
                return false;
            }
        }
        return true;
    }

    private static void swapRows(int n, double[] a, int r1, int r2) {
        for (int j = 0; j < n; j++) {
            double t = a[r1 * n + j];
            a[r1 * n + j] = a[r2 * n + j];
            a[r2 * n + j] = t;
        }
    }

    private static void swap(double[] a, int i, int j) {
        double t = a[i];
        a[i] = a[j];
        a[j] = t;
    }
}
