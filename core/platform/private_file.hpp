#pragma once
// Writing a file that holds case content: atomically (readers see the old file or the whole new
// one, never a part) and privately (the owner's permissions, whatever the umask). Used by the
// case store's import, export, and the report writer.
//
// A temporary file is created beside the target, exclusively and without following links
// (O_CREAT | O_EXCL | O_NOFOLLOW), so a link planted at its name is never written through; it is
// given the mode with fchmod (the umask plays no part), written, fsynced, renamed over the
// target, and the folder is fsynced so the rename itself survives a crash. Temporary names are
// "<target>.cp-tmp-<pid>-<n>": a run killed before the rename leaves one behind, and the next
// write of the same target removes those whose process no longer runs.

#include <filesystem>
#include <string_view>

#include <sys/types.h>

namespace counterpoise::platform {

// The mode of files holding case content: COUNTERPOISE_FILE_MODE (octal, e.g. 0640) when set,
// else 0600, the case store's own. Throws validation::InvalidValue when the variable is not an
// octal mode the owner can read and write, or gives execute rights or writing to others.
mode_t case_content_file_mode();

// Writes `bytes` to `target` as above with `mode`. Throws validation::FileError naming the
// target when the folder cannot be written, the disk is full or the rename fails; the target is
// then unchanged and no temporary file is left.
void write_private_file(const std::filesystem::path& target, std::string_view bytes,
                        mode_t mode = case_content_file_mode());

// Creates `path` empty, exclusively and without following a link, with `mode` (fchmod, so the
// umask plays no part). Throws validation::FileError when it exists or cannot be created.
void create_private_file(const std::filesystem::path& path, mode_t mode);

// A fresh temporary name beside `target` in the form removed by remove_stale_temporaries.
std::filesystem::path temporary_name_for(const std::filesystem::path& target);

// Removes "<target>.cp-tmp-<pid>-<n>" files (and their "-journal") beside `target` whose process
// is gone. Never throws; a file that cannot be removed is left.
void remove_stale_temporaries(const std::filesystem::path& target);

// fsyncs a folder so a rename or link in it is durable. Never throws.
void sync_folder(const std::filesystem::path& folder);

}  // namespace counterpoise::platform
