//===- Text.cpp - Text from files made safe for the formats we write ------===//
#include "revbound/support/Text.h"

#include "llvm/Support/ConvertUTF.h"

namespace revbound {
namespace {

constexpr const char *Replacement = "\xEF\xBF\xBD"; // U+FFFD

/// Calls Emit(sequence) for each legal UTF-8 sequence of S and
/// Emit(Replacement) for each byte that starts none.
template <class EmitFn> void forEachSequence(llvm::StringRef S, EmitFn Emit) {
  const auto *Bytes = reinterpret_cast<const llvm::UTF8 *>(S.data());
  for (size_t I = 0; I < S.size();) {
    unsigned N = llvm::getNumBytesForUTF8(Bytes[I]);
    if (I + N <= S.size() &&
        llvm::isLegalUTF8Sequence(Bytes + I, Bytes + I + N)) {
      Emit(S.substr(I, N));
      I += N;
    } else {
      Emit(llvm::StringRef(Replacement));
      ++I;
    }
  }
}

} // namespace

std::string validUtf8(llvm::StringRef S) {
  std::string Out;
  Out.reserve(S.size());
  forEachSequence(S, [&](llvm::StringRef Seq) { Out += Seq; });
  return Out;
}

std::string xmlEscape(llvm::StringRef S) {
  std::string Out;
  Out.reserve(S.size());
  forEachSequence(S, [&](llvm::StringRef Seq) {
    unsigned char B = Seq[0];
    if (Seq.size() == 1) {
      switch (B) {
      case '&':
        Out += "&amp;";
        return;
      case '<':
        Out += "&lt;";
        return;
      case '>':
        Out += "&gt;";
        return;
      case '"':
        Out += "&quot;";
        return;
      case '\'':
        Out += "&apos;";
        return;
      default:
        if (B < 0x20 && B != '\t' && B != '\n' && B != '\r')
          Out += Replacement;
        else
          Out += char(B);
        return;
      }
    }
    // U+FFFE and U+FFFF are not XML characters either.
    if (Seq.size() == 3 && B == 0xEF && (unsigned char)Seq[1] == 0xBF &&
        (unsigned char)Seq[2] >= 0xBE)
      Out += Replacement;
    else
      Out += Seq;
  });
  return Out;
}

} // namespace revbound
