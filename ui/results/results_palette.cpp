#include "ui/results/results_palette.h"

#include <QObject>
#include <QPainter>
#include <QPainterPath>
#include <QPixmap>
#include <QPolygonF>

namespace tl::ui {
namespace {

QPixmap canvas() {
    QPixmap pm(32, 32);
    pm.fill(Qt::transparent);
    return pm;
}

}  // namespace

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

QIcon solvedIcon()
{
    static const QIcon icon = [] {
        QPixmap pm = canvas();
        QPainter p(&pm);
        p.setRenderHint(QPainter::Antialiasing);
        p.setPen(Qt::NoPen);
        p.setBrush(Qt::black);
        p.drawPolygon(QPolygonF({QPointF(16, 6), QPointF(26, 16), QPointF(16, 26), QPointF(6, 16)}));
        return QIcon(pm);
    }();
    return icon;
}

namespace {
QIcon drawStatusIcon(std::optional<Severity> worst)
{
    QPixmap pm = canvas();
    QPainter p(&pm);
    p.setRenderHint(QPainter::Antialiasing);
    QPen pen(Qt::black, 3.5, Qt::SolidLine, Qt::RoundCap, Qt::RoundJoin);
    if (!worst) {  // tick
        pen.setColor(okabe_ito::kBluishGreen.darker(130));
        p.setPen(pen);
        p.drawPolyline(QPolygonF({QPointF(6, 17), QPointF(13, 24), QPointF(26, 8)}));
    } else if (*worst == Severity::Error) {  // cross in a circle
        p.setPen(Qt::NoPen);
        p.setBrush(okabe_ito::kVermillion);
        p.drawEllipse(QRectF(3, 3, 26, 26));
        pen.setColor(Qt::white);
        p.setPen(pen);
        p.drawLine(QPointF(11, 11), QPointF(21, 21));
        p.drawLine(QPointF(21, 11), QPointF(11, 21));
    } else if (*worst == Severity::Warning) {  // triangle with "!"
        p.setPen(QPen(Qt::black, 1.5));
        p.setBrush(okabe_ito::kYellow);
        p.drawPolygon(QPolygonF({QPointF(16, 3), QPointF(30, 28), QPointF(2, 28)}));
        pen.setColor(Qt::black);
        pen.setWidthF(3);
        p.setPen(pen);
        p.drawLine(QPointF(16, 11), QPointF(16, 19));
        p.drawPoint(QPointF(16, 24));
    } else {  // "i" in a circle
        p.setPen(Qt::NoPen);
        p.setBrush(okabe_ito::kSkyBlue);
        p.drawEllipse(QRectF(3, 3, 26, 26));
        pen.setColor(Qt::white);
        p.setPen(pen);
        p.drawLine(QPointF(16, 14), QPointF(16, 23));
        p.drawPoint(QPointF(16, 9));
    }
    return QIcon(pm);
}
}  // namespace

QIcon statusIcon(std::optional<Severity> worst)
{
    static const QIcon icons[4] = {drawStatusIcon(std::nullopt), drawStatusIcon(Severity::Error),
                                   drawStatusIcon(Severity::Warning), drawStatusIcon(Severity::Info)};
    return worst ? icons[1 + static_cast<int>(*worst)] : icons[0];
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

}  // namespace tl::ui
