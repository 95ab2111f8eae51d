// trophic-ledger: the desktop workbench.
//   trophic-ledger [PROJECT]                 open a .tledger file or a CSV model folder
//   trophic-ledger [PROJECT] --snapshot DIR  render every page to DIR/NN-page.png and exit
// With no PROJECT, unsaved work left by a crash is offered first; otherwise the
// reservoir sample opens as a template (Save As keeps changes elsewhere).
#include <QApplication>
#include <QCommandLineParser>
#include <QDir>
#include <QFileInfo>
#include <QTemporaryDir>
#include <cstdio>
#include <cstring>

#include "ui/main_window.h"
#include "ui/style/palette.h"

namespace {

// The sample project: the installed copy beside the executable, else the source tree.
QString findSample()
{
    const QStringList roots = {QDir(QCoreApplication::applicationDirPath()).filePath(QStringLiteral(TL_INSTALLED_SAMPLES_RELATIVE)),
                               QStringLiteral(TL_SOURCE_SAMPLES_DIR)};
    for (const QString& root : roots) {
        const QString file = root + QStringLiteral("/reservoir.tledger");
        if (QFileInfo::exists(file)) return file;
    }
    for (const QString& root : roots) {
        const QString folder = root + QStringLiteral("/reservoir");
        if (QFileInfo::exists(folder + QStringLiteral("/compartments.csv"))) return folder;
    }
    return {};
}

}  // namespace

int main(int argc, char* argv[])
{
    // Snapshots need no screen: default to the offscreen platform unless one is chosen.
    for (int i = 1; i < argc; ++i)
        if (std::strcmp(argv[i], "--snapshot") == 0 && qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM"))
            qputenv("QT_QPA_PLATFORM", "offscreen");

    QApplication app(argc, argv);
    QApplication::setOrganizationName(QStringLiteral("Trophic Ledger"));
    QApplication::setApplicationName(QStringLiteral("trophic-ledger"));
    QApplication::setApplicationDisplayName(QStringLiteral("Trophic Ledger"));
    QApplication::setApplicationVersion(QStringLiteral(TL_VERSION));
    tl::ui::initResources();
    app.setStyleSheet(tl::ui::styleSheet());

    QCommandLineParser parser;
    parser.setApplicationDescription(QStringLiteral("Trophic Ledger: build, check, balance and explore food-web models."));
    parser.addHelpOption();
    parser.addVersionOption();
    parser.addPositionalArgument(QStringLiteral("project"), QStringLiteral("A .tledger project file or a CSV model folder."));
    QCommandLineOption snapshot(QStringLiteral("snapshot"), QStringLiteral("Render every page to PNG files in <dir> and exit."),
                                QStringLiteral("dir"));
    QCommandLineOption asTemplate(QStringLiteral("template"), QStringLiteral("Open the project as a template (Save As to keep changes)."));
    parser.addOption(snapshot);
    QCommandLineOption snapshotSize(QStringLiteral("snapshot-size"),
                                    QStringLiteral("Window size for --snapshot, WIDTHxHEIGHT (default 1600x1000)."),
                                    QStringLiteral("size"), QStringLiteral("1600x1000"));
    parser.addOption(snapshotSize);
    parser.addOption(asTemplate);
    parser.process(app);
    const QStringList args = parser.positionalArguments();
    if (args.size() > 1) {
        std::fprintf(stderr, "trophic-ledger: give at most one project (got %lld)\n", static_cast<long long>(args.size()));
        return 2;
    }

    if (parser.isSet(snapshot)) {
        QTemporaryDir recovery;  // snapshots never touch the user's recovery files or settings
        tl::ui::MainWindowOptions options;
        options.recoveryDirectory = recovery.path();
        options.useSettings = false;
        options.askBeforeClosing = false;
        tl::ui::MainWindow window(options);
        const QString project = args.isEmpty() ? findSample() : args.front();
        if (project.isEmpty()) {
            std::fprintf(stderr, "trophic-ledger: no project given and no sample project found\n");
            return 2;
        }
        const QStringList wh = parser.value(snapshotSize).split(QLatin1Char('x'));
        bool okW = false, okH = false;
        const int width = wh.size() == 2 ? wh[0].toInt(&okW) : 0, height = wh.size() == 2 ? wh[1].toInt(&okH) : 0;
        if (!okW || !okH || width < 320 || height < 240 || width > 8000 || height > 8000) {
            std::fprintf(stderr, "trophic-ledger: --snapshot-size '%s' is not WIDTHxHEIGHT between 320x240 and 8000x8000\n",
                         qPrintable(parser.value(snapshotSize)));
            return 2;
        }
        window.resize(width, height);
        window.show();
        QString error;
        if (!window.openPath(project, args.isEmpty() || parser.isSet(asTemplate), &error)) {
            std::fprintf(stderr, "trophic-ledger: %s\n", qPrintable(error));
            return 2;
        }
        const QStringList files = window.renderSnapshots(parser.value(snapshot), &error);
        for (const QString& f : files) std::printf("%s\n", qPrintable(QDir::toNativeSeparators(f)));
        if (!error.isEmpty()) {
            std::fprintf(stderr, "trophic-ledger: %s\n", qPrintable(error));
            return 2;
        }
        return 0;
    }

    tl::ui::MainWindow window;
    window.show();
    if (!args.isEmpty()) {
        window.openPath(args.front(), parser.isSet(asTemplate));
    } else if (!window.offerRecovery()) {
        const QString sample = findSample();
        if (!sample.isEmpty()) window.openPath(sample, true);
    }
    return app.exec();
}
