// RecoveryKeeper: autosave of unsaved work. While a document has unsaved changes, the
// whole project is written every 60 s (if it changed since the last write) to a
// recovery .tledger file with a small description beside it (what file it belongs
// to, which scenario, when). Saving or closing cleanly deletes both; files left behind
// therefore mean a crash, and the next start offers to recover them.
#pragma once

#include <QDateTime>
#include <QObject>
#include <QString>
#include <QTimer>

namespace tl::ui {

class ProjectDocument;

struct RecoveryEntry {
    QString recoveryFile;   // the .tledger written by the autosave
    QString infoFile;       // its description (.ini)
    QString originalPath;   // the document's file or folder, empty if untitled
    QString displayName;
    int origin = 0;         // ProjectDocument::Origin
    int currentScenario = 0;
    QDateTime saved;
    qint64 pid = 0;         // process that wrote it
};

class RecoveryKeeper : public QObject {
    Q_OBJECT
public:
    RecoveryKeeper(ProjectDocument* doc, const QString& directory, QObject* parent = nullptr);
    ~RecoveryKeeper() override;

    static QString defaultDirectory();  // <app data>/recovery
    QString directory() const { return dir_; }
    QString recoveryFile() const;
    void setInterval(int milliseconds);  // default 60 000

    // Writes the recovery file now (if the document has unsaved changes).
    bool writeNow(QString* error = nullptr);
    // Deletes this document's recovery files (after a save, or a clean close).
    void discard();

    // Recovery files left in `directory` by processes no longer running (all of them
    // when includeLive is set, for tests), newest first.
    static QList<RecoveryEntry> findRecoverable(const QString& directory, bool includeLive = false);
    // Loads an entry into `doc` as unsaved work; the entry's files are then removed.
    static bool recover(const RecoveryEntry& entry, ProjectDocument* doc, QString* error);
    static void remove(const RecoveryEntry& entry);

signals:
    void written(const QString& file);

private:
    void onTimer();

    ProjectDocument* doc_;
    QString dir_;
    QString stem_;
    QTimer timer_;
    bool dirtySinceWrite_ = false;
};

}  // namespace tl::ui
