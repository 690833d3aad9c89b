//===- SourceFiles.cpp - Loading circuit files and includes safely --------===//
#include "revbound/support/SourceFiles.h"
#include "revbound/support/Diagnostics.h"

#include "llvm/ADT/SmallString.h"
#include "llvm/Support/FileSystem.h"
#include "llvm/Support/MemoryBuffer.h"
#include "llvm/Support/Path.h"

#include <cstdio>
#include <cstring>
#include <fmt/format.h>

namespace revbound {

namespace fs = llvm::sys::fs;
namespace path = llvm::sys::path;

static std::string canonical(llvm::StringRef P) {
  llvm::SmallString<256> Real;
  if (fs::real_path(P, Real))
    return {};
  return std::string(Real);
}

SourceFiles::SourceFiles(SourceOptions O) : Opts(std::move(O)) {
  for (const std::string &P : Opts.IncludePaths) {
    std::string C = canonical(P);
    if (!C.empty())
      Roots.push_back(C);
  }
}

bool SourceFiles::insideRoots(llvm::StringRef RealPath) const {
  if (Opts.AllowIncludeEscape)
    return true;
  for (const std::string &Root : Roots) {
    if (RealPath.startswith(Root) &&
        (RealPath.size() == Root.size() ||
         path::is_separator(RealPath[Root.size()]) || Root == "/"))
      return true;
  }
  return false;
}

llvm::Expected<unsigned> SourceFiles::readFile(llvm::StringRef Path,
                                               llvm::StringRef Shown,
                                               llvm::SMLoc Loc,
                                               unsigned Length) {
  fs::file_status Status;
  if (std::error_code EC = fs::status(Path, Status))
    return errorAt(Loc, fmt::format("cannot open '{}': {}", Shown.str(),
                                    EC.message()), Length);
  if (Status.type() != fs::file_type::regular_file)
    return errorAt(Loc, fmt::format("'{}' is not a regular file", Shown.str()),
                   Length);
  if (Status.getSize() > Opts.MaxFileBytes)
    return errorAt(Loc,
                   fmt::format("'{}' is {} bytes, over the limit of {} bytes "
                               "(--max-file-bytes)",
                               Shown.str(), Status.getSize(), Opts.MaxFileBytes),
                   Length);
  auto BufOrErr = llvm::MemoryBuffer::getFile(Path, /*IsText=*/false,
                                              /*RequiresNullTerminator=*/true);
  if (!BufOrErr)
    return errorAt(Loc, fmt::format("cannot read '{}': {}", Shown.str(),
                                    BufOrErr.getError().message()), Length);
  // The buffer keeps the file mapped; its identifier is the path as given,
  // which is what diagnostics show.
  unsigned Id = adopt(std::move(*BufOrErr));
  BufferPaths[Id - 1] = canonical(Path);
  return Id;
}

llvm::Expected<unsigned> SourceFiles::loadMain(llvm::StringRef Path) {
  if (Path == "-") {
    // Read in chunks and stop past the limit, so memory stays bounded.
    std::string Text;
    char Chunk[1 << 16];
    while (size_t N = std::fread(Chunk, 1, sizeof(Chunk), stdin)) {
      Text.append(Chunk, N);
      if (Text.size() > Opts.MaxFileBytes)
        return errorAt(llvm::SMLoc(),
                       fmt::format("standard input is over the limit of {} "
                                   "bytes (--max-file-bytes)",
                                   Opts.MaxFileBytes));
    }
    if (std::ferror(stdin))
      return errorAt(llvm::SMLoc(), "cannot read standard input");
    unsigned Id = adopt(llvm::MemoryBuffer::getMemBufferCopy(Text, "<stdin>"));
    Roots.push_back(canonical("."));
    return Id;
  }
  llvm::Expected<unsigned> Id = readFile(Path, Path, llvm::SMLoc(), 0);
  if (!Id)
    return Id.takeError();
  llvm::SmallString<256> Dir(BufferPaths[*Id - 1]);
  path::remove_filename(Dir);
  Roots.push_back(std::string(Dir));
  return Id;
}

unsigned SourceFiles::adopt(std::unique_ptr<llvm::MemoryBuffer> Buffer) {
  unsigned Id = SM.AddNewSourceBuffer(std::move(Buffer), llvm::SMLoc());
  BufferPaths.resize(Id);
  return Id;
}

unsigned SourceFiles::addBuffer(llvm::StringRef Name, llvm::StringRef Contents) {
  return adopt(llvm::MemoryBuffer::getMemBufferCopy(Contents, Name));
}

unsigned SourceFiles::addStaticBuffer(llvm::StringRef Name,
                                      llvm::StringRef Contents) {
  return adopt(llvm::MemoryBuffer::getMemBuffer(
      Contents, Name, /*RequiresNullTerminator=*/true));
}

llvm::StringRef SourceFiles::canonicalPath(unsigned BufferId) const {
  if (BufferId == 0 || BufferId > BufferPaths.size())
    return {};
  return BufferPaths[BufferId - 1];
}

llvm::Expected<unsigned> SourceFiles::loadInclude(llvm::StringRef Name,
                                                  llvm::SMLoc IncludeLoc,
                                                  unsigned Length) {
  if (Name.empty())
    return errorAt(IncludeLoc, "empty include file name", Length);
  if (path::is_absolute(Name) && !Opts.AllowIncludeEscape)
    return errorAt(IncludeLoc,
                   fmt::format("include '{}' is an absolute path; includes must "
                               "stay inside the allowed roots (see --include-path)",
                               Name.str()),
                   Length);
  // Candidates: beside the including file, then along the include path.
  std::vector<std::string> Candidates;
  unsigned From = SM.FindBufferContainingLoc(IncludeLoc);
  // Paths are built from the including file's name as given, so that
  // diagnostics show relative paths when the user gave relative ones.
  llvm::SmallString<256> Base;
  if (!canonicalPath(From).empty())
    Base = path::parent_path(
        SM.getMemoryBuffer(From)->getBufferIdentifier());
  if (path::is_absolute(Name)) {
    Candidates.push_back(Name.str());
  } else {
    llvm::SmallString<256> C(Base);
    path::append(C, Name);
    Candidates.push_back(std::string(C));
  }
  for (const std::string &Root : Opts.IncludePaths) {
    llvm::SmallString<256> C(Root);
    path::append(C, Name);
    Candidates.push_back(std::string(C));
  }
  for (const std::string &C : Candidates) {
    if (!fs::exists(C))
      continue;
    std::string Real = canonical(C);
    if (Real.empty() || !insideRoots(Real))
      return errorAt(IncludeLoc,
                     fmt::format("include '{}' resolves to '{}', outside the "
                                 "allowed roots (the main file's folder and "
                                 "--include-path)",
                                 Name.str(), Real.empty() ? C : Real),
                     Length);
    return readFile(C, C, IncludeLoc, Length);
  }
  return errorAt(IncludeLoc,
                 fmt::format("cannot find include file '{}'", Name.str()),
                 Length);
}

} // namespace revbound

namespace revbound {

SourceFiles::Point SourceFiles::locate(llvm::SMLoc Loc) const {
  Point P;
  if (!Loc.isValid())
    return P;
  unsigned Id = SM.FindBufferContainingLoc(Loc);
  if (Id == 0)
    return P;
  const llvm::MemoryBuffer *Buf = SM.getMemoryBuffer(Id);
  P.File = Buf->getBufferIdentifier();
  if (Cursors.size() < Id)
    Cursors.resize(Id);
  const char *Target = Loc.getPointer();
  // Continue from the nearest cursor at or before the target; when there is
  // none, start one from the buffer's beginning in the least useful slot.
  Cursor *Best = nullptr;
  for (Cursor &C : Cursors[Id - 1])
    if (C.Pos && C.Pos <= Target && (!Best || C.Pos > Best->Pos))
      Best = &C;
  if (!Best) {
    Best = &Cursors[Id - 1][0];
    for (Cursor &C : Cursors[Id - 1])
      if (!C.Pos || C.Pos > Best->Pos)
        Best = &C;
    Best->Pos = Buf->getBufferStart();
    Best->Line = 1;
  }
  Cursor &Cur = *Best;
  // Advance line by line with memchr, which is as fast as counting gets.
  while (const void *NL = std::memchr(Cur.Pos, '\n', size_t(Target - Cur.Pos))) {
    Cur.Pos = static_cast<const char *>(NL) + 1;
    ++Cur.Line;
  }
  P.Line = Cur.Line;
  P.Column = unsigned(Target - Cur.Pos) + 1;
  return P;
}

} // namespace revbound
