package org.isorisk.engine.random;

/**
 * The standard normal quantile function (inverse distribution function) by Wichura's algorithm AS241, PPND16
 * (M. J. Wichura, "Algorithm AS 241: The Percentage Points of the Normal Distribution", Applied Statistics 37(3),
 * 1988, pp. 477–484): three rational approximations of degree 7 — the central one in {@code q = p − ½} for
 * {@code |q| ≤ 0.425}, two in {@code r = sqrt(−ln min(p, 1 − p))} for {@code r ≤ 5} and beyond — accurate to
 * about 1 part in 10^16. The coefficients are the paper's.
 *
 * <p>Bit-reproducible: only {@link StrictMath#log} and {@link StrictMath#sqrt} and IEEE arithmetic (strict on
 * every JDK since 17), each in a fixed order, so the same p gives the same bits on every platform.
 */
public final class Gaussian {
    private Gaussian() {
    }

    /** |p − ½| up to which the central approximation applies (the paper's SPLIT1). */
    private static final double SPLIT1 = 0.425;
    /** r = sqrt(−ln p) up to which the intermediate tail approximation applies (SPLIT2). */
    private static final double SPLIT2 = 5;
    /** SPLIT1² (CONST1). */
    private static final double CONST1 = 0.180625;
    /** The shift of r in the intermediate tail (CONST2). */
    private static final double CONST2 = 1.6;

    private static final double A0 = 3.3871328727963666080e0;
    private static final double A1 = 1.3314166789178437745e+2;
    private static final double A2 = 1.9715909503065514427e+3;
    private static final double A3 = 1.3731693765509461125e+4;
    private static final double A4 = 4.5921953931549871457e+4;
    private static final double A5 = 6.7265770927008700853e+4;
    private static final double A6 = 3.3430575583588128105e+4;
    private static final double A7 = 2.5090809287301226727e+3;
    private static final double B1 = 4.2313330701600911252e+1;
    private static final double B2 = 6.8718700749205790830e+2;
    private static final double B3 = 5.3941960214247511077e+3;
    private static final double B4 = 2.1213794301586595867e+4;
    private static final double B5 = 3.9307895800092710610e+4;
    private static final double B6 = 2.8729085735721942674e+4;
    private static final double B7 = 5.2264952788528545610e+3;

    private static final double C0 = 1.42343711074968357734e0;
    private static final double C1 = 4.63033784615654529590e0;
    private static final double C2 = 5.76949722146069140550e0;
    private static final double C3 = 3.64784832476320460504e0;
    private static final double C4 = 1.27045825245236838258e0;
    private static final double C5 = 2.41780725177450611770e-1;
    private static final double C6 = 2.27238449892691845833e-2;
    private static final double C7 = 7.74545014278341407640e-4;
    private static final double D1 = 2.05319162663775882187e0;
    private static final double D2 = 1.67638483018380384940e0;
    private static final double D3 = 6.89767334985100004550e-1;
    private static final double D4 = 1.48103976427480074590e-1;
    private static final double D5 = 1.51986665636164571966e-2;
    private static final double D6 = 5.47593808499534494600e-4;
    private static final double D7 = 1.05075007164441684324e-9;

    private static final double E0 = 6.65790464350110377720e0;
    private static final double E1 = 5.46378491116411436990e0;
    private static final double E2 = 1.78482653991729133580e0;
    private static final double E3 = 2.96560571828504891230e-1;
    private static final double E4 = 2.65321895265761230930e-2;
    private static final double E5 = 1.24266094738807843860e-3;
    private static final double E6 = 2.71155556874348757815e-5;
    private static final double E7 = 2.01033439929228813265e-7;
    private static final double F1 = 5.99832206555887937690e-1;
    private static final double F2 = 1.36929880922735805310e-1;
    private static final double F3 = 1.48753612908506148525e-2;
    private static final double F4 = 7.86869131145613259100e-4;
    private static final double F5 = 1.84631831751005468180e-5;
    private static final double F6 = 1.42151175831644588870e-7;
    private static final double F7 = 2.04426310338993978564e-15;

    /**
     * The x with {@code Φ(x) = p} for the standard normal distribution function Φ.
     *
     * @param p probability strictly between 0 and 1
     * @throws IllegalArgumentException when p is not inside (0, 1)
     */
    public static double inverseCdf(double p) {
        if (!(p > 0 && p < 1)) {
            throw new IllegalArgumentException("probability must lie strictly between 0 and 1: " + p);
        }
        double q = p - 0.5;
        if (Math.abs(q) <= SPLIT1) {
            double r = CONST1 - q * q;
            return q * (((((((A7 * r + A6) * r + A5) * r + A4) * r + A3) * r + A2) * r + A1) * r + A0)
                    / (((((((B7 * r + B6) * r + B5) * r + B4) * r + B3) * r + B2) * r + B1) * r + 1.0);
        }
        double r = q < 0 ? p : 1.0 - p;
        r = StrictMath.sqrt(-StrictMath.log(r));
        double x;
        if (r <= SPLIT2) {
            r -= CONST2;
            x = (((((((C7 * r + C6) * r + C5) * r + C4) * r + C3) * r + C2) * r + C1) * r + C0)
                    / (((((((D7 * r + D6) * r + D5) * r + D4) * r + D3) * r + D2) * r + D1) * r + 1.0);
        } else {
            r -= SPLIT2;
            x = (((((((E7 * r + E6) * r + E5) * r + E4) * r + E3) * r + E2) * r + E1) * r + E0)
                    / (((((((F7 * r + F6) * r + F5) * r + F4) * r + F3) * r + F2) * r + F1) * r + 1.0);
        }
        return q < 0 ? -x : x;
    }
}
