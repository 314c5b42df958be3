package com.example.foldline.ingest;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.concurrent.atomic.AtomicInteger;

import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.springframework.boot.context.event.ApplicationReadyEvent;
import org.springframework.context.event.EventListener;
import org.springframework.scheduling.annotation.Scheduled;
import org.springframework.stereotype.Component;

import com.example.foldline.system.BadRequestException;

import jakarta.annotation.PreDestroy;

/**
 * Runs import jobs in the background: a small pool of {@code foldline.imports.workers} threads takes queued jobs
 * oldest first, never two of one site at once. The database is the queue, so jobs survive a restart: a job left in
 * {@code reading} without a commit for {@link #STALE} is queued again and resumes from its last commit.
 */
@Component
class ImportWorker {

    /** A job being read commits at least every commit-interval; one silent this long lost its worker. */
    static final Duration STALE = Duration.ofMinutes(2);

    private static final Logger log = LoggerFactory.getLogger(ImportWorker.class);

    private final ImportJobRepository jobs;
    private final ImportRunner runner;
    private final ImportFiles files;
    private final ImportProperties properties;
    private final Clock clock;
    private final ExecutorService executor;
    private final Map<Long, AtomicBoolean> running = new ConcurrentHashMap<>();
    private volatile boolean stopping;

    ImportWorker(ImportJobRepository jobs, ImportRunner runner, ImportFiles files, ImportProperties properties,
                 Clock clock) {
        this.jobs = jobs;
        this.runner = runner;
        this.files = files;
        this.properties = properties;
        this.clock = clock;
        AtomicInteger n = new AtomicInteger();
        this.executor = Executors.newFixedThreadPool(properties.workers(), r -> {
            Thread t = new Thread(r, "import-" + n.incrementAndGet());
            t.setDaemon(true);
            return t;
        });
    }

    @EventListener(ApplicationReadyEvent.class)
    void started() {
        scheduled();
    }

    @Scheduled(fixedDelayString = "${foldline.imports.poll-interval:PT30S}", initialDelayString = "PT30S")
    void scheduled() {
        try {
            recover();
        } catch (RuntimeException e) {
            log.error("import job recovery failed; it will be retried", e);
        }
    }

    /** Queues again the jobs whose worker went away, then starts what can start. */
    void recover() {
        Instant now = clock.instant();
        int requeued = jobs.recoverStale(now.minus(STALE), now);
        if (requeued > 0) {
            log.info("{} import job(s) interrupted by a stop will resume from their last commit", requeued);
        }
        dispatch();
    }

    /** Starts queued jobs while workers are free. */
    synchronized void dispatch() {
        while (!stopping && running.size() < properties.workers()) {
            List<ImportJob> next = jobs.claimable(properties.workers());
            ImportJob claimed = null;
            for (ImportJob job : next) {
                if (!running.containsKey(job.id()) && jobs.claim(job.siteId(), job.id(), clock.instant())) {
                    claimed = job;
                    break;
                }
            }
            if (claimed == null) {
                return;
            }
            AtomicBoolean cancel = new AtomicBoolean();
            running.put(claimed.id(), cancel);
            ImportJob job = claimed;
            executor.execute(() -> execute(job, cancel));
        }
    }

    /** Tells the worker reading this job, if it is in this process, to stop at the next line. */
    void cancel(long jobId) {
        AtomicBoolean flag = running.get(jobId);
        if (flag != null) {
            flag.set(true);
        }
    }

    private void execute(ImportJob job, AtomicBoolean cancel) {
        ImportRunner.Outcome outcome = null;
        String message = null;
        try {
            outcome = runner.run(job, new ImportRunner.Control() {
                @Override
                public boolean cancelled() {
                    return cancel.get();
                }

                @Override
                public boolean stopping() {
                    return stopping || Thread.currentThread().isInterrupted();
                }
            });
        } catch (BadRequestException e) {
            message = e.getMessage();
        } catch (IOException | RuntimeException e) {
            if (!stopping) {
                log.warn("import job {} of site {} failed", job.id(), job.siteId(), e);
                message = e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage();
            }
        } finally {
            try {
                if (!stopping && outcome != ImportRunner.Outcome.STOPPED) {
                    end(job, outcome, message);
                }
            } catch (RuntimeException e) {
                log.error("could not record the end of import job {}", job.id(), e);
            } finally {
                running.remove(job.id());
            }
        }
        dispatch();
    }

    private void end(ImportJob job, ImportRunner.Outcome outcome, String message) {
        // the spooled copy goes first, so a job shown as ended never leaves one behind
        if (job.origin().equals("upload")) {
            try {
                Files.deleteIfExists(Path.of(job.sourcePath()));
            } catch (IOException e) {
                log.warn("could not delete the spooled upload {}", job.sourcePath(), e);
            }
        }
        Instant now = clock.instant();
        if (outcome == ImportRunner.Outcome.DONE) {
            jobs.finish(job.siteId(), job.id(), ImportJob.DONE, null, now);
        } else if (outcome == ImportRunner.Outcome.CANCELLED) {
            jobs.finish(job.siteId(), job.id(), ImportJob.CANCELLED, "cancelled; the lines read before the cancel "
                    + "are stored", now);
        } else if (outcome == ImportRunner.Outcome.GAVE_UP) {
            jobs.finish(job.siteId(), job.id(), ImportJob.FAILED, "the first " + ImportRunner.GIVE_UP_AFTER
                    + " or more lines were all rejected; check the format and mapping against the rejection file",
                    now);
        } else {
            jobs.finish(job.siteId(), job.id(), ImportJob.FAILED, message == null ? "failed" : message, now);
        }
    }

    @PreDestroy
    void stop() throws InterruptedException {
        stopping = true;
        executor.shutdownNow();
        if (!executor.awaitTermination(10, TimeUnit.SECONDS)) {
            log.warn("import workers did not stop within 10 s; their jobs resume after the next start");
        }
    }
}
