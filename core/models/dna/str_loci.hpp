#pragma once
// The names of the standard autosomal STR loci and of the sex marker Amelogenin.
// Sources: the 20 CODIS core loci (Hares 2015, "Selection and implementation of expanded CODIS
// core loci in the United States", Forensic Sci. Int. Genet. 17:33 — from memory for the
// citation, the list is common practice); the European Standard Set of 12 loci (Council of the
// European Union resolution 2009/C 296/01 — common practice); and loci commonly typed besides
// them (Penta D, Penta E, SE33, D6S1043 — common practice).

#include <optional>
#include <span>
#include <string>
#include <string_view>

namespace counterpoise::models::dna {

// The canonical spellings of the standard autosomal STR loci ("D8S1179", "TH01", "vWA",
// "Penta D", ...). Amelogenin is not among them.
std::span<const std::string_view> standard_str_loci();

// The canonical spelling of `name` when it names a standard STR locus or Amelogenin, compared
// without regard to ASCII case, spaces, hyphens and underscores ("VWA", "penta_d", "AMEL" are
// recognised); nullopt otherwise.
std::optional<std::string> canonical_locus_name(std::string_view name);

// True when `name` (in any spelling canonical_locus_name accepts) is the sex marker Amelogenin.
bool is_amelogenin(std::string_view name);

// The name used to match loci between a profile and a frequency table: the canonical spelling
// for a standard locus, otherwise `name` unchanged.
std::string locus_key(std::string_view name);

}  // namespace counterpoise::models::dna
