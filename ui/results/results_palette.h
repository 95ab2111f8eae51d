// Look of the results views (DESIGN.md 4): the Okabe-Ito colour-blind-safe palette for
// compartment kinds (Okabe & Ito 2008, "Color Universal Design", J*Fly), and icons so
// that status and "solved" marks never rely on colour alone.
#pragma once

#include <QColor>
#include <QIcon>
#include <QString>

#include "core/model/compartment.h"
#include "core/model/problem.h"

namespace tl::ui {

namespace okabe_ito {
inline const QColor kOrange{0xE6, 0x9F, 0x00};
inline const QColor kSkyBlue{0x56, 0xB4, 0xE9};
inline const QColor kBluishGreen{0x00, 0x9E, 0x73};
inline const QColor kYellow{0xF0, 0xE4, 0x42};
inline const QColor kBlue{0x00, 0x72, 0xB2};
inline const QColor kVermillion{0xD5, 0x5E, 0x00};
inline const QColor kReddishPurple{0xCC, 0x79, 0xA7};
}  // namespace okabe_ito

// Producers bluish green, consumers blue, detritus orange; fleets vermillion.
QColor kindColour(CompartmentKind kind);
QColor fleetColour();
QString kindLabel(CompartmentKind kind);  // "Producer", "Consumer", "Detritus pool"

// A small black diamond marking a value the balance solved (not entered).
QIcon solvedIcon();
inline QString solvedLegend() { return QStringLiteral("solved by the balance, not entered"); }

// Printed under every exported figure and on the balance sheet (rules of the project:
// results that could steer harvest or water decisions say so plainly).
inline QString decisionSupportNotice()
{
    return QStringLiteral("Model output supports, and does not replace, stock assessment, local regulation "
                          "and licensed professional judgement.");
}

// Status icons: a tick for no problem, and one shape per severity (cross, triangle, "i").
QIcon statusIcon(std::optional<Severity> worst);
QString severityLabel(Severity s);  // "Error", "Warning", "Note"

}  // namespace tl::ui
