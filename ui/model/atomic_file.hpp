#pragma once

#include <functional>

#include <QByteArray>
#include <QString>

QT_BEGIN_NAMESPACE
class QIODevice;
QT_END_NAMESPACE

namespace ds {

/// Writes a file whole or not at all: a temporary file beside it is filled by `write`, then
/// renamed over it (QSaveFile). On failure the old file is as it was and `error`, when given,
/// says "cannot write 'PATH': why".
bool writeFileAtomically(const QString& path, const std::function<bool(QIODevice&)>& write,
                         QString* error);
bool writeFileAtomically(const QString& path, const QByteArray& bytes, QString* error);

}  // namespace ds
