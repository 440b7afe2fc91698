using System.Runtime.InteropServices;

namespace RankFreq.Counting;

/// <summary>
/// Large blocks outside the managed heap, for count tables: freed the moment a table is cleared (managed arrays
/// would stay as garbage until a full collection, and that garbage counts against the memory budget), and grown in
/// place where the operating system can remap pages instead of copying them.
/// </summary>
/// <remarks>
/// On Linux blocks are anonymous private mappings (<c>mmap</c>), so a freed block returns to the operating system at
/// once and growth uses <c>mremap</c> (no second copy alive during growth). Elsewhere they come from
/// <see cref="NativeMemory"/>. Fresh blocks read as zero; callers that probe a block write it first (see
/// DEVELOPERS.md on copy-on-write faults of the shared zero page).
/// </remarks>
internal static unsafe partial class NativeBlock
{
    private const int ProtReadWrite = 0x1 | 0x2;
    private const int MapPrivateAnonymous = 0x02 | 0x20;
    private const int MremapMayMove = 1;
    private const int MadvHugePage = 14;
    private const int MadvPopulateWrite = 23;
    private const long HugePageMinBytes = 8L << 20;

    /// <summary>A block of <paramref name="bytes"/> bytes (zero-filled).</summary>
    public static void* Alloc(long bytes)
    {
        if (bytes <= 0) bytes = 1;
        if (OperatingSystem.IsLinux())
        {
            void* p = Mmap(null, (nuint)bytes, ProtReadWrite, MapPrivateAnonymous, -1, 0);
            if ((nint)p == -1) throw new OutOfMemoryException($"cannot map {bytes:N0} bytes for a count table");
            // large tables are probed at random: 2 MiB pages where the kernel grants them (transparent huge pages in
            // "madvise" mode, the common default) save a TLB miss per probe and 511 of 512 page faults; a refusal
            // only leaves the block on small pages, so the result is ignored
            if (bytes >= HugePageMinBytes) _ = Madvise(p, (nuint)bytes, MadvHugePage);
            return p;
        }
        return NativeMemory.AllocZeroed((nuint)bytes);
    }

    /// <summary>
    /// A block of <paramref name="bytes"/> zero bytes whose pages are all mapped and writable already: for blocks that are
    /// probed at random (see DEVELOPERS.md on the shared zero page). On Linux the kernel maps and zeroes them at once
    /// (<c>MADV_POPULATE_WRITE</c>, on the huge pages asked for); where that is refused the block is written with zeros.
    /// </summary>
    public static void* AllocWritten(long bytes)
    {
        void* p = Alloc(bytes);
        if (OperatingSystem.IsLinux() && Madvise(p, (nuint)Math.Max(1, bytes), MadvPopulateWrite) == 0) return p;
        for (long at = 0; at < bytes; at += 1 << 30)
            new Span<byte>((byte*)p + at, (int)Math.Min(1 << 30, bytes - at)).Clear();
        return p;
    }

    /// <summary>Frees a block from <see cref="Alloc"/> or <see cref="Grow"/>.</summary>
    public static void Free(void* p, long bytes)
    {
        if (p is null) return;
        if (OperatingSystem.IsLinux()) Munmap(p, (nuint)Math.Max(1, bytes));
        else NativeMemory.Free(p);
    }

    /// <summary>The block grown to <paramref name="newBytes"/>, contents kept (the block may move).</summary>
    public static void* Grow(void* p, long oldBytes, long newBytes)
    {
        if (p is null) return Alloc(newBytes);
        if (OperatingSystem.IsLinux())
        {
            void* q = Mremap(p, (nuint)oldBytes, (nuint)newBytes, MremapMayMove);
            if ((nint)q == -1) throw new OutOfMemoryException($"cannot grow a count table to {newBytes:N0} bytes");
            return q;
        }
        void* r = NativeMemory.Realloc(p, (nuint)newBytes);
        new Span<byte>((byte*)r + oldBytes, checked((int)(newBytes - oldBytes))).Clear();
        return r;
    }

    [LibraryImport("libc", EntryPoint = "mmap", SetLastError = true)]
    private static partial void* Mmap(void* addr, nuint length, int prot, int flags, int fd, nint offset);

    [LibraryImport("libc", EntryPoint = "madvise", SetLastError = true)]
    private static partial int Madvise(void* addr, nuint length, int advice);

    [LibraryImport("libc", EntryPoint = "munmap", SetLastError = true)]
    private static partial int Munmap(void* addr, nuint length);

    [LibraryImport("libc", EntryPoint = "mremap", SetLastError = true)]
    private static partial void* Mremap(void* oldAddress, nuint oldSize, nuint newSize, int flags);
}
