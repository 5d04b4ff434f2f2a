// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/evaluationrunner.h"

#include "core/engine/evaluate.h"
#include "core/model/fields.h"
#include "ui/designdocument.h"

#include <QCoreApplication>
#include <QDeadlineTimer>
#include <QElapsedTimer>
#include <QPromise>
#include <QThread>
#include <QTimer>
#include <QtConcurrent/QtConcurrentRun>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <limits>

namespace amp::ui {

namespace {

bool stopped(const SlowWorkHooks& hooks) { return hooks.stop && hooks.stop->load(std::memory_order_relaxed); }

/// Wait `ms` in small slices so a stop is seen at once.
void pause(const SlowWorkHooks& hooks) {
    QElapsedTimer t;
    t.start();
    while (hooks.pauseMs > 0 && t.elapsed() < hooks.pauseMs && !stopped(hooks))
        QThread::msleep(2);
}

SweepPoint evaluateCopy(Design copy, double x) {
    SweepPoint p;
    p.x = x;
    const auto problems = validateDesign(copy);
    if (!problems.empty()) {
        p.maxJunction_C = p.efficiency = p.maxTotalLoss_W = std::numeric_limits<double>::quiet_NaN();
        p.problem = QString::fromStdString(problems.front().path + ": " + problems.front().message);
        return p;
    }
    try {
        // The sweeps show the points' T_j, loss and efficiency: the design-wide studies (stall,
        // protection) are left out, as in core/engine/sweep.h.
        EvaluateOptions options;
        options.designStudies = false;
        const Results r = evaluate(copy, options);
        return sweepPointFrom(copy, r, x);
    } catch (const std::exception& e) {
        p.maxJunction_C = p.efficiency = p.maxTotalLoss_W = std::numeric_limits<double>::quiet_NaN();
        p.problem = QString::fromUtf8(e.what());
        return p;
    }
}

} // namespace

std::vector<int> sweepCounts(const Design& design) {
    std::vector<int> out;
    for (int n = 1; n <= 16; ++n)
        out.push_back(n);
    if (design.bank.count > 16)
        out.push_back(design.bank.count);
    return out;
}

std::vector<double> sweepFrequencies_Hz(const Design& design) {
    std::vector<double> out{1e3, 2e3, 4e3, 6e3, 8e3, 10e3, 12e3, 16e3, 20e3, 25e3, 32e3, 40e3, 50e3};
    const double own = design.pwm.frequency_Hz;
    if (std::isfinite(own) && own > 0.0 &&
        std::none_of(out.begin(), out.end(), [own](double f) { return std::abs(f - own) <= 1e-9 * own; }))
        out.push_back(own);
    std::sort(out.begin(), out.end());
    return out;
}

Results fullEvaluation(const Design& design) {
    // The engine's slow parts, which the quick evaluation leaves out: the duty-profile transient
    // and the power-cycling life, and the bank's studies (runaway load, minimum ballast, spread).
    EvaluateOptions options;
    options.thermalTransient = true;
    options.bankStudies = true;
    return evaluate(design, options);
}

std::optional<SlowResults> runSlowWork(const Design& design, const SlowWorkHooks& hooks) {
    QElapsedTimer clock;
    clock.start();
    SlowResults out;
    out.design = design;
    const auto counts = sweepCounts(design);
    const auto frequencies = sweepFrequencies_Hz(design);
    const int total = 1 + static_cast<int>(counts.size() + frequencies.size());
    int done = 0;
    auto report = [&](const QString& what) {
        if (hooks.progress)
            hooks.progress(done, total, what);
    };

    report(QObject::tr("duty-profile run"));
    pause(hooks);
    if (stopped(hooks))
        return std::nullopt;
    try {
        out.full = fullEvaluation(design);
    } catch (const std::exception& e) {
        out.fullError = QString::fromUtf8(e.what());
    }
    ++done;

    for (int n : counts) {
        report(QObject::tr("sweep: %1 switches").arg(n));
        pause(hooks);
        if (stopped(hooks))
            return std::nullopt;
        Design copy = design;
        copy.bank.count = n;
        normalizeBank(copy.bank);
        out.countSweep.push_back(evaluateCopy(std::move(copy), n));
        ++done;
    }
    for (double f : frequencies) {
        report(QObject::tr("sweep: %1 kHz").arg(QString::number(f / 1000.0, 'g', 4)));
        pause(hooks);
        if (stopped(hooks))
            return std::nullopt;
        Design copy = design;
        copy.pwm.frequency_Hz = f;
        out.frequencySweep.push_back(evaluateCopy(std::move(copy), f));
        ++done;
    }
    report(QObject::tr("done"));
    out.seconds = clock.elapsed() / 1000.0;
    return out;
}

// --- the runner ------------------------------------------------------------------------------

EvaluationRunner::EvaluationRunner(DesignDocument* document, QObject* parent)
    : QObject(parent), m_document(document), m_restartTimer(new QTimer(this)) {
    // One worker: a cancelled job winding down does not compete with the new one for the CPU.
    m_pool.setMaxThreadCount(1);
    m_restartTimer->setSingleShot(true);
    m_restartTimer->setInterval(0); // edits made in one turn of the event loop start one job
    connect(m_restartTimer, &QTimer::timeout, this, &EvaluationRunner::restart);
    connect(m_document, &DesignDocument::designChanged, this, [this] {
        // Stop the job of the old design at once, start the new one on the next turn.
        cancel();
        m_restartTimer->start();
    });
}

EvaluationRunner::~EvaluationRunner() {
    for (auto& job : m_jobs) {
        job->stop->store(true);
        job->watcher->disconnect(this);
    }
    m_pool.waitForDone();
}

void EvaluationRunner::cancel() {
    if (!m_job)
        return;
    m_job->stop->store(true);
    m_job->watcher->future().cancel();
    ++m_cancelled;
    emit cancelled(m_job->generation);
    m_job = nullptr; // winds down in the pool; its result is dropped in onJobFinished
}

void EvaluationRunner::restart() {
    m_restartTimer->stop();
    cancel();
    const quint64 generation = ++m_generation;
    auto job = std::make_unique<Job>();
    job->generation = generation;
    job->stop = std::make_shared<std::atomic<bool>>(false);
    job->watcher = new QFutureWatcher<SlowResults>(this);
    Job* raw = job.get();
    connect(job->watcher, &QFutureWatcherBase::progressValueChanged, this, [this, raw](int value) {
        if (raw == m_job)
            emit progressChanged(value, raw->watcher->progressMaximum(), raw->watcher->progressText());
    });
    connect(job->watcher, &QFutureWatcherBase::finished, this, [this, raw] { onJobFinished(raw); });

    const Design copy = m_document->design();
    const int pauseMs = m_pauseMs;
    std::shared_ptr<std::atomic<bool>> stop = job->stop;
    QFuture<SlowResults> future = QtConcurrent::run(
        &m_pool, [copy, pauseMs, stop, generation](QPromise<SlowResults>& promise) {
            SlowWorkHooks hooks;
            hooks.stop = stop.get();
            hooks.pauseMs = pauseMs;
            hooks.progress = [&promise](int done, int total, const QString& what) {
                promise.setProgressRange(0, total);
                promise.setProgressValueAndText(done, what);
            };
            std::optional<SlowResults> r = runSlowWork(copy, hooks);
            if (r && !promise.isCanceled()) {
                r->generation = generation;
                promise.addResult(std::move(*r));
            }
        });
    job->watcher->setFuture(future);
    m_job = raw;
    m_jobs.push_back(std::move(job));
    ++m_started;
    emit started(generation);
}

void EvaluationRunner::onJobFinished(Job* job) {
    const bool current = job == m_job && job->generation == m_generation && !job->stop->load();
    if (current) {
        m_job = nullptr;
        const QFuture<SlowResults> f = job->watcher->future();
        if (f.resultCount() > 0) {
            m_latest = f.resultAt(0);
            ++m_delivered;
            emit finished(job->generation);
        }
    }
    // Stale (cancelled) jobs end here without a trace.
    job->watcher->disconnect(this);
    job->watcher->deleteLater();
    m_jobs.erase(std::remove_if(m_jobs.begin(), m_jobs.end(), [job](const auto& j) { return j.get() == job; }),
                 m_jobs.end());
}

bool EvaluationRunner::waitUntilIdle(int timeoutMs) {
    QDeadlineTimer deadline(timeoutMs);
    while ((m_job || m_restartTimer->isActive()) && !deadline.hasExpired())
        QCoreApplication::processEvents(QEventLoop::AllEvents, 20);
    return !m_job && !m_restartTimer->isActive();
}

} // namespace amp::ui
