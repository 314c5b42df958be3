package com.example.foldline.metrics;

import java.math.BigDecimal;
import java.math.RoundingMode;

/** Converts micro-units of a currency to a decimal amount (6 places), for answers that give both. */
final class Money {

    private Money() {
    }

    static Double decimal(double micros) {
        if (!Double.isFinite(micros)) {
            return null;
        }
        return BigDecimal.valueOf(micros).divide(BigDecimal.valueOf(1_000_000), 6, RoundingMode.HALF_EVEN).doubleValue();
    }

    static Double finite(double value) {
        return Double.isFinite(value) ? value : null;
    }
}
