#include "ui/widgets/removal_question.h"

#include <QMessageBox>
#include <QPushButton>
#include <QStringList>

#include "core/model/removal_impact.h"

namespace tl::ui {
namespace {

QString qs(const std::string& s) { return QString::fromStdString(s); }

QString listOf(const std::vector<std::string>& names)
{
    QStringList out;
    for (const auto& n : names) out << qs(n);
    return out.join(QStringLiteral(", "));
}

QString percent(double share)
{
    // Whole percent, with one decimal below 10 % so that a small share does not read as 0 %.
    return QString::number(100.0 * share, 'f', share < 0.1 ? 1 : 0) + QStringLiteral(" %");
}

}  // namespace

RemovalQuestion removalQuestion(const tl::Model& model, const QList<int>& rows)
{
    std::vector<std::size_t> removed;
    QStringList names;
    for (int r : rows)
        if (r >= 0 && r < int(model.size())) {
            removed.push_back(std::size_t(r));
            names << qs(model.compartment(std::size_t(r)).name);
        }
    RemovalQuestion q;
    q.text = names.size() == 1 ? QObject::tr("Remove %1?").arg(names.front())
                               : QObject::tr("Remove %n compartments (%1)?", nullptr, int(names.size())).arg(names.join(QStringLiteral(", ")));
    const tl::RemovalImpact impact = tl::removalImpact(model, removed);
    QStringList lines;
    for (const auto& loss : impact.diets)
        lines << QObject::tr("The diet of %1 loses %2 (%3); it will no longer sum to 1 until it is normalised.")
                     .arg(qs(loss.predator), percent(loss.share), listOf(loss.prey));
    if (!impact.fleetsCatching.empty())
        lines << QObject::tr("The landings and discards by %1 of what is removed go with it.").arg(listOf(impact.fleetsCatching));
    if (!impact.fleetsDiscardingTo.empty())
        lines << QObject::tr("Discards of %1 go to the first detritus pool instead.").arg(listOf(impact.fleetsDiscardingTo));
    if (!impact.routedTo.empty())
        lines << QObject::tr("The detritus routing of %1 loses its share to the removed pool.").arg(listOf(impact.routedTo));
    if (!lines.isEmpty()) q.details = lines.join(QLatin1Char('\n')) + QLatin1Char('\n') + QObject::tr("Undo (Ctrl+Z) restores all of it.");
    return q;
}

bool confirmRemoval(QWidget* parent, const tl::Model& model, const QList<int>& rows)
{
    const RemovalQuestion q = removalQuestion(model, rows);
    if (q.details.isEmpty()) return true;  // nothing else depends on it; Undo is there
    QMessageBox box(QMessageBox::Question, QObject::tr("Remove compartment"), q.text, QMessageBox::NoButton, parent);
    box.setInformativeText(q.details);
    QPushButton* remove = box.addButton(QObject::tr("Remove"), QMessageBox::DestructiveRole);
    box.addButton(QMessageBox::Cancel);
    box.setDefaultButton(QMessageBox::Cancel);
    box.exec();
    return box.clickedButton() == remove;
}

}  // namespace tl::ui
