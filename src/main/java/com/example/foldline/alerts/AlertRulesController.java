package com.example.foldline.alerts;

import java.net.URI;
import java.time.Instant;
import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import org.springframework.http.HttpStatus;
import org.springframework.http.ResponseEntity;
import org.springframework.web.bind.annotation.DeleteMapping;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.PutMapping;
import org.springframework.web.bind.annotation.RequestBody;
import org.springframework.web.bind.annotation.RequestMapping;
import org.springframework.web.bind.annotation.RequestMethod;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.bind.annotation.ResponseStatus;
import org.springframework.web.bind.annotation.RestController;

import com.example.foldline.system.BadRequestException;
import com.example.foldline.system.FieldError;

import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;
import jakarta.servlet.http.HttpServletRequest;

@RestController
@RequestMapping("/api/v1/sites/{siteId}/alerts")
@Tag(name = "Alerts", description = "Alert rules, back-tests and jump suggestions; see docs/alerts.md")
class AlertRulesController {

    private final AlertRules rules;
    private final Backtester backtester;
    private final JumpSuggestions suggestions;

    AlertRulesController(AlertRules rules, Backtester backtester, JumpSuggestions suggestions) {
        this.rules = rules;
        this.backtester = backtester;
        this.suggestions = suggestions;
    }

    /** Body of PUT …/mute. */
    record MuteRequest(Instant until) {
    }

    @GetMapping("/rules")
    List<RuleView> list(@PathVariable long siteId) {
        return rules.list(siteId);
    }

    @PostMapping("/rules")
    @Operation(summary = "Create an alert rule", description = "Omitted fields take the defaults of docs/alerts.md")
    ResponseEntity<RuleView> create(@PathVariable long siteId, @RequestBody RuleRequest request) {
        RuleView created = rules.create(siteId, request);
        return ResponseEntity.created(URI.create("/api/v1/sites/" + siteId + "/alerts/rules/" + created.id()))
                .body(created);
    }

    @GetMapping("/rules/{ruleId}")
    RuleView get(@PathVariable long siteId, @PathVariable long ruleId) {
        return rules.get(siteId, ruleId);
    }

    @PutMapping("/rules/{ruleId}")
    RuleView update(@PathVariable long siteId, @PathVariable long ruleId, @RequestBody RuleRequest request) {
        return rules.update(siteId, ruleId, request);
    }

    @DeleteMapping("/rules/{ruleId}")
    @ResponseStatus(HttpStatus.NO_CONTENT)
    void delete(@PathVariable long siteId, @PathVariable long ruleId) {
        rules.delete(siteId, ruleId);
    }

    @PostMapping("/rules/{ruleId}/pause")
    RuleView pause(@PathVariable long siteId, @PathVariable long ruleId) {
        return rules.pause(siteId, ruleId);
    }

    @PostMapping("/rules/{ruleId}/resume")
    RuleView resume(@PathVariable long siteId, @PathVariable long ruleId) {
        return rules.resume(siteId, ruleId);
    }

    @RequestMapping(path = "/rules/{ruleId}/mute", method = {RequestMethod.PUT, RequestMethod.POST})
    @Operation(summary = "Mute a rule until a time", description = "Its notifications stay in the app, unread count "
            + "and outward deliveries skip them; body {\"until\": \"2026-11-10T08:00:00Z\"} (PUT, or POST for clients "
            + "without PUT)")
    RuleView mute(@PathVariable long siteId, @PathVariable long ruleId, @RequestBody MuteRequest request) {
        return rules.mute(siteId, ruleId, request == null ? null : request.until());
    }

    @DeleteMapping("/rules/{ruleId}/mute")
    RuleView unmute(@PathVariable long siteId, @PathVariable long ruleId) {
        return rules.unmute(siteId, ruleId);
    }

    @GetMapping("/rules/{ruleId}/history")
    @Operation(summary = "Every state change of the rule with the values that caused it, newest first")
    List<StateChange> history(@PathVariable long siteId, @PathVariable long ruleId,
                              @RequestParam(defaultValue = "100") int limit) {
        return rules.history(siteId, ruleId, limit);
    }

    @PostMapping("/backtest")
    @Operation(summary = "Replay a rule over history (default the last 30 days) with the live evaluator's code")
    BacktestResult backtest(@PathVariable long siteId, @RequestBody BacktestRequest request) {
        return backtester.run(siteId, request);
    }

    @GetMapping("/suggestions")
    @Operation(summary = "Possible jumps in the hourly bounce rate (CUSUM), each with a rule to save",
            description = "days: 4 to 60 (default 14); to: last local day (default: up to the newest complete hour); segment: device, source, country, region, browser, variant")
    JumpSuggestions.Answer suggestions(@PathVariable long siteId, HttpServletRequest request) {
        List<FieldError> errors = new ArrayList<>();
        int days = JumpSuggestions.DEFAULT_DAYS;
        LocalDate until = null;
        Map<String, List<String>> segment = new LinkedHashMap<>();
        for (Map.Entry<String, String[]> p : request.getParameterMap().entrySet()) {
            if (p.getKey().equals("days")) {
                try {
                    days = Integer.parseInt(p.getValue()[0]);
                    if (days < 4 || days > JumpSuggestions.MAX_DAYS) {
                        errors.add(new FieldError("days", "must be from 4 to " + JumpSuggestions.MAX_DAYS + ", got "
                                + days));
                    }
                } catch (NumberFormatException e) {
                    errors.add(new FieldError("days", "must be an integer, got '" + p.getValue()[0] + "'"));
                }
            } else if (p.getKey().equals("to")) {
                try {
                    until = LocalDate.parse(p.getValue()[0]);
                } catch (DateTimeParseException e) {
                    errors.add(new FieldError("to", "must be a date as YYYY-MM-DD, got '" + p.getValue()[0] + "'"));
                }
            } else if (SegmentSpec.DIMENSIONS.containsKey(p.getKey())) {
                segment.put(p.getKey(), Arrays.asList(p.getValue()));
            } else {
                errors.add(new FieldError(p.getKey(), "unknown parameter; accepted: days, to, device, source, country, "
                        + "region, browser, variant"));
            }
        }
        Map<String, List<String>> checked = SegmentSpec.validated(segment, errors);
        if (!errors.isEmpty()) {
            throw new BadRequestException(errors);
        }
        return suggestions.suggest(siteId, checked, days, until);
    }
}
