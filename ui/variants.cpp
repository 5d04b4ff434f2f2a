// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/variants.h"

#include "core/engine/evaluate.h"
#include "ui/designdocument.h"
#include "ui/format.h"
#include "ui/palette.h"
#include "ui/pointtable.h"

#include <QActionGroup>
#include <QComboBox>
#include <QCoreApplication>
#include <QDialogButtonBox>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QInputDialog>
#include <QLabel>
#include <QMenu>
#include <QMessageBox>
#include <QTableWidget>
#include <QUndoStack>
#include <QVBoxLayout>

#include <algorithm>
#include <cmath>
#include <map>

namespace amp::ui {

namespace {
QString toQ(const std::string& s) { return QString::fromStdString(s); }
QString tr(const char* text) { return QCoreApplication::translate("amp::ui::variants", text); }
} // namespace

// --- the command ----------------------------------------------------------------------------

VariantCommand::VariantCommand(DesignDocument* document, std::vector<Variant> after, int afterActive,
                               const QString& text)
    : QUndoCommand(text), m_document(document), m_before(document->project().variants),
      m_beforeActive(document->activeVariant()), m_after(std::move(after)), m_afterActive(afterActive) {}

void VariantCommand::undo() { m_document->applyVariants(m_before, m_beforeActive); }

void VariantCommand::redo() { m_document->applyVariants(m_after, m_afterActive); }

// --- operations -----------------------------------------------------------------------------

QString variantNameProblem(const DesignDocument& document, const QString& name, int ignoreIndex) {
    const QString n = name.trimmed();
    if (n.isEmpty())
        return tr("A variant needs a name.");
    const QStringList names = document.variantNames();
    for (int i = 0; i < names.size(); ++i)
        if (i != ignoreIndex && names[i] == n)
            return tr("There is already a variant named “%1”.").arg(n);
    return {};
}

QString freeVariantName(const DesignDocument& document, const QString& base) {
    QString name = tr("%1 copy").arg(base);
    for (int n = 2; !variantNameProblem(document, name).isEmpty(); ++n)
        name = tr("%1 copy %2").arg(base).arg(n);
    return name;
}

QString duplicateVariant(DesignDocument& document, const QString& name) {
    if (const QString problem = variantNameProblem(document, name); !problem.isEmpty())
        return problem;
    std::vector<Variant> after = document.project().variants;
    const int source = document.activeVariant();
    after.insert(after.begin() + source + 1, Variant{name.trimmed().toStdString(), document.design()});
    document.undoStack()->push(new VariantCommand(&document, std::move(after), source + 1,
                                                  tr("New variant “%1”").arg(name.trimmed())));
    return {};
}

QString renameVariant(DesignDocument& document, int index, const QString& name) {
    std::vector<Variant> after = document.project().variants;
    if (index < 0 || index >= static_cast<int>(after.size()))
        return tr("There is no variant %1.").arg(index);
    if (toQ(after[static_cast<std::size_t>(index)].name) == name.trimmed())
        return {}; // nothing changes: no command
    if (const QString problem = variantNameProblem(document, name, index); !problem.isEmpty())
        return problem;
    const QString old = toQ(after[static_cast<std::size_t>(index)].name);
    after[static_cast<std::size_t>(index)].name = name.trimmed().toStdString();
    document.undoStack()->push(new VariantCommand(&document, std::move(after), document.activeVariant(),
                                                  tr("Rename variant “%1” to “%2”").arg(old, name.trimmed())));
    return {};
}

QString removeVariant(DesignDocument& document, int index) {
    std::vector<Variant> after = document.project().variants;
    if (index < 0 || index >= static_cast<int>(after.size()))
        return tr("There is no variant %1.").arg(index);
    if (after.size() == 1)
        return tr("The last variant cannot be deleted: a project holds at least one.");
    const QString name = toQ(after[static_cast<std::size_t>(index)].name);
    after.erase(after.begin() + index);
    int active = document.activeVariant();
    if (active > index || active >= static_cast<int>(after.size()))
        active = std::max(0, active - 1);
    document.undoStack()->push(
        new VariantCommand(&document, std::move(after), active, tr("Delete variant “%1”").arg(name)));
    return {};
}

QComboBox* makeVariantSwitcher(DesignDocument* document, QWidget* parent) {
    auto* combo = new QComboBox(parent);
    combo->setObjectName(QStringLiteral("variantSwitcher"));
    combo->setToolTip(tr("The variant on screen. Variants are versions of the design kept in the same file; "
                         "the Variants menu adds, renames, deletes and compares them."));
    combo->setSizeAdjustPolicy(QComboBox::AdjustToContents);
    auto fill = [combo, document] {
        const QSignalBlocker block(combo);
        combo->clear();
        for (const QString& n : document->variantNames())
            combo->addItem(QStringLiteral("%1").arg(n));
        combo->setCurrentIndex(document->activeVariant());
    };
    fill();
    QObject::connect(document, &DesignDocument::variantsChanged, combo, fill);
    QObject::connect(combo, &QComboBox::activated, document, [document](int i) { document->switchVariant(i); });
    return combo;
}

void fillVariantMenu(QMenu* menu, DesignDocument* document, QWidget* dialogParent) {
    menu->clear();
    menu->addAction(tr("&Duplicate as a new variant…"), dialogParent, [document, dialogParent] {
        bool ok = false;
        const QString name =
            QInputDialog::getText(dialogParent, tr("New variant"),
                                  tr("A copy of “%1” as it is now, under the name:").arg(document->activeVariantName()),
                                  QLineEdit::Normal, freeVariantName(*document, document->activeVariantName()), &ok);
        if (!ok)
            return;
        if (const QString problem = duplicateVariant(*document, name); !problem.isEmpty())
            QMessageBox::warning(dialogParent, tr("New variant"), problem);
    });
    menu->addAction(tr("&Rename this variant…"), dialogParent, [document, dialogParent] {
        bool ok = false;
        const QString name = QInputDialog::getText(dialogParent, tr("Rename variant"), tr("New name:"),
                                                   QLineEdit::Normal, document->activeVariantName(), &ok);
        if (!ok)
            return;
        if (const QString problem = renameVariant(*document, document->activeVariant(), name); !problem.isEmpty())
            QMessageBox::warning(dialogParent, tr("Rename variant"), problem);
    });
    QAction* remove = menu->addAction(tr("De&lete this variant"), dialogParent, [document, dialogParent] {
        if (const QString problem = removeVariant(*document, document->activeVariant()); !problem.isEmpty())
            QMessageBox::warning(dialogParent, tr("Delete variant"), problem);
    });
    remove->setEnabled(document->variantNames().size() > 1);
    menu->addSeparator();
    auto* group = new QActionGroup(menu);
    const QStringList names = document->variantNames();
    for (int i = 0; i < names.size(); ++i) {
        QAction* a = menu->addAction(names[i], document, [document, i] { document->switchVariant(i); });
        a->setCheckable(true);
        a->setChecked(i == document->activeVariant());
        group->addAction(a);
    }
    menu->addSeparator();
    QAction* compare = menu->addAction(tr("&Compare two variants…"), dialogParent, [document, dialogParent] {
        auto* dialog = new CompareDialog(document, dialogParent);
        dialog->setAttribute(Qt::WA_DeleteOnClose);
        dialog->show();
    });
    compare->setEnabled(names.size() > 1);
}

// --- comparison -----------------------------------------------------------------------------

Comparison compareResults(const Results& a, const Results& b) {
    Comparison c;
    using units::Unit;
    c.figures.push_back({tr("Design"), tr("Hottest T_j, all points"), a.maxJunction_C, b.maxJunction_C, Unit::Celsius});
    c.figures.push_back({tr("Design"), tr("Highest stage loss"), a.maxTotalLoss_W, b.maxTotalLoss_W, Unit::Watt});

    std::map<std::string, const OperatingPointResult*> inB;
    for (const auto& p : b.operatingPoints)
        inB.emplace(p.name, &p);
    for (const auto& pa : a.operatingPoints) {
        const auto it = inB.find(pa.name);
        const OperatingPointResult* pb = it == inB.end() ? nullptr : it->second;
        const bool known = pa.valid && pb && pb->valid;
        auto row = [&](const QString& figure, double va, double vb, Unit unit) {
            c.figures.push_back({toQ(pa.name), figure, va, known ? vb : std::nan(""), unit, known});
        };
        row(tr("Motor current"), pa.motorCurrent_A, pb ? pb->motorCurrent_A : 0.0, Unit::Ampere);
        row(tr("Duty"), pa.duty, pb ? pb->duty : 0.0, Unit::None);
        row(tr("Battery current"), pa.batteryCurrent_A, pb ? pb->batteryCurrent_A : 0.0, Unit::Ampere);
        row(tr("Stage loss"), pa.totalLoss_W, pb ? pb->totalLoss_W : 0.0, Unit::Watt);
        row(tr("Hottest T_j"), hottestJunction_C(pa), pb ? hottestJunction_C(*pb) : 0.0, Unit::Celsius);
        row(tr("Heatsink"), pa.heatsinkTemperature_C, pb ? pb->heatsinkTemperature_C : 0.0, Unit::Celsius);
    }

    // Checks by id and point: a difference in severity, or a check on one side only.
    auto key = [](const Check& k) { return k.id + "\x1f" + k.operatingPoint; };
    std::map<std::string, const Check*> checksA;
    std::map<std::string, const Check*> checksB;
    for (const auto& k : a.checks)
        checksA.emplace(key(k), &k);
    for (const auto& k : b.checks)
        checksB.emplace(key(k), &k);
    auto add = [&](const Check* ka, const Check* kb) {
        const Check* any = ka ? ka : kb;
        c.checks.push_back({toQ(any->id), toQ(any->operatingPoint),
                            ka ? QString::fromLatin1(toString(ka->severity)) : QStringLiteral("—"),
                            kb ? QString::fromLatin1(toString(kb->severity)) : QStringLiteral("—"),
                            ka ? toQ(ka->message) : QString(), kb ? toQ(kb->message) : QString()});
    };
    for (const auto& [k, ka] : checksA) {
        const auto it = checksB.find(k);
        if (it == checksB.end())
            add(ka, nullptr);
        else if (it->second->severity != ka->severity)
            add(ka, it->second);
    }
    for (const auto& [k, kb] : checksB)
        if (!checksA.count(k))
            add(nullptr, kb);
    return c;
}

CompareDialog::CompareDialog(DesignDocument* document, QWidget* parent) : QDialog(parent), m_document(document) {
    setObjectName(QStringLiteral("compareVariants"));
    setWindowTitle(tr("Compare variants"));
    resize(900, 640);
    auto* column = new QVBoxLayout(this);
    auto* pick = new QHBoxLayout;
    m_a = new QComboBox(this);
    m_b = new QComboBox(this);
    m_a->addItems(document->variantNames());
    m_b->addItems(document->variantNames());
    pick->addWidget(new QLabel(tr("Variant A"), this));
    pick->addWidget(m_a, 1);
    pick->addSpacing(16);
    pick->addWidget(new QLabel(tr("against B"), this));
    pick->addWidget(m_b, 1);
    column->addLayout(pick);

    m_summary = new QLabel(this);
    m_summary->setWordWrap(true);
    column->addWidget(m_summary);

    m_figures = new QTableWidget(this);
    m_figures->setObjectName(QStringLiteral("compareFigures"));
    m_figures->setColumnCount(5);
    m_figures->setHorizontalHeaderLabels({tr("Point"), tr("Figure"), tr("A"), tr("B"), tr("B − A")});
    m_figures->verticalHeader()->hide();
    m_figures->setEditTriggers(QAbstractItemView::NoEditTriggers);
    m_figures->setAlternatingRowColors(true);
    m_figures->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    m_figures->horizontalHeader()->setStretchLastSection(true);
    column->addWidget(m_figures, 3);

    auto* checksCaption = new QLabel(tr("Checks that differ"), this);
    QFont bold = checksCaption->font();
    bold.setBold(true);
    checksCaption->setFont(bold);
    column->addWidget(checksCaption);
    m_checks = new QTableWidget(this);
    m_checks->setObjectName(QStringLiteral("compareChecks"));
    m_checks->setColumnCount(5);
    m_checks->setHorizontalHeaderLabels({tr("Check"), tr("Point"), tr("A"), tr("B"), tr("What B finds")});
    m_checks->verticalHeader()->hide();
    m_checks->setEditTriggers(QAbstractItemView::NoEditTriggers);
    m_checks->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    m_checks->horizontalHeader()->setStretchLastSection(true);
    m_checks->setWordWrap(true);
    column->addWidget(m_checks, 2);
    m_noChecks = new QLabel(tr("Every check has the same outcome in both variants."), this);
    m_noChecks->setForegroundRole(QPalette::PlaceholderText);
    column->addWidget(m_noChecks);

    auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close, this);
    connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
    column->addWidget(buttons);

    const int active = document->activeVariant();
    m_a->setCurrentIndex(active);
    m_b->setCurrentIndex(active == 0 && m_b->count() > 1 ? 1 : 0);
    connect(m_a, &QComboBox::currentIndexChanged, this, &CompareDialog::refresh);
    connect(m_b, &QComboBox::currentIndexChanged, this, &CompareDialog::refresh);
    refresh();
}

void CompareDialog::setPair(int a, int b) {
    const QSignalBlocker blockA(m_a);
    const QSignalBlocker blockB(m_b);
    m_a->setCurrentIndex(a);
    m_b->setCurrentIndex(b);
    refresh();
}

void CompareDialog::refresh() {
    const Project project = m_document->project();
    const int ia = m_a->currentIndex();
    const int ib = m_b->currentIndex();
    if (ia < 0 || ib < 0 || ia >= static_cast<int>(project.variants.size()) ||
        ib >= static_cast<int>(project.variants.size()))
        return;
    Results ra;
    Results rb;
    try {
        ra = evaluate(project.variants[static_cast<std::size_t>(ia)].design);
        rb = evaluate(project.variants[static_cast<std::size_t>(ib)].design);
    } catch (const std::exception& e) {
        m_summary->setText(tr("Evaluation failed: %1").arg(QString::fromUtf8(e.what())));
        return;
    }
    const Comparison c = compareResults(ra, rb);

    m_figures->setRowCount(static_cast<int>(c.figures.size()));
    QString lastPoint;
    for (int row = 0; row < m_figures->rowCount(); ++row) {
        const FigureRow& f = c.figures[static_cast<std::size_t>(row)];
        auto cell = [&](int column, const QString& text, Qt::Alignment align = Qt::AlignRight | Qt::AlignVCenter) {
            auto* item = new QTableWidgetItem(text);
            item->setTextAlignment(align);
            m_figures->setItem(row, column, item);
            return item;
        };
        cell(0, f.point == lastPoint ? QString() : f.point, Qt::AlignLeft | Qt::AlignVCenter);
        lastPoint = f.point;
        cell(1, f.figure, Qt::AlignLeft | Qt::AlignVCenter);
        const bool percent = f.unit == units::Unit::None;
        auto show = [&](double v) { return percent ? formatPercent(v) : formatSi(v, f.unit); };
        cell(2, show(f.a));
        cell(3, f.known ? show(f.b) : tr("not reached"));
        // Differences below a millionth of the value are rounding in the solver, not a change.
        QString diff = QStringLiteral("–");
        bool differs = false;
        if (f.known && std::isfinite(f.a) && std::isfinite(f.b)) {
            const double d = f.b - f.a;
            differs = std::abs(d) > 1e-6 * std::max({std::abs(f.a), std::abs(f.b), 1e-9});
            const QString sign = d > 0 ? QStringLiteral("+") : QString();
            if (!differs)
                diff = tr("same");
            else if (percent)
                diff = sign + QString::number(d * 100.0, 'f', 2) + tr(" points");
            else if (f.unit == units::Unit::Celsius)
                diff = sign + QString::number(d, 'f', 1) + QStringLiteral(" K");
            else {
                diff = sign + formatSi(d, f.unit);
                if (std::abs(f.a) > 0.0)
                    diff += QStringLiteral("  (%1%2 %)").arg(sign).arg(100.0 * d / std::abs(f.a), 0, 'f', 1);
            }
        }
        auto* item = cell(4, QStringLiteral("  ") + diff, Qt::AlignLeft | Qt::AlignVCenter);
        if (differs) {
            QFont font = item->font();
            font.setBold(true);
            item->setFont(font);
        } else {
            item->setForeground(palette().color(QPalette::PlaceholderText));
        }
    }

    m_checks->setRowCount(static_cast<int>(c.checks.size()));
    for (int row = 0; row < m_checks->rowCount(); ++row) {
        const CheckDifference& d = c.checks[static_cast<std::size_t>(row)];
        m_checks->setItem(row, 0, new QTableWidgetItem(d.id));
        m_checks->setItem(row, 1, new QTableWidgetItem(d.point));
        auto* a = new QTableWidgetItem(d.a);
        a->setToolTip(d.messageA);
        auto* b = new QTableWidgetItem(d.b);
        b->setToolTip(d.messageB);
        for (auto* item : {a, b})
            for (const Severity sev : {Severity::Pass, Severity::Advice, Severity::Warning, Severity::Fail})
                if (item->text() == QString::fromLatin1(toString(sev))) {
                    item->setBackground(colours::severity(sev));
                    item->setForeground(colours::severityText(sev));
                    item->setTextAlignment(Qt::AlignCenter);
                }
        m_checks->setItem(row, 2, a);
        m_checks->setItem(row, 3, b);
        auto* what = new QTableWidgetItem(d.messageB.isEmpty() ? tr("(not checked in B) %1").arg(d.messageA) : d.messageB);
        what->setToolTip(tr("A: %1\nB: %2").arg(d.messageA, d.messageB));
        m_checks->setItem(row, 4, what);
    }
    m_checks->setVisible(!c.checks.empty());
    m_noChecks->setVisible(c.checks.empty());
    m_summary->setText(tr("A: “%1” · B: “%2” — %3 that differ.")
                           .arg(m_a->currentText(), m_b->currentText(),
                                countOf(static_cast<long long>(c.checks.size()), tr("check"), tr("checks"))));
}

} // namespace amp::ui
