#pragma once
// The seal anchor in the report's XMP packet (core/store/report_anchor.hpp says what it holds
// and how it is read back): one rdf:Description with the property cpseal:anchor, and the PDF/A
// extension schema that declares that property, since PDF/A-1 (ISO 19005-1:2005, 6.7.8) allows
// in the XMP only properties of predefined schemas or of schemas described this way.

#include <QXmlStreamWriter>

#include "core/store/seal_statement.hpp"

namespace counterpoise::reports {

// Writes both descriptions inside an open rdf:RDF element.
void write_seal_anchor_xmp(QXmlStreamWriter& writer, const store::SealAnchor& anchor);

}  // namespace counterpoise::reports
