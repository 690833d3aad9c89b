//===- SourceFiles.h - Loading circuit files and includes safely ----------===//
//
// Owns the llvm::SourceMgr that every location points into. Main files are
// read as given ("-" is standard input); included files resolve relative to
// the including file, then along the include path, and must stay inside the
// allowed roots: the main file's folder and every include-path folder.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_SUPPORT_SOURCEFILES_H
#define REVBOUND_SUPPORT_SOURCEFILES_H

#include "llvm/ADT/StringRef.h"
#include "llvm/Support/Error.h"
#include "llvm/Support/SourceMgr.h"

#include <array>
#include <cstdint>
#include <string>
#include <vector>

namespace revbound {

/// Where includes may come from and how large a file may be.
struct SourceOptions {
  std::vector<std::string> IncludePaths; // extra roots, searched in order
  bool AllowIncludeEscape = false;       // allow includes outside the roots
  uint64_t MaxFileBytes = uint64_t(1) << 30;
};

class SourceFiles {
public:
  explicit SourceFiles(SourceOptions Opts = {});

  /// Reads a main file ("-" for standard input) and returns its buffer id.
  /// Fails with a location-free diagnostic if it cannot be read.
  llvm::Expected<unsigned> loadMain(llvm::StringRef Path);

  /// Adds an in-memory buffer (tests, the built-in library); its includes
  /// resolve against the current directory.
  unsigned addBuffer(llvm::StringRef Name, llvm::StringRef Contents);
  /// Like addBuffer, for text that outlives every SourceFiles and has a NUL
  /// right after it (a string literal): it is not copied, so locations in
  /// it are the same in every SourceFiles that adds it.
  unsigned addStaticBuffer(llvm::StringRef Name, llvm::StringRef Contents);

  /// Resolves and reads `Name` as included from `IncludeLoc`; `Length` is the
  /// byte length of the file-name token, for the diagnostic range.
  llvm::Expected<unsigned> loadInclude(llvm::StringRef Name,
                                       llvm::SMLoc IncludeLoc,
                                       unsigned Length);

  /// Reads a file the user named on the command line (such as --stdlib) on
  /// behalf of an include at `IncludeLoc`; the roots do not apply to it.
  llvm::Expected<unsigned> loadNamed(llvm::StringRef Path,
                                     llvm::SMLoc IncludeLoc, unsigned Length) {
    return readFile(Path, Path, IncludeLoc, Length);
  }

  /// The canonical path of a loaded buffer ("" for in-memory ones); used to
  /// detect include cycles.
  llvm::StringRef canonicalPath(unsigned BufferId) const;

  /// Line and column (1-based) of `Loc` and its buffer's name, for reports
  /// that resolve many locations in source order: a cursor per buffer makes
  /// that one pass over the text instead of a line table of the whole file.
  struct Point {
    llvm::StringRef File;
    unsigned Line = 0;
    unsigned Column = 0;
  };
  Point locate(llvm::SMLoc Loc) const;

  llvm::SourceMgr &mgr() { return SM; }
  const llvm::SourceMgr &mgr() const { return SM; }

private:
  /// Hands `Buffer` to the source manager; its path starts empty.
  unsigned adopt(std::unique_ptr<llvm::MemoryBuffer> Buffer);
  llvm::Expected<unsigned> readFile(llvm::StringRef Path, llvm::StringRef Shown,
                                    llvm::SMLoc Loc, unsigned Length);
  bool insideRoots(llvm::StringRef RealPath) const;

  SourceOptions Opts;
  llvm::SourceMgr SM;
  std::vector<std::string> Roots;          // canonical folders
  std::vector<std::string> BufferPaths;    // by buffer id - 1
  struct Cursor {
    const char *Pos = nullptr; // a line start
    unsigned Line = 1;
  };
  // A few cursors per buffer, since reports alternate between top-level
  // statements and the gate bodies they call.
  static constexpr unsigned CursorsPerBuffer = 4;
  mutable std::vector<std::array<Cursor, CursorsPerBuffer>> Cursors;
};

} // namespace revbound

#endif
