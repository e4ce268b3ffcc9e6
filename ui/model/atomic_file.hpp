#pragma once

#include <functional>

#include <QByteArray>
#include <QString>

QT_BEGIN_NAMESPACE
class QIODevice;
QT_END_NAMESPACE

namespace ds {

/// Writes a file whole or not at all, through the core's one atomic writer
/// (write_file_atomically): what `write` writes is collected, written to a file beside the
/// target, checked and renamed over it. On failure the old file is as it was and `error`, when
/// given, says "cannot write 'PATH': why".
bool writeFileAtomically(const QString& path, const std::function<bool(QIODevice&)>& write,
                         QString* error);
bool writeFileAtomically(const QString& path, const QByteArray& bytes, QString* error);

}  // namespace ds
