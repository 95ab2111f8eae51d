// A number typed into a dialog's field: C locale first ("0.05", as the tables and CSV
// files write it), then the user's locale ("0,05"); not a finite number gives nullopt.
// Shared by the dialogs that take numbers in line edits (project settings, reconcile).
#pragma once

#include <QLocale>
#include <QString>
#include <cmath>
#include <optional>

namespace tl::ui {

inline std::optional<double> parseTypedNumber(const QString& text)
{
    bool ok = false;
    double v = text.trimmed().toDouble(&ok);
    if (!ok) v = QLocale().toDouble(text.trimmed(), &ok);
    if (!ok || !std::isfinite(v)) return std::nullopt;
    return v;
}

}  // namespace tl::ui
