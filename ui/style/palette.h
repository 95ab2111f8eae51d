// The workbench's look, in one place (DESIGN.md 4): the Okabe–Ito colour-blind-safe
// palette (Okabe & Ito 2008, "Color Universal Design") for compartment kinds and
// fleets, the labels of kinds, severities and balance status, and the icons that go
// with them. Status is always shown by icon + text, never by colour alone.
#pragma once

#include <QColor>
#include <QIcon>
#include <QString>
#include <optional>

#include "core/balance/balance_sheet.h"
#include "core/balance/scenario_checks.h"
#include "core/io/balance_report.h"
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
QIcon kindIcon(CompartmentKind kind);     // a small swatch whose shape differs by kind too

QString severityLabel(Severity s);  // "Error", "Warning", "Note"
QIcon severityIcon(Severity s);
QIcon okIcon();
// A tick for no problem, else the icon of the worst severity.
QIcon statusIcon(std::optional<Severity> worst);
QIcon statusIcon(BalanceStatus s);
QString statusLabel(BalanceStatus s);  // "Balanced", "Not balanced", "Cannot be solved"
// The status bar's word for a scenario (core scenarioState): "No compartments yet",
// "Incomplete", "Not balanced", "Balanced"; its icon: none, error, warning, tick.
QString scenarioStateLabel(ScenarioState s);
QIcon scenarioStateIcon(ScenarioState s);

// A small black diamond marking a value the balance solved (not entered).
QIcon solvedIcon();
inline QString solvedLegend() { return QStringLiteral("solved by the balance, not entered"); }

// Printed under every exported figure, on the balance sheet, the harvest page and the
// analysis pages (rules of the project: results that could steer harvest or water
// decisions say so plainly). The sentence itself is the core's, so CLI and GUI agree.
inline QString decisionSupportNotice() { return QString::fromUtf8(tl::kDecisionSupportNotice); }

// Loads the application style sheet from resources (empty when missing).
QString styleSheet();
// Registers the library's compiled resources (icons, style sheet); idempotent.
void initResources();

}  // namespace tl::ui
