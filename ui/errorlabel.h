// SPDX-License-Identifier: GPL-3.0-or-later
#pragma once
// The label an editor shows its refusals in: plain text, wrapped, in the error colour, hidden
// until there is something to say.

#include <QString>

class QLabel;
class QWidget;

namespace amp::ui {

/// A new hidden error label named `objectName` (tests and style sheets find it by that name).
QLabel* makeErrorLabel(const QString& objectName, QWidget* parent);

} // namespace amp::ui
