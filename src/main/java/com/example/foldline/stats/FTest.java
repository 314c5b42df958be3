package com.example.foldline.stats;

/**
 * The naive F test of a segmented fit against the straight line, as R's {@code anova(linear, segmented)}:
 * F = ((RSS₀ − RSS₁)/df1)/(RSS₁/df2). Its p-value ignores that ψ is not identified under the null hypothesis (that is
 * what the Davies test corrects), so report it, but decide with {@link DaviesTest}.
 *
 * @param f      the F statistic
 * @param df1    numerator degrees of freedom (2 per breakpoint: slope change and ψ)
 * @param df2    denominator degrees of freedom (n minus the parameters of the segmented model)
 * @param pValue upper tail of F(df1, df2) at f
 */
public record FTest(double f, double df1, double df2, double pValue) {
}
