//===- Text.h - Text from files made safe for the formats we write --------===//
//
// File names, register names and messages come from untrusted files; every
// writer that embeds them in UTF-8 formats (JSON, Markdown, XML, HTML) passes
// them through here first.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SUPPORT_TEXT_H
#define REVBOUND_SUPPORT_TEXT_H

#include "llvm/ADT/StringRef.h"

#include <string>

namespace revbound {

/// `S` with every byte that does not start a legal UTF-8 sequence replaced
/// by U+FFFD.
std::string validUtf8(llvm::StringRef S);

/// `S` for XML text or a quoted attribute: & < > " ' as entity references,
/// and bytes that are not UTF-8 and characters XML 1.0 forbids (C0 controls
/// but tab, line feed and carriage return; U+FFFE, U+FFFF) as U+FFFD.
std::string xmlEscape(llvm::StringRef S);

} // namespace revbound

#endif
