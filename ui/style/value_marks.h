// Words that go with a marked value in the tables, so that status never rests on
// colour or an icon alone (DESIGN.md 4): an EE above the rules' maximum reads
// "1.35 — above 1" beside the error icon, in the Compartments table and the Balance
// sheet alike, as the Checks panel reports it (code ee-above-max).
#pragma once

#include <QObject>
#include <QString>

namespace tl::ui {

inline QString eeAboveMaxText(const QString& shownValue, double eeMax)
{
    return QObject::tr("%1 — above %2").arg(shownValue, QString::number(eeMax, 'g', 4));
}

}  // namespace tl::ui
