#include "ui/document/recovery_file.h"

#include <QCoreApplication>
#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QSaveFile>
#include <QStandardPaths>
#include <QUuid>
#include <algorithm>
#include <csignal>
#include <sys/types.h>
#include <unistd.h>

#include "ui/document/project_document.h"

namespace tl::ui {
namespace {

bool processAlive(qint64 pid)
{
    if (pid <= 0) return false;
    return ::kill(pid_t(pid), 0) == 0;
}

}  // namespace

RecoveryKeeper::RecoveryKeeper(ProjectDocument* doc, const QString& directory, QObject* parent)
    : QObject(parent), doc_(doc), dir_(directory)
{
    stem_ = QStringLiteral("recovery-%1-%2")
                .arg(QCoreApplication::applicationPid())
                .arg(QUuid::createUuid().toString(QUuid::Id128).left(8));
    timer_.setInterval(60 * 1000);
    connect(&timer_, &QTimer::timeout, this, &RecoveryKeeper::onTimer);
    connect(doc_, &ProjectDocument::modelChanged, this, [this] { dirtySinceWrite_ = true; });
    connect(doc_, &ProjectDocument::projectChanged, this, [this] { dirtySinceWrite_ = true; });
    connect(doc_->undoStack(), &QUndoStack::cleanChanged, this, [this](bool clean) {
        if (clean) {
            timer_.stop();
            discard();  // saved (or undone back to the saved state): nothing to recover
        } else if (!timer_.isActive()) {
            timer_.start();
        }
    });
    if (doc_->isModified()) timer_.start();
}

RecoveryKeeper::~RecoveryKeeper() = default;

QString RecoveryKeeper::defaultDirectory()
{
    return QStandardPaths::writableLocation(QStandardPaths::AppLocalDataLocation) + QStringLiteral("/recovery");
}

QString RecoveryKeeper::recoveryFile() const { return dir_ + QLatin1Char('/') + stem_ + QStringLiteral(".tledger"); }

void RecoveryKeeper::setInterval(int milliseconds) { timer_.setInterval(milliseconds); }

void RecoveryKeeper::onTimer()
{
    if (!doc_->isModified()) {
        timer_.stop();
        return;
    }
    if (dirtySinceWrite_) writeNow();
}

bool RecoveryKeeper::writeNow(QString* error)
{
    if (!doc_->isModified()) return false;
    if (!QDir().mkpath(dir_)) {
        if (error) *error = tr("Cannot create the recovery folder %1.").arg(dir_);
        return false;
    }
    if (!writeProjectFile(doc_->project(), recoveryFile(), error)) return false;
    // The description is written after the project, so it never points at a missing file.
    QSaveFile info(dir_ + QLatin1Char('/') + stem_ + QStringLiteral(".ini"));
    if (!info.open(QIODevice::WriteOnly | QIODevice::Text)) {
        if (error) *error = tr("Cannot write %1.").arg(info.fileName());
        return false;
    }
    QString text;
    auto line = [&](const char* key, const QString& value) {
        text += QLatin1String(key) + QLatin1Char('=') + QString(value).replace('\n', ' ') + QLatin1Char('\n');
    };
    line("original", doc_->filePath());
    line("name", doc_->displayName());
    line("origin", QString::number(int(doc_->origin())));
    line("scenario", QString::number(doc_->currentIndex()));
    line("saved", QDateTime::currentDateTimeUtc().toString(Qt::ISODate));
    line("pid", QString::number(QCoreApplication::applicationPid()));
    info.write(text.toUtf8());
    if (!info.commit()) {
        if (error) *error = tr("Cannot write %1.").arg(info.fileName());
        return false;
    }
    dirtySinceWrite_ = false;
    emit written(recoveryFile());
    return true;
}

void RecoveryKeeper::discard()
{
    QFile::remove(recoveryFile());
    QFile::remove(dir_ + QLatin1Char('/') + stem_ + QStringLiteral(".ini"));
}

QList<RecoveryEntry> RecoveryKeeper::findRecoverable(const QString& directory, bool includeLive)
{
    QList<RecoveryEntry> out;
    const QDir dir(directory);
    for (const QFileInfo& fi : dir.entryInfoList({QStringLiteral("recovery-*.ini")}, QDir::Files)) {
        RecoveryEntry e;
        e.infoFile = fi.absoluteFilePath();
        e.recoveryFile = fi.absolutePath() + QLatin1Char('/') + fi.completeBaseName() + QStringLiteral(".tledger");
        if (!QFileInfo::exists(e.recoveryFile)) continue;
        QFile f(e.infoFile);
        if (!f.open(QIODevice::ReadOnly | QIODevice::Text)) continue;
        for (const QString& line : QString::fromUtf8(f.readAll()).split('\n')) {
            const int eq = line.indexOf('=');
            if (eq < 0) continue;
            const QString key = line.left(eq), value = line.mid(eq + 1);
            if (key == QLatin1String("original")) e.originalPath = value;
            else if (key == QLatin1String("name")) e.displayName = value;
            else if (key == QLatin1String("origin")) e.origin = value.toInt();
            else if (key == QLatin1String("scenario")) e.currentScenario = value.toInt();
            else if (key == QLatin1String("saved")) e.saved = QDateTime::fromString(value, Qt::ISODate);
            else if (key == QLatin1String("pid")) e.pid = value.toLongLong();
        }
        if (!includeLive && processAlive(e.pid)) continue;  // another window is still working on it
        out << e;
    }
    std::sort(out.begin(), out.end(), [](const RecoveryEntry& a, const RecoveryEntry& b) { return a.saved > b.saved; });
    return out;
}

bool RecoveryKeeper::recover(const RecoveryEntry& entry, ProjectDocument* doc, QString* error)
{
    tl::Project p;
    QString readOnly;
    if (!readProjectFile(entry.recoveryFile, &p, error, &readOnly, true)) return false;
    auto origin = ProjectDocument::Origin(std::clamp(entry.origin, 0, 3));
    QString path = entry.originalPath;
    // Only a project file can be saved back in place; anything else asks for a name.
    if (origin != ProjectDocument::Origin::ProjectFile) {
        origin = ProjectDocument::Origin::Untitled;
        path.clear();
    }
    doc->setProject(std::move(p), entry.currentScenario, origin, path, true);
    remove(entry);
    return true;
}

void RecoveryKeeper::remove(const RecoveryEntry& entry)
{
    QFile::remove(entry.recoveryFile);
    QFile::remove(entry.infoFile);
}

}  // namespace tl::ui
