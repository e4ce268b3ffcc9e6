#include "model/atomic_file.hpp"

#include <QBuffer>
#include <QDir>
#include <QFile>

#include "design/file_output.hpp"

namespace ds {

bool writeFileAtomically(const QString& path, const std::function<bool(QIODevice&)>& write,
                         QString* error) {
    // Written whole in memory first (a sheet's PDF is a few megabytes at most), then by the
    // core's one atomic writer, which checks every write and the final flush before it renames
    // the file over the old one.
    QBuffer buffer;
    buffer.open(QIODevice::WriteOnly);
    if (!write(buffer)) {
        if (error) {
            *error = QStringLiteral("cannot write '%1': it could not be composed")
                         .arg(QDir::toNativeSeparators(path));
        }
        return false;
    }
    return writeFileAtomically(path, buffer.data(), error);
}

bool writeFileAtomically(const QString& path, const QByteArray& bytes, QString* error) {
    std::string why;
    if (write_file_atomically(std::filesystem::path(QFile::encodeName(path).toStdString()),
                              std::string_view(bytes.constData(), bytes.size()), &why)) {
        return true;
    }
    if (error)
        *error = QString::fromStdString(why);
    return false;
}

}  // namespace ds
