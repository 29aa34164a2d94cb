using System.Buffers.Binary;
using System.Runtime.InteropServices;
using System.Text;
using LineTest.Core.Results;
namespace LineTest.Factory.Reporting.Packs;

/// <summary>
/// The runs of one station database (chain) that ended in one UTC month, with their readings, in the compact form a
/// report reads (<c>run_packs.body</c>): one column per run field (texts as numbers into one list of distinct texts),
/// and per reading only its value and the number of its shape (name, unit, limits), readings grouped by run in
/// ordinal order. A million runs of five readings are about 140 MB, which the server sends in a quarter of a second,
/// against six million rows on the wire.
/// </summary>
/// <remarks>
/// The byte layout (little-endian, version <see cref="Format"/>): "LTPK", int32 format, 16 bytes chain id, int32
/// text count and each text (int32 UTF-8 length, bytes), int32 run count and the run columns (ended ticks, seq,
/// station, slot, lot, sequence, revision, product, operator, failure, reason, verdict as one byte), the serials
/// (length-prefixed UTF-8), int32 shape count and each shape (name, unit, low flag and value, high flag and value),
/// int32 reading count, the run starts (runs + 1 int32) and the readings' shapes (int32) and values (double, NaN for
/// none). A text number of −1 is no text; a revision of <see cref="int.MinValue"/> none.
/// </remarks>
internal sealed class RunPack
{
    /// <summary>The format version written; a pack of another version is rebuilt, never misread.</summary>
    public const int Format = 1;

    private static readonly uint Magic = BinaryPrimitives.ReadUInt32LittleEndian("LTPK"u8);

    public required Guid Chain { get; init; }

    /// <summary>The distinct texts (stations, lots, sequences, products, operators, failures, reasons, names, units).</summary>
    public required string[] Texts { get; init; }

    public required long[] EndedTicks { get; init; }

    public required long[] Seq { get; init; }

    public required int[] Station { get; init; }

    public required int[] Slot { get; init; }

    public required int[] Lot { get; init; }

    public required int[] Sequence { get; init; }

    public required int[] Revision { get; init; }

    public required int[] Product { get; init; }

    public required int[] Operator { get; init; }

    public required int[] Failure { get; init; }

    public required int[] Reason { get; init; }

    public required Verdict[] Verdict { get; init; }

    public required string[] Serial { get; init; }

    public required PackShape[] Shapes { get; init; }

    /// <summary>Run r's readings are [ReadingStart[r], ReadingStart[r + 1]).</summary>
    public required int[] ReadingStart { get; init; }

    public required int[] ReadingShape { get; init; }

    public required double[] ReadingValue { get; init; }

    public int Runs => EndedTicks.Length;

    public int Readings => ReadingValue.Length;

    public long LastSeq => Seq.Length == 0 ? long.MinValue : Seq.Max();

    /// <summary>The text numbered <paramref name="index"/>; null for −1.</summary>
    public string? Text(int index) => index < 0 ? null : Texts[index];

    public byte[] ToBytes()
    {
        using var stream = new MemoryStream(64 + (Runs * 80) + (Readings * 12));
        using (var writer = new BinaryWriter(stream, Encoding.UTF8, leaveOpen: true))
        {
            writer.Write(Magic);
            writer.Write(Format);
            writer.Write(Chain.ToByteArray());
            writer.Write(Texts.Length);
            foreach (var text in Texts)
            {
                WriteText(writer, text);
            }

            writer.Write(Runs);
            WriteArray(writer, EndedTicks);
            WriteArray(writer, Seq);
            foreach (var column in new[] { Station, Slot, Lot, Sequence, Revision, Product, Operator, Failure, Reason })
            {
                Check(column.Length == Runs, "a run column");
                WriteArray(writer, column);
            }

            Check(Verdict.Length == Runs && Serial.Length == Runs, "the verdicts or serials");
            foreach (var verdict in Verdict)
            {
                writer.Write((byte)verdict);
            }
            foreach (var serial in Serial)
            {
                WriteText(writer, serial);
            }

            writer.Write(Shapes.Length);
            foreach (var shape in Shapes)
            {
                writer.Write(shape.Name);
                writer.Write(shape.Unit);
                writer.Write(shape.Low.HasValue);
                writer.Write(shape.Low ?? 0);
                writer.Write(shape.High.HasValue);
                writer.Write(shape.High ?? 0);
            }

            Check(ReadingStart.Length == Runs + 1 && ReadingShape.Length == Readings, "the reading columns");
            writer.Write(Readings);
            WriteArray(writer, ReadingStart);
            WriteArray(writer, ReadingShape);
            WriteArray(writer, ReadingValue);
        }

        return stream.ToArray();
    }

    /// <summary>Reads a pack; <see cref="InvalidDataException"/> naming what is wrong when the bytes are not one.</summary>
    public static RunPack FromBytes(ReadOnlySpan<byte> bytes)
    {
        var cursor = new Cursor(bytes);
        if (cursor.UInt32() != Magic)
        {
            throw new InvalidDataException("The run pack does not start with LTPK.");
        }

        var format = cursor.Int32();
        if (format != Format)
        {
            throw new InvalidDataException($"The run pack has format {format}; this LineTest reads format {Format}.");
        }

        var chain = new Guid(cursor.Bytes(16));
        var texts = new string[cursor.Count(4)];
        for (var i = 0; i < texts.Length; i++)
        {
            texts[i] = cursor.Text();
        }

        var runs = cursor.Count(8);
        var ended = cursor.Array<long>(runs);
        var seq = cursor.Array<long>(runs);
        var columns = new int[9][];
        for (var c = 0; c < columns.Length; c++)
        {
            columns[c] = cursor.Array<int>(runs);
        }

        var verdicts = new Verdict[runs];
        var verdictBytes = cursor.Bytes(runs);
        for (var i = 0; i < runs; i++)
        {
            verdicts[i] = verdictBytes[i] <= (byte)Core.Results.Verdict.Error
                ? (Verdict)verdictBytes[i]
                : throw new InvalidDataException($"The run pack has verdict {verdictBytes[i]} for run {i}.");
        }
        var serials = new string[runs];
        for (var i = 0; i < runs; i++)
        {
            serials[i] = cursor.Text();
        }

        var shapes = new PackShape[cursor.Count(26)];
        for (var i = 0; i < shapes.Length; i++)
        {
            var name = cursor.Int32();
            var unit = cursor.Int32();
            var hasLow = cursor.Bool();
            var low = cursor.Double();
            var hasHigh = cursor.Bool();
            var high = cursor.Double();
            shapes[i] = new PackShape(name, unit, hasLow ? low : null, hasHigh ? high : null);
        }

        var readings = cursor.Count(12);
        var pack = new RunPack
        {
            Chain = chain,
            Texts = texts,
            EndedTicks = ended,
            Seq = seq,
            Station = columns[0],
            Slot = columns[1],
            Lot = columns[2],
            Sequence = columns[3],
            Revision = columns[4],
            Product = columns[5],
            Operator = columns[6],
            Failure = columns[7],
            Reason = columns[8],
            Verdict = verdicts,
            Serial = serials,
            Shapes = shapes,
            ReadingStart = cursor.Array<int>(runs + 1),
            ReadingShape = cursor.Array<int>(readings),
            ReadingValue = cursor.Array<double>(readings),
        };
        if (!cursor.AtEnd)
        {
            throw new InvalidDataException("The run pack has bytes after its last reading.");
        }

        pack.Validate();
        return pack;
    }

    /// <summary>Every number points into its list, and the readings' runs are in order: a damaged pack is refused whole.</summary>
    private void Validate()
    {
        foreach (var column in new[] { Station, Lot, Sequence, Product, Operator, Failure, Reason })
        {
            foreach (var t in column)
            {
                Check(t >= -1 && t < Texts.Length, "a text number");
            }
        }

        for (var r = 0; r < Runs; r++)
        {
            Check(Station[r] >= 0 && Sequence[r] >= 0 && Product[r] >= 0, "a run without station, sequence or product");
            Check(ReadingStart[r] <= ReadingStart[r + 1], "the run starts");
        }

        Check(ReadingStart[0] == 0 && ReadingStart[Runs] == Readings, "the run starts");
        foreach (var shape in Shapes)
        {
            Check(shape.Name >= 0 && shape.Name < Texts.Length && shape.Unit >= 0 && shape.Unit < Texts.Length, "a shape's name or unit");
        }

        foreach (var s in ReadingShape)
        {
            Check(s >= 0 && s < Shapes.Length, "a reading's shape");
        }
    }

    private static void Check(bool ok, string what)
    {
        if (!ok)
        {
            throw new InvalidDataException($"The run pack is inconsistent: {what}.");
        }
    }

    private static void WriteText(BinaryWriter writer, string text)
    {
        var bytes = Encoding.UTF8.GetBytes(text);
        writer.Write(bytes.Length);
        writer.Write(bytes);
    }

    private static void WriteArray<T>(BinaryWriter writer, T[] values)
        where T : unmanaged
    {
        if (BitConverter.IsLittleEndian)
        {
            writer.Write(MemoryMarshal.AsBytes(values.AsSpan()));
            return;
        }

        throw new PlatformNotSupportedException("Run packs are written little-endian.");
    }

    private ref struct Cursor(ReadOnlySpan<byte> bytes)
    {
        private readonly ReadOnlySpan<byte> _bytes = bytes;
        private int _at;

        public readonly bool AtEnd => _at == _bytes.Length;

        public ReadOnlySpan<byte> Bytes(int count)
        {
            if (count < 0 || count > _bytes.Length - _at)
            {
                throw new InvalidDataException($"The run pack ends early (at byte {_at} of {_bytes.Length}).");
            }

            var span = _bytes.Slice(_at, count);
            _at += count;
            return span;
        }

        public uint UInt32() => BinaryPrimitives.ReadUInt32LittleEndian(Bytes(4));

        public int Int32() => BinaryPrimitives.ReadInt32LittleEndian(Bytes(4));

        public double Double() => BinaryPrimitives.ReadDoubleLittleEndian(Bytes(8));

        public bool Bool() => Bytes(1)[0] != 0;

        /// <summary>A count of items of at least <paramref name="bytesEach"/> bytes: never more than the bytes left could hold.</summary>
        public int Count(int bytesEach)
        {
            var count = Int32();
            if (count < 0 || (long)count * bytesEach > _bytes.Length - _at)
            {
                throw new InvalidDataException($"The run pack gives a count of {count} at byte {_at - 4}, more than it holds.");
            }

            return count;
        }

        public string Text() => Encoding.UTF8.GetString(Bytes(Count(1)));

        public T[] Array<T>(int count)
            where T : unmanaged =>
            MemoryMarshal.Cast<byte, T>(Bytes(checked(count * System.Runtime.CompilerServices.Unsafe.SizeOf<T>()))).ToArray();
    }
}

/// <summary>A reading's name and unit (text numbers) and limits, shared by the readings that have them.</summary>
internal readonly record struct PackShape(int Name, int Unit, double? Low, double? High);
