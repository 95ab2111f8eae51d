#include "ui/style/palette.h"

#include <QFile>
#include <QObject>
#include <QPainter>
#include <QPixmap>

static void tlInitUiResources() { Q_INIT_RESOURCE(workbench); }

namespace tl::ui {

void initResources()
{
    static bool done = false;
    if (!done) tlInitUiResources();
    done = true;
}

QColor kindColour(CompartmentKind kind)
{
    switch (kind) {
    case CompartmentKind::Producer: return okabe_ito::kBluishGreen;
    case CompartmentKind::Consumer: return okabe_ito::kBlue;
    case CompartmentKind::Detritus: return okabe_ito::kOrange;
    }
    return Qt::gray;
}

QColor fleetColour() { return okabe_ito::kVermillion; }

QString kindLabel(CompartmentKind kind)
{
    switch (kind) {
    case CompartmentKind::Producer: return QObject::tr("Producer");
    case CompartmentKind::Consumer: return QObject::tr("Consumer");
    case CompartmentKind::Detritus: return QObject::tr("Detritus pool");
    }
    return {};
}

QIcon kindIcon(CompartmentKind kind)
{
    QPixmap pm(14, 14);
    pm.fill(Qt::transparent);
    QPainter p(&pm);
    p.setRenderHint(QPainter::Antialiasing);
    p.setPen(QPen(QColor(40, 40, 40), 1));
    p.setBrush(kindColour(kind));
    // Shape differs by kind too, so the swatch reads without colour.
    if (kind == CompartmentKind::Producer) p.drawEllipse(QRectF(1.5, 1.5, 11, 11));
    else if (kind == CompartmentKind::Consumer) p.drawRoundedRect(QRectF(1.5, 1.5, 11, 11), 3, 3);
    else {
        // A pool: a basin (flat top, round bottom) where dead matter settles — a shape of
        // its own, never the warning triangle.
        p.drawChord(QRectF(1.0, -4.5, 12.0, 16.5), 180 * 16, 180 * 16);
    }
    return QIcon(pm);
}

QString severityLabel(Severity s)
{
    switch (s) {
    case Severity::Error: return QObject::tr("Error");
    case Severity::Warning: return QObject::tr("Warning");
    case Severity::Info: return QObject::tr("Note");
    }
    return {};
}

QIcon severityIcon(Severity s)
{
    initResources();
    switch (s) {
    case Severity::Error: return QIcon(QStringLiteral(":/tl/icons/status-error.svg"));
    case Severity::Warning: return QIcon(QStringLiteral(":/tl/icons/status-warning.svg"));
    case Severity::Info: return QIcon(QStringLiteral(":/tl/icons/status-info.svg"));
    }
    return {};
}

QIcon okIcon()
{
    initResources();
    return QIcon(QStringLiteral(":/tl/icons/status-ok.svg"));
}

QIcon statusIcon(std::optional<Severity> worst) { return worst ? severityIcon(*worst) : okIcon(); }

QIcon statusIcon(BalanceStatus s)
{
    switch (s) {
    case BalanceStatus::Balanced: return okIcon();
    case BalanceStatus::Unbalanced: return severityIcon(Severity::Warning);
    case BalanceStatus::Invalid: return severityIcon(Severity::Error);
    }
    return {};
}

QString statusLabel(BalanceStatus s)
{
    switch (s) {
    case BalanceStatus::Balanced: return QObject::tr("Balanced");
    case BalanceStatus::Unbalanced: return QObject::tr("Not balanced");
    case BalanceStatus::Invalid: return QObject::tr("Cannot be solved");
    }
    return {};
}

QString scenarioStateLabel(ScenarioState s)
{
    switch (s) {
    case ScenarioState::NoCompartments: return QObject::tr("No compartments yet");
    case ScenarioState::Incomplete: return QObject::tr("Incomplete");
    case ScenarioState::NotBalanced: return QObject::tr("Not balanced");
    case ScenarioState::Balanced: return QObject::tr("Balanced");
    }
    return {};
}

QIcon scenarioStateIcon(ScenarioState s)
{
    switch (s) {
    case ScenarioState::NoCompartments: return severityIcon(Severity::Info);
    case ScenarioState::Incomplete: return severityIcon(Severity::Error);
    case ScenarioState::NotBalanced: return severityIcon(Severity::Warning);
    case ScenarioState::Balanced: return okIcon();
    }
    return {};
}

QIcon solvedIcon()
{
    static const QIcon icon = [] {
        QPixmap pm(32, 32);
        pm.fill(Qt::transparent);
        QPainter p(&pm);
        p.setRenderHint(QPainter::Antialiasing);
        p.setPen(Qt::NoPen);
        p.setBrush(Qt::black);
        p.drawPolygon(QPolygonF({QPointF(16, 6), QPointF(26, 16), QPointF(16, 26), QPointF(6, 16)}));
        return QIcon(pm);
    }();
    return icon;
}

QString styleSheet()
{
    initResources();
    QFile f(QStringLiteral(":/tl/workbench.qss"));
    if (!f.open(QIODevice::ReadOnly)) return {};
    return QString::fromUtf8(f.readAll());
}

}  // namespace tl::ui
