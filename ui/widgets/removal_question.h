// The question asked before compartments that others depend on are removed (issue 13):
// which predators' diets lose how much, which fleets lose their catch of them, which
// routing and discards pointed at a removed pool. Built from tl::removalImpact; the
// view only words it.
#pragma once

#include <QList>
#include <QString>

#include "core/model/model.h"

class QWidget;

namespace tl::ui {

struct RemovalQuestion {
    QString text;     // one line: what is removed
    QString details;  // one line per consequence; empty when nothing else changes
};

RemovalQuestion removalQuestion(const tl::Model& model, const QList<int>& rows);

// Asks when something else changes; true when the user chose to remove (or nothing to ask).
bool confirmRemoval(QWidget* parent, const tl::Model& model, const QList<int>& rows);

}  // namespace tl::ui
