package com.example.foldline.alerts;

import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

import org.springframework.stereotype.Service;
import org.springframework.transaction.annotation.Transactional;

import com.example.foldline.sites.Sites;
import com.example.foldline.system.BadRequestException;
import com.example.foldline.system.FieldError;
import com.example.foldline.system.NotFoundException;

/** The alerts module's API for rules: create, change, pause, mute and read them with their history. */
@Service
public class AlertRules {

    static final Duration MAX_MUTE = Duration.ofDays(30);

    private final RuleRepository rules;
    private final WebhookRepository webhooks;
    private final Sites sites;
    private final Clock clock;

    AlertRules(RuleRepository rules, WebhookRepository webhooks, Sites sites, Clock clock) {
        this.rules = rules;
        this.webhooks = webhooks;
        this.sites = sites;
        this.clock = clock;
    }

    @Transactional
    public RuleView create(long siteId, RuleRequest request) {
        sites.require(siteId);
        Validated v = validate(siteId, request);
        long id = rules.insert(siteId, v.definition(), v.emails(), request.enabled() == null || request.enabled(),
                clock.instant());
        rules.replaceWebhooks(id, v.webhookIds());
        return get(siteId, id);
    }

    /** Replaces the definition; the state is kept, so an open episode still ends with a recovery notice. */
    @Transactional
    public RuleView update(long siteId, long ruleId, RuleRequest request) {
        RuleRepository.Stored stored = rules.lock(siteId, ruleId).orElseThrow(() -> notFound(siteId, ruleId));
        Validated v = validate(siteId, request);
        rules.updateDefinition(ruleId, v.definition(), v.emails(), clock.instant());
        rules.replaceWebhooks(ruleId, v.webhookIds());
        if (request.enabled() != null && request.enabled() != stored.rule().enabled()) {
            AlertRule rule = rules.lock(siteId, ruleId).orElseThrow().rule();
            apply(request.enabled() ? rule.resume() : rule.pause());
        }
        return get(siteId, ruleId);
    }

    public RuleView get(long siteId, long ruleId) {
        return rules.find(siteId, ruleId).map(this::view).orElseThrow(() -> notFound(siteId, ruleId));
    }

    public List<RuleView> list(long siteId) {
        sites.require(siteId);
        return rules.findBySite(siteId).stream().map(this::view).toList();
    }

    @Transactional
    public void delete(long siteId, long ruleId) {
        if (!rules.delete(siteId, ruleId)) {
            throw notFound(siteId, ruleId);
        }
    }

    @Transactional
    public RuleView pause(long siteId, long ruleId) {
        apply(rules.lock(siteId, ruleId).orElseThrow(() -> notFound(siteId, ruleId)).rule().pause());
        return get(siteId, ruleId);
    }

    @Transactional
    public RuleView resume(long siteId, long ruleId) {
        apply(rules.lock(siteId, ruleId).orElseThrow(() -> notFound(siteId, ruleId)).rule().resume());
        return get(siteId, ruleId);
    }

    /** Keeps the rule's notifications in the app only (not counted unread, not sent) until {@code until}. */
    @Transactional
    public RuleView mute(long siteId, long ruleId, Instant until) {
        rules.lock(siteId, ruleId).orElseThrow(() -> notFound(siteId, ruleId));
        Instant now = clock.instant();
        if (until == null || !until.isAfter(now) || until.isAfter(now.plus(MAX_MUTE))) {
            throw new BadRequestException("until", "must be a time in the next " + MAX_MUTE.toDays()
                    + " days, such as " + now.plus(Duration.ofHours(8)).truncatedTo(java.time.temporal.ChronoUnit.MINUTES)
                    + ", got " + until);
        }
        rules.setMutedUntil(ruleId, until, now);
        return get(siteId, ruleId);
    }

    @Transactional
    public RuleView unmute(long siteId, long ruleId) {
        rules.lock(siteId, ruleId).orElseThrow(() -> notFound(siteId, ruleId));
        rules.setMutedUntil(ruleId, null, clock.instant());
        return get(siteId, ruleId);
    }

    public List<StateChange> history(long siteId, long ruleId, int limit) {
        rules.find(siteId, ruleId).orElseThrow(() -> notFound(siteId, ruleId));
        return rules.history(siteId, ruleId, Math.max(1, Math.min(limit, 1000)));
    }

    private void apply(AlertRule.Step step) {
        if (step.transition() == null) {
            return;
        }
        Instant now = clock.instant();
        rules.saveStatus(step.rule(), null, null, now);
        rules.insertStateChange(step.transition(), now);
    }

    private record Validated(RuleDefinition definition, List<Long> webhookIds, List<String> emails) {
    }

    private Validated validate(long siteId, RuleRequest request) {
        List<FieldError> errors = new ArrayList<>();
        RuleDefinition d = RuleDefinition.from(request, errors);
        List<Long> hooks = request == null || request.webhookIds() == null ? List.of()
                : request.webhookIds().stream().distinct().toList();
        if (hooks.stream().anyMatch(java.util.Objects::isNull)) {
            errors.add(new FieldError("webhookIds", "must not contain null"));
        } else {
            List<Long> known = webhooks.existing(siteId, hooks);
            for (Long h : hooks) {
                if (!known.contains(h)) {
                    errors.add(new FieldError("webhookIds", "no webhook " + h + " on site " + siteId));
                }
            }
        }
        List<String> emails = RuleDefinition.emails(request == null ? null : request.emails(), errors);
        if (!errors.isEmpty()) {
            throw new BadRequestException(errors);
        }
        return new Validated(d, hooks, emails);
    }

    private RuleView view(RuleRepository.Stored s) {
        AlertRule r = s.rule();
        return new RuleView(r.id(), r.siteId(), r.definition().toRequest(r.webhookIds(), r.emails(), r.enabled()),
                r.definition().describe(), r.status().state(), r.status().stateSince(), r.status().lastWindowEnd(),
                r.mutedUntil(), rules.readEvaluation(s.lastEvaluation()), s.lastEvaluatedAt(), s.createdAt(),
                s.updatedAt());
    }

    private static NotFoundException notFound(long siteId, long ruleId) {
        return new NotFoundException("no alert rule " + ruleId + " on site " + siteId);
    }
}
