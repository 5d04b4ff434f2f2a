// SPDX-License-Identifier: GPL-3.0-or-later
#include "ui/errorlabel.h"

#include "ui/palette.h"

#include <QLabel>
#include <QPalette>

namespace amp::ui {

QLabel* makeErrorLabel(const QString& objectName, QWidget* parent) {
    auto* label = new QLabel(parent);
    label->setObjectName(objectName);
    label->setWordWrap(true);
    label->setTextFormat(Qt::PlainText);
    QPalette pal = label->palette();
    pal.setColor(QPalette::WindowText, colours::errorText());
    label->setPalette(pal);
    label->hide();
    return label;
}

} // namespace amp::ui
