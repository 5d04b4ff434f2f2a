// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The slow half of the two-speed evaluation. The quick evaluation (amp::evaluate: operating
// points, bank, losses, steady temperatures, checks) runs in DesignDocument on every edit. What
// takes longer — the full evaluation (duty-profile transient and the bank's spread, as far as the
// engine gives them) and the sweeps over the number of switches and the PWM frequency, each an
// evaluation of a design copy — runs here, on a worker thread (QtConcurrent::run), on a copy of
// the design taken at the edit.
// Every edit cancels the running job and starts a new one: the job's stop flag is set (checked
// between evaluations, and passed on to engine functions that take one) and its result, should it
// still arrive, is dropped by its generation number. Only the job of the latest design delivers.

#include "core/engine/results.h"
#include "core/model/design.h"
#include "ui/chartdata.h"

#include <QFutureWatcher>
#include <QObject>
#include <QThreadPool>

#include <atomic>
#include <functional>
#include <memory>
#include <optional>
#include <vector>

class QTimer;

namespace amp::ui {

class DesignDocument;

/// What one slow job computes for one design.
struct SlowResults {
    quint64 generation = 0;
    Design design;                     ///< the copy it was computed for
    std::optional<Results> full;       ///< the full evaluation (empty when it failed: fullError)
    QString fullError;
    std::vector<SweepPoint> countSweep;     ///< 1 … 16 switches (and the design's own count)
    std::vector<SweepPoint> frequencySweep; ///< PWM frequencies, SI (Hz)
    double seconds = 0.0;              ///< wall time of the job
};

/// Hooks of a slow job: stop when `stop` turns true; progress reports (done, total, what).
struct SlowWorkHooks {
    const std::atomic<bool>* stop = nullptr;
    std::function<void(int done, int total, const QString& what)> progress;
    int pauseMs = 0; ///< wait this long before each step (tests make a job slow with it)
};

/// The counts a sweep visits: 1 … 16, and the design's own count when it is larger.
std::vector<int> sweepCounts(const Design& design);
/// The PWM frequencies a sweep visits (Hz): a ladder from 1 kHz to 50 kHz and the design's own.
std::vector<double> sweepFrequencies_Hz(const Design& design);
/// The full evaluation the slow job runs (the engine's slow parts switched on).
Results fullEvaluation(const Design& design);

/// Run every slow step for `design`; empty when stopped before the end.
std::optional<SlowResults> runSlowWork(const Design& design, const SlowWorkHooks& hooks);

class EvaluationRunner : public QObject {
    Q_OBJECT
  public:
    explicit EvaluationRunner(DesignDocument* document, QObject* parent = nullptr);
    ~EvaluationRunner() override;

    /// Cancel the running job (if any) and start one for the document's design now.
    void restart();
    /// Cancel the running job; nothing is delivered until the next restart().
    void cancel();
    bool isRunning() const { return m_job != nullptr; }
    quint64 generation() const { return m_generation; }
    /// The results of the latest finished job of the latest design (nullptr before the first).
    const SlowResults* latest() const { return m_latest ? &*m_latest : nullptr; }
    /// Whether latest() belongs to the design as it stands.
    bool isCurrent() const { return m_latest && m_latest->generation == m_generation && !m_job; }

    int startedJobs() const { return m_started; }
    int cancelledJobs() const { return m_cancelled; }
    int deliveredJobs() const { return m_delivered; }
    /// Make every step of the following jobs wait (tests of the cancellation).
    void setPauseForTests(int ms) { m_pauseMs = ms; }
    /// Wait for the running job (event loop kept turning); false on timeout.
    bool waitUntilIdle(int timeoutMs);

  signals:
    void started(quint64 generation);
    void progressChanged(int done, int total, const QString& what);
    void finished(quint64 generation); ///< latest() now holds that generation's results
    void cancelled(quint64 generation);

  private:
    struct Job {
        quint64 generation = 0;
        std::shared_ptr<std::atomic<bool>> stop;
        QFutureWatcher<SlowResults>* watcher = nullptr;
        int total = 1;
    };
    void onJobFinished(Job* job);

    DesignDocument* m_document = nullptr;
    QTimer* m_restartTimer = nullptr;
    QThreadPool m_pool;
    Job* m_job = nullptr;
    std::vector<std::unique_ptr<Job>> m_jobs; ///< running or winding down (cancelled)
    std::optional<SlowResults> m_latest;
    quint64 m_generation = 0;
    int m_started = 0;
    int m_cancelled = 0;
    int m_delivered = 0;
    int m_pauseMs = 0;
};

} // namespace amp::ui
