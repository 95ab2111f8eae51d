// What the main window's File, Project and Help menus do beyond opening and saving:
// export the figure of the page on screen, write the HTML project report, and give
// every figure the scenario and project it shows. Kept out of main_window.cpp so that
// the window stays a place that wires things together.
#pragma once

#include <QList>
#include <QString>

class QWidget;

namespace tl {
struct Project;
}

namespace tl::ui {

class FigureSource;
class ProjectDocument;

// The page's figure, or nullptr when the page has none (editing pages, balance sheet).
FigureSource* figureOf(QWidget* page);
// Every figure of `pages` names `scenario` and `project` in its title.
void setFigureContexts(const QList<QWidget*>& pages, const QString& scenario, const QString& project);

// The project's HTML report (every scenario, its balance status, balance sheet and
// problems, with the decision-support notice), written atomically. A project without
// a title is titled `fallbackTitle`. False with `error` naming the file on failure.
// The flow map's hand-placed boxes live in the current scenario (Scenario::layout, saved
// with the project): a drag or "Reset layout" becomes one undoable edit, and whatever
// the scenario holds (after undo, redo, a scenario switch, opening) is shown. Does
// nothing when `flowMapPage` is not a flow map.
void bindFlowMapLayout(QWidget* flowMapPage, ProjectDocument* doc);

bool writeProjectReport(const tl::Project& project, const QString& fallbackTitle, const QString& path, QString* error);

}  // namespace tl::ui
