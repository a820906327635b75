using System.Buffers;
using System.Text.Unicode;
using static System.FormattableString;

namespace BatchReconcile.Records.Exports.Reading;

/// <summary>What stopped the reading of an export below the CSV level: the file is not the text the contract asks for.</summary>
/// <param name="Line">The line (1 = header) where it was found.</param>
/// <param name="Value">The offending bytes in hex, short; may be empty.</param>
internal sealed record ExportInputFault(long Line, string Value, string Reason);

/// <summary>
/// A stream under the CSV reader that checks the bytes against the contract's encoding rules one line at
/// a time and hands on only whole lines that passed (<see cref="ExportLimits"/>):
/// <list type="bullet">
/// <item>a line longer than <see cref="ExportLimits.MaxLineBytes"/>, a UTF-16/UTF-32 byte-order mark, a NUL
/// byte, a CR that is not followed by LF, or bytes that are not text in the first block, stop the reading
/// (<see cref="Fault"/>): nothing of that line or after it reaches the CSV reader, so memory stays at
/// about one line and a file of junk is not read to its end;</item>
/// <item>a line whose bytes are not valid UTF-8 is handed on (the CSV reader decodes them as U+FFFD) and
/// remembered (<see cref="IsNotUtf8"/>), so that the scanner can name the column; a correctly encoded
/// U+FFFD on a valid line is an ordinary character.</item>
/// </list>
/// </summary>
internal sealed class ExportInputGuard(Stream inner) : Stream
{
    private const int Chunk = 64 * 1024;

    /// <summary>Bytes from the start of the file in which a line that is not UTF-8 and holds control bytes means "not text".</summary>
    private const int FirstBlock = 64 * 1024;

    /// <summary>After this many lines that are not UTF-8 the file is taken as not UTF-8 at all and reading stops.</summary>
    private const int MaxNotUtf8Lines = 1000;

    private readonly HashSet<long> _notUtf8 = [];
    // Rented, not allocated: a fresh 128 KiB buffer per file is a large-object allocation, and with many small
    // files those made the collector run a full collection every few dozen files.
    private byte[] _buffer = ArrayPool<byte>.Shared.Rent(2 * Chunk);
    private int _start;    // next byte to hand on
    private int _ready;    // end of the lines that passed
    private int _end;      // end of the bytes read
    private int _searched; // where the search for the next LF resumes
    private long _lineStartOffset;
    private long _line = 1; // the line that starts at _ready
    private bool _eof;

    /// <summary>Why reading stopped early, or null while the file is as the contract says.</summary>
    public ExportInputFault? Fault { get; private set; }

    /// <summary>Lines handed on to the reader so far.</summary>
    public long LinesPassed => _line - 1;

    /// <summary>Total bytes read from the file (for the test that junk is not read whole).</summary>
    public long BytesRead { get; private set; }

    /// <summary>Whether any of the lines <paramref name="first"/> to <paramref name="last"/> had bytes that are not UTF-8.</summary>
    public bool IsNotUtf8(long first, long last)
    {
        if (_notUtf8.Count == 0)
        {
            return false;
        }

        for (var line = first; line <= last; line++)
        {
            if (_notUtf8.Contains(line))
            {
                return true;
            }
        }

        return false;
    }

    public override bool CanRead => true;

    public override bool CanSeek => false;

    public override bool CanWrite => false;

    public override long Length => throw new NotSupportedException();

    public override long Position { get => throw new NotSupportedException(); set => throw new NotSupportedException(); }

    public override int Read(byte[] buffer, int offset, int count) => Read(buffer.AsSpan(offset, count));

    public override int Read(Span<byte> buffer)
    {
        if (buffer.IsEmpty)
        {
            return 0;
        }

        while (_start == _ready)
        {
            if (!Fill())
            {
                return 0;
            }
        }

        var n = Math.Min(buffer.Length, _ready - _start);
        _buffer.AsSpan(_start, n).CopyTo(buffer);
        _start += n;
        return n;
    }

    public override ValueTask<int> ReadAsync(Memory<byte> buffer, CancellationToken cancellationToken = default) =>
        ValueTask.FromResult(Read(buffer.Span));

    public override Task<int> ReadAsync(byte[] buffer, int offset, int count, CancellationToken cancellationToken) =>
        Task.FromResult(Read(buffer.AsSpan(offset, count)));

    public override void Flush()
    {
    }

    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();

    public override void SetLength(long value) => throw new NotSupportedException();

    protected override void Dispose(bool disposing)
    {
        if (disposing && _buffer.Length > 0)
        {
            ArrayPool<byte>.Shared.Return(_buffer);
            _buffer = [];
            _start = _ready = _end = _searched = 0;
            _eof = true;
        }

        base.Dispose(disposing);
    }

    public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();

    /// <summary>Reads more and checks every line completed; false when nothing more will be handed on.</summary>
    private bool Fill()
    {
        if (Fault is not null || _eof)
        {
            return false;
        }

        if (_start > 0)
        {
            Buffer.BlockCopy(_buffer, _start, _buffer, 0, _end - _start);
            _ready -= _start;
            _end -= _start;
            _searched -= _start;
            _start = 0;
        }

        if (_end - _ready > ExportLimits.MaxLineBytes)
        {
            var partial = _buffer.AsSpan(_ready, _end - _ready);
            if (!CheckLine(partial, partial.Length - 1))
            {
                return false;
            }

            Stop(_line, "", Invariant($"line {_line} is longer than {ExportLimits.MaxLineBytes:N0} bytes (1 MiB), the longest line the export format allows; reading stopped here. Is this a batch-record export?"));
            return false;
        }

        if (_buffer.Length - _end < Chunk)
        {
            var larger = ArrayPool<byte>.Shared.Rent(Math.Max(_buffer.Length * 2, _end + Chunk));
            Buffer.BlockCopy(_buffer, 0, larger, 0, _end);
            ArrayPool<byte>.Shared.Return(_buffer);
            _buffer = larger;
        }

        var n = inner.Read(_buffer, _end, Chunk);
        if (n == 0)
        {
            _eof = true;
            if (_end > _ready)
            {
                var last = _buffer.AsSpan(_ready, _end - _ready);
                if (!CheckLine(last, last.Length))
                {
                    return _ready > _start;
                }

                Pass(_end);
            }

            return _ready > _start;
        }

        _end += n;
        BytesRead += n;
        while (true)
        {
            var lf = _buffer.AsSpan(_searched, _end - _searched).IndexOf((byte)'\n');
            if (lf < 0)
            {
                _searched = _end;
                return true;
            }

            var lineEnd = _searched + lf + 1;
            var line = _buffer.AsSpan(_ready, lineEnd - _ready);
            var content = line.Length >= 2 && line[^2] == (byte)'\r' ? line.Length - 2 : line.Length - 1;
            if (!CheckLine(line, content))
            {
                // What passed before this line is still handed on; nothing after it is.
                return _ready > _start;
            }

            Pass(lineEnd);
        }
    }

    private void Pass(int lineEnd)
    {
        _lineStartOffset += lineEnd - _ready;
        _ready = lineEnd;
        _searched = lineEnd;
        _line++;
    }

    /// <summary>Checks one line; <paramref name="contentLength"/> excludes its LF or CRLF. False (with <see cref="Fault"/> set) to stop.</summary>
    private bool CheckLine(ReadOnlySpan<byte> line, int contentLength)
    {
        var content = line[..Math.Max(0, contentLength)];
        if (_line == 1 && line.Length >= 2 && ((line[0] == 0xFF && line[1] == 0xFE) || (line[0] == 0xFE && line[1] == 0xFF)))
        {
            Stop(1, Hex(line[..2]), "the file starts with a UTF-16 byte-order mark: it is UTF-16 (or UTF-32) text, but the export format is UTF-8; export the file as UTF-8");
            return false;
        }

        var inFirstBlock = _lineStartOffset < FirstBlock;

        // One pass for the two bytes that are never allowed; the rare line that has one is looked at again.
        var special = content.IndexOfAny((byte)0, (byte)'\r');
        var nul = special < 0 ? -1 : content.IndexOf((byte)0);
        if (nul >= 0)
        {
            Stop(_line, "", inFirstBlock
                ? Invariant($"this is not a text file (a NUL byte on line {_line}, byte {nul + 1}); an export is UTF-8 text")
                : Invariant($"line {_line} has a NUL byte (byte {nul + 1}); an export is UTF-8 text without NUL bytes"));
            return false;
        }

        var valid = Utf8.IsValid(content);
        if (!valid && inFirstBlock && HasControlBytes(content))
        {
            Stop(_line, "", Invariant($"this is not a text file: line {_line} has bytes that are neither UTF-8 nor text; an export is UTF-8 text"));
            return false;
        }

        var cr = special < 0 ? -1 : content.IndexOf((byte)'\r');
        if (cr >= 0)
        {
            Stop(_line, "", Invariant($"line {_line} has a carriage return (CR) that is not followed by LF (byte {cr + 1}): the file has CR-only line ends, or a CR inside a value; the export format allows LF or CRLF line ends only"));
            return false;
        }

        if (!valid)
        {
            if (_notUtf8.Count >= MaxNotUtf8Lines)
            {
                Stop(_line, "", Invariant($"more than {MaxNotUtf8Lines:N0} lines have bytes that are not UTF-8: the file is not UTF-8; export the file as UTF-8"));
                return false;
            }

            _notUtf8.Add(_line);
        }

        return true;
    }

    private void Stop(long line, string value, string reason) => Fault = new ExportInputFault(line, value, reason);

    // Control bytes other than tab, as random or binary data has and text in any 8-bit code page has not.
    private static bool HasControlBytes(ReadOnlySpan<byte> bytes)
    {
        foreach (var b in bytes)
        {
            if (b < 0x20 && b != (byte)'\t' && b != (byte)'\r')
            {
                return true;
            }
        }

        return false;
    }

    private static string Hex(ReadOnlySpan<byte> bytes) => string.Join(" ", bytes.ToArray().Select(b => Invariant($"0x{b:X2}")));
}
