#pragma once
// Header text that is not UTF-8 (internal to ingest).
//
// Loggers on Windows often write their header in Windows-1252 (or ISO 8859-1,
// Latin-1), where '°' is the single byte 0xB0 and 'µ' is 0xB5; in UTF-8 those
// bytes alone are not text. Both encodings give the bytes 0xA0–0xFF the code
// points U+00A0–U+00FF (ISO/IEC 8859-1; Windows-1252 differs only in 0x80–0x9F),
// so a unit spelling that is not valid UTF-8 is read once more as Latin-1:
// "\xB0C" is then "°C" and "\xB5s" is "µs". Nothing else is guessed.

#include <optional>
#include <string>
#include <string_view>

namespace coilspin::ingest {

// True when `text` is well-formed UTF-8 (RFC 3629: no overlong forms, no surrogates, at most U+10FFFF).
bool IsUtf8(std::string_view text);

// `text` read as Latin-1, written as UTF-8: bytes below 0x80 stay, 0x80–0xFF become two bytes.
std::string Latin1ToUtf8(std::string_view text);

// The first byte of `text` that is not part of well-formed UTF-8, e.g. "0xB0"; nothing when it is UTF-8.
std::optional<std::string> FirstNonUtf8Byte(std::string_view text);

}  // namespace coilspin::ingest
