package com.example.foldline.alerts;

import java.time.LocalDateTime;
import java.util.ArrayList;
import java.util.List;

/**
 * Judges a rule over a sequence of windows: the single code path of the live evaluator (for the windows due) and of
 * the back-test (for every hour of the range).
 *
 * @param rule        the rule after the last window
 * @param transitions the state changes, in order
 * @param evaluations every window's evaluation, in order
 */
record RuleRun(AlertRule rule, List<Transition> transitions, List<Evaluation> evaluations) {

    static RuleRun of(AlertRule rule, List<LocalDateTime> ends, HourlySeries series) {
        List<Transition> transitions = new ArrayList<>();
        List<Evaluation> evaluations = new ArrayList<>(ends.size());
        AlertRule current = rule;
        for (LocalDateTime end : ends) {
            Evaluation e = WindowEvaluator.evaluate(current.definition(), end, series);
            AlertRule.Step step = current.judge(e);
            current = step.rule();
            evaluations.add(e);
            if (step.transition() != null) {
                transitions.add(step.transition());
            }
        }
        return new RuleRun(current, List.copyOf(transitions), List.copyOf(evaluations));
    }
}
