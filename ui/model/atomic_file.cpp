#include "model/atomic_file.hpp"

#include <QSaveFile>

namespace ds {

bool writeFileAtomically(const QString& path, const std::function<bool(QIODevice&)>& write,
                         QString* error) {
    QSaveFile file(path);
    const auto failed = [&] {
        if (error)
            *error = QStringLiteral("cannot write '%1': %2").arg(path, file.errorString());
        return false;
    };
    if (!file.open(QIODevice::WriteOnly))
        return failed();
    if (!write(file)) {
        file.cancelWriting();
        return failed();
    }
    if (!file.commit())
        return failed();
    return true;
}

bool writeFileAtomically(const QString& path, const QByteArray& bytes, QString* error) {
    return writeFileAtomically(
        path, [&bytes](QIODevice& device) { return device.write(bytes) == bytes.size(); }, error);
}

}  // namespace ds
