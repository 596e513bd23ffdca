#include "reports/seal_xmp.hpp"

#include "core/store/report_anchor.hpp"

namespace counterpoise::reports {

namespace {

QString q(const std::string& text) { return QString::fromStdString(text); }

void write_extension_schema(QXmlStreamWriter& w) {
  w.writeStartElement(QStringLiteral("rdf:Description"));
  w.writeAttribute(QStringLiteral("rdf:about"), QString());
  w.writeAttribute(QStringLiteral("xmlns:pdfaExtension"), QStringLiteral("http://www.aiim.org/pdfa/ns/extension/"));
  w.writeAttribute(QStringLiteral("xmlns:pdfaSchema"), QStringLiteral("http://www.aiim.org/pdfa/ns/schema#"));
  w.writeAttribute(QStringLiteral("xmlns:pdfaProperty"), QStringLiteral("http://www.aiim.org/pdfa/ns/property#"));
  w.writeStartElement(QStringLiteral("pdfaExtension:schemas"));
  w.writeStartElement(QStringLiteral("rdf:Bag"));
  w.writeStartElement(QStringLiteral("rdf:li"));
  w.writeAttribute(QStringLiteral("rdf:parseType"), QStringLiteral("Resource"));
  w.writeTextElement(QStringLiteral("pdfaSchema:schema"), QStringLiteral("Counterpoise report seal"));
  w.writeTextElement(QStringLiteral("pdfaSchema:namespaceURI"), q(store::kAnchorNamespace));
  w.writeTextElement(QStringLiteral("pdfaSchema:prefix"), q(store::kAnchorPrefix));
  w.writeStartElement(QStringLiteral("pdfaSchema:property"));
  w.writeStartElement(QStringLiteral("rdf:Seq"));
  w.writeStartElement(QStringLiteral("rdf:li"));
  w.writeAttribute(QStringLiteral("rdf:parseType"), QStringLiteral("Resource"));
  w.writeTextElement(QStringLiteral("pdfaProperty:name"), q(store::kAnchorProperty));
  w.writeTextElement(QStringLiteral("pdfaProperty:valueType"), QStringLiteral("Text"));
  w.writeTextElement(QStringLiteral("pdfaProperty:category"), QStringLiteral("external"));
  w.writeTextElement(QStringLiteral("pdfaProperty:description"),
                     QStringLiteral("The seal of this report: hex of the canonical JSON of the signed seal statement "
                                    "and its signature"));
  w.writeEndElement();  // rdf:li
  w.writeEndElement();  // rdf:Seq
  w.writeEndElement();  // pdfaSchema:property
  w.writeEndElement();  // rdf:li
  w.writeEndElement();  // rdf:Bag
  w.writeEndElement();  // pdfaExtension:schemas
  w.writeEndElement();  // rdf:Description
}

}  // namespace

void write_seal_anchor_xmp(QXmlStreamWriter& w, const store::SealAnchor& anchor) {
  write_extension_schema(w);
  w.writeStartElement(QStringLiteral("rdf:Description"));
  w.writeAttribute(QStringLiteral("rdf:about"), QString());
  w.writeAttribute(q(std::string("xmlns:") + store::kAnchorPrefix), q(store::kAnchorNamespace));
  w.writeTextElement(q(std::string(store::kAnchorPrefix) + ":" + store::kAnchorProperty),
                     q(store::anchor_element_text(anchor)));
  w.writeEndElement();
}

}  // namespace counterpoise::reports
