// Workbench look: the Okabe–Ito colour-blind-safe palette (Okabe & Ito 2008, "Color
// Universal Design") for compartment kinds, and status icons that always come with a
// text — colour is never the only carrier of meaning (DESIGN.md 4).
#pragma once

#include <QColor>
#include <QIcon>
#include <QString>

#include "core/balance/balance_sheet.h"
#include "core/model/compartment.h"
#include "core/model/problem.h"

namespace tl::ui {

namespace okabe_ito {
inline const QColor orange{0xE6, 0x9F, 0x00};
inline const QColor skyBlue{0x56, 0xB4, 0xE9};
inline const QColor bluishGreen{0x00, 0x9E, 0x73};
inline const QColor yellow{0xF0, 0xE4, 0x42};
inline const QColor blue{0x00, 0x72, 0xB2};
inline const QColor vermillion{0xD5, 0x5E, 0x00};
inline const QColor reddishPurple{0xCC, 0x79, 0xA7};
}  // namespace okabe_ito

QColor kindColor(tl::CompartmentKind kind);   // producer green, consumer blue, detritus orange
QIcon kindIcon(tl::CompartmentKind kind);     // a small swatch, always shown with the kind's name
QString kindName(tl::CompartmentKind kind);  // "Producer", "Consumer", "Detritus pool"

QIcon severityIcon(tl::Severity s);
QString severityName(tl::Severity s);  // "Error", "Warning", "Note"
QIcon statusIcon(tl::BalanceStatus s);
QString statusLabel(tl::BalanceStatus s);  // "Balanced", "Not balanced", "Cannot be solved"
QIcon okIcon();

// Loads the application style sheet from resources (empty when missing).
QString styleSheet();
// Registers the library's compiled resources (icons, style sheet); idempotent.
void initResources();

}  // namespace tl::ui
