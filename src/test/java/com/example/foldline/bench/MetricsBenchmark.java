package com.example.foldline.bench;

/** Placeholder replaced below. */
final class MetricsBenchmark {
    private MetricsBenchmark() {
    }

    public static void main(String[] args) {
        throw new UnsupportedOperationException("metrics benchmark not written yet");
    }
}
