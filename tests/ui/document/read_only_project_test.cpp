// Issue 12, defect 1 in the workbench: a project the user cannot write (a colleague's
// file, a read-only share) opens read-only, says why, and Save asks for a new file name
// (Save As) instead of failing on the original or calling it damaged.
//
// Permissions do not bind root, so as root the check runs in a child process that
// becomes 'nobody' first; it reports its findings through a pipe.
#include <unistd.h>

#include <QTest>

#include <filesystem>
#include <string>

#include "tests/support/test_support.h"
#include "ui/document/project_document.h"

namespace {

namespace fs = std::filesystem;
using tl::ui::ProjectDocument;

}  // namespace

class ReadOnlyProjectTest : public QObject {
    Q_OBJECT
private slots:
    void aProjectOnAReadOnlyShareOpensReadOnlyWithSaveAs()
    {
        const fs::path base = fs::temp_directory_path() / ("tl_ui_ro_" + std::to_string(::getpid()));
        const fs::path share = base / "share", mine = base / "mine";
        fs::remove_all(base);
        fs::create_directories(share);
        fs::create_directories(mine);
        const fs::path file = share / "lagoon.tledger";
        fs::copy_file(fs::path(TL_SAMPLES_DIR) / "lagoon.tledger", file);
        using fs::perms;
        const perms readable = perms::owner_read | perms::group_read | perms::others_read;
        const perms listable = readable | perms::owner_exec | perms::group_exec | perms::others_exec;
        fs::permissions(base, listable | perms::owner_write);
        fs::permissions(file, readable);
        fs::permissions(share, listable);
        fs::permissions(mine, perms::all);  // where 'nobody' may save a copy

        const std::string report = tl::testing::runInChild([&]() -> std::string {
            ProjectDocument doc;
            QString error;
            if (!doc.open(QString::fromStdString(file.string()), &error))
                return "not opened: " + error.toStdString();
            std::string fails;
            if (doc.origin() != ProjectDocument::Origin::Template) fails += "not opened read-only; ";
            if (!doc.templateReason().contains(QStringLiteral("read-only")))
                fails += "reason: " + doc.templateReason().toStdString() + "; ";
            if (!doc.saveNeedsFileName()) fails += "Save would write over the read-only file; ";
            if (doc.project().scenarios.empty()) fails += "no scenarios loaded; ";
            const QString copy = QString::fromStdString((mine / "my copy.tledger").string());
            if (!doc.saveAs(copy, &error)) fails += "Save As failed: " + error.toStdString() + "; ";
            else if (doc.origin() != ProjectDocument::Origin::ProjectFile) fails += "the copy is not the document's file; ";
            return fails;
        });
        fs::permissions(share, perms::all);
        const bool sidecars = fs::exists(file.string() + "-wal") || fs::exists(file.string() + "-shm");
        const bool copied = fs::exists(mine / "my copy.tledger");
        fs::remove_all(base);
        QVERIFY2(report.empty(), report.c_str());
        QVERIFY2(!sidecars, "a -wal or -shm was written beside a file the user cannot write");
        QVERIFY(copied);
    }
};

QTEST_MAIN(ReadOnlyProjectTest)
#include "read_only_project_test.moc"
