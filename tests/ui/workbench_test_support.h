// Shared by the Qt suites of the whole workbench window: options that keep a test away
// from the user's settings and recovery files, and finding a page by its key.
#pragma once

#include <QString>
#include <QTemporaryDir>

#include "ui/main_window.h"

namespace tl::testing {

inline ui::MainWindowOptions workbenchTestOptions(const QTemporaryDir& dir)
{
    ui::MainWindowOptions o;
    o.recoveryDirectory = dir.path() + QStringLiteral("/recovery");
    o.useSettings = false;
    o.askBeforeClosing = false;
    return o;
}

// The page of `window` whose key is `key`, as T (nullptr when absent or of another type).
template <class T>
T* workbenchPage(const ui::MainWindow& window, const QString& key)
{
    for (int i = 0; i < window.pageCount(); ++i)
        if (window.pageKey(i) == key) return qobject_cast<T*>(window.page(i));
    return nullptr;
}

}  // namespace tl::testing
