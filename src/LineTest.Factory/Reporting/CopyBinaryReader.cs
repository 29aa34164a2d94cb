using System.Buffers.Binary;
using Npgsql;

namespace LineTest.Factory.Reporting;

/// <summary>
/// Reads the rows of <c>COPY (query) TO STDOUT (FORMAT BINARY)</c> straight from the wire: PostgreSQL's binary copy
/// format (a signature, then per row a 16-bit field count and per field a 32-bit length, −1 for NULL, and the value in
/// the type's binary form, big-endian), decoded in place from one buffer. Millions of report rows cost no object per
/// row: a text comes back as its UTF-8 bytes, and the few distinct texts of a column become shared strings through a
/// <see cref="CopyTextCache"/>. The caller reads the fields of each row in the query's column order; a field of the
/// wrong size is an <see cref="InvalidDataException"/> naming the row and field.
/// </summary>
internal sealed class CopyBinaryReader : IAsyncDisposable
{
    /// <summary>"PGCOPY\n\377\r\n\0": 11 bytes (0xFF is one byte, not UTF-8).</summary>
    private static readonly byte[] Signature = [(byte)'P', (byte)'G', (byte)'C', (byte)'O', (byte)'P', (byte)'Y', (byte)'\n', 0xFF, (byte)'\r', (byte)'\n', 0];

    private readonly Stream _stream;
    private readonly int _fields;
    private byte[] _buffer = new byte[1 << 16];
    private int _start;
    private int _end;
    private int _position;
    private int _rowEnd;
    private int _field;
    private bool _done;
    private bool _ended;
    private bool _lastWasNull;

    private CopyBinaryReader(Stream stream, int fields)
    {
        _stream = stream;
        _fields = fields;
    }

    /// <summary>Rows read so far (the current one included).</summary>
    public long Row { get; private set; }

    /// <summary>
    /// Starts <paramref name="copyCommand"/> (a <c>COPY (…) TO STDOUT (FORMAT BINARY)</c> whose rows have
    /// <paramref name="fields"/> fields) on <paramref name="connection"/> and reads its header.
    /// </summary>
    public static async Task<CopyBinaryReader> StartAsync(NpgsqlConnection connection, string copyCommand, int fields, CancellationToken ct)
    {
        ArgumentNullException.ThrowIfNull(connection);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(fields);
        var stream = await connection.BeginRawBinaryCopyAsync(copyCommand, ct).ConfigureAwait(false);
        var reader = new CopyBinaryReader(stream, fields);
        try
        {
            await reader.ReadHeaderAsync(ct).ConfigureAwait(false);
            return reader;
        }
        catch
        {
            await reader.DisposeAsync().ConfigureAwait(false);
            throw;
        }
    }

    /// <summary>Moves to the next row, with all its bytes in the buffer; false after the last.</summary>
    public async ValueTask<bool> NextRowAsync(CancellationToken ct)
    {
        if (_done)
        {
            return false;
        }

        // A row whose fields were not all read is skipped whole.
        _start = _rowEnd;
        while (true)
        {
            var length = RowLength();
            if (length == 0)
            {
                // The end-of-data marker is the last of the data: the stream ends with it.
                _done = true;
                while (!_ended && await _stream.ReadAsync(_buffer, ct).ConfigureAwait(false) > 0)
                {
                }

                return false;
            }

            if (length > 0)
            {
                _rowEnd = _start + length;
                _position = _start + 2;
                _field = 0;
                Row++;
                return true;
            }

            await FillAsync(ct).ConfigureAwait(false);
        }
    }

    /// <summary>The next field as a uuid.</summary>
    public Guid ReadGuid() => new(Field(16, "uuid"), bigEndian: true);

    /// <summary>The next field as a bigint.</summary>
    public long ReadInt64() => BinaryPrimitives.ReadInt64BigEndian(Field(8, "bigint"));

    /// <summary>The next field as an integer.</summary>
    public int ReadInt32() => BinaryPrimitives.ReadInt32BigEndian(Field(4, "integer"));

    /// <summary>The next field as a boolean.</summary>
    public bool ReadBoolean() => Field(1, "boolean")[0] != 0;

    /// <summary>The next field as a double precision, null for NULL.</summary>
    public double? ReadNullableDouble()
    {
        var bytes = NullableField(8, "double precision");
        return _lastWasNull ? null : BinaryPrimitives.ReadDoubleBigEndian(bytes);
    }

    /// <summary>The next field's UTF-8 bytes (a text); false for NULL.</summary>
    public bool TryReadText(out ReadOnlySpan<byte> utf8)
    {
        utf8 = NullableField(-1, "text");
        return !_lastWasNull;
    }

    /// <summary>The next field as a text, decoded; null for NULL.</summary>
    public string? ReadText() => TryReadText(out var utf8) ? System.Text.Encoding.UTF8.GetString(utf8) : null;

    /// <summary>The next field as a text, shared through <paramref name="cache"/>; null for NULL.</summary>
    public string? ReadText(CopyTextCache cache)
    {
        ArgumentNullException.ThrowIfNull(cache);
        return TryReadText(out var utf8) ? cache.Get(utf8) : null;
    }

    public async ValueTask DisposeAsync() => await _stream.DisposeAsync().ConfigureAwait(false);

    private ReadOnlySpan<byte> Field(int size, string type)
    {
        var bytes = NullableField(size, type);
        if (_lastWasNull)
        {
            throw new InvalidDataException($"COPY row {Row}, field {_field}: NULL where a {type} is required.");
        }

        return bytes;
    }

    /// <summary>The next field's bytes (empty with <see cref="_lastWasNull"/> for NULL); <paramref name="size"/> −1: any.</summary>
    private ReadOnlySpan<byte> NullableField(int size, string type)
    {
        if (_field >= _fields)
        {
            throw new InvalidOperationException($"COPY row {Row} has {_fields} fields; a field past them was read.");
        }

        var length = BinaryPrimitives.ReadInt32BigEndian(_buffer.AsSpan(_position, 4));
        _position += 4;
        _field++;
        if (length < 0)
        {
            _lastWasNull = true;
            return [];
        }

        if (size >= 0 && length != size)
        {
            throw new InvalidDataException($"COPY row {Row}, field {_field - 1}: {length} bytes where a {type} takes {size}.");
        }

        _lastWasNull = false;
        var bytes = _buffer.AsSpan(_position, length);
        _position += length;
        return bytes;
    }

    /// <summary>
    /// The length of the row starting at <see cref="_start"/> when all of it is in the buffer, −1 when more must be read,
    /// 0 at the end-of-data marker.
    /// </summary>
    private int RowLength()
    {
        var available = _end - _start;
        if (available < 2)
        {
            return -1;
        }

        var count = BinaryPrimitives.ReadInt16BigEndian(_buffer.AsSpan(_start, 2));
        if (count == -1)
        {
            return 0;
        }

        if (count != _fields)
        {
            throw new InvalidDataException($"COPY row {Row + 1} has {count} fields; {_fields} were expected.");
        }

        var at = _start + 2;
        for (var f = 0; f < count; f++)
        {
            if (_end - at < 4)
            {
                return -1;
            }

            var length = BinaryPrimitives.ReadInt32BigEndian(_buffer.AsSpan(at, 4));
            at += 4 + Math.Max(0, length);
            if (at > _end)
            {
                return -1;
            }
        }

        return at - _start;
    }

    /// <summary>
    /// Keeps the unread bytes from <see cref="_start"/>, growing the buffer for a long row, and reads more: until the
    /// buffer is three quarters full or the data ends. The stream gives one row (one CopyData message) per read, so the
    /// rows are gathered here and then decoded in one run, not one wait per row.
    /// </summary>
    private async ValueTask FillAsync(CancellationToken ct)
    {
        if (_ended)
        {
            throw new InvalidDataException($"The COPY data ended inside row {Row + 1}, before its end-of-data marker.");
        }

        var kept = _end - _start;
        if (kept == _buffer.Length)
        {
            Array.Resize(ref _buffer, _buffer.Length * 2);
        }
        else if (_start > 0)
        {
            Buffer.BlockCopy(_buffer, _start, _buffer, 0, kept);
        }

        _start = 0;
        _position = 0;
        _rowEnd = 0;
        _end = kept;
        var enough = _buffer.Length - (_buffer.Length / 4);
        do
        {
            var read = await _stream.ReadAsync(_buffer.AsMemory(_end), ct).ConfigureAwait(false);
            if (read == 0)
            {
                _ended = true;
                break;
            }

            _end += read;
        }
        while (_end < enough);

        if (_end == kept)
        {
            throw new InvalidDataException($"The COPY data ended inside row {Row + 1}, before its end-of-data marker.");
        }
    }

    private async Task ReadHeaderAsync(CancellationToken ct)
    {
        // Signature (11 bytes), flags (32 bits), header extension length (32 bits) and the extension.
        while (_end < Signature.Length + 8)
        {
            await FillAsync(ct).ConfigureAwait(false);
        }

        if (!_buffer.AsSpan(0, Signature.Length).SequenceEqual(Signature))
        {
            throw new InvalidDataException("The COPY data does not start with PostgreSQL's binary copy signature.");
        }

        var flags = BinaryPrimitives.ReadInt32BigEndian(_buffer.AsSpan(Signature.Length, 4));
        if ((flags & (1 << 16)) != 0)
        {
            throw new InvalidDataException("The COPY data carries OIDs, which these reports do not ask for.");
        }

        var extension = BinaryPrimitives.ReadInt32BigEndian(_buffer.AsSpan(Signature.Length + 4, 4));
        var header = Signature.Length + 8 + extension;
        while (_end < header)
        {
            _start = 0;
            await FillAsync(ct).ConfigureAwait(false);
        }

        _position = header;
        _start = header;
        _rowEnd = header;
    }
}
