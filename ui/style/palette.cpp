#include "ui/style/palette.h"

#include <QFile>
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

QColor kindColor(tl::CompartmentKind kind)
{
    switch (kind) {
    case tl::CompartmentKind::Producer: return okabe_ito::bluishGreen;
    case tl::CompartmentKind::Consumer: return okabe_ito::blue;
    case tl::CompartmentKind::Detritus: return okabe_ito::orange;
    }
    return Qt::gray;
}

QIcon kindIcon(tl::CompartmentKind kind)
{
    QPixmap pm(14, 14);
    pm.fill(Qt::transparent);
    QPainter p(&pm);
    p.setRenderHint(QPainter::Antialiasing);
    p.setPen(QPen(QColor(40, 40, 40), 1));
    p.setBrush(kindColor(kind));
    // Shape differs by kind too, so the swatch reads without colour.
    if (kind == tl::CompartmentKind::Producer) p.drawEllipse(QRectF(1.5, 1.5, 11, 11));
    else if (kind == tl::CompartmentKind::Consumer) p.drawRoundedRect(QRectF(1.5, 1.5, 11, 11), 3, 3);
    else p.drawPolygon(QPolygonF({QPointF(7, 1.5), QPointF(12.5, 12.5), QPointF(1.5, 12.5)}));
    return QIcon(pm);
}

QString kindName(tl::CompartmentKind kind)
{
    switch (kind) {
    case tl::CompartmentKind::Producer: return QObject::tr("Producer");
    case tl::CompartmentKind::Consumer: return QObject::tr("Consumer");
    case tl::CompartmentKind::Detritus: return QObject::tr("Detritus pool");
    }
    return {};
}

QIcon severityIcon(tl::Severity s)
{
    initResources();
    switch (s) {
    case tl::Severity::Error: return QIcon(QStringLiteral(":/tl/icons/status-error.svg"));
    case tl::Severity::Warning: return QIcon(QStringLiteral(":/tl/icons/status-warning.svg"));
    case tl::Severity::Info: return QIcon(QStringLiteral(":/tl/icons/status-info.svg"));
    }
    return {};
}

QString severityName(tl::Severity s)
{
    switch (s) {
    case tl::Severity::Error: return QObject::tr("Error");
    case tl::Severity::Warning: return QObject::tr("Warning");
    case tl::Severity::Info: return QObject::tr("Note");
    }
    return {};
}

QIcon okIcon()
{
    initResources();
    return QIcon(QStringLiteral(":/tl/icons/status-ok.svg"));
}

QIcon statusIcon(tl::BalanceStatus s)
{
    switch (s) {
    case tl::BalanceStatus::Balanced: return okIcon();
    case tl::BalanceStatus::Unbalanced: return severityIcon(tl::Severity::Warning);
    case tl::BalanceStatus::Invalid: return severityIcon(tl::Severity::Error);
    }
    return {};
}

QString statusLabel(tl::BalanceStatus s)
{
    switch (s) {
    case tl::BalanceStatus::Balanced: return QObject::tr("Balanced");
    case tl::BalanceStatus::Unbalanced: return QObject::tr("Not balanced");
    case tl::BalanceStatus::Invalid: return QObject::tr("Cannot be solved");
    }
    return {};
}

QString styleSheet()
{
    initResources();
    QFile f(QStringLiteral(":/tl/workbench.qss"));
    if (!f.open(QIODevice::ReadOnly)) return {};
    return QString::fromUtf8(f.readAll());
}

}  // namespace tl::ui
